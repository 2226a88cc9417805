import { applyDecorators, type CanActivate, type ExecutionContext, ForbiddenException, Injectable, UseGuards } from '@nestjs/common';
import { ApiForbiddenResponse } from '@nestjs/swagger';
import type { AuthedRequest } from './auth-user.js';
import { HttpErrorBody } from './http-error.js';

@Injectable()
export class SiteAdminGuard implements CanActivate {
  canActivate(context: ExecutionContext): boolean {
    const user = context.switchToHttp().getRequest<AuthedRequest>().user;
    if (user?.siteRole !== 'admin') throw new ForbiddenException({ message: 'Only site admins may do this', details: null });
    return true;
  }
}

/** The route is for site admins (after the app-wide JWT guard has identified the user). */
export const SiteAdminOnly = () =>
  applyDecorators(UseGuards(SiteAdminGuard), ApiForbiddenResponse({ type: HttpErrorBody, description: 'Not a site admin' }));
