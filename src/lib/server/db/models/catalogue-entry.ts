import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes
} from 'sequelize';
import { sequelize } from '../sequelize';

/** A propulsion catalogue entry of one workspace, in SI (thrust is vacuum thrust). */
export class CatalogueEntry extends Model<InferAttributes<CatalogueEntry>, InferCreationAttributes<CatalogueEntry>> {
  declare id: CreationOptional<number>;
  declare workspaceId: string;
  declare name: string;
  declare propellants: string;
  declare ispSeaLevelS: number | null;
  declare ispVacuumS: number;
  declare thrustVacuumN: number;
  declare massKg: number;
  declare notes: CreationOptional<string>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

CatalogueEntry.init(
  {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    workspaceId: { type: DataTypes.UUID, allowNull: false },
    name: { type: DataTypes.STRING(120), allowNull: false },
    propellants: { type: DataTypes.STRING(80), allowNull: false },
    ispSeaLevelS: { type: DataTypes.DOUBLE, allowNull: true, field: 'isp_sl_s' },
    ispVacuumS: { type: DataTypes.DOUBLE, allowNull: false, field: 'isp_vac_s' },
    thrustVacuumN: { type: DataTypes.DOUBLE, allowNull: false, field: 'thrust_vac_n' },
    massKg: { type: DataTypes.DOUBLE, allowNull: false, field: 'mass_kg' },
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE
  },
  { sequelize, tableName: 'catalogue_entries', modelName: 'CatalogueEntry' }
);
