import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes
} from 'sequelize';
import { sequelize } from '../sequelize';

export const SWEEP_STATUSES = ['draft', 'queued', 'running', 'paused', 'completed', 'cancelled', 'failed'] as const;
export type SweepStatus = (typeof SWEEP_STATUSES)[number];

/**
 * A sweep: a frozen spec and its run state. The counters are only ever changed by
 * src/lib/server/sweeps/store.ts, in the same transaction as the chunk ledger (sweep_chunks).
 */
export class Sweep extends Model<InferAttributes<Sweep>, InferCreationAttributes<Sweep>> {
  declare id: CreationOptional<number>;
  declare workspaceId: string;
  declare studyId: string;
  declare ownerId: string | null;
  declare name: string;
  declare spec: unknown;
  declare mode: 'budget' | 'ascent';
  declare status: CreationOptional<SweepStatus>;
  declare totalCases: number;
  declare doneCases: CreationOptional<number>;
  declare feasibleCases: CreationOptional<number>;
  declare failedCases: CreationOptional<number>;
  declare chunkSize: number;
  declare chunkCount: number;
  declare chunksDone: CreationOptional<number>;
  declare runGen: CreationOptional<number>;
  declare modelVersion: string;
  declare summary: CreationOptional<unknown | null>;
  declare error: CreationOptional<string | null>;
  declare queuedAt: CreationOptional<Date | null>;
  declare startedAt: CreationOptional<Date | null>;
  declare pausedAt: CreationOptional<Date | null>;
  declare finishedAt: CreationOptional<Date | null>;
  declare finalizeClaimedAt: CreationOptional<Date | null>;
  declare notifiedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Sweep.init(
  {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    workspaceId: { type: DataTypes.UUID, allowNull: false },
    studyId: { type: DataTypes.UUID, allowNull: false },
    ownerId: { type: DataTypes.UUID, allowNull: true },
    name: { type: DataTypes.STRING(120), allowNull: false },
    spec: { type: DataTypes.JSON, allowNull: false },
    mode: { type: DataTypes.ENUM('budget', 'ascent'), allowNull: false },
    status: { type: DataTypes.ENUM(...SWEEP_STATUSES), allowNull: false, defaultValue: 'draft' },
    totalCases: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    doneCases: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
    feasibleCases: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
    failedCases: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
    chunkSize: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    chunkCount: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    chunksDone: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
    runGen: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
    modelVersion: { type: DataTypes.STRING(64), allowNull: false },
    summary: { type: DataTypes.JSON, allowNull: true },
    error: { type: DataTypes.TEXT, allowNull: true },
    queuedAt: { type: DataTypes.DATE, allowNull: true },
    startedAt: { type: DataTypes.DATE, allowNull: true },
    pausedAt: { type: DataTypes.DATE, allowNull: true },
    finishedAt: { type: DataTypes.DATE, allowNull: true },
    finalizeClaimedAt: { type: DataTypes.DATE, allowNull: true },
    notifiedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE
  },
  { sequelize, tableName: 'sweeps', modelName: 'Sweep' }
);
