/**
 * The flat numeric result columns of `sweep_cases`, shared by the migration, the writer, the
 * API (sort/filter whitelist) and the CSV export. The key is the camelCase name used in JSON
 * (and in the sweep spec's objective metrics); `column` is the SQL column.
 *
 * `indexed` columns have a (sweep_id, column) index and are the only sort keys the API accepts,
 * so every sorted page is an index range scan (STACK.md: ~3 ms vs ~300 ms on 1M rows).
 * The objective metrics are exactly the keys of OBJECTIVE_METRICS in src/lib/sweep/spec.ts.
 */
export interface ResultColumn {
  key: string;
  column: string;
  label: string;
  unit: string;
  indexed: boolean;
}

const c = (key: string, column: string, label: string, unit: string, indexed: boolean): ResultColumn => ({
  key,
  column,
  label,
  unit,
  indexed
});

export const RESULT_COLUMNS: readonly ResultColumn[] = Object.freeze([
  c('glow', 'glow', 'gross lift-off mass', 'kg', true),
  c('payloadMass', 'payload_mass', 'payload', 'kg', true),
  c('payloadFraction', 'payload_fraction', 'payload fraction', '', true),
  c('dryMass', 'dry_mass', 'dry mass', 'kg', true),
  c('propellantMass', 'propellant_mass', 'propellant mass', 'kg', true),
  c('maxDynamicPressure', 'max_dynamic_pressure', 'max-Q', 'Pa', true),
  c('maxAxialAcceleration', 'max_axial_acceleration', 'max axial acceleration', 'm/s²', true),
  c('totalLosses', 'total_losses', 'total losses', 'm/s', true),
  c('requiredDeltaV', 'required_delta_v', 'required delta-v', 'm/s', true),
  c('liftoffThrustToWeight', 'liftoff_thrust_to_weight', 'lift-off T/W', '', true),
  c('insertionSpeed', 'insertion_speed', 'insertion speed', 'm/s', false),
  c('gravityLoss', 'gravity_loss', 'gravity loss', 'm/s', false),
  c('dragLoss', 'drag_loss', 'drag loss', 'm/s', false),
  c('steeringLoss', 'steering_loss', 'steering loss', 'm/s', false),
  c('rotationAssist', 'rotation_assist', 'rotation assist', 'm/s', false),
  c('transferDeltaV', 'transfer_delta_v', 'transfer delta-v', 'm/s', false),
  c('planeChangeDeltaV', 'plane_change_delta_v', 'plane-change delta-v', 'm/s', false),
  c('reserveDeltaV', 'reserve_delta_v', 'reserve delta-v', 'm/s', false)
]);

export const RESULT_KEYS = RESULT_COLUMNS.map((r) => r.key);
export const COLUMN_BY_KEY: ReadonlyMap<string, ResultColumn> = new Map(RESULT_COLUMNS.map((r) => [r.key, r]));

/** Swept parameter values are stored as p0..p9 (catalogue choices as the option's position). */
export const PARAM_SLOTS = 10;
export const PARAM_COLUMNS = Array.from({ length: PARAM_SLOTS }, (_, i) => `p${i}`);

/** Name of the (sweep_id, column) index of an indexed column. */
export const indexName = (column: string) => `sweep_cases_${column}`;
