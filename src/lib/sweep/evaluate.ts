/**
 * Case evaluation: one sweep case → one flat result row.
 *
 * Budget mode calls the physics core's fast evaluator (`evaluateBudgetCase`); ascent mode calls
 * its targeted ascent (`ascentPayload`, payload of a given vehicle) or its ascent-mode sizing
 * (`sizeAscentVehicle`). Nothing here re-derives physics; this module maps the spec onto the
 * core's inputs, applies the spec's constraints, and flattens the outputs.
 *
 * Mapping choices (documented in each result's `detail.assumptions` as well):
 * - Budget mode takes one Isp per stage: the first stage flies the trajectory-averaged value
 *   ½(Isp_sl + Isp_vac), the upper stages their vacuum Isp (common practice for budget
 *   estimates; from memory). Ascent mode uses both Isp values through the pressure law.
 * - Stage T/W: the first stage's is at sea level (T_sl/(m0·G0), T_sl = T_vac·Isp_sl/Isp_vac),
 *   the upper stages' is vacuum thrust over the weight at their ignition.
 * - A given vehicle (problem `payload`) whose stages are defined by T/W rather than thrust gets
 *   the thrust that gives that T/W with the resulting payload on top (budget mode: the payload
 *   is solved first with the correlation losses at that T/W, then the thrusts follow; ascent
 *   mode: the thrusts follow from the budget-mode payload estimate).
 * - Constraints not given are not checked, except the physical floor lift-off T/W ≥ 1.
 * - Budget-mode max-Q is the physics correlation's estimate; ascent mode's is simulated.
 * - Ascent mode flies to the target perigee (50–2,000 km); the target speed is the perigee
 *   speed minus the Earth-rotation assist (the model Earth does not rotate) plus the
 *   plane change and the reserve, which the last stage supplies as extra delta-v.
 *
 * Determinism: a case's result depends only on the spec and the case (ascent-mode targeting is
 * warm-started from the BASELINE's solution, computed once per evaluator, never from the
 * previous case), so any worker reproduces any case bit for bit.
 */
import {
  DEFAULT_LOSS_CORRELATION,
  G0,
  REASON_CODES,
  ascentPayload,
  checkFeasibility,
  createBudgetCaseInput,
  createBudgetCaseResult,
  evaluateBudgetCase,
  explainBudgetCase,
  insertionToTarget,
  lossAllowances,
  rotationAssist,
  sizeAscentVehicle,
  type AscentPayloadResult,
  type AscentSolution,
  type AscentSizingSolution,
  type BudgetCaseInput,
  type BudgetCaseResult,
  type FeasibilityLimits,
  type ReasonCode
} from '../physics';
import { planOf, type CasePlan } from './cases';
import { parseParameterPath, type SweepParameter, type SweepSpec } from './spec';

/** Version of the sweep evaluation model, recorded with every sweep's results. */
export const SWEEP_MODEL_VERSION = 'loftwise-sweep-1';

/** Stages the result table has columns for. */
export const RESULT_STAGES = 4;

/** Reason codes of a case result: the physics core's, then this module's. */
export const CASE_REASON_CODES = [
  ...REASON_CODES,
  /** A swept value made the sea-level Isp exceed the vacuum Isp. */
  'ISP_ORDER_INVALID',
  /** The physics core refused a value as outside its model (its RangeError message is kept). */
  'MODEL_INPUT_OUT_OF_RANGE',
  /** Ascent mode: the target perigee is outside the ascent model's 50–2,000 km. */
  'ASCENT_TARGET_OUT_OF_RANGE',
  /** Ascent mode: the vehicle cannot reach the target speed even with no payload. */
  'ASCENT_DELTA_V_INSUFFICIENT',
  'ASCENT_TARGET_UNREACHABLE',
  'ASCENT_FELL_BACK',
  'ASCENT_TARGETING_FAILED',
  'ASCENT_SIZING_NOT_CONVERGED'
] as const;
export type CaseReasonCode = (typeof CASE_REASON_CODES)[number];
/** Bit of each reason in `failMask` / `warnMask` (the core's codes keep their bits). */
export const CASE_REASON_BIT: Readonly<Record<CaseReasonCode, number>> = Object.freeze(
  Object.fromEntries(CASE_REASON_CODES.map((c, i) => [c, 1 << i])) as Record<CaseReasonCode, number>
);

// Few distinct masks occur in a sweep: decode each once (frozen arrays, shared by results).
const decoded = new Map<number, readonly CaseReasonCode[]>();

/** Codes of the bits set in a case mask, in CASE_REASON_CODES order (a shared, frozen array). */
export function caseReasonCodes(mask: number): readonly CaseReasonCode[] {
  let codes = decoded.get(mask);
  if (!codes) {
    const out: CaseReasonCode[] = [];
    for (let i = 0; i < CASE_REASON_CODES.length; i++) if (mask & (1 << i)) out.push(CASE_REASON_CODES[i]);
    codes = Object.freeze(out);
    if (decoded.size < 4096) decoded.set(mask, codes);
  }
  return codes;
}

/**
 * One case's result: flat numeric columns (a DB table stores one column per field) plus the
 * reasons and an optional JSON `detail` for the single-case view. Every number is finite; a
 * column that does not apply is null (never NaN or Infinity).
 */
export interface CaseResult {
  /** Case index in the sweep. */
  index: number;
  feasible: boolean;
  /** Failed checks, bits of CASE_REASON_BIT. */
  failMask: number;
  /** Warnings (e.g. unusual structural coefficient), bits of CASE_REASON_BIT. */
  warnMask: number;
  /** Codes of failMask (shared empty array when feasible). */
  reasons: readonly CaseReasonCode[];

  /** Gross lift-off mass [kg] (0 when no vehicle closes). */
  glow: number;
  /** Payload [kg]: required (sizing) or found (given vehicle). */
  payloadMass: number;
  /** payloadMass / glow [-]. */
  payloadFraction: number;
  /** Propellant of all stages [kg]. */
  propellantMass: number;
  /** Dry (structural) mass of all stages [kg], payload excluded. */
  dryMass: number;
  /** Per stage, bottom first [kg]; null beyond the stage count. */
  stage1PropellantMass: number | null;
  stage2PropellantMass: number | null;
  stage3PropellantMass: number | null;
  stage4PropellantMass: number | null;
  stage1DryMass: number | null;
  stage2DryMass: number | null;
  stage3DryMass: number | null;
  stage4DryMass: number | null;

  /** Delta-v budget terms [m/s]. rotationAssist is the credit subtracted (negative when retrograde). */
  insertionSpeed: number;
  gravityLoss: number;
  dragLoss: number;
  steeringLoss: number;
  rotationAssist: number;
  transferDeltaV: number;
  planeChangeDeltaV: number;
  reserveDeltaV: number;
  /** Ideal delta-v the vehicle supplies [m/s] (sum of the terms). */
  requiredDeltaV: number;
  /** gravity + drag + steering loss [m/s] (ascent mode: drag includes back-pressure loss). */
  totalLosses: number;

  /** Lift-off T/W at sea level [-]. */
  liftoffThrustToWeight: number;
  /** T/W of the top stage at its ignition [-]; null for a single stage. */
  upperStageThrustToWeight: number | null;
  /** Max dynamic pressure [Pa] (budget mode: correlation estimate). */
  maxDynamicPressure: number;
  /** Max axial acceleration [m/s²] (budget mode: thrust over burn-out mass, drag neglected). */
  maxAxialAcceleration: number;
  /** Launch azimuth [deg]. */
  launchAzimuth: number;

  /** Constraint margins, positive = satisfied; null when the constraint is not set. */
  liftoffThrustToWeightMargin: number | null;
  /** [Pa] */
  dynamicPressureMargin: number | null;
  /** [m/s²] */
  axialAccelerationMargin: number | null;
  /** [kg] */
  payloadMargin: number | null;
  /** [kg] */
  glowMargin: number | null;

  /** Single-case detail (null in bulk evaluation). */
  detail: CaseDetail | null;
}

/** The numeric columns of CaseResult, in table order, with units (for the DB layer and CSV). */
export const CASE_RESULT_COLUMNS = Object.freeze([
  { name: 'glow', unit: 'kg', nullable: false },
  { name: 'payloadMass', unit: 'kg', nullable: false },
  { name: 'payloadFraction', unit: '-', nullable: false },
  { name: 'propellantMass', unit: 'kg', nullable: false },
  { name: 'dryMass', unit: 'kg', nullable: false },
  { name: 'stage1PropellantMass', unit: 'kg', nullable: true },
  { name: 'stage2PropellantMass', unit: 'kg', nullable: true },
  { name: 'stage3PropellantMass', unit: 'kg', nullable: true },
  { name: 'stage4PropellantMass', unit: 'kg', nullable: true },
  { name: 'stage1DryMass', unit: 'kg', nullable: true },
  { name: 'stage2DryMass', unit: 'kg', nullable: true },
  { name: 'stage3DryMass', unit: 'kg', nullable: true },
  { name: 'stage4DryMass', unit: 'kg', nullable: true },
  { name: 'insertionSpeed', unit: 'm/s', nullable: false },
  { name: 'gravityLoss', unit: 'm/s', nullable: false },
  { name: 'dragLoss', unit: 'm/s', nullable: false },
  { name: 'steeringLoss', unit: 'm/s', nullable: false },
  { name: 'rotationAssist', unit: 'm/s', nullable: false },
  { name: 'transferDeltaV', unit: 'm/s', nullable: false },
  { name: 'planeChangeDeltaV', unit: 'm/s', nullable: false },
  { name: 'reserveDeltaV', unit: 'm/s', nullable: false },
  { name: 'requiredDeltaV', unit: 'm/s', nullable: false },
  { name: 'totalLosses', unit: 'm/s', nullable: false },
  { name: 'liftoffThrustToWeight', unit: '-', nullable: false },
  { name: 'upperStageThrustToWeight', unit: '-', nullable: true },
  { name: 'maxDynamicPressure', unit: 'Pa', nullable: false },
  { name: 'maxAxialAcceleration', unit: 'm/s²', nullable: false },
  { name: 'launchAzimuth', unit: 'deg', nullable: false },
  { name: 'liftoffThrustToWeightMargin', unit: '-', nullable: true },
  { name: 'dynamicPressureMargin', unit: 'Pa', nullable: true },
  { name: 'axialAccelerationMargin', unit: 'm/s²', nullable: true },
  { name: 'payloadMargin', unit: 'kg', nullable: true },
  { name: 'glowMargin', unit: 'kg', nullable: true }
] as const);
export type CaseResultColumn = (typeof CASE_RESULT_COLUMNS)[number]['name'];

/** One delta-v budget term with where it comes from. */
export interface DetailTerm {
  /** [m/s]; the rotation assist is negative here (it reduces the total). */
  value: number;
  origin: 'computed' | 'allowance' | 'correlation' | 'simulated';
  note: string;
}

/** One row of the stage table. */
export interface DetailStage {
  ispSeaLevel: number;
  ispVacuum: number;
  /** Isp used by the budget's rocket equation [s]. */
  ispUsed: number;
  structuralCoefficient: number;
  propellantMass: number;
  dryMass: number;
  ignitionMass: number;
  massRatio: number;
  deltaV: number;
  thrustVacuum: number;
  thrustToWeight: number;
  catalogueId: string | null;
}

/** JSON detail for the single-case view. */
export interface CaseDetail {
  modelVersion: string;
  mode: 'budget' | 'ascent';
  problem: 'size' | 'payload';
  /** The swept values of this case (catalogue choices by id). */
  params: Record<string, number | string>;
  budget: {
    insertionSpeed: DetailTerm;
    gravityLoss: DetailTerm;
    dragLoss: DetailTerm;
    steeringLoss: DetailTerm;
    rotationAssist: DetailTerm;
    transfer: DetailTerm;
    planeChange: DetailTerm;
    reserve: DetailTerm;
    total: number;
  };
  stages: DetailStage[];
  /** Every constraint check with its limit, value and margin. */
  checks: { code: string; limit: number; value: number; margin: number; passed: boolean; message: string }[];
  /** Human-readable notes for failures the checks do not carry. */
  messages: string[];
  assumptions: string[];
  /** Ascent mode: the targeted solution. */
  ascent: { pitchKick: number; finalPitch: number; simulations: number; burnoutAltitude: number; burnoutSpeed: number } | null;
}

const NO_REASONS: readonly CaseReasonCode[] = Object.freeze([]);

const ASSUMPTIONS_BUDGET = [
  'Budget mode: losses from the allowances given, else from the physics loss correlation; max-Q is the correlation estimate.',
  `Loss correlation: ${DEFAULT_LOSS_CORRELATION.source}.`,
  'First-stage Isp in the rocket equation is the trajectory average ½(Isp_sl + Isp_vac); upper stages use vacuum Isp.',
  'Lift-off T/W uses sea-level thrust; upper-stage T/W uses vacuum thrust over the weight at ignition.',
  'Max axial acceleration: thrust over burn-out mass per stage, drag neglected.'
];
const ASSUMPTION_FIXED_RATIO =
  'Stages with a fixed mass ratio are sized from it and fly full; the other stages share the rest of the delta-v by the staging optimum. With every ratio fixed, a shortfall is infeasible and a surplus is margin.';
const ASSUMPTIONS_ASCENT = [
  'Ascent mode: planar point-mass ascent over a non-rotating spherical Earth, targeted by a shooting method; losses simulated.',
  'Target speed at the perigee minus the Earth-rotation assist, plus plane change and reserve as extra delta-v of the last stage.',
  'Upper-stage sea-level Isp below 1 s is raised to 1 s for the pressure law (the stage ignites above the dense atmosphere).'
];

/** Working vehicle of one case (baseline, then the swept values applied). */
interface Work {
  k: number;
  ispSl: Float64Array;
  ispVac: Float64Array;
  /** ε, or NaN when the stage is given by masses. */
  eps: Float64Array;
  /** Fixed stage mass ratio, or NaN when the staging optimum chooses it (sizing only). */
  massRatio: Float64Array;
  dry: Float64Array;
  prop: Float64Array;
  /** Vacuum thrust [N], or NaN when given by T/W. */
  thrust: Float64Array;
  /** T/W, or NaN when given by thrust. */
  tw: Float64Array;
  catalogueId: (string | null)[];
  payload: number;
  perigee: number;
  apogee: number;
  inclination: number;
  latitude: number;
}

function makeWork(spec: SweepSpec): Work {
  const stages = spec.baseline.stages;
  const k = stages.length;
  const w: Work = {
    k,
    ispSl: new Float64Array(k),
    ispVac: new Float64Array(k),
    eps: new Float64Array(k),
    massRatio: new Float64Array(k),
    dry: new Float64Array(k),
    prop: new Float64Array(k),
    thrust: new Float64Array(k),
    tw: new Float64Array(k),
    catalogueId: stages.map((s) => s.propulsion.catalogueId ?? null),
    payload: spec.problem.kind === 'size' ? spec.problem.payloadMass : 0,
    perigee: 0,
    apogee: 0,
    inclination: spec.target.inclination,
    latitude: spec.target.launchLatitude
  };
  stages.forEach((s, i) => {
    w.ispSl[i] = s.propulsion.ispSeaLevel;
    w.ispVac[i] = s.propulsion.ispVacuum;
    w.eps[i] = s.structuralCoefficient ?? NaN;
    w.massRatio[i] = s.massRatio ?? NaN;
    w.dry[i] = s.dryMass ?? NaN;
    w.prop[i] = s.propellantMass ?? NaN;
    w.thrust[i] = s.thrustVacuum ?? NaN;
    w.tw[i] = s.thrustToWeight ?? NaN;
  });
  const o = spec.target.orbit;
  w.perigee = o.kind === 'circular' ? o.altitude : o.perigeeAltitude;
  w.apogee = o.kind === 'circular' ? o.altitude : o.apogeeAltitude;
  return w;
}

function copyWork(from: Work, to: Work): void {
  // Plain loops: TypedArray.set costs more than the copy itself for 1–4 elements.
  for (let i = 0; i < from.k; i++) {
    to.ispSl[i] = from.ispSl[i];
    to.ispVac[i] = from.ispVac[i];
    to.eps[i] = from.eps[i];
    to.massRatio[i] = from.massRatio[i];
    to.dry[i] = from.dry[i];
    to.prop[i] = from.prop[i];
    to.thrust[i] = from.thrust[i];
    to.tw[i] = from.tw[i];
    to.catalogueId[i] = from.catalogueId[i];
  }
  to.payload = from.payload;
  to.perigee = from.perigee;
  to.apogee = from.apogee;
  to.inclination = from.inclination;
  to.latitude = from.latitude;
}

/** Writes swept value vector `vec` into the working vehicle `w`. */
type Applier = (w: Work, vec: Float64Array) => void;

function makeApplier(spec: SweepSpec, plan: CasePlan): Applier {
  const circular = spec.target.orbit.kind === 'circular';
  const top = spec.baseline.stages.length - 1;
  const steps = plan.dimensions.map((d, k): Applier => {
    const p = parseParameterPath(d.path)!;
    const s = p.stage;
    switch (p.quantity) {
      case 'ispVacuum':
        return (w, v) => void (w.ispVac[s] = v[k]);
      case 'ispSeaLevel':
        return (w, v) => void (w.ispSl[s] = v[k]);
      case 'structuralCoefficient':
        // With masses given, ε keeps the propellant load and sets the dry mass.
        return (w, v) => {
          w.eps[s] = v[k];
          w.dry[s] = NaN;
        };
      case 'massRatio':
        return (w, v) => void (w.massRatio[s] = v[k]);
      case 'thrustToWeight':
      case 'liftoffThrustToWeight':
      case 'upperStageThrustToWeight': {
        const st = p.quantity === 'liftoffThrustToWeight' ? 0 : p.quantity === 'upperStageThrustToWeight' ? top : s;
        return (w, v) => {
          w.tw[st] = v[k];
          w.thrust[st] = NaN;
        };
      }
      case 'propulsion': {
        if (d.kind !== 'choices') throw new RangeError(`${d.path}: propulsion needs catalogue choices`);
        const opts = d.options;
        return (w, v) => {
          const o = opts[v[k]];
          w.ispSl[s] = o.ispSeaLevel;
          w.ispVac[s] = o.ispVacuum;
          w.catalogueId[s] = o.id;
        };
      }
      case 'targetAltitude':
        return (w, v) => {
          w.perigee = v[k];
          w.apogee = v[k];
        };
      case 'targetPerigeeAltitude':
        return (w, v) => void (w.perigee = v[k]);
      case 'targetApogeeAltitude':
        return (w, v) => void (w.apogee = v[k]);
      case 'inclination':
        return (w, v) => void (w.inclination = v[k]);
      case 'launchLatitude':
        return (w, v) => void (w.latitude = v[k]);
      case 'payloadMass':
        return (w, v) => void (w.payload = v[k]);
    }
  });
  void circular;
  return (w, vec) => {
    for (let i = 0; i < steps.length; i++) steps[i](w, vec);
  };
}

/** Limits passed to the physics feasibility checks (constraints of the spec, SI). */
function limitsOf(spec: SweepSpec): FeasibilityLimits {
  const c = spec.constraints;
  return {
    // Lift-off needs thrust above weight, whatever the spec says.
    minLiftoffThrustToWeight: c.minLiftoffThrustToWeight ?? 1,
    maxDynamicPressure: c.maxDynamicPressure,
    maxAxialAcceleration: c.maxAxialAcceleration ?? (c.maxAxialAccelerationG !== undefined ? c.maxAxialAccelerationG * G0 : undefined),
    minPayloadMass: c.payloadFloor,
    maxGrossMass: c.glowCeiling,
    typicalStructuralCoefficient: { min: 0.04, max: 0.2 }
  };
}

/** Resets every field of `r` to {@link emptyResult}'s values (for reuse without allocation). */
function resetResult(r: CaseResult, index: number): CaseResult {
  r.index = index;
  r.feasible = false;
  r.failMask = 0;
  r.warnMask = 0;
  r.reasons = NO_REASONS;
  r.glow = 0;
  r.payloadMass = 0;
  r.payloadFraction = 0;
  r.propellantMass = 0;
  r.dryMass = 0;
  r.stage1PropellantMass = null;
  r.stage2PropellantMass = null;
  r.stage3PropellantMass = null;
  r.stage4PropellantMass = null;
  r.stage1DryMass = null;
  r.stage2DryMass = null;
  r.stage3DryMass = null;
  r.stage4DryMass = null;
  r.insertionSpeed = 0;
  r.gravityLoss = 0;
  r.dragLoss = 0;
  r.steeringLoss = 0;
  r.rotationAssist = 0;
  r.transferDeltaV = 0;
  r.planeChangeDeltaV = 0;
  r.reserveDeltaV = 0;
  r.requiredDeltaV = 0;
  r.totalLosses = 0;
  r.liftoffThrustToWeight = 0;
  r.upperStageThrustToWeight = null;
  r.maxDynamicPressure = 0;
  r.maxAxialAcceleration = 0;
  r.launchAzimuth = 0;
  r.liftoffThrustToWeightMargin = null;
  r.dynamicPressureMargin = null;
  r.axialAccelerationMargin = null;
  r.payloadMargin = null;
  r.glowMargin = null;
  r.detail = null;
  return r;
}

/**
 * A result with every column zeroed or null, shaped like every evaluated result (for callers
 * of {@link SweepEvaluator.evaluateInto} that keep one object for a whole chunk).
 */
export function createCaseResult(index = 0): CaseResult {
  return emptyResult(index);
}

function emptyResult(index: number): CaseResult {
  return {
    index,
    feasible: false,
    failMask: 0,
    warnMask: 0,
    reasons: NO_REASONS,
    glow: 0,
    payloadMass: 0,
    payloadFraction: 0,
    propellantMass: 0,
    dryMass: 0,
    stage1PropellantMass: null,
    stage2PropellantMass: null,
    stage3PropellantMass: null,
    stage4PropellantMass: null,
    stage1DryMass: null,
    stage2DryMass: null,
    stage3DryMass: null,
    stage4DryMass: null,
    insertionSpeed: 0,
    gravityLoss: 0,
    dragLoss: 0,
    steeringLoss: 0,
    rotationAssist: 0,
    transferDeltaV: 0,
    planeChangeDeltaV: 0,
    reserveDeltaV: 0,
    requiredDeltaV: 0,
    totalLosses: 0,
    liftoffThrustToWeight: 0,
    upperStageThrustToWeight: null,
    maxDynamicPressure: 0,
    maxAxialAcceleration: 0,
    launchAzimuth: 0,
    liftoffThrustToWeightMargin: null,
    dynamicPressureMargin: null,
    axialAccelerationMargin: null,
    payloadMargin: null,
    glowMargin: null,
    detail: null
  };
}

const fin = (x: number): number => (Number.isFinite(x) ? x : 0);

/** Stage columns from per-stage arrays (k stages). */
function setStageColumns(r: CaseResult, k: number, prop: ArrayLike<number>, dry: ArrayLike<number>): void {
  let tp = 0;
  let td = 0;
  for (let i = 0; i < k; i++) {
    tp += fin(prop[i]);
    td += fin(dry[i]);
  }
  r.propellantMass = tp;
  r.dryMass = td;
  r.stage1PropellantMass = k > 0 ? fin(prop[0]) : null;
  r.stage2PropellantMass = k > 1 ? fin(prop[1]) : null;
  r.stage3PropellantMass = k > 2 ? fin(prop[2]) : null;
  r.stage4PropellantMass = k > 3 ? fin(prop[3]) : null;
  r.stage1DryMass = k > 0 ? fin(dry[0]) : null;
  r.stage2DryMass = k > 1 ? fin(dry[1]) : null;
  r.stage3DryMass = k > 2 ? fin(dry[2]) : null;
  r.stage4DryMass = k > 3 ? fin(dry[3]) : null;
}

/** Margins of the spec's constraints (positive = satisfied). */
function setMargins(r: CaseResult, spec: SweepSpec, limits: FeasibilityLimits): void {
  const c = spec.constraints;
  r.liftoffThrustToWeightMargin = c.minLiftoffThrustToWeight !== undefined ? r.liftoffThrustToWeight - c.minLiftoffThrustToWeight : null;
  r.dynamicPressureMargin = limits.maxDynamicPressure !== undefined ? limits.maxDynamicPressure - r.maxDynamicPressure : null;
  r.axialAccelerationMargin = limits.maxAxialAcceleration !== undefined ? limits.maxAxialAcceleration - r.maxAxialAcceleration : null;
  r.payloadMargin = c.payloadFloor !== undefined ? r.payloadMass - c.payloadFloor : null;
  r.glowMargin = c.glowCeiling !== undefined ? (r.glow > 0 ? c.glowCeiling - r.glow : null) : null;
}

/** Replaces any non-finite number column by 0 (flagging NON_FINITE_RESULT); true if all were finite. */
function sanitize(r: CaseResult): boolean {
  // Fast path: x − x is 0 for a finite x and NaN otherwise, so one sum tells (null counts as 0).
  const z =
    r.glow - r.glow + (r.payloadMass - r.payloadMass) + (r.payloadFraction - r.payloadFraction) +
    (r.propellantMass - r.propellantMass) + (r.dryMass - r.dryMass) +
    (r.insertionSpeed - r.insertionSpeed) + (r.gravityLoss - r.gravityLoss) + (r.dragLoss - r.dragLoss) +
    (r.steeringLoss - r.steeringLoss) + (r.rotationAssist - r.rotationAssist) +
    (r.transferDeltaV - r.transferDeltaV) + (r.planeChangeDeltaV - r.planeChangeDeltaV) +
    (r.reserveDeltaV - r.reserveDeltaV) + (r.requiredDeltaV - r.requiredDeltaV) + (r.totalLosses - r.totalLosses) +
    (r.liftoffThrustToWeight - r.liftoffThrustToWeight) + (r.maxDynamicPressure - r.maxDynamicPressure) +
    (r.maxAxialAcceleration - r.maxAxialAcceleration) + (r.launchAzimuth - r.launchAzimuth) +
    nz(r.upperStageThrustToWeight) + nz(r.liftoffThrustToWeightMargin) + nz(r.dynamicPressureMargin) +
    nz(r.axialAccelerationMargin) + nz(r.payloadMargin) + nz(r.glowMargin);
  if (z === 0) return true;
  let ok = true;
  const rec = r as unknown as Record<string, number | null>;
  for (const col of CASE_RESULT_COLUMNS) {
    const v = rec[col.name];
    if (v !== null && !Number.isFinite(v)) {
      rec[col.name] = 0;
      ok = false;
    }
  }
  return ok;
}

/** 0 for null or a finite number, NaN otherwise. */
function nz(x: number | null): number {
  return x === null ? 0 : x - x;
}

function finish(r: CaseResult, fail: number, warn: number): CaseResult {
  if (!sanitize(r)) fail |= CASE_REASON_BIT.NON_FINITE_RESULT;
  r.failMask = fail;
  r.warnMask = warn;
  r.feasible = fail === 0;
  r.reasons = fail === 0 ? NO_REASONS : caseReasonCodes(fail);
  return r;
}

/** Options of {@link makeEvaluator}. */
export interface EvaluatorOptions {
  /** Attach the JSON `detail` to each result (allocates; meant for single cases). */
  detail?: boolean;
}

/** A reusable evaluator of one spec: build once, evaluate any case index. */
export interface SweepEvaluator {
  readonly plan: CasePlan;
  readonly total: number;
  /** Evaluates case `index` into a new result. */
  evaluate(index: number): CaseResult;
  /**
   * Evaluates case `index` into `out` (every field overwritten) and returns it: the same values
   * as {@link evaluate}, without allocating a result per case. The caller must copy what it
   * keeps before the next call (`reasons` is a shared frozen array and may be kept).
   */
  evaluateInto(index: number, out: CaseResult): CaseResult;
}

/**
 * Builds an evaluator for a validated spec. Budget mode allocates only the returned result
 * object per case (the physics inputs and outputs are reused).
 */
export function makeEvaluator(spec: SweepSpec, options: EvaluatorOptions = {}): SweepEvaluator {
  const plan = planOf(spec);
  const apply = makeApplier(spec, plan);
  const base = makeWork(spec);
  const work = makeWork(spec);
  const vec = new Float64Array(plan.dimensions.length);
  const limits = limitsOf(spec);
  const withDetail = options.detail === true;

  const budget = makeBudgetRunner(spec, limits);
  const ascent = spec.mode === 'ascent' ? makeAscentRunner(spec, limits, budget, base) : null;

  /** Evaluates case `index` into `r`, which holds emptyResult(index)'s values. */
  const run = (index: number, r: CaseResult): CaseResult => {
    plan.fill(index, vec);
    copyWork(base, work);
    apply(work, vec);
    // Swept Isp values may cross: refuse the case, not the sweep.
    for (let i = 0; i < work.k; i++)
      if (!(work.ispSl[i] <= work.ispVac[i])) {
        if (withDetail)
          r.detail = minimalDetail(spec, plan, index, [`stage ${i + 1}: sea-level Isp ${work.ispSl[i]} s exceeds vacuum Isp ${work.ispVac[i]} s`]);
        return finish(r, CASE_REASON_BIT.ISP_ORDER_INVALID, 0);
      }
    let detail: CaseDetail | null = null;
    try {
      if (ascent) detail = ascent(work, r, withDetail);
      else detail = budget.run(work, r, withDetail);
    } catch (e) {
      // The core throws RangeError for values outside its model (e.g. a pole launch site).
      if (!(e instanceof RangeError)) throw e;
      const out = finish(resetResult(r, index), CASE_REASON_BIT.MODEL_INPUT_OUT_OF_RANGE, 0);
      if (withDetail) out.detail = minimalDetail(spec, plan, index, [e.message]);
      return out;
    }
    if (withDetail) {
      r.detail = detail ?? minimalDetail(spec, plan, index, caseReasonCodes(r.failMask).map((c) => `not evaluated: ${c}`));
      r.detail.params = plan.caseAt(index).params;
    }
    return finish(r, r.failMask, r.warnMask);
  };
  const evaluate = (index: number): CaseResult => run(index, emptyResult(index));
  const evaluateInto = (index: number, out: CaseResult): CaseResult => run(index, resetResult(out, index));
  return Object.freeze({ plan, total: plan.total, evaluate, evaluateInto });
}

function minimalDetail(spec: SweepSpec, plan: CasePlan, index: number, messages: string[]): CaseDetail {
  const zero = (note: string): DetailTerm => ({ value: 0, origin: 'computed', note });
  return {
    modelVersion: SWEEP_MODEL_VERSION,
    mode: spec.mode,
    problem: spec.problem.kind,
    params: plan.caseAt(index).params,
    budget: {
      insertionSpeed: zero('not evaluated'),
      gravityLoss: zero('not evaluated'),
      dragLoss: zero('not evaluated'),
      steeringLoss: zero('not evaluated'),
      rotationAssist: zero('not evaluated'),
      transfer: zero('not evaluated'),
      planeChange: zero('not evaluated'),
      reserve: zero('not evaluated'),
      total: 0
    },
    stages: [],
    checks: [],
    messages,
    assumptions: spec.mode === 'budget' ? ASSUMPTIONS_BUDGET : ASSUMPTIONS_ASCENT
  , ascent: null };
}

// ---------------------------------------------------------------------------------------------
// Budget mode

interface BudgetRunner {
  /** Runs the core evaluator on `w` and fills `r`; returns the detail when asked. */
  run(w: Work, r: CaseResult, detail: boolean): CaseDetail | null;
  /** The core's input and output of the last run. */
  readonly input: BudgetCaseInput;
  readonly output: BudgetCaseResult;
}

function makeBudgetRunner(spec: SweepSpec, limits: FeasibilityLimits): BudgetRunner {
  const input = createBudgetCaseInput();
  const output = createBudgetCaseResult();
  const sizing = spec.problem.kind === 'size';
  input.mode = sizing ? 'sizing' : 'vehicle';
  input.stageCount = spec.baseline.stages.length;
  input.strategy = 'direct';
  input.reserveFraction = spec.target.reserve.fraction;
  input.reserveValue = spec.target.reserve.deltaV;
  input.limits = limits;
  input.correlation = DEFAULT_LOSS_CORRELATION;
  const userG = spec.losses.gravity ?? NaN;
  const userD = spec.losses.drag ?? NaN;
  const userS = spec.losses.steering ?? NaN;
  const loss = { gravityLoss: 0, dragLoss: 0, steeringLoss: 0, maxDynamicPressure: 0 };
  const k = input.stageCount;
  // The correlation-derived loss origins of the last run (bit 0 gravity, 1 drag, 3 max-Q).
  let corrOrigin = 0;

  /** Vehicle mode: thrust of each stage for a payload guess (T/W stages), else as given. */
  const setThrusts = (w: Work, payload: number) => {
    let above = payload;
    for (let i = k - 1; i >= 0; i--) {
      const m0 = above + w.prop[i] + input.dryMass[i];
      const seaToVac = i === 0 ? w.ispSl[0] / w.ispVac[0] : 1;
      // Lift-off thrust at sea level (T_sl = T_vac·Isp_sl/Isp_vac); upper stages vacuum.
      input.thrust[i] = w.tw[i] === w.tw[i] ? w.tw[i] * m0 * G0 : w.thrust[i] * seaToVac;
      above = m0;
    }
  };

  const run = (w: Work, r: CaseResult, withDetail: boolean): CaseDetail | null => {
    for (let i = 0; i < k; i++) {
      // Trajectory-averaged Isp for the first stage, vacuum above (see the file header).
      input.isp[i] = i === 0 ? 0.5 * (w.ispSl[0] + w.ispVac[0]) : w.ispVac[i];
    }
    input.targetPerigeeAltitude = w.perigee;
    input.targetApogeeAltitude = w.apogee;
    input.insertionAltitude = w.perigee;
    input.targetInclination = w.inclination;
    input.latitude = w.latitude;
    input.gravityLoss = userG;
    input.dragLoss = userD;
    input.steeringLoss = userS;
    input.maxDynamicPressure = NaN;
    corrOrigin = 0;
    if (sizing) {
      for (let i = 0; i < k; i++) {
        input.structuralCoefficient[i] = w.eps[i] === w.eps[i] ? w.eps[i] : w.dry[i] / (w.dry[i] + w.prop[i]);
        input.thrustToWeight[i] = w.tw[i];
        input.massRatio![i] = w.massRatio[i];
      }
      input.payloadMass = w.payload;
      evaluateBudgetCase(input, output);
      corrOrigin = output.correlationMask;
    } else {
      let anyTw = false;
      for (let i = 0; i < k; i++) {
        input.propellantMass[i] = w.prop[i];
        // ε with a propellant load sets the dry mass: m_dry = m_p·ε/(1 − ε).
        input.dryMass[i] = w.eps[i] === w.eps[i] ? (w.prop[i] * w.eps[i]) / (1 - w.eps[i]) : w.dry[i];
        if (w.tw[i] === w.tw[i]) anyTw = true;
      }
      if (w.tw[0] === w.tw[0]) {
        // Lift-off T/W fixed: the correlation losses do not depend on the payload; pass them in.
        lossAllowances(w.tw[0], w.perigee, DEFAULT_LOSS_CORRELATION, loss);
        if (userG !== userG) {
          input.gravityLoss = loss.gravityLoss;
          corrOrigin |= 1;
        }
        if (userD !== userD) {
          input.dragLoss = loss.dragLoss;
          corrOrigin |= 2;
        }
        if (userS !== userS) corrOrigin |= 4;
        input.maxDynamicPressure = loss.maxDynamicPressure;
        corrOrigin |= 8;
      }
      setThrusts(w, 0);
      evaluateBudgetCase(input, output);
      if (anyTw && output.payloadMass > 0) {
        // Thrusts that give the stated T/W with the payload found on top.
        setThrusts(w, output.payloadMass);
        evaluateBudgetCase(input, output);
      }
      if (w.tw[0] !== w.tw[0]) corrOrigin = output.correlationMask;
    }
    const o = output;
    r.glow = o.grossMass;
    r.payloadMass = o.payloadMass;
    r.payloadFraction = o.payloadFraction;
    setStageColumns(r, k, o.propellantMass, o.structuralMass);
    r.insertionSpeed = o.insertionSpeed;
    r.gravityLoss = o.gravityLoss;
    r.dragLoss = o.dragLoss;
    r.steeringLoss = o.steeringLoss;
    r.rotationAssist = o.rotationAssist;
    r.transferDeltaV = o.transferDeltaV;
    r.planeChangeDeltaV = o.planeChangeDeltaV;
    r.reserveDeltaV = o.reserve;
    r.requiredDeltaV = o.totalDeltaV;
    r.totalLosses = o.gravityLoss + o.dragLoss + o.steeringLoss;
    r.liftoffThrustToWeight = o.liftoffThrustToWeight;
    r.upperStageThrustToWeight = k > 1 ? o.thrustToWeight[k - 1] : null;
    r.maxDynamicPressure = o.maxDynamicPressure;
    r.maxAxialAcceleration = o.maxAxialAcceleration;
    r.launchAzimuth = o.azimuth;
    setMargins(r, spec, limits);
    r.failMask = o.failMask;
    r.warnMask = o.warnMask;
    if (!withDetail) return null;
    return budgetDetail(spec, w, input, output, corrOrigin);
  };
  return { run, input, output };
}

function budgetDetail(spec: SweepSpec, w: Work, input: BudgetCaseInput, o: BudgetCaseResult, corr: number): CaseDetail {
  const report = explainBudgetCase(input, o);
  const origin = (bit: number): DetailTerm['origin'] => (corr & bit ? 'correlation' : 'allowance');
  // The full source is in DEFAULT_LOSS_CORRELATION.source; the case page shows a short form.
  const corrNote = `loss correlation at lift-off T/W ${o.liftoffThrustToWeight.toFixed(3)}, fitted to the ascent model`;
  const k = o.stageCount;
  let fixedRatios = false;
  for (let i = 0; i < k; i++) if (w.massRatio[i] === w.massRatio[i]) fixedRatios = true;
  return {
    modelVersion: SWEEP_MODEL_VERSION,
    mode: 'budget',
    problem: spec.problem.kind,
    params: {},
    budget: {
      insertionSpeed: { value: o.insertionSpeed, origin: 'computed', note: 'vis-viva speed at the target perigee' },
      gravityLoss: { value: o.gravityLoss, origin: origin(1), note: corr & 1 ? corrNote : 'allowance from the spec' },
      dragLoss: { value: o.dragLoss, origin: origin(2), note: corr & 2 ? corrNote : 'allowance from the spec' },
      steeringLoss: { value: o.steeringLoss, origin: origin(4), note: corr & 4 ? corrNote : 'allowance from the spec' },
      rotationAssist: {
        value: -o.rotationAssist,
        origin: 'computed',
        note: `Earth-rotation assist at latitude ${w.latitude}°, azimuth ${o.azimuth.toFixed(2)}°`
      },
      transfer: { value: o.transferDeltaV, origin: 'computed', note: 'none (direct insertion)' },
      planeChange: {
        value: o.planeChangeDeltaV,
        origin: 'computed',
        note: o.planeChangeAngle > 0 ? `${o.planeChangeAngle.toFixed(2)}° plane change at apogee` : 'none (inclination reachable directly)'
      },
      reserve: {
        value: o.reserve,
        origin: 'allowance',
        note: `${(spec.target.reserve.fraction * 100).toFixed(2)} % of the budget + ${spec.target.reserve.deltaV} m/s`
      },
      total: o.totalDeltaV
    },
    stages: Array.from({ length: k }, (_, i) => ({
      ispSeaLevel: w.ispSl[i],
      ispVacuum: w.ispVac[i],
      ispUsed: input.isp[i],
      structuralCoefficient: o.structuralCoefficient[i],
      propellantMass: o.propellantMass[i],
      dryMass: o.structuralMass[i],
      ignitionMass: o.ignitionMass[i],
      massRatio: o.massRatio[i],
      deltaV: o.stageDeltaV[i],
      // The core works with lift-off (sea-level) thrust for stage 1; report vacuum thrust.
      thrustVacuum: i === 0 ? (o.thrust[0] * w.ispVac[0]) / w.ispSl[0] : o.thrust[i],
      thrustToWeight: o.thrustToWeight[i],
      catalogueId: w.catalogueId[i]
    })),
    checks: [
      ...report.failures.map((f) => ({ ...f, passed: false })),
      ...report.passed.map((f) => ({ ...f, passed: true }))
    ].map(({ code, limit, value, margin, passed, message }) => ({ code, limit, value, margin, passed, message })),
    messages: [
      ...report.warnings.map((x) => x.message),
      ...(fixedRatios && o.payloadFraction > 0 && o.deliveredDeltaV > o.totalDeltaV + 1e-6
        ? [`the fixed mass ratios deliver ${o.deliveredDeltaV.toFixed(1)} m/s, ${(o.deliveredDeltaV - o.totalDeltaV).toFixed(1)} m/s above the requirement (kept as margin)`]
        : [])
    ],
    assumptions: fixedRatios ? [...ASSUMPTIONS_BUDGET, ASSUMPTION_FIXED_RATIO] : ASSUMPTIONS_BUDGET,
    ascent: null
  };
}

// ---------------------------------------------------------------------------------------------
// Ascent mode

const ASCENT_MIN_ALTITUDE = 50e3;
const ASCENT_MAX_ALTITUDE = 2e6;

const ASCENT_REASON: Record<string, CaseReasonCode> = {
  'delta-v-insufficient': 'ASCENT_DELTA_V_INSUFFICIENT',
  'target-unreachable': 'ASCENT_TARGET_UNREACHABLE',
  'fell-back': 'ASCENT_FELL_BACK',
  'targeting-failed': 'ASCENT_TARGETING_FAILED',
  'staging-infeasible': 'DELTA_V_UNREACHABLE',
  'ascent-infeasible': 'ASCENT_TARGET_UNREACHABLE',
  'sizing-not-converged': 'ASCENT_SIZING_NOT_CONVERGED'
};

type AscentRun = (w: Work, r: CaseResult, detail: boolean) => CaseDetail | null;

function makeAscentRunner(spec: SweepSpec, limits: FeasibilityLimits, budget: BudgetRunner, baseline: Work): AscentRun {
  const a = spec.ascent;
  const k = spec.baseline.stages.length;
  const sizing = spec.problem.kind === 'size';
  const timeStep =
    a.timeStepAtmosphere !== undefined || a.timeStepVacuum !== undefined
      ? { atmosphere: a.timeStepAtmosphere, vacuum: a.timeStepVacuum }
      : undefined;
  const tolerance =
    a.altitudeTolerance !== undefined || a.speedTolerance !== undefined
      ? { altitude: a.altitudeTolerance, speed: a.speedTolerance }
      : undefined;
  const scratch = emptyResult(-1);
  let warm: AscentSolution | AscentSizingSolution | undefined;

  const run: AscentRun = (w, r, withDetail) => {
    if (!(w.perigee >= ASCENT_MIN_ALTITUDE && w.perigee <= ASCENT_MAX_ALTITUDE)) {
      r.failMask = CASE_REASON_BIT.ASCENT_TARGET_OUT_OF_RANGE;
      return null;
    }
    // Budget-mode pass of the same case: orbital terms, and the payload estimate for T/W stages.
    budget.run(w, scratch, false);
    const orbit = insertionToTarget({
      targetPerigeeAltitude: w.perigee,
      targetApogeeAltitude: w.apogee,
      targetInclination: w.inclination,
      latitude: w.latitude,
      strategy: 'direct',
      insertionAltitude: w.perigee
    });
    const assist = rotationAssist(w.latitude, orbit.azimuth);
    const base = orbit.insertionSpeed - assist + orbit.planeChangeDeltaV;
    const reserve = spec.target.reserve.fraction * base + spec.target.reserve.deltaV;
    const target = { altitude: w.perigee, speed: base + reserve };
    const upperIspSl = (i: number) => (i === 0 ? w.ispSl[0] : Math.max(1, w.ispSl[i]));
    let res: AscentPayloadResult | null;
    let glow: number;
    let prop: number[];
    let dry: number[];
    let thrust: number[];
    let failCodes: string[];
    let sims: number;
    if (sizing) {
      const s = sizeAscentVehicle(
        {
          stages: Array.from({ length: k }, (_, i) => ({
            ispVacuum: w.ispVac[i],
            ispSeaLevel: upperIspSl(i),
            structuralCoefficient: w.eps[i] === w.eps[i] ? w.eps[i] : w.dry[i] / (w.dry[i] + w.prop[i]),
            thrustToWeight: w.tw[i]
          })),
          payloadMass: w.payload,
          referenceArea: spec.baseline.referenceArea,
          dragCoefficient: spec.baseline.dragCoefficient,
          verticalRiseTime: a.verticalRiseTime
        },
        target,
        { timeStep, ascentTolerance: tolerance, warmStart: warm as AscentSizingSolution | undefined }
      );
      res = s.ascent;
      glow = s.grossLiftOffMass;
      prop = s.stageMasses.map((m) => m.propellantMass);
      dry = s.stageMasses.map((m) => m.structuralMass);
      thrust = s.thrustVacuum;
      failCodes = s.reasons;
      sims = s.simulations;
      if (s.feasible && warm === undefined) warm = s.solution;
    } else {
      const dryOf = (i: number) => (w.eps[i] === w.eps[i] ? (w.prop[i] * w.eps[i]) / (1 - w.eps[i]) : w.dry[i]);
      const guess = scratch.payloadMass > 0 ? scratch.payloadMass : 0;
      thrust = new Array<number>(k);
      let above = guess;
      for (let i = k - 1; i >= 0; i--) {
        const m0 = above + w.prop[i] + dryOf(i);
        // T/W stages: thrust for the stack with the budget-mode payload estimate on top.
        thrust[i] = w.tw[i] === w.tw[i] ? w.tw[i] * m0 * G0 * (i === 0 ? w.ispVac[0] / w.ispSl[0] : 1) : w.thrust[i];
        above = m0;
      }
      prop = Array.from(w.prop);
      dry = Array.from({ length: k }, (_, i) => dryOf(i));
      res = ascentPayload(
        {
          stages: Array.from({ length: k }, (_, i) => ({
            propellantMass: w.prop[i],
            dryMass: dry[i],
            thrustVacuum: thrust[i],
            ispVacuum: w.ispVac[i],
            ispSeaLevel: upperIspSl(i)
          })),
          referenceArea: spec.baseline.referenceArea,
          dragCoefficient: spec.baseline.dragCoefficient,
          verticalRiseTime: a.verticalRiseTime,
          nominalPayloadMass: guess
        },
        target,
        { timeStep, tolerance, maxSimulations: a.maxSimulations, warmStart: warm as AscentSolution | undefined }
      );
      glow = res.grossLiftOffMass;
      failCodes = res.reasons;
      sims = res.simulations;
      if (res.feasible && warm === undefined) warm = res.solution;
    }
    let fail = 0;
    for (const c of failCodes) fail |= CASE_REASON_BIT[ASCENT_REASON[c] ?? 'ASCENT_TARGETING_FAILED'];
    const payload = sizing ? w.payload : (res?.payloadMass ?? 0);
    const ok = fail === 0 && res !== null;
    r.glow = ok ? glow : 0;
    r.payloadMass = ok ? payload : 0;
    r.payloadFraction = ok && glow > 0 ? payload / glow : 0;
    setStageColumns(r, k, ok ? prop : [], ok ? dry : []);
    r.insertionSpeed = orbit.insertionSpeed;
    r.rotationAssist = assist;
    r.planeChangeDeltaV = orbit.planeChangeDeltaV;
    r.transferDeltaV = 0;
    r.reserveDeltaV = reserve;
    r.launchAzimuth = orbit.azimuth;
    if (res && ok) {
      r.gravityLoss = res.losses.gravity;
      // Back-pressure loss counted with drag (both atmospheric), as the core's budget mapping does.
      r.dragLoss = res.losses.drag + res.losses.pressure;
      r.steeringLoss = res.losses.steering;
      r.totalLosses = res.losses.total;
      r.requiredDeltaV = res.vacuumDeltaV;
      r.liftoffThrustToWeight = res.liftOffThrustToWeight;
      r.maxDynamicPressure = res.maxDynamicPressure;
      r.maxAxialAcceleration = res.maxAxialAcceleration;
      // Upper-stage T/W at ignition from the thrust and the stack above.
      if (k > 1) r.upperStageThrustToWeight = thrust[k - 1] / ((prop[k - 1] + dry[k - 1] + payload) * G0);
    }
    const report = ok
      ? checkFeasibility(
          {
            liftoffThrustToWeight: r.liftoffThrustToWeight,
            maxDynamicPressure: r.maxDynamicPressure,
            maxAxialAcceleration: r.maxAxialAcceleration,
            payloadMass: r.payloadMass,
            grossMass: r.glow,
            structuralCoefficients: Array.from({ length: k }, (_, i) => dry[i] / (dry[i] + prop[i]))
          },
          limits
        )
      : null;
    if (report) fail |= report.failMask;
    r.failMask = fail;
    r.warnMask = report?.warnMask ?? 0;
    setMargins(r, spec, limits);
    if (!withDetail) return null;
    const zeroTerm = (note: string): DetailTerm => ({ value: 0, origin: 'computed', note });
    return {
      modelVersion: SWEEP_MODEL_VERSION,
      mode: 'ascent',
      problem: spec.problem.kind,
      params: {},
      budget: {
        insertionSpeed: { value: r.insertionSpeed, origin: 'computed', note: 'vis-viva speed at the target perigee' },
        gravityLoss: { value: r.gravityLoss, origin: 'simulated', note: 'ascent simulation ∫g·sin γ dt' },
        dragLoss: { value: r.dragLoss, origin: 'simulated', note: 'ascent simulation ∫D/m dt plus back-pressure loss' },
        steeringLoss: { value: r.steeringLoss, origin: 'simulated', note: 'ascent simulation ∫(T/m)(1 − cos α) dt' },
        rotationAssist: { value: -assist, origin: 'computed', note: `Earth-rotation assist at latitude ${w.latitude}°` },
        transfer: zeroTerm('none (direct insertion)'),
        planeChange: { value: r.planeChangeDeltaV, origin: 'computed', note: 'plane change at apogee, flown as extra delta-v' },
        reserve: { value: reserve, origin: 'allowance', note: 'reserve, flown as extra delta-v' },
        total: r.requiredDeltaV
      },
      stages: Array.from({ length: k }, (_, i) => {
        // Ignition mass: this stage, every stage above it and the payload.
        let ignition = payload;
        for (let j = i; j < k; j++) ignition += prop[j] + dry[j];
        const ratio = ok && ignition > prop[i] ? ignition / (ignition - prop[i]) : 0;
        // Stage T/W: the first stage's at sea level (T_sl = T_vac·Isp_sl/Isp_vac), the others' in vacuum.
        const t = ok ? (thrust[i] ?? 0) * (i === 0 ? w.ispSl[0] / w.ispVac[0] : 1) : 0;
        return {
          ispSeaLevel: w.ispSl[i],
          ispVacuum: w.ispVac[i],
          ispUsed: w.ispVac[i],
          structuralCoefficient: ok ? dry[i] / (dry[i] + prop[i]) : 0,
          propellantMass: ok ? prop[i] : 0,
          dryMass: ok ? dry[i] : 0,
          ignitionMass: ok ? ignition : 0,
          massRatio: ratio,
          // Vacuum rocket-equation delta-v of the stage (the simulated flight's losses are in the budget).
          deltaV: ratio > 1 ? w.ispVac[i] * G0 * Math.log(ratio) : 0,
          thrustVacuum: ok ? (thrust[i] ?? 0) : 0,
          thrustToWeight: ok && ignition > 0 ? t / (ignition * G0) : 0,
          catalogueId: w.catalogueId[i]
        };
      }),
      checks: report
        ? [...report.failures.map((f) => ({ ...f, passed: false })), ...report.passed.map((f) => ({ ...f, passed: true }))].map(
            ({ code, limit, value, margin, passed, message }) => ({ code, limit, value, margin, passed, message })
          )
        : [],
      messages: res && !res.feasible ? [res.message] : [],
      assumptions: ASSUMPTIONS_ASCENT,
      ascent: res
        ? {
            pitchKick: res.pitchKick,
            finalPitch: res.finalPitch,
            simulations: sims,
            burnoutAltitude: res.burnout.altitude,
            burnoutSpeed: res.burnout.speed
          }
        : null
    };
  };
  // Warm start every case from the baseline's solution (deterministic per spec).
  const probe = emptyResult(-1);
  try {
    run(baseline, probe, false);
  } catch (e) {
    if (!(e instanceof RangeError)) throw e;
  }
  const frozen = warm;
  return (w, r, d) => {
    warm = frozen;
    const out = run(w, r, d);
    warm = frozen;
    return out;
  };
}

// ---------------------------------------------------------------------------------------------
// Single case

/**
 * Evaluates one case with its detail (budget terms with origins, stage table, checks): for the
 * case page, previews and `POST /api/evaluate`. `caseParams` are swept values by path (a
 * `SweepCase.params` object, or overrides of the baseline; catalogue choices by id); paths not
 * swept by the spec are ignored.
 */
export function evaluateCase(
  spec: SweepSpec,
  caseParams: Record<string, number | string> = {},
  index = 0
): CaseResult {
  // A one-case spec whose "sweep" is the given values, evaluated with detail.
  const parameters = spec.sweep.parameters.flatMap((p): SweepParameter[] => {
    const v = caseParams[p.path];
    if (v === undefined) return [];
    if (p.values.kind === 'choices') {
      const opt = p.values.options.find((o) => o.id === v);
      if (!opt) throw new RangeError(`${p.path}: "${String(v)}" is not one of the catalogue choices`);
      return [{ path: p.path, values: { kind: 'choices' as const, options: [opt] } }];
    }
    if (typeof v !== 'number' || !Number.isFinite(v)) throw new RangeError(`${p.path}: expected a finite number, got ${String(v)}`);
    return [{ path: p.path, values: { kind: 'list' as const, values: [v] } }];
  });
  const single: SweepSpec = { ...spec, sweep: { parameters, sampling: { plan: 'grid' } } };
  const r = makeEvaluator(single, { detail: true }).evaluate(0);
  r.index = index;
  if (r.detail) r.detail.params = { ...caseParams };
  return r;
}
