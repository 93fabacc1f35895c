/**
 * The trajectory of one ascent-mode case, recomputed on demand (never stored): the vehicle of
 * the evaluated case (SWEEP-CORE's detail: stage masses, thrust and Isp), its payload and the
 * targeted controls, flown once more by the physics core's `simulateAscent` with trajectory
 * samples. SWEEP-CORE's evaluator has no trajectory option, so this re-flight rebuilds the
 * vehicle from the detail; the default vertical-rise time follows from the nominal payload,
 * which the evaluator may have taken from its budget estimate, so the re-flight is checked
 * against the evaluated burn-out and the check is returned with the samples.
 */
import { simulateAscent } from '../../physics/ascent';
import type { CaseDetail } from '../../sweep/evaluate';
import type { SweepSpec } from '../../sweep/spec';

export interface TrajectoryOut {
  time: number[];
  altitude: number[];
  downrange: number[];
  speed: number[];
  flightPathAngle: number[];
  dynamicPressure: number[];
  acceleration: number[];
  /** Burn-out of this re-flight against the evaluator's: altitude [m] and speed [m/s] differences. */
  check: { altitudeDifference: number; speedDifference: number; consistent: boolean };
}

export function ascentTrajectory(spec: SweepSpec, detail: CaseDetail | null, payloadMass: number | null): TrajectoryOut | null {
  if (spec.mode !== 'ascent' || !detail?.ascent || payloadMass === null || !(payloadMass >= 0)) return null;
  const a = spec.ascent as Record<string, number | undefined>;
  const stages = detail.stages.map((s, i) => ({
    propellantMass: s.propellantMass,
    dryMass: s.dryMass,
    thrustVacuum: s.thrustVacuum,
    ispVacuum: s.ispVacuum,
    // As the evaluator does: an upper stage's sea-level Isp below 1 s is raised to 1 s.
    ispSeaLevel: i === 0 ? s.ispSeaLevel : Math.max(1, s.ispSeaLevel)
  }));
  if (!stages.every((s) => s.propellantMass > 0 && s.thrustVacuum > 0)) return null;
  const timeStep =
    a.timeStepAtmosphere !== undefined || a.timeStepVacuum !== undefined ? { atmosphere: a.timeStepAtmosphere, vacuum: a.timeStepVacuum } : undefined;
  const flight = simulateAscent(
    {
      stages,
      referenceArea: spec.baseline.referenceArea,
      dragCoefficient: spec.baseline.dragCoefficient,
      verticalRiseTime: a.verticalRiseTime,
      nominalPayloadMass: payloadMass
    },
    payloadMass,
    { pitchKick: detail.ascent.pitchKick, finalPitch: detail.ascent.finalPitch },
    { timeStep, trajectory: true }
  );
  const t = flight.trajectory;
  if (!t) return null;
  const dh = flight.burnout.altitude - detail.ascent.burnoutAltitude;
  const dv = flight.burnout.speed - detail.ascent.burnoutSpeed;
  return {
    time: t.time,
    altitude: t.altitude,
    downrange: t.downrange,
    speed: t.speed,
    flightPathAngle: t.flightPathAngle,
    dynamicPressure: t.dynamicPressure,
    acceleration: t.acceleration,
    // Within the targeting tolerances of the core (50 m, 0.5 m/s by default), with room for the step size.
    check: { altitudeDifference: dh, speedDifference: dv, consistent: Math.abs(dh) <= 500 && Math.abs(dv) <= 5 }
  };
}

