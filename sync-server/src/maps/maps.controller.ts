import { Controller, Get, Param } from '@nestjs/common';
import { ApiBearerAuth, ApiOkResponse, ApiOperation, ApiTags, ApiUnauthorizedResponse } from '@nestjs/swagger';
import type { ProjectAccess } from '../common/auth-user.js';
import { CurrentAccess } from '../common/decorators.js';
import { HttpErrorBody } from '../common/http-error.js';
import { ANY_MEMBER, ProjectRoles } from '../memberships/project-roles.guard.js';
import { MapSummaryDto } from './dto/map.dto.js';
import { MapsService } from './maps.service.js';

@ApiTags('maps')
@ApiBearerAuth()
@ApiUnauthorizedResponse({ type: HttpErrorBody, description: 'No valid access token' })
@Controller('projects/:projectId/maps')
export class MapsController {
  constructor(private readonly maps: MapsService) {}

  @Get()
  @ProjectRoles(...ANY_MEMBER)
  @ApiOperation({ summary: 'The maps of a project, without points (any member)' })
  @ApiOkResponse({ type: [MapSummaryDto] })
  list(@CurrentAccess() access: ProjectAccess): Promise<MapSummaryDto[]> {
    return this.maps.list(access.projectId);
  }

  @Get(':mapId')
  @ProjectRoles(...ANY_MEMBER)
  @ApiOperation({ summary: 'One map: sweep, full provenance, point count and digest (any member)' })
  @ApiOkResponse({ type: MapSummaryDto })
  get(@CurrentAccess() access: ProjectAccess, @Param('mapId') mapId: string): Promise<MapSummaryDto> {
    return this.maps.summary(access.projectId, mapId);
  }
}
