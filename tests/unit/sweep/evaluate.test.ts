/**
 * Case evaluation: finite results on grids of absurd-but-valid inputs, consistency of the flat
 * columns with the rocket equation and the budget, determinism, single-case = bulk, and the
 * summary.
 */
import { describe, expect, test } from 'vitest';
import { G0 } from '../../../src/lib/physics';
import { caseAt, makeCasePlan } from '../../../src/lib/sweep/cases';
import {
  CASE_REASON_BIT,
  CASE_RESULT_COLUMNS,
  caseReasonCodes,
  createCaseResult,
  evaluateCase,
  makeEvaluator,
  type CaseResult
} from '../../../src/lib/sweep/evaluate';
import { EXAMPLE_ASCENT_SPEC, EXAMPLE_PAYLOAD_INPUT, EXAMPLE_SIZING_INPUT, EXAMPLE_SPECS } from '../../../src/lib/sweep/examples';
import { paretoRanks } from '../../../src/lib/sweep/pareto';
import { pearson, ranksOf, summarizeSweep } from '../../../src/lib/sweep/summary';
import { assertSweepSpec, type SweepSpecInput } from '../../../src/lib/sweep/spec';

/** Problems of one result (empty when every column is finite or an allowed null). */
function problems(r: CaseResult): string[] {
  const out: string[] = [];
  const rec = r as unknown as Record<string, unknown>;
  for (const col of CASE_RESULT_COLUMNS) {
    const v = rec[col.name];
    if (v === null ? !col.nullable : !Number.isFinite(v)) out.push(`case ${r.index}: ${col.name} = ${String(v)}`);
  }
  if (r.feasible !== (r.failMask === 0)) out.push(`case ${r.index}: feasible flag disagrees with failMask`);
  if (!r.feasible && r.reasons.length === 0) out.push(`case ${r.index}: infeasible without a reason`);
  if (caseReasonCodes(r.failMask).join() !== r.reasons.join()) out.push(`case ${r.index}: reasons disagree with failMask`);
  return out;
}

function expectClean(r: CaseResult): void {
  expect(problems(r)).toEqual([]);
}

// Values at (and near) the limits the spec accepts: valid input, absurd physics.
const absurdSizing: SweepSpecInput = {
  ...EXAMPLE_SIZING_INPUT,
  target: { ...EXAMPLE_SIZING_INPUT.target, reserve: { deltaV: 5000, fraction: 0.5 } },
  sweep: {
    parameters: [
      { path: 'stages.0.structuralCoefficient', values: { kind: 'list', values: [1e-6, 0.08, 0.999999] } },
      { path: 'stages.1.ispVacuum', values: { kind: 'list', values: [180, 450, 1000] } },
      { path: 'stages.0.ispSeaLevel', values: { kind: 'list', values: [0.001, 285, 1000] } },
      { path: 'liftoffThrustToWeight', values: { kind: 'list', values: [1e-6, 1.3, 10] } },
      { path: 'target.altitude', values: { kind: 'list', values: [80e3, 2.5e6, 4e8] } },
      { path: 'target.launchLatitude', values: { kind: 'list', values: [-90, 0, 89.9, 90] } },
      { path: 'target.inclination', values: { kind: 'list', values: [0, 98, 180] } },
      { path: 'payloadMass', values: { kind: 'list', values: [1e-6, 1e9] } }
    ],
    sampling: { plan: 'grid' }
  },
  constraints: { minLiftoffThrustToWeight: 1.1, maxDynamicPressure: 1, maxAxialAcceleration: 1e-3, payloadFloor: 1e9, glowCeiling: 1 }
};

const absurdPayload: SweepSpecInput = {
  ...EXAMPLE_PAYLOAD_INPUT,
  baseline: {
    ...EXAMPLE_PAYLOAD_INPUT.baseline,
    stages: EXAMPLE_PAYLOAD_INPUT.baseline.stages.map((s, i) => (i === 1 ? { ...s, thrustVacuum: undefined, thrustToWeight: 0.8 } : s))
  },
  sweep: {
    parameters: [
      { path: 'stages.1.structuralCoefficient', values: { kind: 'list', values: [1e-6, 0.1, 0.999999] } },
      { path: 'stages.0.ispVacuum', values: { kind: 'list', values: [1e-3, 315, 1000] } },
      { path: 'liftoffThrustToWeight', values: { kind: 'list', values: [1e-6, 1.3, 10] } },
      { path: 'upperStageThrustToWeight', values: { kind: 'list', values: [1e-6, 10] } },
      { path: 'target.altitude', values: { kind: 'list', values: [80e3, 4e8] } },
      { path: 'target.launchLatitude', values: { kind: 'list', values: [-90, 45, 90] } },
      { path: 'target.inclination', values: { kind: 'list', values: [0, 180] } }
    ],
    sampling: { plan: 'grid' }
  },
  constraints: { minLiftoffThrustToWeight: 1.1, maxAxialAcceleration: 1e-3, payloadFloor: 1e9 }
};

describe('evaluateCase never returns NaN or Infinity, and never throws, on valid input', () => {
  for (const [name, input] of [['sizing', absurdSizing], ['payload of a given vehicle', absurdPayload]] as const) {
    test(`budget mode, ${name}: every case of an absurd grid is finite with reasons`, () => {
      const ev = makeEvaluator(assertSweepSpec(input));
      expect(ev.total).toBeGreaterThan(200);
      let feasible = 0;
      const seen = new Set<string>();
      const bad: string[] = [];
      for (let i = 0; i < ev.total; i++) {
        const r = ev.evaluate(i);
        bad.push(...problems(r));
        if (r.feasible) feasible++;
        for (const c of r.reasons) seen.add(c);
      }
      expect(bad.slice(0, 20)).toEqual([]);
      // The absurd constraints make nothing feasible; the physics refusals are recorded.
      expect(feasible).toBe(0);
      expect(seen.has('ISP_ORDER_INVALID') || seen.has('DELTA_V_UNREACHABLE')).toBe(true);
      expect(seen.has('MODEL_INPUT_OUT_OF_RANGE')).toBe(true); // a launch site at a pole
    });
  }

  test('with detail, each absurd case carries a detail and finite budget terms', () => {
    const spec = assertSweepSpec(absurdSizing);
    const plan = makeCasePlan(spec);
    for (const i of [0, 1, 17, 500, plan.total - 1]) {
      const r = evaluateCase(spec, plan.caseAt(i).params, i);
      expectClean(r);
      expect(r.detail).not.toBeNull();
      expect(r.index).toBe(i);
      for (const t of Object.values(r.detail!.budget)) {
        const v = typeof t === 'number' ? t : t.value;
        expect(Number.isFinite(v)).toBe(true);
      }
    }
  });
});

describe('budget mode results', () => {
  const sizing = EXAMPLE_SPECS.sizing;
  const payload = EXAMPLE_SPECS.payload;

  test('the budget terms add up to the required delta-v', () => {
    for (const spec of [sizing, payload]) {
      const ev = makeEvaluator(spec);
      for (let i = 0; i < Math.min(ev.total, 75); i++) {
        const r = ev.evaluate(i);
        if (r.failMask & CASE_REASON_BIT.DELTA_V_UNREACHABLE) continue;
        const sum =
          r.insertionSpeed + r.gravityLoss + r.dragLoss + r.steeringLoss - r.rotationAssist + r.transferDeltaV + r.planeChangeDeltaV + r.reserveDeltaV;
        expect(Math.abs(sum - r.requiredDeltaV)).toBeLessThan(1e-6 * r.requiredDeltaV);
        expect(r.totalLosses).toBeCloseTo(r.gravityLoss + r.dragLoss + r.steeringLoss, 9);
      }
    }
  });

  test('the stage masses deliver the required delta-v by the rocket equation (Tsiolkovsky)', () => {
    // Independent of the core: Δv = Σ Isp_i·G0·ln(m0_i/mf_i) from the flat mass columns, with the
    // Isp the evaluator documents (stage 1 ½(Isp_sl + Isp_vac), upper stages vacuum).
    for (const spec of [sizing, payload]) {
      const ev = makeEvaluator(spec);
      for (let i = 0; i < Math.min(ev.total, 75); i++) {
        const r = ev.evaluate(i);
        if (r.failMask & CASE_REASON_BIT.DELTA_V_UNREACHABLE) continue;
        const d = evaluateCase(spec, caseAt(spec, i).params, i).detail!;
        const prop = [r.stage1PropellantMass!, r.stage2PropellantMass!];
        const dry = [r.stage1DryMass!, r.stage2DryMass!];
        const top = r.payloadMass;
        const m0 = [top + prop[0] + dry[0] + prop[1] + dry[1], top + prop[1] + dry[1]];
        const isp = [0.5 * (d.stages[0].ispSeaLevel + d.stages[0].ispVacuum), d.stages[1].ispVacuum];
        const dv = isp[0] * G0 * Math.log(m0[0] / (m0[0] - prop[0])) + isp[1] * G0 * Math.log(m0[1] / (m0[1] - prop[1]));
        expect(Math.abs(dv - r.requiredDeltaV), `case ${i}`).toBeLessThan(1e-6 * r.requiredDeltaV);
        expect(r.glow).toBeCloseTo(m0[0], 6);
        expect(r.payloadFraction).toBeCloseTo(r.payloadMass / r.glow, 12);
      }
    }
  });

  test('rules of thumb: LEO from a 45° site needs 9.3–10.5 km/s; heavier structure → heavier vehicle (common practice)', () => {
    const ev = makeEvaluator(sizing);
    const r = ev.evaluate(12); // ε1 = 0.06, hydrogen... any case: the orbit is the same
    expect(r.requiredDeltaV).toBeGreaterThan(9300);
    expect(r.requiredDeltaV).toBeLessThan(10500);
    // Same propulsion and T/W, ε1 from 0.06 to 0.10: GLOW rises.
    const glows = [0, 15, 30, 45, 60].map((i) => ev.evaluate(i + 7).glow);
    for (let k = 1; k < glows.length; k++) expect(glows[k]).toBeGreaterThan(glows[k - 1]);
  });

  test('feasible cases satisfy every constraint they report a margin for', () => {
    for (const spec of [sizing, payload]) {
      const ev = makeEvaluator(spec);
      for (let i = 0; i < ev.total; i++) {
        const r = ev.evaluate(i);
        if (!r.feasible) continue;
        for (const m of [r.liftoffThrustToWeightMargin, r.dynamicPressureMargin, r.axialAccelerationMargin, r.payloadMargin, r.glowMargin])
          if (m !== null) expect(m).toBeGreaterThanOrEqual(0);
      }
    }
  });

  test('deterministic: two evaluators give identical rows; single-case = bulk', () => {
    for (const spec of [sizing, payload]) {
      const a = makeEvaluator(spec);
      const b = makeEvaluator(assertSweepSpec(JSON.parse(JSON.stringify(spec))));
      for (let i = 0; i < a.total; i += 7) {
        const ra = a.evaluate(i);
        expect(b.evaluate(i)).toEqual(ra);
        const { detail, ...flat } = evaluateCase(spec, caseAt(spec, i).params, i);
        expect(detail).not.toBeNull();
        const { detail: bulkDetail, ...bulk } = ra;
        expect(bulkDetail).toBeNull();
        expect(flat).toEqual(bulk);
      }
    }
  });

  test('evaluateInto reusing one result object gives exactly the rows of evaluate', () => {
    for (const spec of [sizing, payload, EXAMPLE_ASCENT_SPEC]) {
      const ev = makeEvaluator(spec);
      const out = createCaseResult();
      // Backwards, so every reuse follows a different case (stale fields would show).
      for (let i = ev.total - 1; i >= 0; i -= spec === EXAMPLE_ASCENT_SPEC ? 1 : 3) {
        expect({ ...ev.evaluateInto(i, out) }).toEqual(ev.evaluate(i));
      }
    }
  });

  test('detail lists every term with its origin and the stage table', () => {
    const r = evaluateCase(sizing, caseAt(sizing, 3).params, 3);
    const d = r.detail!;
    expect(d.budget.gravityLoss.origin).toBe('correlation');
    expect(d.budget.insertionSpeed.origin).toBe('computed');
    expect(d.budget.rotationAssist.value).toBeCloseTo(-r.rotationAssist, 9);
    expect(d.stages).toHaveLength(2);
    expect(d.params).toEqual(caseAt(sizing, 3).params);
    const withAllowances = assertSweepSpec({ ...EXAMPLE_SIZING_INPUT, losses: { gravity: 1200, drag: 100 } });
    const d2 = evaluateCase(withAllowances, {}).detail!;
    expect(d2.budget.gravityLoss).toMatchObject({ value: 1200, origin: 'allowance' });
    expect(d2.budget.steeringLoss.origin).toBe('correlation');
  });
});

describe('ascent mode', () => {
  test('targeted ascent cases are finite, deterministic, and report simulated losses and max-Q', () => {
    const a = makeEvaluator(EXAMPLE_ASCENT_SPEC);
    const b = makeEvaluator(EXAMPLE_ASCENT_SPEC);
    const rows = Array.from({ length: a.total }, (_, i) => a.evaluate(i));
    rows.forEach((r, i) => {
      expectClean(r);
      expect(b.evaluate(i)).toEqual(r);
      expect(r.payloadMass).toBeGreaterThan(0);
      expect(r.maxDynamicPressure).toBeGreaterThan(0);
    });
    // Rule of thumb (common practice): a higher lift-off T/W lowers the gravity loss and raises max-Q.
    for (let i = 1; i < rows.length; i++) {
      expect(rows[i].gravityLoss).toBeLessThan(rows[i - 1].gravityLoss);
      expect(rows[i].maxDynamicPressure).toBeGreaterThan(rows[i - 1].maxDynamicPressure);
    }
    const d = evaluateCase(EXAMPLE_ASCENT_SPEC, caseAt(EXAMPLE_ASCENT_SPEC, 1).params, 1).detail!;
    expect(d.budget.gravityLoss.origin).toBe('simulated');
    expect(d.ascent?.simulations).toBeGreaterThan(0);
  });
});

describe('summary', () => {
  test('best case per objective equals a brute-force search; feasible share; ρ(ε1, GLOW) > 0', () => {
    const spec = EXAMPLE_SPECS.sizing;
    const ev = makeEvaluator(spec);
    const rows = Array.from({ length: ev.total }, (_, i) => ev.evaluate(i));
    const s = summarizeSweep(spec, [...rows].reverse()); // order must not matter
    const feasible = rows.filter((r) => r.feasible);
    expect(s.feasible).toBe(feasible.length);
    expect(s.feasibleShare).toBeCloseTo(feasible.length / rows.length, 12);
    const minGlow = feasible.reduce((a, b) => (b.glow < a.glow ? b : a));
    expect(s.best[0]).toEqual({ metric: 'glow', direction: 'min', index: minGlow.index, value: minGlow.glow });
    const eps = s.sensitivity.find((x) => x.path === 'stages.0.structuralCoefficient' && x.metric === 'glow')!;
    expect(eps.spearman).toBeGreaterThan(0.3);
    expect(eps.levels).toHaveLength(5);
    [0.06, 0.07, 0.08, 0.09, 0.1].forEach((x, i) => expect(eps.levels[i].level as number).toBeCloseTo(x, 12));
    const means = eps.levels.filter((l) => l.mean !== null).map((l) => l.mean!);
    for (let k = 1; k < means.length; k++) expect(means[k]).toBeGreaterThan(means[k - 1]);
    const prop = s.sensitivity.find((x) => x.path === 'stages.1.propulsion')!;
    expect(prop.spearman).toBeNull();
    expect(prop.levels.map((l) => l.level)).toEqual(['pl-kx-vac', 'pl-mx-vac', 'pl-hx-vac']);
    // The hydrogen upper stage gives the lightest vehicles on average (higher Isp).
    expect(prop.levels[2].mean!).toBeLessThan(prop.levels[0].mean!);
  });

  test('the front of a real sweep: every feasible rank-1 case is non-dominated among the feasible', () => {
    const ev = makeEvaluator(EXAMPLE_SPECS.sizing);
    const rows = Array.from({ length: ev.total }, (_, i) => ev.evaluate(i));
    const ranks = paretoRanks(
      [Float64Array.from(rows, (r) => r.glow), Float64Array.from(rows, (r) => r.dryMass)],
      ['min', 'min'],
      Uint8Array.from(rows, (r) => (r.feasible ? 1 : 0))
    );
    rows.forEach((r, i) => expect(ranks[i] > 0).toBe(r.feasible));
  });

  test('Spearman: ranks with ties take the average rank; ρ of a monotone map is 1', () => {
    expect(Array.from(ranksOf([10, 20, 20, 5]))).toEqual([2, 3.5, 3.5, 1]);
    const x = [1, 2, 3, 4, 5, 6];
    expect(pearson(ranksOf(x), ranksOf(x.map((v) => Math.exp(v))))).toBeCloseTo(1, 12);
    expect(pearson(ranksOf(x), ranksOf(x.map((v) => -v * v)))).toBeCloseTo(-1, 12);
    expect(pearson([1, 1, 1], [1, 2, 3])).toBeNull();
  });
});

describe('stage mass ratio as a swept parameter', () => {
  test('the upper stage delivers c·ln n (Tsiolkovsky) and the optimised first stage the rest', () => {
    const input = structuredClone(EXAMPLE_SIZING_INPUT);
    input.sweep = { parameters: [{ path: 'stages.1.massRatio', values: { kind: 'list', values: [2.5, 3, 3.5, 4] } }], sampling: { plan: 'grid' } };
    const spec = assertSweepSpec(input);
    const ev = makeEvaluator(spec, { detail: true });
    const c2 = 340 * G0; // upper stage vacuum Isp of the example
    const stageDv: number[] = [];
    for (let i = 0; i < ev.total; i++) {
      const r = ev.evaluate(i);
      expectClean(r);
      const n = [2.5, 3, 3.5, 4][i];
      const d = r.detail!;
      expect(d.stages[1].massRatio).toBe(n);
      // Rocket equation for the fixed stage (tolerance: rounding of one logarithm).
      expect(Math.abs(d.stages[1].deltaV - c2 * Math.log(n))).toBeLessThan(1e-9);
      // The two stages together supply the required delta-v.
      expect(Math.abs(d.stages[0].deltaV + d.stages[1].deltaV - r.requiredDeltaV)).toBeLessThan(1e-6);
      expect(d.assumptions.some((a) => /fixed mass ratio/.test(a))).toBe(true);
      stageDv.push(d.stages[1].deltaV);
    }
    // Steps in delta-v follow ln(n_b/n_a) exactly as Tsiolkovsky says.
    expect(Math.abs(stageDv[3] - stageDv[0] - c2 * Math.log(4 / 2.5))).toBeLessThan(1e-9);
    // Same results in bulk evaluation (no detail).
    const bulk = makeEvaluator(spec);
    for (let i = 0; i < ev.total; i++) expect(bulk.evaluate(i).glow).toBe(ev.evaluate(i).glow);
  });

  test('a ratio no stage of its structure reaches is an infeasible case with a reason', () => {
    const input = structuredClone(EXAMPLE_SIZING_INPUT);
    // ε = 0.1 for the upper stage: n must stay below 10.
    input.sweep = { parameters: [{ path: 'stages.1.massRatio', values: { kind: 'list', values: [3, 12] } }], sampling: { plan: 'grid' } };
    const ev = makeEvaluator(assertSweepSpec(input));
    const bad = ev.evaluate(1);
    expectClean(bad);
    expect(bad.reasons).toContain('STAGE_MASS_RATIO_UNREACHABLE');
    expect(bad.glow).toBe(0);
  });
});
