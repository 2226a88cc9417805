import { createHmac } from 'node:crypto';
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
import { refreshReuseGraceS } from './refresh-reuse-grace.js';
import { retryOnDeadlock } from '../database/deadlock-retry.js';

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
 *
 * Grace window (refreshReuseGraceS, PW_REFRESH_REUSE_GRACE_S, 30 s): why it exists. A client can
 * lose the answer of a refresh the server already carried out: the page reloads (or the tab is
 * closed, or the network drops) after the server rotated the token but before the PWA stored the
 * new one. The client then presents the old token again, which without a window is "reuse" and
 * signs the device out although nothing leaked. So a used token presented again within the window
 * of its rotation, while its successor has not been used yet, gets a fresh access token and the
 * same successor again (the family stays one chain). After the window, or once the successor has
 * been used, the old token is reuse as before and the family is revoked. Identity providers offer
 * the same trade-off under names like "reuse interval" or "rotation grace period" (common practice);
 * the cost is that a token stolen and replayed within those seconds goes unnoticed until the next
 * rotation conflict.
 *
 * To hand out the same successor without storing any token in plain text, the successor is not
 * random but HMAC-SHA256(server secret, presented token): whoever holds the presented token and
 * not the secret cannot compute it, and only its hash is stored, as for every other token.
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
  async issue(user: User, transaction: Transaction, familyId: string = newId(), refreshToken: string = newToken()): Promise<TokenPairDto> {
    const refreshExpiresAt = new Date(Date.now() + this.config.refreshTokenTtlS * 1000);
    await this.refreshTokens.create(
      { id: newId(), userId: user.id, familyId, tokenHash: sha256Hex(refreshToken), expiresAt: refreshExpiresAt, usedAt: null, revokedAt: null },
      { transaction },
    );
    return { ...(await this.accessFor(user)), refreshToken, refreshExpiresAt };
  }

  private async accessFor(user: User): Promise<{ accessToken: string; expiresIn: number }> {
    const claims: AccessClaims = { sub: user.id, ver: user.tokenVersion, typ: 'access' };
    const accessToken = await this.jwt.signAsync(claims, { expiresIn: this.config.accessTokenTtlS });
    return { accessToken, expiresIn: this.config.accessTokenTtlS };
  }

  /** The token that replaces `presented` on rotation (see the class comment: same input, same successor). */
  private successorOf(presented: string): string {
    return createHmac('sha256', this.config.jwtSecret).update('phasewright refresh successor\0').update(presented, 'utf8').digest('base64url');
  }

  /**
   * The still unused successor of a used token presented again within the grace window, locked for
   * the transaction; null when the window is over or off, or the successor was used or revoked
   * (then the presentation is reuse).
   */
  private async unusedSuccessorInGrace(row: RefreshToken, presented: string, transaction: Transaction): Promise<RefreshToken | null> {
    const graceMs = refreshReuseGraceS(this.config.refreshReuseGraceS) * 1000;
    if (!row.usedAt || graceMs <= 0 || Date.now() - row.usedAt.getTime() > graceMs) return null;
    const successor = await this.refreshTokens.findOne({
      where: { tokenHash: sha256Hex(this.successorOf(presented)), familyId: row.familyId },
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    if (!successor || successor.usedAt || successor.revokedAt || successor.expiresAt.getTime() <= Date.now()) return null;
    return successor;
  }

  /**
   * Exchange a refresh token for a new pair. The reuse check and the rotation happen under a row
   * lock, so two concurrent refreshes with one token cannot both rotate it (the second one is
   * answered from the grace window with the same successor, or is reuse after it). A reuse is recorded
   * (family revoked) even though the request fails, hence the separate commit before throwing.
   */
  async rotate(presented: string, loadUser: (id: string, t: Transaction) => Promise<User | null>): Promise<{ user: User; tokens: TokenPairDto }> {
    // Sign-ins and refreshes of one user at once can deadlock in InnoDB (token row, then user row,
    // against the other order); the transaction is then simply run again.
    const outcome = await retryOnDeadlock(() => this.sequelize.transaction(async (transaction) => {
      const row = await this.refreshTokens.findOne({
        where: { tokenHash: sha256Hex(presented) },
        transaction,
        lock: transaction.LOCK.UPDATE,
      });
      const failed = (fail: 'token_invalid' | 'refresh_reused' | 'token_expired') => ({ fail, user: undefined, tokens: undefined });
      if (!row || row.revokedAt) return failed('token_invalid');
      if (row.usedAt) {
        // Within the grace window (see the class comment) the lost answer is given again.
        const successor = await this.unusedSuccessorInGrace(row, presented, transaction);
        const user = successor ? await loadUser(row.userId, transaction) : null;
        if (!successor || !user) {
          await this.revokeFamily(row.familyId, transaction);
          return failed('refresh_reused');
        }
        const tokens: TokenPairDto = { ...(await this.accessFor(user)), refreshToken: this.successorOf(presented), refreshExpiresAt: successor.expiresAt };
        return { fail: undefined, user, tokens };
      }
      if (row.expiresAt.getTime() <= Date.now()) return failed('token_expired');
      const user = await loadUser(row.userId, transaction);
      if (!user) return failed('token_invalid');
      row.usedAt = new Date();
      await row.save({ transaction });
      return { fail: undefined, user, tokens: await this.issue(user, transaction, row.familyId, this.successorOf(presented)) };
    }));
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
