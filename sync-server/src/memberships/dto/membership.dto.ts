import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { IsEmail, IsIn, IsOptional, IsString, MaxLength, MinLength } from 'class-validator';
import { PROJECT_ROLES, type ProjectRole } from '../../common/auth-user.js';
import { IsAcceptablePassword, PASSWORD_MAX_LENGTH, PASSWORD_MIN_LENGTH } from '../../common/password-rule.js';
import { Trim } from '../../common/transforms.js';
import { SessionDto } from '../../auth/dto/auth.dto.js';

export class MemberDto {
  @ApiProperty({ format: 'uuid' })
  userId!: string;

  @ApiProperty()
  displayName!: string;

  @ApiProperty()
  email!: string;

  @ApiProperty({ enum: PROJECT_ROLES })
  role!: ProjectRole;

  @ApiProperty({ description: 'When they joined' })
  since!: Date;
}

export class ChangeRoleDto {
  @ApiProperty({ enum: PROJECT_ROLES })
  @IsIn(PROJECT_ROLES)
  role!: ProjectRole;
}

export class CreateInvitationDto {
  @ApiProperty({ example: 'bo.lantern@example.org', maxLength: 254 })
  @Trim()
  @IsString()
  @MaxLength(254)
  @IsEmail()
  email!: string;

  @ApiProperty({ enum: PROJECT_ROLES })
  @IsIn(PROJECT_ROLES)
  role!: ProjectRole;
}

export const INVITATION_STATES = ['pending', 'accepted', 'revoked', 'expired'] as const;
export type InvitationState = (typeof INVITATION_STATES)[number];

export class InvitationDto {
  @ApiProperty({ format: 'uuid' })
  id!: string;

  @ApiProperty()
  email!: string;

  @ApiProperty({ enum: PROJECT_ROLES })
  role!: ProjectRole;

  @ApiProperty({ enum: INVITATION_STATES })
  state!: InvitationState;

  @ApiProperty()
  expiresAt!: Date;

  @ApiProperty()
  createdAt!: Date;

  @ApiPropertyOptional({ description: 'Only on creation: whether the e-mail left the server' })
  mailSent?: boolean;
}

export class InvitationTokenDto {
  @ApiProperty({ description: 'The token from the invitation link (the part after #token=)' })
  @IsString()
  @MaxLength(200)
  token!: string;
}

export class AcceptInvitationDto extends InvitationTokenDto {
  @ApiPropertyOptional({ description: 'Only when not signed in and no account uses the invited address: creates one', maxLength: 100 })
  @IsOptional()
  @Trim()
  @IsString()
  @MinLength(1)
  @MaxLength(100)
  displayName?: string;

  @ApiPropertyOptional({
    description: `With displayName: the new account's password (${PASSWORD_MIN_LENGTH}–${PASSWORD_MAX_LENGTH} characters, at least 5 different ones)`,
    format: 'password',
  })
  @IsOptional()
  @IsString()
  @IsAcceptablePassword()
  password?: string;
}

export class InvitationPreviewDto {
  @ApiProperty()
  projectName!: string;

  @ApiProperty({ enum: PROJECT_ROLES })
  role!: ProjectRole;

  @ApiProperty({ description: 'The invited address' })
  email!: string;

  @ApiProperty({ description: 'Who sent it', nullable: true, type: String })
  invitedBy!: string | null;

  @ApiProperty()
  expiresAt!: Date;

  @ApiProperty({ description: 'True when an account uses the invited address (sign in, then accept); false: register while accepting' })
  accountExists!: boolean;
}

export class AcceptedInvitationDto {
  @ApiProperty({ format: 'uuid' })
  projectId!: string;

  @ApiProperty({ enum: PROJECT_ROLES, description: 'Your role in the project now' })
  role!: ProjectRole;

  @ApiPropertyOptional({ type: SessionDto, description: 'Present when the account was created by this call' })
  session?: SessionDto;
}
