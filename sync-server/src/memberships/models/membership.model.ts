import { Column, CreatedAt, DataType, Model, PrimaryKey, Table, UpdatedAt } from 'sequelize-typescript';
import type { ProjectRole } from '../../common/auth-user.js';

@Table({ tableName: 'memberships', underscored: true })
export class Membership extends Model {
  @PrimaryKey
  @Column(DataType.CHAR(36))
  declare projectId: string;

  @PrimaryKey
  @Column(DataType.CHAR(36))
  declare userId: string;

  @Column(DataType.ENUM('owner', 'editor', 'reviewer', 'viewer'))
  declare role: ProjectRole;

  @CreatedAt
  declare createdAt: Date;

  @UpdatedAt
  declare updatedAt: Date;
}
