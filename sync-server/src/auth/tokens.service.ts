import { Inject, Injectable } from '@nestjs/common';
import { JwtService } from '@nestjs/jwt';
import { InjectConnection, InjectModel } from '@nestjs/sequelize';
import { Op, type Transaction } from 'sequelize';
import type { Sequelize } from 'sequelize-typescript';
import { ACCOUNTS_CONFIG, type AccountsConfig } from '../common/accounts-config.js';
import { unauthorized } from '../common/errors.js';
import { newId, newToken, sha256Hex } from '../common/secrets.js';
import type { User } from '../users/models/user.model.js';
import type { TokenPairDto } from './dto/auth.dto.js';
import { RefreshToken } from './models/refresh-token.model.js';

/** Claims of an access token. `ver` must equal the user's token_version (bumped on password change). */
export interface AccessClaims {
  sub: string;
  ver: number;
  typ: 'access';
}

/**
 * Access tokens (JWT, HS256, short-lived) and refresh tokens (random, single use, stored hashed,
 * grouped in families). Each refresh marks the presented token used and issues a new one in the same
 * family; presenting a used token again means it leaked (or two clients share it) and revokes the
 * whole family, so both holders must sign in again.
 */
@Injectable()
export class TokensService {
  constructor(
    @Inject(ACCOUNTS_CONFIG) private readonly config: AccountsConfig,
    private readonly jwt: JwtService,
    @InjectModel(RefreshToken) private readonly refreshTokens: typeof RefreshToken,
    @InjectConnection() private readonly sequelize: Sequelize,
  ) {}

  /** A new session: a fresh refresh-token family and an access token. */
  async issue(user: User, transaction: Transaction, familyId: string = newId()): Promise<TokenPairDto> {
    const refreshToken = newToken();
    const refreshExpiresAt = new Date(Date.now() + this.config.refreshTokenTtlS * 1000);
    await this.refreshTokens.create(
      { id: newId(), userId: user.id, familyId, tokenHash: sha256Hex(refreshToken), expiresAt: refreshExpiresAt, usedAt: null, revokedAt: null },
      { transaction },
    );
    const claims: AccessClaims = { sub: user.id, ver: user.tokenVersion, typ: 'access' };
    const accessToken = await this.jwt.signAsync(claims, { expiresIn: this.config.accessTokenTtlS });
    return { accessToken, expiresIn: this.config.accessTokenTtlS, refreshToken, refreshExpiresAt };
  }

  /**
   * Exchange a refresh token for a new pair. The reuse check and the rotation happen under a row
   * lock, so two concurrent refreshes with one token cannot both succeed. A reuse is recorded
   * (family revoked) even though the request fails, hence the separate commit before throwing.
   */
  async rotate(presented: string, loadUser: (id: string, t: Transaction) => Promise<User | null>): Promise<{ user: User; tokens: TokenPairDto }> {
    const outcome = await this.sequelize.transaction(async (transaction) => {
      const row = await this.refreshTokens.findOne({
        where: { tokenHash: sha256Hex(presented) },
        transaction,
        lock: transaction.LOCK.UPDATE,
      });
      const failed = (fail: 'token_invalid' | 'refresh_reused' | 'token_expired') => ({ fail, user: undefined, tokens: undefined });
      if (!row || row.revokedAt) return failed('token_invalid');
      if (row.usedAt) {
        await this.revokeFamily(row.familyId, transaction);
        return failed('refresh_reused');
      }
      if (row.expiresAt.getTime() <= Date.now()) return failed('token_expired');
      const user = await loadUser(row.userId, transaction);
      if (!user) return failed('token_invalid');
      row.usedAt = new Date();
      await row.save({ transaction });
      return { fail: undefined, user, tokens: await this.issue(user, transaction, row.familyId) };
    });
    if (outcome.fail !== undefined) {
      const messages = {
        token_invalid: 'Refresh token is not valid (signed out or revoked); sign in again',
        refresh_reused: 'Refresh token was already used; every session of this sign-in is revoked, sign in again',
        token_expired: 'Refresh token has expired; sign in again',
      };
      throw unauthorized(outcome.fail, messages[outcome.fail]);
    }
    return { user: outcome.user, tokens: outcome.tokens };
  }

  /** Sign-out: revoke the family of the presented token (unknown tokens are ignored). */
  async revokeByToken(presented: string): Promise<boolean> {
    return this.sequelize.transaction(async (transaction) => {
      const row = await this.refreshTokens.findOne({ where: { tokenHash: sha256Hex(presented) }, transaction });
      if (!row) return false;
      await this.revokeFamily(row.familyId, transaction);
      return true;
    });
  }

  async revokeAllOfUser(userId: string, transaction: Transaction): Promise<void> {
    await this.refreshTokens.update({ revokedAt: new Date() }, { where: { userId, revokedAt: { [Op.is]: null } }, transaction });
  }

  private async revokeFamily(familyId: string, transaction: Transaction): Promise<void> {
    await this.refreshTokens.update({ revokedAt: new Date() }, { where: { familyId, revokedAt: { [Op.is]: null } }, transaction });
  }
}
