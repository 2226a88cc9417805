import { ConflictException, ForbiddenException, Inject, Injectable, Logger, NotFoundException } from '@nestjs/common';
import { InjectConnection, InjectModel } from '@nestjs/sequelize';
import { Op, type Transaction } from 'sequelize';
import type { Sequelize } from 'sequelize-typescript';
import type { SessionDto } from '../auth/dto/auth.dto.js';
import { PasswordHasher } from '../auth/password-hasher.js';
import { TokensService } from '../auth/tokens.service.js';
import { ACCOUNTS_CONFIG, type AccountsConfig } from '../common/accounts-config.js';
import type { AuthUser, ProjectAccess } from '../common/auth-user.js';
import { fieldError } from '../common/errors.js';
import { passwordProblem } from '../common/password-rule.js';
import { newId, newToken, normalizeEmail, sha256Hex } from '../common/secrets.js';
import { MailService } from '../mail/mail.service.js';
import { invitationAcceptedMail, invitationMail } from '../mail/templates.js';
import { Project } from '../projects/models/project.model.js';
import { User } from '../users/models/user.model.js';
import { UsersService } from '../users/users.service.js';
import type {
  AcceptedInvitationDto,
  AcceptInvitationDto,
  CreateInvitationDto,
  InvitationDto,
  InvitationPreviewDto,
  InvitationState,
} from './dto/membership.dto.js';
import { Invitation } from './models/invitation.model.js';
import { Membership } from './models/membership.model.js';

const invalidLink = () =>
  fieldError('token', 'token is not valid: the invitation was already used, has expired or been withdrawn, or the link was mistyped');

@Injectable()
export class InvitationsService {
  private readonly logger = new Logger('Invitations');

  constructor(
    @Inject(ACCOUNTS_CONFIG) private readonly config: AccountsConfig,
    @InjectConnection() private readonly sequelize: Sequelize,
    @InjectModel(Invitation) private readonly invitations: typeof Invitation,
    @InjectModel(Membership) private readonly memberships: typeof Membership,
    @InjectModel(Project) private readonly projects: typeof Project,
    @InjectModel(User) private readonly userRows: typeof User,
    private readonly users: UsersService,
    private readonly hasher: PasswordHasher,
    private readonly tokens: TokensService,
    private readonly mail: MailService,
  ) {}

  /** Invite an address with a role; earlier pending invitations of that address here are withdrawn. */
  async create(access: ProjectAccess, me: AuthUser, dto: CreateInvitationDto): Promise<InvitationDto> {
    const email = normalizeEmail(dto.email);
    const token = newToken();
    const expiresAt = new Date(Date.now() + this.config.invitationTtlS * 1000);
    const { invitation, project } = await this.sequelize.transaction(async (transaction) => {
      const existing = await this.users.findByEmail(email, transaction);
      if (existing && (await this.memberships.findOne({ where: { projectId: access.projectId, userId: existing.id }, transaction }))) {
        throw new ConflictException({ message: `${email} is already a member of this project`, details: { reason: 'already_member' } });
      }
      await this.invitations.update(
        { revokedAt: new Date() },
        { where: { projectId: access.projectId, email, acceptedAt: { [Op.is]: null }, revokedAt: { [Op.is]: null } }, transaction },
      );
      const invitation = await this.invitations.create(
        { id: newId(), projectId: access.projectId, email, role: dto.role, tokenHash: sha256Hex(token), invitedBy: me.id, expiresAt },
        { transaction },
      );
      const project = await this.projects.findByPk(access.projectId, { transaction });
      return { invitation, project: project! };
    });
    const link = this.mail.link('/invitations/accept', { token });
    const mailSent = await this.mail.send(
      email,
      invitationMail({ projectName: project.name, inviterName: me.displayName, role: dto.role, link, expiresAt }),
    );
    return { ...this.toDto(invitation), mailSent };
  }

  async list(projectId: string): Promise<InvitationDto[]> {
    const rows = await this.invitations.findAll({ where: { projectId }, order: [['createdAt', 'DESC']] });
    return rows.map((r) => this.toDto(r));
  }

  async revoke(projectId: string, invitationId: string): Promise<void> {
    const [count] = await this.invitations.update(
      { revokedAt: new Date() },
      { where: { id: invitationId, projectId, acceptedAt: { [Op.is]: null }, revokedAt: { [Op.is]: null } } },
    );
    if (count === 0) throw new NotFoundException({ message: 'No pending invitation with this id in this project', details: null });
  }

  /** What an invitation link offers, so the app can show "sign in" or "create an account". */
  async preview(token: string): Promise<InvitationPreviewDto> {
    const invitation = await this.usable(token);
    const project = await this.projects.findByPk(invitation.projectId);
    const inviter = invitation.invitedBy ? await this.users.findById(invitation.invitedBy) : null;
    return {
      projectName: project!.name,
      role: invitation.role,
      email: invitation.email,
      invitedBy: inviter?.displayName ?? null,
      expiresAt: invitation.expiresAt,
      accountExists: (await this.users.findByEmail(invitation.email)) !== null,
    };
  }

  /**
   * Accept: as the signed-in user whose address was invited, or (not signed in, no account with that
   * address yet) by registering with displayName and password. One transaction; the owners are told
   * by e-mail afterwards.
   */
  async accept(dto: AcceptInvitationDto, me: AuthUser | undefined): Promise<AcceptedInvitationDto> {
    const preview = await this.usable(dto.token);
    let passwordHash: string | undefined;
    if (!me) {
      if (dto.displayName === undefined) throw fieldError('displayName', 'displayName is needed to create an account (or sign in first)');
      if (dto.password === undefined) throw fieldError('password', 'password is needed to create an account (or sign in first)');
      const problem = passwordProblem(dto.password, preview.email);
      if (problem) throw fieldError('password', `password ${problem}`);
      passwordHash = await this.hasher.hash(dto.password);
    }
    const result = await this.sequelize.transaction(async (transaction) => {
      const invitation = await this.usable(dto.token, transaction);
      let user: User;
      let session: SessionDto | undefined;
      if (me) {
        if (normalizeEmail(me.email) !== invitation.email) {
          throw new ForbiddenException({
            message: 'This invitation was sent to another address; sign in with that address to accept it',
            details: { reason: 'email_mismatch' },
          });
        }
        user = (await this.users.findById(me.id, transaction))!;
      } else {
        if (await this.users.findByEmail(invitation.email, transaction)) {
          throw new ConflictException({
            message: 'An account already uses the invited address: sign in, then accept the invitation',
            details: { reason: 'account_exists' },
          });
        }
        user = await this.users.create({ email: invitation.email, displayName: dto.displayName!, passwordHash: passwordHash! }, transaction);
        session = { ...(await this.tokens.issue(user, transaction)), user: this.users.toProfile(user) };
      }
      let membership = await this.memberships.findOne({ where: { projectId: invitation.projectId, userId: user.id }, transaction });
      // Already a member (joined another way meanwhile): keep the current role.
      membership ??= await this.memberships.create({ projectId: invitation.projectId, userId: user.id, role: invitation.role }, { transaction });
      invitation.acceptedAt = new Date();
      invitation.acceptedBy = user.id;
      await invitation.save({ transaction });
      return { user, membership, session };
    });
    await this.notifyOwners(result.membership, result.user);
    return { projectId: result.membership.projectId, role: result.membership.role, session: result.session };
  }

  private async notifyOwners(membership: Membership, member: User): Promise<void> {
    const project = await this.projects.findByPk(membership.projectId);
    if (!project) return;
    const owners = await this.memberships.findAll({ where: { projectId: project.id, role: 'owner' } });
    const ownerUsers = await this.userRows.findAll({ where: { id: { [Op.in]: owners.map((o) => o.userId) } } });
    const link = this.mail.link(`/projects/${project.id}`);
    for (const owner of ownerUsers) {
      if (owner.id === member.id) continue;
      await this.mail.send(
        owner.email,
        invitationAcceptedMail({
          ownerName: owner.displayName,
          memberName: member.displayName,
          memberEmail: member.email,
          projectName: project.name,
          role: membership.role,
          link,
        }),
      );
    }
    this.logger.log(`invitation accepted: user ${member.id} joined project ${project.id} as ${membership.role}`);
  }

  /** The invitation a token names, if it can still be accepted (else 400 naming `token`). */
  private async usable(token: string, transaction?: Transaction): Promise<Invitation> {
    const invitation = await this.invitations.findOne({
      where: { tokenHash: sha256Hex(token) },
      transaction,
      lock: transaction ? transaction.LOCK.UPDATE : undefined,
    });
    if (!invitation || this.state(invitation) !== 'pending') throw invalidLink();
    return invitation;
  }

  private state(i: Invitation): InvitationState {
    if (i.acceptedAt) return 'accepted';
    if (i.revokedAt) return 'revoked';
    if (i.expiresAt.getTime() <= Date.now()) return 'expired';
    return 'pending';
  }

  private toDto(i: Invitation): InvitationDto {
    return { id: i.id, email: i.email, role: i.role, state: this.state(i), expiresAt: i.expiresAt, createdAt: i.createdAt };
  }
}
