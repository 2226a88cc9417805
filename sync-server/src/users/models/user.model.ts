import { Column, CreatedAt, DataType, Model, PrimaryKey, Table, UpdatedAt } from 'sequelize-typescript';
import type { SiteRole } from '../../common/auth-user.js';

@Table({ tableName: 'users', underscored: true })
export class User extends Model {
  @PrimaryKey
  @Column(DataType.CHAR(36))
  declare id: string;

  @Column(DataType.STRING(254))
  declare email: string;

  @Column(DataType.STRING(100))
  declare displayName: string;

  /** Never leaves the server: UsersService.toProfile() is the only way users reach a response. */
  @Column(DataType.STRING(255))
  declare passwordHash: string;

  @Column(DataType.ENUM('admin', 'member'))
  declare siteRole: SiteRole;

  @Column(DataType.INTEGER)
  declare tokenVersion: number;

  @CreatedAt
  declare createdAt: Date;

  @UpdatedAt
  declare updatedAt: Date;
}
