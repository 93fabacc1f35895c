/**
 * An independent integration of the ascent equations with mathjs `solveODE` (Dormand–Prince
 * RK5(4), adaptive), written from DESIGN.md §3 without using the project's integrator, drag
 * interpolation or atmosphere table: it calls the exact `atmosphere()` (USSA 1976) and
 * interpolates Cd itself. Used by the unit tests and the ascent benchmark as the outside
 * reference for the fixed-step RK4 of src/lib/physics/ascent.ts.
 *
 * The state is scaled (km, km/s, t, rad) so that one absolute `tol` means the same thing for
 * every component: tol = 1e-9 is a micrometre, a micrometre per second, a milligram.
 */
import * as mathjs from 'mathjs';
import { atmosphere } from '../../../src/lib/physics/atmosphere';
import { EARTH, G0 } from '../../../src/lib/physics/constants';
import type { AscentStage } from '../../../src/lib/physics/ascent';

// solveODE is missing from mathjs's type declarations (STACK.md pitfall 8).
type Rhs = (t: number, y: number[]) => number[];
const solveODE = (
  mathjs as unknown as {
    solveODE: (
      f: Rhs,
      tspan: [number, number],
      y0: number[],
      options: { tol: number; method?: string; maxIter?: number; maxStep?: number; firstStep?: number }
    ) => { t: number[]; y: number[][] };
  }
).solveODE;

export interface ReferenceInput {
  stages: ReadonlyArray<AscentStage>;
  payloadMass: number;
  referenceArea: number;
  dragCoefficient: ReadonlyArray<readonly [number, number]>;
  verticalRiseTime: number;
  /** [deg] */
  pitchKick: number;
  /** Linear-tangent steering from this stage's ignition with tan θf at the end; omit for none. */
  steering?: { startStage: number; finalPitch: number };
}

export interface ReferenceResult {
  time: number;
  speed: number;
  /** [deg] */
  flightPathAngle: number;
  altitude: number;
  downrange: number;
  mass: number;
  idealDeltaV: number;
  gravityLoss: number;
  dragLoss: number;
  steeringLoss: number;
  /** Max of ½ρV² over solveODE's output points [Pa]. */
  maxDynamicPressure: number;
  /** Steps solveODE took. */
  steps: number;
}

function cd(table: ReadonlyArray<readonly [number, number]>, mach: number): number {
  if (mach <= table[0][0]) return table[0][1];
  for (let k = 0; k < table.length - 1; k++) {
    const [m0, c0] = table[k];
    const [m1, c1] = table[k + 1];
    if (mach < m1) return c0 + ((c1 - c0) * (mach - m0)) / (m1 - m0);
  }
  return table[table.length - 1][1];
}

/**
 * Integrates the ascent with mathjs solveODE, one call per segment (vertical rise, each burn,
 * each coast is not supported: the reference covers the no-coast timeline of DESIGN.md §3).
 *
 * @param input the problem (SI, degrees).
 * @param tol solveODE's absolute tolerance on the scaled state (default 1e-9).
 */
export function referenceAscent(input: ReferenceInput, tol = 1e-9): ReferenceResult {
  const R = EARTH.radius / 1000; // km
  const mu = EARTH.mu / 1e9; // km³/s²
  const p0 = atmosphere(0).pressure;
  const n = input.stages.length;
  let vertical = true;
  let thrusting = true;
  let stage = 0;
  let steer: { a: number; b: number; t0: number } | null = null;
  let steps = 0;
  let maxQ = 0;

  // y = [V km/s, γ rad, h km, x km, m t, ∫T/m, ∫g sinγ, ∫D/m, ∫(T/m)(1 − cos α) km/s]
  const rhs: Rhs = (t, y) => {
    const [V, gam, h, , m] = y;
    const s = input.stages[stage];
    const r = R + h;
    const g = mu / (r * r);
    const atm = atmosphere(Math.max(h * 1000, -5000));
    const mdot = s.thrustVacuum / (G0 * s.ispVacuum) / 1000; // t/s
    const isp = s.ispVacuum - ((s.ispVacuum - s.ispSeaLevel) * atm.pressure) / p0;
    // Units: t/s · m/s² · s = kN; /1000 → MN; MN/t = km/s².
    const T = thrusting ? (mdot * G0 * isp) / 1000 : 0; // MN
    const Vm = V * 1000;
    // Drag D = ½ρV²·Cd(M)·A [N] → MN.
    const D = (0.5 * atm.density * Vm * Vm * cd(input.dragCoefficient, Math.abs(Vm) / atm.speedOfSound) * input.referenceArea) / 1e6;
    let alpha = 0;
    if (steer && thrusting) alpha = Math.atan(steer.a + steer.b * (t - steer.t0)) - gam;
    const aT = T / m; // km/s²
    const aD = (V < 0 ? -D : D) / m; // km/s²
    return [
      aT * Math.cos(alpha) - aD - g * Math.sin(gam),
      vertical ? 0 : (aT * Math.sin(alpha)) / V - (g / V - V / r) * Math.cos(gam),
      V * Math.sin(gam),
      ((R / r) * V) * Math.cos(gam),
      thrusting ? -mdot : 0,
      aT,
      g * Math.sin(gam),
      aD,
      aT * (1 - Math.cos(alpha))
    ];
  };

  const m0 = (input.payloadMass + input.stages.reduce((a, s) => a + s.propellantMass + s.dryMass, 0)) / 1000;
  let y = [0, Math.PI / 2, 0, 0, m0, 0, 0, 0, 0];
  let t = 0;
  const run = (duration: number) => {
    const sol = solveODE(rhs, [t, t + duration], y, { tol, maxIter: 1e6, firstStep: 1e-3 });
    steps += sol.t.length - 1;
    for (let i = 0; i < sol.y.length; i++) {
      const yi = sol.y[i];
      const q = 0.5 * atmosphere(Math.max(yi[2] * 1000, -5000)).density * (yi[0] * 1000) ** 2;
      if (q > maxQ) maxQ = q;
    }
    y = sol.y[sol.y.length - 1].slice();
    t = sol.t[sol.t.length - 1];
  };
  let steerDuration = 0;
  const ss = input.steering?.startStage ?? n;
  for (let i = ss; i < n; i++) steerDuration += input.stages[i].propellantMass / (input.stages[i].thrustVacuum / (G0 * input.stages[i].ispVacuum));
  for (stage = 0; stage < n; stage++) {
    const s = input.stages[stage];
    const burn = s.propellantMass / (s.thrustVacuum / (G0 * s.ispVacuum));
    let left = burn;
    if (stage === 0) {
      vertical = true;
      if (input.verticalRiseTime > 0) run(input.verticalRiseTime);
      left -= input.verticalRiseTime;
      vertical = false;
      y[1] = Math.PI / 2 - (input.pitchKick * Math.PI) / 180;
    }
    if (input.steering && stage === ss && !steer) {
      const a = Math.tan(y[1]);
      steer = { a, t0: t, b: (Math.tan((input.steering.finalPitch * Math.PI) / 180) - a) / steerDuration };
    }
    thrusting = true;
    run(left);
    if (stage < n - 1) y[4] -= s.dryMass / 1000;
  }
  return {
    time: t,
    speed: y[0] * 1000,
    flightPathAngle: (y[1] * 180) / Math.PI,
    altitude: y[2] * 1000,
    downrange: y[3] * 1000,
    mass: y[4] * 1000,
    idealDeltaV: y[5] * 1000,
    gravityLoss: y[6] * 1000,
    dragLoss: y[7] * 1000,
    steeringLoss: y[8] * 1000,
    maxDynamicPressure: maxQ,
    steps
  };
}
