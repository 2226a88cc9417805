import { Body, Controller, Delete, Get, HttpCode, HttpStatus, Param, ParseUUIDPipe, Patch, Post } from '@nestjs/common';
import {
  ApiBadRequestResponse,
  ApiBearerAuth,
  ApiConflictResponse,
  ApiCreatedResponse,
  ApiNoContentResponse,
  ApiOkResponse,
  ApiOperation,
  ApiParam,
  ApiTags,
  ApiUnauthorizedResponse,
} from '@nestjs/swagger';
import type { AuthUser, ProjectAccess } from '../common/auth-user.js';
import { CurrentAccess, CurrentUser } from '../common/decorators.js';
import { HttpErrorBody } from '../common/http-error.js';
import { ChangeRoleDto, CreateInvitationDto, InvitationDto, MemberDto } from './dto/membership.dto.js';
import { InvitationsService } from './invitations.service.js';
import { MembershipsService } from './memberships.service.js';
import { ANY_MEMBER, ProjectRoles } from './project-roles.guard.js';

const uuid = new ParseUUIDPipe({ version: '4' });

@ApiTags('members')
@ApiBearerAuth()
@ApiUnauthorizedResponse({ type: HttpErrorBody, description: 'No valid access token; `details.reason` says why' })
@Controller('projects/:projectId')
export class MembershipsController {
  constructor(
    private readonly memberships: MembershipsService,
    private readonly invitations: InvitationsService,
  ) {}

  @Get('members')
  @ProjectRoles(...ANY_MEMBER)
  @ApiOperation({ summary: 'Members of the project with their roles (any member)' })
  @ApiOkResponse({ type: [MemberDto] })
  members(@CurrentAccess() access: ProjectAccess): Promise<MemberDto[]> {
    return this.memberships.list(access.projectId);
  }

  @Patch('members/:userId')
  @ProjectRoles('owner')
  @ApiParam({ name: 'userId', format: 'uuid' })
  @ApiOperation({ summary: "Change a member's role (owner)", description: 'The last owner cannot be demoted (409).' })
  @ApiOkResponse({ type: MemberDto })
  @ApiConflictResponse({ type: HttpErrorBody, description: 'Would leave the project without an owner' })
  changeRole(@CurrentAccess() access: ProjectAccess, @Param('userId', uuid) userId: string, @Body() body: ChangeRoleDto): Promise<MemberDto> {
    return this.memberships.changeRole(access, userId, body.role);
  }

  @Delete('members/:userId')
  @ProjectRoles(...ANY_MEMBER)
  @HttpCode(HttpStatus.NO_CONTENT)
  @ApiParam({ name: 'userId', format: 'uuid' })
  @ApiOperation({
    summary: 'Remove a member (owner), or leave the project (your own user id, any role)',
    description: 'The last owner cannot leave (409).',
  })
  @ApiNoContentResponse()
  @ApiConflictResponse({ type: HttpErrorBody, description: 'Would leave the project without an owner' })
  async remove(@CurrentAccess() access: ProjectAccess, @CurrentUser() me: AuthUser, @Param('userId', uuid) userId: string): Promise<void> {
    await this.memberships.remove(access, me, userId);
  }

  @Post('invitations')
  @ProjectRoles('owner')
  @ApiOperation({
    summary: 'Invite someone by e-mail with a role (owner)',
    description: 'Sends a single-use link that expires after PW_INVITATION_TTL_S (7 days). A new invitation withdraws older pending ones to the same address.',
  })
  @ApiCreatedResponse({ type: InvitationDto })
  @ApiBadRequestResponse({ type: HttpErrorBody })
  @ApiConflictResponse({ type: HttpErrorBody, description: 'The address already belongs to a member' })
  invite(@CurrentAccess() access: ProjectAccess, @CurrentUser() me: AuthUser, @Body() body: CreateInvitationDto): Promise<InvitationDto> {
    return this.invitations.create(access, me, body);
  }

  @Get('invitations')
  @ProjectRoles('owner')
  @ApiOperation({ summary: 'Invitations of the project, newest first, with their state (owner)' })
  @ApiOkResponse({ type: [InvitationDto] })
  listInvitations(@CurrentAccess() access: ProjectAccess): Promise<InvitationDto[]> {
    return this.invitations.list(access.projectId);
  }

  @Delete('invitations/:invitationId')
  @ProjectRoles('owner')
  @HttpCode(HttpStatus.NO_CONTENT)
  @ApiParam({ name: 'invitationId', format: 'uuid' })
  @ApiOperation({ summary: 'Withdraw a pending invitation (owner); its link stops working' })
  @ApiNoContentResponse()
  async revoke(@CurrentAccess() access: ProjectAccess, @Param('invitationId', uuid) invitationId: string): Promise<void> {
    await this.invitations.revoke(access.projectId, invitationId);
  }
}
