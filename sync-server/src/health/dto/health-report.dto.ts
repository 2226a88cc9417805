import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';

export class ServerInfoDto {
  @ApiProperty({ example: '0.1.0' })
  version!: string;

  @ApiProperty({ description: 'Seconds since the server process started', example: 12.3 })
  uptimeS!: number;

  @ApiProperty({ description: 'Node.js version', example: 'v20.20.2' })
  node!: string;
}

export class DatabaseInfoDto {
  @ApiProperty({ enum: ['up', 'down'] })
  status!: 'up' | 'down';

  @ApiProperty({ description: 'Round trip of the check query in milliseconds', example: 1.7 })
  latencyMs!: number;

  @ApiProperty({
    description: 'Schema generation recorded by the migrations (table schema_info); null when not migrated',
    example: 'phasewright/1',
    nullable: true,
    type: String,
  })
  schema!: string | null;

  @ApiPropertyOptional({ description: 'Why the database is down or not migrated' })
  error?: string;
}

export class CoreInfoDto {
  @ApiProperty({ description: 'physics-core version linked into the server', example: '0.1.0' })
  version!: string;
}

export class HealthReportDto {
  @ApiProperty({ enum: ['ok', 'degraded'], description: '"degraded" when the database is down or not migrated' })
  status!: 'ok' | 'degraded';

  @ApiProperty({ type: ServerInfoDto })
  server!: ServerInfoDto;

  @ApiProperty({ type: DatabaseInfoDto })
  database!: DatabaseInfoDto;

  @ApiProperty({ type: CoreInfoDto })
  core!: CoreInfoDto;
}
