import { ApiPropertyOptional } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import { IsInt, IsOptional, Max, Min } from 'class-validator';

export class PullQueryDto {
  @ApiPropertyOptional({ description: 'Cursor from the previous pull (0 or absent: from the start)', default: 0 })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(0)
  after?: number;

  @ApiPropertyOptional({ description: 'Page size: records and maps count one each, points one each (a page never splits a block of points, so it may exceed the limit by part of a block)', default: 2000 })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(1)
  @Max(1_000_000)
  limit?: number;
}
