/**
 * Case generation: determinism, caseAt(i) = i-th generated case, Latin-hypercube stratification,
 * grid decoding, chunking; the normal distribution helpers against published values.
 */
import { erf } from 'mathjs';
import { describe, expect, test } from 'vitest';
import { caseAt, casesInRange, chunkPlan, makeCasePlan } from '../../../src/lib/sweep/cases';
import { normalCdf, normalQuantile, truncatedNormalInverse } from '../../../src/lib/sweep/distributions';
import { EXAMPLE_PAYLOAD_INPUT, EXAMPLE_SIZING_INPUT, EXAMPLE_SPECS } from '../../../src/lib/sweep/examples';
import { counterKey, dimKey, streamKey, uniform01, uniform01Keyed } from '../../../src/lib/sweep/random';
import { assertSweepSpec, type SweepSpecInput } from '../../../src/lib/sweep/spec';

type SweepParameterInput = SweepSpecInput['sweep']['parameters'] extends (infer P)[] | undefined ? P : never;

const sampled = (plan: 'latinHypercube' | 'random', samples: number, seed: number): SweepSpecInput => ({
  ...EXAMPLE_PAYLOAD_INPUT,
  sweep: {
    parameters: ([
      { path: 'target.inclination', values: { kind: 'uniform', min: 45, max: 98 } },
      { path: 'stages.1.ispVacuum', values: { kind: 'normal', mean: 340, sd: 4, min: 328, max: 352 } },
      { path: 'stages.0.structuralCoefficient', values: { kind: 'list', values: [0.06, 0.07, 0.08, 0.09] } },
      { path: 'stages.0.propulsion', values: { kind: 'choices', options: [
        { id: 'a', name: 'A', ispSeaLevel: 280, ispVacuum: 310 },
        { id: 'b', name: 'B', ispSeaLevel: 290, ispVacuum: 320 },
        { id: 'c', name: 'C', ispSeaLevel: 300, ispVacuum: 330 }
      ] } }
    ] satisfies SweepParameterInput[]).filter((p) => p.path !== 'stages.1.ispVacuum' || plan === 'random'),
    sampling: { plan, samples, seed }
  }
});

describe('determinism and random access', () => {
  const specs = {
    grid: EXAMPLE_SPECS.sizing,
    latinHypercube: assertSweepSpec(sampled('latinHypercube', 997, 12345)),
    random: assertSweepSpec(sampled('random', 997, 12345))
  };
  for (const [name, spec] of Object.entries(specs)) {
    test(`${name}: the same spec gives the same cases; caseAt(i) equals the i-th generated case`, () => {
      const first = Array.from(casesInRange(spec, 0, makeCasePlan(spec).total));
      // A structurally equal spec built separately (a fresh parse: no shared cache).
      const again = Array.from(casesInRange(assertSweepSpec(JSON.parse(JSON.stringify(spec))), 0, first.length));
      expect(again).toEqual(first);
      first.forEach((c, i) => expect(c.index).toBe(i));
      // Random access in a scrambled order, on a fresh plan (as another worker would).
      const other = makeCasePlan(assertSweepSpec(JSON.parse(JSON.stringify(spec))));
      for (const i of [first.length - 1, 0, 17, 500, 3, first.length >> 1]) {
        if (i < first.length) expect(other.caseAt(i)).toEqual(first[i]);
      }
      // Chunks rebuilt independently concatenate to the whole sweep.
      const chunks = chunkPlan(first.length, 128);
      const rebuilt = chunks.reverse().flatMap((c) => Array.from(casesInRange(makeCasePlan(spec), c.start, c.end)).reverse()).reverse();
      expect(rebuilt).toEqual(first);
    });
  }

  test('a different seed gives different sampled cases', () => {
    const a = caseAt(assertSweepSpec(sampled('latinHypercube', 100, 1)), 5).params;
    const b = caseAt(assertSweepSpec(sampled('latinHypercube', 100, 2)), 5).params;
    expect(a).not.toEqual(b);
  });

  test('out-of-range indexes are refused', () => {
    expect(() => caseAt(EXAMPLE_SPECS.sizing, 75)).toThrow(RangeError);
    expect(() => caseAt(EXAMPLE_SPECS.sizing, -1)).toThrow(RangeError);
    expect(() => caseAt(EXAMPLE_SPECS.sizing, 1.5)).toThrow(RangeError);
    expect(() => Array.from(casesInRange(EXAMPLE_SPECS.sizing, 10, 76))).toThrow(RangeError);
  });
});

describe('full grid', () => {
  test('mixed-radix order: the last parameter varies fastest, every combination once', () => {
    const spec = EXAMPLE_SPECS.sizing; // ε1 (5) × upper propulsion (3) × lift-off T/W (5)
    const plan = makeCasePlan(spec);
    expect(plan.total).toBe(75);
    const c0 = plan.caseAt(0).params;
    const c1 = plan.caseAt(1).params;
    const c5 = plan.caseAt(5).params;
    expect(c0).toEqual({ 'stages.0.structuralCoefficient': 0.06, 'stages.1.propulsion': 'pl-kx-vac', liftoffThrustToWeight: 1.2 });
    expect(c1.liftoffThrustToWeight).toBeCloseTo(1.3, 12);
    expect(c5['stages.1.propulsion']).toBe('pl-mx-vac');
    expect(plan.caseAt(74).params).toEqual({ 'stages.0.structuralCoefficient': 0.1, 'stages.1.propulsion': 'pl-hx-vac', liftoffThrustToWeight: 1.6 });
    const seen = new Set(Array.from(casesInRange(spec, 0, 75), (c) => JSON.stringify(c.params)));
    expect(seen.size).toBe(75);
  });

  test('no swept parameters: one case, the baseline', () => {
    const spec = assertSweepSpec({ ...EXAMPLE_SIZING_INPUT, sweep: { parameters: [], sampling: { plan: 'grid' } } });
    expect(makeCasePlan(spec).total).toBe(1);
    expect(caseAt(spec, 0)).toEqual({ index: 0, params: {} });
  });
});

describe('Latin hypercube', () => {
  test('each dimension hits every one of the N strata exactly once', () => {
    for (const [n, seed] of [[1000, 7], [4096, 99], [37, 1]] as const) {
      const spec = assertSweepSpec({
        ...EXAMPLE_PAYLOAD_INPUT,
        sweep: {
          parameters: [
            { path: 'target.inclination', values: { kind: 'uniform', min: 45, max: 98 } },
            { path: 'target.launchLatitude', values: { kind: 'uniform', min: -10, max: 60 } },
            { path: 'stages.1.ispVacuum', values: { kind: 'normal', mean: 340, sd: 4, min: 328, max: 352 } }
          ],
          sampling: { plan: 'latinHypercube', samples: n, seed }
        }
      });
      const plan = makeCasePlan(spec);
      const out = new Float64Array(3);
      const hits = [new Uint32Array(n), new Uint32Array(n), new Uint32Array(n)];
      for (let i = 0; i < n; i++) {
        plan.fill(i, out);
        hits[0][Math.floor(((out[0] - 45) / 53) * n)]++;
        hits[1][Math.floor(((out[1] + 10) / 70) * n)]++;
        // Normal: the stratum is the CDF position inside the truncation window.
        const lo = normalCdf((328 - 340) / 4);
        const hi = normalCdf((352 - 340) / 4);
        hits[2][Math.min(n - 1, Math.floor(((normalCdf((out[2] - 340) / 4) - lo) / (hi - lo)) * n))]++;
      }
      for (const h of hits.slice(0, 2)) expect(Array.from(h).every((c) => c === 1)).toBe(true);
      // Through the erfc fit (fractional error < 1.2e-7) the CDF round trip can move a value
      // by ~1e-7 in probability: allow a sample to land in a neighbouring stratum of width 1/N.
      const misses = Array.from(hits[2]).filter((c) => c !== 1).length;
      expect(misses).toBeLessThanOrEqual(Math.ceil(n * 1e-3) * 2);
    }
  });

  test('discrete levels are sampled in equal shares', () => {
    const spec = assertSweepSpec(sampled('latinHypercube', 1200, 5));
    const plan = makeCasePlan(spec);
    const counts = new Map<string, number>();
    for (let i = 0; i < plan.total; i++) {
      const p = plan.caseAt(i).params;
      const key = `${p['stages.0.structuralCoefficient']}`;
      counts.set(key, (counts.get(key) ?? 0) + 1);
      const choice = `${p['stages.0.propulsion']}`;
      counts.set(choice, (counts.get(choice) ?? 0) + 1);
    }
    // 1200 strata over 4 levels and 3 choices: exactly 300 and 400 each.
    for (const v of ['0.06', '0.07', '0.08', '0.09']) expect(counts.get(v)).toBe(300);
    for (const v of ['a', 'b', 'c']) expect(counts.get(v)).toBe(400);
  });
});

describe('random plan', () => {
  test('uniform draws have the mean and variance of U(0,1) (statistical check, 5-sigma bounds)', () => {
    const n = 200_000;
    let s = 0;
    let s2 = 0;
    for (let i = 0; i < n; i++) {
      const u = uniform01(42, 3, i, 1);
      s += u;
      s2 += u * u;
    }
    const mean = s / n;
    const variance = s2 / n - mean * mean;
    // U(0,1): mean 1/2 (sd of the mean √(1/12/n)), variance 1/12.
    expect(Math.abs(mean - 0.5)).toBeLessThan(5 * Math.sqrt(1 / 12 / n));
    expect(Math.abs(variance - 1 / 12)).toBeLessThan(0.002);
  });

  test('truncated-normal samples stay within bounds with about the right mean', () => {
    const spec = assertSweepSpec(sampled('random', 20_000, 77));
    const plan = makeCasePlan(spec);
    let sum = 0;
    for (let i = 0; i < plan.total; i++) {
      const v = plan.caseAt(i).params['stages.1.ispVacuum'] as number;
      expect(v).toBeGreaterThanOrEqual(328);
      expect(v).toBeLessThanOrEqual(352);
      sum += v;
    }
    // Symmetric truncation at ±3 sd keeps the mean at 340; sd of the mean 4/√20000 ≈ 0.028.
    expect(Math.abs(sum / plan.total - 340)).toBeLessThan(0.15);
  });
});

describe('chunkPlan', () => {
  test('covers 0..total−1 with consecutive chunks', () => {
    expect(chunkPlan(10, 4)).toEqual([
      { chunk: 0, start: 0, end: 4 },
      { chunk: 1, start: 4, end: 8 },
      { chunk: 2, start: 8, end: 10 }
    ]);
    expect(chunkPlan(0, 4)).toEqual([]);
    expect(() => chunkPlan(10, 0)).toThrow(RangeError);
  });
});

describe('normal distribution helpers', () => {
  test('quantiles equal the standard normal table (published values of z)', () => {
    // z for one-sided probabilities 0.9, 0.95, 0.975, 0.995, 0.999 (standard normal tables).
    const table: [number, number][] = [[0.9, 1.281551566], [0.95, 1.644853627], [0.975, 1.959963985], [0.995, 2.575829304], [0.999, 3.090232306]];
    for (const [p, z] of table) {
      expect(Math.abs(normalQuantile(p) - z)).toBeLessThan(1e-8);
      expect(Math.abs(normalQuantile(1 - p) + z)).toBeLessThan(1e-8);
    }
    expect(normalQuantile(0.5)).toBe(0);
    expect(normalQuantile(0.01)).toBeCloseTo(-2.326347874, 8);
  });

  test('the CDF equals ½(1 + erf(x/√2)) from mathjs within the fit error (1.2e-7 relative)', () => {
    for (let x = -6; x <= 6; x += 0.25) {
      const ref = 0.5 * (1 + erf(x / Math.SQRT2));
      expect(Math.abs(normalCdf(x) - ref)).toBeLessThanOrEqual(1.2e-7 * Math.max(ref, 1 - ref) + 1e-15);
    }
  });

  test('truncated inverse maps (0,1) into [min, max] monotonically', () => {
    let prev = -Infinity;
    for (let u = 0.001; u < 1; u += 0.001) {
      const x = truncatedNormalInverse(u, 10, 2, 9, 15);
      expect(x).toBeGreaterThanOrEqual(9);
      expect(x).toBeLessThanOrEqual(15);
      expect(x).toBeGreaterThanOrEqual(prev);
      prev = x;
    }
  });
});

describe('staged hashing (hot-loop form of uniform01)', () => {
  test('uniform01Keyed(counterKey(streamKey(s, t), c), dimKey(d)) is uniform01(s, t, c, d) exactly', () => {
    for (let i = 0; i < 2000; i++) {
      // Spread over the 32-bit range, edges included.
      const s = i === 0 ? 0 : i === 1 ? 0xffffffff : (i * 2654435761) >>> 0;
      const t = i % 5;
      const c = (i * 40503 + 7) >>> 0;
      const d = i % 11;
      expect(uniform01Keyed(counterKey(streamKey(s, t), c), dimKey(d))).toBe(uniform01(s, t, c, d));
    }
  });
});
