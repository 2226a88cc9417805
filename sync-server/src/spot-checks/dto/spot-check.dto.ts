import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import type { Method, SpotCheckOutcome } from '@phasewright/physics-core';
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
  @ApiProperty({ enum: ['reproduced', 'stored-lower', 'differs', 'not-run'], description: "physics-core's compareSpotCheck: stored-lower only for mean-field (the re-run stopped in a higher minimum; the stored point stands)" })
  outcome!: SpotCheckOutcome;
  @ApiPropertyOptional({ description: 'Why the point fails (differs or not-run)' }) problem?: string;
  @ApiPropertyOptional({ description: 'What to know about a passing point (stored-lower)' }) note?: string;
}

export class SpotCheckReportDto {
  @ApiProperty({ format: 'uuid' }) id!: string;
  @ApiProperty({ format: 'uuid' }) mapId!: string;
  @ApiPropertyOptional({ format: 'uuid', nullable: true, type: String }) reviewId!: string | null;
  @ApiProperty({ enum: ['ed', 'meanfield'] }) method!: Method;
  @ApiProperty() sample!: number;
  @ApiProperty() seed!: number;
  @ApiProperty({ description: 'Tolerance on |ΔE|/max(|E|,1) (ED 1e-8, mean-field 1e-6)' }) tolerance!: number;
  @ApiProperty({ type: [SpotCheckPointDto] }) points!: SpotCheckPointDto[];
  @ApiProperty() maxAbsEnergyDifference!: number;
  @ApiProperty() maxRelEnergyDifference!: number;
  @ApiProperty() labelsAgree!: number;
  @ApiPropertyOptional() worstKey?: string;
  @ApiProperty() labelsCompared!: number;
  @ApiProperty() reproduced!: number;
  @ApiProperty() storedLower!: number;
  @ApiProperty() differs!: number;
  @ApiProperty({ description: 'Points that could not be re-run' }) failed!: number;
  @ApiProperty() pass!: boolean;
  @ApiProperty({ description: 'Wall time of the whole run and the sum of point times, ms' }) timing!: { totalMs: number; pointsMs: number; workers: number };
  @ApiProperty({ description: 'Node version, platform, physics-core and server versions' }) runtime!: Record<string, unknown>;
  @ApiProperty({ nullable: true, type: String }) requestedBy!: string | null;
  @ApiProperty() createdAt!: Date;
}
