import { Column, CreatedAt, DataType, Model, PrimaryKey, Table } from 'sequelize-typescript';

/** One refresh token (stored as its SHA-256); rotation adds a row to the same family. */
@Table({ tableName: 'refresh_tokens', underscored: true, updatedAt: false })
export class RefreshToken extends Model {
  @PrimaryKey
  @Column(DataType.CHAR(36))
  declare id: string;

  @Column(DataType.CHAR(36))
  declare userId: string;

  @Column(DataType.CHAR(36))
  declare familyId: string;

  @Column(DataType.CHAR(64))
  declare tokenHash: string;

  @Column(DataType.DATE(3))
  declare expiresAt: Date;

  /** Set when the token was exchanged for a new one; presenting it again is reuse. */
  @Column(DataType.DATE(3))
  declare usedAt: Date | null;

  @Column(DataType.DATE(3))
  declare revokedAt: Date | null;

  @CreatedAt
  declare createdAt: Date;
}
