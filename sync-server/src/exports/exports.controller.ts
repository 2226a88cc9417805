import { Controller, Get, Param, Res } from '@nestjs/common';
import { ApiBearerAuth, ApiOkResponse, ApiOperation, ApiProduces, ApiTags, ApiUnauthorizedResponse } from '@nestjs/swagger';
import type { Response } from 'express';
import type { ProjectAccess } from '../common/auth-user.js';
import { CurrentAccess } from '../common/decorators.js';
import { HttpErrorBody } from '../common/http-error.js';
import { ANY_MEMBER, ProjectRoles } from '../memberships/project-roles.guard.js';
import { ExportsService } from './exports.service.js';

function send(res: Response, type: string, file: { name: string; body: string }): void {
  res.setHeader('Content-Type', `${type}; charset=utf-8`);
  res.setHeader('Content-Disposition', `attachment; filename="${file.name}"`);
  res.send(file.body);
}

@ApiTags('exports')
@ApiBearerAuth()
@ApiUnauthorizedResponse({ type: HttpErrorBody, description: 'No valid access token' })
@Controller('projects/:projectId/maps/:mapId/export')
export class ExportsController {
  constructor(private readonly exports: ExportsService) {}

  @Get('package.json')
  @ProjectRoles(...ANY_MEMBER)
  @ApiOperation({ summary: 'The map as a data package: JSON with the full provenance (any member)' })
  @ApiProduces('application/json')
  @ApiOkResponse({ description: 'phasewright.data-package/1' })
  async dataPackage(@CurrentAccess() access: ProjectAccess, @Param('mapId') mapId: string, @Res() res: Response): Promise<void> {
    send(res, 'application/json', await this.exports.dataPackage(access.projectId, mapId));
  }

  @Get('points.csv')
  @ProjectRoles(...ANY_MEMBER)
  @ApiOperation({ summary: 'The points as CSV (any member)' })
  @ApiProduces('text/csv')
  @ApiOkResponse({ description: 'One line per point' })
  async pointsCsv(@CurrentAccess() access: ProjectAccess, @Param('mapId') mapId: string, @Res() res: Response): Promise<void> {
    send(res, 'text/csv', await this.exports.pointsCsv(access.projectId, mapId));
  }

  @Get('methods.txt')
  @ProjectRoles(...ANY_MEMBER)
  @ApiOperation({ summary: 'A plain-text methods summary: model, lattice, cluster, solver settings and tolerances, versions, limits (any member)' })
  @ApiProduces('text/plain')
  @ApiOkResponse({ description: 'Plain text' })
  async methods(@CurrentAccess() access: ProjectAccess, @Param('mapId') mapId: string, @Res() res: Response): Promise<void> {
    send(res, 'text/plain', await this.exports.methods(access.projectId, mapId));
  }
}
