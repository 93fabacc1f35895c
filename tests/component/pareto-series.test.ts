/**
 * The Pareto plot's point sets: the front highlighted apart from the rest, feasible and
 * infeasible told apart, values in the user's units (1 lb = 0.45359237 kg exactly, NIST SP
 * 811 App. B.8), cases without a value left out, the third quantity mapped onto the ramp.
 */
import { describe, expect, it } from 'vitest';
import { RAMP, niceAxis, paretoSeries } from '../../src/lib/components/pareto-series';

const c = (caseIndex: number, feasible: boolean, glow: number | null, payloadMass: number | null, dryMass = 100) => ({
  caseIndex,
  feasible,
  paretoRank: null,
  values: { glow, payloadMass, dryMass }
});

describe('paretoSeries', () => {
  const cloud = [c(0, true, 1000, 50, 100), c(1, false, 800, 60), c(2, true, 1200, 40, 300), c(3, true, 900, 55, 200), c(4, false, null, 70)];
  const front = [c(3, true, 900, 55, 200), c(5, true, 700, 45, 150)];

  it('keeps front members out of the other series and sorts the front along x', () => {
    const s = paretoSeries(cloud, front, 'glow', 'payloadMass', '', 'si');
    expect(s.front.map((p) => p.caseIndex)).toEqual([5, 3]);
    expect(s.feasible.map((p) => p.caseIndex)).toEqual([0, 2]);
    // Case 4 has no GLOW (a failed case): not plotted.
    expect(s.infeasible.map((p) => p.caseIndex)).toEqual([1]);
    expect(s.feasible.every((p) => p.fillColor === undefined)).toBe(true);
  });

  it('plots in the user’s units', () => {
    const s = paretoSeries(cloud, front, 'glow', 'payloadMass', '', 'us');
    const p = s.feasible.find((q) => q.caseIndex === 0)!;
    expect(p.x).toBeCloseTo(1000 / 0.45359237, 9);
    expect(p.y).toBeCloseTo(50 / 0.45359237, 9);
  });

  it('colours feasible cases by the third quantity from the low to the high end of the ramp', () => {
    const s = paretoSeries(cloud, front, 'glow', 'payloadMass', 'dryMass', 'si');
    expect(s.range).toEqual({ lo: 100, hi: 300 });
    const byCase = Object.fromEntries(s.feasible.map((p) => [p.caseIndex, p.fillColor]));
    expect(byCase[0]).toBe(RAMP[0]);
    expect(byCase[2]).toBe(RAMP[RAMP.length - 1]);
    // Infeasible cases stay hollow grey whatever the colour quantity.
    expect(s.infeasible.every((p) => p.fillColor === undefined)).toBe(true);
  });
});

describe('niceAxis', () => {
  it('puts the ticks on 1, 2 or 5 × 10^k over the extent (the usual nice-number rule, common practice)', () => {
    // The demo sweep's GLOW spread: 15,000…125,000 kg → 0…140,000 in steps of 20,000 (7 ticks).
    expect(niceAxis(14_824, 125_300)).toEqual({ min: 0, max: 140_000, tickAmount: 7 });
    const a = niceAxis(0.0612, 0.0987)!;
    const step = (a.max - a.min) / a.tickAmount;
    expect(a.min).toBeLessThanOrEqual(0.0612);
    expect(a.max).toBeGreaterThanOrEqual(0.0987);
    expect(step).toBeCloseTo(0.005, 12);
    expect(Math.abs(a.min / step - Math.round(a.min / step))).toBeLessThan(1e-9);
  });

  it('leaves an empty or zero-width extent to the chart', () => {
    expect(niceAxis(5, 5)).toBeNull();
    expect(niceAxis(Number.NaN, 3)).toBeNull();
  });
});
