import { Injectable, NotFoundException } from '@nestjs/common';
import { InjectModel } from '@nestjs/sequelize';
import { type Transaction, UniqueConstraintError } from 'sequelize';
import type { AuthUser, SiteRole } from '../common/auth-user.js';
import { fieldError } from '../common/errors.js';
import { newId, normalizeEmail } from '../common/secrets.js';
import type { UserProfileDto } from './dto/user-profile.dto.js';
import { User } from './models/user.model.js';

export interface NewUser {
  email: string;
  displayName: string;
  passwordHash: string;
  siteRole?: SiteRole;
}

@Injectable()
export class UsersService {
  constructor(@InjectModel(User) private readonly users: typeof User) {}

  findByEmail(email: string, transaction?: Transaction): Promise<User | null> {
    return this.users.findOne({ where: { email: normalizeEmail(email) }, transaction });
  }

  findById(id: string, transaction?: Transaction): Promise<User | null> {
    return this.users.findByPk(id, { transaction });
  }

  async getById(id: string, transaction?: Transaction): Promise<User> {
    const user = await this.findById(id, transaction);
    if (!user) throw new NotFoundException({ message: 'No such user', details: null });
    return user;
  }

  /**
   * Create an account; a taken address is a 400 naming `email`. The unique index decides (a locking
   * pre-check would make concurrent registrations deadlock on InnoDB's gap locks).
   */
  async create(input: NewUser, transaction: Transaction): Promise<User> {
    const email = normalizeEmail(input.email);
    const taken = () => fieldError('email', 'email is already registered');
    if (await this.users.findOne({ where: { email }, transaction })) throw taken();
    try {
      return await this.users.create(
        {
          id: newId(),
          email,
          displayName: input.displayName,
          passwordHash: input.passwordHash,
          siteRole: input.siteRole ?? 'member',
          tokenVersion: 0,
        },
        { transaction },
      );
    } catch (err) {
      if (err instanceof UniqueConstraintError) throw taken();
      throw err;
    }
  }

  async updateDisplayName(id: string, displayName: string): Promise<User> {
    const user = await this.getById(id);
    user.displayName = displayName;
    return user.save();
  }

  toProfile(user: User): UserProfileDto {
    return { id: user.id, email: user.email, displayName: user.displayName, siteRole: user.siteRole, createdAt: user.createdAt };
  }

  toAuthUser(user: User): AuthUser {
    return { id: user.id, email: user.email, displayName: user.displayName, siteRole: user.siteRole };
  }
}
