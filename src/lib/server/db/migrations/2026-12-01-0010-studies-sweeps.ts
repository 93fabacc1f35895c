import { DataTypes, type QueryInterface } from 'sequelize';

/**
 * Studies (a question, grouping sweeps), sweeps (a frozen spec with its run state and
 * counters), sweep_chunks (one row per evaluated chunk: the "counted once" ledger) and
 * share_links (anonymous read-only access to one sweep's report).
 *
 * Sweeps have an integer key (not a UUID like workspaces) because it is repeated in every
 * row and every secondary index of the million-row sweep_cases table: 4 bytes instead of 36.
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  const ts = {
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false }
  };
  await qi.createTable('studies', {
    id: { type: DataTypes.UUID, primaryKey: true },
    workspace_id: {
      type: DataTypes.UUID,
      allowNull: false,
      references: { model: 'workspaces', key: 'id' },
      onDelete: 'CASCADE'
    },
    name: { type: DataTypes.STRING(120), allowNull: false },
    question: { type: DataTypes.TEXT, allowNull: false },
    notes: { type: DataTypes.TEXT, allowNull: false },
    archived: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    created_by: {
      type: DataTypes.UUID,
      allowNull: true,
      references: { model: 'users', key: 'id' },
      onDelete: 'SET NULL'
    },
    ...ts
  });
  await qi.addIndex('studies', ['workspace_id', 'archived', 'updated_at'], { name: 'studies_workspace' });

  await qi.createTable('sweeps', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    workspace_id: {
      type: DataTypes.UUID,
      allowNull: false,
      references: { model: 'workspaces', key: 'id' },
      onDelete: 'CASCADE'
    },
    study_id: {
      type: DataTypes.UUID,
      allowNull: false,
      references: { model: 'studies', key: 'id' },
      onDelete: 'CASCADE'
    },
    owner_id: {
      type: DataTypes.UUID,
      allowNull: true,
      references: { model: 'users', key: 'id' },
      onDelete: 'SET NULL'
    },
    name: { type: DataTypes.STRING(120), allowNull: false },
    /** The frozen, validated spec (defaults filled in), exactly as the workers read it. */
    spec: { type: DataTypes.JSON, allowNull: false },
    mode: { type: DataTypes.ENUM('budget', 'ascent'), allowNull: false },
    status: {
      type: DataTypes.ENUM('draft', 'queued', 'running', 'paused', 'completed', 'cancelled', 'failed'),
      allowNull: false,
      defaultValue: 'draft'
    },
    total_cases: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    done_cases: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
    feasible_cases: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
    failed_cases: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
    chunk_size: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    chunk_count: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    chunks_done: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
    /** Run generation: bumped by every resume so chunk job ids of a new run never collide. */
    run_gen: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
    model_version: { type: DataTypes.STRING(64), allowNull: false },
    summary: { type: DataTypes.JSON, allowNull: true },
    error: { type: DataTypes.TEXT, allowNull: true },
    queued_at: { type: DataTypes.DATE, allowNull: true },
    started_at: { type: DataTypes.DATE, allowNull: true },
    paused_at: { type: DataTypes.DATE, allowNull: true },
    finished_at: { type: DataTypes.DATE, allowNull: true },
    /** Set by the one transaction that saw the last chunk land: completion is claimed once. */
    finalize_claimed_at: { type: DataTypes.DATE, allowNull: true },
    notified_at: { type: DataTypes.DATE, allowNull: true },
    ...ts
  });
  await qi.addIndex('sweeps', ['workspace_id', 'created_at'], { name: 'sweeps_workspace' });
  await qi.addIndex('sweeps', ['study_id', 'created_at'], { name: 'sweeps_study' });

  await qi.createTable('sweep_chunks', {
    sweep_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      primaryKey: true,
      references: { model: 'sweeps', key: 'id' },
      onDelete: 'CASCADE'
    },
    chunk_index: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true },
    first_case: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    case_count: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    feasible_cases: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    failed_cases: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    attempts: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    /** host:pid of the worker that committed it. */
    worker: { type: DataTypes.STRING(120), allowNull: false },
    eval_ms: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    write_ms: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    created_at: { type: DataTypes.DATE, allowNull: false }
  });

  await qi.createTable('share_links', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    sweep_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: 'sweeps', key: 'id' },
      onDelete: 'CASCADE'
    },
    token_hash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
    prefix: { type: DataTypes.STRING(16), allowNull: false },
    label: { type: DataTypes.STRING(120), allowNull: false },
    created_by: {
      type: DataTypes.UUID,
      allowNull: true,
      references: { model: 'users', key: 'id' },
      onDelete: 'SET NULL'
    },
    expires_at: { type: DataTypes.DATE, allowNull: true },
    revoked_at: { type: DataTypes.DATE, allowNull: true },
    last_opened_at: { type: DataTypes.DATE, allowNull: true },
    ...ts
  });
  await qi.addIndex('share_links', ['sweep_id'], { name: 'share_links_sweep' });
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.dropTable('share_links');
  await qi.dropTable('sweep_chunks');
  await qi.dropTable('sweeps');
  await qi.dropTable('studies');
}
