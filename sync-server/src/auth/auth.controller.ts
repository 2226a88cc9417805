import { Body, Controller, HttpCode, HttpStatus, Post } from '@nestjs/common';
import {
  ApiAcceptedResponse,
  ApiBadRequestResponse,
  ApiBearerAuth,
  ApiCreatedResponse,
  ApiNoContentResponse,
  ApiOkResponse,
  ApiOperation,
  ApiTags,
  ApiTooManyRequestsResponse,
  ApiUnauthorizedResponse,
} from '@nestjs/swagger';
import type { AuthUser } from '../common/auth-user.js';
import { CurrentUser, Public } from '../common/decorators.js';
import { HttpErrorBody } from '../common/http-error.js';
import { AuthService } from './auth.service.js';
import {
  AcceptedDto,
  ChangePasswordDto,
  ForgotPasswordDto,
  RefreshDto,
  RegisterDto,
  ResetPasswordDto,
  SessionDto,
  SignInDto,
  TokenPairDto,
} from './dto/auth.dto.js';

@ApiTags('auth')
@ApiBadRequestResponse({ type: HttpErrorBody, description: 'Invalid body; `details` names each field' })
@Controller('auth')
export class AuthController {
  constructor(private readonly auth: AuthService) {}

  @Post('register')
  @Public()
  @ApiOperation({ summary: 'Create an account and sign in', description: 'Rate-limited per client address (PW_RATE_LIMIT_REGISTER per window).' })
  @ApiCreatedResponse({ type: SessionDto })
  @ApiTooManyRequestsResponse({ type: HttpErrorBody })
  register(@Body() body: RegisterDto): Promise<SessionDto> {
    return this.auth.register(body);
  }

  @Post('sign-in')
  @Public()
  @HttpCode(HttpStatus.OK)
  @ApiOperation({ summary: 'Sign in with e-mail address and password', description: 'Rate-limited per client address (PW_RATE_LIMIT_SIGN_IN per window).' })
  @ApiOkResponse({ type: SessionDto })
  @ApiUnauthorizedResponse({ type: HttpErrorBody, description: 'Wrong address or password (`details.reason` = bad_credentials)' })
  @ApiTooManyRequestsResponse({ type: HttpErrorBody })
  signIn(@Body() body: SignInDto): Promise<SessionDto> {
    return this.auth.signIn(body);
  }

  @Post('refresh')
  @Public()
  @HttpCode(HttpStatus.OK)
  @ApiOperation({
    summary: 'Exchange a refresh token for a new access and refresh token',
    description:
      'Each refresh token works once. Presenting one that was already exchanged revokes every token of that sign-in (401, reason refresh_reused); an offline client that comes back should refresh once and sign in again on any 401.',
  })
  @ApiOkResponse({ type: TokenPairDto })
  @ApiUnauthorizedResponse({ type: HttpErrorBody, description: '`details.reason`: token_invalid, token_expired or refresh_reused' })
  refresh(@Body() body: RefreshDto): Promise<TokenPairDto> {
    return this.auth.refresh(body.refreshToken);
  }

  @Post('sign-out')
  @Public()
  @HttpCode(HttpStatus.NO_CONTENT)
  @ApiOperation({
    summary: 'Sign out: revoke the refresh token and its whole family',
    description: 'Works without an access token (it may have expired while offline). Unknown tokens are ignored.',
  })
  @ApiNoContentResponse()
  async signOut(@Body() body: RefreshDto): Promise<void> {
    await this.auth.signOut(body.refreshToken);
  }

  @Post('password/change')
  @ApiBearerAuth()
  @HttpCode(HttpStatus.OK)
  @ApiOperation({ summary: 'Change my password', description: 'Signs out every other session; returns a fresh session for this one.' })
  @ApiOkResponse({ type: SessionDto })
  @ApiUnauthorizedResponse({ type: HttpErrorBody, description: 'No valid access token; `details.reason` says why' })
  changePassword(@CurrentUser() me: AuthUser, @Body() body: ChangePasswordDto): Promise<SessionDto> {
    return this.auth.changePassword(me, body);
  }

  @Post('password/forgot')
  @Public()
  @HttpCode(HttpStatus.ACCEPTED)
  @ApiOperation({
    summary: 'Ask for a password-reset link by e-mail',
    description: 'Same answer whether or not the address has an account. Rate-limited (PW_RATE_LIMIT_RESET per window).',
  })
  @ApiAcceptedResponse({ type: AcceptedDto })
  @ApiTooManyRequestsResponse({ type: HttpErrorBody })
  async forgot(@Body() body: ForgotPasswordDto): Promise<AcceptedDto> {
    await this.auth.forgotPassword(body.email);
    return { message: 'If an account uses that address, a reset link is on its way' };
  }

  @Post('password/reset')
  @Public()
  @HttpCode(HttpStatus.NO_CONTENT)
  @ApiOperation({ summary: 'Set a new password with the token from the reset link', description: 'Single use; signs out every session. Rate-limited.' })
  @ApiNoContentResponse()
  @ApiTooManyRequestsResponse({ type: HttpErrorBody })
  async reset(@Body() body: ResetPasswordDto): Promise<void> {
    await this.auth.resetPassword(body.token, body.password);
  }
}
