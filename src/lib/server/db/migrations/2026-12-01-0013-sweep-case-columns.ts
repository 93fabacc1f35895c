import type { QueryInterface } from 'sequelize';

/**
 * The rest of the sweep evaluator's flat result (src/lib/sweep/evaluate.ts CASE_RESULT_COLUMNS):
 * per-stage masses, upper-stage T/W, launch azimuth and the constraint margins. Not indexed
 * (not sort keys): each index costs insert speed, measured in tests/bench/sweeps.bench.ts.
 */
const COLUMNS = [
  'stage1_propellant_mass',
  'stage2_propellant_mass',
  'stage3_propellant_mass',
  'stage4_propellant_mass',
  'stage1_dry_mass',
  'stage2_dry_mass',
  'stage3_dry_mass',
  'stage4_dry_mass',
  'upper_stage_thrust_to_weight',
  'launch_azimuth',
  'liftoff_thrust_to_weight_margin',
  'dynamic_pressure_margin',
  'axial_acceleration_margin',
  'payload_margin',
  'glow_margin'
];

export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.sequelize.query(`ALTER TABLE sweep_cases ${COLUMNS.map((c) => `ADD COLUMN ${c} DOUBLE NULL AFTER reserve_delta_v`).join(', ')}`);
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.sequelize.query(`ALTER TABLE sweep_cases ${COLUMNS.map((c) => `DROP COLUMN ${c}`).join(', ')}`);
}
