/**
 * Constraint limits on the Pareto plot: the spec's constraints become limits on the result
 * quantities they bound (SI), and lines on the plotted axes in the user's units, each naming
 * its infeasible side. Conversion factors are typed here from their sources, not taken from
 * the units module.
 */
import { describe, expect, it } from 'vitest';
import { REACH, axisBounds, extentOf, limitLines, limitsOf } from '../../src/lib/components/plot-limits';
import { toDisplay } from '../../src/lib/units';

// Standard acceleration of gravity, exact (3rd CGPM 1901; NIST SP 811 (2008) App. B.8).
const GN = 9.80665;
// NIST SP 811 (2008) App. B.9, exact: 1 lb = 0.453 592 37 kg, 1 ft = 0.3048 m.
const KG_PER_LB = 0.45359237;
const M_PER_FT = 0.3048;
// NIST SP 811 (2008) App. B.9: 1 lbf/ft² = 4.788 026 E+01 Pa (1 lbf = 4.448 221 615 260 5 N, exact).
const PA_PER_PSF = 4.4482216152605 / (M_PER_FT * M_PER_FT);

const ALL = { minLiftoffThrustToWeight: 1.25, maxDynamicPressure: 45_000, maxAxialAccelerationG: 6, payloadFloor: 150, glowCeiling: 45_000 };

describe('limitsOf', () => {
  it('maps every constraint to the quantity it bounds, with the side that is feasible', () => {
    expect(limitsOf(ALL)).toEqual([
      { metric: 'liftoffThrustToWeight', bound: 'min', value: 1.25 },
      { metric: 'maxDynamicPressure', bound: 'max', value: 45_000 },
      { metric: 'maxAxialAcceleration', bound: 'max', value: expect.closeTo(6 * GN, 12), given: '6 g' },
      { metric: 'payloadMass', bound: 'min', value: 150 },
      { metric: 'glow', bound: 'max', value: 45_000 }
    ]);
  });

  it('converts an acceleration limit in g with standard gravity, and keeps one given in m/s² as it is', () => {
    // 6 g = 58.8399 m/s² exactly (GN above).
    expect(limitsOf({ maxAxialAccelerationG: 6 })[0].value).toBeCloseTo(58.8399, 12);
    expect(limitsOf({ maxAxialAcceleration: 70 })).toEqual([{ metric: 'maxAxialAcceleration', bound: 'max', value: 70 }]);
    // Both ways at once is refused by the schema; should it reach the plot, the m/s² one wins.
    expect(limitsOf({ maxAxialAcceleration: 70, maxAxialAccelerationG: 6 })).toEqual([{ metric: 'maxAxialAcceleration', bound: 'max', value: 70 }]);
  });

  it('gives nothing for no constraints or missing values', () => {
    expect(limitsOf(undefined)).toEqual([]);
    expect(limitsOf(null)).toEqual([]);
    expect(limitsOf({})).toEqual([]);
    expect(limitsOf({ glowCeiling: null, payloadFloor: Number.NaN })).toEqual([]);
  });
});

describe('limitLines', () => {
  const limits = limitsOf(ALL);

  it('draws only the limits of the plotted quantities, in SI display units, naming the infeasible side', () => {
    const lines = limitLines(limits, 'glow', 'maxDynamicPressure', 'si');
    expect(lines.map((l) => [l.axis, l.metric, l.value, l.label, l.side, l.offPlot])).toEqual([
      ['x', 'glow', 45_000, 'GLOW ceiling 45,000 kg', 'infeasible to the right', null],
      // Pressure is shown in kPa: 45 000 Pa = 45 kPa.
      ['y', 'maxDynamicPressure', 45, 'max-Q limit 45 kPa', 'infeasible above', null]
    ]);
    expect(lines[0].text).toBe('GLOW ceiling 45,000 kg · infeasible →');
    expect(lines[1].text).toBe('max-Q limit 45 kPa · infeasible above');
    // Dry mass has no constraint: nothing on the vertical axis.
    expect(limitLines(limits, 'glow', 'dryMass', 'si').map((l) => l.axis)).toEqual(['x']);
  });

  it('puts a floor on the left or below, and the g limit with both its units', () => {
    const [tw, payload] = limitLines(limits, 'liftoffThrustToWeight', 'payloadMass', 'si');
    expect(tw.text).toBe('← infeasible · lift-off T/W minimum 1.25');
    expect(tw.side).toBe('infeasible to the left');
    expect(payload.label).toBe('payload floor 150 kg');
    expect(payload.side).toBe('infeasible below');
    const [a] = limitLines(limits, 'maxAxialAcceleration', 'glow', 'si');
    expect(a.label).toBe('axial acceleration limit 6 g (58.84 m/s²)');
  });

  it('converts to US customary units: lb, psf, ft/s²; T/W stays a plain ratio', () => {
    const lines = limitLines(limits, 'glow', 'maxDynamicPressure', 'us');
    // 45 000 kg / 0.45359237 kg/lb = 99 208.018 lb.
    expect(lines[0].value).toBeCloseTo(45_000 / KG_PER_LB, 9);
    expect(lines[0].value).toBeCloseTo(99_208.018, 3);
    expect(lines[0].label).toBe('GLOW ceiling 99,208 lb');
    // 45 000 Pa / 47.880 26 Pa/psf = 939.84 psf.
    expect(lines[1].value).toBeCloseTo(45_000 / PA_PER_PSF, 9);
    expect(lines[1].label).toBe('max-Q limit 939.8 psf');
    // 6 g in ft/s²: 6 × 9.80665 / 0.3048 = 193.044 (1 g = 32.174 05 ft/s²).
    const [a] = limitLines(limits, 'maxAxialAcceleration', 'payloadMass', 'us');
    expect(a.value).toBeCloseTo((6 * GN) / M_PER_FT, 9);
    expect(a.label).toBe('axial acceleration limit 6 g (193 ft/s²)');
    const [, floor] = limitLines(limits, 'maxAxialAcceleration', 'payloadMass', 'us');
    expect(floor.label).toBe('payload floor 330.7 lb');
    const [tw] = limitLines(limits, 'liftoffThrustToWeight', 'glow', 'us');
    expect(tw.value).toBe(1.25);
    expect(tw.label).toBe('lift-off T/W minimum 1.25');
  });

  it('T/W needs no conversion: thrust in lbf over mass in lb is the same ratio (1 lbf = 1 lb × gn, NIST SP 811 App. B.8)', () => {
    const mass = 30_000; // kg
    const thrust = 1.25 * mass * GN; // N, at a T/W of exactly 1.25
    expect(toDisplay('force', thrust, 'us') / toDisplay('mass', mass, 'us')).toBeCloseTo(1.25, 12);
  });

  it('draws a limit just beyond the plotted cases, stretching the axis to it, and lists one far beyond as off the plot', () => {
    const glow = limitsOf({ glowCeiling: 31_000 });
    const e = { x: [20_000, 30_000] as [number, number], y: [0, 1] as [number, number] };
    const [near] = limitLines(glow, 'glow', 'payloadMass', 'si', e);
    expect(near.offPlot).toBeNull();
    expect(axisBounds([near], e)).toEqual({ x: { max: 31_000 + 0.05 * 11_000 }, y: {} });
    // Inside the spread: drawn, and the axis left to the chart.
    const [inside] = limitLines(limitsOf({ glowCeiling: 25_000 }), 'glow', 'payloadMass', 'si', e);
    expect(inside.offPlot).toBeNull();
    expect(axisBounds([inside], e)).toEqual({ x: {}, y: {} });
    // More than REACH × spread (2 500 kg) past the highest: every plotted case is under the ceiling.
    const [far] = limitLines(limitsOf({ glowCeiling: 30_000 + REACH * 10_000 + 1 }), 'glow', 'payloadMass', 'si', e);
    expect(far.offPlot).toBe('feasible');
    expect(axisBounds([far], e)).toEqual({ x: {}, y: {} });
    // A floor far above every plotted payload: they are all on its infeasible side; far below, all feasible.
    const ye = { x: null, y: [100, 200] as [number, number] };
    expect(limitLines(limitsOf({ payloadFloor: 1000 }), 'glow', 'payloadMass', 'si', ye)[0].offPlot).toBe('infeasible');
    expect(limitLines(limitsOf({ payloadFloor: 10 }), 'glow', 'payloadMass', 'si', ye)[0].offPlot).toBe('feasible');
    const [low] = limitLines(limitsOf({ payloadFloor: 90 }), 'glow', 'payloadMass', 'si', ye);
    expect(axisBounds([low], ye).y).toEqual({ min: 90 - 0.05 * 110 });
  });

  it('draws a limit on both axes when both show its quantity', () => {
    expect(limitLines(limitsOf({ glowCeiling: 1 }), 'glow', 'glow', 'si').map((l) => [l.axis, l.side])).toEqual([
      ['x', 'infeasible to the right'],
      ['y', 'infeasible above']
    ]);
  });
});

describe('extentOf', () => {
  it('spans the finite values, null for none', () => {
    expect(extentOf([3, -1, Number.NaN, 7, Infinity])).toEqual([-1, 7]);
    expect(extentOf([])).toBeNull();
  });
});
