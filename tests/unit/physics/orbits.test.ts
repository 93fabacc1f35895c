import { describe, expect, it } from 'vitest';
import {
  apogeeSpeed,
  circularSpeed,
  combinedPlaneChange,
  hohmann,
  insertionToTarget,
  launchAzimuth,
  launchAzimuthRotating,
  perigeeSpeed,
  rotationAssist,
  visVivaSpeed
} from '../../../src/lib/physics/orbits';

// Published constants, typed here independently of src/lib/physics/constants.ts:
// GM = 3.986004418e14 m³/s² (IERS Conventions 2010, Table 1.1); a = 6378137 m and
// ω = 7.292115e-5 rad/s (WGS 84, NGA.STND.0036 Table 3.1).
const MU = 3.986004418e14;
const RE = 6378137;
const OMEGA = 7.292115e-5;

describe('circular and vis-viva speeds', () => {
  it('circular speed at 200 km equals √(GM/(a + h)) from the published constants', () => {
    // Independent arithmetic: √(3.986004418e14 / 6578137) = 7784.2617 m/s.
    const expected = Math.sqrt(MU / (RE + 200e3));
    expect(Math.abs(circularSpeed(200e3) - expected)).toBeLessThan(1e-9);
    // "7.8 km/s class" (common practice).
    expect(circularSpeed(200e3)).toBeGreaterThan(7700);
    expect(circularSpeed(200e3)).toBeLessThan(7900);
  });

  it('geostationary radius 42164 km gives ≈ 3.0747 km/s (from memory, textbook value 3.075 km/s)', () => {
    expect(Math.abs(circularSpeed(42164e3 - RE) - 3074.7)).toBeLessThan(0.5);
  });

  it('falls with altitude', () => {
    let prev = Infinity;
    for (let h = 0; h <= 40000e3; h += 1000e3) {
      const v = circularSpeed(h);
      expect(v).toBeLessThan(prev);
      prev = v;
    }
  });

  it('vis-viva reduces to the circular speed when a = r, and perigee/apogee speeds conserve angular momentum', () => {
    const r = RE + 500e3;
    expect(Math.abs(visVivaSpeed(r, r) - circularSpeed(500e3))).toBeLessThan(1e-9);
    // r_p·v_p = r_a·v_a (Kepler's second law) for a 200 × 35786 km transfer ellipse.
    const rp = RE + 200e3;
    const ra = RE + 35786e3;
    const lhs = rp * perigeeSpeed(200e3, 35786e3);
    const rhs = ra * apogeeSpeed(200e3, 35786e3);
    expect(Math.abs(lhs / rhs - 1)).toBeLessThan(1e-12);
  });

  it.each([
    [() => circularSpeed(-1), /altitude/],
    [() => circularSpeed(NaN), /altitude/],
    [() => circularSpeed(Infinity), /altitude/],
    [() => perigeeSpeed(300e3, 200e3), /apogeeAltitude/],
    [() => visVivaSpeed(7e6, 3e6), /semiMajorAxis/]
  ])('bad input %# throws a RangeError naming the parameter', (fn, name) => {
    expect(fn).toThrow(RangeError);
    expect(fn).toThrow(name);
  });
});

describe('hohmann', () => {
  const r1 = RE + 300e3;
  const rGeo = 42164e3;

  it('LEO (300 km) → GEO (42,164 km) costs ≈ 3.89 km/s (textbook figure, from memory: 2.43 + 1.47 km/s)', () => {
    const t = hohmann(r1, rGeo);
    expect(Math.abs(t.total - 3893)).toBeLessThan(10);
    expect(Math.abs(t.dv1 - 2426)).toBeLessThan(5);
    expect(Math.abs(t.dv2 - 1467)).toBeLessThan(5);
    expect(t.total).toBe(t.dv1 + t.dv2);
  });

  it('matches independent vis-viva arithmetic from the published constants', () => {
    const a = (r1 + rGeo) / 2;
    const dv1 = Math.sqrt(MU * (2 / r1 - 1 / a)) - Math.sqrt(MU / r1);
    const dv2 = Math.sqrt(MU / rGeo) - Math.sqrt(MU * (2 / rGeo - 1 / a));
    const t = hohmann(r1, rGeo);
    expect(Math.abs(t.dv1 - dv1)).toBeLessThan(1e-9);
    expect(Math.abs(t.dv2 - dv2)).toBeLessThan(1e-9);
  });

  it('is symmetric (lowering costs the same as raising) and zero between equal orbits', () => {
    const up = hohmann(r1, rGeo);
    const down = hohmann(rGeo, r1);
    expect(Math.abs(up.total - down.total)).toBeLessThan(1e-9);
    expect(hohmann(r1, r1).total).toBe(0);
  });

  it('throws a RangeError naming r1 / r2', () => {
    expect(() => hohmann(0, rGeo)).toThrow(/r1/);
    expect(() => hohmann(r1, NaN)).toThrow(/r2/);
  });
});

describe('plane changes', () => {
  it('reduces to |v2 − v1| without rotation and to 2·v·sin(Δi/2) at constant speed (law of cosines)', () => {
    expect(Math.abs(combinedPlaneChange(7000, 7500, 0) - 500)).toBeLessThan(1e-9);
    const v = 7784;
    expect(Math.abs(combinedPlaneChange(v, v, 10) - 2 * v * Math.sin((5 * Math.PI) / 180))).toBeLessThan(1e-9);
    expect(Math.abs(combinedPlaneChange(v, v, 60) - v)).toBeLessThan(1e-9);
  });

  it('apogee burn of a transfer to geostationary orbit with a 28.5° plane change ≈ 1.8 km/s (textbook, from memory)', () => {
    const dv = combinedPlaneChange(apogeeSpeed(200e3, 35786e3), circularSpeed(35786e3), 28.5);
    expect(dv).toBeGreaterThan(1800);
    expect(dv).toBeLessThan(1870);
  });

  it('throws for a rotation outside [0, 180]', () => {
    expect(() => combinedPlaneChange(1, 1, 181)).toThrow(/deltaInclination/);
  });
});

describe('launchAzimuth', () => {
  it('28.5° latitude to 51.6° inclination: sin β = cos i / cos φ gives 44.98° (spherical trigonometry; from memory, textbook example)', () => {
    expect(Math.abs(launchAzimuth(28.5, 51.6) - 44.98)).toBeLessThan(0.01);
  });

  it('is due east when the inclination equals the latitude and due north for a polar orbit', () => {
    expect(launchAzimuth(28.5, 28.5)).toBeCloseTo(90, 9);
    expect(launchAzimuth(0, 0)).toBeCloseTo(90, 9);
    expect(launchAzimuth(40, 90)).toBeCloseTo(0, 9);
    expect(launchAzimuth(-30, 45)).toBeCloseTo(launchAzimuth(30, 45), 12);
  });

  it('gives north-west azimuths for retrograde orbits (e.g. 98° from 34°)', () => {
    const az = launchAzimuth(34, 98);
    expect(az).toBeGreaterThan(270);
    expect(az).toBeLessThan(360);
  });

  it('reproduces the inclination of the orbit flown (independent check with h = r × v)', () => {
    for (const lat of [0, 5.2, 28.5, 45, 62.8]) {
      for (const inc of [lat, lat + 3, 51.6, 70, 90, 98, 120]) {
        if (inc < lat || inc > 180 - lat) continue;
        const beta = (launchAzimuth(lat, inc) * Math.PI) / 180;
        const phi = (lat * Math.PI) / 180;
        // Site at longitude 0: r = (cos φ, 0, sin φ); east = (0, 1, 0); north = (−sin φ, 0, cos φ).
        const r = [Math.cos(phi), 0, Math.sin(phi)];
        const v = [-Math.sin(phi) * Math.cos(beta), Math.sin(beta), Math.cos(phi) * Math.cos(beta)];
        const h = [r[1] * v[2] - r[2] * v[1], r[2] * v[0] - r[0] * v[2], r[0] * v[1] - r[1] * v[0]];
        const got = (Math.acos(h[2] / Math.hypot(h[0], h[1], h[2])) * 180) / Math.PI;
        expect(Math.abs(got - inc), `lat ${lat}, inc ${inc}`).toBeLessThan(1e-6);
      }
    }
  });

  it('throws a RangeError naming inclination when it is below the latitude (dog-leg needed), and for bad latitude', () => {
    expect(() => launchAzimuth(45, 30)).toThrow(RangeError);
    expect(() => launchAzimuth(45, 30)).toThrow(/inclination/);
    expect(() => launchAzimuth(45, 140)).toThrow(/inclination/);
    expect(() => launchAzimuth(95, 100)).toThrow(/latitude/);
    expect(() => launchAzimuth(10, NaN)).toThrow(/inclination/);
  });

  it('rotating-frame azimuth: due east stays due east; north-east launches aim more to the north', () => {
    expect(launchAzimuthRotating(28.5, 28.5, 7800)).toBeCloseTo(90, 9);
    const inertial = launchAzimuth(28.5, 51.6);
    const rotating = launchAzimuthRotating(28.5, 51.6, 7800);
    expect(rotating).toBeLessThan(inertial);
    expect(inertial - rotating).toBeGreaterThan(1);
    expect(inertial - rotating).toBeLessThan(4);
  });
});

describe('rotationAssist', () => {
  it('is ω·a = 465.10 m/s due east at the equator (WGS 84 ω and a)', () => {
    expect(Math.abs(rotationAssist(0, 90) - 465.1)).toBeLessThan(0.01);
    expect(Math.abs(rotationAssist(0, 90) - OMEGA * RE)).toBeLessThan(1e-9);
  });

  it('equals ω·a·cos i along the direct-launch azimuth (since sin β = cos i / cos φ)', () => {
    for (const [lat, inc] of [[28.5, 51.6], [45, 60], [5, 5], [34, 98]]) {
      const got = rotationAssist(lat, launchAzimuth(lat, inc));
      expect(Math.abs(got - OMEGA * RE * Math.cos((inc * Math.PI) / 180))).toBeLessThan(1e-6);
    }
  });

  it('is negative for westward launches and zero due north', () => {
    expect(rotationAssist(30, 270)).toBeLessThan(0);
    expect(Math.abs(rotationAssist(30, 0))).toBeLessThan(1e-12);
    expect(() => rotationAssist(91, 90)).toThrow(/latitude/);
    expect(() => rotationAssist(0, NaN)).toThrow(/azimuth/);
  });
});

describe('insertionToTarget', () => {
  const base = { targetInclination: 28.5, latitude: 28.5, insertionAltitude: 200e3 };

  it("'parkingOrbit' to a higher circular orbit equals a Hohmann transfer", () => {
    const r = insertionToTarget({ ...base, targetPerigeeAltitude: 800e3, targetApogeeAltitude: 800e3, strategy: 'parkingOrbit' });
    expect(Math.abs(r.insertionSpeed - circularSpeed(200e3))).toBeLessThan(1e-9);
    expect(Math.abs(r.transferDeltaV - hohmann(RE + 200e3, RE + 800e3).total)).toBeLessThan(1e-9);
    expect(r.planeChangeDeltaV).toBe(0);
  });

  it("'transferOrbit' inserts at the ellipse's perigee and pays only the apogee burn", () => {
    const r = insertionToTarget({ ...base, targetPerigeeAltitude: 800e3, targetApogeeAltitude: 800e3, strategy: 'transferOrbit' });
    expect(Math.abs(r.insertionSpeed - perigeeSpeed(200e3, 800e3))).toBeLessThan(1e-9);
    expect(Math.abs(r.transferDeltaV - hohmann(RE + 200e3, RE + 800e3).dv2)).toBeLessThan(1e-9);
  });

  it("'direct' to an elliptical target inserts at its perigee at the vis-viva speed", () => {
    const r = insertionToTarget({ ...base, targetPerigeeAltitude: 250e3, targetApogeeAltitude: 1000e3, strategy: 'direct' });
    expect(Math.abs(r.insertionSpeed - perigeeSpeed(250e3, 1000e3))).toBeLessThan(1e-9);
    expect(r.transferDeltaV).toBe(0);
  });

  it('adds the plane change when the inclination is below the site latitude (launch due east, 2·v·sin(Δi/2) at apogee)', () => {
    const r = insertionToTarget({ ...base, targetInclination: 0, targetPerigeeAltitude: 400e3, targetApogeeAltitude: 400e3, strategy: 'direct' });
    expect(r.launchInclination).toBe(28.5);
    expect(r.azimuth).toBeCloseTo(90, 9);
    expect(r.planeChangeAngle).toBe(28.5);
    expect(Math.abs(r.planeChangeDeltaV - 2 * circularSpeed(400e3) * Math.sin((14.25 * Math.PI) / 180))).toBeLessThan(1e-6);
  });

  it('combines the plane change with the apogee burn of a geostationary transfer (cheaper than two separate burns)', () => {
    const r = insertionToTarget({ ...base, targetInclination: 0, targetPerigeeAltitude: 35786e3, targetApogeeAltitude: 35786e3, strategy: 'transferOrbit' });
    const separate = 2 * circularSpeed(35786e3) * Math.sin((14.25 * Math.PI) / 180);
    expect(r.planeChangeDeltaV).toBeGreaterThan(0);
    expect(r.planeChangeDeltaV).toBeLessThan(separate);
    // Coplanar + plane-change share = the law-of-cosines apogee burn.
    const combined = combinedPlaneChange(apogeeSpeed(200e3, 35786e3), circularSpeed(35786e3), 28.5);
    expect(Math.abs(r.transferDeltaV + r.planeChangeDeltaV - combined)).toBeLessThan(1e-6);
  });

  it('throws RangeErrors naming the field', () => {
    expect(() => insertionToTarget({ ...base, targetPerigeeAltitude: 300e3, targetApogeeAltitude: 200e3, strategy: 'direct' })).toThrow(/targetApogeeAltitude/);
    expect(() => insertionToTarget({ ...base, insertionAltitude: 900e3, targetPerigeeAltitude: 800e3, targetApogeeAltitude: 800e3, strategy: 'parkingOrbit' })).toThrow(/insertionAltitude/);
    expect(() =>
      insertionToTarget({ ...base, targetPerigeeAltitude: 800e3, targetApogeeAltitude: 800e3, strategy: 'sideways' as never })
    ).toThrow(/strategy/);
  });
});
