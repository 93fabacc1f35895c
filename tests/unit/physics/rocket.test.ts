import { describe, expect, it } from 'vitest';
import {
  fixedSplitStaging,
  idealDeltaV,
  massRatioForDeltaV,
  optimalStaging,
  payloadForVehicle,
  sizeForPayload,
  stageMassesFromRatio,
  type StagingStage
} from '../../../src/lib/physics/rocket';

// Standard gravity, 9.80665 m/s² exactly (3rd CGPM 1901), typed here independently.
const g0 = 9.80665;

/** Every number in a result tree is finite (no NaN / ±Infinity leaves the module). */
function allFinite(v: unknown): boolean {
  if (typeof v === 'number') return Number.isFinite(v);
  if (Array.isArray(v)) return v.every(allFinite);
  if (v && typeof v === 'object') return Object.values(v).every(allFinite);
  return true;
}

/** Payload fraction of a given split of the delta-v (rocket equation + step ratios), or 0. */
function fractionOfSplit(stages: StagingStage[], dvs: number[]): number {
  let pi = 1;
  for (let i = 0; i < stages.length; i++) {
    const n = Math.exp(dvs[i] / (stages[i].isp * g0));
    const e = stages[i].structuralCoefficient;
    if (n * e >= 1) return 0;
    pi *= (1 - e * n) / ((1 - e) * n);
  }
  return pi;
}

/** Independent brute force: best payload fraction over a grid of splits, refined by zooming. */
function bruteForce(stages: StagingStage[], dv: number): { pi: number; split: number[] } {
  const k = stages.length;
  let best = { pi: -1, split: [] as number[] };
  let center = new Array(k - 1).fill(dv / k);
  let half = dv / 2;
  for (let round = 0; round < 12; round++) {
    const steps = k === 2 ? 400 : 60;
    const tryPoint = (free: number[]) => {
      const used = free.reduce((a, b) => a + b, 0);
      if (free.some((x) => x < 0) || used > dv) return;
      const split = [...free, dv - used];
      const pi = fractionOfSplit(stages, split);
      if (pi > best.pi) best = { pi, split };
    };
    if (k === 2) {
      for (let a = 0; a <= steps; a++) tryPoint([center[0] - half + (2 * half * a) / steps]);
    } else {
      for (let a = 0; a <= steps; a++) {
        for (let b = 0; b <= steps; b++) {
          tryPoint([center[0] - half + (2 * half * a) / steps, center[1] - half + (2 * half * b) / steps]);
        }
      }
    }
    center = best.split.slice(0, k - 1);
    half /= 4;
  }
  return best;
}

describe('rocket equation', () => {
  it('idealDeltaV is Isp·g0·ln(mass ratio) (Tsiolkovsky)', () => {
    expect(Math.abs(idealDeltaV(300, Math.E) - 300 * g0)).toBeLessThan(1e-9);
    expect(Math.abs(idealDeltaV(450, 5) - 450 * g0 * Math.log(5))).toBeLessThan(1e-9);
    expect(idealDeltaV(300, 1)).toBe(0);
  });

  it('massRatioForDeltaV inverts it', () => {
    for (const isp of [250, 311, 450]) {
      for (const dv of [0, 1000, 4321, 9000]) {
        expect(Math.abs(idealDeltaV(isp, massRatioForDeltaV(isp, dv)) - dv)).toBeLessThan(1e-8);
      }
    }
  });

  it('throws RangeErrors naming the parameter', () => {
    expect(() => idealDeltaV(0, 2)).toThrow(/isp/);
    expect(() => idealDeltaV(300, 0.5)).toThrow(/massRatio/);
    expect(() => idealDeltaV(NaN, 2)).toThrow(RangeError);
    expect(() => massRatioForDeltaV(300, -1)).toThrow(/deltaV/);
  });
});

describe('stageMassesFromRatio', () => {
  it('returns masses that reproduce the mass ratio and structural coefficient (definitions)', () => {
    const m = stageMassesFromRatio(0.08, 3.5, 12000);
    expect(Math.abs(m.ignitionMass / m.burnoutMass - 3.5)).toBeLessThan(1e-12);
    expect(Math.abs(m.structuralMass / (m.structuralMass + m.propellantMass) - 0.08)).toBeLessThan(1e-12);
    expect(Math.abs(m.ignitionMass - m.stageMass - 12000)).toBeLessThan(1e-6);
  });

  it('rejects a mass ratio at or beyond 1/ε and ε outside (0, 1)', () => {
    expect(() => stageMassesFromRatio(0.1, 10, 1000)).toThrow(/massRatio/);
    expect(() => stageMassesFromRatio(0, 3, 1000)).toThrow(/structuralCoefficient/);
    expect(() => stageMassesFromRatio(1, 3, 1000)).toThrow(/structuralCoefficient/);
    expect(() => stageMassesFromRatio(0.1, 3, 0)).toThrow(/upperMass/);
  });
});

describe('optimalStaging', () => {
  it('identical stages: equal mass ratios exp(Δv/(N·c)) and the analytic payload fraction (N = 1…4)', () => {
    const stage = { isp: 320, structuralCoefficient: 0.1 };
    const dv = 8000;
    for (let N = 1; N <= 4; N++) {
      const stages = new Array(N).fill(stage);
      if (N === 1 && dv >= -320 * g0 * Math.log(0.1)) continue;
      const r = optimalStaging(stages, dv);
      const n = Math.exp(dv / (N * 320 * g0));
      for (const ni of r.massRatios) expect(Math.abs(ni / n - 1)).toBeLessThan(1e-10);
      // Analytic: π = ((1 − ε n)/((1 − ε) n))^N.
      const pi = ((1 - 0.1 * n) / (0.9 * n)) ** N;
      expect(Math.abs(r.payloadFraction / pi - 1)).toBeLessThan(1e-10);
      for (const d of r.stageDeltaV) expect(Math.abs(d - dv / N)).toBeLessThan(1e-6);
    }
  });

  const cases: Array<{ name: string; stages: StagingStage[]; dv: number }> = [
    { name: '2 stages, dense lower / high-energy upper', stages: [{ isp: 290, structuralCoefficient: 0.06 }, { isp: 440, structuralCoefficient: 0.12 }], dv: 9300 },
    { name: '2 stages, same propellant, lighter upper', stages: [{ isp: 300, structuralCoefficient: 0.08 }, { isp: 340, structuralCoefficient: 0.05 }], dv: 9600 },
    { name: '3 stages, mixed', stages: [{ isp: 270, structuralCoefficient: 0.07 }, { isp: 320, structuralCoefficient: 0.1 }, { isp: 450, structuralCoefficient: 0.15 }], dv: 11000 },
    { name: '3 stages, solid-like upper', stages: [{ isp: 310, structuralCoefficient: 0.05 }, { isp: 350, structuralCoefficient: 0.09 }, { isp: 290, structuralCoefficient: 0.12 }], dv: 9500 },
    { name: '3 stages, one left empty by the optimum', stages: [{ isp: 300, structuralCoefficient: 0.08 }, { isp: 450, structuralCoefficient: 0.1 }, { isp: 250, structuralCoefficient: 0.25 }], dv: 7000 }
  ];

  it.each(cases)('$name: agrees with an independent brute-force search over the delta-v split', ({ stages, dv }) => {
    const r = optimalStaging(stages, dv);
    const b = bruteForce(stages, dv);
    expect(r.feasible).toBe(true);
    // The optimum is never beaten by the search, and the search gets within 1e-6 of it.
    expect(b.pi).toBeLessThanOrEqual(r.payloadFraction * (1 + 1e-9));
    expect(Math.abs(b.pi / r.payloadFraction - 1)).toBeLessThan(1e-6);
    for (let i = 0; i < stages.length; i++) expect(Math.abs(b.split[i] - r.stageDeltaV[i])).toBeLessThan(2);
    for (const n of r.massRatios) expect(n).toBeGreaterThanOrEqual(1);
    expect(Math.abs(r.stageDeltaV.reduce((a, c) => a + c, 0) - dv)).toBeLessThan(1e-6);
    // The payload fraction matches the rocket-equation product of its own split.
    expect(Math.abs(fractionOfSplit(stages, r.stageDeltaV) / r.payloadFraction - 1)).toBeLessThan(1e-9);
  });

  it('mass fractions add up: gross = Σ stages + payload', () => {
    const r = optimalStaging(cases[2].stages, cases[2].dv);
    const sum = r.propellantFractions.reduce((a, b) => a + b, 0) + r.structuralFractions.reduce((a, b) => a + b, 0);
    expect(Math.abs(sum + r.payloadFraction - 1)).toBeLessThan(1e-12);
  });

  it('an unreachable delta-v gives payloadFraction 0, a machine-readable reason and no NaN (1–4 stages)', () => {
    for (let N = 1; N <= 4; N++) {
      const stages = new Array(N).fill({ isp: 250, structuralCoefficient: 0.2 });
      const limit = -N * 250 * g0 * Math.log(0.2);
      for (const dv of [limit, limit + 1, 99999]) {
        const r = optimalStaging(stages, dv);
        expect(r.feasible).toBe(false);
        expect(r.payloadFraction).toBe(0);
        expect(r.reason?.code).toBe('DELTA_V_UNREACHABLE');
        expect(r.reason!.margin).toBeLessThanOrEqual(0);
        expect(Math.abs(r.maxDeltaV - limit)).toBeLessThan(1e-6);
        expect(allFinite(r)).toBe(true);
      }
    }
  });

  it('stays finite and feasible just below the limit and at zero delta-v', () => {
    const stages = [{ isp: 300, structuralCoefficient: 0.1 }, { isp: 350, structuralCoefficient: 0.1 }];
    const limit = -(300 + 350) * g0 * Math.log(0.1);
    const near = optimalStaging(stages, limit * 0.999);
    expect(near.feasible).toBe(true);
    expect(near.payloadFraction).toBeGreaterThan(0);
    expect(allFinite(near)).toBe(true);
    const zero = optimalStaging(stages, 0);
    expect(zero.payloadFraction).toBe(1);
  });

  it('leaves a stage empty (n = 1) when the optimum would give it a negative share', () => {
    // A poor bottom stage and a small delta-v: the search's best is to use the upper stage only.
    const stages = [{ isp: 200, structuralCoefficient: 0.3 }, { isp: 450, structuralCoefficient: 0.05 }];
    const r = optimalStaging(stages, 500);
    expect(r.massRatios[0]).toBe(1);
    expect(Math.abs(r.stageDeltaV[1] - 500)).toBeLessThan(1e-6);
    const b = bruteForce(stages, 500);
    expect(Math.abs(b.pi / r.payloadFraction - 1)).toBeLessThan(1e-6);
  });

  it('property: payload fraction falls as ε rises and rises with Isp (grid, 2 and 3 stages)', () => {
    const dv = 9300;
    for (const k of [2, 3]) {
      for (const isp of [280, 320, 360]) {
        let prev = Infinity;
        for (const eps of [0.04, 0.06, 0.08, 0.1, 0.12, 0.15]) {
          const pi = optimalStaging(new Array(k).fill({ isp, structuralCoefficient: eps }), dv).payloadFraction;
          expect(pi, `k ${k}, isp ${isp}, eps ${eps}`).toBeLessThan(prev);
          prev = pi;
        }
      }
      for (const eps of [0.05, 0.09, 0.13]) {
        let prev = -Infinity;
        for (const isp of [260, 290, 320, 350, 380, 420, 450]) {
          const pi = optimalStaging(new Array(k).fill({ isp, structuralCoefficient: eps }), dv).payloadFraction;
          expect(pi, `k ${k}, isp ${isp}, eps ${eps}`).toBeGreaterThan(prev);
          prev = pi;
        }
      }
    }
  });

  it('throws RangeErrors naming the field', () => {
    expect(() => optimalStaging([], 9000)).toThrow(/stages/);
    expect(() => optimalStaging([{ isp: 300, structuralCoefficient: 0.1 }, { isp: -1, structuralCoefficient: 0.1 }], 9000)).toThrow(/stages\[1\]\.isp/);
    expect(() => optimalStaging([{ isp: 300, structuralCoefficient: 1 }], 9000)).toThrow(/stages\[0\]\.structuralCoefficient/);
    expect(() => optimalStaging([{ isp: 300, structuralCoefficient: 0.1 }], NaN)).toThrow(/deltaV/);
  });
});

describe('fixedSplitStaging', () => {
  const stages = [{ isp: 290, structuralCoefficient: 0.06 }, { isp: 440, structuralCoefficient: 0.12 }];

  it('reproduces the optimum at the optimal split and gives less elsewhere', () => {
    const opt = optimalStaging(stages, 9300);
    const f = opt.stageDeltaV.map((d) => d / 9300);
    f[1] = 1 - f[0];
    const same = fixedSplitStaging(stages, 9300, f);
    expect(Math.abs(same.payloadFraction / opt.payloadFraction - 1)).toBeLessThan(1e-9);
    for (const f0 of [0.3, 0.5, 0.6]) {
      expect(fixedSplitStaging(stages, 9300, [f0, 1 - f0]).payloadFraction).toBeLessThan(opt.payloadFraction);
    }
  });

  it('reports the stage that cannot deliver its share', () => {
    const r = fixedSplitStaging(stages, 9300, [0.95, 0.05]);
    expect(r.feasible).toBe(false);
    expect(r.payloadFraction).toBe(0);
    expect(r.reason?.code).toBe('STAGE_MASS_RATIO_UNREACHABLE');
    expect(r.reason?.stage).toBe(0);
    expect(allFinite(r)).toBe(true);
  });

  it('rejects fractions that do not sum to 1 or have the wrong length', () => {
    expect(() => fixedSplitStaging(stages, 9300, [0.5, 0.4])).toThrow(/fractions/);
    expect(() => fixedSplitStaging(stages, 9300, [1])).toThrow(/fractions/);
  });
});

describe('payloadForVehicle and sizeForPayload', () => {
  const stages = [{ isp: 300, structuralCoefficient: 0.07 }, { isp: 345, structuralCoefficient: 0.09 }];

  it('single stage: payload from the rocket equation in closed form', () => {
    // m0/mf = 5 → (10000 + m)/(1000 + m) = 5 → m = 1250 kg.
    const r = payloadForVehicle([{ isp: 300, propellantMass: 9000, dryMass: 1000 }], 300 * g0 * Math.log(5));
    expect(Math.abs(r.payloadMass - 1250)).toBeLessThan(1e-6);
  });

  it('round trip: the vehicle sized for 5 t delivers 5 t for the same delta-v', () => {
    const sized = sizeForPayload(stages, 9325, 5000);
    expect(sized.feasible).toBe(true);
    const vehicle = sized.stages.map((s, i) => ({ isp: stages[i].isp, propellantMass: s.propellantMass, dryMass: s.structuralMass }));
    const back = payloadForVehicle(vehicle, 9325);
    expect(Math.abs(back.payloadMass - 5000)).toBeLessThan(1e-6);
    expect(Math.abs(back.grossMass - sized.grossMass)).toBeLessThan(1e-6);
    // Stage masses sum to the gross mass.
    const sum = sized.stages.reduce((a, s) => a + s.stageMass, 0) + 5000;
    expect(Math.abs(sum / sized.grossMass - 1)).toBeLessThan(1e-12);
  });

  it('payload falls as the required delta-v rises', () => {
    const vehicle = [{ isp: 300, propellantMass: 150e3, dryMass: 11e3 }, { isp: 345, propellantMass: 25e3, dryMass: 2.5e3 }];
    let prev = Infinity;
    for (let dv = 8000; dv <= 10500; dv += 250) {
      const p = payloadForVehicle(vehicle, dv).payloadMass;
      expect(p).toBeLessThan(prev);
      prev = p;
    }
  });

  it('infeasible vehicles and sizings return 0 with DELTA_V_UNREACHABLE, never NaN', () => {
    const r = payloadForVehicle([{ isp: 300, propellantMass: 1000, dryMass: 1000 }], 5000);
    expect(r.feasible).toBe(false);
    expect(r.payloadMass).toBe(0);
    expect(r.reason?.code).toBe('DELTA_V_UNREACHABLE');
    expect(allFinite(r)).toBe(true);
    const s = sizeForPayload([{ isp: 300, structuralCoefficient: 0.2 }], 8000, 1000);
    expect(s.feasible).toBe(false);
    expect(s.grossMass).toBe(0);
    expect(allFinite(s)).toBe(true);
  });

  it('throws RangeErrors naming the field', () => {
    expect(() => payloadForVehicle([{ isp: 300, propellantMass: -1, dryMass: 1 }], 1000)).toThrow(/propellantMass/);
    expect(() => payloadForVehicle([{ isp: 300, propellantMass: 1, dryMass: 0 }], 1000)).toThrow(/dryMass/);
    expect(() => sizeForPayload(stages, 9000, 0)).toThrow(/payloadMass/);
  });
});
