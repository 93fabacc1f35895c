/**
 * Planar point-mass ascent over a spherical, non-rotating Earth, SI units inside, angles in
 * degrees at the API and radians inside.
 *
 * Public API:
 * - `simulateGravityTurn(input, options?)`: the unsteered gravity turn of DESIGN.md §3,
 *   integrated to the last stage's burnout.
 * - `simulateAscent(vehicle, payloadMass, controls, options?)`: one full ascent flown with given
 *   controls: vertical rise, pitch-over, gravity turn with thrust along the velocity, staging
 *   (burnout, jettison, optional coast), then a steered upper-stage phase under the
 *   linear-tangent law, to the last stage's burnout.
 * - `ascentPayload(vehicle, target, options?)`: the largest payload a given vehicle puts on the
 *   target (altitude, flight-path angle 0, speed), with the pitch kick and the steering law found
 *   by a shooting method; gravity, drag, steering and back-pressure losses; constraints' inputs.
 * - `compileAscentVehicle(vehicle)`: validates and packs a vehicle once (sweeps reuse it).
 * - `ascentBudgetLosses(result)`: the simulated losses as delta-v budget inputs.
 * (Sizing for a required payload lives in `./ascent-sizing`.)
 *
 * Steering family and its limit: the linear-tangent law starts at the flight-path angle of the
 * staging point (no attitude jump), so the kick and the law's end point are the only controls.
 * Upper stages with ignition T/W below ≈ 0.5, or direct ascents to high orbits, can then have no
 * solution in the family: such cases come back infeasible ('fell-back' / 'targeting-failed'),
 * never NaN; insert into a low orbit and let the budget add the transfer instead.
 *
 * Equations of motion (the gravity-turn equations of any flight-mechanics text, e.g. Wiesel,
 * Spaceflight Dynamics, ch. on launch vehicles; from memory), state (V, γ, h, x, m):
 *   dV/dt = (T·cos α − D)/m − g·sin γ
 *   dγ/dt = T·sin α/(m·V) − (g/V − V/r)·cos γ
 *   dh/dt = V·sin γ,  dx/dt = (R/r)·V·cos γ,  dm/dt = −ṁ
 * with r = R + h, g = μ/r², D = ½ρV²·Cd(V/a)·A, T = ṁ·G0·Isp(h), Isp(h) = Isp_vac −
 * (Isp_vac − Isp_sl)·p(h)/p(0), α the angle of the thrust from the velocity (0 in the gravity
 * turn). The losses integrate alongside: ideal Δv = ∫T/m dt, gravity = ∫g·sin γ dt,
 * drag = ∫D/m dt, steering = ∫(T/m)(1 − cos α) dt, so that
 * V(burnout) = ∫T/m − gravity − drag − steering (exactly, up to integration error).
 *
 * Integrator (chosen for speed): classical fixed-step Runge–Kutta 4, steps aligned with every
 * event of the timeline (end of vertical rise, each burnout, each coast end: all known in advance
 * because ṁ is constant per stage), so no event location is needed except the fall-back, which
 * is located by linear interpolation of the altitude inside the last step. The step is chosen
 * per phase: `atmosphere` (vertical rise, gravity turn, coasts before steering) and `vacuum`
 * (steered phase and the coasts after it), defaults 1 s and 8 s (≈ 210 steps for a two-stage
 * flight; simulateGravityTurn defaults to 0.25 s everywhere). Stated error at the defaults,
 * measured on the notional two-stage test vehicle against mathjs solveODE (RK45, tol 1e-9 on a
 * km-scaled state) and against a 0.02 s / 0.05 s run of the same RK4: burnout speed ≤ 0.1 m/s,
 * altitude ≤ 40 m, flight-path angle ≤ 0.001°, each loss ≤ 0.1 m/s, max-Q ≤ 0.2 % (max-Q sits
 * on the tropopause kink of the atmosphere, which caps the order there); the targeted payload
 * ≤ 0.03 % from a tight-tolerance reference over a 100-case sweep (measured max 0.023 %).
 * RK4's h⁴ error made 2 s / 10 s steps just as good for the payload, but max-Q then errs by
 * 0.4–0.6 %: hence 1 s in the atmosphere. tests/unit/physics/ascent-integrator.test.ts holds the bounds (≈ 3× measured);
 * tests/bench/physics-ascent.bench.ts prints the measured values.
 * Atmosphere: U.S. Standard Atmosphere 1976 from `./atmosphere`, read through the 50 m table of
 * `./atmosphere-table` (linear interpolation, ≈ 1e-5 relative; no allocation, no exp per call).
 */
import { EARTH, G0, DEG } from './constants';
import { createAtmosphereState } from './atmosphere';
import { atmosphereTableInto } from './atmosphere-table';
import { cdAt, compileDragTable, isDragTable, type DragTable } from './drag';
import type { LossInput } from './budget';

// ---------------------------------------------------------------------------------------------
// Types
// ---------------------------------------------------------------------------------------------

/** One stage, bottom first. Masses in kg, thrust in N, Isp in s, coast in s. */
export interface AscentStage {
  /** Usable propellant [kg], > 0. */
  propellantMass: number;
  /** Dry (burnout) mass dropped at jettison [kg], ≥ 0. */
  dryMass: number;
  /** Vacuum thrust [N], > 0. */
  thrustVacuum: number;
  /** Vacuum specific impulse [s], > 0. */
  ispVacuum: number;
  /** Sea-level specific impulse [s], > 0 and ≤ ispVacuum. */
  ispSeaLevel: number;
  /** Unpowered coast after this stage's jettison, before the next ignition [s], ≥ 0 (ascent mode only; default 0). */
  coastAfter?: number;
}

/** Drag input: `[mach, cd][]` or a compiled table. */
export type DragInput = ReadonlyArray<readonly [number, number]> | DragTable;

/** Input of {@link simulateGravityTurn} (DESIGN.md §3). */
export interface GravityTurnInput {
  /** Stages, bottom first; stage i+1 ignites when stage i burns out and drops its dry mass. */
  stages: ReadonlyArray<AscentStage>;
  /** Payload on the top stage [kg], ≥ 0. */
  payloadMass: number;
  /** Drag reference area [m²], ≥ 0. */
  referenceArea: number;
  /** Cd against Mach, `[mach, cd][]`, linear, held constant beyond the ends. */
  dragCoefficient: DragInput;
  /** Duration of the vertical rise [s], ≥ 0 and shorter than the first stage's burn. */
  verticalRiseTime: number;
  /** Pitch kick at the end of the vertical rise [deg], 0 ≤ kick < 90: γ becomes 90° − kick. */
  pitchKick: number;
}

/** State at the last stage's burnout (or at the fall-back point). */
export interface BurnoutState {
  /** Time from lift-off [s]. */
  time: number;
  /** Geometric altitude [m]. */
  altitude: number;
  /** Speed (inertial = Earth-relative, non-rotating Earth) [m/s]. */
  speed: number;
  /** Flight-path angle above the local horizontal [deg]. */
  flightPathAngle: number;
  /** Ground distance along the surface [m]. */
  downrange: number;
  /** Mass [kg] (payload + last stage dry mass + any unburned propellant). */
  mass: number;
}

/** Output of {@link simulateGravityTurn} (DESIGN.md §3). */
export interface GravityTurnResult {
  burnout: BurnoutState;
  /** ∫T/m dt over the powered flight [m/s]. */
  idealDeltaV: number;
  /** ∫g·sin γ dt [m/s]. */
  gravityLoss: number;
  /** ∫D/m dt [m/s]. */
  dragLoss: number;
  /** max ½ρV² [Pa]. */
  maxDynamicPressure: number;
  /** max (T − D)/m [m/s²]. */
  maxAxialAcceleration: number;
  /** True when the altitude returned to zero (or the speed to zero after the vertical rise) before burnout. */
  fellBack: boolean;
  /** Sampled trajectory, present only when `options.trajectory` is true. */
  trajectory?: AscentTrajectory;
}

/** Trajectory samples for plotting (struct of arrays, one entry per integration step). */
export interface AscentTrajectory {
  /** [s] */ time: number[];
  /** [m] */ altitude: number[];
  /** [m] */ downrange: number[];
  /** [m/s] */ speed: number[];
  /** [deg] */ flightPathAngle: number[];
  /** Dynamic pressure ½ρV² [Pa]. */ dynamicPressure: number[];
  /** Axial acceleration (T − D)/m [m/s²]. */ acceleration: number[];
  /** [kg] */ mass: number[];
}

/** Integration steps per phase [s]. */
export interface AscentTimeStep {
  /** Vertical rise, gravity turn and coasts before steering starts [s], default 1. */
  atmosphere?: number;
  /** Steered phase and coasts after steering starts [s], default 8. */
  vacuum?: number;
}

/** A vehicle for ascent mode (everything except the payload). */
export interface AscentVehicle {
  /** Stages, bottom first (coastAfter allowed). */
  stages: ReadonlyArray<AscentStage>;
  /** Drag reference area [m²], ≥ 0. */
  referenceArea: number;
  /** Cd against Mach. */
  dragCoefficient: DragInput;
  /**
   * Vertical rise [s], ≥ 0, shorter than the first burn. Default: the time to reach ≈ 50 m/s at
   * the lift-off acceleration (with `nominalPayloadMass` on top), so T/W sweeps pitch over at a
   * comparable speed.
   */
  verticalRiseTime?: number;
  /** Payload assumed only for the default vertical-rise time [kg], default 0. */
  nominalPayloadMass?: number;
  /**
   * Index of the stage (bottom = 0) at whose ignition the linear-tangent steering starts;
   * earlier stages fly the gravity turn. Default: 1 when there are two or more stages, else 0
   * (then steering starts at the pitch-over).
   */
  steeringStartStage?: number;
  /**
   * Gravity-turn time flown by the steering start stage before the steering starts [s], ≥ 0 and
   * shorter than that stage's burn (after the vertical rise for stage 0). Default 0 with two or
   * more stages; for a single stage 40 % of the burn after the vertical rise, so that the
   * atmospheric part is flown as a gravity turn (thrust along the velocity through max-Q).
   */
  steeringDelay?: number;
}

/** Controls of one flight: the pitch kick and the linear-tangent law's end point. */
export interface AscentControls {
  /** Pitch kick at the end of the vertical rise [deg], 0 ≤ kick < 90. */
  pitchKick: number;
  /**
   * Thrust pitch above the local horizontal at the last burnout [deg], −89…89. The law is
   * tan θ(τ) = tan θ0 + (tan θf − tan θ0)·τ/τf, τ from steering start, θ0 = γ at steering start
   * (no attitude jump), τf the steered duration.
   */
  finalPitch: number;
}

/** Result of one full ascent ({@link simulateAscent}). */
export interface AscentFlight extends GravityTurnResult {
  /** ∫(T/m)(1 − cos α) dt [m/s]. */
  steeringLoss: number;
  /** Vacuum rocket-equation Δv of the propellant burned, Σ G0·Isp_vac·ln(m_start/m_end) [m/s]. */
  vacuumDeltaV: number;
  /** Thrust lost to ambient pressure: vacuumDeltaV − idealDeltaV [m/s]. */
  pressureLoss: number;
  /** Gross lift-off mass [kg]. */
  grossLiftOffMass: number;
  /** Lift-off thrust-to-weight ratio T(0)/(m0·G0). */
  liftOffThrustToWeight: number;
}

// ---------------------------------------------------------------------------------------------
// Compiled vehicle and the RK4 engine
// ---------------------------------------------------------------------------------------------

const MODE_VERTICAL = 0;
const MODE_TURN = 1;
const MODE_STEER = 2;
/** State layout: V, γ, h, x, m, ∫T/m, ∫g sinγ, ∫D/m, ∫(T/m)(1−cosα). */
const NY = 9;
/** Sea-level pressure p(0) of USSA 1976 [Pa] (Table 4). */
const P_SEA_LEVEL = 101325;
/** Below this speed outside the vertical rise the free turn has stalled (falls back) [m/s]. */
const STALL_SPEED = 0.01;
/** Speed at which the default vertical rise ends [m/s] (common practice: pitch-over at ≈ 30–100 m/s; from memory). */
const VERTICAL_RISE_SPEED = 50;

/** A validated vehicle packed in typed arrays (build once, fly many times). */
export interface CompiledAscentVehicle {
  readonly stageCount: number;
  readonly propellantMass: Float64Array;
  readonly dryMass: Float64Array;
  readonly thrustVacuum: Float64Array;
  readonly ispVacuum: Float64Array;
  readonly ispSeaLevel: Float64Array;
  readonly massFlow: Float64Array;
  readonly burnTime: Float64Array;
  readonly coastAfter: Float64Array;
  /** Σ propellant + dry of all stages [kg]. */
  readonly stackMass: number;
  readonly referenceArea: number;
  readonly drag: DragTable;
  readonly verticalRiseTime: number;
  readonly steeringStartStage: number;
  readonly steeringDelay: number;
}

function requireFinite(value: unknown, field: string, min: number, minInclusive: boolean, max = Infinity): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || (minInclusive ? value < min : value <= min) || value > max) {
    const range = `${minInclusive ? '≥' : '>'} ${min}${max < Infinity ? ` and ≤ ${max}` : ''}`;
    throw new RangeError(`${field} must be a finite number ${range}, got ${String(value)}`);
  }
  return value;
}

function compileStages(stages: ReadonlyArray<AscentStage>, allowCoast: boolean) {
  if (!Array.isArray(stages) || stages.length === 0 || stages.length > 8) {
    throw new RangeError(`stages must be an array of 1 to 8 stages, got ${Array.isArray(stages) ? stages.length : typeof stages}`);
  }
  const n = stages.length;
  const out = {
    propellantMass: new Float64Array(n),
    dryMass: new Float64Array(n),
    thrustVacuum: new Float64Array(n),
    ispVacuum: new Float64Array(n),
    ispSeaLevel: new Float64Array(n),
    massFlow: new Float64Array(n),
    burnTime: new Float64Array(n),
    coastAfter: new Float64Array(n),
    stackMass: 0
  };
  for (let i = 0; i < n; i++) {
    const s = stages[i];
    const f = `stages[${i}]`;
    if (typeof s !== 'object' || s === null) throw new RangeError(`${f} must be an object`);
    out.propellantMass[i] = requireFinite(s.propellantMass, `${f}.propellantMass`, 0, false);
    out.dryMass[i] = requireFinite(s.dryMass, `${f}.dryMass`, 0, true);
    out.thrustVacuum[i] = requireFinite(s.thrustVacuum, `${f}.thrustVacuum`, 0, false);
    out.ispVacuum[i] = requireFinite(s.ispVacuum, `${f}.ispVacuum`, 0, false, 10000);
    out.ispSeaLevel[i] = requireFinite(s.ispSeaLevel, `${f}.ispSeaLevel`, 0, false, out.ispVacuum[i]);
    const coast = s.coastAfter ?? 0;
    if (!allowCoast && coast !== 0) throw new RangeError(`${f}.coastAfter is not part of the gravity-turn problem (no coast)`);
    out.coastAfter[i] = requireFinite(coast, `${f}.coastAfter`, 0, true, 1e5);
    // Constant mass flow ṁ = T_vac/(G0·Isp_vac) (definition of specific impulse).
    out.massFlow[i] = out.thrustVacuum[i] / (G0 * out.ispVacuum[i]);
    // Burn time t_b = m_p/ṁ (constant mass flow).
    out.burnTime[i] = out.propellantMass[i] / out.massFlow[i];
    out.stackMass += out.propellantMass[i] + out.dryMass[i];
  }
  out.coastAfter[n - 1] = 0;
  return out;
}

function compileDrag(drag: DragInput): DragTable {
  return isDragTable(drag) ? drag : compileDragTable(drag, 'dragCoefficient');
}

/**
 * Validates an ascent-mode vehicle and packs it into typed arrays for repeated flights.
 *
 * Derived per stage: ṁ = T_vac/(G0·Isp_vac), t_b = m_p/ṁ (definition of Isp, constant flow).
 *
 * @param vehicle stages bottom first (kg, N, s), reference area [m²] ≥ 0, Cd–Mach table,
 *   vertical rise [s] ≥ 0 shorter than the first burn (default 10 s), steering start stage
 *   (0 … stages−1).
 * @returns a {@link CompiledAscentVehicle}.
 * @throws RangeError naming the field (e.g. `stages[1].ispSeaLevel`) for non-physical input.
 * @see DESIGN.md §3 for the field definitions.
 * @example
 * const v = compileAscentVehicle({ stages: [{ propellantMass: 1e5, dryMass: 8e3,
 *   thrustVacuum: 1.6e6, ispVacuum: 320, ispSeaLevel: 290 }], referenceArea: 7,
 *   dragCoefficient: DEFAULT_DRAG_COEFFICIENT });
 * v.burnTime[0]; // ≈ 196 s
 */
export function compileAscentVehicle(vehicle: AscentVehicle): CompiledAscentVehicle {
  if (typeof vehicle !== 'object' || vehicle === null) throw new RangeError('vehicle must be an object');
  const st = compileStages(vehicle.stages, true);
  const n = st.propellantMass.length;
  const referenceArea = requireFinite(vehicle.referenceArea, 'referenceArea', 0, true, 1e4);
  const drag = compileDrag(vehicle.dragCoefficient);
  let verticalRiseTime: number;
  if (vehicle.verticalRiseTime === undefined) {
    // Default: rise until ≈ 50 m/s (pitch-over speed, common practice; from memory), from the
    // lift-off acceleration (T/W − 1)·G0 with the mass held at its lift-off value; 2 s at least.
    const t0 = st.thrustVacuum[0] - st.massFlow[0] * G0 * (st.ispVacuum[0] - st.ispSeaLevel[0]);
    const w0 = (st.stackMass + requireFinite(vehicle.nominalPayloadMass ?? 0, 'nominalPayloadMass', 0, true)) * G0;
    const a0 = (t0 / w0 - 1) * G0;
    verticalRiseTime = a0 > 0 ? Math.min(0.25 * st.burnTime[0], Math.max(2, VERTICAL_RISE_SPEED / a0)) : 2;
  } else {
    verticalRiseTime = requireFinite(vehicle.verticalRiseTime, 'verticalRiseTime', 0, true);
  }
  if (verticalRiseTime >= st.burnTime[0]) {
    throw new RangeError(
      `verticalRiseTime must be shorter than the first stage's burn time (${st.burnTime[0].toFixed(1)} s), got ${verticalRiseTime}`
    );
  }
  const steer = vehicle.steeringStartStage ?? (n >= 2 ? 1 : 0);
  if (!Number.isInteger(steer) || steer < 0 || steer >= n) {
    throw new RangeError(`steeringStartStage must be an integer from 0 to ${n - 1}, got ${String(steer)}`);
  }
  const avail = st.burnTime[steer] - (steer === 0 ? verticalRiseTime : 0);
  const steeringDelay = requireFinite(vehicle.steeringDelay ?? (n === 1 ? 0.4 * avail : 0), 'steeringDelay', 0, true);
  if (steeringDelay >= avail) {
    throw new RangeError(`steeringDelay must be shorter than the steered stage's remaining burn (${avail.toFixed(1)} s), got ${steeringDelay}`);
  }
  return { stageCount: n, ...st, referenceArea, drag, verticalRiseTime, steeringStartStage: steer, steeringDelay };
}

/** Raw numbers of one flight (internal; converted to the public shapes by the callers). */
interface RawFlight {
  time: number;
  speed: number;
  gamma: number;
  altitude: number;
  downrange: number;
  mass: number;
  ideal: number;
  gravity: number;
  drag: number;
  steering: number;
  vacuumDeltaV: number;
  maxQ: number;
  maxAcc: number;
  fellBack: boolean;
  m0: number;
  liftOffTW: number;
}

/**
 * The RK4 engine: one instance per compiled vehicle, all scratch preallocated; the derivative
 * is a method reading the current segment from fields, so nothing is allocated per step.
 */
class FlightEngine {
  private readonly v: CompiledAscentVehicle;
  private readonly atm = createAtmosphereState();
  private readonly mu = EARTH.mu;
  private readonly re = EARTH.radius;
  // Current segment.
  private thrusting = false;
  private mode = MODE_VERTICAL;
  private tVac = 0;
  private kP = 0;
  private mDot = 0;
  private steerA = 0;
  private steerB = 0;
  private steerT0 = 0;
  // Last evaluated dynamic pressure and axial acceleration (set by deriv).
  private lastQ = 0;
  private lastAcc = 0;
  // Scratch.
  private readonly y = new Float64Array(NY);
  private readonly yPrev = new Float64Array(NY);
  private readonly yt = new Float64Array(NY);
  private readonly k1 = new Float64Array(NY);
  private readonly k2 = new Float64Array(NY);
  private readonly k3 = new Float64Array(NY);
  private readonly k4 = new Float64Array(NY);
  private t = 0;
  private maxQ = 0;
  private maxAcc = 0;
  // Last two (t, q) samples for the max-Q parabola.
  private qt0 = -2;
  private qq0 = 0;
  private qt1 = -1;
  private qq1 = 0;
  private fellBack = false;
  private rec: AscentTrajectory | null = null;

  constructor(v: CompiledAscentVehicle) {
    this.v = v;
  }

  /** Right-hand side of the equations of motion (see the file header) into `out`. */
  private deriv(t: number, y: Float64Array, out: Float64Array): void {
    const V = y[0];
    const gam = y[1];
    const h = y[2];
    const m = y[4];
    const r = this.re + h;
    // Newtonian point-mass gravity g = μ/r².
    const g = this.mu / (r * r);
    // U.S. Standard Atmosphere 1976, tabulated fast path (50 m linear interpolation, ≈1e-5 relative).
    const atm = atmosphereTableInto(h, this.atm);
    let T = 0;
    let mdot = 0;
    if (this.thrusting) {
      // Pressure-corrected thrust T = ṁ·G0·(Isp_vac − (Isp_vac − Isp_sl)·p/p0) = T_vac − kP·p.
      T = this.tVac - this.kP * atm.pressure;
      mdot = this.mDot;
    }
    const speed = V < 0 ? -V : V;
    // Dynamic pressure q = ½ρV².
    const q = 0.5 * atm.density * V * V;
    // Drag D = q·Cd(M)·A, M = V/a (Cd from the table, linear interpolation).
    const D = q * cdAt(this.v.drag, speed / atm.speedOfSound) * this.v.referenceArea;
    const Ds = V < 0 ? -D : D;
    const sg = Math.sin(gam);
    const cg = Math.cos(gam);
    let ca = 1;
    let sa = 0;
    if (this.mode === MODE_STEER && this.thrusting) {
      // Linear-tangent law tan θ = a + b·τ; cos θ = 1/√(1+u²), sin θ = u/√(1+u²).
      const u = this.steerA + this.steerB * (t - this.steerT0);
      const inv = 1 / Math.sqrt(1 + u * u);
      // α = θ − γ: cos α = cosθ·cosγ + sinθ·sinγ, sin α = sinθ·cosγ − cosθ·sinγ.
      ca = inv * cg + u * inv * sg;
      sa = u * inv * cg - inv * sg;
    }
    const Tm = T / m;
    // Tangential equation: dV/dt = (T·cos α − D)/m − g·sin γ.
    out[0] = Tm * ca - Ds / m - g * sg;
    // Normal equation: dγ/dt = T·sin α/(mV) − (g/V − V/r)·cos γ (held at 90° in the vertical rise).
    out[1] = this.mode === MODE_VERTICAL ? 0 : (Tm * sa) / V - (g / V - V / r) * cg;
    // Kinematics: dh/dt = V·sin γ, dx/dt = (R/r)·V·cos γ.
    out[2] = V * sg;
    out[3] = ((this.re / r) * V) * cg;
    // Constant mass flow.
    out[4] = -mdot;
    // Loss integrands: T/m, g·sin γ, D/m, (T/m)(1 − cos α).
    out[5] = Tm;
    out[6] = g * sg;
    out[7] = Ds / m;
    out[8] = Tm * (1 - ca);
    this.lastQ = q;
    // Axial acceleration (T − D)/m.
    this.lastAcc = (T - D) / m;
  }

  /** Evaluates at the current state and folds q and (T−D)/m into the maxima (and records). */
  private probe(): void {
    this.deriv(this.t, this.y, this.k1);
    const q = this.lastQ;
    if (q > this.maxQ) this.maxQ = q;
    // Max-Q between samples: vertex of the parabola through the last three (t, q) samples when
    // the middle one is a local maximum (three-point quadratic interpolation).
    if (this.t > this.qt1) {
      const q0 = this.qq0;
      const q1 = this.qq1;
      if (q1 >= q0 && q1 >= q && this.qt0 < this.qt1) {
        const t0 = this.qt0;
        const t1 = this.qt1;
        const t2 = this.t;
        const d1 = (q1 - q0) / (t1 - t0);
        const d2 = (q - q1) / (t2 - t1);
        // Second divided difference (Newton form of the interpolating quadratic).
        const c = (d2 - d1) / (t2 - t0);
        if (c < 0) {
          let ts = 0.5 * (t0 + t1) - d1 / (2 * c);
          ts = ts < t0 ? t0 : ts > t2 ? t2 : ts;
          const qs = q0 + d1 * (ts - t0) + c * (ts - t0) * (ts - t1);
          if (qs > this.maxQ) this.maxQ = qs;
        }
      }
      this.qt0 = this.qt1;
      this.qq0 = q1;
      this.qt1 = this.t;
      this.qq1 = q;
    } else {
      this.qq1 = q;
    }
    if (this.lastAcc > this.maxAcc) this.maxAcc = this.lastAcc;
    const rec = this.rec;
    if (rec !== null) {
      const y = this.y;
      rec.time.push(this.t);
      rec.altitude.push(y[2]);
      rec.downrange.push(y[3]);
      rec.speed.push(y[0]);
      rec.flightPathAngle.push(y[1] / DEG);
      rec.dynamicPressure.push(this.lastQ);
      rec.acceleration.push(this.lastAcc);
      rec.mass.push(y[4]);
    }
  }

  /** Integrates the current segment for `duration` s with steps ≤ hMax; false once fallen back. */
  private integrate(duration: number, hMax: number): boolean {
    if (!(duration > 0)) return true;
    const n = Math.max(1, Math.ceil(duration / hMax - 1e-9));
    const h = duration / n;
    const y = this.y;
    const yt = this.yt;
    const k1 = this.k1;
    const k2 = this.k2;
    const k3 = this.k3;
    const k4 = this.k4;
    const yPrev = this.yPrev;
    const half = 0.5 * h;
    const sixth = h / 6;
    for (let s = 0; s < n; s++) {
      const t = this.t;
      this.probe(); // k1 = f(t, y), plus the maxima at the step start
      for (let i = 0; i < NY; i++) {
        yPrev[i] = y[i];
        yt[i] = y[i] + half * k1[i];
      }
      // Classical RK4 stages (Runge–Kutta 4th order).
      this.deriv(t + half, yt, k2);
      for (let i = 0; i < NY; i++) yt[i] = y[i] + half * k2[i];
      this.deriv(t + half, yt, k3);
      for (let i = 0; i < NY; i++) yt[i] = y[i] + h * k3[i];
      this.deriv(t + h, yt, k4);
      for (let i = 0; i < NY; i++) y[i] += sixth * (k1[i] + 2 * (k2[i] + k3[i]) + k4[i]);
      this.t = t + h;
      const finite = Number.isFinite(y[0]) && Number.isFinite(y[1]) && Number.isFinite(y[2]);
      if (!finite || y[2] < 0 || (this.mode !== MODE_VERTICAL && !(y[0] > STALL_SPEED))) {
        this.fellBack = true;
        if (finite && y[2] < 0 && yPrev[2] >= 0) {
          // Fall-back point: linear interpolation of the state to h = 0 inside the last step.
          const f = yPrev[2] / (yPrev[2] - y[2]);
          for (let i = 0; i < NY; i++) y[i] = yPrev[i] + f * (y[i] - yPrev[i]);
          this.t = t + f * h;
          y[2] = 0;
        } else if (!finite) {
          for (let i = 0; i < NY; i++) y[i] = yPrev[i];
          this.t = t;
        }
        return false;
      }
    }
    return true;
  }

  private setStage(i: number, thrusting: boolean): void {
    const v = this.v;
    this.thrusting = thrusting;
    this.tVac = v.thrustVacuum[i];
    // kP = ṁ·G0·(Isp_vac − Isp_sl)/p0 so that T = T_vac − kP·p.
    this.kP = (v.massFlow[i] * G0 * (v.ispVacuum[i] - v.ispSeaLevel[i])) / P_SEA_LEVEL;
    this.mDot = v.massFlow[i];
  }

  /**
   * Flies the whole timeline. `finalPitchTan` = tan θf of the linear-tangent law, or NaN for
   * no steering (pure gravity turn to the end).
   */
  fly(
    payload: number,
    kickRad: number,
    finalPitchTan: number,
    hAtmo: number,
    hVac: number,
    rec: AscentTrajectory | null,
    stopAtSteering = false
  ): RawFlight {
    const v = this.v;
    const n = v.stageCount;
    const steerStage = Number.isNaN(finalPitchTan) ? n : v.steeringStartStage;
    const y = this.y;
    y.fill(0);
    const m0 = payload + v.stackMass;
    y[1] = Math.PI / 2;
    y[4] = m0;
    this.t = 0;
    this.maxQ = 0;
    this.maxAcc = -Infinity;
    this.qt0 = -2;
    this.qq0 = 0;
    this.qt1 = -1;
    this.qq1 = 0;
    this.fellBack = false;
    this.rec = rec;
    this.mode = MODE_VERTICAL;
    // Steered duration τf: burns from the steering start to the end plus the coasts between them.
    let steerDuration = 0;
    for (let i = steerStage; i < n; i++) steerDuration += v.burnTime[i] + (i < n - 1 ? v.coastAfter[i] : 0);
    if (steerStage === 0) steerDuration -= v.verticalRiseTime;
    const delay = steerStage < n ? v.steeringDelay : 0;
    steerDuration -= delay;
    let steering = false;
    let vacuumDeltaV = 0;
    let ok = true;
    const startSteering = () => {
      steering = true;
      this.mode = MODE_STEER;
      // θ0 = γ at steering start (no attitude jump); b from the end point: b = (tan θf − tan θ0)/τf.
      this.steerA = Math.tan(y[1]);
      this.steerT0 = this.t;
      this.steerB = (finalPitchTan - this.steerA) / steerDuration;
    };
    this.setStage(0, true);
    const liftOffThrust = v.thrustVacuum[0] - this.kP * P_SEA_LEVEL;
    for (let i = 0; i < n && ok; i++) {
      this.setStage(i, true);
      const mStart = y[4];
      let burn = v.burnTime[i];
      if (i === 0 && v.verticalRiseTime > 0) {
        this.mode = MODE_VERTICAL;
        ok = this.integrate(v.verticalRiseTime, hAtmo);
        burn -= v.verticalRiseTime;
      }
      if (ok && i === 0) {
        // Pitch-over: γ jumps to 90° − kick (the gravity turn's initial condition).
        y[1] = Math.PI / 2 - kickRad;
        this.mode = MODE_TURN;
      }
      if (ok && i >= steerStage && !steering) {
        if (delay > 0) {
          // Gravity turn for `steeringDelay` s of this stage before the steering takes over.
          ok = this.integrate(delay, hAtmo);
          burn -= delay;
        }
        if (stopAtSteering) break;
        if (ok) startSteering();
      }
      if (ok) ok = this.integrate(burn, steering ? hVac : hAtmo);
      // Burnout state of this stage (before jettison): peak axial acceleration lives here.
      this.probe();
      // Vacuum rocket equation over what was burned: G0·Isp_vac·ln(m_start/m_end) (Tsiolkovsky).
      vacuumDeltaV += G0 * v.ispVacuum[i] * Math.log(mStart / y[4]);
      if (!ok || i === n - 1) break;
      // Jettison the dry mass, then coast unpowered if asked.
      y[4] -= v.dryMass[i];
      if (v.coastAfter[i] > 0) {
        this.thrusting = false;
        const keep = this.mode;
        if (this.mode === MODE_STEER) this.mode = MODE_TURN; // no thrust: ballistic arc
        ok = this.integrate(v.coastAfter[i], steering ? hVac : hAtmo);
        this.probe();
        this.mode = keep;
      }
    }
    this.rec = null;
    return {
      time: this.t,
      speed: y[0],
      gamma: y[1],
      altitude: y[2],
      downrange: y[3],
      mass: y[4],
      ideal: y[5],
      gravity: y[6],
      drag: y[7],
      steering: y[8],
      vacuumDeltaV,
      maxQ: this.maxQ,
      maxAcc: Number.isFinite(this.maxAcc) ? this.maxAcc : 0,
      fellBack: this.fellBack,
      m0,
      liftOffTW: liftOffThrust / (m0 * G0)
    };
  }
}

/** Engines cached per compiled vehicle (weak: a sweep's vehicles are collected with it). */
const ENGINES = new WeakMap<CompiledAscentVehicle, FlightEngine>();
function engineFor(v: CompiledAscentVehicle): FlightEngine {
  let e = ENGINES.get(v);
  if (e === undefined) {
    e = new FlightEngine(v);
    ENGINES.set(v, e);
  }
  return e;
}

function newTrajectory(): AscentTrajectory {
  return { time: [], altitude: [], downrange: [], speed: [], flightPathAngle: [], dynamicPressure: [], acceleration: [], mass: [] };
}

function stepsOf(step: AscentTimeStep | undefined, defAtmo: number, defVac: number): [number, number] {
  const a = requireFinite(step?.atmosphere ?? defAtmo, 'timeStep.atmosphere', 0, false, 100);
  const b = requireFinite(step?.vacuum ?? defVac, 'timeStep.vacuum', 0, false, 100);
  return [a, b];
}

function burnoutOf(r: RawFlight): BurnoutState {
  return {
    time: r.time,
    altitude: r.altitude,
    speed: r.speed,
    flightPathAngle: r.gamma / DEG,
    downrange: r.downrange,
    mass: r.mass
  };
}

// ---------------------------------------------------------------------------------------------
// simulateGravityTurn (DESIGN.md §3)
// ---------------------------------------------------------------------------------------------

/**
 * The unsteered gravity turn of DESIGN.md §3, integrated to the last stage's burnout.
 *
 * Vertical rise (γ = 90°) for `verticalRiseTime`, then γ = 90° − `pitchKick`, then free:
 * dV/dt = (T − D)/m − g·sin γ; dγ/dt = −(g/V − V/r)·cos γ; dh/dt = V·sin γ;
 * dx/dt = (R/r)·V·cos γ; dm/dt = −ṁ, with ṁ = T_vac/(G0·Isp_vac), T = ṁ·G0·Isp(h),
 * Isp(h) = Isp_vac − (Isp_vac − Isp_sl)·p(h)/p(0), D = ½ρV²·Cd(V/a)·A, g = μ/r², r = R + h,
 * planar point mass over a spherical non-rotating Earth (EARTH.radius, EARTH.mu), USSA 1976
 * (`atmosphere()` read through the 50 m table of `./atmosphere-table`, ≤ 1.1e-5 relative).
 * Stage i+1 ignites the instant stage i burns out and drops its dry mass.
 *
 * Integrator: fixed-step RK4 with steps aligned to each burnout (ṁ constant ⇒ burnout times known);
 * default step 0.25 s (burnout speed error < 0.01 m/s against a 0.02 s run on the test vehicle).
 *
 * @param input `{ stages, payloadMass, referenceArea, dragCoefficient, verticalRiseTime, pitchKick }`:
 *   stages bottom first `{ propellantMass > 0 kg, dryMass ≥ 0 kg, thrustVacuum > 0 N,
 *   ispVacuum > 0 s, ispSeaLevel (0, ispVacuum] s }`; payloadMass ≥ 0 kg; referenceArea ≥ 0 m²;
 *   dragCoefficient `[mach, cd][]`; verticalRiseTime ≥ 0 s, shorter than the first burn;
 *   pitchKick in [0, 90) deg.
 * @param options `timeStep` [s] (default 0.25), `trajectory` (default false) to return samples.
 * @returns `{ burnout: { time s, altitude m, speed m/s, flightPathAngle deg, downrange m, mass kg },
 *   idealDeltaV, gravityLoss, dragLoss (m/s), maxDynamicPressure Pa, maxAxialAcceleration m/s²,
 *   fellBack }`; speed = idealDeltaV − gravityLoss − dragLoss up to integration error.
 * @throws RangeError naming the field for non-physical input.
 * @see Gravity-turn equations: any flight-mechanics text (e.g. Wiesel, Spaceflight Dynamics;
 *   from memory); USSA 1976 for the atmosphere; DESIGN.md §3 for the contract.
 * @example
 * const r = simulateGravityTurn({ stages: [
 *   { propellantMass: 4e5, dryMass: 2.8e4, thrustVacuum: 7.7e6, ispVacuum: 320, ispSeaLevel: 290 },
 *   { propellantMass: 1e5, dryMass: 7e3, thrustVacuum: 1e6, ispVacuum: 345, ispSeaLevel: 250 }],
 *   payloadMass: 15e3, referenceArea: 10, dragCoefficient: DEFAULT_DRAG_COEFFICIENT,
 *   verticalRiseTime: 10, pitchKick: 0.2 });
 * r.burnout.speed; // ≈ 7900 m/s at ≈ 298 km, γ ≈ 0.36° (a kick of 0.3° already falls back)
 */
export function simulateGravityTurn(
  input: GravityTurnInput,
  options: { timeStep?: number; trajectory?: boolean } = {}
): GravityTurnResult {
  if (typeof input !== 'object' || input === null) throw new RangeError('input must be an object');
  const st = compileStages(input.stages, false);
  const payload = requireFinite(input.payloadMass, 'payloadMass', 0, true);
  const referenceArea = requireFinite(input.referenceArea, 'referenceArea', 0, true, 1e4);
  const drag = compileDrag(input.dragCoefficient);
  const tv = requireFinite(input.verticalRiseTime, 'verticalRiseTime', 0, true);
  if (tv >= st.burnTime[0]) {
    throw new RangeError(
      `verticalRiseTime must be shorter than the first stage's burn time (${st.burnTime[0].toFixed(1)} s), got ${tv}`
    );
  }
  const kick = requireFinite(input.pitchKick, 'pitchKick', 0, true);
  if (kick >= 90) throw new RangeError(`pitchKick must be a finite number ≥ 0 and < 90 degrees, got ${kick}`);
  const h = requireFinite(options.timeStep ?? 0.25, 'timeStep', 0, false, 100);
  const v: CompiledAscentVehicle = {
    stageCount: st.propellantMass.length,
    ...st,
    referenceArea,
    drag,
    verticalRiseTime: tv,
    steeringStartStage: 0,
    steeringDelay: 0
  };
  const rec = options.trajectory ? newTrajectory() : null;
  const r = new FlightEngine(v).fly(payload, kick * DEG, NaN, h, h, rec);
  const out: GravityTurnResult = {
    burnout: burnoutOf(r),
    idealDeltaV: r.ideal,
    gravityLoss: r.gravity,
    dragLoss: r.drag,
    maxDynamicPressure: r.maxQ,
    maxAxialAcceleration: r.maxAcc,
    fellBack: r.fellBack
  };
  if (rec) out.trajectory = rec;
  return out;
}

// ---------------------------------------------------------------------------------------------
// One full ascent with given controls
// ---------------------------------------------------------------------------------------------

function checkControls(c: AscentControls): [number, number] {
  if (typeof c !== 'object' || c === null) throw new RangeError('controls must be an object');
  const kick = requireFinite(c.pitchKick, 'pitchKick', 0, true);
  if (kick >= 90) throw new RangeError(`pitchKick must be a finite number ≥ 0 and < 90 degrees, got ${kick}`);
  const thf = requireFinite(c.finalPitch, 'finalPitch', -89, true, 89);
  return [kick, thf];
}

function flightOf(r: RawFlight, rec: AscentTrajectory | null): AscentFlight {
  const out: AscentFlight = {
    burnout: burnoutOf(r),
    idealDeltaV: r.ideal,
    gravityLoss: r.gravity,
    dragLoss: r.drag,
    steeringLoss: r.steering,
    vacuumDeltaV: r.vacuumDeltaV,
    pressureLoss: r.vacuumDeltaV - r.ideal,
    maxDynamicPressure: r.maxQ,
    maxAxialAcceleration: r.maxAcc,
    fellBack: r.fellBack,
    grossLiftOffMass: r.m0,
    liftOffThrustToWeight: r.liftOffTW
  };
  if (rec) out.trajectory = rec;
  return out;
}

/**
 * One full ascent with given controls, to the last stage's burnout (no targeting).
 *
 * Vertical rise, pitch kick, gravity turn (α = 0) through the lower stages, staging (burnout →
 * jettison of the dry mass → optional coast → ignition), then from the ignition of
 * `steeringStartStage` the linear-tangent law tan θ = tan θ0 + (tan θf − tan θ0)·τ/τf with θ the
 * thrust pitch above the local horizontal (the optimal-thrust-direction law for flight in a
 * uniform gravity field without drag, Bryson & Ho, Applied Optimal Control, 1975, §2.7 — from
 * memory; measuring θ from the local horizontal is the usual round-Earth variant). Equations in
 * the file header.
 *
 * Identity: V = idealDeltaV − gravityLoss − dragLoss − steeringLoss, and
 * idealDeltaV = vacuumDeltaV − pressureLoss.
 *
 * @param vehicle {@link AscentVehicle} or a {@link CompiledAscentVehicle}.
 * @param payloadMass payload [kg], ≥ 0.
 * @param controls `{ pitchKick deg in [0, 90), finalPitch deg in [−89, 89] }`.
 * @param options `timeStep` per phase [s] (defaults 1 / 4), `trajectory` to return samples.
 * @returns an {@link AscentFlight}.
 * @throws RangeError naming the field for non-physical input.
 * @see Bryson & Ho 1975 §2.7 (linear-tangent law, from memory); USSA 1976.
 * @example
 * const f = simulateAscent(vehicle, 8000, { pitchKick: 1.2, finalPitch: -5 });
 * f.burnout.altitude; // m
 */
export function simulateAscent(
  vehicle: AscentVehicle | CompiledAscentVehicle,
  payloadMass: number,
  controls: AscentControls,
  options: { timeStep?: AscentTimeStep; trajectory?: boolean } = {}
): AscentFlight {
  const v = isCompiled(vehicle) ? vehicle : compileAscentVehicle(vehicle);
  const payload = requireFinite(payloadMass, 'payloadMass', 0, true);
  const [kick, thf] = checkControls(controls);
  const [ha, hv] = stepsOf(options.timeStep, 1, 8);
  const rec = options.trajectory ? newTrajectory() : null;
  const r = engineFor(v).fly(payload, kick * DEG, Math.tan(thf * DEG), ha, hv, rec);
  return flightOf(r, rec);
}

function isCompiled(v: AscentVehicle | CompiledAscentVehicle): v is CompiledAscentVehicle {
  return typeof v === 'object' && v !== null && (v as CompiledAscentVehicle).massFlow instanceof Float64Array;
}

// ---------------------------------------------------------------------------------------------
// Targeting and the payload of a given vehicle
// ---------------------------------------------------------------------------------------------

/** Where the ascent must end: altitude with γ = 0 and a speed. */
export interface AscentTarget {
  /** Burnout (insertion) altitude [m], 50 km … 2,000 km. */
  altitude: number;
  /**
   * Burnout speed [m/s]; default the circular speed √(μ/(R + h)). Pass e.g. the perigee speed of
   * an elliptical target, or the circular speed minus the Earth-rotation assist (the model's
   * Earth does not rotate, so the assist is applied here as a speed credit).
   */
  speed?: number;
}

/** Tolerances of the shooting solution. */
export interface AscentTolerance {
  /** |h − h_target| [m], default 50. */
  altitude?: number;
  /** |γ| [deg], default 0.005. */
  flightPathAngle?: number;
  /** |V − V_target| [m/s], default 0.5. */
  speed?: number;
}

/** A converged (or last) solution, to warm-start the next, similar case. */
export interface AscentSolution {
  pitchKick: number;
  finalPitch: number;
  payloadMass: number;
  /** 3×3 Jacobian of the scaled residuals, row-major (reused if given). */
  jacobian?: number[];
}

/** Machine-readable reasons an ascent-mode case is infeasible. */
export type AscentInfeasibility =
  | 'delta-v-insufficient' // even with no payload and no losses the stages cannot reach the speed
  | 'target-unreachable' // targeted with zero payload, the burnout speed stays short
  | 'fell-back' // the flight falls back for every control tried
  | 'targeting-failed'; // the shooting method did not converge within its budget

/** Result of {@link ascentPayload}. All numbers finite (zeros when infeasible). */
export interface AscentPayloadResult {
  feasible: boolean;
  /** Empty when feasible. */
  reasons: AscentInfeasibility[];
  /** Human-readable explanation when infeasible. */
  message: string;
  /** Largest payload placed on the target [kg]. */
  payloadMass: number;
  /** Gross lift-off mass with that payload [kg]. */
  grossLiftOffMass: number;
  liftOffThrustToWeight: number;
  /** Controls that fly it [deg]. */
  pitchKick: number;
  finalPitch: number;
  /** Target speed used [m/s]. */
  targetSpeed: number;
  burnout: BurnoutState;
  /** Losses [m/s]: gravity, drag, steering, pressure (thrust lost to back-pressure), total. */
  losses: { gravity: number; drag: number; steering: number; pressure: number; total: number };
  /** ∫T/m [m/s]. */
  idealDeltaV: number;
  /** Σ G0·Isp_vac·ln(m0/mf) [m/s] = targetSpeed + total losses (up to the tolerances). */
  vacuumDeltaV: number;
  maxDynamicPressure: number;
  maxAxialAcceleration: number;
  /** Residual miss at the solution: altitude m, flight-path angle deg, speed m/s. */
  miss: { altitude: number; flightPathAngle: number; speed: number };
  /** Shooting iterations and simulated flights used. */
  iterations: number;
  simulations: number;
  /** Pass as `options.warmStart` to the next similar case. */
  solution: AscentSolution;
  trajectory?: AscentTrajectory;
}

/** Options of {@link ascentPayload}. */
export interface AscentPayloadOptions {
  timeStep?: AscentTimeStep;
  tolerance?: AscentTolerance;
  /** Previous solution of a similar case. */
  warmStart?: AscentSolution;
  /** Return the trajectory of the solution (one extra flight). */
  trajectory?: boolean;
  /** Maximum simulated flights, partial ones included (default 60). */
  maxSimulations?: number;
}

/** Bounds of the controls searched [deg]. */
const LN_KICK_MIN = Math.log(0.005);
const LN_KICK_MAX = Math.log(30);
/** Flight-path angle at steering start aimed at by the cold-start kick search [deg] (a typical staging value, common practice). */
const GAMMA_AT_STEERING_GUESS = 25;
const PITCH_MIN = -70;
const PITCH_MAX = 70;
/** Residual scales: 1 km, 1°, 10 m/s (so the three scaled residuals weigh alike). */
const SCALE_H = 1000;
const SCALE_V = 10;
/** Loss allowance for the first payload guess [m/s] (common practice: 1.5–2 km/s to low orbit). */
const FIRST_GUESS_LOSSES = 1700;
/** Lowest ignition T/W of the first steered stage that the first payload guess allows. */
const MIN_GUESS_UPPER_TW = 0.5;

/**
 * Payload P for which the vacuum rocket equation gives `deltaV`:
 * Σ G0·Isp_i·ln((P + M_i)/(P + M_i − m_p,i)) = Δv, M_i the stack from stage i up (Tsiolkovsky),
 * solved by Newton's method with bisection safeguard; −1 when even P = 0 falls short.
 */
function rocketPayload(v: CompiledAscentVehicle, deltaV: number): number {
  const dv = (P: number) => vacuumDeltaVOf(v, P);
  if (dv(0) < deltaV) return -1;
  let lo = 0;
  let hi = Math.max(1, v.stackMass);
  while (dv(hi) > deltaV) hi *= 2;
  let P = 0.5 * (lo + hi);
  for (let k = 0; k < 60; k++) {
    const f = dv(P) - deltaV;
    if (f > 0) lo = P;
    else hi = P;
    if (Math.abs(f) < 1e-6 || hi - lo < 1e-6) break;
    // Newton step on Δv(P), kept inside the bracket (safeguarded Newton).
    const d = dvdp(v, P);
    let Pn = P - f / d;
    if (!(Pn > lo && Pn < hi)) Pn = 0.5 * (lo + hi);
    P = Pn;
  }
  return P;
}

/** Vacuum rocket-equation Δv of the whole vehicle with payload P [m/s] (Tsiolkovsky, per stage). */
function vacuumDeltaVOf(v: CompiledAscentVehicle, P: number): number {
  let above = P;
  let dv = 0;
  for (let i = v.stageCount - 1; i >= 0; i--) {
    const m0 = above + v.dryMass[i] + v.propellantMass[i];
    // Tsiolkovsky: G0·Isp·ln(m0/mf).
    dv += G0 * v.ispVacuum[i] * Math.log(m0 / (m0 - v.propellantMass[i]));
    above = m0;
  }
  return dv;
}

/** d(vacuum Δv)/dP [m/s per kg] (derivative of the rocket equation). */
function dvdp(v: CompiledAscentVehicle, P: number): number {
  let above = P;
  let d = 0;
  for (let i = v.stageCount - 1; i >= 0; i--) {
    const m0 = above + v.dryMass[i] + v.propellantMass[i];
    // d/dP ln(m0/mf) = 1/m0 − 1/mf.
    d += G0 * v.ispVacuum[i] * (1 / m0 - 1 / (m0 - v.propellantMass[i]));
    above = m0;
  }
  return d;
}

/** Solves the 3×3 system J·dx = b by Gaussian elimination with partial pivoting; false if singular. */
function solve3(J: Float64Array, b: Float64Array, dx: Float64Array): boolean {
  const a = new Float64Array(12);
  for (let i = 0; i < 3; i++) {
    a[i * 4] = J[i * 3];
    a[i * 4 + 1] = J[i * 3 + 1];
    a[i * 4 + 2] = J[i * 3 + 2];
    a[i * 4 + 3] = b[i];
  }
  for (let c = 0; c < 3; c++) {
    let p = c;
    for (let r = c + 1; r < 3; r++) if (Math.abs(a[r * 4 + c]) > Math.abs(a[p * 4 + c])) p = r;
    if (!(Math.abs(a[p * 4 + c]) > 1e-14)) return false;
    if (p !== c) for (let k = 0; k < 4; k++) [a[c * 4 + k], a[p * 4 + k]] = [a[p * 4 + k], a[c * 4 + k]];
    for (let r = c + 1; r < 3; r++) {
      const f = a[r * 4 + c] / a[c * 4 + c];
      for (let k = c; k < 4; k++) a[r * 4 + k] -= f * a[c * 4 + k];
    }
  }
  for (let r = 2; r >= 0; r--) {
    let s = a[r * 4 + 3];
    for (let k = r + 1; k < 3; k++) s -= a[r * 4 + k] * dx[k];
    dx[r] = s / a[r * 4 + r];
  }
  return Number.isFinite(dx[0]) && Number.isFinite(dx[1]) && Number.isFinite(dx[2]);
}

/**
 * Circular orbital speed at an altitude, √(μ/(R + h)) (Newtonian two-body circular orbit).
 * Kept local so this module does not depend on the orbits module's load order.
 */
function circular(h: number): number {
  // Circular speed v = √(μ/r).
  return Math.sqrt(EARTH.mu / (EARTH.radius + h));
}

/**
 * The largest payload a given vehicle puts on a target, by a shooting method.
 *
 * Unknowns x = (pitch kick [deg], final pitch θf of the linear-tangent law [deg], payload [t]);
 * residuals F = ((h_bo − h_t)/1 km, γ_bo/1°, (V_bo − V_t)/10 m/s) at the last burnout (all the
 * propellant burned, so the largest payload is the one that arrives exactly at the target speed).
 * Solved by a quasi-Newton (Broyden) iteration: the kick and θf columns of the Jacobian by finite
 * differences, the payload column from the rocket equation with the losses frozen — so the payload
 * update is the classical loss iteration P ← payload(V_t + losses) of the vacuum rocket equation —
 * and Broyden's rank-one update corrects all columns as flights come in (backtracking when a step
 * makes the miss worse or falls back; the Jacobian is refreshed by finite differences if progress
 * stalls). Converged when |Δh| ≤ 50 m, |γ| ≤ 0.005°, |ΔV| ≤ 0.5 m/s (defaults), which moves the
 * payload by < 0.05 % on the test vehicle. Warm-start with the previous case's `solution`.
 *
 * Never NaN: an unreachable target returns `feasible: false` with machine-readable `reasons`.
 *
 * @param vehicle {@link AscentVehicle} or a {@link CompiledAscentVehicle}.
 * @param target `{ altitude m in [50 km, 2000 km], speed? m/s (default circular) }`.
 * @param options time steps, tolerances, warm start, trajectory flag, flight budget.
 * @returns an {@link AscentPayloadResult}.
 * @throws RangeError naming the field for non-physical input.
 * @see Broyden, Math. Comp. 19 (1965) 577–593 (quasi-Newton update); shooting methods: Stoer &
 *   Bulirsch, Introduction to Numerical Analysis, §7.3 (from memory); Bryson & Ho 1975 §2.7
 *   (linear-tangent law, from memory).
 * @example
 * const r = ascentPayload(vehicle, { altitude: 200e3 });
 * r.feasible && r.payloadMass; // kg
 */
export function ascentPayload(
  vehicle: AscentVehicle | CompiledAscentVehicle,
  target: AscentTarget,
  options: AscentPayloadOptions = {}
): AscentPayloadResult {
  const v = isCompiled(vehicle) ? vehicle : compileAscentVehicle(vehicle);
  if (typeof target !== 'object' || target === null) throw new RangeError('target must be an object');
  const ht = requireFinite(target.altitude, 'target.altitude', 50e3, true, 2e6);
  const Vt = requireFinite(target.speed ?? circular(ht), 'target.speed', 0, false, 20000);
  const [ha, hv] = stepsOf(options.timeStep, 1, 8);
  const tolH = requireFinite(options.tolerance?.altitude ?? 50, 'tolerance.altitude', 0, false);
  const tolG = requireFinite(options.tolerance?.flightPathAngle ?? 0.005, 'tolerance.flightPathAngle', 0, false);
  const tolV = requireFinite(options.tolerance?.speed ?? 0.5, 'tolerance.speed', 0, false);
  const maxSims = Math.max(5, Math.floor(requireFinite(options.maxSimulations ?? 60, 'maxSimulations', 0, false)));
  const engine = engineFor(v);

  const fail = (reason: AscentInfeasibility, message: string, sims: number, iters: number, kick = 0, pitch = 0): AscentPayloadResult => ({
    feasible: false,
    reasons: [reason],
    message,
    payloadMass: 0,
    grossLiftOffMass: v.stackMass,
    liftOffThrustToWeight: (v.thrustVacuum[0] - (v.massFlow[0] * G0 * (v.ispVacuum[0] - v.ispSeaLevel[0]))) / (v.stackMass * G0),
    pitchKick: kick,
    finalPitch: pitch,
    targetSpeed: Vt,
    burnout: { time: 0, altitude: 0, speed: 0, flightPathAngle: 0, downrange: 0, mass: 0 },
    losses: { gravity: 0, drag: 0, steering: 0, pressure: 0, total: 0 },
    idealDeltaV: 0,
    vacuumDeltaV: 0,
    maxDynamicPressure: 0,
    maxAxialAcceleration: 0,
    miss: { altitude: 0, flightPathAngle: 0, speed: 0 },
    iterations: iters,
    simulations: sims,
    solution: { pitchKick: kick, finalPitch: pitch, payloadMass: 0 }
  });

  // Quick rejection: no payload and no losses still short of the target speed (rocket equation).
  if (vacuumDeltaVOf(v, 0) <= Vt) {
    return fail('delta-v-insufficient', `the stages' vacuum Δv with no payload (${vacuumDeltaVOf(v, 0).toFixed(0)} m/s) is below the target speed ${Vt.toFixed(0)} m/s`, 0, 0);
  }

  // x = [ln(kick/deg), θf deg, payload t]; F = scaled residuals. The kick enters through its
  // logarithm because the turn's sensitivity to the kick scales roughly as 1/kick.
  const x = new Float64Array(3);
  const F = new Float64Array(3);
  const xn = new Float64Array(3);
  const Fn = new Float64Array(3);
  const dx = new Float64Array(3);
  const rhs = new Float64Array(3);
  const J = new Float64Array(9);
  let sims = 0;
  const clampX = (xx: Float64Array) => {
    xx[0] = Math.min(LN_KICK_MAX, Math.max(LN_KICK_MIN, xx[0]));
    xx[1] = Math.min(PITCH_MAX, Math.max(PITCH_MIN, xx[1]));
    xx[2] = Math.max(0, xx[2]);
  };
  const evalAt = (xx: Float64Array, out: Float64Array): RawFlight => {
    sims++;
    const r = engine.fly(xx[2] * 1000, Math.exp(xx[0]) * DEG, Math.tan(xx[1] * DEG), ha, hv, null);
    // Scaled residuals: altitude per km, γ per degree, speed per 10 m/s.
    out[0] = (r.altitude - ht) / SCALE_H;
    out[1] = r.gamma / DEG;
    out[2] = (r.speed - Vt) / SCALE_V;
    return r;
  };
  const norm = (f: Float64Array) => Math.hypot((f[0] * SCALE_H) / tolH, f[1] / tolG, (f[2] * SCALE_V) / tolV);
  const converged = (f: Float64Array) =>
    Math.abs(f[0] * SCALE_H) <= tolH && Math.abs(f[1]) <= tolG && Math.abs(f[2] * SCALE_V) <= tolV;
  const kickOf = (xx: Float64Array) => Math.exp(xx[0]);

  /**
   * Kick giving a flight-path angle `goal` [deg] at steering start: regula falsi (Illinois
   * variant) in ln(kick), γ falling monotonically as the kick grows; partial flights (lower
   * stages only) at twice the step. Returns ln(kick).
   */
  const kickForGamma = (goal: number): number => {
    const gAt = (lnk: number) => {
      sims++;
      const r = engine.fly(x[2] * 1000, Math.exp(lnk) * DEG, 0, 2 * ha, hv, null, true);
      return (r.fellBack ? -90 : r.gamma / DEG) - goal;
    };
    let a = Math.log(0.1);
    let b = Math.log(1);
    let fa = gAt(a);
    let fb = gAt(b);
    // Widen the bracket towards the sign change (γ too high → larger kick).
    for (let k = 0; k < 4 && fa < 0 && a > LN_KICK_MIN; k++) {
      b = a;
      fb = fa;
      a = Math.max(LN_KICK_MIN, a - 1.5);
      fa = gAt(a);
    }
    for (let k = 0; k < 4 && fb > 0 && b < LN_KICK_MAX; k++) {
      a = b;
      fa = fb;
      b = Math.min(LN_KICK_MAX, b + 1.5);
      fb = gAt(b);
    }
    let c = fa < 0 ? a : b;
    if (fa >= 0 && fb <= 0) {
      let side = 0;
      for (let k = 0; k < 8; k++) {
        c = (a * fb - b * fa) / (fb - fa);
        const fc = gAt(c);
        if (Math.abs(fc) < 3) break;
        if (fc > 0) {
          a = c;
          fa = fc;
          if (side === 1) fb *= 0.5; // Illinois modification
          side = 1;
        } else {
          b = c;
          fb = fc;
          if (side === -1) fa *= 0.5;
          side = -1;
        }
      }
    }
    return c;
  };

  /**
   * Jacobian: finite differences in ln(kick) and θf; the payload column from the rocket equation
   * with the losses frozen (∂(V − V_t)/∂P = dΔv_vac/dP, ∂h/∂P = ∂γ/∂P = 0) on the first build —
   * which makes the payload update the classical loss iteration — and by finite differences
   * too (`full`) when the iteration stalls.
   */
  const refreshJacobian = (full = false) => {
    const steps = [0.02, 0.5, Math.max(0.05, 0.02 * x[2])];
    for (let c = 0; c < (full ? 3 : 2); c++) {
      xn.set(x);
      const up = c === 0 ? LN_KICK_MAX : c === 1 ? PITCH_MAX : Infinity;
      xn[c] = x[c] + steps[c] > up ? x[c] - steps[c] : x[c] + steps[c];
      const d = xn[c] - x[c];
      evalAt(xn, Fn);
      // Forward difference ∂F/∂x_c.
      for (let r = 0; r < 3; r++) J[r * 3 + c] = (Fn[r] - F[r]) / d;
    }
    if (!full) {
      // Rocket-equation column (per tonne, scaled).
      J[2] = 0;
      J[5] = 0;
      J[8] = (dvdp(v, x[2] * 1000) * 1000) / SCALE_V;
    }
  };

  /**
   * With no payload, is the burnout speed short by more than the altitude and flight-path misses
   * could still buy? Energy trade: Δv ≈ g·|Δh|/V + V·|Δγ| (twice that, as a margin), plus tolV.
   */
  const shortOfSpeed = (f: Float64Array): boolean => {
    const g = EARTH.mu / (EARTH.radius + ht) ** 2;
    const buy = 2 * ((g * Math.abs(f[0] * SCALE_H)) / Vt + Vt * Math.abs(f[1] * DEG));
    return f[2] * SCALE_V < -(tolV + buy);
  };

  /** Quasi-Newton from the current x (F, J set): 'ok', 'unreachable' or 'failed'. */
  let iters = 0;
  let last: RawFlight | null = null;
  const newton = (budget: number): 'ok' | 'unreachable' | 'failed' => {
    let stall = 0;
    let refreshed = false;
    while (!converged(F)) {
      if (sims >= budget) return 'failed';
      iters++;
      for (let k = 0; k < 3; k++) rhs[k] = -F[k];
      if (!solve3(J, rhs, dx)) {
        refreshJacobian();
        if (!solve3(J, rhs, dx)) return 'failed';
      }
      // Step limits (a trust region in control units): ln kick ≤ 0.7, θf ≤ 20°, payload ≤ 30 % of the stack.
      const lim2 = (0.3 * v.stackMass) / 1000;
      const scale = Math.min(1, 0.7 / Math.abs(dx[0] || 1e-300), 20 / Math.abs(dx[1] || 1e-300), lim2 / Math.abs(dx[2] || 1e-300));
      for (let k = 0; k < 3; k++) dx[k] *= scale;
      const n0 = norm(F);
      let accepted = false;
      let r: RawFlight | null = null;
      for (let bt = 0; bt < 5 && sims < budget; bt++) {
        for (let k = 0; k < 3; k++) xn[k] = x[k] + dx[k];
        clampX(xn);
        r = evalAt(xn, Fn);
        if (!r.fellBack && norm(Fn) < 1.2 * n0) {
          accepted = true;
          break;
        }
        // Backtracking line search: halve the step.
        for (let k = 0; k < 3; k++) dx[k] *= 0.5;
      }
        if (!accepted || r === null) {
        if (refreshed || sims >= budget) return 'failed';
        refreshed = true;
        refreshJacobian(true);
        continue;
      }
      refreshed = false;
      // Broyden's ("good") rank-one update: J += (ΔF − J·Δx)·Δxᵀ/(Δxᵀ·Δx), x in (ln kick, θf°, P t).
      const s0 = xn[0] - x[0];
      const s1 = xn[1] - x[1];
      const s2 = xn[2] - x[2];
      const ss = s0 * s0 + s1 * s1 + s2 * s2;
      if (ss > 0) {
        for (let row = 0; row < 3; row++) {
          const pred = J[row * 3] * s0 + J[row * 3 + 1] * s1 + J[row * 3 + 2] * s2;
          const c = (Fn[row] - F[row] - pred) / ss;
          J[row * 3] += c * s0;
          J[row * 3 + 1] += c * s1;
          J[row * 3 + 2] += c * s2;
        }
      }
      const improved = norm(Fn) < 0.5 * n0;
      x.set(xn);
      F.set(Fn);
      last = r;
      // Payload pinned at zero and still short of the speed: the target cannot be reached.
      if (x[2] === 0 && shortOfSpeed(F)) return 'unreachable';
      stall = improved ? 0 : stall + 1;
      if (stall >= 2) {
        stall = 0;
        refreshJacobian(true);
      }
    }
    return 'ok';
  };

  // Starting points, tried in turn until one converges (a multi-start shooting): the warm start,
  // then cold starts — payload from the rocket equation with a 1.7 km/s loss allowance, the kick
  // for a flight-path angle at steering start of 25°, 40°, 55°, 10° or 70° (low upper-stage
  // thrust needs a lofted staging), and final pitch 0° or 30°.
  const ws = options.warmStart;
  // Cap: keep the first steered stage's ignition T/W ≥ 0.5 if any payload allows it (heavier
  // guesses make low-thrust upper stages fall back before the shooting can start).
  let stackAbove = 0;
  for (let i = v.steeringStartStage; i < v.stageCount; i++) stackAbove += v.propellantMass[i] + v.dryMass[i];
  const pCap = v.thrustVacuum[v.steeringStartStage] / (MIN_GUESS_UPPER_TW * G0) - stackAbove;
  const p0 = Math.max(0, Math.min(rocketPayload(v, Vt + FIRST_GUESS_LOSSES), pCap)) / 1000;
  const starts: Array<() => boolean> = [];
  if (ws && Number.isFinite(ws.pitchKick) && ws.pitchKick > 0 && Number.isFinite(ws.finalPitch) && Number.isFinite(ws.payloadMass)) {
    starts.push(() => {
      x[0] = Math.log(ws.pitchKick);
      x[1] = ws.finalPitch;
      x[2] = ws.payloadMass / 1000;
      clampX(x);
      return true;
    });
  }
  const goals = v.steeringStartStage === 0 && v.steeringDelay === 0 ? [NaN] : [25, 40, 55, 10, 70];
  // Second round with 40 % of the payload guess: low upper-stage thrust also means larger losses
  // than the allowance, and a lighter stack keeps such a stage from falling back.
  for (const pf of [1, 0.4]) {
    for (const goal of goals) {
      let lnk = NaN;
      for (const th of [0, 30]) {
        starts.push(() => {
          x[2] = p0 * pf;
          if (Number.isNaN(lnk)) lnk = Number.isNaN(goal) ? Math.log(2) : kickForGamma(goal);
          x[0] = lnk;
          x[1] = th;
          return true;
        });
      }
    }
  }
  let outcome: 'ok' | 'unreachable' | 'failed' | 'fell' = 'fell';
  let anyFlew = false;
  for (let i = 0; i < starts.length && sims < maxSims; i++) {
    starts[i]();
    const r = evalAt(x, F);
    if (r.fellBack) continue;
    anyFlew = true;
    last = r;
    const isWarm = i === 0 && ws !== undefined && starts.length > goals.length * 4;
    if (isWarm && ws?.jacobian && ws.jacobian.length === 9 && ws.jacobian.every(Number.isFinite)) J.set(ws.jacobian);
    else refreshJacobian();
    // Each start may use up to half of what is left of the flight budget (at least 12 flights).
    const budget = Math.min(maxSims, sims + Math.max(12, Math.ceil((maxSims - sims) / 2)));
    outcome = newton(budget);
    if (outcome === 'ok' || outcome === 'unreachable') break;
  }
  if (outcome === 'unreachable' || (outcome === 'failed' && x[2] === 0 && shortOfSpeed(F))) {
    return fail('target-unreachable', `with no payload the best burnout speed found is ${(Vt + F[2] * SCALE_V).toFixed(0)} m/s, below the target ${Vt.toFixed(0)} m/s (miss ${(F[0] * SCALE_H).toFixed(0)} m, ${F[1].toFixed(3)}°)`, sims, iters, kickOf(x), x[1]);
  }
  if (!anyFlew || last === null) {
    return fail('fell-back', 'the flight falls back to the ground for every starting control tried', sims, iters, kickOf(x), x[1]);
  }
  if (outcome !== 'ok') {
    return fail('targeting-failed', `the shooting method did not converge in ${sims} flights (last miss: ${(F[0] * SCALE_H).toFixed(0)} m, ${F[1].toFixed(3)}°, ${(F[2] * SCALE_V).toFixed(1)} m/s)`, sims, iters, kickOf(x), x[1]);
  }
  let rec: AscentTrajectory | null = null;
  if (options.trajectory) {
    rec = newTrajectory();
    last = engine.fly(x[2] * 1000, kickOf(x) * DEG, Math.tan(x[1] * DEG), ha, hv, rec);
    sims++;
  }
  const f = last;
  const total = f.vacuumDeltaV - f.speed;
  const result: AscentPayloadResult = {
    feasible: true,
    reasons: [],
    message: '',
    payloadMass: x[2] * 1000,
    grossLiftOffMass: f.m0,
    liftOffThrustToWeight: f.liftOffTW,
    pitchKick: kickOf(x),
    finalPitch: x[1],
    targetSpeed: Vt,
    burnout: burnoutOf(f),
    losses: {
      gravity: f.gravity,
      drag: f.drag,
      steering: f.steering,
      pressure: f.vacuumDeltaV - f.ideal,
      total
    },
    idealDeltaV: f.ideal,
    vacuumDeltaV: f.vacuumDeltaV,
    maxDynamicPressure: f.maxQ,
    maxAxialAcceleration: f.maxAcc,
    miss: { altitude: F[0] * SCALE_H, flightPathAngle: F[1], speed: F[2] * SCALE_V },
    iterations: iters,
    simulations: sims,
    solution: { pitchKick: kickOf(x), finalPitch: x[1], payloadMass: x[2] * 1000, jacobian: Array.from(J) }
  };
  if (rec) result.trajectory = rec;
  return result;
}

/**
 * The simulated losses of an ascent-mode result as delta-v budget inputs (`origin: 'simulated'`),
 * for `buildDeltaVBudget({ losses })` of `./budget`.
 *
 * Mapping: gravity = ∫g·sin γ dt; steering = ∫(T/m)(1 − cos α) dt; drag = ∫D/m dt plus the
 * thrust lost to ambient pressure (vacuum Δv − ∫T/m dt), both atmospheric losses, so that the
 * budget's vacuum-Isp rocket equation closes: Σ losses = vacuum Δv − burnout speed. The note
 * carries the split.
 *
 * Earth rotation: the ascent model's Earth does not rotate; pass `target.speed` = insertion speed
 * − rotation assist to {@link ascentPayload} and let the budget subtract the same assist.
 *
 * @param r a feasible {@link AscentPayloadResult} (an infeasible one gives zeros).
 * @returns `{ gravity, drag, steering }` as `{ value [m/s], origin: 'simulated', note }`.
 * @see DESIGN.md §3 and issue 3 point 5 (term origins).
 * @example
 * buildDeltaVBudget({ ..., losses: ascentBudgetLosses(ascentPayload(vehicle, target)) });
 */
export function ascentBudgetLosses(r: AscentPayloadResult): { gravity: LossInput; drag: LossInput; steering: LossInput } {
  const l = r.losses;
  return {
    gravity: { value: l.gravity, origin: 'simulated', note: 'ascent simulation: ∫g·sin γ dt' },
    drag: {
      value: l.drag + l.pressure,
      origin: 'simulated',
      note: `ascent simulation: aerodynamic drag ${l.drag.toFixed(1)} m/s + thrust lost to ambient pressure ${l.pressure.toFixed(1)} m/s`
    },
    steering: { value: l.steering, origin: 'simulated', note: 'ascent simulation: ∫(T/m)(1 − cos α) dt' }
  };
}
