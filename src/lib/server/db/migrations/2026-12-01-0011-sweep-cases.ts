import type { QueryInterface } from 'sequelize';
// The columns as they were when this migration was written (later ones: 0013).
const RESULT_COLUMNS = [
  ['glow', true],
  ['payload_mass', true],
  ['payload_fraction', true],
  ['dry_mass', true],
  ['propellant_mass', true],
  ['max_dynamic_pressure', true],
  ['max_axial_acceleration', true],
  ['total_losses', true],
  ['required_delta_v', true],
  ['liftoff_thrust_to_weight', true],
  ['insertion_speed', false],
  ['gravity_loss', false],
  ['drag_loss', false],
  ['steering_loss', false],
  ['rotation_assist', false],
  ['transfer_delta_v', false],
  ['plane_change_delta_v', false],
  ['reserve_delta_v', false]
].map(([column, indexed]) => ({ column: column as string, indexed: indexed as boolean }));
const PARAM_COLUMNS = Array.from({ length: 10 }, (_, i) => `p${i}`);
const indexName = (column: string) => `sweep_cases_${column}`;

/**
 * One row per (sweep, case index): the flat numeric result, the feasible flag and reasons,
 * the swept values (p0..p9), the per-chunk non-dominated mark (live front) and, after
 * completion, the Pareto rank. Written only through the mariadb connector's batch() with
 * INSERT IGNORE, so a retried chunk can never duplicate a row.
 *
 * Raw DDL: DOUBLE columns, a composite primary key and one (sweep_id, column) index per sort
 * key. No foreign key to sweeps: the row count makes cascading deletes a job for
 * src/lib/server/sweeps/store.ts (in slices), and the writer checks the sweep in the same
 * transaction anyway.
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  const results = RESULT_COLUMNS.map((r) => `  ${r.column} DOUBLE NULL`).join(',\n');
  const params = PARAM_COLUMNS.map((p) => `  ${p} DOUBLE NULL`).join(',\n');
  const indexes = RESULT_COLUMNS.filter((r) => r.indexed)
    .map((r) => `  KEY ${indexName(r.column)} (sweep_id, ${r.column})`)
    .join(',\n');
  await qi.sequelize.query(`
CREATE TABLE sweep_cases (
  sweep_id INT UNSIGNED NOT NULL,
  case_index INT UNSIGNED NOT NULL,
  chunk_index INT UNSIGNED NOT NULL,
  feasible TINYINT(1) NOT NULL,
  -- 1 when the evaluation itself failed (not merely infeasible)
  failed TINYINT(1) NOT NULL DEFAULT 0,
  -- bit i set <=> REASON_CODES[i] of src/lib/physics/reasons.ts
  fail_mask INT UNSIGNED NOT NULL DEFAULT 0,
  reasons VARCHAR(1000) NOT NULL DEFAULT '',
  -- 1 when non-dominated within its own chunk (feasible cases only): the live front
  chunk_front TINYINT(1) NOT NULL DEFAULT 0,
  pareto_rank INT UNSIGNED NULL,
${results},
${params},
  detail JSON NULL,
  PRIMARY KEY (sweep_id, case_index),
${indexes},
  KEY sweep_cases_pareto_rank (sweep_id, pareto_rank),
  KEY sweep_cases_chunk_front (sweep_id, chunk_front)
) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.dropTable('sweep_cases');
}
