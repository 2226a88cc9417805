import { Inject, Injectable } from '@nestjs/common';
import { InjectConnection, InjectModel } from '@nestjs/sequelize';
import type { Sequelize } from 'sequelize-typescript';
import { ACCOUNTS_CONFIG, type AccountsConfig } from '../common/accounts-config.js';
import type { AuthUser } from '../common/auth-user.js';
import { fieldError, unauthorized } from '../common/errors.js';
import { passwordProblem } from '../common/password-rule.js';
import { newId, newToken, sha256Hex } from '../common/secrets.js';
import { MailService } from '../mail/mail.service.js';
import { passwordResetMail } from '../mail/templates.js';
import { UsersService } from '../users/users.service.js';
import type { ChangePasswordDto, RegisterDto, SessionDto, SignInDto, TokenPairDto } from './dto/auth.dto.js';
import { PasswordReset } from './models/password-reset.model.js';
import { PasswordHasher } from './password-hasher.js';
import { TokensService } from './tokens.service.js';

@Injectable()
export class AuthService {
  constructor(
    @Inject(ACCOUNTS_CONFIG) private readonly config: AccountsConfig,
    @InjectConnection() private readonly sequelize: Sequelize,
    @InjectModel(PasswordReset) private readonly resets: typeof PasswordReset,
    private readonly users: UsersService,
    private readonly hasher: PasswordHasher,
    private readonly tokens: TokensService,
    private readonly mail: MailService,
  ) {}

  async register(dto: RegisterDto): Promise<SessionDto> {
    const passwordHash = await this.hasher.hash(dto.password);
    return this.sequelize.transaction(async (transaction) => {
      const user = await this.users.create({ email: dto.email, displayName: dto.displayName, passwordHash }, transaction);
      const tokens = await this.tokens.issue(user, transaction);
      return { ...tokens, user: this.users.toProfile(user) };
    });
  }

  async signIn(dto: SignInDto): Promise<SessionDto> {
    const user = await this.users.findByEmail(dto.email);
    const ok = user ? await this.hasher.verify(dto.password, user.passwordHash) : await this.hasher.verifyDecoy(dto.password);
    if (!user || !ok) throw unauthorized('bad_credentials', 'Wrong e-mail address or password');
    const tokens = await this.sequelize.transaction((transaction) => this.tokens.issue(user, transaction));
    return { ...tokens, user: this.users.toProfile(user) };
  }

  refresh(refreshToken: string): Promise<TokenPairDto> {
    return this.tokens.rotate(refreshToken, (id, t) => this.users.findById(id, t)).then((r) => r.tokens);
  }

  async signOut(refreshToken: string): Promise<void> {
    await this.tokens.revokeByToken(refreshToken);
  }

  /** New password, every other session signed out (refresh tokens revoked, access tokens outdated). */
  async changePassword(me: AuthUser, dto: ChangePasswordDto): Promise<SessionDto> {
    const user = await this.users.getById(me.id);
    if (!(await this.hasher.verify(dto.currentPassword, user.passwordHash))) {
      throw fieldError('currentPassword', 'currentPassword is not correct');
    }
    const problem = passwordProblem(dto.newPassword, user.email);
    if (problem) throw fieldError('newPassword', `newPassword ${problem}`);
    const passwordHash = await this.hasher.hash(dto.newPassword);
    return this.sequelize.transaction(async (transaction) => {
      const locked = await this.users.getById(me.id, transaction);
      locked.passwordHash = passwordHash;
      locked.tokenVersion += 1;
      await locked.save({ transaction });
      await this.tokens.revokeAllOfUser(locked.id, transaction);
      const tokens = await this.tokens.issue(locked, transaction);
      return { ...tokens, user: this.users.toProfile(locked) };
    });
  }

  /** Mail a reset link when the address has an account; the answer is the same either way. */
  async forgotPassword(email: string): Promise<void> {
    const user = await this.users.findByEmail(email);
    if (!user) return;
    const token = newToken();
    const expiresAt = new Date(Date.now() + this.config.resetTtlS * 1000);
    await this.resets.create({ id: newId(), userId: user.id, tokenHash: sha256Hex(token), expiresAt, usedAt: null });
    const link = this.mail.link('/reset-password', { token });
    await this.mail.send(user.email, passwordResetMail({ displayName: user.displayName, link, expiresAt }));
  }

  async resetPassword(token: string, password: string): Promise<void> {
    const row = await this.resets.findOne({ where: { tokenHash: sha256Hex(token) } });
    const invalid = () => fieldError('token', 'token is not valid: the link was already used, has expired or was mistyped; ask for a new one');
    if (!row || row.usedAt || row.expiresAt.getTime() <= Date.now()) throw invalid();
    const user = await this.users.getById(row.userId);
    const problem = passwordProblem(password, user.email);
    if (problem) throw fieldError('password', `password ${problem}`);
    const passwordHash = await this.hasher.hash(password);
    await this.sequelize.transaction(async (transaction) => {
      const locked = await this.resets.findByPk(row.id, { transaction, lock: transaction.LOCK.UPDATE });
      if (!locked || locked.usedAt) throw invalid();
      locked.usedAt = new Date();
      await locked.save({ transaction });
      const u = await this.users.getById(row.userId, transaction);
      u.passwordHash = passwordHash;
      u.tokenVersion += 1;
      await u.save({ transaction });
      await this.tokens.revokeAllOfUser(u.id, transaction);
    });
  }
}
