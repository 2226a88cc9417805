import { Controller, Get } from '@nestjs/common';
import { ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import { HealthReportDto } from './dto/health-report.dto.js';
import { HealthService } from './health.service.js';
import { Public } from '../common/decorators.js';

@ApiTags('health')
@Public()
@Controller('health')
export class HealthController {
  constructor(private readonly health: HealthService) {}

  @Get()
  @ApiOperation({
    summary: 'Server, database and physics-core status',
    description: 'Always answers 200 while the server runs; `status` is "degraded" and `database.status` "down" when the database cannot be reached.',
  })
  @ApiOkResponse({ type: HealthReportDto })
  get(): Promise<HealthReportDto> {
    return this.health.report();
  }
}
