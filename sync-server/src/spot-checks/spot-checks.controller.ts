import { Body, Controller, Get, Param, Post, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiCreatedResponse, ApiOkResponse, ApiOperation, ApiQuery, ApiTags, ApiTooManyRequestsResponse, ApiUnauthorizedResponse } from '@nestjs/swagger';
import type { AuthUser, ProjectAccess } from '../common/auth-user.js';
import { CurrentAccess, CurrentUser } from '../common/decorators.js';
import { HttpErrorBody } from '../common/http-error.js';
import { ANY_MEMBER, ProjectRoles } from '../memberships/project-roles.guard.js';
import { RunSpotCheckDto, SpotCheckReportDto } from './dto/spot-check.dto.js';
import { SpotChecksService } from './spot-checks.service.js';

@ApiTags('spot-checks')
@ApiBearerAuth()
@ApiUnauthorizedResponse({ type: HttpErrorBody, description: 'No valid access token' })
@Controller('projects/:projectId/maps/:mapId/spot-checks')
export class SpotChecksController {
  constructor(private readonly spotChecks: SpotChecksService) {}

  @Post()
  @ProjectRoles('owner', 'editor', 'reviewer')
  @ApiOperation({ summary: 'Re-run K sampled points with physics-core in worker threads, store and return the report (reviewers, editors, owners)' })
  @ApiCreatedResponse({ type: SpotCheckReportDto })
  @ApiTooManyRequestsResponse({ type: HttpErrorBody, description: 'A spot-check of yours (or too many on the server) is still running' })
  run(@CurrentAccess() access: ProjectAccess, @CurrentUser() me: AuthUser, @Param('mapId') mapId: string, @Body() body: RunSpotCheckDto): Promise<SpotCheckReportDto> {
    return this.spotChecks.run(access, me.id, mapId, body);
  }

  @Get()
  @ProjectRoles(...ANY_MEMBER)
  @ApiOperation({ summary: 'Stored spot-check reports of a map, newest first (any member)' })
  @ApiQuery({ name: 'reviewId', required: false })
  @ApiOkResponse({ type: [SpotCheckReportDto] })
  list(@CurrentAccess() access: ProjectAccess, @Param('mapId') mapId: string, @Query('reviewId') reviewId?: string): Promise<SpotCheckReportDto[]> {
    return this.spotChecks.list(access.projectId, mapId, reviewId);
  }
}
