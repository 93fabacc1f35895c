/**
 * Sizing with fixed stage mass ratios (evaluateBudgetCase, sizing mode, `massRatio` given).
 * Reference: the Tsiolkovsky rocket equation Δv = Isp·g0·ln(m0/mf) per stage (Sutton & Biblarz,
 * Rocket Propulsion Elements, eq. 4-6) and the definitions n = m0/mf, ε = ms/(ms + mp), worked
 * by hand below; g0 = 9.80665 m/s² (CGPM 1901 standard gravity).
 */
import { describe, expect, it } from 'vitest';
import {
  createBudgetCaseInput,
  evaluateBudgetCase,
  explainBudgetCase,
  type BudgetCaseInput
} from '../../../src/lib/physics/evaluate';
import { REASON_BIT } from '../../../src/lib/physics/reasons';

const g0 = 9.80665;

/** Two stages, Isp 300 / 350 s, ε 0.08 / 0.10, 1,000 kg payload, losses given (so the budget is fixed). */
function input(gravityLoss = 0): BudgetCaseInput {
  const i = createBudgetCaseInput();
  i.stageCount = 2;
  i.isp.set([300, 350]);
  i.structuralCoefficient.set([0.08, 0.1]);
  i.thrustToWeight.set([1.4, 0.9]);
  i.payloadMass = 1000;
  i.gravityLoss = gravityLoss;
  i.dragLoss = 0;
  i.steeringLoss = 0;
  return i;
}

describe('fixed stage mass ratios', () => {
  it('all ratios fixed: masses and delta-v worked by hand with the rocket equation', () => {
    const inp = input();
    inp.massRatio!.set([4, 3.5]);
    const r = evaluateBudgetCase(inp);
    // By hand, top down. From n = (S + m_up)/(ε·S + m_up): S = m_up·(n − 1)/(1 − n·ε).
    // Stage 2: S2 = 1000·2.5/0.65 = 3846.154 kg; ignition mass 4846.154 kg.
    // Stage 1: S1 = 4846.154·3/0.68 = 21380.090 kg; GLOW = 26226.244 kg.
    // Δv = 300·g0·ln 4 + 350·g0·ln 3.5 = 4078.38 + 4299.98 = 8378.36 m/s.
    const rel = 1e-12; // closed-form arithmetic on both sides: only rounding differs
    expect(Math.abs(r.grossMass / 26226.244343891405 - 1)).toBeLessThan(rel);
    expect(Math.abs(r.ignitionMass[1] / 4846.153846153847 - 1)).toBeLessThan(rel);
    expect(Math.abs(r.propellantMass[1] / (0.9 * 3846.1538461538466) - 1)).toBeLessThan(rel);
    expect(Math.abs(r.structuralMass[0] / (0.08 * 21380.090497737558) - 1)).toBeLessThan(rel);
    // The sized stages really have those mass ratios (ignition / burn-out mass).
    expect(Math.abs(r.ignitionMass[0] / (r.ignitionMass[0] - r.propellantMass[0]) - 4)).toBeLessThan(1e-12);
    expect(Math.abs(r.ignitionMass[1] / (r.ignitionMass[1] - r.propellantMass[1]) - 3.5)).toBeLessThan(1e-12);
    const dv = 300 * g0 * Math.log(4) + 350 * g0 * Math.log(3.5);
    expect(Math.abs(r.deliveredDeltaV - dv)).toBeLessThan(1e-9);
    expect(Math.abs(dv - 8378.363866691197)).toBeLessThan(1e-9);
    // The requirement (≈ 7.4 km/s with no losses to 200 km) is covered: feasible, surplus is margin.
    expect(r.totalDeltaV).toBeLessThan(dv);
    expect(r.feasible).toBe(true);
    expect(Math.abs(r.payloadFraction - 1000 / 26226.244343891405)).toBeLessThan(1e-15);
  });

  it('all ratios fixed and short of the requirement: infeasible with a reason, finite fields', () => {
    const inp = input(1500); // adds 1.5 km/s: required ≈ 8.9 km/s > 8378 m/s delivered
    inp.massRatio!.set([4, 3.5]);
    const r = evaluateBudgetCase(inp);
    expect(r.feasible).toBe(false);
    expect(r.failMask & REASON_BIT.DELTA_V_UNREACHABLE).toBeTruthy();
    expect(r.grossMass).toBe(0);
    expect(r.payloadMass).toBe(0);
    expect(Math.abs(r.deliveredDeltaV - 8378.363866691197)).toBeLessThan(1e-9);
    const why = explainBudgetCase(inp, r).failures.find((f) => f.code === 'DELTA_V_UNREACHABLE')!;
    expect(why.message).toMatch(/fixed mass ratios deliver 8378\.4 m\/s, short of the required/);
    expect(why.margin).toBeLessThan(0);
  });

  it('one ratio fixed: the free stage supplies the rest (one free stage: inverse rocket equation)', () => {
    const inp = input();
    inp.massRatio!.set([NaN, 3.5]);
    const r = evaluateBudgetCase(inp);
    const rest = r.totalDeltaV - 350 * g0 * Math.log(3.5);
    const n1 = Math.exp(rest / (300 * g0)); // n = exp(Δv/c)
    expect(r.feasible).toBe(true);
    expect(Math.abs(r.massRatio[0] / n1 - 1)).toBeLessThan(1e-9);
    expect(r.massRatio[1]).toBe(3.5);
    expect(Math.abs(r.deliveredDeltaV - r.totalDeltaV)).toBeLessThan(1e-6);
    // GLOW from the same hand formulas with the solved n1.
    const m02 = 1000 + (1000 * 2.5) / 0.65;
    const glow = m02 + (m02 * (n1 - 1)) / (1 - n1 * 0.08);
    expect(Math.abs(r.grossMass / glow - 1)).toBeLessThan(1e-9);
  });

  it('a fixed ratio never beats the optimum (Lagrange staging maximises payload fraction)', () => {
    const free = evaluateBudgetCase(input());
    const opt = free.massRatio[1];
    for (const n of [opt * 0.8, opt * 0.95, opt * 1.05, opt * 1.2]) {
      const inp = input();
      inp.massRatio!.set([NaN, n]);
      const r = evaluateBudgetCase(inp);
      expect(r.payloadFraction).toBeLessThan(free.payloadFraction);
    }
    const at = input();
    at.massRatio!.set([NaN, opt]);
    expect(Math.abs(evaluateBudgetCase(at).payloadFraction / free.payloadFraction - 1)).toBeLessThan(1e-9);
  });

  it('unbuildable ratios are feasibility failures naming the stage; a non-finite ratio is a RangeError', () => {
    const low = input();
    low.massRatio!.set([NaN, 1]);
    const a = evaluateBudgetCase(low);
    expect(a.failMask & REASON_BIT.MASS_RATIO_INVALID).toBeTruthy();
    expect(a.failMask & REASON_BIT.DELTA_V_UNREACHABLE).toBeFalsy();
    expect(explainBudgetCase(low, a).failures.find((f) => f.code === 'MASS_RATIO_INVALID')?.stage).toBe(1);
    const high = input();
    high.massRatio!.set([NaN, 10]); // n·ε = 1: the structure alone is m0/n
    const b = evaluateBudgetCase(high);
    expect(b.failMask & REASON_BIT.STAGE_MASS_RATIO_UNREACHABLE).toBeTruthy();
    const why = explainBudgetCase(high, b).failures.find((f) => f.code === 'STAGE_MASS_RATIO_UNREACHABLE')!;
    expect(why.stage).toBe(1);
    expect(why.limit).toBeCloseTo(10, 12);
    const inf = input();
    inf.massRatio!.set([Infinity, NaN]);
    expect(() => evaluateBudgetCase(inf)).toThrow(/massRatio\[0\]/);
  });

  it('the fixed stages alone cover the requirement: the free stage is left empty and flagged', () => {
    const inp = input();
    inp.massRatio!.set([NaN, 9]); // 350·g0·ln 9 ≈ 7542 m/s > ≈ 7.4 km/s required
    const r = evaluateBudgetCase(inp);
    expect(r.massRatio[0]).toBe(1);
    expect(r.failMask & REASON_BIT.MASS_RATIO_INVALID).toBeTruthy();
  });

  it('with no ratio fixed, results are those of the optimised path (NaN is the default)', () => {
    const a = evaluateBudgetCase(input());
    const inp = input();
    delete inp.massRatio; // inputs built before the field existed
    const b = evaluateBudgetCase(inp);
    expect(b.grossMass).toBe(a.grossMass);
    expect(Array.from(b.massRatio)).toEqual(Array.from(a.massRatio));
  });
});
