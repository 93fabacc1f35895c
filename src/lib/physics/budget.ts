/**
 * Delta-v budget: insertion speed + gravity, drag and steering losses − Earth-rotation assist
 * + transfer and plane-change manoeuvres + reserve, every term with its origin.
 *
 * Budget mode takes the three ascent losses from the user or, when not given, from the loss
 * correlation below (gravity ≈ a + b/ψ + c·h, drag ≈ d0 + d1·ψ, steering ≈ s + sh·h, with ψ the
 * lift-off thrust-to-weight ratio and h the burn-out altitude), fitted by least squares to this
 * project's own ascent simulation (tests/fixtures/loss-correlation/fit.ts). Ascent mode passes
 * the simulated losses in with `origin: 'simulated'`.
 */
import { EARTH } from './constants';
import {
  insertionToTargetInto,
  type InsertionResult,
  type InsertionStrategy
} from './orbits';

/** Where a budget term comes from. */
export type BudgetOrigin =
  /** Orbital mechanics from the target and the site (vis-viva, Hohmann, plane change, assist). */
  | 'computed'
  /** An allowance: given by the user, or defaulted from the loss correlation (see `note`). */
  | 'allowance'
  /** Integrated by the ascent simulation. */
  | 'simulated';

/** One line of the budget. */
export interface BudgetTerm {
  /** Delta-v [m/s]; the rotation assist is negative (it reduces the total). */
  value: number;
  origin: BudgetOrigin;
  /** How the value was obtained (formula, correlation, or user input). */
  note: string;
}

/**
 * Coefficients of the budget-mode loss correlation (all SI; ψ = lift-off T/W, h = burn-out
 * altitude in metres):
 *   gravityLoss  = gravity.a + gravity.b/ψ + gravity.c·h
 *   dragLoss     = drag.d0 + drag.d1·ψ
 *   steeringLoss = steering.s + steering.sh·h   (sh optional, default 0)
 *   maxDynamicPressure (estimate) = maxQ.q0 + maxQ.q1·ψ
 * each clamped at ≥ 0. Linear in its coefficients, so it is re-fitted by linear least squares.
 */
export interface LossCorrelation {
  gravity: { a: number; b: number; c: number };
  drag: { d0: number; d1: number };
  /** s [m/s] and the optional altitude slope sh [m/s per m] (default 0: constant steering loss). */
  steering: { s: number; sh?: number };
  maxQ: { q0: number; q1: number };
  /** Lift-off T/W range over which the coefficients are meant to be used. */
  validThrustToWeight: { min: number; max: number };
  /** Burn-out altitude range over which the coefficients are meant to be used [m] (optional). */
  validBurnoutAltitude?: { min: number; max: number };
  /** Where the numbers come from, stored with results for traceability. */
  source: string;
}

/**
 * Default loss correlation: our own least-squares fit to our own ascent model, not a published
 * formula.
 *
 * Where the numbers come from: `npx tsx tests/fixtures/loss-correlation/fit.ts` sizes 960
 * invented vehicles in ascent mode (`sizeAscentVehicle`: targeted planar ascent, loss iteration)
 * — two- and three-stage round-number families; lift-off T/W 1.15, 1.3, 1.5, 1.75, 2.0;
 * upper-stage T/W 0.7, 0.9, 1.15, 1.5; direct ascent to circular 200, 400, 600, 800 km; payload
 * 2, 10, 40 t; rotation credit 0 and 400 m/s; the default Cd–Mach table; reference area
 * A = 10 m²·(m0/500 t)^(2/3) — and fits each term by linear least squares (mathjs QR) to the 849
 * that converge (the 111 others are direct ascents the steering family cannot fly, mostly to
 * 600–800 km). Drag is aerodynamic drag + thrust lost to back-pressure, as ascent mode hands it
 * to the budget (`ascentBudgetLosses`). The coefficients, grid and residuals are in
 * tests/fixtures/loss-correlation/fit.json; tests/unit/physics/loss-correlation.test.ts keeps
 * these numbers equal to it and checks them on held-out vehicles.
 *
 * Residuals, simulated − correlation, over the fit grid (RMS / max |r|): gravity 204 / 592 m/s;
 * drag 16 / 70 m/s; steering 436 / 1,493 m/s; total 376 / 1,245 m/s; max-Q 5.8 / 27.7 kPa. The
 * scatter is mostly the upper-stage T/W, which the correlation does not see: in a direct ascent
 * to 600–800 km a fast-burning upper stage (T/W 1.5) must loft and then turn down, so its
 * steering loss runs ~0.4–0.5 km/s above the correlation, a slow one (0.7) ~0.3 km/s below.
 * At 200 km the total-loss residual is RMS 258 m/s, max 746 m/s (three-stage vehicles with slow
 * upper stages); two-stage vehicles at lift-off T/W 1.3 lie within ≈ 0.25 km/s of it.
 * For high orbits, a parking orbit plus transfer (insertion strategy) or ascent mode is better.
 * Valid over the fitted ranges: lift-off T/W 1.15–2.0, burn-out altitude 200–800 km.
 */
export const DEFAULT_LOSS_CORRELATION: LossCorrelation = Object.freeze({
  gravity: Object.freeze({ a: -449.868, b: 2067.55, c: 0.00238213 }),
  drag: Object.freeze({ d0: 91.1051, d1: 14.9777 }),
  steering: Object.freeze({ s: -234.584, sh: 0.00149959 }),
  maxQ: Object.freeze({ q0: -52110.3, q1: 65670 }),
  validThrustToWeight: Object.freeze({ min: 1.15, max: 2 }),
  validBurnoutAltitude: Object.freeze({ min: 200e3, max: 800e3 }),
  source:
    'least-squares fit to the ascent simulation of 849 invented vehicles (tests/fixtures/loss-correlation/fit.ts; lift-off T/W 1.15–2.0, 200–800 km; total-loss residual RMS 376 m/s)'
}) as LossCorrelation;

/** Loss allowances from the correlation [m/s] and the max-Q estimate [Pa]. */
export interface LossEstimate {
  gravityLoss: number;
  dragLoss: number;
  steeringLoss: number;
  maxDynamicPressure: number;
}

/**
 * Default loss allowances from lift-off T/W and burn-out altitude (budget-mode correlation).
 *
 * Formula: gravity = a + b/ψ + c·h; drag = d0 + d1·ψ; steering = s + sh·h; q_max = q0 + q1·ψ;
 * each clamped at ≥ 0. Coefficients: {@link DEFAULT_LOSS_CORRELATION}.
 *
 * @param liftoffThrustToWeight lift-off thrust / (mass·G0), in (0, 10].
 * @param burnoutAltitude altitude at the end of the ascent [m], in [0, 4e8].
 * @param correlation coefficients (default {@link DEFAULT_LOSS_CORRELATION}).
 * @param out optional object to write into (no allocation).
 * @returns `{ gravityLoss, dragLoss, steeringLoss, maxDynamicPressure }`.
 * @throws RangeError naming the parameter.
 * @see {@link DEFAULT_LOSS_CORRELATION} for the fit, its grid and its residuals.
 * @example
 * lossAllowances(1.3, 200e3).gravityLoss; // ≈ 1617 m/s (default fitted correlation)
 */
export function lossAllowances(
  liftoffThrustToWeight: number,
  burnoutAltitude: number,
  correlation: LossCorrelation = DEFAULT_LOSS_CORRELATION,
  out: LossEstimate = { gravityLoss: 0, dragLoss: 0, steeringLoss: 0, maxDynamicPressure: 0 }
): LossEstimate {
  const psi = liftoffThrustToWeight;
  if (!(psi > 0 && psi <= 10)) {
    throw new RangeError(`liftoffThrustToWeight must be a finite number in (0, 10], got ${psi}`);
  }
  if (!(burnoutAltitude >= 0 && burnoutAltitude <= 4e8)) {
    throw new RangeError(`burnoutAltitude must be a finite number in [0, 4e8] m, got ${burnoutAltitude}`);
  }
  const g = correlation.gravity;
  // Gravity-loss correlation a + b/ψ + c·h.
  const grav = g.a + g.b / psi + g.c * burnoutAltitude;
  // Drag-loss correlation d0 + d1·ψ.
  const drag = correlation.drag.d0 + correlation.drag.d1 * psi;
  // Max-Q estimate q0 + q1·ψ.
  const q = correlation.maxQ.q0 + correlation.maxQ.q1 * psi;
  out.gravityLoss = grav > 0 ? grav : 0;
  out.dragLoss = drag > 0 ? drag : 0;
  // Steering-loss correlation s + sh·h (sh optional: constant when absent).
  const st = correlation.steering;
  const steer = st.s + (st.sh ?? 0) * burnoutAltitude;
  out.steeringLoss = steer > 0 ? steer : 0;
  out.maxDynamicPressure = q > 0 ? q : 0;
  return out;
}

/** A loss given by the caller: a number (user allowance) or a value with its origin. */
export type LossInput = number | { value: number; origin: 'allowance' | 'simulated'; note?: string };

/** Input of {@link buildDeltaVBudget}. */
export interface BudgetInput {
  /** Target orbit: perigee and apogee altitudes [m] (apogee defaults to perigee), inclination [deg]. */
  target: { perigeeAltitude: number; apogeeAltitude?: number; inclination: number };
  /** Launch-site latitude [deg], in (−90, 90). */
  latitude: number;
  /** How burn-out relates to the target (default 'direct'); altitude [m] for the other strategies. */
  insertion?: { strategy: InsertionStrategy; altitude?: number };
  /** Lift-off T/W, needed when any loss is left to the correlation. */
  liftoffThrustToWeight?: number;
  /** Loss values; any left out is defaulted from the correlation. */
  losses?: { gravity?: LossInput; drag?: LossInput; steering?: LossInput };
  /** Reserve: a fraction of the total before reserve (e.g. 0.02) or a fixed value [m/s]. */
  reserve?: { fraction: number } | { value: number };
  /** Correlation coefficients (default {@link DEFAULT_LOSS_CORRELATION}). */
  correlation?: LossCorrelation;
}

/** The structured delta-v budget. */
export interface DeltaVBudget {
  terms: {
    insertionSpeed: BudgetTerm;
    gravityLoss: BudgetTerm;
    dragLoss: BudgetTerm;
    steeringLoss: BudgetTerm;
    rotationAssist: BudgetTerm;
    transfer: BudgetTerm;
    planeChange: BudgetTerm;
    reserve: BudgetTerm;
  };
  /** Sum of all term values: the ideal delta-v the vehicle must supply [m/s]. */
  total: number;
  /** gravity + drag + steering [m/s]. */
  ascentLosses: number;
  /** Inertial launch azimuth [deg]. */
  azimuth: number;
  /** Inclination flown by the ascent [deg]. */
  launchInclination: number;
  /** Plane change left after the ascent [deg]. */
  planeChangeAngle: number;
  /** Burn-out altitude [m]. */
  insertionAltitude: number;
  /** Max dynamic pressure estimate from the correlation [Pa] (0 when T/W was not given). */
  estimatedMaxDynamicPressure: number;
}

function lossTerm(
  name: string,
  given: LossInput | undefined,
  fallback: number | undefined,
  fallbackNote: string
): BudgetTerm {
  if (given !== undefined) {
    const v = typeof given === 'number' ? given : given.value;
    if (!(v >= 0 && v <= 1e5)) throw new RangeError(`losses.${name} must be a finite number in [0, 1e5] m/s, got ${v}`);
    if (typeof given === 'number') return { value: v, origin: 'allowance', note: 'user allowance' };
    return { value: v, origin: given.origin, note: given.note ?? (given.origin === 'simulated' ? 'ascent simulation' : 'user allowance') };
  }
  if (fallback === undefined) {
    throw new RangeError(`liftoffThrustToWeight is required when losses.${name} is not given`);
  }
  return { value: fallback, origin: 'allowance', note: fallbackNote };
}

/**
 * Build the delta-v budget for one target orbit and launch site.
 *
 * Formula: total = v_insertion + Δv_gravity + Δv_drag + Δv_steering − ω·R·cos φ·sin β
 * + Δv_transfer + Δv_plane + reserve, with reserve = fraction·(sum of the others) or a value.
 * Orbital terms from {@link insertionToTarget}; the assist along the azimuth of the inclination
 * flown (equal to ω·R·cos i for a direct launch, since sin β = cos i / cos φ).
 *
 * @param input see {@link BudgetInput}.
 * @returns see {@link DeltaVBudget}.
 * @throws RangeError naming the offending field.
 * @see Vallado, Fundamentals of Astrodynamics and Applications, Algorithm 36 and eq. 6-26;
 *   {@link DEFAULT_LOSS_CORRELATION} for the allowances.
 * @example
 * buildDeltaVBudget({ target: { perigeeAltitude: 200e3, inclination: 28.5 }, latitude: 28.5,
 *   liftoffThrustToWeight: 1.3 }).total; // ≈ 9168 m/s
 */
export function buildDeltaVBudget(input: BudgetInput): DeltaVBudget {
  if (!input || typeof input !== 'object') throw new RangeError('input must be an object');
  const t = input.target;
  if (!t || typeof t !== 'object') throw new RangeError('target must be an object');
  const strategy = input.insertion?.strategy ?? 'direct';
  const orbit: InsertionResult = insertionToTargetInto(
    {
      targetPerigeeAltitude: t.perigeeAltitude,
      targetApogeeAltitude: t.apogeeAltitude ?? t.perigeeAltitude,
      targetInclination: t.inclination,
      latitude: input.latitude,
      strategy,
      insertionAltitude: input.insertion?.altitude ?? t.perigeeAltitude
    },
    {
      insertionSpeed: 0,
      insertionAltitude: 0,
      transferDeltaV: 0,
      planeChangeDeltaV: 0,
      launchInclination: 0,
      planeChangeAngle: 0,
      azimuth: 0
    }
  );
  const correlation = input.correlation ?? DEFAULT_LOSS_CORRELATION;
  const est =
    input.liftoffThrustToWeight !== undefined
      ? lossAllowances(input.liftoffThrustToWeight, orbit.insertionAltitude, correlation)
      : undefined;
  const psiText = est ? `T/W ${input.liftoffThrustToWeight}` : '';
  const h = orbit.insertionAltitude;
  const g = correlation.gravity;
  const gravityLoss = lossTerm(
    'gravity',
    input.losses?.gravity,
    est?.gravityLoss,
    `correlation a + b/ψ + c·h = ${g.a} + ${g.b}/ψ + ${g.c}·h at ${psiText}, h ${h} m (${correlation.source})`
  );
  const dragLoss = lossTerm(
    'drag',
    input.losses?.drag,
    est?.dragLoss,
    `correlation d0 + d1·ψ = ${correlation.drag.d0} + ${correlation.drag.d1.toFixed(2)}·ψ at ${psiText} (${correlation.source})`
  );
  const steeringLoss = lossTerm(
    'steering',
    input.losses?.steering,
    est?.steeringLoss,
    `correlation s + sh·h = ${correlation.steering.s} + ${correlation.steering.sh ?? 0}·h at h ${h} m (${correlation.source})`
  );
  // Earth-rotation assist along the azimuth: ω·R·cos φ·sin β.
  const assistValue =
    EARTH.rotationRate * EARTH.radius * Math.cos((input.latitude * Math.PI) / 180) *
    Math.sin((orbit.azimuth * Math.PI) / 180);
  const terms = {
    insertionSpeed: {
      value: orbit.insertionSpeed,
      origin: 'computed' as const,
      note:
        strategy === 'direct'
          ? 'vis-viva speed at the target perigee'
          : strategy === 'parkingOrbit'
            ? 'circular speed of the parking orbit'
            : 'vis-viva speed at the perigee of the transfer ellipse'
    },
    gravityLoss,
    dragLoss,
    steeringLoss,
    rotationAssist: {
      value: -assistValue,
      origin: 'computed' as const,
      note: `ω·R·cos φ·sin β at latitude ${input.latitude}°, azimuth ${orbit.azimuth.toFixed(3)}°`
    },
    transfer: {
      value: orbit.transferDeltaV,
      origin: 'computed' as const,
      note: strategy === 'direct' ? 'none (direct insertion)' : 'coplanar two-impulse (Hohmann-type) transfer'
    },
    planeChange: {
      value: orbit.planeChangeDeltaV,
      origin: 'computed' as const,
      note:
        orbit.planeChangeAngle > 0
          ? `${orbit.planeChangeAngle.toFixed(3)}° at the target apogee (law of cosines)`
          : 'none (inclination reachable directly)'
    },
    reserve: { value: 0, origin: 'allowance' as const, note: 'no reserve requested' }
  };
  let sum = 0;
  for (const k of Object.keys(terms) as Array<keyof typeof terms>) sum += terms[k].value;
  const r = input.reserve;
  if (r !== undefined) {
    if ('fraction' in r) {
      if (!(r.fraction >= 0 && r.fraction <= 1)) throw new RangeError(`reserve.fraction must be in [0, 1], got ${r.fraction}`);
      // Reserve as a fraction of the budget before reserve.
      terms.reserve = { value: r.fraction * sum, origin: 'allowance', note: `${(r.fraction * 100).toFixed(2)} % of the budget before reserve` };
    } else {
      if (!(r.value >= 0 && r.value <= 1e5)) throw new RangeError(`reserve.value must be in [0, 1e5] m/s, got ${r.value}`);
      terms.reserve = { value: r.value, origin: 'allowance', note: 'fixed reserve' };
    }
  }
  const ascentLosses = gravityLoss.value + dragLoss.value + steeringLoss.value;
  return {
    terms,
    total: sum + terms.reserve.value,
    ascentLosses,
    azimuth: orbit.azimuth,
    launchInclination: orbit.launchInclination,
    planeChangeAngle: orbit.planeChangeAngle,
    insertionAltitude: orbit.insertionAltitude,
    estimatedMaxDynamicPressure: est?.maxDynamicPressure ?? 0
  };
}
