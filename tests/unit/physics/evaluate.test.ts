import { describe, expect, it } from 'vitest';
import { buildDeltaVBudget } from '../../../src/lib/physics/budget';
import {
  budgetCaseToRecord,
  createBudgetCaseInput,
  createBudgetCaseResult,
  evaluateBudgetCase,
  explainBudgetCase,
  type BudgetCaseInput
} from '../../../src/lib/physics/evaluate';
import { REASON_BIT } from '../../../src/lib/physics/reasons';
import { payloadForVehicle, sizeForPayload } from '../../../src/lib/physics/rocket';

const g0 = 9.80665;

function sizingInput(): BudgetCaseInput {
  const input = createBudgetCaseInput();
  input.stageCount = 2;
  input.isp.set([300, 345]);
  input.structuralCoefficient.set([0.07, 0.09]);
  input.thrustToWeight.set([1.3, 0.9]);
  input.payloadMass = 5000;
  return input;
}

function allFinite(v: unknown): boolean {
  if (typeof v === 'number') return Number.isFinite(v);
  if (Array.isArray(v)) return v.every(allFinite);
  if (v && typeof v === 'object') return Object.values(v).every(allFinite);
  return true;
}

describe('evaluateBudgetCase, sizing mode', () => {
  it('agrees with the object API (buildDeltaVBudget + sizeForPayload)', () => {
    const input = sizingInput();
    const r = evaluateBudgetCase(input);
    const budget = buildDeltaVBudget({ target: { perigeeAltitude: 200e3, inclination: 28.5 }, latitude: 28.5, liftoffThrustToWeight: 1.3 });
    expect(Math.abs(r.totalDeltaV - budget.total)).toBeLessThan(1e-9);
    expect(Math.abs(r.rotationAssist + budget.terms.rotationAssist.value)).toBeLessThan(1e-9);
    const sized = sizeForPayload([{ isp: 300, structuralCoefficient: 0.07 }, { isp: 345, structuralCoefficient: 0.09 }], budget.total, 5000);
    expect(Math.abs(r.grossMass / sized.grossMass - 1)).toBeLessThan(1e-9);
    for (let i = 0; i < 2; i++) {
      expect(Math.abs(r.propellantMass[i] / sized.stages[i].propellantMass - 1)).toBeLessThan(1e-9);
      expect(Math.abs(r.stageDeltaV[i] / sized.staging.stageDeltaV[i] - 1)).toBeLessThan(1e-9);
    }
    expect(r.feasible).toBe(true);
    expect(r.correlationMask).toBe(15);
    // Thrust from T/W at ignition; burn-out acceleration ψ·n·g0.
    expect(Math.abs(r.thrust[0] - 1.3 * r.grossMass * g0)).toBeLessThan(1e-6);
    expect(Math.abs(r.maxAxialAcceleration - Math.max(1.3 * r.massRatio[0], 0.9 * r.massRatio[1]) * g0)).toBeLessThan(1e-9);
  });

  it('flags an unreachable delta-v with payload 0 and finite fields (never NaN)', () => {
    const input = sizingInput();
    input.isp.set([220, 230]);
    input.structuralCoefficient.set([0.2, 0.2]);
    const r = evaluateBudgetCase(input);
    expect(r.feasible).toBe(false);
    expect(r.failMask & REASON_BIT.DELTA_V_UNREACHABLE).toBeTruthy();
    expect(r.payloadMass).toBe(0);
    expect(r.grossMass).toBe(0);
    const rec = budgetCaseToRecord(r);
    expect(allFinite(rec)).toBe(true);
    expect(rec.failures).toContain('DELTA_V_UNREACHABLE');
    const why = explainBudgetCase(input, r);
    const reason = why.failures.find((f) => f.code === 'DELTA_V_UNREACHABLE')!;
    expect(reason.margin).toBeLessThan(0);
    expect(Math.abs(reason.limit + 220 * g0 * Math.log(0.2) + 230 * g0 * Math.log(0.2))).toBeLessThan(1e-6);
  });

  it('treats a structural coefficient outside (0, 1) as a feasibility failure, not an exception', () => {
    const input = sizingInput();
    input.structuralCoefficient[1] = 1.5;
    const r = evaluateBudgetCase(input);
    expect(r.failMask & REASON_BIT.STRUCTURAL_COEFFICIENT_INVALID).toBeTruthy();
    expect(r.grossMass).toBe(0);
    expect(allFinite(budgetCaseToRecord(r))).toBe(true);
  });

  it('reports the T/W, acceleration and max-Q checks by bit and by margin', () => {
    const input = sizingInput();
    input.thrustToWeight.set([1.1, 2.5]);
    const r = evaluateBudgetCase(input);
    expect(r.failMask & REASON_BIT.LIFTOFF_THRUST_TO_WEIGHT_LOW).toBeTruthy();
    expect(r.failMask & REASON_BIT.MAX_AXIAL_ACCELERATION_HIGH).toBeTruthy();
    const report = explainBudgetCase(input, r);
    expect(report.failMask).toBe(r.failMask);
    expect(report.failures.find((f) => f.code === 'LIFTOFF_THRUST_TO_WEIGHT_LOW')!.margin).toBeCloseTo(1.1 - 1.15, 9);
  });

  it('reusing one result for a smaller case clears the unused stages (regression: stale per-stage values)', () => {
    const out = createBudgetCaseResult();
    const three = sizingInput();
    three.stageCount = 3;
    three.isp[2] = 450;
    three.structuralCoefficient[2] = 0.12;
    three.thrustToWeight[2] = 0.7;
    evaluateBudgetCase(three, out);
    expect(out.propellantMass[2]).toBeGreaterThan(0);
    evaluateBudgetCase(sizingInput(), out);
    expect(out.stageCount).toBe(2);
    expect(out.propellantMass[2]).toBe(0);
    expect(out.massRatio[2]).toBe(0);
  });

  it('recomputes the orbit when the target changes between cases (regression: geometry cache)', () => {
    const input = sizingInput();
    const out = createBudgetCaseResult();
    const a = evaluateBudgetCase(input, out).insertionSpeed;
    input.targetPerigeeAltitude = 400e3;
    input.targetApogeeAltitude = 400e3;
    const b = evaluateBudgetCase(input, out).insertionSpeed;
    expect(b).toBeLessThan(a);
    input.targetInclination = 0;
    expect(evaluateBudgetCase(input, out).planeChangeDeltaV).toBeGreaterThan(1000);
  });

  it('uses user allowances and a reserve when given', () => {
    const input = sizingInput();
    input.gravityLoss = 1000;
    input.dragLoss = 100;
    input.steeringLoss = 50;
    input.reserveFraction = 0.01;
    input.reserveValue = 20;
    const r = evaluateBudgetCase(input);
    expect(r.correlationMask).toBe(8);
    const before = r.insertionSpeed - r.rotationAssist + 1150;
    expect(Math.abs(r.totalDeltaV - (before * 1.01 + 20))).toBeLessThan(1e-9);
    expect(Math.abs(r.reserve - (before * 0.01 + 20))).toBeLessThan(1e-9);
  });

  it('throws RangeErrors naming malformed fields', () => {
    const bad = (f: (i: BudgetCaseInput) => void) => {
      const i = sizingInput();
      f(i);
      return () => evaluateBudgetCase(i);
    };
    expect(bad((i) => (i.isp[1] = 0))).toThrow(/isp\[1\]/);
    expect(bad((i) => (i.stageCount = 0))).toThrow(/stageCount/);
    expect(bad((i) => (i.payloadMass = NaN))).toThrow(/payloadMass/);
    expect(bad((i) => (i.thrustToWeight[0] = -1))).toThrow(/thrustToWeight\[0\]/);
    expect(bad((i) => (i.latitude = 100))).toThrow(/latitude/);
    expect(bad((i) => (i.reserveFraction = -0.1))).toThrow(/reserveFraction/);
    expect(bad((i) => (i.gravityLoss = -5))).toThrow(/gravityLoss/);
  });
});

describe('evaluateBudgetCase, vehicle mode', () => {
  function vehicleFromSizing(): BudgetCaseInput {
    const sized = evaluateBudgetCase(sizingInput());
    const v = createBudgetCaseInput();
    v.mode = 'vehicle';
    v.stageCount = 2;
    v.isp.set([300, 345]);
    v.propellantMass.set([sized.propellantMass[0], sized.propellantMass[1]]);
    v.dryMass.set([sized.structuralMass[0], sized.structuralMass[1]]);
    v.thrust.set([sized.thrust[0], sized.thrust[1]]);
    return v;
  }

  it('round trip: the vehicle sized for 5 t delivers 5 t with losses re-evaluated at its own T/W', () => {
    const r = evaluateBudgetCase(vehicleFromSizing());
    expect(Math.abs(r.payloadMass - 5000)).toBeLessThan(1e-3);
    expect(Math.abs(r.liftoffThrustToWeight - 1.3)).toBeLessThan(1e-7);
    expect(r.feasible).toBe(true);
  });

  it('with fixed losses it matches payloadForVehicle', () => {
    const v = vehicleFromSizing();
    v.gravityLoss = 1500;
    v.dragLoss = 120;
    v.steeringLoss = 80;
    const r = evaluateBudgetCase(v);
    const ref = payloadForVehicle(
      [0, 1].map((i) => ({ isp: v.isp[i], propellantMass: v.propellantMass[i], dryMass: v.dryMass[i] })),
      r.totalDeltaV
    );
    expect(Math.abs(r.payloadMass - ref.payloadMass)).toBeLessThan(1e-6);
  });

  it('payload falls when the target is higher (more delta-v)', () => {
    const v = vehicleFromSizing();
    const low = evaluateBudgetCase(v).payloadMass;
    v.targetPerigeeAltitude = 600e3;
    v.targetApogeeAltitude = 600e3;
    expect(evaluateBudgetCase(v).payloadMass).toBeLessThan(low);
  });

  it('a vehicle that cannot reach orbit gets payload 0 and DELTA_V_UNREACHABLE', () => {
    const v = vehicleFromSizing();
    v.propellantMass[1] = 1000;
    const r = evaluateBudgetCase(v);
    expect(r.payloadMass).toBe(0);
    expect(r.failMask & REASON_BIT.DELTA_V_UNREACHABLE).toBeTruthy();
    expect(allFinite(budgetCaseToRecord(r))).toBe(true);
  });

  it('rejects malformed stage masses by name', () => {
    const v = vehicleFromSizing();
    v.dryMass[0] = 0;
    expect(() => evaluateBudgetCase(v)).toThrow(/dryMass\[0\]/);
  });
});
