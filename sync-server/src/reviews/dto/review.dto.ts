import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { IsIn, IsOptional, IsString, IsUUID, MaxLength, MinLength } from 'class-validator';
import { Trim } from '../../common/transforms.js';
import { SpotCheckReportDto } from '../../spot-checks/dto/spot-check.dto.js';

export class RequestReviewDto {
  @ApiProperty({ format: 'uuid', description: 'A member of the project with the reviewer (or owner) role' })
  @IsUUID()
  reviewerId!: string;

  @ApiPropertyOptional({ description: 'What to look at', maxLength: 5000 })
  @IsOptional()
  @Trim()
  @IsString()
  @MaxLength(5000)
  message?: string;
}

export class CommentDto {
  @ApiProperty({ maxLength: 10000 })
  @Trim()
  @IsString()
  @MinLength(1)
  @MaxLength(10000)
  body!: string;

  @ApiPropertyOptional({ description: 'Comment on one point (its key, e.g. "J=1,V=0.5"); absent: on the map' })
  @IsOptional()
  @IsString()
  @MaxLength(255)
  pointKey?: string;
}

export const VERDICTS = ['approved', 'changes-requested'] as const;

export class VerdictDto {
  @ApiProperty({ enum: VERDICTS })
  @IsIn(VERDICTS)
  verdict!: (typeof VERDICTS)[number];

  @ApiProperty({ maxLength: 10000 })
  @Trim()
  @IsString()
  @MinLength(1)
  @MaxLength(10000)
  note!: string;
}

export class ReviewCommentDto {
  @ApiProperty({ format: 'uuid' }) id!: string;
  @ApiProperty({ nullable: true, type: String }) authorId!: string | null;
  @ApiProperty({ nullable: true, type: String }) authorName!: string | null;
  @ApiProperty({ nullable: true, type: String }) pointKey!: string | null;
  @ApiProperty() body!: string;
  @ApiProperty() createdAt!: Date;
}

export class ReviewDto {
  @ApiProperty({ format: 'uuid' }) id!: string;
  @ApiProperty({ format: 'uuid' }) mapId!: string;
  @ApiProperty({ nullable: true, type: String }) requestedBy!: string | null;
  @ApiProperty({ nullable: true, type: String }) reviewerId!: string | null;
  @ApiProperty() message!: string;
  @ApiProperty({ enum: ['requested', 'approved', 'changes-requested'] }) status!: string;
  @ApiProperty({ nullable: true, type: String }) verdictNote!: string | null;
  @ApiProperty({ nullable: true, type: Date }) verdictAt!: Date | null;
  @ApiProperty({ nullable: true, type: String, description: 'Map identity when the verdict was given' }) mapIdentity!: string | null;
  @ApiProperty({ nullable: true, type: String, description: 'Point-set digest when the verdict was given' }) pointsDigest!: string | null;
  @ApiProperty({ nullable: true, type: Number }) pointCount!: number | null;
  @ApiProperty({ description: 'The map gained or changed points after the verdict: the verdict no longer covers all of it' }) outdated!: boolean;
  @ApiProperty({ type: [ReviewCommentDto] }) comments!: ReviewCommentDto[];
  @ApiProperty({ type: [SpotCheckReportDto] }) spotChecks!: SpotCheckReportDto[];
  @ApiPropertyOptional({ description: 'Whether the e-mail notice went out (on request only)' }) mailSent?: boolean;
  @ApiProperty() createdAt!: Date;
}

export const MAP_REVIEW_STATES = ['none', 'requested', 'approved', 'changes-requested', 'outdated'] as const;
export type MapReviewState = (typeof MAP_REVIEW_STATES)[number];

/** Where one map of a project stands with its reviews: the state of its latest review (by request time). */
export class MapReviewStateDto {
  @ApiProperty({ format: 'uuid' }) mapId!: string;
  @ApiProperty({
    enum: MAP_REVIEW_STATES,
    description: 'State of the latest review: an open request is "requested"; a verdict on a map that gained or changed points since is "outdated"; "none" without reviews',
  })
  state!: MapReviewState;
  @ApiProperty({ nullable: true, type: String, format: 'uuid', description: 'The latest review (null: none)' }) reviewId!: string | null;
  @ApiProperty({ nullable: true, type: String, format: 'uuid' }) reviewerId!: string | null;
  @ApiProperty({ nullable: true, type: String }) reviewerName!: string | null;
  @ApiProperty({ nullable: true, type: Date, description: 'When the latest review last changed (request, verdict); null: none' }) updatedAt!: Date | null;
  @ApiProperty({ description: "The map's current number of points" }) pointCount!: number;
}
