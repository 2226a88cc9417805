import { type ExecutionContext, HttpException, Injectable } from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import { AuthGuard } from '@nestjs/passport';
import type { Request } from 'express';
import type { AuthUser } from '../common/auth-user.js';
import { IS_PUBLIC, OPTIONAL_AUTH } from '../common/decorators.js';
import { unauthorized } from '../common/errors.js';

/**
 * The app-wide guard (APP_GUARD): every route needs a valid access token unless marked @Public().
 * A failure is a 401 whose `details.reason` is token_missing, token_expired or token_invalid.
 */
@Injectable()
export class JwtAuthGuard extends AuthGuard('jwt') {
  constructor(private readonly reflector: Reflector) {
    super();
  }

  override async canActivate(context: ExecutionContext): Promise<boolean> {
    const targets = [context.getHandler(), context.getClass()];
    if (this.reflector.getAllAndOverride<boolean>(IS_PUBLIC, targets)) {
      const optional = this.reflector.getAllAndOverride<boolean>(OPTIONAL_AUTH, targets);
      const header = context.switchToHttp().getRequest<Request>().headers.authorization;
      if (!optional || !header) return true;
    }
    return (await super.canActivate(context)) as boolean;
  }

  override handleRequest<TUser = AuthUser>(err: unknown, user: TUser | false, info: unknown): TUser {
    if (err instanceof HttpException) throw err;
    if (err) throw err;
    if (user) return user;
    const name = info instanceof Error ? info.name : '';
    if (name === 'TokenExpiredError') throw unauthorized('token_expired', 'Access token has expired; refresh it or sign in again');
    if (info instanceof Error && /no auth token/i.test(info.message)) {
      throw unauthorized('token_missing', 'Sign in first: send the access token as "Authorization: Bearer <token>"');
    }
    throw unauthorized('token_invalid', 'Access token is not valid; sign in again');
  }
}
