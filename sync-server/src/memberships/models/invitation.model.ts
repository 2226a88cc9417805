import { Column, CreatedAt, DataType, Model, PrimaryKey, Table } from 'sequelize-typescript';
import type { ProjectRole } from '../../common/auth-user.js';

/** An e-mailed invitation (token stored as its SHA-256; single use, expiring). */
@Table({ tableName: 'invitations', underscored: true, updatedAt: false })
export class Invitation extends Model {
  @PrimaryKey
  @Column(DataType.CHAR(36))
  declare id: string;

  @Column(DataType.CHAR(36))
  declare projectId: string;

  @Column(DataType.STRING(254))
  declare email: string;

  @Column(DataType.ENUM('owner', 'editor', 'reviewer', 'viewer'))
  declare role: ProjectRole;

  @Column(DataType.CHAR(64))
  declare tokenHash: string;

  @Column(DataType.CHAR(36))
  declare invitedBy: string | null;

  @Column(DataType.DATE(3))
  declare expiresAt: Date;

  @Column(DataType.DATE(3))
  declare acceptedAt: Date | null;

  @Column(DataType.CHAR(36))
  declare acceptedBy: string | null;

  @Column(DataType.DATE(3))
  declare revokedAt: Date | null;

  @CreatedAt
  declare createdAt: Date;
}
