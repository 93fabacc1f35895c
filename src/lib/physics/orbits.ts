/**
 * Two-body orbital mechanics for the delta-v budget: circular and vis-viva speeds, Hohmann
 * transfers, plane changes, launch azimuth and Earth-rotation assist. SI units; angles in
 * degrees at the API, radians inside. Constants from ./constants (IERS 2010 / WGS 84).
 */
import { DEG, EARTH } from './constants';

function requireFinite(name: string, value: number, min: number, max: number, unit: string): void {
  if (!(value >= min && value <= max)) {
    throw new RangeError(`${name} must be a finite number in [${min}, ${max}] ${unit}, got ${value}`);
  }
}

/** Largest altitude accepted by the orbit helpers [m] (beyond lunar distance is out of scope). */
export const MAX_ORBIT_ALTITUDE = 4e8;

/**
 * Speed on a circular orbit at a given altitude above the equatorial radius.
 *
 * Formula: v = √(μ / (R + h)).
 *
 * @param altitude altitude above `EARTH.radius` [m], in [0, 4e8].
 * @returns circular orbital speed [m/s].
 * @throws RangeError naming `altitude` when out of range or not finite.
 * @see Vallado, Fundamentals of Astrodynamics and Applications, eq. 1-35 (circular speed).
 * @example
 * circularSpeed(200e3); // ≈ 7784.26 m/s
 */
export function circularSpeed(altitude: number): number {
  requireFinite('altitude', altitude, 0, MAX_ORBIT_ALTITUDE, 'm');
  // Circular speed from the vis-viva equation with a = r.
  return Math.sqrt(EARTH.mu / (EARTH.radius + altitude));
}

/**
 * Vis-viva speed at radius r on an orbit of semi-major axis a.
 *
 * Formula: v = √(μ·(2/r − 1/a)).
 *
 * @param radius distance from Earth's centre [m], > 0.
 * @param semiMajorAxis semi-major axis [m], > 0 and ≥ radius/2 (bound orbit through r).
 * @returns speed [m/s].
 * @throws RangeError naming the parameter.
 * @see Vallado, Fundamentals of Astrodynamics and Applications, eq. 1-31 (vis-viva).
 * @example
 * visVivaSpeed(6578137, 6578137); // ≈ 7784.3 m/s (circular)
 */
export function visVivaSpeed(radius: number, semiMajorAxis: number): number {
  requireFinite('radius', radius, 1, Number.MAX_VALUE, 'm');
  requireFinite('semiMajorAxis', semiMajorAxis, radius / 2, Number.MAX_VALUE, 'm');
  // Vis-viva energy equation.
  return Math.sqrt(EARTH.mu * (2 / radius - 1 / semiMajorAxis));
}

/**
 * Speed at perigee of an ellipse given perigee and apogee altitudes.
 *
 * Formula: v_p = √(μ·(2/r_p − 2/(r_p + r_a))), r = R + h.
 *
 * @param perigeeAltitude [m], in [0, 4e8].
 * @param apogeeAltitude [m], ≥ perigeeAltitude, ≤ 4e8.
 * @returns perigee speed [m/s].
 * @throws RangeError naming the parameter.
 * @see Vallado, Fundamentals of Astrodynamics and Applications, eq. 1-31 (vis-viva).
 * @example
 * perigeeSpeed(200e3, 35786e3); // ≈ 10238.8 m/s (geostationary transfer orbit)
 */
export function perigeeSpeed(perigeeAltitude: number, apogeeAltitude: number): number {
  requireFinite('perigeeAltitude', perigeeAltitude, 0, MAX_ORBIT_ALTITUDE, 'm');
  requireFinite('apogeeAltitude', apogeeAltitude, perigeeAltitude, MAX_ORBIT_ALTITUDE, 'm');
  const rp = EARTH.radius + perigeeAltitude;
  const ra = EARTH.radius + apogeeAltitude;
  // Vis-viva at r = r_p with a = (r_p + r_a)/2.
  return Math.sqrt(EARTH.mu * (2 / rp - 2 / (rp + ra)));
}

/**
 * Speed at apogee of an ellipse given perigee and apogee altitudes.
 *
 * Formula: v_a = √(μ·(2/r_a − 2/(r_p + r_a))).
 *
 * @param perigeeAltitude [m], in [0, 4e8].
 * @param apogeeAltitude [m], ≥ perigeeAltitude, ≤ 4e8.
 * @returns apogee speed [m/s].
 * @throws RangeError naming the parameter.
 * @see Vallado, Fundamentals of Astrodynamics and Applications, eq. 1-31 (vis-viva).
 * @example
 * apogeeSpeed(200e3, 35786e3); // ≈ 1597.4 m/s
 */
export function apogeeSpeed(perigeeAltitude: number, apogeeAltitude: number): number {
  requireFinite('perigeeAltitude', perigeeAltitude, 0, MAX_ORBIT_ALTITUDE, 'm');
  requireFinite('apogeeAltitude', apogeeAltitude, perigeeAltitude, MAX_ORBIT_ALTITUDE, 'm');
  const rp = EARTH.radius + perigeeAltitude;
  const ra = EARTH.radius + apogeeAltitude;
  // Vis-viva at r = r_a with a = (r_p + r_a)/2.
  return Math.sqrt(EARTH.mu * (2 / ra - 2 / (rp + ra)));
}

/** Delta-v of a two-impulse Hohmann transfer [m/s]. */
export interface HohmannTransfer {
  /** First burn, at r1 (magnitude) [m/s]. */
  dv1: number;
  /** Second burn, at r2 (magnitude) [m/s]. */
  dv2: number;
  /** dv1 + dv2 [m/s]. */
  total: number;
}

/**
 * Hohmann transfer between coplanar circular orbits of radii r1 and r2 (either direction).
 *
 * Formula: Δv1 = √(μ/r1)·|√(2r2/(r1+r2)) − 1|, Δv2 = √(μ/r2)·|1 − √(2r1/(r1+r2))|.
 *
 * @param r1 radius of the initial circular orbit from Earth's centre [m], > 0.
 * @param r2 radius of the final circular orbit [m], > 0.
 * @returns `{ dv1, dv2, total }` [m/s].
 * @throws RangeError naming `r1` or `r2`.
 * @see Vallado, Fundamentals of Astrodynamics and Applications, Algorithm 36 (Hohmann transfer).
 * @example
 * hohmann(6678137, 42164000).total; // ≈ 3893 m/s (300 km parking orbit to geostationary radius)
 */
export function hohmann(r1: number, r2: number): HohmannTransfer {
  requireFinite('r1', r1, 1, Number.MAX_VALUE, 'm');
  requireFinite('r2', r2, 1, Number.MAX_VALUE, 'm');
  const sum = r1 + r2;
  // Hohmann first burn: circular speed at r1 to transfer-ellipse perigee/apogee speed.
  const dv1 = Math.abs(Math.sqrt(EARTH.mu / r1) * (Math.sqrt((2 * r2) / sum) - 1));
  // Hohmann second burn: transfer-ellipse speed at r2 to circular speed at r2.
  const dv2 = Math.abs(Math.sqrt(EARTH.mu / r2) * (1 - Math.sqrt((2 * r1) / sum)));
  return { dv1, dv2, total: dv1 + dv2 };
}

/**
 * Single burn that changes speed from v1 to v2 while rotating the orbit plane by Δi.
 *
 * Formula (law of cosines): Δv = √(v1² + v2² − 2·v1·v2·cos Δi). With v1 = v2 = v this is the
 * simple plane change 2·v·sin(Δi/2).
 *
 * @param v1 speed before the burn [m/s], ≥ 0.
 * @param v2 speed after the burn [m/s], ≥ 0.
 * @param deltaInclination plane rotation [deg], in [0, 180].
 * @returns burn magnitude [m/s].
 * @throws RangeError naming the parameter.
 * @see Vallado, Fundamentals of Astrodynamics and Applications, eq. 6-26 (combined plane change).
 * @example
 * combinedPlaneChange(1597, 3075, 28.5); // ≈ 1837 m/s (apogee burn of a transfer to geostationary)
 */
export function combinedPlaneChange(v1: number, v2: number, deltaInclination: number): number {
  requireFinite('v1', v1, 0, 1e6, 'm/s');
  requireFinite('v2', v2, 0, 1e6, 'm/s');
  requireFinite('deltaInclination', deltaInclination, 0, 180, 'deg');
  // Law of cosines on the velocity triangle.
  const d2 = v1 * v1 + v2 * v2 - 2 * v1 * v2 * Math.cos(deltaInclination * DEG);
  return Math.sqrt(d2 > 0 ? d2 : 0);
}

/**
 * Launch azimuth (inertial) of the northward launch that reaches an orbit of inclination i
 * directly from latitude φ.
 *
 * Formula (spherical trigonometry): sin β = cos i / cos φ. Prograde orbits (i ≤ 90°) give a
 * north-east azimuth in [0°, 90°]; retrograde orbits give the north-west azimuth 360° + β in
 * (270°, 360°). The southward alternative is 180° − β. Reachable when |φ| ≤ i ≤ 180° − |φ|.
 * The rotating-frame correction is {@link launchAzimuthRotating}.
 *
 * @param latitude geodetic latitude of the launch site [deg], in (−90, 90).
 * @param inclination target inclination [deg], in [0, 180].
 * @returns azimuth from north, clockwise [deg].
 * @throws RangeError naming `latitude` or `inclination`; the message for an unreachable
 *   inclination states the reachable interval.
 * @see Vallado, Fundamentals of Astrodynamics and Applications, §6.4 (launch azimuth),
 *   cos i = cos φ · sin β.
 * @example
 * launchAzimuth(28.5, 51.6); // ≈ 44.98°
 */
export function launchAzimuth(latitude: number, inclination: number): number {
  requireFinite('latitude', latitude, -89.999999, 89.999999, 'deg');
  requireFinite('inclination', inclination, 0, 180, 'deg');
  const absLat = Math.abs(latitude);
  if (inclination < absLat - 1e-9 || inclination > 180 - absLat + 1e-9) {
    throw new RangeError(
      `inclination ${inclination}° is not reachable directly from latitude ${latitude}°: ` +
        `it must lie in [${absLat}, ${180 - absLat}] deg (a dog-leg or plane change is needed)`
    );
  }
  // Spherical trigonometry: sin β = cos i / cos φ (clamped for round-off at i = |φ|).
  let s = Math.cos(inclination * DEG) / Math.cos(latitude * DEG);
  if (s > 1) s = 1;
  else if (s < -1) s = -1;
  const beta = Math.asin(s) / DEG;
  return beta >= 0 ? beta : 360 + beta;
}

/**
 * Launch azimuth in the Earth-fixed (rotating) frame, i.e. the heading the vehicle flies
 * relative to the ground to end on the inertial azimuth of {@link launchAzimuth}.
 *
 * Formula: tan β_rot = (v·sin β − ω·R·cos φ) / (v·cos β), with v the inertial orbital speed.
 *
 * @param latitude launch-site latitude [deg], in (−90, 90).
 * @param inclination target inclination [deg], reachable from the latitude.
 * @param orbitalSpeed inertial speed at insertion [m/s], in (0, 1e5].
 * @returns rotating-frame azimuth [deg], in [0, 360).
 * @throws RangeError naming the parameter.
 * @see Vallado, Fundamentals of Astrodynamics and Applications, §6.4 (rotating-Earth correction).
 * @example
 * launchAzimuthRotating(28.5, 51.6, 7788); // ≈ 42.77°
 */
export function launchAzimuthRotating(latitude: number, inclination: number, orbitalSpeed: number): number {
  requireFinite('orbitalSpeed', orbitalSpeed, 1e-9, 1e5, 'm/s');
  const beta = launchAzimuth(latitude, inclination) * DEG;
  // Subtract the site's eastward surface velocity from the inertial velocity vector.
  const east = orbitalSpeed * Math.sin(beta) - EARTH.rotationRate * EARTH.radius * Math.cos(latitude * DEG);
  const north = orbitalSpeed * Math.cos(beta);
  const az = Math.atan2(east, north) / DEG;
  return az >= 0 ? az : az + 360;
}

/**
 * Earth-rotation assist: component of the site's eastward surface velocity along the launch
 * azimuth (negative for westward launches).
 *
 * Formula: Δv_rot = ω·R·cos φ·sin β, with ω and R of WGS 84 (spherical Earth).
 *
 * @param latitude launch-site latitude [deg], in [−90, 90].
 * @param azimuth launch azimuth from north, clockwise [deg], in [−360, 360].
 * @returns assist [m/s]; 465.10 m/s due east at the equator.
 * @throws RangeError naming the parameter.
 * @see NGA.STND.0036 (WGS 84) Table 3.1 for ω and a; the projection is elementary kinematics.
 * @example
 * rotationAssist(0, 90); // ≈ 465.10 m/s
 */
export function rotationAssist(latitude: number, azimuth: number): number {
  requireFinite('latitude', latitude, -90, 90, 'deg');
  requireFinite('azimuth', azimuth, -360, 360, 'deg');
  // Surface speed ω·R·cos φ projected onto the azimuth.
  return EARTH.rotationRate * EARTH.radius * Math.cos(latitude * DEG) * Math.sin(azimuth * DEG);
}

/** How the vehicle reaches the target orbit. */
export type InsertionStrategy =
  /** Burn-out directly on the target orbit, at its perigee. */
  | 'direct'
  /** Burn-out on a circular parking orbit at `insertionAltitude`, then a two-impulse transfer. */
  | 'parkingOrbit'
  /** Burn-out at `insertionAltitude` as the perigee of a transfer ellipse reaching the target
   *  apogee, then one apogee burn (the ascent itself supplies the first Hohmann impulse). */
  | 'transferOrbit';

/** Input of {@link insertionToTarget}. */
export interface InsertionInput {
  /** Target perigee altitude [m], ≥ 0. */
  targetPerigeeAltitude: number;
  /** Target apogee altitude [m], ≥ perigee (equal for a circular target). */
  targetApogeeAltitude: number;
  /** Target inclination [deg], in [0, 180]. */
  targetInclination: number;
  /** Launch-site latitude [deg], in (−90, 90). */
  latitude: number;
  /** Insertion strategy. */
  strategy: InsertionStrategy;
  /** Burn-out altitude for 'parkingOrbit' and 'transferOrbit' [m], in [0, target perigee]. */
  insertionAltitude: number;
}

/** Result of {@link insertionToTarget}; all speeds [m/s], angles [deg]. */
export interface InsertionResult {
  /** Inertial speed at burn-out (horizontal), the budget's orbital term. */
  insertionSpeed: number;
  /** Altitude of burn-out [m]. */
  insertionAltitude: number;
  /** Sum of the coplanar transfer burns after burn-out (excluding the plane-change share). */
  transferDeltaV: number;
  /** Extra delta-v due to the plane change (combined burn minus its coplanar part). */
  planeChangeDeltaV: number;
  /** Inclination flown by the ascent: the target's if reachable, else the nearest reachable. */
  launchInclination: number;
  /** Plane change still needed after the ascent [deg]. */
  planeChangeAngle: number;
  /** Inertial launch azimuth for `launchInclination` [deg]. */
  azimuth: number;
}

/**
 * Delta-v from burn-out to the target orbit, with the plane change that a target inclination
 * below the site latitude requires (done at the target apogee, the slowest point, combined with
 * the apogee burn by the law of cosines).
 *
 * Formulas: vis-viva speeds v_p, v_a; Hohmann-type two-impulse transfer from a circular parking
 * orbit r_park to (r_pt, r_at): Δv1 = v_p(r_park, r_at) − v_c(r_park), Δv2 = the law-of-cosines
 * burn from v_a(r_park, r_at) to v_a(r_pt, r_at) through Δi. 'direct' with Δi > 0: a plane change
 * 2·v_a·sin(Δi/2) at the target apogee. Δi = |φ| − i when i < |φ| (or i − (180° − |φ|)).
 *
 * @param input see {@link InsertionInput}.
 * @returns see {@link InsertionResult}.
 * @throws RangeError naming the offending field.
 * @see Vallado, Fundamentals of Astrodynamics and Applications, Algorithms 36–37 and eq. 6-26.
 * @example
 * insertionToTarget({ targetPerigeeAltitude: 35786e3, targetApogeeAltitude: 35786e3,
 *   targetInclination: 0, latitude: 28.5, strategy: 'parkingOrbit', insertionAltitude: 200e3 });
 * // insertionSpeed ≈ 7784.3, transferDeltaV ≈ 3931.9 (coplanar), planeChangeDeltaV ≈ 359.2
 */
export function insertionToTarget(input: InsertionInput): InsertionResult {
  const out: InsertionResult = {
    insertionSpeed: 0,
    insertionAltitude: 0,
    transferDeltaV: 0,
    planeChangeDeltaV: 0,
    launchInclination: 0,
    planeChangeAngle: 0,
    azimuth: 0
  };
  return insertionToTargetInto(input, out);
}

/**
 * Same as {@link insertionToTarget}, writing into `out` (no allocation, for the sweep hot path).
 *
 * @param input see {@link InsertionInput}.
 * @param out receives the result; returned.
 * @returns `out`.
 * @throws RangeError naming the offending field.
 * @see {@link insertionToTarget}.
 * @example
 * const r = insertionToTarget(input);
 * insertionToTargetInto(nextInput, r); // reuse r across cases
 */
export function insertionToTargetInto(input: InsertionInput, out: InsertionResult): InsertionResult {
  const hp = input.targetPerigeeAltitude;
  const ha = input.targetApogeeAltitude;
  const inc = input.targetInclination;
  const lat = input.latitude;
  requireFinite('targetPerigeeAltitude', hp, 0, MAX_ORBIT_ALTITUDE, 'm');
  requireFinite('targetApogeeAltitude', ha, hp, MAX_ORBIT_ALTITUDE, 'm');
  requireFinite('targetInclination', inc, 0, 180, 'deg');
  requireFinite('latitude', lat, -89.999999, 89.999999, 'deg');
  const absLat = Math.abs(lat);
  // Nearest directly reachable inclination and the remaining plane change.
  let launchInc = inc;
  if (inc < absLat) launchInc = absLat;
  else if (inc > 180 - absLat) launchInc = 180 - absLat;
  const dInc = Math.abs(launchInc - inc);
  const mu = EARTH.mu;
  const rpt = EARTH.radius + hp;
  const rat = EARTH.radius + ha;
  // Target orbit speeds at its apogee (vis-viva).
  const vaTarget = Math.sqrt(mu * (2 / rat - 2 / (rpt + rat)));
  const cosDi = Math.cos(dInc * DEG);
  let insertionSpeed: number;
  let insertionAltitude: number;
  let transfer = 0;
  let plane = 0;
  if (input.strategy === 'direct') {
    insertionAltitude = hp;
    // Vis-viva at the target perigee.
    insertionSpeed = Math.sqrt(mu * (2 / rpt - 2 / (rpt + rat)));
    // Simple plane change at apogee: 2·v·sin(Δi/2).
    plane = dInc > 0 ? 2 * vaTarget * Math.sin((dInc * DEG) / 2) : 0;
  } else if (input.strategy === 'parkingOrbit' || input.strategy === 'transferOrbit') {
    const hi = input.insertionAltitude;
    requireFinite('insertionAltitude', hi, 0, hp, 'm');
    insertionAltitude = hi;
    const ri = EARTH.radius + hi;
    // Transfer ellipse (r_i, r_at): vis-viva at its perigee and apogee.
    const vpTransfer = Math.sqrt(mu * (2 / ri - 2 / (ri + rat)));
    const vaTransfer = Math.sqrt(mu * (2 / rat - 2 / (ri + rat)));
    // Apogee burn, coplanar part and combined with the plane change (law of cosines).
    const coplanar = Math.abs(vaTarget - vaTransfer);
    if (dInc > 0) {
      const d2 = vaTransfer * vaTransfer + vaTarget * vaTarget - 2 * vaTransfer * vaTarget * cosDi;
      plane = Math.sqrt(d2 > 0 ? d2 : 0) - coplanar;
    }
    if (input.strategy === 'parkingOrbit') {
      // Circular parking orbit speed, then the Hohmann-type first burn.
      insertionSpeed = Math.sqrt(mu / ri);
      transfer = vpTransfer - insertionSpeed + coplanar;
    } else {
      insertionSpeed = vpTransfer;
      transfer = coplanar;
    }
  } else {
    throw new RangeError(
      `strategy must be 'direct', 'parkingOrbit' or 'transferOrbit', got ${String(input.strategy)}`
    );
  }
  out.insertionSpeed = insertionSpeed;
  out.insertionAltitude = insertionAltitude;
  out.transferDeltaV = transfer;
  out.planeChangeDeltaV = plane;
  out.launchInclination = launchInc;
  out.planeChangeAngle = dInc;
  out.azimuth = launchAzimuth(lat, launchInc);
  return out;
}
