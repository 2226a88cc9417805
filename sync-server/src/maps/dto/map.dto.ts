import { ApiProperty } from '@nestjs/swagger';

/** A stored map without its points (points come through sync pull or the exports). */
export class MapSummaryDto {
  @ApiProperty({ format: 'uuid', description: 'Client-generated id of the map' })
  id!: string;

  @ApiProperty({ description: "physics-core's map identity (SHA-256 of model, sweep, solver options, core version)" })
  identity!: string;

  @ApiProperty({ enum: ['ed', 'meanfield'] })
  method!: 'ed' | 'meanfield';

  @ApiProperty({ nullable: true, type: String })
  name!: string | null;

  @ApiProperty({ description: 'The sweep spec (phasewright.sweep/1)' })
  sweep!: Record<string, unknown>;

  @ApiProperty({ description: 'The merged provenance of every run that contributed points' })
  provenance!: Record<string, unknown>;

  @ApiProperty()
  pointCount!: number;

  @ApiProperty({ description: 'SHA-256 over the sorted lines "key<TAB>sha256(point)" of the point set' })
  pointsDigest!: string;

  @ApiProperty({ description: 'Change number of the last change of the metadata' })
  seq!: number;

  @ApiProperty({ nullable: true, type: String })
  createdBy!: string | null;

  @ApiProperty({ nullable: true, type: String })
  updatedBy!: string | null;

  @ApiProperty()
  createdAt!: Date;

  @ApiProperty()
  updatedAt!: Date;
}
