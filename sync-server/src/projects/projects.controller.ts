import { Body, Controller, Delete, Get, HttpCode, HttpStatus, Patch, Post } from '@nestjs/common';
import {
  ApiBadRequestResponse,
  ApiBearerAuth,
  ApiCreatedResponse,
  ApiNoContentResponse,
  ApiOkResponse,
  ApiOperation,
  ApiTags,
  ApiUnauthorizedResponse,
} from '@nestjs/swagger';
import type { AuthUser, ProjectAccess } from '../common/auth-user.js';
import { CurrentAccess, CurrentUser } from '../common/decorators.js';
import { HttpErrorBody } from '../common/http-error.js';
import { ANY_MEMBER, ProjectRoles } from '../memberships/project-roles.guard.js';
import { CreateProjectDto, DeleteConfirmationDto, DeleteProjectDto, ProjectDto, UpdateProjectDto } from './dto/project.dto.js';
import { ProjectsService } from './projects.service.js';

@ApiTags('projects')
@ApiBearerAuth()
@ApiUnauthorizedResponse({ type: HttpErrorBody, description: 'No valid access token; `details.reason` says why' })
@Controller('projects')
export class ProjectsController {
  constructor(private readonly projects: ProjectsService) {}

  @Get()
  @ApiOperation({ summary: 'The projects I belong to, with my role in each' })
  @ApiOkResponse({ type: [ProjectDto] })
  list(@CurrentUser() me: AuthUser): Promise<ProjectDto[]> {
    return this.projects.listMine(me);
  }

  @Post()
  @ApiOperation({ summary: 'Create a project; I become its owner' })
  @ApiCreatedResponse({ type: ProjectDto })
  @ApiBadRequestResponse({ type: HttpErrorBody })
  create(@CurrentUser() me: AuthUser, @Body() body: CreateProjectDto): Promise<ProjectDto> {
    return this.projects.create(me, body);
  }

  @Get(':projectId')
  @ProjectRoles(...ANY_MEMBER)
  @ApiOperation({ summary: 'One project (any member)' })
  @ApiOkResponse({ type: ProjectDto })
  get(@CurrentAccess() access: ProjectAccess): Promise<ProjectDto> {
    return this.projects.get(access);
  }

  @Patch(':projectId')
  @ProjectRoles('owner')
  @ApiOperation({ summary: 'Rename or describe a project (owner)' })
  @ApiOkResponse({ type: ProjectDto })
  @ApiBadRequestResponse({ type: HttpErrorBody })
  update(@CurrentAccess() access: ProjectAccess, @Body() body: UpdateProjectDto): Promise<ProjectDto> {
    return this.projects.update(access, body);
  }

  @Post(':projectId/archive')
  @ProjectRoles('owner')
  @HttpCode(HttpStatus.OK)
  @ApiOperation({ summary: 'Archive a project (owner); it stays listed and readable' })
  @ApiOkResponse({ type: ProjectDto })
  archive(@CurrentAccess() access: ProjectAccess): Promise<ProjectDto> {
    return this.projects.setArchived(access, true);
  }

  @Post(':projectId/unarchive')
  @ProjectRoles('owner')
  @HttpCode(HttpStatus.OK)
  @ApiOperation({ summary: 'Bring an archived project back (owner)' })
  @ApiOkResponse({ type: ProjectDto })
  unarchive(@CurrentAccess() access: ProjectAccess): Promise<ProjectDto> {
    return this.projects.setArchived(access, false);
  }

  @Post(':projectId/delete-confirmation')
  @ProjectRoles('owner')
  @HttpCode(HttpStatus.OK)
  @ApiOperation({
    summary: 'Step 1 of deleting a project (owner): get a confirmation token',
    description: 'The token is bound to this project and this owner and expires after PW_DELETE_CONFIRM_TTL_S (300 s).',
  })
  @ApiOkResponse({ type: DeleteConfirmationDto })
  deleteConfirmation(@CurrentAccess() access: ProjectAccess, @CurrentUser() me: AuthUser): Promise<DeleteConfirmationDto> {
    return this.projects.deleteConfirmation(access, me);
  }

  @Delete(':projectId')
  @ProjectRoles('owner')
  @HttpCode(HttpStatus.NO_CONTENT)
  @ApiOperation({ summary: 'Step 2: delete the project with its memberships and invitations (owner, with the confirmation token)' })
  @ApiNoContentResponse()
  @ApiBadRequestResponse({ type: HttpErrorBody, description: 'Missing, expired or foreign confirmation token' })
  async remove(@CurrentAccess() access: ProjectAccess, @CurrentUser() me: AuthUser, @Body() body: DeleteProjectDto): Promise<void> {
    await this.projects.delete(access, me, body.confirmationToken);
  }
}
