import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes
} from 'sequelize';
import { sequelize } from '../sequelize';
import type { UnitSystem } from './user';

/** Anonymous read-only access to one sweep's report. Only the token's SHA-256 is stored. */
export class ShareLink extends Model<InferAttributes<ShareLink>, InferCreationAttributes<ShareLink>> {
  declare id: CreationOptional<number>;
  declare sweepId: number;
  declare tokenHash: string;
  declare prefix: string;
  declare label: string;
  /** Display units of the shared report; the reader may switch on the page. */
  declare units: CreationOptional<UnitSystem>;
  declare createdBy: string | null;
  declare expiresAt: Date | null;
  declare revokedAt: CreationOptional<Date | null>;
  declare lastOpenedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

ShareLink.init(
  {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    sweepId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    tokenHash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
    prefix: { type: DataTypes.STRING(16), allowNull: false },
    label: { type: DataTypes.STRING(120), allowNull: false },
    units: { type: DataTypes.ENUM('si', 'us'), allowNull: false, defaultValue: 'si' },
    createdBy: { type: DataTypes.UUID, allowNull: true },
    expiresAt: { type: DataTypes.DATE, allowNull: true },
    revokedAt: { type: DataTypes.DATE, allowNull: true },
    lastOpenedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE
  },
  { sequelize, tableName: 'share_links', modelName: 'ShareLink' }
);
