/**
 * Ascent-mode sizing: the gross lift-off mass and stage masses of a vehicle that puts a required
 * payload on a target, with the losses simulated (not allowances), SI units.
 *
 * Method (the classical loss iteration): start from a loss allowance L; size the stages for the
 * delta-v V_target + L by optimal staging (Lagrange multipliers, `sizeForPayload` of
 * `./rocket`, vacuum Isp); give each stage its thrust from its thrust-to-weight ratio; fly the
 * targeted ascent (`ascentPayload`, which returns the largest payload this sized vehicle
 * delivers and the simulated losses at it); take its total loss (gravity + drag + steering +
 * back-pressure) as the new L; repeat until the sized vehicle's own largest payload equals the
 * required payload within `tolerance` (default 0.02 %) — then the simulated losses and the
 * rocket equation agree. Each pass warm-starts the shooting from the previous one.
 */
import { EARTH, G0 } from './constants';
import { sizeForPayload, type StageMasses } from './rocket';
import {
  ascentPayload,
  compileAscentVehicle,
  type AscentPayloadResult,
  type AscentSolution,
  type AscentTarget,
  type AscentTimeStep,
  type AscentTolerance,
  type AscentTrajectory,
  type DragInput
} from './ascent';

/** One stage to be sized, bottom first. */
export interface AscentSizingStage {
  /** Vacuum specific impulse [s], > 0 (used by the rocket equation and for the thrust). */
  ispVacuum: number;
  /** Sea-level specific impulse [s], in (0, ispVacuum]. */
  ispSeaLevel: number;
  /** ε = dry/(dry + propellant), in (0, 1). */
  structuralCoefficient: number;
  /**
   * Thrust-to-weight at ignition: for the first stage the lift-off value T_sl/(m0·G0), for the
   * others T_vac/(m_ignition·G0). > 0 (the first stage must exceed 1 to lift off).
   */
  thrustToWeight: number;
  /** Coast after this stage's jettison [s], ≥ 0. */
  coastAfter?: number;
}

/** Input of {@link sizeAscentVehicle}. */
export interface AscentSizingInput {
  stages: ReadonlyArray<AscentSizingStage>;
  /** Required payload [kg], > 0. */
  payloadMass: number;
  /** Drag reference area [m²], ≥ 0 (held fixed while the vehicle is sized). */
  referenceArea: number;
  dragCoefficient: DragInput;
  /** Vertical rise [s]; default: time to ≈ 50 m/s at the lift-off acceleration. */
  verticalRiseTime?: number;
  steeringStartStage?: number;
}

/** Warm start of the sizing loop (from the previous, similar case). */
export interface AscentSizingSolution extends AscentSolution {
  /** Total simulated loss of the last pass [m/s]. */
  losses: number;
}

/** Machine-readable reasons a sizing case is infeasible. */
export type AscentSizingInfeasibility =
  | 'staging-infeasible' // optimal staging cannot reach V_target + losses with these ε and Isp
  | 'ascent-infeasible' // the sized vehicle's targeted ascent fails (see `ascent.reasons`)
  | 'sizing-not-converged'; // the loss iteration did not settle within its passes

/** Result of {@link sizeAscentVehicle}; numbers finite (zeros when infeasible). */
export interface AscentSizingResult {
  feasible: boolean;
  reasons: AscentSizingInfeasibility[];
  message: string;
  /** Gross lift-off mass [kg]. */
  grossLiftOffMass: number;
  /** Stage masses bottom first (from the optimal staging). */
  stageMasses: StageMasses[];
  /** Thrust of each stage: vacuum [N]. */
  thrustVacuum: number[];
  /** Delta-v the stages were sized for, V_target + losses [m/s]. */
  sizedDeltaV: number;
  /** Passes of the loss iteration. */
  passes: number;
  /** Flights simulated in total. */
  simulations: number;
  /** The targeted ascent of the final vehicle (its payloadMass ≈ the required payload). */
  ascent: AscentPayloadResult | null;
  solution: AscentSizingSolution;
  trajectory?: AscentTrajectory;
}

/** Options of {@link sizeAscentVehicle}. */
export interface AscentSizingOptions {
  timeStep?: AscentTimeStep;
  /** Shooting tolerances of each ascent. */
  ascentTolerance?: AscentTolerance;
  /** Relative payload tolerance of the loss iteration, default 2e-4 (0.02 %). */
  tolerance?: number;
  warmStart?: AscentSizingSolution;
  trajectory?: boolean;
  /** Maximum passes, default 12. */
  maxPasses?: number;
}

/** Loss allowance to start from [m/s] (common practice: 1.5–2 km/s to low orbit). */
const FIRST_GUESS_LOSSES = 1700;

function check(value: unknown, field: string, ok: (v: number) => boolean, range: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || !ok(value)) {
    throw new RangeError(`${field} must be a finite number ${range}, got ${String(value)}`);
  }
  return value;
}

/**
 * Gross lift-off mass and stage masses for a required payload in ascent mode, iterating between
 * the simulated losses and the rocket equation (optimal staging) until they agree.
 *
 * Pass k: Δv_k = V_t + L_k → optimal staging (Lagrange multipliers) → stage masses m_p,i, m_s,i for
 * the payload → thrusts T_1 = (T/W)_1·m0·G0·Isp_vac/Isp_sl, T_i = (T/W)_i·m_ign,i·G0 → targeted
 * ascent → largest payload P_k and losses L_{k+1} = Σ G0·Isp_vac·ln(m0/mf) − V_t at P_k.
 * Converged when |P_k − P|/P ≤ tolerance (default 2e-4).
 *
 * @param input stages `{ ispVacuum s, ispSeaLevel s, structuralCoefficient (0,1), thrustToWeight > 0,
 *   coastAfter? s }` bottom first, payloadMass kg > 0, referenceArea m², dragCoefficient,
 *   verticalRiseTime?, steeringStartStage?.
 * @param target `{ altitude m, speed? m/s }` (see `ascentPayload`).
 * @param options time steps, tolerances, warm start, trajectory flag, pass budget.
 * @returns an {@link AscentSizingResult}; infeasible results carry `reasons` and never NaN.
 * @throws RangeError naming the field for non-physical input.
 * @see Curtis, Orbital Mechanics for Engineering Students, §11.6 (optimal staging, from memory);
 *   the loss iteration is common practice in conceptual launcher sizing.
 * @example
 * const s = sizeAscentVehicle({ stages: [
 *   { ispVacuum: 320, ispSeaLevel: 290, structuralCoefficient: 0.07, thrustToWeight: 1.3 },
 *   { ispVacuum: 345, ispSeaLevel: 250, structuralCoefficient: 0.08, thrustToWeight: 0.9 }],
 *   payloadMass: 10000, referenceArea: 10, dragCoefficient: DEFAULT_DRAG_COEFFICIENT },
 *   { altitude: 200e3 });
 * s.grossLiftOffMass; // kg
 */
export function sizeAscentVehicle(
  input: AscentSizingInput,
  target: AscentTarget,
  options: AscentSizingOptions = {}
): AscentSizingResult {
  if (typeof input !== 'object' || input === null) throw new RangeError('input must be an object');
  const st = input.stages;
  if (!Array.isArray(st) || st.length === 0 || st.length > 8) {
    throw new RangeError(`stages must be an array of 1 to 8 stages, got ${Array.isArray(st) ? st.length : typeof st}`);
  }
  const n = st.length;
  for (let i = 0; i < n; i++) {
    const s = st[i];
    const f = `stages[${i}]`;
    if (typeof s !== 'object' || s === null) throw new RangeError(`${f} must be an object`);
    check(s.ispVacuum, `${f}.ispVacuum`, (v) => v > 0 && v <= 10000, '> 0 and ≤ 10000 s');
    check(s.ispSeaLevel, `${f}.ispSeaLevel`, (v) => v > 0 && v <= s.ispVacuum, `> 0 and ≤ ispVacuum (${s.ispVacuum}) s`);
    check(s.structuralCoefficient, `${f}.structuralCoefficient`, (v) => v > 0 && v < 1, 'in (0, 1)');
    check(s.thrustToWeight, `${f}.thrustToWeight`, (v) => (i === 0 ? v > 1 : v > 0) && v <= 20, i === 0 ? '> 1 and ≤ 20 (lift-off)' : '> 0 and ≤ 20');
    if (s.coastAfter !== undefined) check(s.coastAfter, `${f}.coastAfter`, (v) => v >= 0 && v <= 1e5, '≥ 0 s');
  }
  const payload = check(input.payloadMass, 'payloadMass', (v) => v > 0 && v <= 1e9, '> 0 and ≤ 1e9 kg');
  const relTol = check(options.tolerance ?? 2e-4, 'tolerance', (v) => v > 0 && v < 0.1, 'in (0, 0.1)');
  const maxPasses = Math.floor(check(options.maxPasses ?? 12, 'maxPasses', (v) => v >= 1 && v <= 100, 'in [1, 100]'));
  if (typeof target !== 'object' || target === null) throw new RangeError('target must be an object');
  check(target.altitude, 'target.altitude', (v) => v >= 50e3 && v <= 2e6, 'in [50000, 2000000] m');
  if (target.speed !== undefined) check(target.speed, 'target.speed', (v) => v > 0 && v <= 20000, 'in (0, 20000] m/s');
  const stagingStages = st.map((s) => ({ isp: s.ispVacuum, structuralCoefficient: s.structuralCoefficient }));

  const ws = options.warmStart;
  let losses = ws && Number.isFinite(ws.losses) && ws.losses > 0 ? ws.losses : FIRST_GUESS_LOSSES;
  let shoot: AscentSolution | undefined = ws ? { ...ws, payloadMass: payload } : undefined;
  let sims = 0;
  let last: AscentPayloadResult | null = null;
  let masses: StageMasses[] = [];
  let thrust: number[] = [];
  let sizedDv = 0;
  const empty = (reason: AscentSizingInfeasibility, message: string, passes: number): AscentSizingResult => ({
    feasible: false,
    reasons: [reason],
    message,
    grossLiftOffMass: 0,
    stageMasses: [],
    thrustVacuum: [],
    sizedDeltaV: sizedDv,
    passes,
    simulations: sims,
    ascent: last,
    solution: { pitchKick: shoot?.pitchKick ?? 1, finalPitch: shoot?.finalPitch ?? 0, payloadMass: payload, losses }
  });
  const Vt = target.speed;
  for (let pass = 1; pass <= maxPasses; pass++) {
    // Target speed (ascentPayload validates the target): given, or circular √(μ/(R + h)).
    const vt = Vt ?? Math.sqrt(EARTH.mu / (EARTH.radius + target.altitude));
    sizedDv = vt + losses;
    // Optimal staging for Δv = V_t + L (Lagrange multipliers, vacuum Isp).
    const sizing = sizeForPayload(stagingStages, Math.min(sizedDv, 1e5), payload);
    if (!sizing.feasible) {
      return empty('staging-infeasible', sizing.reason?.message ?? 'optimal staging cannot reach the delta-v', pass);
    }
    masses = sizing.stages;
    thrust = masses.map((m, i) => {
      const s = st[i];
      // Thrust from T/W at ignition; first stage given at sea level: T_vac = T_sl·Isp_vac/Isp_sl (same ṁ).
      return i === 0
        ? s.thrustToWeight * m.ignitionMass * G0 * (s.ispVacuum / s.ispSeaLevel)
        : s.thrustToWeight * m.ignitionMass * G0;
    });
    const vehicle = compileAscentVehicle({
      stages: masses.map((m, i) => ({
        propellantMass: m.propellantMass,
        dryMass: m.structuralMass,
        thrustVacuum: thrust[i],
        ispVacuum: st[i].ispVacuum,
        ispSeaLevel: st[i].ispSeaLevel,
        coastAfter: st[i].coastAfter
      })),
      referenceArea: input.referenceArea,
      dragCoefficient: input.dragCoefficient,
      verticalRiseTime: input.verticalRiseTime,
      nominalPayloadMass: payload,
      steeringStartStage: input.steeringStartStage
    });
    const r = ascentPayload(vehicle, target, {
      timeStep: options.timeStep,
      tolerance: options.ascentTolerance,
      warmStart: shoot
    });
    sims += r.simulations;
    last = r;
    if (!r.feasible) {
      return empty('ascent-infeasible', `the sized vehicle's ascent is infeasible: ${r.message}`, pass);
    }
    shoot = r.solution;
    const newLosses = r.losses.total;
    const err = Math.abs(r.payloadMass - payload) / payload;
    losses = newLosses;
    if (err <= relTol) {
      let trajectory: AscentTrajectory | undefined;
      if (options.trajectory) {
        const rt = ascentPayload(vehicle, target, { timeStep: options.timeStep, tolerance: options.ascentTolerance, warmStart: shoot, trajectory: true });
        sims += rt.simulations;
        trajectory = rt.trajectory;
      }
      const out: AscentSizingResult = {
        feasible: true,
        reasons: [],
        message: '',
        grossLiftOffMass: sizing.grossMass,
        stageMasses: masses,
        thrustVacuum: thrust,
        sizedDeltaV: sizedDv,
        passes: pass,
        simulations: sims,
        ascent: r,
        solution: { ...shoot, losses }
      };
      if (trajectory) out.trajectory = trajectory;
      return out;
    }
  }
  return empty('sizing-not-converged', `the loss iteration did not converge in ${maxPasses} passes`, maxPasses);
}
