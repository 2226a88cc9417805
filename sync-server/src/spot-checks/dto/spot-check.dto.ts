import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { IsInt, IsOptional, IsUUID, Max, Min } from 'class-validator';

export class RunSpotCheckDto {
  @ApiProperty({ description: 'Points to re-run (at most PW_SPOT_CHECK_MAX_SAMPLE)', example: 8 })
  @IsInt()
  @Min(1)
  sample!: number;

  @ApiPropertyOptional({ description: 'Seed of the sample (same seed, same points)', default: 1 })
  @IsOptional()
  @IsInt()
  @Min(0)
  @Max(4294967295)
  seed?: number;

  @ApiPropertyOptional({ format: 'uuid', description: 'Show the report with this review of the map' })
  @IsOptional()
  @IsUUID()
  reviewId?: string;
}

export class SpotCheckPointDto {
  @ApiProperty() key!: string;
  @ApiProperty() parameters!: Record<string, number>;
  @ApiProperty() storedEnergy!: number;
  @ApiPropertyOptional() freshEnergy?: number;
  @ApiPropertyOptional() absEnergyDifference?: number;
  @ApiPropertyOptional() relEnergyDifference?: number;
  @ApiPropertyOptional() storedLabel?: string;
  @ApiPropertyOptional() freshLabel?: string;
  @ApiPropertyOptional() labelsAgree?: boolean;
  @ApiPropertyOptional() converged?: boolean;
  @ApiPropertyOptional() wallMs?: number;
  @ApiPropertyOptional() failed?: string;
}

export class SpotCheckReportDto {
  @ApiProperty({ format: 'uuid' }) id!: string;
  @ApiProperty({ format: 'uuid' }) mapId!: string;
  @ApiPropertyOptional({ format: 'uuid', nullable: true, type: String }) reviewId!: string | null;
  @ApiProperty() sample!: number;
  @ApiProperty() seed!: number;
  @ApiProperty({ description: 'Relative energy tolerance (ED 1e-8, mean-field 1e-6)' }) tolerance!: number;
  @ApiProperty({ type: [SpotCheckPointDto] }) points!: SpotCheckPointDto[];
  @ApiProperty() maxAbsEnergyDifference!: number;
  @ApiProperty() maxRelEnergyDifference!: number;
  @ApiProperty() labelsAgree!: number;
  @ApiProperty() labelsCompared!: number;
  @ApiProperty() failed!: number;
  @ApiProperty() pass!: boolean;
  @ApiProperty({ description: 'Wall time of the whole run and the sum of point times, ms' }) timing!: { totalMs: number; pointsMs: number; workers: number };
  @ApiProperty({ description: 'Node version, platform, physics-core and server versions' }) runtime!: Record<string, unknown>;
  @ApiProperty({ nullable: true, type: String }) requestedBy!: string | null;
  @ApiProperty() createdAt!: Date;
}
