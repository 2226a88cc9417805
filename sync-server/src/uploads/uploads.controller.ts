import { Body, Controller, Delete, Get, HttpCode, HttpStatus, Param, ParseUUIDPipe, Post, Res, UploadedFile, UseFilters, UseInterceptors } from '@nestjs/common';
import { FileInterceptor } from '@nestjs/platform-express';
import { ApiBearerAuth, ApiBody, ApiConsumes, ApiCreatedResponse, ApiNoContentResponse, ApiOkResponse, ApiOperation, ApiProduces, ApiTags, ApiUnauthorizedResponse } from '@nestjs/swagger';
import type { Response } from 'express';
import type { AuthUser, ProjectAccess } from '../common/auth-user.js';
import { CurrentAccess, CurrentUser } from '../common/decorators.js';
import { HttpErrorBody } from '../common/http-error.js';
import { ANY_MEMBER, ProjectRoles } from '../memberships/project-roles.guard.js';
import { UploadDto, UploadLatticeDto, UploadMeasurementsDto } from './dto/upload.dto.js';
import { UploadTooLargeFilter } from './upload-too-large.filter.js';
import { type UploadedFileData, UploadsService } from './uploads.service.js';

@ApiTags('uploads')
@ApiBearerAuth()
@ApiUnauthorizedResponse({ type: HttpErrorBody, description: 'No valid access token' })
@Controller('projects/:projectId/uploads')
@UseFilters(UploadTooLargeFilter)
export class UploadsController {
  constructor(private readonly uploads: UploadsService) {}

  @Post('measurements')
  @ProjectRoles('owner', 'editor')
  @UseInterceptors(FileInterceptor('file'))
  @ApiConsumes('multipart/form-data')
  @ApiBody({ type: UploadMeasurementsDto })
  @ApiOperation({ summary: 'Upload measured data as CSV: header of parameters and observables (X_err = uncertainty of X); errors name line and column (editors, owners)' })
  @ApiCreatedResponse({ type: UploadDto })
  measurements(@CurrentAccess() access: ProjectAccess, @CurrentUser() me: AuthUser, @UploadedFile() file: UploadedFileData | undefined, @Body() body: UploadMeasurementsDto): Promise<UploadDto> {
    return this.uploads.measurements(access, me.id, file, body.parameters, body.mapId);
  }

  @Post('lattices')
  @ProjectRoles('owner', 'editor')
  @UseInterceptors(FileInterceptor('file'))
  @ApiConsumes('multipart/form-data')
  @ApiBody({ type: UploadLatticeDto })
  @ApiOperation({ summary: 'Upload a custom lattice geometry (JSON, the model spec’s lattice with kind "custom"), checked by physics-core (editors, owners)' })
  @ApiCreatedResponse({ type: UploadDto })
  lattice(@CurrentAccess() access: ProjectAccess, @CurrentUser() me: AuthUser, @UploadedFile() file: UploadedFileData | undefined): Promise<UploadDto> {
    return this.uploads.lattice(access, me.id, file);
  }

  @Get()
  @ProjectRoles(...ANY_MEMBER)
  @ApiOperation({ summary: 'Uploads of the project, newest first (any member)' })
  @ApiOkResponse({ type: [UploadDto] })
  list(@CurrentAccess() access: ProjectAccess): Promise<UploadDto[]> {
    return this.uploads.list(access.projectId);
  }

  @Get(':uploadId')
  @ProjectRoles(...ANY_MEMBER)
  @ApiOperation({ summary: 'One upload with what the server read from it (any member)' })
  @ApiOkResponse({ type: UploadDto })
  get(@CurrentAccess() access: ProjectAccess, @Param('uploadId', ParseUUIDPipe) id: string): Promise<UploadDto> {
    return this.uploads.get(access.projectId, id);
  }

  @Get(':uploadId/content')
  @ProjectRoles(...ANY_MEMBER)
  @ApiProduces('text/csv', 'application/json')
  @ApiOperation({ summary: 'Download the file as uploaded (any member; never served without a token)' })
  async content(@CurrentAccess() access: ProjectAccess, @Param('uploadId', ParseUUIDPipe) id: string, @Res() res: Response): Promise<void> {
    const file = await this.uploads.content(access.projectId, id);
    res.setHeader('Content-Type', `${file.type}; charset=utf-8`);
    res.setHeader('Content-Disposition', `attachment; filename="${file.name.replace(/["\\\r\n]/g, '_')}"`);
    res.send(file.body);
  }

  @Delete(':uploadId')
  @HttpCode(HttpStatus.NO_CONTENT)
  @ProjectRoles(...ANY_MEMBER)
  @ApiOperation({ summary: 'Delete an upload (its uploader or a project owner)' })
  @ApiNoContentResponse()
  remove(@CurrentAccess() access: ProjectAccess, @CurrentUser() me: AuthUser, @Param('uploadId', ParseUUIDPipe) id: string): Promise<void> {
    return this.uploads.remove(access, me.id, id);
  }
}
