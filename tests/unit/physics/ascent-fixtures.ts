/**
 * Invented test vehicles for the ascent tests (no real vehicle data): a notional two-stage
 * kerosene/oxygen-class launcher with round numbers, lift-off T/W ≈ 1.3.
 */
import { DEFAULT_DRAG_COEFFICIENT } from '../../../src/lib/physics/drag';
import type { AscentStage, AscentVehicle, GravityTurnInput } from '../../../src/lib/physics/ascent';

/** Notional two-stage vehicle: 400 t + 100 t of propellant, Isp 290/320 s and 250/345 s. */
export function notionalStages(liftOffThrustScale = 1): AscentStage[] {
  return [
    { propellantMass: 400e3, dryMass: 28e3, thrustVacuum: 7.7e6 * liftOffThrustScale, ispVacuum: 320, ispSeaLevel: 290 },
    { propellantMass: 100e3, dryMass: 7e3, thrustVacuum: 1.0e6, ispVacuum: 345, ispSeaLevel: 250 }
  ];
}

/** The gravity-turn problem of DESIGN.md §3 on the notional vehicle (burnout near 300 km, γ ≈ 0). */
export function notionalGravityTurn(): GravityTurnInput {
  return {
    stages: notionalStages(),
    payloadMass: 15e3,
    referenceArea: 10,
    dragCoefficient: DEFAULT_DRAG_COEFFICIENT,
    verticalRiseTime: 10,
    pitchKick: 0.2
  };
}

/**
 * The notional vehicle for ascent mode (10 s vertical rise, or 'default': until ≈ 50 m/s with a
 * 15 t payload assumed), steering from the second stage.
 */
export function notionalVehicle(liftOffThrustScale = 1, verticalRiseTime: number | 'default' = 10): AscentVehicle {
  return {
    stages: notionalStages(liftOffThrustScale),
    referenceArea: 10,
    dragCoefficient: DEFAULT_DRAG_COEFFICIENT,
    verticalRiseTime: verticalRiseTime === 'default' ? undefined : verticalRiseTime,
    nominalPayloadMass: 15e3
  };
}

/** Every number inside a value (recursively), for "never NaN" checks. */
export function allNumbers(value: unknown, path = 'result', out: Array<[string, number]> = []): Array<[string, number]> {
  if (typeof value === 'number') out.push([path, value]);
  else if (Array.isArray(value)) value.forEach((v, i) => allNumbers(v, `${path}[${i}]`, out));
  else if (value && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) allNumbers(v, `${path}.${k}`, out);
  }
  return out;
}
