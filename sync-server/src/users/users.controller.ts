import { Body, Controller, Get, Patch } from '@nestjs/common';
import { ApiBearerAuth, ApiOkResponse, ApiOperation, ApiTags, ApiUnauthorizedResponse } from '@nestjs/swagger';
import type { AuthUser } from '../common/auth-user.js';
import { CurrentUser } from '../common/decorators.js';
import { HttpErrorBody } from '../common/http-error.js';
import { UpdateProfileDto, UserProfileDto } from './dto/user-profile.dto.js';
import { UsersService } from './users.service.js';

@ApiTags('users')
@ApiBearerAuth()
@ApiUnauthorizedResponse({ type: HttpErrorBody, description: 'No valid access token; `details.reason` says why' })
@Controller('users')
export class UsersController {
  constructor(private readonly users: UsersService) {}

  @Get('me')
  @ApiOperation({ summary: 'My account' })
  @ApiOkResponse({ type: UserProfileDto })
  async me(@CurrentUser() me: AuthUser): Promise<UserProfileDto> {
    return this.users.toProfile(await this.users.getById(me.id));
  }

  @Patch('me')
  @ApiOperation({ summary: 'Change my display name' })
  @ApiOkResponse({ type: UserProfileDto })
  async update(@CurrentUser() me: AuthUser, @Body() body: UpdateProfileDto): Promise<UserProfileDto> {
    return this.users.toProfile(await this.users.updateDisplayName(me.id, body.displayName));
  }
}
