import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes
} from 'sequelize';
import { sequelize } from '../sequelize';

/** A message caught by the local fake SMTP server (development and tests). */
export class MailMessage extends Model<InferAttributes<MailMessage>, InferCreationAttributes<MailMessage>> {
  declare id: CreationOptional<number>;
  declare mailFrom: string;
  declare rcptTo: string;
  declare subject: string;
  declare raw: string;
  declare createdAt: CreationOptional<Date>;
}

MailMessage.init(
  {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    mailFrom: { type: DataTypes.STRING(320), allowNull: false },
    rcptTo: { type: DataTypes.STRING(2000), allowNull: false },
    subject: { type: DataTypes.STRING(500), allowNull: false },
    raw: { type: DataTypes.TEXT('medium'), allowNull: false },
    createdAt: DataTypes.DATE
  },
  { sequelize, tableName: 'mail_messages', modelName: 'MailMessage', updatedAt: false }
);
