import { ApiProperty } from '@nestjs/swagger';
import { IsString, MaxLength, MinLength } from 'class-validator';
import { SITE_ROLES, type SiteRole } from '../../common/auth-user.js';
import { Trim } from '../../common/transforms.js';

export class UserProfileDto {
  @ApiProperty({ format: 'uuid' })
  id!: string;

  @ApiProperty({ example: 'ada.quill@example.org' })
  email!: string;

  @ApiProperty({ example: 'Ada Quill' })
  displayName!: string;

  @ApiProperty({ enum: SITE_ROLES, description: 'Site-wide role: admins also read the mail store' })
  siteRole!: SiteRole;

  @ApiProperty()
  createdAt!: Date;
}

export class UpdateProfileDto {
  @ApiProperty({ example: 'Ada Quill', minLength: 1, maxLength: 100 })
  @Trim()
  @IsString()
  @MinLength(1)
  @MaxLength(100)
  displayName!: string;
}
