import { Inject, Injectable } from '@nestjs/common';
import { PassportStrategy } from '@nestjs/passport';
import { ExtractJwt, Strategy } from 'passport-jwt';
import { ACCOUNTS_CONFIG, type AccountsConfig } from '../common/accounts-config.js';
import type { AuthUser } from '../common/auth-user.js';
import { unauthorized } from '../common/errors.js';
import { UsersService } from '../users/users.service.js';
import type { AccessClaims } from './tokens.service.js';

/** Verifies the bearer token (passport-jwt) and loads the user it names. */
@Injectable()
export class JwtStrategy extends PassportStrategy(Strategy, 'jwt') {
  constructor(
    @Inject(ACCOUNTS_CONFIG) config: AccountsConfig,
    private readonly users: UsersService,
  ) {
    super({
      jwtFromRequest: ExtractJwt.fromAuthHeaderAsBearerToken(),
      secretOrKey: config.jwtSecret,
      algorithms: ['HS256'],
      ignoreExpiration: false,
    });
  }

  /** The signature and expiry are checked; here the user must still exist and the token be current. */
  async validate(claims: Partial<AccessClaims>): Promise<AuthUser> {
    if (claims.typ !== 'access' || typeof claims.sub !== 'string') {
      throw unauthorized('token_invalid', 'Access token is not valid; sign in again');
    }
    const user = await this.users.findById(claims.sub);
    if (!user || user.tokenVersion !== claims.ver) {
      throw unauthorized('token_invalid', 'Access token was revoked (password changed or account gone); sign in again');
    }
    return this.users.toAuthUser(user);
  }
}
