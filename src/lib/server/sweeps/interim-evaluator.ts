/**
 * INTERIM budget-mode evaluator, used by engine.ts only while SWEEP-CORE's evaluator
 * (src/lib/sweep, `makeEvaluator`/`evaluateCase`) has not landed: it maps a spec and one
 * case's swept values onto the physics core's `evaluateBudgetCase`. It lets the queue, the
 * storage and the API run end to end on real physics; the mapping choices that belong to
 * SWEEP-CORE (which Isp a budget-mode stage uses...) are the simplest defensible ones and
 * are replaced as soon as their evaluator exists. Ascent mode is not mapped here.
 */
import { G0 } from '../../physics/constants';
import {
  createBudgetCaseInput,
  createBudgetCaseResult,
  evaluateBudgetCase,
  type BudgetCaseInput,
  type BudgetCaseResult
} from '../../physics/evaluate';
import { DEFAULT_FEASIBILITY_LIMITS } from '../../physics/feasibility';
import { codesFromMask } from '../../physics/reasons';
import type { CasePlan } from '../../sweep/cases';
import type { SweepSpec } from '../../sweep/spec';

export interface FlatCase {
  feasible: boolean;
  failMask: number;
  values: Record<string, number>;
  detail: Record<string, unknown>;
}

export function makeInterimEvaluator(spec: SweepSpec, plan: CasePlan) {
  if (spec.mode !== 'budget') throw new Error('ascent mode needs the sweep evaluator of src/lib/sweep (not available yet)');
  const stages = spec.baseline.stages;
  const k = stages.length;
  const base = createBudgetCaseInput();
  const out: BudgetCaseResult = createBudgetCaseResult();
  const c = spec.constraints;
  base.limits = {
    ...DEFAULT_FEASIBILITY_LIMITS,
    ...(c.minLiftoffThrustToWeight !== undefined ? { minLiftoffThrustToWeight: c.minLiftoffThrustToWeight } : {}),
    ...(c.maxAxialAcceleration !== undefined ? { maxAxialAcceleration: c.maxAxialAcceleration } : {}),
    ...(c.maxAxialAccelerationG !== undefined ? { maxAxialAcceleration: c.maxAxialAccelerationG * G0 } : {}),
    ...(c.payloadFloor !== undefined ? { minPayloadMass: c.payloadFloor } : {}),
    ...(c.glowCeiling !== undefined ? { maxGrossMass: c.glowCeiling } : {})
  };
  const dims = plan.dimensions;
  const x = new Float64Array(Math.max(1, dims.length));
  const ispSl = new Float64Array(k);
  const ispVac = new Float64Array(k);

  function load(index: number): BudgetCaseInput {
    const inp = base;
    inp.mode = spec.problem.kind === 'size' ? 'sizing' : 'vehicle';
    inp.stageCount = k;
    stages.forEach((s, i) => {
      ispSl[i] = s.propulsion.ispSeaLevel;
      ispVac[i] = s.propulsion.ispVacuum;
      inp.structuralCoefficient[i] = s.structuralCoefficient ?? (s.dryMass! / (s.dryMass! + s.propellantMass!));
      inp.thrustToWeight[i] = s.thrustToWeight ?? NaN;
      inp.propellantMass[i] = s.propellantMass ?? 0;
      inp.dryMass[i] = s.dryMass ?? (s.structuralCoefficient !== undefined && s.propellantMass !== undefined ? (s.structuralCoefficient * s.propellantMass) / (1 - s.structuralCoefficient) : 0);
      inp.thrust[i] = s.thrustVacuum ?? NaN;
    });
    inp.payloadMass = spec.problem.kind === 'size' ? spec.problem.payloadMass : 0;
    const o = spec.target.orbit;
    inp.targetPerigeeAltitude = o.kind === 'circular' ? o.altitude : o.perigeeAltitude;
    inp.targetApogeeAltitude = o.kind === 'circular' ? o.altitude : o.apogeeAltitude;
    inp.targetInclination = spec.target.inclination;
    inp.latitude = spec.target.launchLatitude;
    inp.gravityLoss = spec.losses.gravity ?? NaN;
    inp.dragLoss = spec.losses.drag ?? NaN;
    inp.steeringLoss = spec.losses.steering ?? NaN;
    inp.reserveFraction = spec.target.reserve.fraction;
    inp.reserveValue = spec.target.reserve.deltaV;

    plan.fill(index, x);
    dims.forEach((d, j) => {
      const v = x[j];
      const q = d.parsed.quantity;
      const st = d.parsed.stage;
      switch (q) {
        case 'propulsion': {
          if (d.kind !== 'choices') break;
          const opt = d.options[v];
          ispSl[st] = opt.ispSeaLevel;
          ispVac[st] = opt.ispVacuum;
          break;
        }
        case 'ispVacuum':
          ispVac[st] = v;
          break;
        case 'ispSeaLevel':
          ispSl[st] = v;
          break;
        case 'structuralCoefficient':
          inp.structuralCoefficient[st] = v;
          break;
        case 'thrustToWeight':
          inp.thrustToWeight[st] = v;
          break;
        case 'liftoffThrustToWeight':
          inp.thrustToWeight[0] = v;
          break;
        case 'upperStageThrustToWeight':
          inp.thrustToWeight[k - 1] = v;
          break;
        case 'targetAltitude':
          inp.targetPerigeeAltitude = inp.targetApogeeAltitude = v;
          break;
        case 'targetPerigeeAltitude':
          inp.targetPerigeeAltitude = v;
          break;
        case 'targetApogeeAltitude':
          inp.targetApogeeAltitude = v;
          break;
        case 'inclination':
          inp.targetInclination = v;
          break;
        case 'launchLatitude':
          inp.latitude = v;
          break;
        case 'payloadMass':
          inp.payloadMass = v;
          break;
        case 'massRatio':
          break;
      }
    });
    // Budget mode: the first stage flies through the atmosphere on the mean of its sea-level
    // and vacuum Isp; upper stages on vacuum Isp (common practice for first-cut budgets, from memory).
    for (let i = 0; i < k; i++) inp.isp[i] = i === 0 ? 0.5 * (ispSl[i] + ispVac[i]) : ispVac[i];
    if (inp.mode === 'vehicle') {
      // A given vehicle: lift-off T/W comes from the thrust; when only T/W is given, thrust follows from the gross mass.
      for (let i = 0; i < k; i++) if (!Number.isFinite(inp.thrust[i])) inp.thrust[i] = 0;
    }
    return inp;
  }

  return function evaluate(index: number): FlatCase {
    const r = evaluateBudgetCase(load(index), out);
    let dry = 0;
    let prop = 0;
    for (let i = 0; i < r.stageCount; i++) {
      dry += r.structuralMass[i];
      prop += r.propellantMass[i];
    }
    return {
      feasible: r.feasible,
      failMask: r.failMask,
      values: {
        glow: r.grossMass,
        payloadMass: r.payloadMass,
        payloadFraction: r.payloadFraction,
        dryMass: dry,
        propellantMass: prop,
        maxDynamicPressure: r.maxDynamicPressure,
        maxAxialAcceleration: r.maxAxialAcceleration,
        totalLosses: r.gravityLoss + r.dragLoss + r.steeringLoss,
        requiredDeltaV: r.totalDeltaV,
        liftoffThrustToWeight: r.liftoffThrustToWeight,
        insertionSpeed: r.insertionSpeed,
        gravityLoss: r.gravityLoss,
        dragLoss: r.dragLoss,
        steeringLoss: r.steeringLoss,
        rotationAssist: r.rotationAssist,
        transferDeltaV: r.transferDeltaV,
        planeChangeDeltaV: r.planeChangeDeltaV,
        reserveDeltaV: r.reserve
      },
      detail: {
        warnings: codesFromMask(r.warnMask),
        azimuth: r.azimuth,
        stages: Array.from({ length: r.stageCount }, (_, i) => ({
          massRatio: r.massRatio[i],
          deltaV: r.stageDeltaV[i],
          propellantMass: r.propellantMass[i],
          structuralMass: r.structuralMass[i],
          ignitionMass: r.ignitionMass[i],
          thrust: r.thrust[i],
          thrustToWeight: r.thrustToWeight[i],
          structuralCoefficient: r.structuralCoefficient[i]
        }))
      }
    };
  };
}
