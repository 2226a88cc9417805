import { AutoIncrement, Column, DataType, Model, PrimaryKey, Table } from 'sequelize-typescript';

/** A message the built-in fake SMTP server received. */
@Table({ tableName: 'mail_messages', underscored: true, timestamps: false })
export class MailMessage extends Model {
  @PrimaryKey
  @AutoIncrement
  @Column(DataType.INTEGER)
  declare id: number;

  @Column(DataType.STRING(255))
  declare messageId: string | null;

  @Column(DataType.STRING(320))
  declare mailFrom: string;

  /** Envelope recipients, comma-separated. */
  @Column(DataType.STRING(2000))
  declare mailTo: string;

  @Column(DataType.STRING(998))
  declare subject: string;

  @Column(DataType.TEXT('medium'))
  declare text: string;

  @Column(DataType.TEXT('medium'))
  declare html: string;

  /** JSON array of the http(s) links found in the bodies. */
  @Column(DataType.TEXT)
  declare links: string;

  @Column(DataType.DATE(3))
  declare receivedAt: Date;
}
