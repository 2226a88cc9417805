import { Column, CreatedAt, DataType, Model, PrimaryKey, Table, UpdatedAt } from 'sequelize-typescript';

@Table({ tableName: 'projects', underscored: true })
export class Project extends Model {
  @PrimaryKey
  @Column(DataType.CHAR(36))
  declare id: string;

  @Column(DataType.STRING(120))
  declare name: string;

  @Column(DataType.STRING(2000))
  declare description: string;

  /** Set while the project is archived (read-only for later features; still listed). */
  @Column(DataType.DATE(3))
  declare archivedAt: Date | null;

  @Column(DataType.CHAR(36))
  declare createdBy: string | null;

  @CreatedAt
  declare createdAt: Date;

  @UpdatedAt
  declare updatedAt: Date;
}
