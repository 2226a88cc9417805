import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { CHANGE_KINDS, type ChangeKind } from '../sync-input.js';

/** One change of a push (for the API docs; the service checks the body itself, with JSON paths). */
export class ChangeDto {
  @ApiProperty({ enum: CHANGE_KINDS })
  kind!: ChangeKind;

  @ApiProperty({ format: 'uuid', description: 'Client-generated id of the record or map (for "points": the map)' })
  id!: string;

  @ApiPropertyOptional({ description: 'Human-edited records (model, sweep, annotation, note): the revision this edit started from (0 or absent for a new record)' })
  baseRevision?: number;

  @ApiProperty({
    description:
      'model/sweep: the record, with `spec` checked by physics-core; map: a phasewright.map/1 document; points: {points: {key: point}} for a stored map; annotation: {mapId, labelId, name?, color?, note?}; note: {text, mapId?, pointKey?}',
  })
  data!: Record<string, unknown>;
}

export class PushDto {
  @ApiProperty({ format: 'uuid', description: 'Made by the client once per batch and kept for every retry: a replay changes nothing and returns the first response' })
  batchId!: string;

  @ApiProperty({ type: [ChangeDto] })
  changes!: ChangeDto[];
}

export class PushPointsCount {
  @ApiProperty() received!: number;
  @ApiProperty() added!: number;
  @ApiProperty() updated!: number;
  @ApiProperty() unchanged!: number;
  @ApiProperty({ description: 'Points written now that carry disputed ED results' }) disputed!: number;
}

export class PushResult {
  @ApiProperty({ enum: CHANGE_KINDS }) kind!: ChangeKind;
  @ApiProperty({ format: 'uuid' }) id!: string;
  @ApiProperty({ enum: ['created', 'updated', 'merged', 'unchanged'] }) status!: 'created' | 'updated' | 'merged' | 'unchanged';
  @ApiPropertyOptional({ description: 'Records: the revision now stored' }) revision?: number;
  @ApiPropertyOptional() seq?: number;
  @ApiPropertyOptional({ format: 'uuid', description: 'Maps: the id under which a map of the same identity was already stored (the points were merged into it)' }) storedAs?: string;
  @ApiPropertyOptional({ type: PushPointsCount }) points?: PushPointsCount;
}

export class PushResponse {
  @ApiProperty({ format: 'uuid' }) batchId!: string;
  @ApiProperty({ description: 'The project change number after this batch' }) cursor!: number;
  @ApiProperty({ type: [PushResult] }) results!: PushResult[];
}

export class PullChange {
  @ApiProperty({ description: 'Change number of this change (for a points change: of its last point)' }) seq!: number;
  @ApiProperty({ enum: CHANGE_KINDS }) kind!: ChangeKind;
  @ApiProperty({ format: 'uuid' }) id!: string;
  @ApiPropertyOptional() revision?: number;
  @ApiProperty({ description: 'Records: the record; map: the map document without points; points: {points: {key: point}}' }) data!: Record<string, unknown>;
  @ApiPropertyOptional() pointCount?: number;
  @ApiPropertyOptional() pointsDigest?: string;
  @ApiPropertyOptional({ nullable: true, type: String }) updatedBy?: string | null;
  @ApiPropertyOptional() updatedAt?: Date;
}

export class PullResponse {
  @ApiProperty({ type: [PullChange] }) changes!: PullChange[];
  @ApiProperty({ description: 'Pass as `after` to get the next page (or, later, what changed since)' }) cursor!: number;
  @ApiProperty({ description: 'More changes wait after this page' }) hasMore!: boolean;
}
