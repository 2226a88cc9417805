import { Column, CreatedAt, DataType, Model, PrimaryKey, Table } from 'sequelize-typescript';

/** A password-reset link sent by e-mail (token stored as its SHA-256; single use, expiring). */
@Table({ tableName: 'password_resets', underscored: true, updatedAt: false })
export class PasswordReset extends Model {
  @PrimaryKey
  @Column(DataType.CHAR(36))
  declare id: string;

  @Column(DataType.CHAR(36))
  declare userId: string;

  @Column(DataType.CHAR(64))
  declare tokenHash: string;

  @Column(DataType.DATE(3))
  declare expiresAt: Date;

  @Column(DataType.DATE(3))
  declare usedAt: Date | null;

  @CreatedAt
  declare createdAt: Date;
}
