import { createParamDecorator, type ExecutionContext, SetMetadata, UnauthorizedException } from '@nestjs/common';
import type { AuthedRequest, AuthUser, ProjectAccess } from './auth-user.js';

export const IS_PUBLIC = 'pw:isPublic';
export const OPTIONAL_AUTH = 'pw:optionalAuth';

/** The route needs no access token (the app-wide JWT guard lets it through). */
export const Public = () => SetMetadata(IS_PUBLIC, true);

/**
 * The route works without a token, but when an Authorization header is sent it must be valid
 * and the user is then known (e.g. accepting an invitation while signed in).
 */
export const OptionalAuth = () => SetMetadata(OPTIONAL_AUTH, true);

/** The signed-in user (routes behind the JWT guard). */
export const CurrentUser = createParamDecorator((_data: unknown, ctx: ExecutionContext): AuthUser => {
  const user = ctx.switchToHttp().getRequest<AuthedRequest>().user;
  if (!user) throw new UnauthorizedException({ message: 'Sign in first', details: { reason: 'token_missing' } });
  return user;
});

/** The signed-in user or undefined (routes marked @OptionalAuth()). */
export const MaybeUser = createParamDecorator(
  (_data: unknown, ctx: ExecutionContext): AuthUser | undefined => ctx.switchToHttp().getRequest<AuthedRequest>().user,
);

/** The caller's role in the project of the route (set by the project-role guard). */
export const CurrentAccess = createParamDecorator((_data: unknown, ctx: ExecutionContext): ProjectAccess => {
  const access = ctx.switchToHttp().getRequest<AuthedRequest>().projectAccess;
  if (!access) throw new Error('CurrentAccess used on a route without @ProjectRoles()');
  return access;
});
