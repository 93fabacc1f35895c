/**
 * Display of result quantities in the user's unit system, on top of the units module
 * ($lib/units, the one place with conversion factors). Result keys are the result columns of
 * the sweep API (glow, payloadMass, ...) and the objective metrics of the sweep spec.
 */
import { M_PER_FT, formatNumber, fromDisplay, toDisplay, unitLabel, type Quantity, type UnitSystem } from '$lib/units';

/** Acceleration is not a units-module quantity: m/s² in SI, ft/s² in US customary (same factor as speed). */
export type DisplayKind = Quantity | 'acceleration' | 'ratio' | 'angle';

export interface MetricInfo {
  label: string;
  /** Short label for table headers and axes. */
  short: string;
  kind: DisplayKind;
}

export const METRICS: Record<string, MetricInfo> = {
  glow: { label: 'Gross lift-off mass', short: 'GLOW', kind: 'mass' },
  payloadMass: { label: 'Payload', short: 'Payload', kind: 'mass' },
  payloadFraction: { label: 'Payload fraction', short: 'Payload fraction', kind: 'ratio' },
  dryMass: { label: 'Dry mass', short: 'Dry mass', kind: 'mass' },
  propellantMass: { label: 'Propellant mass', short: 'Propellant', kind: 'mass' },
  maxDynamicPressure: { label: 'Max dynamic pressure (max-Q)', short: 'Max-Q', kind: 'pressure' },
  maxAxialAcceleration: { label: 'Max axial acceleration', short: 'Max accel.', kind: 'acceleration' },
  totalLosses: { label: 'Total losses', short: 'Losses', kind: 'speed' },
  requiredDeltaV: { label: 'Required delta-v', short: 'Required Δv', kind: 'speed' },
  liftoffThrustToWeight: { label: 'Lift-off thrust-to-weight', short: 'Lift-off T/W', kind: 'ratio' },
  insertionSpeed: { label: 'Insertion speed', short: 'Insertion speed', kind: 'speed' },
  gravityLoss: { label: 'Gravity loss', short: 'Gravity loss', kind: 'speed' },
  dragLoss: { label: 'Drag loss', short: 'Drag loss', kind: 'speed' },
  steeringLoss: { label: 'Steering loss', short: 'Steering loss', kind: 'speed' },
  rotationAssist: { label: 'Earth-rotation assist', short: 'Rotation assist', kind: 'speed' },
  transferDeltaV: { label: 'Transfer delta-v', short: 'Transfer Δv', kind: 'speed' },
  planeChangeDeltaV: { label: 'Plane-change delta-v', short: 'Plane change Δv', kind: 'speed' },
  reserveDeltaV: { label: 'Reserve', short: 'Reserve', kind: 'speed' }
};

export function metricInfo(key: string): MetricInfo {
  return METRICS[key] ?? { label: key, short: key, kind: 'ratio' };
}

/** Unit label of a display kind ('' for plain ratios). */
export function kindUnit(kind: DisplayKind, system: UnitSystem): string {
  if (kind === 'ratio') return '';
  if (kind === 'angle') return 'deg';
  if (kind === 'acceleration') return system === 'us' ? 'ft/s²' : 'm/s²';
  return unitLabel(kind, system);
}

/** SI value → display value. */
export function toUnits(kind: DisplayKind, si: number, system: UnitSystem): number {
  if (kind === 'ratio' || kind === 'angle') return si;
  if (kind === 'acceleration') return system === 'us' ? si / M_PER_FT : si;
  return toDisplay(kind, si, system);
}

/** Display value → SI value. */
export function fromUnits(kind: DisplayKind, shown: number, system: UnitSystem): number {
  if (kind === 'ratio' || kind === 'angle') return shown;
  if (kind === 'acceleration') return system === 'us' ? shown * M_PER_FT : shown;
  return fromDisplay(kind, shown, system);
}

/** Number only (no unit), for table cells whose header carries the unit. */
export function fmtValue(kind: DisplayKind, si: number | null | undefined, system: UnitSystem, digits = 4): string {
  if (si == null || !Number.isFinite(si)) return '—';
  return formatNumber(toUnits(kind, si, system), kind === 'ratio' ? { digits: 3 } : { digits });
}

/** A value with a fixed number of decimals, for columns that add up (delta-v budget terms to 1 m/s). */
export function fmtFixed(kind: DisplayKind, si: number | null | undefined, system: UnitSystem, decimals = 0): string {
  if (si == null || !Number.isFinite(si)) return '—';
  return formatNumber(toUnits(kind, si, system), { decimals });
}

/** Number with its unit. */
export function fmtWithUnit(kind: DisplayKind, si: number | null | undefined, system: UnitSystem, digits = 4): string {
  const v = fmtValue(kind, si, system, digits);
  const u = kindUnit(kind, system);
  return v === '—' || !u ? v : `${v} ${u}`;
}

/** Header text with the unit in brackets: "GLOW (kg)". */
export function headerOf(key: string, system: UnitSystem, long = false): string {
  const m = metricInfo(key);
  const u = kindUnit(m.kind, system);
  const name = long ? m.label : m.short;
  return u ? `${name} (${u})` : name;
}

/** Unit kind of a spec unit string ('kg', 'm', 's', 'deg', 'N', 'm/s', ...) from PARAMETER_INFO. */
export function kindOfSpecUnit(unit: string): DisplayKind {
  switch (unit) {
    case 'kg':
      return 'mass';
    case 'm':
      return 'altitude';
    case 's':
      return 'isp';
    case 'N':
      return 'thrust';
    case 'm/s':
      return 'speed';
    case 'Pa':
      return 'pressure';
    case 'm/s²':
      return 'acceleration';
    case 'm²':
      return 'area';
    case 'deg':
      return 'angle';
    default:
      return 'ratio';
  }
}

/** Human label of a swept parameter path: "stages.1.ispVacuum" → "Stage 2 vacuum Isp". */
export function parameterLabel(path: string): string {
  const m = /^stages\.(\d)\.(\w+)$/.exec(path);
  const names: Record<string, string> = {
    ispVacuum: 'vacuum Isp',
    ispSeaLevel: 'sea-level Isp',
    structuralCoefficient: 'structural coefficient',
    massRatio: 'mass ratio',
    thrustToWeight: 'T/W',
    propulsion: 'propulsion',
    liftoffThrustToWeight: 'Lift-off T/W',
    upperStageThrustToWeight: 'Upper-stage T/W',
    'target.altitude': 'Orbit altitude',
    'target.perigeeAltitude': 'Perigee altitude',
    'target.apogeeAltitude': 'Apogee altitude',
    'target.inclination': 'Inclination',
    'target.launchLatitude': 'Launch latitude',
    payloadMass: 'Payload mass'
  };
  if (m) return `Stage ${Number(m[1]) + 1} ${names[m[2]] ?? m[2]}`;
  return names[path] ?? path;
}

/** Plain words for the physics core's reason codes. */
export const REASON_LABELS: Record<string, string> = {
  DELTA_V_UNREACHABLE: 'delta-v cannot be reached',
  STAGE_MASS_RATIO_UNREACHABLE: 'a stage mass ratio cannot be reached',
  PAYLOAD_NOT_POSITIVE: 'no payload left',
  LIFTOFF_THRUST_TO_WEIGHT_LOW: 'lift-off T/W too low',
  STAGE_THRUST_TO_WEIGHT_LOW: 'a stage T/W too low',
  MAX_DYNAMIC_PRESSURE_HIGH: 'max-Q above the limit',
  MAX_AXIAL_ACCELERATION_HIGH: 'axial acceleration above the limit',
  PAYLOAD_BELOW_FLOOR: 'payload below the floor',
  GROSS_MASS_ABOVE_CEILING: 'GLOW above the ceiling',
  STRUCTURAL_COEFFICIENT_INVALID: 'structural coefficient out of range',
  STRUCTURAL_COEFFICIENT_UNUSUAL: 'structural coefficient unusual',
  MASS_RATIO_INVALID: 'mass ratio out of range',
  NON_FINITE_RESULT: 'no finite result',
  EVALUATION_FAILED: 'evaluation failed',
  ISP_ORDER_INVALID: 'sea-level Isp above vacuum Isp',
  MODEL_INPUT_OUT_OF_RANGE: 'a value is outside the model',
  ASCENT_TARGET_OUT_OF_RANGE: 'target outside the ascent model',
  ASCENT_DELTA_V_INSUFFICIENT: 'cannot reach orbit even without payload',
  ASCENT_TARGET_UNREACHABLE: 'ascent cannot reach the target',
  ASCENT_FELL_BACK: 'ascent falls back',
  ASCENT_TARGETING_FAILED: 'ascent targeting did not converge',
  ASCENT_SIZING_NOT_CONVERGED: 'ascent sizing did not converge'
};

export function reasonLabel(code: string): string {
  return REASON_LABELS[code] ?? code.toLowerCase().replace(/_/g, ' ');
}
