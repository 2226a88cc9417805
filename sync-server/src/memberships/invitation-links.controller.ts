import { Body, Controller, HttpCode, HttpStatus, Post } from '@nestjs/common';
import {
  ApiBadRequestResponse,
  ApiConflictResponse,
  ApiForbiddenResponse,
  ApiOkResponse,
  ApiOperation,
  ApiTags,
  ApiTooManyRequestsResponse,
} from '@nestjs/swagger';
import type { AuthUser } from '../common/auth-user.js';
import { MaybeUser, OptionalAuth, Public } from '../common/decorators.js';
import { HttpErrorBody } from '../common/http-error.js';
import { AcceptedInvitationDto, AcceptInvitationDto, InvitationPreviewDto, InvitationTokenDto } from './dto/membership.dto.js';
import { InvitationsService } from './invitations.service.js';

/** The receiving end of an invitation link (the token travels in the body, never in a URL). */
@ApiTags('invitations')
@ApiBadRequestResponse({ type: HttpErrorBody, description: 'Invalid body, or a used, expired, withdrawn or unknown token (`details` names `token`)' })
@Controller('invitations')
export class InvitationLinksController {
  constructor(private readonly invitations: InvitationsService) {}

  @Post('preview')
  @Public()
  @HttpCode(HttpStatus.OK)
  @ApiOperation({ summary: 'What an invitation link offers (project, role, invited address, whether an account exists)' })
  @ApiOkResponse({ type: InvitationPreviewDto })
  preview(@Body() body: InvitationTokenDto): Promise<InvitationPreviewDto> {
    return this.invitations.preview(body.token);
  }

  @Post('accept')
  @Public()
  @OptionalAuth()
  @HttpCode(HttpStatus.OK)
  @ApiOperation({
    summary: 'Accept an invitation: signed in as the invited address, or registering with displayName and password',
    description:
      'With a valid Authorization header the signed-in user joins (their address must be the invited one). Without it, an account is created for the invited address and a session returned. The owners are told by e-mail. Rate-limited like registration.',
  })
  @ApiOkResponse({ type: AcceptedInvitationDto })
  @ApiForbiddenResponse({ type: HttpErrorBody, description: 'Signed in with another address' })
  @ApiConflictResponse({ type: HttpErrorBody, description: 'Not signed in but an account uses the invited address' })
  @ApiTooManyRequestsResponse({ type: HttpErrorBody })
  accept(@Body() body: AcceptInvitationDto, @MaybeUser() me: AuthUser | undefined): Promise<AcceptedInvitationDto> {
    return this.invitations.accept(body, me);
  }
}
