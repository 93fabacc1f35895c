/**
 * The budget-mode loss correlation against the ascent model it was fitted to
 * (tests/fixtures/loss-correlation/fit.ts → fit.json), on invented vehicles only.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { DEFAULT_LOSS_CORRELATION, buildDeltaVBudget, lossAllowances } from '../../../src/lib/physics/budget';
import { createBudgetCaseInput, createBudgetCaseResult, evaluateBudgetCase } from '../../../src/lib/physics/evaluate';
import { circularSpeed } from '../../../src/lib/physics/orbits';
import { simulateLossCase, type LossCase } from '../../fixtures/loss-correlation/vehicles';

interface Stats { rms: number; maxAbs: number }
const fit = JSON.parse(readFileSync(new URL('../../fixtures/loss-correlation/fit.json', import.meta.url), 'utf8')) as {
  coefficients: { gravity: { a: number; b: number; c: number }; drag: { d0: number; d1: number }; steering: { s: number; sh: number }; maxQ: { q0: number; q1: number } };
  grid: { liftoffThrustToWeight: number[]; upperStageThrustToWeight: number[]; altitude: number[]; payloadMass: number[]; assist: number[]; feasible: number; ranges: { liftoffThrustToWeight: number[]; altitude: number[] } };
  residuals: { gravity: Stats; drag: Stats; steering: Stats; total: Stats; maxDynamicPressure: Stats };
};

describe('DEFAULT_LOSS_CORRELATION is the committed fit (no drift between code and fixture)', () => {
  it('coefficients equal fit.json exactly', () => {
    const c = DEFAULT_LOSS_CORRELATION;
    expect(c.gravity).toEqual(fit.coefficients.gravity);
    expect(c.drag).toEqual(fit.coefficients.drag);
    expect(c.steering).toEqual(fit.coefficients.steering);
    expect(c.maxQ).toEqual(fit.coefficients.maxQ);
  });
  it('validity ranges are the fitted ranges, and the source names the fit', () => {
    const c = DEFAULT_LOSS_CORRELATION;
    expect(c.validThrustToWeight.min).toBeCloseTo(fit.grid.ranges.liftoffThrustToWeight[0], 2);
    expect(c.validThrustToWeight.max).toBeCloseTo(fit.grid.ranges.liftoffThrustToWeight[1], 2);
    expect(c.validBurnoutAltitude).toEqual({ min: fit.grid.ranges.altitude[0], max: fit.grid.ranges.altitude[1] });
    expect(c.source).toMatch(/fit\.ts/);
    expect(c.source).toContain(String(fit.grid.feasible));
  });
  it('the fast evaluator uses the same correlation as lossAllowances (budget and sweep agree)', () => {
    const input = createBudgetCaseInput();
    const out = createBudgetCaseResult();
    input.stageCount = 2;
    input.isp.set([300, 345]);
    input.structuralCoefficient.set([0.07, 0.09]);
    input.thrustToWeight.set([1.45, 0.9]);
    input.payloadMass = 5000;
    input.targetInclination = 90; // any latitude reaches a polar orbit directly
    for (const h of [150e3, 200e3, 450e3, 800e3]) {
      input.targetPerigeeAltitude = h;
      input.targetApogeeAltitude = h;
      evaluateBudgetCase(input, out);
      const l = lossAllowances(1.45, h);
      // Same formula, same double arithmetic: agreement to rounding.
      expect(Math.abs(out.gravityLoss - l.gravityLoss), `h ${h}`).toBeLessThan(1e-9);
      expect(Math.abs(out.dragLoss - l.dragLoss), `h ${h}`).toBeLessThan(1e-9);
      expect(Math.abs(out.steeringLoss - l.steeringLoss), `h ${h}`).toBeLessThan(1e-9);
      expect(Math.abs(out.maxDynamicPressure - l.maxDynamicPressure), `h ${h}`).toBeLessThan(1e-6);
    }
  });
});

/**
 * Held-out invented vehicles: lift-off T/W, upper-stage T/W, altitude, payload and rotation
 * credit all between the fit grid's points (none of these values is a grid value), flown the
 * same way as the grid (tests/fixtures/loss-correlation/vehicles.ts).
 */
const HELD_OUT: LossCase[] = [
  { family: 'two-stage', liftoffThrustToWeight: 1.22, upperStageThrustToWeight: 0.8, altitude: 250e3, payloadMass: 5e3, assist: 200 },
  { family: 'two-stage', liftoffThrustToWeight: 1.62, upperStageThrustToWeight: 1.0, altitude: 700e3, payloadMass: 5e3, assist: 200 },
  { family: 'three-stage', liftoffThrustToWeight: 1.88, upperStageThrustToWeight: 1.0, altitude: 250e3, payloadMass: 5e3, assist: 200 },
  { family: 'two-stage', liftoffThrustToWeight: 1.22, upperStageThrustToWeight: 1.3, altitude: 500e3, payloadMass: 5e3, assist: 200 },
  { family: 'three-stage', liftoffThrustToWeight: 1.4, upperStageThrustToWeight: 1.3, altitude: 700e3, payloadMass: 5e3, assist: 200 },
  { family: 'two-stage', liftoffThrustToWeight: 1.62, upperStageThrustToWeight: 0.8, altitude: 250e3, payloadMass: 20e3, assist: 200 },
  { family: 'three-stage', liftoffThrustToWeight: 1.88, upperStageThrustToWeight: 0.8, altitude: 500e3, payloadMass: 20e3, assist: 200 },
  { family: 'two-stage', liftoffThrustToWeight: 1.22, upperStageThrustToWeight: 1.0, altitude: 700e3, payloadMass: 20e3, assist: 200 },
  { family: 'three-stage', liftoffThrustToWeight: 1.4, upperStageThrustToWeight: 1.0, altitude: 250e3, payloadMass: 20e3, assist: 200 },
  { family: 'two-stage', liftoffThrustToWeight: 1.62, upperStageThrustToWeight: 1.3, altitude: 500e3, payloadMass: 20e3, assist: 200 },
  { family: 'three-stage', liftoffThrustToWeight: 1.88, upperStageThrustToWeight: 1.3, altitude: 700e3, payloadMass: 20e3, assist: 200 },
  { family: 'two-stage', liftoffThrustToWeight: 1.35, upperStageThrustToWeight: 0.95, altitude: 300e3, payloadMass: 30e3, assist: 300 },
  { family: 'three-stage', liftoffThrustToWeight: 1.55, upperStageThrustToWeight: 1.1, altitude: 300e3, payloadMass: 30e3, assist: 100 },
  { family: 'two-stage', liftoffThrustToWeight: 1.7, upperStageThrustToWeight: 0.75, altitude: 450e3, payloadMass: 8e3, assist: 300 }
];

describe('held-out vehicles: the correlation stays inside the stated residual band', () => {
  for (const c of HELD_OUT) {
    for (const [k, vals] of Object.entries(fit.grid)) {
      if (Array.isArray(vals) && k in c && k !== 'family') expect(vals, `held-out ${k} ${String(c[k as keyof LossCase])} must not be a grid value`).not.toContain(c[k as keyof LossCase]);
    }
  }
  const sims = HELD_OUT.map((c) => ({ c, r: simulateLossCase(c) }));
  const ok = sims.filter((s) => s.r.feasible);

  it('the ascent model flies (nearly) all of them', () => {
    // One infeasible case is tolerated: like 12 % of the fit grid, a direct ascent can fall outside the steering family.
    expect(ok.length).toBeGreaterThanOrEqual(HELD_OUT.length - 1);
  });

  // Band (stated in budget.ts and fit.json): the fit's own max |residual| per term plus 10 %
  // for vehicles between grid points; and the held-out RMS within 1.5 × the fit's RMS.
  const terms = [
    ['gravity', (l: ReturnType<typeof lossAllowances>) => l.gravityLoss, (r: (typeof ok)[number]['r']) => r.gravity],
    ['drag', (l: ReturnType<typeof lossAllowances>) => l.dragLoss, (r: (typeof ok)[number]['r']) => r.drag],
    ['steering', (l: ReturnType<typeof lossAllowances>) => l.steeringLoss, (r: (typeof ok)[number]['r']) => r.steering],
    ['total', (l: ReturnType<typeof lossAllowances>) => l.gravityLoss + l.dragLoss + l.steeringLoss, (r: (typeof ok)[number]['r']) => r.gravity + r.drag + r.steering],
    ['maxDynamicPressure', (l: ReturnType<typeof lossAllowances>) => l.maxDynamicPressure, (r: (typeof ok)[number]['r']) => r.maxQ]
  ] as const;
  for (const [name, corr, sim] of terms) {
    it(`${name}: every held-out residual within 1.1 × the fit's max |residual|, RMS within 1.5 × the fit's`, () => {
      const band = 1.1 * fit.residuals[name].maxAbs;
      let ss = 0;
      for (const { c, r } of ok) {
        const res = sim(r) - corr(lossAllowances(r.psi, c.altitude));
        ss += res * res;
        expect(Math.abs(res), `${JSON.stringify(c)}: simulated ${sim(r).toFixed(1)}, residual ${res.toFixed(1)}, band ±${band.toFixed(1)}`).toBeLessThanOrEqual(band);
      }
      expect(Math.sqrt(ss / ok.length)).toBeLessThanOrEqual(1.5 * fit.residuals[name].rms);
    });
  }
});

describe('rules of the trade with the fitted defaults (common practice)', () => {
  // A large two-stage vehicle at lift-off T/W ≈ 1.3 to a low orbit: total ascent losses ≈ 1.5–2
  // km/s, and orbital speed + losses ≈ 9.3–10 km/s (7.8 km/s + 1.5–2 km/s, before any credit
  // for Earth's rotation) — common practice.
  it.each([185e3, 200e3])('T/W 1.3 to %s m: losses 1.5–2 km/s, orbital speed + losses 9.3–10 km/s', (h) => {
    const b = buildDeltaVBudget({ target: { perigeeAltitude: h, inclination: 90 }, latitude: 28.5, liftoffThrustToWeight: 1.3 });
    expect(b.ascentLosses).toBeGreaterThanOrEqual(1500);
    expect(b.ascentLosses).toBeLessThanOrEqual(2000);
    // Polar target: azimuth 0, no rotation credit, so the budget total is orbital speed + losses.
    expect(Math.abs(b.terms.rotationAssist.value)).toBeLessThan(1e-9);
    expect(b.total).toBeGreaterThanOrEqual(9300);
    expect(b.total).toBeLessThanOrEqual(10000);
    expect(Math.abs(b.total - circularSpeed(h) - b.ascentLosses)).toBeLessThan(1e-9);
  });

  it('the correlation agrees with a simulated large two-stage invented vehicle at T/W 1.3 to 200 km', () => {
    // Invented, outside the fit grid (45 t payload, upper-stage T/W 0.85, rotation credit 0).
    const c: LossCase = { family: 'two-stage', liftoffThrustToWeight: 1.3, upperStageThrustToWeight: 0.85, altitude: 200e3, payloadMass: 45e3, assist: 0 };
    const r = simulateLossCase(c);
    expect(r.feasible, r.reason).toBe(true);
    expect(r.grossMass).toBeGreaterThan(1e6); // "large": over 1,000 t at lift-off
    const l = lossAllowances(r.psi, 200e3);
    const sim = r.gravity + r.drag + r.steering;
    const est = l.gravityLoss + l.dragLoss + l.steeringLoss;
    // Both in the common-practice band, and within the fit's RMS of each other.
    for (const v of [sim, est]) {
      expect(v).toBeGreaterThanOrEqual(1500);
      expect(v).toBeLessThanOrEqual(2000);
    }
    expect(Math.abs(sim - est)).toBeLessThanOrEqual(fit.residuals.total.rms);
  });
});
