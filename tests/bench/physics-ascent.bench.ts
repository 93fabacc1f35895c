/**
 * Ascent-mode benchmark (plain script: `npx tsx tests/bench/physics-ascent.bench.ts`). It prints
 * figures and never asserts times. One process, one thread: every rate is per core.
 *
 * 1. One flight: the fixed-step RK4 (defaults 1 s / 8 s) against mathjs solveODE (RK45) on the
 *    same trajectory, with the error of each against a tight RK4 run (0.02 s / 0.05 s).
 * 2. Ascent mode with targeting: a sweep of invented two-stage vehicles (lift-off T/W × upper
 *    stage Isp × target altitude), evaluated in order with each case warm-started from the
 *    previous one (what a sweep chunk does), then the same cases cold.
 * 3. Payload error of those cases against a tight-tolerance reference (steps 0.02 s / 0.05 s,
 *    tolerances 1 m, 1e-4°, 0.01 m/s).
 * 4. Ascent-mode sizing (gross lift-off mass for a required payload) cases/s.
 */
import { ascentPayload, compileAscentVehicle, simulateAscent, type AscentSolution } from '../../src/lib/physics/ascent';
import { sizeAscentVehicle, type AscentSizingSolution } from '../../src/lib/physics/ascent-sizing';
import { DEFAULT_DRAG_COEFFICIENT } from '../../src/lib/physics/drag';
import { referenceAscent } from '../unit/physics/ascent-reference';

const quick = process.argv.includes('--quick');
const fmt = (x: number, d = 1) => x.toFixed(d);

function stages(twScale: number, isp2: number) {
  return [
    { propellantMass: 400e3, dryMass: 28e3, thrustVacuum: 7.7e6 * twScale, ispVacuum: 320, ispSeaLevel: 290 },
    { propellantMass: 100e3, dryMass: 7e3, thrustVacuum: 1.0e6, ispVacuum: isp2, ispSeaLevel: isp2 - 95 }
  ];
}
const vehicleOf = (twScale: number, isp2: number) =>
  compileAscentVehicle({ stages: stages(twScale, isp2), referenceArea: 10, dragCoefficient: DEFAULT_DRAG_COEFFICIENT, nominalPayloadMass: 15e3 });

/** CPU time of this process [ms] (user + system): insensitive to other processes on the machine. */
const cpuMs = () => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
};

/** Best of `reps` timings of fn() repeated `n` times [ms per call]. */
function time(fn: () => unknown, n: number, reps = 5): number {
  let best = Infinity;
  for (let r = 0; r < reps; r++) {
    const t0 = performance.now();
    for (let i = 0; i < n; i++) fn();
    best = Math.min(best, (performance.now() - t0) / n);
  }
  return best;
}

console.log('Loftwise ascent benchmark (one thread; wall rates vary ±10–40 % on a shared machine, CPU-second rates less)\n');

// 1. One flight: RK4 vs mathjs solveODE ------------------------------------------------------
{
  const v = vehicleOf(1, 345);
  const sol = ascentPayload(v, { altitude: 200e3 });
  const controls = { pitchKick: sol.pitchKick, finalPitch: sol.finalPitch };
  const refInput = {
    stages: stages(1, 345),
    payloadMass: sol.payloadMass,
    referenceArea: 10,
    dragCoefficient: DEFAULT_DRAG_COEFFICIENT,
    verticalRiseTime: v.verticalRiseTime,
    pitchKick: sol.pitchKick,
    steering: { startStage: 1, finalPitch: sol.finalPitch }
  };
  const tight = simulateAscent(v, sol.payloadMass, controls, { timeStep: { atmosphere: 0.02, vacuum: 0.05 } });
  const rk4 = simulateAscent(v, sol.payloadMass, controls);
  const msRk4 = time(() => simulateAscent(v, sol.payloadMass, controls), 500);
  const ref9 = referenceAscent(refInput, 1e-9);
  const msRef9 = time(() => referenceAscent(refInput, 1e-9), 1, 3);
  const ref6 = referenceAscent(refInput, 1e-6);
  const msRef6 = time(() => referenceAscent(refInput, 1e-6), 2, 3);
  const steps = Math.ceil(v.burnTime[0]) + Math.ceil(v.burnTime[1] / 8);
  console.log('1. One steered two-stage flight to burnout (same equations, same trajectory)');
  console.log(`   RK4 fixed step 1 s / 8 s (${steps} steps):      ${fmt(msRk4 * 1000)} µs per flight`);
  console.log(`   mathjs solveODE RK45 tol 1e-9 (${ref9.steps} steps): ${fmt(msRef9 * 1000)} µs   → RK4 is ${fmt(msRef9 / msRk4, 0)}× faster`);
  console.log(`   mathjs solveODE RK45 tol 1e-6 (${ref6.steps} steps): ${fmt(msRef6 * 1000)} µs   → RK4 is ${fmt(msRef6 / msRk4, 0)}× faster`);
  const row = (name: string, r: { speed: number; altitude: number; gravityLoss: number; dragLoss: number; steeringLoss: number; maxDynamicPressure: number }) =>
    console.log(
      `   ${name.padEnd(26)} ΔV ${fmt(r.speed - tight.burnout.speed, 3).padStart(7)} m/s  Δh ${fmt(r.altitude - tight.burnout.altitude, 1).padStart(6)} m  ` +
        `Δgrav ${fmt(r.gravityLoss - tight.gravityLoss, 3).padStart(7)}  Δdrag ${fmt(r.dragLoss - tight.dragLoss, 4).padStart(7)}  ` +
        `Δsteer ${fmt(r.steeringLoss - tight.steeringLoss, 4).padStart(7)} m/s  max-Q ${fmt((r.maxDynamicPressure / tight.maxDynamicPressure - 1) * 100, 3)} %`
    );
  console.log('   error against the tight RK4 run (0.02 s / 0.05 s):');
  row('RK4 1 s / 8 s', { ...rk4.burnout, ...rk4 });
  row('solveODE tol 1e-9', ref9);
  row('solveODE tol 1e-6', ref6);
  console.log('   (solveODE max-Q is the largest value at its own output points, so it reads low when they are sparse)');
  console.log('');
}

// 2. + 3. Ascent mode with targeting --------------------------------------------------------
{
  const tws = quick ? [1.0, 1.2] : [0.9, 1.0, 1.1, 1.2, 1.3];
  const isps = quick ? [345, 360] : [340, 350, 360, 370];
  const alts = quick ? [200e3, 300e3] : [200e3, 250e3, 300e3, 400e3, 500e3];
  const cases: Array<{ v: ReturnType<typeof vehicleOf>; alt: number }> = [];
  for (const tw of tws) for (const isp of isps) for (const alt of alts) cases.push({ v: vehicleOf(tw, isp), alt });
  const reps = quick ? 2 : 4;

  const run = (warm: boolean) => {
    let prev: AscentSolution | undefined;
    let sims = 0;
    let feasible = 0;
    const payloads: number[] = [];
    const c0 = cpuMs();
    const t0 = performance.now();
    for (let rep = 0; rep < reps; rep++) {
      prev = undefined;
      for (const c of cases) {
        const r = ascentPayload(c.v, { altitude: c.alt }, warm ? { warmStart: prev } : {});
        sims += r.simulations;
        if (r.feasible) {
          feasible++;
          prev = r.solution;
        }
        if (rep === 0) payloads.push(r.feasible ? r.payloadMass : NaN);
      }
    }
    const ms = performance.now() - t0;
    const cpu = cpuMs() - c0;
    const n = cases.length * reps;
    return { rate: (n / ms) * 1000, cpuRate: (n / cpu) * 1000, sims: sims / n, feasible: feasible / reps, payloads };
  };
  run(true); // warm-up (JIT)
  const w = run(true);
  const c = run(false);
  console.log(`2. Ascent mode with targeting (max payload to a circular orbit), ${cases.length} cases × ${reps}`);
  console.log(`   warm-started in sweep order: ${fmt(w.rate, 0)} cases/s wall, ${fmt(w.cpuRate, 0)} cases per CPU-second (one core), ${fmt(w.sims)} flights/case, ${w.feasible}/${cases.length} feasible`);
  console.log(`   cold (no warm start):        ${fmt(c.rate, 0)} cases/s wall, ${fmt(c.cpuRate, 0)} cases per CPU-second (one core), ${fmt(c.sims)} flights/case, ${c.feasible}/${cases.length} feasible`);

  let worst = 0;
  let sum = 0;
  let count = 0;
  let coldVsWarm = 0;
  for (let i = 0; i < cases.length; i++) {
    const p = w.payloads[i];
    if (!Number.isFinite(p)) continue;
    const ref = ascentPayload(cases[i].v, { altitude: cases[i].alt }, {
      timeStep: { atmosphere: 0.02, vacuum: 0.05 },
      tolerance: { altitude: 1, flightPathAngle: 1e-4, speed: 0.01 },
      maxSimulations: 80
    });
    if (!ref.feasible) continue;
    const e = Math.abs(p / ref.payloadMass - 1);
    worst = Math.max(worst, e);
    sum += e;
    count++;
    if (Number.isFinite(c.payloads[i])) coldVsWarm = Math.max(coldVsWarm, Math.abs(c.payloads[i] / p - 1));
  }
  console.log(`3. Payload error vs tight-tolerance reference (0.02 s / 0.05 s steps; 1 m, 1e-4°, 0.01 m/s), ${count} cases`);
  console.log(`   max ${fmt(worst * 100, 4)} %, mean ${fmt((sum / Math.max(count, 1)) * 100, 4)} %   (cold vs warm start differ by ≤ ${fmt(coldVsWarm * 100, 4)} %)`);
  console.log('');
}

// 2b. A wide sweep, including hard and infeasible corners --------------------------------------
{
  const cases: Array<{ v: ReturnType<typeof compileAscentVehicle>; alt: number }> = [];
  const isps = quick ? [340] : [340, 450];
  for (const nst of [2, 3])
    for (const tw1 of [1.15, 1.3, 1.6, 2.0])
      for (const tw2 of [0.4, 0.7, 1.2])
        for (const alt of [150e3, 300e3, 800e3])
          for (const isp2 of isps) {
            const st =
              nst === 2
                ? [
                    { propellantMass: 400e3, dryMass: 28e3, thrustVacuum: 0, ispVacuum: 320, ispSeaLevel: 290 },
                    { propellantMass: 100e3, dryMass: 8e3, thrustVacuum: 0, ispVacuum: isp2, ispSeaLevel: isp2 - 100 }
                  ]
                : [
                    { propellantMass: 400e3, dryMass: 28e3, thrustVacuum: 0, ispVacuum: 320, ispSeaLevel: 290 },
                    { propellantMass: 90e3, dryMass: 7e3, thrustVacuum: 0, ispVacuum: 340, ispSeaLevel: 250 },
                    { propellantMass: 20e3, dryMass: 2.5e3, thrustVacuum: 0, ispVacuum: isp2, ispSeaLevel: isp2 - 100 }
                  ];
            let above = 10e3;
            const ign: number[] = [];
            for (let i = st.length - 1; i >= 0; i--) {
              above += st[i].propellantMass + st[i].dryMass;
              ign[i] = above;
            }
            st[0].thrustVacuum = tw1 * ign[0] * 9.80665 * (320 / 290);
            for (let i = 1; i < st.length; i++) st[i].thrustVacuum = tw2 * ign[i] * 9.80665;
            cases.push({ v: compileAscentVehicle({ stages: st, referenceArea: 10, dragCoefficient: DEFAULT_DRAG_COEFFICIENT, nominalPayloadMass: 10e3 }), alt });
          }
  let prev: AscentSolution | undefined;
  let sims = 0;
  const reasons: Record<string, number> = {};
  const c0 = cpuMs();
  const t0 = performance.now();
  for (const c of cases) {
    const r = ascentPayload(c.v, { altitude: c.alt }, { warmStart: prev });
    sims += r.simulations;
    const key = r.feasible ? 'feasible' : r.reasons[0];
    reasons[key] = (reasons[key] ?? 0) + 1;
    if (r.feasible) prev = r.solution;
  }
  const ms = performance.now() - t0;
  const cpu = cpuMs() - c0;
  console.log(`2b. Wide sweep (2–3 stages, lift-off T/W 1.15–2.0, upper-stage T/W 0.4–1.2, direct ascent to 150–800 km), ${cases.length} cases`);
  console.log(`   ${fmt((cases.length / ms) * 1000, 0)} cases/s wall, ${fmt((cases.length / cpu) * 1000, 0)} cases per CPU-second, ${fmt(sims / cases.length)} flights/case; outcomes ${JSON.stringify(reasons)}`);
  console.log('');
}

// 4. Sizing ---------------------------------------------------------------------------------
{
  const payloads = quick ? [10e3, 12e3] : [8e3, 10e3, 12e3, 14e3, 16e3, 18e3, 20e3, 22e3];
  const tws = quick ? [1.3] : [1.25, 1.35, 1.45];
  const inputs = [];
  for (const tw of tws)
    for (const p of payloads)
      inputs.push({
        stages: [
          { ispVacuum: 320, ispSeaLevel: 290, structuralCoefficient: 0.07, thrustToWeight: tw },
          { ispVacuum: 345, ispSeaLevel: 250, structuralCoefficient: 0.08, thrustToWeight: 0.9 }
        ],
        payloadMass: p,
        referenceArea: 10,
        dragCoefficient: DEFAULT_DRAG_COEFFICIENT
      });
  let prev: AscentSizingSolution | undefined;
  let sims = 0;
  let passes = 0;
  let feasible = 0;
  const c0 = cpuMs();
  const t0 = performance.now();
  for (const inp of inputs) {
    const r = sizeAscentVehicle(inp, { altitude: 200e3 }, { warmStart: prev });
    sims += r.simulations;
    passes += r.passes;
    if (r.feasible) {
      feasible++;
      prev = r.solution;
    }
  }
  const ms = performance.now() - t0;
  const cpu = cpuMs() - c0;
  console.log(`4. Ascent-mode sizing (gross lift-off mass for a payload), ${inputs.length} cases, warm-started`);
  console.log(
    `   ${fmt((inputs.length / ms) * 1000, 0)} cases/s wall, ${fmt((inputs.length / cpu) * 1000, 0)} cases per CPU-second, ${fmt(passes / inputs.length)} loss-iteration passes/case, ${fmt(sims / inputs.length)} flights/case, ${feasible}/${inputs.length} feasible`
  );
}
