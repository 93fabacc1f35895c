/**
 * Sweep engine throughput on one core (prints figures; no timed asserts):
 * case generation alone (grid, Latin hypercube, random) and generation + budget-mode evaluation
 * (sizing and payload problems). Run: `npx tsx tests/bench/sweep-evaluate.bench.ts`.
 */
import { EXAMPLE_PAYLOAD_INPUT, EXAMPLE_SIZING_INPUT } from '../../src/lib/sweep/examples';
import { makeCasePlan } from '../../src/lib/sweep/cases';
import { createCaseResult, makeEvaluator } from '../../src/lib/sweep/evaluate';
import { assertSweepSpec, type SweepSpecInput } from '../../src/lib/sweep/spec';

function rate(label: string, n: number, fn: () => number): void {
  fn(); // warm-up
  const t0 = performance.now();
  const cpu0 = process.cpuUsage();
  const check = fn();
  const cpu = process.cpuUsage(cpu0);
  const s = (performance.now() - t0) / 1000;
  // Per core: cases per second of this process's CPU time (the machine may be shared), wall beside it.
  const cpuS = (cpu.user + cpu.system) / 1e6;
  const fmt = (x: number) => Math.round(x).toLocaleString('en-US').padStart(11);
  console.log(`sweep  ${label.padEnd(66)} ${fmt(n / cpuS)} cases/s per core (CPU) | ${fmt(n / s)} wall  (${n.toLocaleString('en-US')} in ${s.toFixed(2)} s; check ${check.toFixed(0)})`);
}

const sizingGrid: SweepSpecInput = {
  ...EXAMPLE_SIZING_INPUT,
  sweep: {
    parameters: [
      { path: 'stages.0.structuralCoefficient', values: { kind: 'count', min: 0.05, max: 0.12, count: 50 } },
      { path: 'stages.1.structuralCoefficient', values: { kind: 'count', min: 0.06, max: 0.14, count: 40 } },
      { path: 'liftoffThrustToWeight', values: { kind: 'count', min: 1.15, max: 1.8, count: 25 } },
      { path: 'stages.1.ispVacuum', values: { kind: 'count', min: 320, max: 460, count: 20 } }
    ],
    sampling: { plan: 'grid' }
  }
};
const payloadLhs: SweepSpecInput = {
  ...EXAMPLE_PAYLOAD_INPUT,
  sweep: {
    parameters: [
      { path: 'target.inclination', values: { kind: 'uniform', min: 45, max: 98 } },
      { path: 'stages.1.ispVacuum', values: { kind: 'normal', mean: 340, sd: 4, min: 328, max: 352 } },
      { path: 'target.altitude', values: { kind: 'uniform', min: 300e3, max: 800e3 } }
    ],
    sampling: { plan: 'latinHypercube', samples: 1_000_000, seed: 7 }
  }
};
const payloadRandom: SweepSpecInput = { ...payloadLhs, sweep: { ...payloadLhs.sweep, sampling: { plan: 'random', samples: 1_000_000, seed: 7 } } };

for (const [label, input] of [
  ['grid, 4 parameters', sizingGrid],
  ['Latin hypercube, 3 parameters', payloadLhs],
  ['random, 3 parameters', payloadRandom]
] as const) {
  const spec = assertSweepSpec(input);
  const plan = makeCasePlan(spec);
  const out = new Float64Array(plan.dimensions.length);
  rate(`generate only: ${label}`, plan.total, () => {
    let s = 0;
    for (let i = 0; i < plan.total; i++) s += plan.fill(i, out)[0];
    return s;
  });
}

for (const [label, input] of [
  ['generate + evaluate: sizing, budget mode, grid', sizingGrid],
  ['generate + evaluate: payload, budget mode, LHS', payloadLhs]
] as const) {
  const ev = makeEvaluator(assertSweepSpec(input));
  rate(`${label} (evaluate)`, ev.total, () => {
    let s = 0;
    for (let i = 0; i < ev.total; i++) s += ev.evaluate(i).glow;
    return s;
  });
  // The chunk loop of a worker: one result object reused for every case (same values).
  const out = createCaseResult();
  rate(`${label} (evaluateInto)`, ev.total, () => {
    let s = 0;
    for (let i = 0; i < ev.total; i++) s += ev.evaluateInto(i, out).glow;
    return s;
  });
}
