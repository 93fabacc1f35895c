import { describe, expect, it } from 'vitest';
import { DEFAULT_FEASIBILITY_LIMITS, checkFeasibility } from '../../../src/lib/physics/feasibility';
import { REASON_BIT, codesFromMask, finiteOr, sanitizeNumbers } from '../../../src/lib/physics/reasons';

function allFinite(v: unknown): boolean {
  if (typeof v === 'number') return Number.isFinite(v);
  if (Array.isArray(v)) return v.every(allFinite);
  if (v && typeof v === 'object') return Object.values(v).every(allFinite);
  return true;
}

describe('checkFeasibility', () => {
  const good = {
    liftoffThrustToWeight: 1.3,
    stageThrustToWeight: [1.3, 0.9],
    maxDynamicPressure: 30e3,
    maxAxialAcceleration: 45,
    payloadMass: 5000,
    grossMass: 2e5,
    structuralCoefficients: [0.07, 0.09],
    massRatios: [4.3, 4.4]
  };
  const limits = { ...DEFAULT_FEASIBILITY_LIMITS, minPayloadMass: 1000, maxGrossMass: 5e5 };

  it('passes a sound case and reports positive margins for every check', () => {
    const r = checkFeasibility(good, limits);
    expect(r.feasible).toBe(true);
    expect(r.failures).toEqual([]);
    // 2 T/W + max-Q + acceleration + payload + gross + 2 ε + 2 mass ratios.
    expect(r.passed.length).toBe(10);
    for (const p of r.passed) expect(p.margin).toBeGreaterThan(0);
    const tw = r.passed.find((p) => p.code === 'LIFTOFF_THRUST_TO_WEIGHT_LOW')!;
    expect(tw.margin).toBeCloseTo(1.3 - 1.15, 12);
  });

  it.each([
    ['LIFTOFF_THRUST_TO_WEIGHT_LOW', { liftoffThrustToWeight: 1.05 }, 1.05 - 1.15],
    ['STAGE_THRUST_TO_WEIGHT_LOW', { stageThrustToWeight: [1.3, 0.2] }, 0.2 - 0.3],
    ['MAX_DYNAMIC_PRESSURE_HIGH', { maxDynamicPressure: 60e3 }, 50e3 - 60e3],
    ['MAX_AXIAL_ACCELERATION_HIGH', { maxAxialAcceleration: 70 }, 6 * 9.80665 - 70],
    ['PAYLOAD_BELOW_FLOOR', { payloadMass: 400 }, 400 - 1000],
    ['GROSS_MASS_ABOVE_CEILING', { grossMass: 6e5 }, 5e5 - 6e5],
    ['STRUCTURAL_COEFFICIENT_INVALID', { structuralCoefficients: [0.07, 1.2] }, -0.2],
    ['MASS_RATIO_INVALID', { massRatios: [4.3, 0.9] }, -0.1]
  ] as const)('fails %s with a negative margin', (code, change, margin) => {
    const r = checkFeasibility({ ...good, ...change }, limits);
    expect(r.feasible).toBe(false);
    expect(r.failures.map((f) => f.code)).toEqual([code]);
    expect(r.failures[0].margin).toBeCloseTo(margin, 9);
    expect(r.failMask).toBe(REASON_BIT[code]);
    expect(codesFromMask(r.failMask)).toEqual([code]);
  });

  it('warns, without failing, for a structural coefficient outside the typical 0.04–0.20', () => {
    const r = checkFeasibility({ ...good, structuralCoefficients: [0.03, 0.25] }, limits);
    expect(r.feasible).toBe(true);
    expect(r.warnings.map((w) => w.code)).toEqual(['STRUCTURAL_COEFFICIENT_UNUSUAL', 'STRUCTURAL_COEFFICIENT_UNUSUAL']);
    expect(r.warnings.map((w) => w.stage)).toEqual([0, 1]);
  });

  it('turns non-finite values into NON_FINITE_RESULT failures and never emits NaN or Infinity', () => {
    const r = checkFeasibility({ ...good, maxDynamicPressure: NaN, grossMass: Infinity, massRatios: [NaN, 3], structuralCoefficients: [NaN, 0.1] }, limits);
    expect(r.feasible).toBe(false);
    expect(r.failures.some((f) => f.code === 'NON_FINITE_RESULT')).toBe(true);
    expect(allFinite(r)).toBe(true);
  });

  it('skips checks whose value or limit is absent', () => {
    const r = checkFeasibility({ payloadMass: 1 }, DEFAULT_FEASIBILITY_LIMITS);
    expect(r.feasible).toBe(true);
    expect(r.passed).toEqual([]);
  });
});

describe('reason helpers', () => {
  it('finiteOr and sanitizeNumbers replace NaN/Infinity and list the paths', () => {
    expect(finiteOr(NaN)).toBe(0);
    expect(finiteOr(Infinity, -1)).toBe(-1);
    expect(finiteOr(2)).toBe(2);
    const s = sanitizeNumbers({ a: 1, b: [NaN, 2], c: { d: -Infinity }, e: new Float64Array([1, NaN]) });
    expect(s.replaced).toEqual(['b.0', 'c.d', 'e.1']);
    expect(allFinite({ ...s.value, e: Array.from(s.value.e) })).toBe(true);
  });
});
