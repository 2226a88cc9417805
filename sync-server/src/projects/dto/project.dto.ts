import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { IsOptional, IsString, MaxLength, MinLength } from 'class-validator';
import { PROJECT_ROLES, type ProjectRole } from '../../common/auth-user.js';
import { Trim } from '../../common/transforms.js';

export class CreateProjectDto {
  @ApiProperty({ example: 'Kagome strip survey', minLength: 1, maxLength: 120 })
  @Trim()
  @IsString()
  @MinLength(1)
  @MaxLength(120)
  name!: string;

  @ApiPropertyOptional({ example: 'Phase map of a conditional-hopping strip', maxLength: 2000, default: '' })
  @IsOptional()
  @IsString()
  @MaxLength(2000)
  description?: string;
}

export class UpdateProjectDto {
  @ApiPropertyOptional({ description: 'New name', minLength: 1, maxLength: 120 })
  @IsOptional()
  @Trim()
  @IsString()
  @MinLength(1)
  @MaxLength(120)
  name?: string;

  @ApiPropertyOptional({ description: 'New description', maxLength: 2000 })
  @IsOptional()
  @IsString()
  @MaxLength(2000)
  description?: string;
}

export class DeleteProjectDto {
  @ApiProperty({ description: 'From POST /api/projects/{projectId}/delete-confirmation (valid for a few minutes)' })
  @IsString()
  @MaxLength(2000)
  confirmationToken!: string;
}

export class ProjectDto {
  @ApiProperty({ format: 'uuid' })
  id!: string;

  @ApiProperty()
  name!: string;

  @ApiProperty()
  description!: string;

  @ApiProperty({ description: 'True while archived' })
  archived!: boolean;

  @ApiProperty({ nullable: true, type: Date })
  archivedAt!: Date | null;

  @ApiProperty()
  createdAt!: Date;

  @ApiProperty()
  updatedAt!: Date;

  @ApiProperty({ enum: PROJECT_ROLES, description: 'Your role in this project' })
  myRole!: ProjectRole;
}

export class DeleteConfirmationDto {
  @ApiProperty({ description: 'Send it back in DELETE /api/projects/{projectId}' })
  confirmationToken!: string;

  @ApiProperty()
  expiresAt!: Date;

  @ApiProperty({ description: 'What will be deleted (show it to the person confirming)' })
  projectName!: string;
}
