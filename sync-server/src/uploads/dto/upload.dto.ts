import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { IsOptional, IsString, IsUUID, MaxLength } from 'class-validator';

export class UploadMeasurementsDto {
  @ApiProperty({ type: 'string', format: 'binary', description: 'The CSV file (field "file")' })
  file?: unknown;

  @ApiPropertyOptional({ description: 'Comma-separated names of the columns that are model parameters; default: the swept parameters of mapId' })
  @IsOptional()
  @IsString()
  @MaxLength(1000)
  parameters?: string;

  @ApiPropertyOptional({ format: 'uuid', description: 'The map these measurements are meant to overlay' })
  @IsOptional()
  @IsUUID()
  mapId?: string;
}

export class UploadLatticeDto {
  @ApiProperty({ type: 'string', format: 'binary', description: 'The lattice JSON file (field "file")' })
  file?: unknown;
}

export class UploadDto {
  @ApiProperty({ format: 'uuid' }) id!: string;
  @ApiProperty({ enum: ['measurements', 'lattice'] }) kind!: 'measurements' | 'lattice';
  @ApiProperty() fileName!: string;
  @ApiProperty() contentType!: string;
  @ApiProperty() size!: number;
  @ApiProperty() sha256!: string;
  @ApiProperty({ nullable: true, type: String }) mapId!: string | null;
  @ApiProperty({ nullable: true, type: String }) uploadedBy!: string | null;
  @ApiProperty() createdAt!: Date;
  @ApiPropertyOptional({ description: 'What the server read: CSV columns and rows, or the lattice and its counts' }) summary?: unknown;
}
