/**
 * Feasibility checks of one design case: lift-off and upper-stage T/W, max dynamic pressure,
 * max axial acceleration, payload floor, gross-mass ceiling, and the physical limits of the
 * structural coefficient and stage mass ratio. Each check yields a machine-readable
 * {@link Reason} with its margin, passing or not.
 */
import { G0 } from './constants';
import { REASON_BIT, type Reason, type ReasonCode } from './reasons';

/** Limits of the checks (SI). A limit left undefined is not checked. */
export interface FeasibilityLimits {
  /** Minimum lift-off thrust-to-weight (−). */
  minLiftoffThrustToWeight?: number;
  /** Minimum thrust-to-weight of each upper stage at its ignition (−). */
  minUpperStageThrustToWeight?: number;
  /** Maximum dynamic pressure [Pa]. */
  maxDynamicPressure?: number;
  /** Maximum axial acceleration [m/s²]. */
  maxAxialAcceleration?: number;
  /** Minimum payload [kg]. */
  minPayloadMass?: number;
  /** Maximum gross lift-off mass [kg]. */
  maxGrossMass?: number;
  /** Structural coefficient band outside which a warning is raised (−). */
  typicalStructuralCoefficient?: { min: number; max: number };
}

/**
 * Default limits (common practice, from memory): lift-off T/W ≥ 1.15 (launchers lift off at
 * 1.2–1.5; below ≈ 1.15 gravity losses and pad clearance become poor); upper stages ≥ 0.3 at
 * ignition; max-Q ≤ 50 kPa (typical design values 30–50 kPa); axial acceleration ≤ 6 g
 * (uncrewed payload environments 4–6 g); structural coefficient typically 0.04–0.20.
 * Payload floor and gross-mass ceiling are study-specific and unset by default.
 */
export const DEFAULT_FEASIBILITY_LIMITS: Readonly<FeasibilityLimits> = Object.freeze({
  minLiftoffThrustToWeight: 1.15,
  minUpperStageThrustToWeight: 0.3,
  maxDynamicPressure: 50_000,
  maxAxialAcceleration: 6 * G0,
  typicalStructuralCoefficient: Object.freeze({ min: 0.04, max: 0.2 })
});

/** Values of one case to check (SI). Any value left undefined is not checked. */
export interface FeasibilityInput {
  liftoffThrustToWeight?: number;
  /** T/W of every stage at its ignition, bottom first (entry 0 is ignored: lift-off above). */
  stageThrustToWeight?: readonly number[];
  maxDynamicPressure?: number;
  maxAxialAcceleration?: number;
  payloadMass?: number;
  grossMass?: number;
  structuralCoefficients?: readonly number[];
  massRatios?: readonly number[];
}

/** Outcome of {@link checkFeasibility}. */
export interface FeasibilityReport {
  /** True when no check failed (warnings allowed). */
  feasible: boolean;
  /** Failed checks (negative margins, or invalid physics). */
  failures: Reason[];
  /** Warnings (e.g. unusual structural coefficient); do not make the case infeasible. */
  warnings: Reason[];
  /** Checks that passed, with their (positive) margins. */
  passed: Reason[];
  /** Bit mask of failure codes (see REASON_BIT). */
  failMask: number;
  /** Bit mask of warning codes. */
  warnMask: number;
}

function fin(x: number): number {
  return Number.isFinite(x) ? x : x > 0 ? Number.MAX_VALUE : x < 0 ? -Number.MAX_VALUE : 0;
}

function reason(code: ReasonCode, limit: number, value: number, margin: number, message: string, stage?: number): Reason {
  const r: Reason = { code, limit: fin(limit), value: fin(value), margin: fin(margin), message };
  if (stage !== undefined) r.stage = stage;
  return r;
}

/**
 * Check one case against its limits.
 *
 * Formula: margin = value − limit for a lower bound, limit − value for an upper bound; a check
 * fails when margin < 0 (or the value is not finite). Physical limits: 0 < ε < 1 and n > 1 per
 * stage (fail), ε outside the typical band (warn). NaN or ±Infinity never appear in the report:
 * a non-finite value fails its check with `NON_FINITE_RESULT` and is reported as 0 / ±MAX_VALUE.
 *
 * @param input values to check (SI), see {@link FeasibilityInput}.
 * @param limits limits (default {@link DEFAULT_FEASIBILITY_LIMITS}).
 * @returns see {@link FeasibilityReport}.
 * @see Common practice for the default limits (see {@link DEFAULT_FEASIBILITY_LIMITS}).
 * @example
 * checkFeasibility({ liftoffThrustToWeight: 1.1 }).failures[0].code; // 'LIFTOFF_THRUST_TO_WEIGHT_LOW'
 */
export function checkFeasibility(
  input: FeasibilityInput,
  limits: FeasibilityLimits = DEFAULT_FEASIBILITY_LIMITS
): FeasibilityReport {
  const failures: Reason[] = [];
  const warnings: Reason[] = [];
  const passed: Reason[] = [];
  const put = (r: Reason, ok: boolean) => (ok ? passed : failures).push(r);
  const lower = (code: ReasonCode, value: number | undefined, limit: number | undefined, what: string, stage?: number) => {
    if (value === undefined || limit === undefined) return;
    if (!Number.isFinite(value)) {
      failures.push(reason('NON_FINITE_RESULT', limit, value, 0, `${what} is not a finite number`, stage));
      return;
    }
    // Margin to a lower bound.
    const m = value - limit;
    put(reason(code, limit, value, m, `${what} ${value.toPrecision(4)} vs minimum ${limit.toPrecision(4)}`, stage), m >= 0);
  };
  const upper = (code: ReasonCode, value: number | undefined, limit: number | undefined, what: string) => {
    if (value === undefined || limit === undefined) return;
    if (!Number.isFinite(value)) {
      failures.push(reason('NON_FINITE_RESULT', limit, value, 0, `${what} is not a finite number`));
      return;
    }
    // Margin to an upper bound.
    const m = limit - value;
    put(reason(code, limit, value, m, `${what} ${value.toPrecision(4)} vs maximum ${limit.toPrecision(4)}`), m >= 0);
  };
  lower('LIFTOFF_THRUST_TO_WEIGHT_LOW', input.liftoffThrustToWeight, limits.minLiftoffThrustToWeight, 'lift-off T/W');
  const stw = input.stageThrustToWeight;
  if (stw) {
    for (let i = 1; i < stw.length; i++) {
      lower('STAGE_THRUST_TO_WEIGHT_LOW', stw[i], limits.minUpperStageThrustToWeight, `stage ${i + 1} T/W at ignition`, i);
    }
  }
  upper('MAX_DYNAMIC_PRESSURE_HIGH', input.maxDynamicPressure, limits.maxDynamicPressure, 'max dynamic pressure [Pa]');
  upper('MAX_AXIAL_ACCELERATION_HIGH', input.maxAxialAcceleration, limits.maxAxialAcceleration, 'max axial acceleration [m/s²]');
  lower('PAYLOAD_BELOW_FLOOR', input.payloadMass, limits.minPayloadMass, 'payload [kg]');
  upper('GROSS_MASS_ABOVE_CEILING', input.grossMass, limits.maxGrossMass, 'gross lift-off mass [kg]');
  const eps = input.structuralCoefficients;
  if (eps) {
    const band = limits.typicalStructuralCoefficient;
    for (let i = 0; i < eps.length; i++) {
      const e = eps[i];
      if (!(e > 0 && e < 1)) {
        // Physical limit 0 < ε < 1; margin is the distance into the open interval.
        const m = Number.isFinite(e) ? Math.min(e, 1 - e) : 0;
        failures.push(reason('STRUCTURAL_COEFFICIENT_INVALID', e <= 0 ? 0 : 1, e, m, `stage ${i + 1} structural coefficient must be in (0, 1)`, i));
        continue;
      }
      passed.push(reason('STRUCTURAL_COEFFICIENT_INVALID', e < 0.5 ? 0 : 1, e, Math.min(e, 1 - e), `stage ${i + 1} structural coefficient in (0, 1)`, i));
      if (band && (e < band.min || e > band.max)) {
        const lim = e < band.min ? band.min : band.max;
        warnings.push(
          reason('STRUCTURAL_COEFFICIENT_UNUSUAL', lim, e, e < band.min ? e - band.min : band.max - e,
            `stage ${i + 1} structural coefficient ${e} is outside the typical ${band.min}–${band.max}`, i)
        );
      }
    }
  }
  const n = input.massRatios;
  if (n) {
    for (let i = 0; i < n.length; i++) {
      // Physical limit n > 1 (a stage must burn propellant).
      const m = n[i] - 1;
      if (!(m > 0)) failures.push(reason('MASS_RATIO_INVALID', 1, n[i], Number.isFinite(m) ? m : 0, `stage ${i + 1} mass ratio must exceed 1`, i));
      else passed.push(reason('MASS_RATIO_INVALID', 1, n[i], m, `stage ${i + 1} mass ratio above 1`, i));
    }
  }
  let failMask = 0;
  let warnMask = 0;
  for (const f of failures) failMask |= REASON_BIT[f.code];
  for (const w of warnings) warnMask |= REASON_BIT[w.code];
  return { feasible: failures.length === 0, failures, warnings, passed, failMask, warnMask };
}
