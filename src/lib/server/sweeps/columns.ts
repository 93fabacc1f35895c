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
  c('reserveDeltaV', 'reserve_delta_v', 'reserve delta-v', 'm/s', false),
  // Added by migration 0013 (the rest of src/lib/sweep/evaluate.ts CASE_RESULT_COLUMNS).
  c('stage1PropellantMass', 'stage1_propellant_mass', 'stage 1 propellant mass', 'kg', false),
  c('stage2PropellantMass', 'stage2_propellant_mass', 'stage 2 propellant mass', 'kg', false),
  c('stage3PropellantMass', 'stage3_propellant_mass', 'stage 3 propellant mass', 'kg', false),
  c('stage4PropellantMass', 'stage4_propellant_mass', 'stage 4 propellant mass', 'kg', false),
  c('stage1DryMass', 'stage1_dry_mass', 'stage 1 dry mass', 'kg', false),
  c('stage2DryMass', 'stage2_dry_mass', 'stage 2 dry mass', 'kg', false),
  c('stage3DryMass', 'stage3_dry_mass', 'stage 3 dry mass', 'kg', false),
  c('stage4DryMass', 'stage4_dry_mass', 'stage 4 dry mass', 'kg', false),
  c('upperStageThrustToWeight', 'upper_stage_thrust_to_weight', 'upper-stage T/W', '', false),
  c('launchAzimuth', 'launch_azimuth', 'launch azimuth', 'deg', false),
  c('liftoffThrustToWeightMargin', 'liftoff_thrust_to_weight_margin', 'lift-off T/W margin', '', false),
  c('dynamicPressureMargin', 'dynamic_pressure_margin', 'max-Q margin', 'Pa', false),
  c('axialAccelerationMargin', 'axial_acceleration_margin', 'axial acceleration margin', 'm/s²', false),
  c('payloadMargin', 'payload_margin', 'payload margin', 'kg', false),
  c('glowMargin', 'glow_margin', 'GLOW margin', 'kg', false)
]);

export const RESULT_KEYS = RESULT_COLUMNS.map((r) => r.key);
export const COLUMN_BY_KEY: ReadonlyMap<string, ResultColumn> = new Map(RESULT_COLUMNS.map((r) => [r.key, r]));

/** Swept parameter values are stored as p0..p9 (catalogue choices as the option's position). */
export const PARAM_SLOTS = 10;
export const PARAM_COLUMNS = Array.from({ length: PARAM_SLOTS }, (_, i) => `p${i}`);

/** Name of the (sweep_id, column) index of an indexed column. */
export const indexName = (column: string) => `sweep_cases_${column}`;
