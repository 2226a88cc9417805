import { ApiProperty } from '@nestjs/swagger';
import { IsEmail, IsString, MaxLength, MinLength } from 'class-validator';
import { PASSWORD_MAX_LENGTH, PASSWORD_MIN_LENGTH, IsAcceptablePassword } from '../../common/password-rule.js';
import { Trim } from '../../common/transforms.js';
import { UserProfileDto } from '../../users/dto/user-profile.dto.js';

const PASSWORD_DOC = `${PASSWORD_MIN_LENGTH}–${PASSWORD_MAX_LENGTH} characters, at least 5 different ones, not containing the e-mail address`;

export class RegisterDto {
  @ApiProperty({ example: 'ada.quill@example.org', maxLength: 254 })
  @Trim()
  @IsString()
  @MaxLength(254)
  @IsEmail()
  email!: string;

  @ApiProperty({ example: 'Ada Quill', minLength: 1, maxLength: 100 })
  @Trim()
  @IsString()
  @MinLength(1)
  @MaxLength(100)
  displayName!: string;

  @ApiProperty({ description: PASSWORD_DOC, minLength: PASSWORD_MIN_LENGTH, maxLength: PASSWORD_MAX_LENGTH, format: 'password' })
  @IsString()
  @IsAcceptablePassword('email')
  password!: string;
}

export class SignInDto {
  @ApiProperty({ example: 'ada.quill@example.org', maxLength: 254 })
  @Trim()
  @IsString()
  @MaxLength(254)
  email!: string;

  @ApiProperty({ format: 'password', maxLength: PASSWORD_MAX_LENGTH })
  @IsString()
  @MaxLength(PASSWORD_MAX_LENGTH)
  password!: string;
}

export class RefreshDto {
  @ApiProperty({ description: 'The refresh token from the last sign-in or refresh' })
  @IsString()
  @MaxLength(200)
  refreshToken!: string;
}

export class ChangePasswordDto {
  @ApiProperty({ format: 'password', maxLength: PASSWORD_MAX_LENGTH })
  @IsString()
  @MaxLength(PASSWORD_MAX_LENGTH)
  currentPassword!: string;

  @ApiProperty({ description: PASSWORD_DOC, format: 'password' })
  @IsString()
  @IsAcceptablePassword()
  newPassword!: string;
}

export class ForgotPasswordDto {
  @ApiProperty({ example: 'ada.quill@example.org', maxLength: 254 })
  @Trim()
  @IsString()
  @MaxLength(254)
  @IsEmail()
  email!: string;
}

export class ResetPasswordDto {
  @ApiProperty({ description: 'The token from the reset link (the part after #token=)' })
  @IsString()
  @MaxLength(200)
  token!: string;

  @ApiProperty({ description: PASSWORD_DOC, format: 'password' })
  @IsString()
  @IsAcceptablePassword()
  password!: string;
}

export class TokenPairDto {
  @ApiProperty({ description: 'Short-lived JWT for the Authorization: Bearer header' })
  accessToken!: string;

  @ApiProperty({ description: 'Seconds until the access token expires', example: 900 })
  expiresIn!: number;

  @ApiProperty({ description: 'Single-use token for POST /api/auth/refresh; each refresh returns a new one (presented again within the grace window after its rotation, while the new one is unused, it returns that same new one)' })
  refreshToken!: string;

  @ApiProperty({ description: 'When the refresh token expires' })
  refreshExpiresAt!: Date;
}

export class SessionDto extends TokenPairDto {
  @ApiProperty({ type: UserProfileDto })
  user!: UserProfileDto;
}

export class AcceptedDto {
  @ApiProperty({ example: 'If an account uses that address, a reset link is on its way' })
  message!: string;
}
