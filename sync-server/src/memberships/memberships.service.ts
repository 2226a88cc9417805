import { ConflictException, ForbiddenException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectConnection, InjectModel } from '@nestjs/sequelize';
import { Op, type Transaction } from 'sequelize';
import type { Sequelize } from 'sequelize-typescript';
import type { AuthUser, ProjectAccess, ProjectRole } from '../common/auth-user.js';
import { User } from '../users/models/user.model.js';
import type { MemberDto } from './dto/membership.dto.js';
import { Membership } from './models/membership.model.js';

const ROLE_ORDER: Record<ProjectRole, number> = { owner: 0, editor: 1, reviewer: 2, viewer: 3 };

@Injectable()
export class MembershipsService {
  constructor(
    @InjectConnection() private readonly sequelize: Sequelize,
    @InjectModel(Membership) private readonly memberships: typeof Membership,
    @InjectModel(User) private readonly users: typeof User,
  ) {}

  async list(projectId: string): Promise<MemberDto[]> {
    const rows = await this.memberships.findAll({ where: { projectId } });
    const users = await this.users.findAll({ where: { id: { [Op.in]: rows.map((m) => m.userId) } } });
    const byId = new Map(users.map((u) => [u.id, u]));
    return rows
      .map((m) => {
        const u = byId.get(m.userId)!;
        return { userId: m.userId, displayName: u.displayName, email: u.email, role: m.role, since: m.createdAt };
      })
      .sort((a, b) => ROLE_ORDER[a.role] - ROLE_ORDER[b.role] || a.displayName.localeCompare(b.displayName));
  }

  /** Change a member's role; the last owner cannot be demoted (409). */
  async changeRole(access: ProjectAccess, userId: string, role: ProjectRole): Promise<MemberDto> {
    await this.sequelize.transaction(async (transaction) => {
      const target = await this.lockedMember(access.projectId, userId, transaction);
      if (target.role === 'owner' && role !== 'owner') await this.ensureAnotherOwner(access.projectId, transaction);
      target.role = role;
      await target.save({ transaction });
    });
    return (await this.list(access.projectId)).find((m) => m.userId === userId)!;
  }

  /** Owners remove anyone; every member may remove themselves (leave). The last owner stays (409). */
  async remove(access: ProjectAccess, me: AuthUser, userId: string): Promise<void> {
    if (access.role !== 'owner' && userId !== me.id) {
      throw new ForbiddenException({ message: 'Only owners remove other members; you may remove yourself', details: { role: access.role } });
    }
    await this.sequelize.transaction(async (transaction) => {
      const target = await this.lockedMember(access.projectId, userId, transaction);
      if (target.role === 'owner') await this.ensureAnotherOwner(access.projectId, transaction);
      await target.destroy({ transaction });
    });
  }

  private async lockedMember(projectId: string, userId: string, transaction: Transaction): Promise<Membership> {
    // Lock every owner row of the project too, so two owners cannot demote each other at once.
    await this.memberships.findAll({ where: { projectId, role: 'owner' }, transaction, lock: transaction.LOCK.UPDATE });
    const target = await this.memberships.findOne({ where: { projectId, userId }, transaction, lock: transaction.LOCK.UPDATE });
    if (!target) throw new NotFoundException({ message: 'No such member in this project', details: null });
    return target;
  }

  private async ensureAnotherOwner(projectId: string, transaction: Transaction): Promise<void> {
    const owners = await this.memberships.count({ where: { projectId, role: 'owner' }, transaction });
    if (owners <= 1) {
      throw new ConflictException({
        message: 'A project needs at least one owner: make someone else owner first (or delete the project)',
        details: { reason: 'last_owner' },
      });
    }
  }
}
