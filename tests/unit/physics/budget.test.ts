import { describe, expect, it } from 'vitest';
import {
  DEFAULT_LOSS_CORRELATION,
  buildDeltaVBudget,
  lossAllowances,
  type DeltaVBudget
} from '../../../src/lib/physics/budget';
import { circularSpeed, hohmann } from '../../../src/lib/physics/orbits';

const RE = 6378137; // WGS 84 equatorial radius [m]

function sumOfTerms(b: DeltaVBudget): number {
  return Object.values(b.terms).reduce((a, t) => a + t.value, 0);
}

describe('buildDeltaVBudget: rules of the trade (common practice)', () => {
  // The rule is quoted for a typical vehicle (lift-off T/W ≈ 1.3) flying to a low orbit; its
  // 9.3–10 km/s is orbital speed (≈ 7.8 km/s) + losses (1.5–2 km/s) before any credit for
  // Earth's rotation, which depends on the site (0–465 m/s). Checked that way since the loss
  // correlation became a fit to the ascent model (tests/fixtures/loss-correlation/fit.ts): the
  // old a-priori anchor had been set high (1.95 km/s) so that the total *after* a 28.5° due-east
  // credit reached 9.3 km/s; the fitted losses (≈ 1.79 km/s at 200 km) do not, and should not.
  // 400 km is left out of the band: a direct ascent there costs the fitted correlation ≈ 10.2
  // km/s before the credit (its altitude slope c + sh ≈ 3.9 m/s per km is the grid's average over
  // upper-stage T/W 0.7–1.5, see loss-correlation.test.ts); higher orbits are covered by the
  // energy-consistency test below.
  const lowOrbitCases = [
    { h: 185e3, lat: 28.5, inc: 28.5 },
    { h: 200e3, lat: 28.5, inc: 28.5 },
    { h: 300e3, lat: 28.5, inc: 28.5 },
    { h: 200e3, lat: 45, inc: 51.6 },
    { h: 300e3, lat: 45, inc: 51.6 }
  ];

  it.each(lowOrbitCases)(
    'orbital speed + default loss allowances is in the 9.3–10 km/s band (common practice): h $h, lat $lat, i $inc, T/W 1.3',
    ({ h, lat, inc }) => {
      const b = buildDeltaVBudget({ target: { perigeeAltitude: h, inclination: inc }, latitude: lat, liftoffThrustToWeight: 1.3 });
      const beforeCredit = b.total - b.terms.rotationAssist.value;
      expect(beforeCredit).toBeGreaterThanOrEqual(9300);
      expect(beforeCredit).toBeLessThanOrEqual(10000);
      // The site's credit only lowers it, by at most the equatorial surface speed ω·a (WGS 84).
      expect(b.total).toBeLessThan(beforeCredit);
      expect(beforeCredit - b.total).toBeLessThanOrEqual(7.292115e-5 * RE);
    }
  );

  it.each([1.3, 1.4, 1.5])(
    'total ascent losses to 200 km are 1.5–2 km/s for a large two-stage vehicle (common practice), T/W %s',
    (tw) => {
      const b = buildDeltaVBudget({ target: { perigeeAltitude: 200e3, inclination: 28.5 }, latitude: 28.5, liftoffThrustToWeight: tw });
      expect(b.ascentLosses).toBeGreaterThanOrEqual(1500);
      expect(b.ascentLosses).toBeLessThanOrEqual(2000);
    }
  );

  it('a direct ascent to a higher circular orbit never costs less than to a lower one (energy consistency)', () => {
    let prev = 0;
    for (let h = 150e3; h <= 2000e3; h += 50e3) {
      const b = buildDeltaVBudget({ target: { perigeeAltitude: h, inclination: 28.5 }, latitude: 28.5, liftoffThrustToWeight: 1.3 });
      expect(b.total, `h ${h}`).toBeGreaterThan(prev);
      prev = b.total;
    }
  });
});

describe('buildDeltaVBudget: structure and arithmetic', () => {
  it('total is the sum of its terms, the assist is negative, origins are traceable', () => {
    const b = buildDeltaVBudget({ target: { perigeeAltitude: 200e3, inclination: 28.5 }, latitude: 28.5, liftoffThrustToWeight: 1.3 });
    expect(Math.abs(b.total - sumOfTerms(b))).toBeLessThan(1e-9);
    expect(b.terms.insertionSpeed.origin).toBe('computed');
    expect(Math.abs(b.terms.insertionSpeed.value - circularSpeed(200e3))).toBeLessThan(1e-9);
    // ω·a·cos 28.5° (WGS 84) for a due-east launch.
    expect(Math.abs(b.terms.rotationAssist.value + 7.292115e-5 * RE * Math.cos((28.5 * Math.PI) / 180))).toBeLessThan(1e-6);
    expect(b.terms.gravityLoss.origin).toBe('allowance');
    expect(b.terms.gravityLoss.note).toMatch(/correlation/);
    expect(b.azimuth).toBeCloseTo(90, 9);
  });

  it('uses user allowances and simulated losses as given, with their origin', () => {
    const b = buildDeltaVBudget({
      target: { perigeeAltitude: 200e3, inclination: 28.5 },
      latitude: 28.5,
      losses: { gravity: 1234, drag: { value: 98.7, origin: 'simulated' }, steering: { value: 42, origin: 'allowance', note: 'study value' } }
    });
    expect(b.terms.gravityLoss).toEqual({ value: 1234, origin: 'allowance', note: 'user allowance' });
    expect(b.terms.dragLoss.origin).toBe('simulated');
    expect(b.terms.dragLoss.value).toBe(98.7);
    expect(b.terms.steeringLoss.note).toBe('study value');
    expect(b.ascentLosses).toBeCloseTo(1234 + 98.7 + 42, 9);
  });

  it('adds the Hohmann transfer from a parking orbit to a higher circular target', () => {
    const b = buildDeltaVBudget({
      target: { perigeeAltitude: 1200e3, inclination: 28.5 },
      latitude: 28.5,
      insertion: { strategy: 'parkingOrbit', altitude: 200e3 },
      liftoffThrustToWeight: 1.3
    });
    expect(Math.abs(b.terms.transfer.value - hohmann(RE + 200e3, RE + 1200e3).total)).toBeLessThan(1e-9);
    expect(b.insertionAltitude).toBe(200e3);
  });

  it('charges a plane change when the inclination is below the site latitude', () => {
    const b = buildDeltaVBudget({ target: { perigeeAltitude: 400e3, inclination: 10 }, latitude: 28.5, liftoffThrustToWeight: 1.3 });
    expect(b.planeChangeAngle).toBeCloseTo(18.5, 9);
    expect(Math.abs(b.terms.planeChange.value - 2 * circularSpeed(400e3) * Math.sin((9.25 * Math.PI) / 180))).toBeLessThan(1e-6);
  });

  it('applies the reserve as a fraction of the budget before reserve, or as a fixed value', () => {
    const input = { target: { perigeeAltitude: 200e3, inclination: 28.5 }, latitude: 28.5, liftoffThrustToWeight: 1.3 };
    const none = buildDeltaVBudget(input);
    const frac = buildDeltaVBudget({ ...input, reserve: { fraction: 0.02 } });
    const fixed = buildDeltaVBudget({ ...input, reserve: { value: 100 } });
    expect(Math.abs(frac.total - none.total * 1.02)).toBeLessThan(1e-9);
    expect(Math.abs(fixed.total - none.total - 100)).toBeLessThan(1e-9);
  });

  it('throws RangeErrors naming the field', () => {
    const target = { perigeeAltitude: 200e3, inclination: 28.5 };
    expect(() => buildDeltaVBudget({ target, latitude: 28.5 })).toThrow(/liftoffThrustToWeight/);
    expect(() => buildDeltaVBudget({ target, latitude: 28.5, liftoffThrustToWeight: 0 })).toThrow(/liftoffThrustToWeight/);
    expect(() => buildDeltaVBudget({ target, latitude: 28.5, losses: { gravity: -1, drag: 0, steering: 0 } })).toThrow(/losses.gravity/);
    expect(() => buildDeltaVBudget({ target, latitude: 95, liftoffThrustToWeight: 1.3 })).toThrow(/latitude/);
    expect(() => buildDeltaVBudget({ target: { perigeeAltitude: -5, inclination: 0 }, latitude: 0, liftoffThrustToWeight: 1.3 })).toThrow(/targetPerigeeAltitude/);
    expect(() => buildDeltaVBudget({ target, latitude: 28.5, liftoffThrustToWeight: 1.3, reserve: { fraction: 2 } })).toThrow(/reserve.fraction/);
  });
});

describe('lossAllowances (correlation shape)', () => {
  it('gravity loss falls and drag loss and max-Q rise as lift-off T/W rises (property, T/W 1.05–3)', () => {
    let prev = lossAllowances(1.05, 200e3);
    for (let tw = 1.1; tw <= 3; tw += 0.05) {
      const l = lossAllowances(tw, 200e3);
      expect(l.gravityLoss).toBeLessThan(prev.gravityLoss);
      expect(l.dragLoss).toBeGreaterThan(prev.dragLoss);
      expect(l.maxDynamicPressure).toBeGreaterThan(prev.maxDynamicPressure);
      prev = l;
    }
  });

  it('gravity and steering losses grow with burn-out altitude and follow the stated formula', () => {
    expect(lossAllowances(1.3, 400e3).gravityLoss).toBeGreaterThan(lossAllowances(1.3, 200e3).gravityLoss);
    const c = DEFAULT_LOSS_CORRELATION;
    expect(Math.abs(lossAllowances(1.3, 200e3).gravityLoss - (c.gravity.a + c.gravity.b / 1.3 + c.gravity.c * 200e3))).toBeLessThan(1e-9);
    expect(lossAllowances(1.3, 400e3).steeringLoss).toBeGreaterThan(lossAllowances(1.3, 200e3).steeringLoss);
    expect(Math.abs(lossAllowances(1.3, 200e3).steeringLoss - (c.steering.s + (c.steering.sh ?? 0) * 200e3))).toBeLessThan(1e-9);
  });

  it('accepts a re-fitted correlation object', () => {
    const refit = { ...DEFAULT_LOSS_CORRELATION, gravity: { a: 0, b: 1000, c: 0 }, drag: { d0: 10, d1: 0 }, steering: { s: 0 } };
    const l = lossAllowances(2, 200e3, refit);
    expect(l.gravityLoss).toBe(500);
    expect(l.dragLoss).toBe(10);
    expect(l.steeringLoss).toBe(0);
  });
});
