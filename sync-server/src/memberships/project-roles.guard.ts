import {
  applyDecorators,
  type CanActivate,
  type ExecutionContext,
  ForbiddenException,
  Injectable,
  SetMetadata,
  UseGuards,
} from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import { InjectModel } from '@nestjs/sequelize';
import { ApiForbiddenResponse, ApiNotFoundResponse, ApiParam } from '@nestjs/swagger';
import type { AuthedRequest, ProjectRole } from '../common/auth-user.js';
import { projectNotFound } from '../common/errors.js';
import { HttpErrorBody } from '../common/http-error.js';
import { Membership } from './models/membership.model.js';

const PROJECT_ROLES_KEY = 'pw:projectRoles';
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/**
 * Reads `:projectId`, finds the caller's membership and lets the request through when the role is
 * one of those named by @ProjectRoles(). Anyone outside the project (site admins included) gets the
 * same 404 as for a project that does not exist; a member whose role is too weak gets 403.
 */
@Injectable()
export class ProjectRolesGuard implements CanActivate {
  constructor(
    private readonly reflector: Reflector,
    @InjectModel(Membership) private readonly memberships: typeof Membership,
  ) {}

  async canActivate(context: ExecutionContext): Promise<boolean> {
    const allowed = this.reflector.getAllAndOverride<ProjectRole[]>(PROJECT_ROLES_KEY, [context.getHandler(), context.getClass()]);
    const req = context.switchToHttp().getRequest<AuthedRequest>();
    const projectId = req.params.projectId;
    const user = req.user;
    if (!allowed || typeof projectId !== 'string' || !user) throw projectNotFound();
    if (!UUID.test(projectId)) throw projectNotFound();
    const membership = await this.memberships.findOne({ where: { projectId: projectId.toLowerCase(), userId: user.id } });
    if (!membership) throw projectNotFound();
    if (!allowed.includes(membership.role)) {
      throw new ForbiddenException({
        message: `Your role in this project (${membership.role}) may not do this; it needs ${allowed.join(' or ')}`,
        details: { role: membership.role, needs: allowed },
      });
    }
    req.projectAccess = { projectId: membership.projectId, role: membership.role };
    return true;
  }
}

/** The route acts on project `:projectId` and needs one of these roles in it. */
export const ProjectRoles = (...roles: ProjectRole[]) =>
  applyDecorators(
    SetMetadata(PROJECT_ROLES_KEY, roles),
    UseGuards(ProjectRolesGuard),
    ApiParam({ name: 'projectId', format: 'uuid' }),
    ApiNotFoundResponse({ type: HttpErrorBody, description: 'No such project, or you are not a member (the two look the same)' }),
    ApiForbiddenResponse({ type: HttpErrorBody, description: `A member whose role is not ${roles.join('/')}` }),
  );

export const ANY_MEMBER: ProjectRole[] = ['owner', 'editor', 'reviewer', 'viewer'];
