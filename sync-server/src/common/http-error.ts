import { ApiProperty } from '@nestjs/swagger';

/** The one shape of every error the API returns. */
export class HttpErrorBody {
  @ApiProperty({ example: 400 })
  statusCode!: number;

  @ApiProperty({ example: 'Bad Request', description: 'HTTP reason phrase' })
  error!: string;

  @ApiProperty({ example: 'Request validation failed' })
  message!: string;

  @ApiProperty({
    description: 'Machine-readable particulars (e.g. one entry per invalid field), or null',
    nullable: true,
    example: [{ path: 'name', problems: ['name must be a string'] }],
  })
  details!: unknown;
}
