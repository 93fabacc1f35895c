/**
 * Rocket equation, staging and sizing. SI units: Isp in s, masses in kg, speeds in m/s.
 *
 * Notation: c = Isp·G0 (effective exhaust speed), ε = ms/(ms + mp) (structural coefficient),
 * n = m_ignition/m_burnout of one stage (stage mass ratio), π = payload / gross lift-off mass.
 *
 * Hot-path kernels (no allocation, no validation; the caller validates once per sweep):
 * `optimalStagingKernel`, `vehicleDeltaVKernel`, `payloadForVehicleKernel`.
 */
import { G0 } from './constants';
import type { Reason } from './reasons';

function requireRange(name: string, value: number, min: number, max: number, unit: string): void {
  if (!(value >= min && value <= max)) {
    throw new RangeError(`${name} must be a finite number in [${min}, ${max}] ${unit}, got ${value}`);
  }
}
function requireOpen(name: string, value: number, min: number, max: number, unit: string): void {
  if (!(value > min && value < max)) {
    throw new RangeError(`${name} must be a finite number in (${min}, ${max}) ${unit}, got ${value}`);
  }
}

/** Largest specific impulse accepted [s] (well above any chemical or nuclear-thermal engine). */
export const MAX_ISP = 10000;
/** Largest stage count handled by the staging routines. */
export const MAX_STAGES = 8;

/**
 * Ideal (Tsiolkovsky) delta-v.
 *
 * Formula: Δv = Isp·G0·ln(m0/mf).
 *
 * @param isp specific impulse [s], in (0, 10000].
 * @param massRatio initial / final mass, ≥ 1 and finite.
 * @returns ideal delta-v [m/s].
 * @throws RangeError naming `isp` or `massRatio`.
 * @see Tsiolkovsky rocket equation; Sutton & Biblarz, Rocket Propulsion Elements, eq. 4-6.
 * @example
 * idealDeltaV(300, Math.E); // ≈ 2941.995 m/s
 */
export function idealDeltaV(isp: number, massRatio: number): number {
  requireRange('isp', isp, Number.MIN_VALUE, MAX_ISP, 's');
  requireRange('massRatio', massRatio, 1, Number.MAX_VALUE, '(-)');
  // Tsiolkovsky rocket equation.
  return isp * G0 * Math.log(massRatio);
}

/**
 * Mass ratio needed for a delta-v (inverse rocket equation).
 *
 * Formula: m0/mf = exp(Δv / (Isp·G0)).
 *
 * @param isp specific impulse [s], in (0, 10000].
 * @param deltaV delta-v [m/s], in [0, 1e5].
 * @returns mass ratio (≥ 1).
 * @throws RangeError naming `isp` or `deltaV`.
 * @see Sutton & Biblarz, Rocket Propulsion Elements, eq. 4-7.
 * @example
 * massRatioForDeltaV(300, 2941.995); // ≈ 2.71828
 */
export function massRatioForDeltaV(isp: number, deltaV: number): number {
  requireRange('isp', isp, Number.MIN_VALUE, MAX_ISP, 's');
  requireRange('deltaV', deltaV, 0, 1e5, 'm/s');
  // Inverse Tsiolkovsky equation.
  return Math.exp(deltaV / (isp * G0));
}

/** Masses of one stage sized for the mass on top of it. */
export interface StageMasses {
  /** Propellant mass mp [kg]. */
  propellantMass: number;
  /** Structural (dry) mass ms [kg]. */
  structuralMass: number;
  /** mp + ms [kg]. */
  stageMass: number;
  /** Stack mass at this stage's ignition: stage + everything above [kg]. */
  ignitionMass: number;
  /** Stack mass at burn-out: structure + everything above [kg]. */
  burnoutMass: number;
}

/**
 * Size one stage from its structural coefficient and mass ratio for a given upper mass.
 *
 * Formula: with S = ms + mp and m_up the mass above, n = (S + m_up)/(ε·S + m_up), so
 * S = m_up·(n − 1)/(1 − n·ε); ms = ε·S, mp = (1 − ε)·S. Requires n·ε < 1.
 *
 * @param structuralCoefficient ε = ms/(ms + mp), in (0, 1).
 * @param massRatio stage mass ratio n, in [1, 1/ε).
 * @param upperMass mass carried above the stage (payload and upper stages) [kg], > 0.
 * @returns stage masses.
 * @throws RangeError naming the parameter (including n ≥ 1/ε, which no mass of stage reaches).
 * @see Curtis, Orbital Mechanics for Engineering Students, §11.5 (staging relations).
 * @example
 * stageMassesFromRatio(0.1, 3, 1000); // stageMass ≈ 2857.1 kg (S = 1000·2/0.7)
 */
export function stageMassesFromRatio(
  structuralCoefficient: number,
  massRatio: number,
  upperMass: number
): StageMasses {
  requireOpen('structuralCoefficient', structuralCoefficient, 0, 1, '(-)');
  requireRange('upperMass', upperMass, Number.MIN_VALUE, Number.MAX_VALUE, 'kg');
  if (!(massRatio >= 1 && massRatio * structuralCoefficient < 1)) {
    throw new RangeError(
      `massRatio must be in [1, 1/structuralCoefficient) = [1, ${1 / structuralCoefficient}), got ${massRatio}`
    );
  }
  // Stage mass from the definitions of n and ε.
  const s = (upperMass * (massRatio - 1)) / (1 - massRatio * structuralCoefficient);
  const ms = structuralCoefficient * s;
  return {
    propellantMass: s - ms,
    structuralMass: ms,
    stageMass: s,
    ignitionMass: s + upperMass,
    burnoutMass: ms + upperMass
  };
}

/** One stage for the staging optimiser. */
export interface StagingStage {
  /** Specific impulse [s], in (0, 10000]. */
  isp: number;
  /** ε = ms/(ms + mp), in (0, 1). */
  structuralCoefficient: number;
}

/** Result of {@link optimalStaging} and {@link fixedSplitStaging}. */
export interface StagingResult {
  /** False when the delta-v cannot be reached; then payloadFraction is 0. */
  feasible: boolean;
  /** Payload / gross lift-off mass, in [0, 1]. */
  payloadFraction: number;
  /** Stage mass ratios n_i (bottom first); 1 for a stage the optimum leaves empty. */
  massRatios: number[];
  /** Delta-v of each stage c_i·ln n_i [m/s]. */
  stageDeltaV: number[];
  /** Stack mass at each stage's ignition / gross mass; last entry = payloadFraction. */
  ignitionMassFractions: number[];
  /** Propellant mass of each stage / gross mass. */
  propellantFractions: number[];
  /** Structural mass of each stage / gross mass. */
  structuralFractions: number[];
  /** Largest delta-v these stages can give with zero payload, Σ c_i·ln(1/ε_i) [m/s]. */
  maxDeltaV: number;
  /** Lagrange multiplier η [s/m] of the optimum (0 for a fixed split or when infeasible). */
  multiplier: number;
  /** Why the result is infeasible, or null. */
  reason: Reason | null;
}

function validateStages(stages: readonly StagingStage[]): void {
  if (!Array.isArray(stages) || stages.length < 1 || stages.length > MAX_STAGES) {
    throw new RangeError(`stages must be an array of 1 to ${MAX_STAGES} stages, got ${stages?.length}`);
  }
  for (let i = 0; i < stages.length; i++) {
    requireRange(`stages[${i}].isp`, stages[i].isp, Number.MIN_VALUE, MAX_ISP, 's');
    requireOpen(`stages[${i}].structuralCoefficient`, stages[i].structuralCoefficient, 0, 1, '(-)');
  }
}

/**
 * Allocation-free core of {@link optimalStaging}: Lagrange-multiplier optimum for `count`
 * stages with exhaust speeds `c` [m/s] and structural coefficients `eps`, written into
 * `massRatios`. No validation (inputs assumed finite, c > 0, 0 < ε < 1, deltaV ≥ 0).
 *
 * Method: with x = 1/η the optimality condition gives n_i = (c_i − x)/(c_i·ε_i); x solves
 * F(x) = Σ c_i·max(0, ln n_i(x)) − Δv = 0 on [0, max c_i(1 − ε_i)); F is continuous and
 * decreasing, so a Newton iteration safeguarded by bisection on the bracket converges from any
 * start. The max(0, ·) is the bound n_i ≥ 1: in u_i = ln n_i the problem is separable and
 * concave, so its KKT point leaves a stage empty (n = 1) exactly when the unconstrained
 * Lagrange condition would give it n < 1 ("water-filling").
 *
 * @param count number of stages (1..MAX_STAGES).
 * @param c effective exhaust speeds Isp·G0 [m/s], bottom first.
 * @param eps structural coefficients, bottom first.
 * @param deltaV required delta-v [m/s].
 * @param massRatios receives n_i (length ≥ count).
 * @param logMassRatios optional, receives ln n_i (so callers get stage delta-v c_i·ln n_i
 *   without another logarithm).
 * @returns the payload fraction π, or −1 when Δv ≥ Σ c_i·ln(1/ε_i) (unreachable; massRatios
 *   then holds 1/ε_i, the zero-payload limit).
 * @see Curtis, Orbital Mechanics for Engineering Students, §11.6 (optimal staging, Lagrange
 *   multipliers), eqs. 11.61–11.63 (from memory).
 * @example
 * const n = new Float64Array(2);
 * optimalStagingKernel(2, new Float64Array([2942, 2942]), new Float64Array([0.1, 0.1]), 6000, n);
 */
export function optimalStagingKernel(
  count: number,
  c: ArrayLike<number>,
  eps: ArrayLike<number>,
  deltaV: number,
  massRatios: { [i: number]: number; length: number },
  logMassRatios?: { [i: number]: number; length: number }
): number {
  const ln = logMassRatios ?? LN_SCRATCH;
  // Zero-payload limit Σ c_i·ln(1/ε_i).
  let maxDv = 0;
  let cSum = 0;
  let epsSum = 0;
  let xMax = 0;
  for (let i = 0; i < count; i++) {
    maxDv -= c[i] * Math.log(eps[i]);
    cSum += c[i];
    epsSum += eps[i];
    // Stage i is used (n_i > 1) only while x < c_i·(1 − ε_i).
    const edge = c[i] * (1 - eps[i]);
    if (edge > xMax) xMax = edge;
  }
  if (!(deltaV < maxDv * (1 - 1e-12))) {
    for (let i = 0; i < count; i++) {
      massRatios[i] = 1 / eps[i];
      ln[i] = Math.log(1 / eps[i]);
    }
    return -1;
  }
  if (deltaV <= 0) {
    for (let i = 0; i < count; i++) {
      massRatios[i] = 1;
      ln[i] = 0;
    }
    return 1;
  }
  // Bracket [lo, hi] on x = 1/η with F(lo) > 0 > F(hi), F(x) = Σ c_i·max(0, ln n_i(x)) − Δv.
  let lo = 0;
  let hi = xMax;
  // Start from the identical-stage optimum with mean c and ε (equal mass ratios).
  const cBar = cSum / count;
  const epsBar = epsSum / count;
  let x = cBar * (1 - epsBar * Math.exp(deltaV / (count * cBar)));
  if (!(x > lo && x < hi)) x = 0.5 * (lo + hi);
  // |F| below which one last Newton step is taken without re-evaluating F: the step's own
  // error is of order (F''/2F')·(F/F')², far below 1e-9 m/s here.
  const fTol = 1e-3;
  for (let it = 0; it < 200; it++) {
    let f = -deltaV;
    let df = 0;
    for (let i = 0; i < count; i++) {
      const ci = c[i];
      const d = ci - x;
      if (!(d > ci * eps[i])) {
        ln[i] = 0; // stage left empty at this x (n_i would be ≤ 1)
        continue;
      }
      // Constraint Σ c_i ln n_i − Δv over the used stages and its derivative −Σ c_i/(c_i − x).
      const l = Math.log(d / (ci * eps[i]));
      ln[i] = l;
      f += ci * l;
      df -= ci / d;
    }
    const step = f / df;
    if (Math.abs(f) < fTol) {
      // Final Newton step; log mass ratios follow to first order (ln n_i − step/(c_i − x)).
      const xNew = x - step;
      for (let i = 0; i < count; i++) if (ln[i] > 0) ln[i] += step / (c[i] - x);
      x = xNew;
      break;
    }
    if (f > 0) lo = x;
    else hi = x;
    if (hi - lo < 1e-15 * xMax) break;
    // Newton step, replaced by bisection when it leaves the bracket.
    let next = x - step;
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
    x = next;
  }
  let pi = 1;
  for (let i = 0; i < count; i++) {
    // Optimal stage mass ratio from the Lagrange condition, or 1 for an empty stage.
    let n = (c[i] - x) / (c[i] * eps[i]);
    if (!(n > 1) || !(ln[i] > 0)) {
      n = 1;
      ln[i] = 0;
    }
    massRatios[i] = n;
    // Step payload ratio m0_{i+1}/m0_i = (1 − ε n)/((1 − ε) n).
    pi *= (1 - eps[i] * n) / ((1 - eps[i]) * n);
  }
  return pi > 0 ? pi : 0;
}

const LN_SCRATCH = new Float64Array(MAX_STAGES);

function stagingFromRatios(
  stages: readonly StagingStage[],
  massRatios: ArrayLike<number>,
  maxDeltaV: number,
  multiplier: number
): StagingResult {
  const k = stages.length;
  const ratios: number[] = [];
  const dv: number[] = [];
  const ignition: number[] = [1];
  const prop: number[] = [];
  const struct: number[] = [];
  let m0 = 1;
  for (let i = 0; i < k; i++) {
    const eps = stages[i].structuralCoefficient;
    const n = massRatios[i];
    ratios.push(n);
    // Stage delta-v from the rocket equation.
    dv.push(stages[i].isp * G0 * Math.log(n));
    // Next stack mass from the step payload ratio.
    const next = (m0 * (1 - eps * n)) / ((1 - eps) * n);
    const s = m0 - next;
    prop.push((1 - eps) * s);
    struct.push(eps * s);
    ignition.push(next);
    m0 = next;
  }
  return {
    feasible: true,
    payloadFraction: m0,
    massRatios: ratios,
    stageDeltaV: dv,
    ignitionMassFractions: ignition,
    propellantFractions: prop,
    structuralFractions: struct,
    maxDeltaV,
    multiplier,
    reason: null
  };
}

function infeasibleStaging(stages: readonly StagingStage[], maxDeltaV: number, reason: Reason): StagingResult {
  const k = stages.length;
  return {
    feasible: false,
    payloadFraction: 0,
    massRatios: stages.map((s) => 1 / s.structuralCoefficient),
    stageDeltaV: stages.map((s) => -s.isp * G0 * Math.log(s.structuralCoefficient)),
    ignitionMassFractions: new Array(k + 1).fill(0),
    propellantFractions: new Array(k).fill(0),
    structuralFractions: new Array(k).fill(0),
    maxDeltaV,
    multiplier: 0,
    reason
  };
}

function maxDeltaVOf(stages: readonly StagingStage[]): number {
  let m = 0;
  // Zero-payload limit: each stage burns to n = 1/ε.
  for (const s of stages) m -= s.isp * G0 * Math.log(s.structuralCoefficient);
  return m;
}

/**
 * Optimal staging: the stage mass ratios that maximise payload / gross mass for a required
 * delta-v (Lagrange-multiplier method), stages bottom first, each with its own Isp and ε.
 *
 * Formula: maximise π = Π (1 − ε_i·n_i)/((1 − ε_i)·n_i) subject to Σ c_i·ln n_i = Δv, c = Isp·G0;
 * the optimum is n_i = (c_i·η − 1)/(c_i·ε_i·η) with η from the constraint (solved by a
 * safeguarded Newton iteration). Identical stages give equal mass ratios exp(Δv/(N·c)).
 * Unreachable when Δv ≥ Σ c_i·ln(1/ε_i): then `feasible: false`, `payloadFraction: 0` and
 * `reason.code: 'DELTA_V_UNREACHABLE'` (never NaN).
 *
 * @param stages 1–8 stages `{ isp [s] in (0, 10000], structuralCoefficient in (0, 1) }`, bottom first.
 * @param deltaV required delta-v [m/s], in [0, 1e5].
 * @returns see {@link StagingResult}.
 * @throws RangeError naming the offending field.
 * @see Curtis, Orbital Mechanics for Engineering Students, §11.6 (optimal staging), from memory.
 * @example
 * optimalStaging([{ isp: 300, structuralCoefficient: 0.1 }, { isp: 300, structuralCoefficient: 0.1 }], 6000)
 *   .massRatios; // [≈2.772, ≈2.772] (equal split)
 */
export function optimalStaging(stages: readonly StagingStage[], deltaV: number): StagingResult {
  validateStages(stages);
  requireRange('deltaV', deltaV, 0, 1e5, 'm/s');
  const k = stages.length;
  const c = new Float64Array(k);
  const eps = new Float64Array(k);
  for (let i = 0; i < k; i++) {
    c[i] = stages[i].isp * G0;
    eps[i] = stages[i].structuralCoefficient;
  }
  const n = new Float64Array(k);
  const pi = optimalStagingKernel(k, c, eps, deltaV, n);
  const maxDv = maxDeltaVOf(stages);
  if (pi < 0) {
    return infeasibleStaging(stages, maxDv, {
      code: 'DELTA_V_UNREACHABLE',
      limit: maxDv,
      value: deltaV,
      margin: maxDv - deltaV,
      message: `required delta-v ${deltaV.toFixed(1)} m/s is at or beyond the zero-payload limit ${maxDv.toFixed(1)} m/s of these stages`
    });
  }
  // Multiplier η = 1/x recovered from any active stage: x = c_i·(1 − ε_i·n_i).
  let eta = 0;
  for (let i = 0; i < k; i++) {
    if (n[i] > 1) {
      eta = 1 / (c[i] * (1 - eps[i] * n[i]));
      break;
    }
  }
  return stagingFromRatios(stages, n, maxDv, eta);
}

/**
 * Staging with a user-given split of the delta-v between stages.
 *
 * Formula: Δv_i = f_i·Δv, n_i = exp(Δv_i/c_i), π = Π (1 − ε_i n_i)/((1 − ε_i) n_i).
 * Infeasible (`STAGE_MASS_RATIO_UNREACHABLE`, with the stage index) when some n_i ≥ 1/ε_i.
 *
 * @param stages 1–8 stages, bottom first (see {@link optimalStaging}).
 * @param deltaV required delta-v [m/s], in [0, 1e5].
 * @param fractions share of the delta-v per stage, each in [0, 1], summing to 1 (±1e-9).
 * @returns see {@link StagingResult} (multiplier 0).
 * @throws RangeError naming the offending field.
 * @see Curtis, Orbital Mechanics for Engineering Students, §11.5 (from memory).
 * @example
 * const two = [{ isp: 300, structuralCoefficient: 0.1 }, { isp: 300, structuralCoefficient: 0.1 }];
 * fixedSplitStaging(two, 6000, [0.5, 0.5]).payloadFraction; // ≈ 0.0839 (the optimum, equal split)
 */
export function fixedSplitStaging(
  stages: readonly StagingStage[],
  deltaV: number,
  fractions: readonly number[]
): StagingResult {
  validateStages(stages);
  requireRange('deltaV', deltaV, 0, 1e5, 'm/s');
  if (!Array.isArray(fractions) || fractions.length !== stages.length) {
    throw new RangeError(`fractions must have one entry per stage (${stages.length}), got ${fractions?.length}`);
  }
  let sum = 0;
  for (let i = 0; i < fractions.length; i++) {
    requireRange(`fractions[${i}]`, fractions[i], 0, 1, '(-)');
    sum += fractions[i];
  }
  if (Math.abs(sum - 1) > 1e-9) throw new RangeError(`fractions must sum to 1, got ${sum}`);
  const maxDv = maxDeltaVOf(stages);
  const n: number[] = [];
  for (let i = 0; i < stages.length; i++) {
    const s = stages[i];
    // Inverse rocket equation for the stage's share.
    const ni = Math.exp((fractions[i] * deltaV) / (s.isp * G0));
    if (!(ni * s.structuralCoefficient < 1)) {
      const limit = -s.isp * G0 * Math.log(s.structuralCoefficient);
      return infeasibleStaging(stages, maxDv, {
        code: 'STAGE_MASS_RATIO_UNREACHABLE',
        limit,
        value: fractions[i] * deltaV,
        margin: limit - fractions[i] * deltaV,
        stage: i,
        message: `stage ${i + 1} would need ${(fractions[i] * deltaV).toFixed(1)} m/s, beyond its zero-payload limit ${limit.toFixed(1)} m/s`
      });
    }
    n.push(ni);
  }
  return stagingFromRatios(stages, n, maxDv, 0);
}

/** One stage of an existing vehicle. */
export interface VehicleStage {
  /** Specific impulse [s], in (0, 10000]. */
  isp: number;
  /** Propellant mass [kg], ≥ 0. */
  propellantMass: number;
  /** Dry (structural) mass including engines and interstage [kg], > 0. */
  dryMass: number;
}

function validateVehicle(stages: readonly VehicleStage[]): void {
  if (!Array.isArray(stages) || stages.length < 1 || stages.length > MAX_STAGES) {
    throw new RangeError(`stages must be an array of 1 to ${MAX_STAGES} stages, got ${stages?.length}`);
  }
  for (let i = 0; i < stages.length; i++) {
    requireRange(`stages[${i}].isp`, stages[i].isp, Number.MIN_VALUE, MAX_ISP, 's');
    requireRange(`stages[${i}].propellantMass`, stages[i].propellantMass, 0, 1e10, 'kg');
    requireRange(`stages[${i}].dryMass`, stages[i].dryMass, Number.MIN_VALUE, 1e10, 'kg');
  }
}

/**
 * Allocation-free ideal delta-v of a vehicle with a payload (no validation).
 *
 * Formula: Δv = Σ c_i·ln(m0_i/(m0_i − mp_i)), m0_i = payload + Σ_{j ≥ i}(mp_j + md_j).
 *
 * @param count number of stages.
 * @param c effective exhaust speeds [m/s], bottom first.
 * @param propellant propellant masses [kg].
 * @param dry dry masses [kg].
 * @param payloadMass payload [kg], ≥ 0.
 * @returns ideal delta-v [m/s].
 * @see Tsiolkovsky rocket equation applied stage by stage.
 * @example
 * vehicleDeltaVKernel(1, [2942], [9000], [1000], 0); // ≈ 2942·ln 10
 */
export function vehicleDeltaVKernel(
  count: number,
  c: ArrayLike<number>,
  propellant: ArrayLike<number>,
  dry: ArrayLike<number>,
  payloadMass: number
): number {
  let m0 = payloadMass;
  let dv = 0;
  for (let i = count - 1; i >= 0; i--) {
    m0 += propellant[i] + dry[i];
    // Rocket equation for stage i.
    dv += c[i] * Math.log(m0 / (m0 - propellant[i]));
  }
  return dv;
}

/**
 * Allocation-free payload of a vehicle for a required delta-v (no validation).
 *
 * Method: Δv(m_L) is decreasing and convex in the payload m_L, so Newton's method started at
 * m_L = 0 approaches the root monotonically from below; a bisection fallback on an expanding
 * bracket guards it. Converged to 1e-9 relative in payload or 1e-9 m/s in delta-v.
 *
 * @returns payload [kg], or −1 when even zero payload misses the delta-v.
 * @see Tsiolkovsky rocket equation; Newton's method on a convex monotone function.
 * @example
 * payloadForVehicleKernel(1, [2942], [9000], [1000], 2942 * Math.log(5)); // ≈ 1250 kg
 */
export function payloadForVehicleKernel(
  count: number,
  c: ArrayLike<number>,
  propellant: ArrayLike<number>,
  dry: ArrayLike<number>,
  deltaV: number
): number {
  let f = vehicleDeltaVKernel(count, c, propellant, dry, 0) - deltaV;
  if (f < 0) return -1;
  if (f === 0) return 0;
  let x = 0;
  let lo = 0;
  let hi = Infinity;
  for (let it = 0; it < 200; it++) {
    // Derivative dΔv/dm_L = Σ c_i·(1/m0_i − 1/(m0_i − mp_i)).
    let m0 = x;
    let df = 0;
    for (let i = count - 1; i >= 0; i--) {
      m0 += propellant[i] + dry[i];
      df += c[i] * (1 / m0 - 1 / (m0 - propellant[i]));
    }
    let next = x - f / df;
    if (!(next > lo && next < hi) || !Number.isFinite(next)) next = hi === Infinity ? 2 * x + 1 : 0.5 * (lo + hi);
    x = next;
    f = vehicleDeltaVKernel(count, c, propellant, dry, x) - deltaV;
    if (f > 0) lo = x;
    else hi = x;
    if (Math.abs(f) < 1e-9 || (hi !== Infinity && hi - lo <= 1e-12 * hi)) break;
  }
  return x;
}

/** Result of {@link payloadForVehicle}. */
export interface VehiclePayloadResult {
  feasible: boolean;
  /** Payload mass [kg] (0 when infeasible). */
  payloadMass: number;
  /** Gross lift-off mass with that payload [kg]. */
  grossMass: number;
  /** Ideal delta-v of each stage with that payload [m/s]. */
  stageDeltaV: number[];
  /** Delta-v with zero payload [m/s]. */
  maxDeltaV: number;
  reason: Reason | null;
}

/**
 * Payload that a given vehicle delivers for a required ideal delta-v.
 *
 * Formula: solve Σ c_i·ln(m0_i/(m0_i − mp_i)) = Δv for the payload m_L (bracketed Newton).
 *
 * @param stages 1–8 stages `{ isp [s], propellantMass [kg] ≥ 0, dryMass [kg] > 0 }`, bottom first.
 * @param deltaV required delta-v [m/s], in [0, 1e5].
 * @returns see {@link VehiclePayloadResult}; infeasible with `DELTA_V_UNREACHABLE` when even
 *   zero payload falls short.
 * @throws RangeError naming the offending field.
 * @see Tsiolkovsky rocket equation applied stage by stage.
 * @example
 * payloadForVehicle([{ isp: 300, propellantMass: 9000, dryMass: 1000 }], 300 * 9.80665 * Math.log(5))
 *   .payloadMass; // ≈ 1250 kg
 */
export function payloadForVehicle(stages: readonly VehicleStage[], deltaV: number): VehiclePayloadResult {
  validateVehicle(stages);
  requireRange('deltaV', deltaV, 0, 1e5, 'm/s');
  const k = stages.length;
  const c = stages.map((s) => s.isp * G0);
  const mp = stages.map((s) => s.propellantMass);
  const md = stages.map((s) => s.dryMass);
  const maxDv = vehicleDeltaVKernel(k, c, mp, md, 0);
  const payload = payloadForVehicleKernel(k, c, mp, md, deltaV);
  const dry = md.reduce((a, b) => a + b, 0) + mp.reduce((a, b) => a + b, 0);
  const perStage = (m: number) => {
    const out: number[] = [];
    let m0 = m;
    for (let i = k - 1; i >= 0; i--) {
      m0 += mp[i] + md[i];
      // Rocket equation per stage.
      out.unshift(c[i] * Math.log(m0 / (m0 - mp[i])));
    }
    return out;
  };
  if (payload < 0) {
    return {
      feasible: false,
      payloadMass: 0,
      grossMass: dry,
      stageDeltaV: perStage(0),
      maxDeltaV: maxDv,
      reason: {
        code: 'DELTA_V_UNREACHABLE',
        limit: maxDv,
        value: deltaV,
        margin: maxDv - deltaV,
        message: `the vehicle gives ${maxDv.toFixed(1)} m/s with zero payload, short of the required ${deltaV.toFixed(1)} m/s`
      }
    };
  }
  return {
    feasible: true,
    payloadMass: payload,
    grossMass: dry + payload,
    stageDeltaV: perStage(payload),
    maxDeltaV: maxDv,
    reason: null
  };
}

/** Result of {@link sizeForPayload}. */
export interface SizingResult {
  feasible: boolean;
  /** Gross lift-off mass [kg] (0 when infeasible). */
  grossMass: number;
  /** Payload mass [kg] (the input). */
  payloadMass: number;
  /** Per stage, bottom first (empty masses when infeasible). */
  stages: StageMasses[];
  /** The optimal staging used. */
  staging: StagingResult;
  reason: Reason | null;
}

/**
 * Gross lift-off mass and stage masses for a required payload, from optimal staging.
 *
 * Formula: m0 = m_L/π; stack masses m0_{i+1} = m0_i·(1 − ε_i n_i)/((1 − ε_i) n_i);
 * stage mass S_i = m0_i − m0_{i+1}, ms_i = ε_i·S_i, mp_i = (1 − ε_i)·S_i.
 *
 * @param stages 1–8 stages `{ isp, structuralCoefficient }`, bottom first.
 * @param deltaV required delta-v [m/s], in [0, 1e5].
 * @param payloadMass payload [kg], in (0, 1e9].
 * @returns see {@link SizingResult}.
 * @throws RangeError naming the offending field.
 * @see Curtis, Orbital Mechanics for Engineering Students, §11.6 (from memory).
 * @example
 * sizeForPayload([{ isp: 300, structuralCoefficient: 0.1 }, { isp: 350, structuralCoefficient: 0.12 }], 9000, 1000)
 *   .grossMass; // ≈ 4.457e4 kg
 */
export function sizeForPayload(
  stages: readonly StagingStage[],
  deltaV: number,
  payloadMass: number
): SizingResult {
  requireRange('payloadMass', payloadMass, Number.MIN_VALUE, 1e9, 'kg');
  const staging = optimalStaging(stages, deltaV);
  if (!staging.feasible) {
    return { feasible: false, grossMass: 0, payloadMass, stages: [], staging, reason: staging.reason };
  }
  const gross = payloadMass / staging.payloadFraction;
  const out: StageMasses[] = [];
  for (let i = 0; i < stages.length; i++) {
    const ignitionMass = gross * staging.ignitionMassFractions[i];
    const propellantMass = gross * staging.propellantFractions[i];
    const structuralMass = gross * staging.structuralFractions[i];
    out.push({
      propellantMass,
      structuralMass,
      stageMass: propellantMass + structuralMass,
      ignitionMass,
      burnoutMass: ignitionMass - propellantMass
    });
  }
  return { feasible: true, grossMass: gross, payloadMass, stages: out, staging, reason: null };
}
