/**
 * Budget-mode throughput: cases per second on one core for evaluateBudgetCase (issue 3 §10,
 * target ≥ 1,000,000 cases/s per core). Prints figures, asserts nothing.
 * Run: npx tsx tests/bench/physics-budget.bench.ts
 */
import {
  createBudgetCaseInput,
  createBudgetCaseResult,
  evaluateBudgetCase,
  optimalStaging
} from '../../src/lib/physics/index';

const input = createBudgetCaseInput();
const result = createBudgetCaseResult();

/** Deterministic grid values (a sweep changes Isp, ε and T/W every case). */
const ISP1 = [270, 285, 300, 311, 320];
const ISP2 = [320, 345, 380, 421, 450];
const EPS = [0.05, 0.07, 0.09, 0.12, 0.16];
const TW = [1.15, 1.25, 1.35, 1.5, 1.8];
const ALT = [185e3, 200e3, 300e3, 400e3];

function runSizing(cases: number, stages: number, varyOrbit: boolean): number {
  input.mode = 'sizing';
  input.stageCount = stages;
  input.payloadMass = 5000;
  let sink = 0;
  for (let i = 0; i < cases; i++) {
    input.isp[0] = ISP1[i % 5];
    input.isp[1] = ISP2[(i / 5) % 5 | 0];
    input.isp[2] = ISP2[(i / 25) % 5 | 0];
    input.isp[3] = ISP2[(i / 7) % 5 | 0];
    input.structuralCoefficient[0] = EPS[(i / 125) % 5 | 0];
    input.structuralCoefficient[1] = EPS[(i / 625) % 5 | 0];
    input.structuralCoefficient[2] = EPS[(i / 3) % 5 | 0];
    input.structuralCoefficient[3] = EPS[(i / 11) % 5 | 0];
    input.thrustToWeight[0] = TW[(i / 3125) % 5 | 0];
    input.thrustToWeight[1] = 0.9;
    input.thrustToWeight[2] = 0.8;
    input.thrustToWeight[3] = 0.7;
    if (varyOrbit) {
      const h = ALT[i % 4];
      input.targetPerigeeAltitude = h;
      input.targetApogeeAltitude = h;
      input.targetInclination = 28.5 + ((i >> 2) % 3) * 10;
    }
    evaluateBudgetCase(input, result);
    sink += result.grossMass;
  }
  return sink;
}

function runVehicle(cases: number): number {
  input.mode = 'vehicle';
  input.stageCount = 2;
  input.targetPerigeeAltitude = 200e3;
  input.targetApogeeAltitude = 200e3;
  input.targetInclination = 28.5;
  let sink = 0;
  for (let i = 0; i < cases; i++) {
    input.isp[0] = ISP1[i % 5];
    input.isp[1] = ISP2[(i / 5) % 5 | 0];
    input.propellantMass[0] = 150000 + 1000 * (i % 7);
    input.propellantMass[1] = 25000 + 500 * (i % 11);
    input.dryMass[0] = 11000 + 100 * (i % 3);
    input.dryMass[1] = 2500;
    input.thrust[0] = 2.6e6;
    input.thrust[1] = 3.0e5;
    evaluateBudgetCase(input, result);
    sink += result.payloadMass;
  }
  return sink;
}

function measure(label: string, fn: (n: number) => number, n: number): void {
  fn(Math.min(n, 200_000)); // warm-up (JIT)
  const t0 = process.hrtime.bigint();
  const cpu0 = process.cpuUsage();
  const sink = fn(n);
  const cpu = process.cpuUsage(cpu0);
  const s = Number(process.hrtime.bigint() - t0) / 1e9;
  // Per core: cases per second of this process's CPU time (user + system), so a busy shared
  // machine does not understate the figure; wall-clock rate printed beside it.
  const cpuS = (cpu.user + cpu.system) / 1e6;
  const fmt = (x: number) => x.toLocaleString('en-US', { maximumFractionDigits: 0 }).padStart(11);
  console.log(`${label.padEnd(54)} ${fmt(n / cpuS)} cases/s per core (CPU time) | ${fmt(n / s)} wall | ${n} cases, checksum ${sink.toExponential(6)}`);
}

const N = Number(process.env.BENCH_CASES ?? 2_000_000);
console.log(`physics budget-mode bench, one core, Node ${process.version}`);
measure('sizing, 2 stages, fixed orbit (evaluateBudgetCase)', (n) => runSizing(n, 2, false), N);
measure('sizing, 3 stages, fixed orbit', (n) => runSizing(n, 3, false), N);
measure('sizing, 4 stages, fixed orbit', (n) => runSizing(n, 4, false), N);
measure('sizing, 2 stages, orbit changes every case', (n) => runSizing(n, 2, true), N);
measure('vehicle (payload of given stages), 2 stages', (n) => runVehicle(n), N);
measure('optimalStaging() object API, 2 stages (allocates)', (n) => {
  let s = 0;
  for (let i = 0; i < n; i++) {
    s += optimalStaging(
      [
        { isp: ISP1[i % 5], structuralCoefficient: EPS[(i / 5) % 5 | 0] },
        { isp: ISP2[(i / 25) % 5 | 0], structuralCoefficient: 0.09 }
      ],
      9300
    ).payloadFraction;
  }
  return s;
}, Math.floor(N / 4));
