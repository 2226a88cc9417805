import { Inject, Injectable } from '@nestjs/common';
import { JwtService } from '@nestjs/jwt';
import { InjectConnection, InjectModel } from '@nestjs/sequelize';
import { Op } from 'sequelize';
import type { Sequelize } from 'sequelize-typescript';
import { ACCOUNTS_CONFIG, type AccountsConfig } from '../common/accounts-config.js';
import type { AuthUser, ProjectAccess, ProjectRole } from '../common/auth-user.js';
import { fieldError, projectNotFound } from '../common/errors.js';
import { newId } from '../common/secrets.js';
import { Membership } from '../memberships/models/membership.model.js';
import type { CreateProjectDto, DeleteConfirmationDto, ProjectDto, UpdateProjectDto } from './dto/project.dto.js';
import { Project } from './models/project.model.js';

interface DeleteClaims {
  typ: 'delete-project';
  pid: string;
  sub: string;
}

@Injectable()
export class ProjectsService {
  constructor(
    @Inject(ACCOUNTS_CONFIG) private readonly config: AccountsConfig,
    @InjectConnection() private readonly sequelize: Sequelize,
    @InjectModel(Project) private readonly projects: typeof Project,
    @InjectModel(Membership) private readonly memberships: typeof Membership,
    private readonly jwt: JwtService,
  ) {}

  /** The projects I belong to, with my role, newest first. */
  async listMine(me: AuthUser): Promise<ProjectDto[]> {
    const mine = await this.memberships.findAll({ where: { userId: me.id } });
    if (mine.length === 0) return [];
    const roles = new Map(mine.map((m) => [m.projectId, m.role]));
    const rows = await this.projects.findAll({ where: { id: { [Op.in]: [...roles.keys()] } }, order: [['createdAt', 'DESC']] });
    return rows.map((p) => this.toDto(p, roles.get(p.id)!));
  }

  /** A new project with its creator as the owner (one transaction). */
  async create(me: AuthUser, dto: CreateProjectDto): Promise<ProjectDto> {
    return this.sequelize.transaction(async (transaction) => {
      const project = await this.projects.create(
        { id: newId(), name: dto.name, description: dto.description ?? '', archivedAt: null, createdBy: me.id },
        { transaction },
      );
      await this.memberships.create({ projectId: project.id, userId: me.id, role: 'owner' }, { transaction });
      return this.toDto(project, 'owner');
    });
  }

  async get(access: ProjectAccess): Promise<ProjectDto> {
    return this.toDto(await this.load(access.projectId), access.role);
  }

  async update(access: ProjectAccess, dto: UpdateProjectDto): Promise<ProjectDto> {
    const project = await this.load(access.projectId);
    if (dto.name !== undefined) project.name = dto.name;
    if (dto.description !== undefined) project.description = dto.description;
    await project.save();
    return this.toDto(project, access.role);
  }

  async setArchived(access: ProjectAccess, archived: boolean): Promise<ProjectDto> {
    const project = await this.load(access.projectId);
    if (archived && !project.archivedAt) project.archivedAt = new Date();
    if (!archived) project.archivedAt = null;
    await project.save();
    return this.toDto(project, access.role);
  }

  /** Step 1 of deletion: a short-lived token bound to this project and this owner. */
  async deleteConfirmation(access: ProjectAccess, me: AuthUser): Promise<DeleteConfirmationDto> {
    const project = await this.load(access.projectId);
    const claims: DeleteClaims = { typ: 'delete-project', pid: project.id, sub: me.id };
    const confirmationToken = await this.jwt.signAsync(claims, { expiresIn: this.config.deleteConfirmTtlS });
    return { confirmationToken, expiresAt: new Date(Date.now() + this.config.deleteConfirmTtlS * 1000), projectName: project.name };
  }

  /** Step 2: delete the project (memberships and invitations go with it) if the token matches. */
  async delete(access: ProjectAccess, me: AuthUser, confirmationToken: string): Promise<void> {
    let claims: Partial<DeleteClaims>;
    try {
      claims = await this.jwt.verifyAsync<DeleteClaims>(confirmationToken);
    } catch {
      throw fieldError('confirmationToken', 'confirmationToken is not valid or has expired; ask for a new one');
    }
    if (claims.typ !== 'delete-project' || claims.pid !== access.projectId || claims.sub !== me.id) {
      throw fieldError('confirmationToken', 'confirmationToken was issued for another project or person');
    }
    await this.sequelize.transaction(async (transaction) => {
      const deleted = await this.projects.destroy({ where: { id: access.projectId }, transaction });
      if (deleted !== 1) throw projectNotFound();
    });
  }

  private async load(id: string): Promise<Project> {
    const project = await this.projects.findByPk(id);
    if (!project) throw projectNotFound();
    return project;
  }

  private toDto(p: Project, myRole: ProjectRole): ProjectDto {
    return {
      id: p.id,
      name: p.name,
      description: p.description,
      archived: p.archivedAt !== null,
      archivedAt: p.archivedAt,
      createdAt: p.createdAt,
      updatedAt: p.updatedAt,
      myRole,
    };
  }
}
