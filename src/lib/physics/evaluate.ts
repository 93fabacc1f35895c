/**
 * Fast single-case evaluator for budget mode, built for the sweep engine's inner loop.
 *
 * Usage (allocate once per worker, mutate per case):
 *
 *   const input = createBudgetCaseInput();    // struct of scalars + Float64Array(MAX_STAGES) arrays
 *   const result = createBudgetCaseResult();
 *   for (const c of cases) {
 *     input.stageCount = 2; input.isp[0] = 300; ...; input.payloadMass = 5000;
 *     evaluateBudgetCase(input, result);       // no allocation; result fields overwritten
 *     store(budgetCaseToRecord(result));      // or read the fields directly
 *   }
 *
 * Two modes:
 * - 'sizing': stages given by Isp, structural coefficient ε and T/W at their ignition, plus a
 *   required payload → delta-v budget, optimal staging (Lagrange), gross lift-off mass and
 *   stage masses, feasibility. A stage may instead be given a fixed mass ratio n (`massRatio[i]`
 *   finite; NaN = optimise): see "Fixed mass ratios" below.
 * - 'vehicle': stages given by Isp, propellant and dry mass and thrust → the payload that closes
 *   the budget (the losses depend on the lift-off T/W, hence on the payload: one bracketed
 *   Newton iteration solves both together), feasibility.
 *
 * Fixed mass ratios (sizing mode). A stage with a given n is sized from it — its step payload
 * ratio (1 − ε·n)/((1 − ε)·n) and its delta-v c·ln n are fixed — and the free stages share the
 * rest of the requirement, Δv_free = Δv_required − Σ_fixed c_i·ln n_i, by the same
 * Lagrange-multiplier optimum (π = Π over all stages of the step ratios is separable, so the
 * optimum over the free stages with the fixed ones held is the optimum of the free stages alone
 * for Δv_free). With every stage fixed the vehicle's delta-v Σ c_i·ln n_i is what it is: short
 * of the requirement → `DELTA_V_UNREACHABLE` (explainBudgetCase states delivered vs required);
 * at or above it → feasible, sized with those ratios, and the surplus is delivered margin
 * (`deliveredDeltaV` − `totalDeltaV`), not propellant off-loaded — a fixed mass ratio means
 * the stage flies full. When the fixed stages alone cover the requirement in a mixed case, the
 * optimum leaves the free stages empty (n = 1), flagged `MASS_RATIO_INVALID` like any empty
 * stage (the case needs fewer stages). A fixed n ≤ 1 is `MASS_RATIO_INVALID` (not a stage); n ≥
 * 1/ε is `STAGE_MASS_RATIO_UNREACHABLE` (the stage's structure alone exceeds 1/n of its ignition
 * mass, so no mass on top closes it). Vehicle mode ignores `massRatio` (the masses fix it).
 *
 * Guarantees: no NaN or ±Infinity in the result (a non-finite intermediate is replaced by 0 and
 * flags `NON_FINITE_RESULT`); an unreachable delta-v gives payload 0 and `DELTA_V_UNREACHABLE`;
 * a malformed input (non-finite or out-of-range Isp, altitude, latitude …) throws a RangeError
 * naming the field, because that is a spec error the sweep should report once, not per case.
 * Physically impossible but well-formed values (ε ∉ (0, 1), T/W too low …) are feasibility
 * failures, not exceptions.
 */
import { DEFAULT_LOSS_CORRELATION, type LossCorrelation } from './budget';
import { DEFAULT_FEASIBILITY_LIMITS, checkFeasibility, type FeasibilityLimits, type FeasibilityReport } from './feasibility';
import { DEG, EARTH, G0 } from './constants';
import { insertionToTargetInto, type InsertionResult, type InsertionStrategy } from './orbits';
import { REASON_BIT, codesFromMask, type Reason, type ReasonCode } from './reasons';
import { MAX_STAGES, MAX_ISP, optimalStagingKernel, vehicleDeltaVKernel } from './rocket';

/** Input of {@link evaluateBudgetCase} (SI; arrays bottom first, only the first `stageCount` used). */
export interface BudgetCaseInput {
  /** 'sizing' (payload given → gross mass) or 'vehicle' (stage masses given → payload). */
  mode: 'sizing' | 'vehicle';
  /** Number of stages, 1..MAX_STAGES (8). */
  stageCount: number;
  /** Specific impulse per stage [s], in (0, 10000]. */
  isp: Float64Array;
  /** Sizing mode: structural coefficient ε = ms/(ms + mp) per stage. */
  structuralCoefficient: Float64Array;
  /** Sizing mode: thrust / (stack mass at ignition · G0) per stage; entry 0 is lift-off T/W. */
  thrustToWeight: Float64Array;
  /**
   * Sizing mode: fixed stage mass ratio n = m_ignition/m_burnout per stage, or NaN to optimise
   * that stage (the default). Optional so inputs built by hand before it existed still work.
   */
  massRatio?: Float64Array;
  /** Vehicle mode: propellant mass per stage [kg]. */
  propellantMass: Float64Array;
  /** Vehicle mode: dry mass per stage [kg]. */
  dryMass: Float64Array;
  /** Vehicle mode: thrust per stage [N] (held constant over the burn for the acceleration check). */
  thrust: Float64Array;
  /** Sizing mode: required payload [kg], > 0. */
  payloadMass: number;
  /** Target perigee altitude [m]. */
  targetPerigeeAltitude: number;
  /** Target apogee altitude [m] (= perigee for a circular target). */
  targetApogeeAltitude: number;
  /** Target inclination [deg]. */
  targetInclination: number;
  /** Launch-site latitude [deg]. */
  latitude: number;
  /** Insertion strategy (see orbits.ts). */
  strategy: InsertionStrategy;
  /** Burn-out altitude for 'parkingOrbit' / 'transferOrbit' [m]. */
  insertionAltitude: number;
  /** User loss allowances [m/s]; NaN (the default) → from the correlation. */
  gravityLoss: number;
  dragLoss: number;
  steeringLoss: number;
  /** Max dynamic pressure from elsewhere (e.g. ascent mode) [Pa]; NaN → correlation estimate. */
  maxDynamicPressure: number;
  /** Reserve = reserveFraction·(budget before reserve) + reserveValue [m/s]. */
  reserveFraction: number;
  reserveValue: number;
  /** Feasibility limits (default {@link DEFAULT_FEASIBILITY_LIMITS}). */
  limits: FeasibilityLimits;
  /** Loss correlation (default {@link DEFAULT_LOSS_CORRELATION}). */
  correlation: LossCorrelation;
}

/** Output of {@link evaluateBudgetCase} (SI; per-stage arrays length MAX_STAGES, first `stageCount` valid). */
export interface BudgetCaseResult {
  /** True when no feasibility check failed. */
  feasible: boolean;
  /** Failed checks as a bit mask of REASON_BIT (decode with codesFromMask). */
  failMask: number;
  /** Warnings as a bit mask (e.g. STRUCTURAL_COEFFICIENT_UNUSUAL). */
  warnMask: number;
  /** Budget terms [m/s]; rotationAssist is the (positive) assist that is subtracted. */
  insertionSpeed: number;
  gravityLoss: number;
  dragLoss: number;
  steeringLoss: number;
  rotationAssist: number;
  transferDeltaV: number;
  planeChangeDeltaV: number;
  reserve: number;
  /** Ideal delta-v the vehicle must supply [m/s]. */
  totalDeltaV: number;
  /**
   * Ideal delta-v of the stages as evaluated, Σ stageDeltaV [m/s]: equal to totalDeltaV (to
   * rounding) when the vehicle closes, more when fixed mass ratios over-deliver, what the fixed
   * ratios give when they fall short, 0 when an optimised staging cannot close.
   */
  deliveredDeltaV: number;
  /** 1 when the loss came from the correlation, 0 when given by the user (bit 0 gravity, 1 drag, 2 steering, 3 max-Q). */
  correlationMask: number;
  /** Inertial launch azimuth [deg], inclination flown [deg], plane change left [deg]. */
  azimuth: number;
  launchInclination: number;
  planeChangeAngle: number;
  /** Payload [kg], gross lift-off mass [kg], payload / gross. */
  payloadMass: number;
  grossMass: number;
  payloadFraction: number;
  /** Lift-off T/W (−), max axial acceleration [m/s²] (thrust / burn-out mass, max over stages), max-Q [Pa]. */
  liftoffThrustToWeight: number;
  maxAxialAcceleration: number;
  maxDynamicPressure: number;
  stageCount: number;
  massRatio: Float64Array;
  stageDeltaV: Float64Array;
  propellantMass: Float64Array;
  structuralMass: Float64Array;
  /** Stack mass at each stage's ignition [kg]. */
  ignitionMass: Float64Array;
  /** Thrust per stage [N]. */
  thrust: Float64Array;
  /** Thrust / (ignition mass·G0) per stage (−). */
  thrustToWeight: Float64Array;
  /** Structural coefficient per stage (−) (input in sizing mode, derived in vehicle mode). */
  structuralCoefficient: Float64Array;
}

/**
 * A fresh input with default values: 2 stages zeroed, direct insertion, losses from the
 * correlation (NaN), no reserve, default limits and correlation.
 *
 * @returns a mutable {@link BudgetCaseInput}.
 * @example
 * const input = createBudgetCaseInput();
 */
export function createBudgetCaseInput(): BudgetCaseInput {
  return {
    mode: 'sizing',
    stageCount: 2,
    isp: new Float64Array(MAX_STAGES),
    structuralCoefficient: new Float64Array(MAX_STAGES),
    thrustToWeight: new Float64Array(MAX_STAGES),
    massRatio: new Float64Array(MAX_STAGES).fill(NaN),
    propellantMass: new Float64Array(MAX_STAGES),
    dryMass: new Float64Array(MAX_STAGES),
    thrust: new Float64Array(MAX_STAGES),
    payloadMass: 0,
    targetPerigeeAltitude: 200e3,
    targetApogeeAltitude: 200e3,
    targetInclination: 28.5,
    latitude: 28.5,
    strategy: 'direct',
    insertionAltitude: 200e3,
    gravityLoss: NaN,
    dragLoss: NaN,
    steeringLoss: NaN,
    maxDynamicPressure: NaN,
    reserveFraction: 0,
    reserveValue: 0,
    limits: DEFAULT_FEASIBILITY_LIMITS,
    correlation: DEFAULT_LOSS_CORRELATION
  };
}

/**
 * A zeroed result to reuse with {@link evaluateBudgetCase}.
 *
 * @returns a mutable {@link BudgetCaseResult}.
 * @example
 * const result = createBudgetCaseResult();
 */
export function createBudgetCaseResult(): BudgetCaseResult {
  return {
    feasible: false,
    failMask: 0,
    warnMask: 0,
    insertionSpeed: 0,
    gravityLoss: 0,
    dragLoss: 0,
    steeringLoss: 0,
    rotationAssist: 0,
    transferDeltaV: 0,
    planeChangeDeltaV: 0,
    reserve: 0,
    totalDeltaV: 0,
    deliveredDeltaV: 0,
    correlationMask: 0,
    azimuth: 0,
    launchInclination: 0,
    planeChangeAngle: 0,
    payloadMass: 0,
    grossMass: 0,
    payloadFraction: 0,
    liftoffThrustToWeight: 0,
    maxAxialAcceleration: 0,
    maxDynamicPressure: 0,
    stageCount: 0,
    massRatio: new Float64Array(MAX_STAGES),
    stageDeltaV: new Float64Array(MAX_STAGES),
    propellantMass: new Float64Array(MAX_STAGES),
    structuralMass: new Float64Array(MAX_STAGES),
    ignitionMass: new Float64Array(MAX_STAGES),
    thrust: new Float64Array(MAX_STAGES),
    thrustToWeight: new Float64Array(MAX_STAGES),
    structuralCoefficient: new Float64Array(MAX_STAGES)
  };
}

// Module scratch (single-threaded JS: safe to share between calls).
const C = new Float64Array(MAX_STAGES);
const LNN = new Float64Array(MAX_STAGES);
const ORBIT: InsertionResult = {
  insertionSpeed: 0,
  insertionAltitude: 0,
  transferDeltaV: 0,
  planeChangeDeltaV: 0,
  launchInclination: 0,
  planeChangeAngle: 0,
  azimuth: 0
};
const ORBIT_IN = {
  targetPerigeeAltitude: NaN,
  targetApogeeAltitude: NaN,
  targetInclination: NaN,
  latitude: NaN,
  strategy: 'direct' as InsertionStrategy,
  insertionAltitude: NaN
};
let orbitAssist = 0;
const GEOMETRY = { ...ORBIT_IN };

// Parameters of the vehicle-mode required delta-v, set once per case (avoids a closure).
const REQ = { t0: 0, dryTotal: 0, corrMask: 0, ga: 0, gb: 0, d0: 0, d1: 0, userG: 0, userD: 0, fixed: 0, rf: 0, rv: 0 };

/** d required/dx = (1 + rf)·(b/ψ − d1·ψ)/(M + x) for the correlated terms (chain rule, dψ/dx = −ψ/(M + x)). */
function requiredSlope(x: number): number {
  const m = REQ.dryTotal + x;
  const psi = REQ.t0 / (m * G0);
  let s = 0;
  if (REQ.corrMask & 1 && REQ.ga + REQ.gb / psi > 0) s += REQ.gb / psi;
  if (REQ.corrMask & 2 && REQ.d0 + REQ.d1 * psi > 0) s -= REQ.d1 * psi;
  return ((1 + REQ.rf) * s) / m;
}

// dΔv_vehicle/dx of the last deltaVAndSlope call.
let SLOPE = 0;

/**
 * Δv_vehicle(x) = Σ c_i·ln(m0_i/(m0_i − mp_i)) (exactly as vehicleDeltaVKernel sums it) and, into
 * SLOPE, its derivative Σ c_i·(1/m0_i − 1/(m0_i − mp_i)) in the same pass over the stages.
 */
function deltaVAndSlope(k: number, mp: Float64Array, md: Float64Array, x: number): number {
  let m0 = x;
  let dv = 0;
  let df = 0;
  for (let i = k - 1; i >= 0; i--) {
    const p = mp[i];
    m0 += p + md[i];
    const mf = m0 - p;
    // Rocket equation for stage i and its derivative in the payload.
    dv += C[i] * Math.log(m0 / mf);
    df += C[i] * (1 / m0 - 1 / mf);
  }
  SLOPE = df;
  return dv;
}

/** Required delta-v for payload x: ψ = T0/((M + x)·G0) feeds the loss correlation. */
function required(x: number): number {
  const psi = REQ.t0 / ((REQ.dryTotal + x) * G0);
  // Correlation a + b/ψ + c·h and d0 + d1·ψ, or the user's allowances.
  const g = REQ.corrMask & 1 ? Math.max(0, REQ.ga + REQ.gb / psi) : REQ.userG;
  const d = REQ.corrMask & 2 ? Math.max(0, REQ.d0 + REQ.d1 * psi) : REQ.userD;
  // Reserve as a fraction of the budget before reserve plus a fixed value.
  return (REQ.fixed + g + d) * (1 + REQ.rf) + REQ.rv;
}

// Outcome of fixedRatioStaging besides its return value (module scratch, like C and LNN).
const FIXED = { fail: 0, deliveredFixed: 0 };
const CF = new Float64Array(MAX_STAGES);
const EF = new Float64Array(MAX_STAGES);
const NF = new Float64Array(MAX_STAGES);
const LF = new Float64Array(MAX_STAGES);

/**
 * Staging with some stage mass ratios fixed (finite `fixed[i]`) and the rest optimised for the
 * remaining delta-v (see the file header). Writes n_i into `massRatios` and ln n_i into LNN;
 * sets FIXED.fail (MASS_RATIO_INVALID for a fixed n ≤ 1, STAGE_MASS_RATIO_UNREACHABLE for
 * n·ε ≥ 1). Returns π = Π (1 − ε_i n_i)/((1 − ε_i) n_i), or −1 when the delta-v is not reached
 * or a fixed ratio is unbuildable. Inputs validated by the caller (c = C, 0 < ε < 1).
 */
function fixedRatioStaging(
  k: number,
  eps: Float64Array,
  fixed: Float64Array,
  deltaV: number,
  massRatios: Float64Array
): number {
  let fail = 0;
  let piFixed = 1;
  let dvFixed = 0;
  let free = 0;
  for (let i = 0; i < k; i++) {
    const n = fixed[i];
    if (n !== n) {
      CF[free] = C[i];
      EF[free] = eps[i];
      free++;
      continue;
    }
    const e = eps[i];
    if (!(n > 1)) fail |= REASON_BIT.MASS_RATIO_INVALID;
    else if (!(n * e < 1)) fail |= REASON_BIT.STAGE_MASS_RATIO_UNREACHABLE;
    massRatios[i] = n;
    // Rocket equation of the fixed stage, c_i·ln n_i, and its step payload ratio.
    const l = n > 0 ? Math.log(n) : 0;
    LNN[i] = l;
    dvFixed += C[i] * l;
    piFixed *= (1 - e * n) / ((1 - e) * n);
  }
  FIXED.fail = fail;
  FIXED.deliveredFixed = dvFixed;
  if (fail !== 0) return -1;
  if (free === 0) return dvFixed >= deltaV ? piFixed : -1;
  // The free stages supply what the fixed ones leave (none left: they stay empty, n = 1).
  const rest = deltaV - dvFixed;
  const piFree = optimalStagingKernel(free, CF, EF, rest > 0 ? rest : 0, NF, LF);
  if (piFree < 0) return -1;
  for (let i = 0, j = 0; i < k; i++) {
    if (fixed[i] === fixed[i]) continue;
    massRatios[i] = NF[j];
    LNN[i] = LF[j];
    j++;
  }
  return piFixed * piFree;
}

function range(name: string, v: number, min: number, max: number): void {
  if (!(v >= min && v <= max)) throw new RangeError(`${name} must be a finite number in [${min}, ${max}], got ${v}`);
}

/** Orbital terms, recomputed only when the geometry differs from the previous case. */
function orbitTerms(input: BudgetCaseInput): void {
  const ha = input.targetApogeeAltitude;
  const hi = input.strategy === 'direct' ? input.targetPerigeeAltitude : input.insertionAltitude;
  if (
    input.targetPerigeeAltitude === ORBIT_IN.targetPerigeeAltitude &&
    ha === ORBIT_IN.targetApogeeAltitude &&
    input.targetInclination === ORBIT_IN.targetInclination &&
    input.latitude === ORBIT_IN.latitude &&
    input.strategy === ORBIT_IN.strategy &&
    hi === ORBIT_IN.insertionAltitude
  ) {
    return;
  }
  ORBIT_IN.targetPerigeeAltitude = NaN; // invalidate while computing (an exception leaves it invalid)
  GEOMETRY.targetPerigeeAltitude = input.targetPerigeeAltitude;
  GEOMETRY.targetApogeeAltitude = ha;
  GEOMETRY.targetInclination = input.targetInclination;
  GEOMETRY.latitude = input.latitude;
  GEOMETRY.strategy = input.strategy;
  GEOMETRY.insertionAltitude = hi;
  insertionToTargetInto(GEOMETRY, ORBIT);
  // Earth-rotation assist ω·R·cos φ·sin β along the azimuth flown.
  orbitAssist = EARTH.rotationRate * EARTH.radius * Math.cos(input.latitude * DEG) * Math.sin(ORBIT.azimuth * DEG);
  ORBIT_IN.targetApogeeAltitude = ha;
  ORBIT_IN.targetInclination = input.targetInclination;
  ORBIT_IN.latitude = input.latitude;
  ORBIT_IN.strategy = input.strategy;
  ORBIT_IN.insertionAltitude = hi;
  ORBIT_IN.targetPerigeeAltitude = input.targetPerigeeAltitude;
}

function clearStages(out: BudgetCaseResult, count: number): void {
  for (let i = 0; i < count; i++) {
    out.massRatio[i] = 0;
    out.stageDeltaV[i] = 0;
    out.propellantMass[i] = 0;
    out.structuralMass[i] = 0;
    out.ignitionMass[i] = 0;
    out.thrust[i] = 0;
    out.thrustToWeight[i] = 0;
    out.structuralCoefficient[i] = 0;
  }
}

/**
 * Evaluate one budget-mode case: delta-v budget, sizing (or payload), feasibility.
 *
 * Formulas: budget total = v_ins + Δv_g + Δv_d + Δv_s − ω·R·cos φ·sin β + Δv_transfer +
 * Δv_plane + reserve (see budget.ts; losses from the correlation a + b/ψ + c·h, d0 + d1·ψ, s + sh·h when
 * not given); sizing by the Lagrange-multiplier optimum (rocket.ts) with m0 = m_L/π; vehicle mode
 * solves Σ c_i·ln(m0_i/(m0_i − mp_i)) = total(ψ(m_L)) for m_L, ψ = T_0/((M + m_L)·G0); max axial
 * acceleration = max_i T_i/(m0_i − mp_i) (vacuum thrust at burn-out, drag neglected).
 *
 * @param input see {@link BudgetCaseInput}; read only.
 * @param out result to overwrite (default: a new one; pass one to avoid allocation).
 * @returns `out`.
 * @throws RangeError naming the field for malformed input (see the file header).
 * @see budget.ts, rocket.ts, orbits.ts, feasibility.ts for the sources of each formula.
 * @example
 * const input = createBudgetCaseInput();
 * input.isp.set([300, 345]); input.structuralCoefficient.set([0.07, 0.09]);
 * input.thrustToWeight.set([1.3, 0.9]); input.payloadMass = 5000;
 * evaluateBudgetCase(input).grossMass; // ≈ 1.776e5 kg (direct to 200 km, 28.5°)
 */
export function evaluateBudgetCase(input: BudgetCaseInput, out: BudgetCaseResult = createBudgetCaseResult()): BudgetCaseResult {
  const k = input.stageCount;
  if (!(k >= 1 && k <= MAX_STAGES && (k | 0) === k)) throw new RangeError(`stageCount must be an integer in [1, ${MAX_STAGES}], got ${k}`);
  const vehicleMode = input.mode === 'vehicle';
  if (!vehicleMode && input.mode !== 'sizing') throw new RangeError(`mode must be 'sizing' or 'vehicle', got ${String(input.mode)}`);
  for (let i = 0; i < k; i++) {
    const isp = input.isp[i];
    if (!(isp > 0 && isp <= MAX_ISP)) throw new RangeError(`isp[${i}] must be a finite number in (0, ${MAX_ISP}] s, got ${isp}`);
    C[i] = isp * G0;
  }
  orbitTerms(input);
  const limits = input.limits ?? DEFAULT_FEASIBILITY_LIMITS;
  const corr = input.correlation ?? DEFAULT_LOSS_CORRELATION;
  const rf = input.reserveFraction;
  const rv = input.reserveValue;
  range('reserveFraction', rf, 0, 1);
  range('reserveValue', rv, 0, 1e5);
  const userG = input.gravityLoss;
  const userD = input.dragLoss;
  const userS = input.steeringLoss;
  const userQ = input.maxDynamicPressure;
  let corrMask = 0;
  if (userG === userG) range('gravityLoss', userG, 0, 1e5);
  else corrMask |= 1;
  if (userD === userD) range('dragLoss', userD, 0, 1e5);
  else corrMask |= 2;
  if (userS === userS) range('steeringLoss', userS, 0, 1e5);
  else corrMask |= 4;
  if (userQ === userQ) range('maxDynamicPressure', userQ, 0, 1e9);
  else corrMask |= 8;
  const h = ORBIT.insertionAltitude;
  const ga = corr.gravity.a + corr.gravity.c * h;
  const gb = corr.gravity.b;
  const d0 = corr.drag.d0;
  const d1 = corr.drag.d1;
  // Steering-loss correlation s + sh·h (as lossAllowances in budget.ts), or the user's.
  const steerCorr = corr.steering.s + (corr.steering.sh ?? 0) * h;
  const steer = corrMask & 4 ? (steerCorr > 0 ? steerCorr : 0) : userS;
  // Orbital part of the budget (independent of the vehicle).
  const orbital = ORBIT.insertionSpeed - orbitAssist + ORBIT.transferDeltaV + ORBIT.planeChangeDeltaV;

  // Zero the per-stage fields this case uses and any left over from a larger previous case.
  clearStages(out, out.stageCount > k ? out.stageCount : k);
  out.stageCount = k;
  let fail = 0;
  let warn = 0;
  let psi0: number;
  let payload: number;
  let gross = 0;
  let gl = 0;
  let dl = 0;
  let total = 0;

  if (!vehicleMode) {
    psi0 = input.thrustToWeight[0];
    payload = input.payloadMass;
    if (!(payload > 0 && payload <= 1e9)) throw new RangeError(`payloadMass must be a finite number in (0, 1e9] kg, got ${payload}`);
    for (let i = 0; i < k; i++) {
      const tw = input.thrustToWeight[i];
      if (!(tw > 0 && tw <= 100)) throw new RangeError(`thrustToWeight[${i}] must be a finite number in (0, 100], got ${tw}`);
      const e = input.structuralCoefficient[i];
      if (e !== e) throw new RangeError(`structuralCoefficient[${i}] must be a number, got NaN`);
      out.structuralCoefficient[i] = e;
      out.thrustToWeight[i] = tw;
    }
    // Losses from the correlation at lift-off T/W ψ (a + b/ψ + c·h; d0 + d1·ψ), or the user's.
    gl = corrMask & 1 ? Math.max(0, ga + gb / psi0) : userG;
    dl = corrMask & 2 ? Math.max(0, d0 + d1 * psi0) : userD;
    const base = orbital + gl + dl + steer;
    // Reserve as a fraction of the budget before reserve plus a fixed value.
    total = base * (1 + rf) + rv;
    let epsOk = true;
    for (let i = 0; i < k; i++) {
      const e = input.structuralCoefficient[i];
      if (!(e > 0 && e < 1)) epsOk = false;
    }
    if (!epsOk) {
      fail |= REASON_BIT.STRUCTURAL_COEFFICIENT_INVALID;
      payload = 0;
    } else {
      const fixedN = input.massRatio;
      let nFixed = 0;
      if (fixedN !== undefined) {
        for (let i = 0; i < k; i++) {
          const n = fixedN[i];
          if (n !== n) continue;
          if (n - n !== 0) throw new RangeError(`massRatio[${i}] must be a finite number (or NaN to optimise the stage), got ${n}`);
          nFixed++;
        }
      }
      const pi =
        nFixed === 0
          ? optimalStagingKernel(k, C, input.structuralCoefficient, total > 0 ? total : 0, out.massRatio, LNN)
          : fixedRatioStaging(k, input.structuralCoefficient, fixedN!, total > 0 ? total : 0, out.massRatio);
      if (nFixed > 0) fail |= FIXED.fail;
      if (!(pi > 0)) {
        if (nFixed === 0 || !(FIXED.fail & (REASON_BIT.MASS_RATIO_INVALID | REASON_BIT.STAGE_MASS_RATIO_UNREACHABLE)))
          fail |= REASON_BIT.DELTA_V_UNREACHABLE;
        payload = 0;
        out.payloadFraction = 0;
        for (let i = 0; i < k; i++) {
          // A fixed ratio is an input: keep it and its delta-v on show; optimised ones have none.
          const n = nFixed > 0 ? fixedN![i] : NaN;
          out.massRatio[i] = n === n ? n : 0;
          out.stageDeltaV[i] = n === n && n > 0 ? C[i] * Math.log(n) : 0;
        }
      } else {
        gross = payload / pi;
        out.payloadFraction = pi;
        let m0 = gross;
        let maxAcc = 0;
        for (let i = 0; i < k; i++) {
          const e = input.structuralCoefficient[i];
          const n = out.massRatio[i];
          // Next stack mass from the step payload ratio (1 − ε n)/((1 − ε) n).
          const next = (m0 * (1 - e * n)) / ((1 - e) * n);
          const s = m0 - next;
          out.ignitionMass[i] = m0;
          out.propellantMass[i] = (1 - e) * s;
          out.structuralMass[i] = e * s;
          // Rocket equation per stage, c_i·ln n_i (ln n_i from the staging kernel).
          out.stageDeltaV[i] = C[i] * LNN[i];
          const thrust = input.thrustToWeight[i] * m0 * G0;
          out.thrust[i] = thrust;
          // Burn-out acceleration T/(m0/n) = ψ·n·G0.
          const acc = input.thrustToWeight[i] * n * G0;
          if (acc > maxAcc) maxAcc = acc;
          if (!(n > 1 + 1e-12)) fail |= REASON_BIT.MASS_RATIO_INVALID;
          m0 = next;
        }
        out.maxAxialAcceleration = maxAcc;
      }
    }
  } else {
    let dryTotal = 0;
    for (let i = 0; i < k; i++) {
      const mp = input.propellantMass[i];
      const md = input.dryMass[i];
      const th = input.thrust[i];
      if (!(mp >= 0 && mp <= 1e10)) throw new RangeError(`propellantMass[${i}] must be a finite number in [0, 1e10] kg, got ${mp}`);
      if (!(md > 0 && md <= 1e10)) throw new RangeError(`dryMass[${i}] must be a finite number in (0, 1e10] kg, got ${md}`);
      if (!(th > 0 && th <= 1e10)) throw new RangeError(`thrust[${i}] must be a finite number in (0, 1e10] N, got ${th}`);
      dryTotal += mp + md;
      // Structural coefficient from the stage masses.
      out.structuralCoefficient[i] = md / (md + mp);
    }
    const t0 = input.thrust[0];
    const fixedLoss = !(corrMask & 3);
    REQ.t0 = t0;
    REQ.dryTotal = dryTotal;
    REQ.corrMask = corrMask;
    REQ.ga = ga;
    REQ.gb = gb;
    REQ.d0 = d0;
    REQ.d1 = d1;
    REQ.userG = userG;
    REQ.userD = userD;
    REQ.fixed = orbital + steer;
    REQ.rf = rf;
    REQ.rv = rv;
    let x = 0;
    const mp = input.propellantMass;
    const md = input.dryMass;
    let f = deltaVAndSlope(k, mp, md, 0) - required(0);
    if (f < 0) {
      fail |= REASON_BIT.DELTA_V_UNREACHABLE;
      payload = 0;
    } else {
      // Bracketed Newton on g(x) = Δv_vehicle(x) − required(x), analytic derivative (the
      // vehicle's part from the same pass that gave Δv_vehicle(x)).
      let lo = 0;
      let hi = Infinity;
      for (let it = 0; it < 100 && f !== 0; it++) {
        let df = SLOPE;
        if (!fixedLoss) df -= requiredSlope(x);
        let next = x - f / df;
        if (!(next > lo && next < hi)) next = hi === Infinity ? 2 * x + 0.01 * dryTotal : 0.5 * (lo + hi);
        x = next;
        f = deltaVAndSlope(k, mp, md, x) - required(x);
        if (f > 0) lo = x;
        else hi = x;
        if (Math.abs(f) < 1e-9 || (hi !== Infinity && hi - lo <= 1e-12 * hi)) break;
      }
      payload = x;
    }
    gross = dryTotal + payload;
    psi0 = t0 / (gross * G0);
    gl = corrMask & 1 ? Math.max(0, ga + gb / psi0) : userG;
    dl = corrMask & 2 ? Math.max(0, d0 + d1 * psi0) : userD;
    total = (orbital + gl + dl + steer) * (1 + rf) + rv;
    let m0 = gross;
    let maxAcc = 0;
    for (let i = 0; i < k; i++) {
      const mp = input.propellantMass[i];
      const th = input.thrust[i];
      const mf = m0 - mp;
      // Stage mass ratio and rocket equation.
      const n = m0 / mf;
      out.massRatio[i] = n;
      out.stageDeltaV[i] = C[i] * Math.log(n);
      out.ignitionMass[i] = m0;
      out.propellantMass[i] = mp;
      out.structuralMass[i] = input.dryMass[i];
      out.thrust[i] = th;
      out.thrustToWeight[i] = th / (m0 * G0);
      // Burn-out acceleration T/m_f.
      const acc = th / mf;
      if (acc > maxAcc) maxAcc = acc;
      if (!(n > 1 + 1e-12)) fail |= REASON_BIT.MASS_RATIO_INVALID;
      m0 = mf - input.dryMass[i];
    }
    out.maxAxialAcceleration = maxAcc;
    out.payloadFraction = gross > 0 ? payload / gross : 0;
  }

  // Max-Q: given, or the correlation estimate q0 + q1·ψ.
  const q = corrMask & 8 ? corr.maxQ.q0 + corr.maxQ.q1 * psi0 : userQ;
  out.maxDynamicPressure = q > 0 ? q : 0;
  out.insertionSpeed = ORBIT.insertionSpeed;
  out.gravityLoss = gl;
  out.dragLoss = dl;
  out.steeringLoss = steer;
  out.rotationAssist = orbitAssist;
  out.transferDeltaV = ORBIT.transferDeltaV;
  out.planeChangeDeltaV = ORBIT.planeChangeDeltaV;
  const beforeReserve = orbital + gl + dl + steer;
  out.reserve = total - beforeReserve;
  out.totalDeltaV = total;
  let delivered = 0;
  for (let i = 0; i < k; i++) delivered += out.stageDeltaV[i];
  out.deliveredDeltaV = delivered;
  out.correlationMask = corrMask;
  out.azimuth = ORBIT.azimuth;
  out.launchInclination = ORBIT.launchInclination;
  out.planeChangeAngle = ORBIT.planeChangeAngle;
  out.payloadMass = fail & REASON_BIT.DELTA_V_UNREACHABLE ? 0 : payload;
  out.grossMass = fail & (REASON_BIT.DELTA_V_UNREACHABLE | REASON_BIT.STRUCTURAL_COEFFICIENT_INVALID) && !vehicleMode ? 0 : gross;
  out.liftoffThrustToWeight = psi0;

  // Feasibility checks (bit masks; explainBudgetCase expands them with margins).
  const minTw = limits.minLiftoffThrustToWeight;
  if (minTw !== undefined && !(psi0 >= minTw)) fail |= REASON_BIT.LIFTOFF_THRUST_TO_WEIGHT_LOW;
  const minUp = limits.minUpperStageThrustToWeight;
  if (minUp !== undefined) {
    for (let i = 1; i < k; i++) {
      const tw = out.thrustToWeight[i];
      if (tw !== 0 && !(tw >= minUp)) fail |= REASON_BIT.STAGE_THRUST_TO_WEIGHT_LOW;
    }
  }
  const maxQ = limits.maxDynamicPressure;
  if (maxQ !== undefined && !(out.maxDynamicPressure <= maxQ)) fail |= REASON_BIT.MAX_DYNAMIC_PRESSURE_HIGH;
  const maxA = limits.maxAxialAcceleration;
  if (maxA !== undefined && !(out.maxAxialAcceleration <= maxA)) fail |= REASON_BIT.MAX_AXIAL_ACCELERATION_HIGH;
  const minPay = limits.minPayloadMass;
  if (minPay !== undefined && !(out.payloadMass >= minPay)) fail |= REASON_BIT.PAYLOAD_BELOW_FLOOR;
  const maxGross = limits.maxGrossMass;
  if (maxGross !== undefined && !(out.grossMass <= maxGross)) fail |= REASON_BIT.GROSS_MASS_ABOVE_CEILING;
  if (vehicleMode && !(out.payloadMass > 0) && !(fail & REASON_BIT.DELTA_V_UNREACHABLE)) fail |= REASON_BIT.PAYLOAD_NOT_POSITIVE;
  const band = limits.typicalStructuralCoefficient;
  if (band !== undefined) {
    for (let i = 0; i < k; i++) {
      const e = out.structuralCoefficient[i];
      if (e > 0 && e < 1 && (e < band.min || e > band.max)) warn |= REASON_BIT.STRUCTURAL_COEFFICIENT_UNUSUAL;
    }
  }
  if (!allFinite(out)) fail |= REASON_BIT.NON_FINITE_RESULT;
  out.failMask = fail;
  out.warnMask = warn;
  out.feasible = fail === 0;
  return out;
}

const SCALAR_KEYS = [
  'insertionSpeed',
  'gravityLoss',
  'dragLoss',
  'steeringLoss',
  'rotationAssist',
  'transferDeltaV',
  'planeChangeDeltaV',
  'reserve',
  'totalDeltaV',
  'deliveredDeltaV',
  'azimuth',
  'launchInclination',
  'planeChangeAngle',
  'payloadMass',
  'grossMass',
  'payloadFraction',
  'liftoffThrustToWeight',
  'maxAxialAcceleration',
  'maxDynamicPressure'
] as const;
const ARRAY_KEYS = [
  'massRatio',
  'stageDeltaV',
  'propellantMass',
  'structuralMass',
  'ignitionMass',
  'thrust',
  'thrustToWeight',
  'structuralCoefficient'
] as const;

/** Replace non-finite numbers by 0; true when all were finite already. */
function allFinite(out: BudgetCaseResult): boolean {
  // Fast path: x − x is 0 for finite x and NaN for NaN/±Infinity, so one sum tells.
  let z =
    out.insertionSpeed - out.insertionSpeed + (out.gravityLoss - out.gravityLoss) + (out.dragLoss - out.dragLoss) +
    (out.steeringLoss - out.steeringLoss) + (out.rotationAssist - out.rotationAssist) +
    (out.transferDeltaV - out.transferDeltaV) + (out.planeChangeDeltaV - out.planeChangeDeltaV) +
    (out.reserve - out.reserve) + (out.totalDeltaV - out.totalDeltaV) +
    (out.deliveredDeltaV - out.deliveredDeltaV) + (out.azimuth - out.azimuth) +
    (out.launchInclination - out.launchInclination) + (out.planeChangeAngle - out.planeChangeAngle) +
    (out.payloadMass - out.payloadMass) + (out.grossMass - out.grossMass) +
    (out.payloadFraction - out.payloadFraction) + (out.liftoffThrustToWeight - out.liftoffThrustToWeight) +
    (out.maxAxialAcceleration - out.maxAxialAcceleration) + (out.maxDynamicPressure - out.maxDynamicPressure);
  const k = out.stageCount;
  for (let i = 0; i < k; i++) {
    z +=
      out.massRatio[i] - out.massRatio[i] + (out.stageDeltaV[i] - out.stageDeltaV[i]) +
      (out.propellantMass[i] - out.propellantMass[i]) + (out.structuralMass[i] - out.structuralMass[i]) +
      (out.ignitionMass[i] - out.ignitionMass[i]) + (out.thrust[i] - out.thrust[i]) +
      (out.thrustToWeight[i] - out.thrustToWeight[i]) + (out.structuralCoefficient[i] - out.structuralCoefficient[i]);
  }
  if (z === 0) return true;
  return repairNonFinite(out);
}

/** Slow path of {@link allFinite}: zero every non-finite field. */
function repairNonFinite(out: BudgetCaseResult): boolean {
  let ok = true;
  for (let j = 0; j < SCALAR_KEYS.length; j++) {
    const key = SCALAR_KEYS[j];
    if (!Number.isFinite(out[key])) {
      out[key] = 0;
      ok = false;
    }
  }
  for (let j = 0; j < ARRAY_KEYS.length; j++) {
    const a = out[ARRAY_KEYS[j]];
    for (let i = 0; i < a.length; i++) {
      if (!Number.isFinite(a[i])) {
        a[i] = 0;
        ok = false;
      }
    }
  }
  return ok;
}

/** Plain, JSON-safe copy of a result (arrays cut to `stageCount`), for storage and display. */
export interface BudgetCaseRecord extends Omit<BudgetCaseResult, (typeof ARRAY_KEYS)[number]> {
  failures: ReasonCode[];
  warnings: ReasonCode[];
  massRatio: number[];
  stageDeltaV: number[];
  propellantMass: number[];
  structuralMass: number[];
  ignitionMass: number[];
  thrust: number[];
  thrustToWeight: number[];
  structuralCoefficient: number[];
}

/**
 * Copy a result into a plain JSON-safe record with decoded reason codes.
 *
 * @param r a result of {@link evaluateBudgetCase}.
 * @returns a new plain object.
 * @example
 * budgetCaseToRecord(evaluateBudgetCase(input)).failures; // e.g. ['LIFTOFF_THRUST_TO_WEIGHT_LOW']
 */
export function budgetCaseToRecord(r: BudgetCaseResult): BudgetCaseRecord {
  const k = r.stageCount;
  const cut = (a: Float64Array) => Array.from(a.subarray(0, k));
  return {
    feasible: r.feasible,
    failMask: r.failMask,
    warnMask: r.warnMask,
    failures: codesFromMask(r.failMask),
    warnings: codesFromMask(r.warnMask),
    insertionSpeed: r.insertionSpeed,
    gravityLoss: r.gravityLoss,
    dragLoss: r.dragLoss,
    steeringLoss: r.steeringLoss,
    rotationAssist: r.rotationAssist,
    transferDeltaV: r.transferDeltaV,
    planeChangeDeltaV: r.planeChangeDeltaV,
    reserve: r.reserve,
    totalDeltaV: r.totalDeltaV,
    deliveredDeltaV: r.deliveredDeltaV,
    correlationMask: r.correlationMask,
    azimuth: r.azimuth,
    launchInclination: r.launchInclination,
    planeChangeAngle: r.planeChangeAngle,
    payloadMass: r.payloadMass,
    grossMass: r.grossMass,
    payloadFraction: r.payloadFraction,
    liftoffThrustToWeight: r.liftoffThrustToWeight,
    maxAxialAcceleration: r.maxAxialAcceleration,
    maxDynamicPressure: r.maxDynamicPressure,
    stageCount: k,
    massRatio: cut(r.massRatio),
    stageDeltaV: cut(r.stageDeltaV),
    propellantMass: cut(r.propellantMass),
    structuralMass: cut(r.structuralMass),
    ignitionMass: cut(r.ignitionMass),
    thrust: cut(r.thrust),
    thrustToWeight: cut(r.thrustToWeight),
    structuralCoefficient: cut(r.structuralCoefficient)
  };
}

/**
 * Full feasibility report (every check with its limit, value and margin) for an evaluated case;
 * not for the hot path (allocates). Adds the staging reason when the delta-v was unreachable.
 *
 * @param input the case's input.
 * @param r its result from {@link evaluateBudgetCase}.
 * @returns a {@link FeasibilityReport} whose failMask includes the result's bits.
 * @example
 * explainBudgetCase(input, evaluateBudgetCase(input)).failures.map((f) => f.code);
 */
export function explainBudgetCase(input: BudgetCaseInput, r: BudgetCaseResult): FeasibilityReport {
  const k = r.stageCount;
  const report = checkFeasibility(
    {
      liftoffThrustToWeight: r.liftoffThrustToWeight,
      stageThrustToWeight: Array.from(r.thrustToWeight.subarray(0, k)),
      maxDynamicPressure: r.maxDynamicPressure,
      maxAxialAcceleration: r.failMask & REASON_BIT.DELTA_V_UNREACHABLE ? undefined : r.maxAxialAcceleration,
      payloadMass: r.payloadMass,
      grossMass: r.failMask & REASON_BIT.DELTA_V_UNREACHABLE ? undefined : r.grossMass,
      structuralCoefficients: Array.from(r.structuralCoefficient.subarray(0, k)),
      // Not when nothing was sized (a fixed-ratio failure is explained below, stage by stage).
      massRatios: r.failMask & (REASON_BIT.DELTA_V_UNREACHABLE | REASON_BIT.STRUCTURAL_COEFFICIENT_INVALID) || (input.mode === 'sizing' && !(r.payloadFraction > 0)) ? undefined : Array.from(r.massRatio.subarray(0, k))
    },
    input.limits ?? DEFAULT_FEASIBILITY_LIMITS
  );
  const extra: Array<[ReasonCode, () => Reason]> = [
    [
      'DELTA_V_UNREACHABLE',
      () => {
        let limit = 0;
        let allFixed = input.mode === 'sizing' && input.massRatio !== undefined;
        if (input.mode === 'sizing') {
          // Zero-payload limit Σ c_i ln(1/ε_i), with c_i ln n_i for a stage of fixed ratio n_i.
          for (let i = 0; i < k; i++) {
            const n = input.massRatio?.[i] ?? NaN;
            if (n === n) limit += input.isp[i] * G0 * Math.log(n);
            else {
              allFixed = false;
              limit -= input.isp[i] * G0 * Math.log(input.structuralCoefficient[i]);
            }
          }
        } else {
          limit = vehicleDeltaVKernel(k, Array.from(input.isp.subarray(0, k), (v) => v * G0), input.propellantMass, input.dryMass, 0);
        }
        return {
          code: 'DELTA_V_UNREACHABLE',
          limit,
          value: r.totalDeltaV,
          margin: limit - r.totalDeltaV,
          message: allFixed
            ? `the fixed mass ratios deliver ${limit.toFixed(1)} m/s, short of the required ${r.totalDeltaV.toFixed(1)} m/s`
            : `required ${r.totalDeltaV.toFixed(1)} m/s exceeds the zero-payload limit ${limit.toFixed(1)} m/s`
        };
      }
    ],
    [
      'MASS_RATIO_INVALID',
      () => {
        let stage = 0;
        for (let i = 0; i < k; i++) {
          const n = input.massRatio?.[i] ?? NaN;
          if (n === n && !(n > 1)) {
            stage = i;
            break;
          }
        }
        const n = input.massRatio?.[stage] ?? 0;
        return { code: 'MASS_RATIO_INVALID', limit: 1, value: n, margin: n - 1, stage, message: `stage ${stage + 1} fixed mass ratio ${n} must exceed 1` };
      }
    ],
    [
      'STAGE_MASS_RATIO_UNREACHABLE',
      () => {
        // The first stage whose fixed ratio n reaches 1/ε: its structure alone is ≥ m0/n.
        let stage = 0;
        for (let i = 0; i < k; i++) {
          const n = input.massRatio?.[i] ?? NaN;
          if (n === n && !(n * input.structuralCoefficient[i] < 1)) {
            stage = i;
            break;
          }
        }
        const n = input.massRatio?.[stage] ?? 0;
        const limit = 1 / input.structuralCoefficient[stage];
        return {
          code: 'STAGE_MASS_RATIO_UNREACHABLE',
          limit,
          value: n,
          margin: limit - n,
          stage,
          message: `stage ${stage + 1} fixed mass ratio ${n} is at or above 1/ε = ${limit.toFixed(3)}: no stage of that structure reaches it`
        };
      }
    ],
    [
      'PAYLOAD_NOT_POSITIVE',
      () => ({ code: 'PAYLOAD_NOT_POSITIVE', limit: 0, value: r.payloadMass, margin: r.payloadMass, message: 'the vehicle closes the budget with no payload' })
    ],
    [
      'NON_FINITE_RESULT',
      () => ({ code: 'NON_FINITE_RESULT', limit: 0, value: 0, margin: 0, message: 'a non-finite intermediate was replaced by 0' })
    ]
  ];
  for (const [code, make] of extra) {
    if (r.failMask & REASON_BIT[code] && !(report.failMask & REASON_BIT[code])) {
      report.failures.push(make());
      report.failMask |= REASON_BIT[code];
    }
  }
  report.feasible = report.failures.length === 0;
  return report;
}
