import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import { IsInt, IsOptional, IsString, Max, MaxLength, Min } from 'class-validator';
import { Trim } from '../../common/transforms.js';

export class MailMessageDto {
  @ApiProperty()
  id!: number;

  @ApiProperty({ example: 'no-reply@phasewright.localhost' })
  from!: string;

  @ApiProperty({ description: 'Envelope recipients, comma-separated', example: 'ada.quill@example.org' })
  to!: string;

  @ApiProperty()
  subject!: string;

  @ApiProperty({ description: 'Plain-text body' })
  text!: string;

  @ApiProperty({ description: 'HTML body' })
  html!: string;

  @ApiProperty({ type: [String], description: 'The http(s) links found in the bodies (invitation, reset, project)' })
  links!: string[];

  @ApiProperty()
  receivedAt!: Date;
}

export class MailQueryDto {
  @ApiPropertyOptional({ description: 'Only messages to addresses containing this text', maxLength: 254 })
  @IsOptional()
  @Trim()
  @IsString()
  @MaxLength(254)
  to?: string;

  @ApiPropertyOptional({ description: 'Newest first, at most this many', default: 50, minimum: 1, maximum: 500 })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(1)
  @Max(500)
  limit?: number;
}
