/**
 * Sweep specification: the examples parse, bad input is refused with field errors naming the
 * field, and the case cap refuses over-large sweeps.
 */
import { describe, expect, test } from 'vitest';
import { EXAMPLE_ASCENT_INPUT, EXAMPLE_PAYLOAD_INPUT, EXAMPLE_SIZING_INPUT, EXAMPLE_SPECS } from '../../../src/lib/sweep/examples';
import {
  DEFAULT_CASE_CAP,
  ROOT_ERROR_KEY,
  SweepSpecError,
  assertSweepSpec,
  estimateCaseCount,
  levelCount,
  numericLevels,
  parseParameterPath,
  parseSweepSpec,
  type SweepSpecInput
} from '../../../src/lib/sweep/spec';

// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Loose = any;
const clone = (x: SweepSpecInput): Loose => structuredClone(x);

function errorsOf(input: unknown, caseCap?: number): Record<string, string> {
  const r = parseSweepSpec(input, { caseCap });
  if (r.ok) throw new Error('expected the spec to be refused');
  return r.errors;
}

describe('examples', () => {
  test('each example parses, with defaults filled in', () => {
    for (const input of [EXAMPLE_SIZING_INPUT, EXAMPLE_PAYLOAD_INPUT, EXAMPLE_ASCENT_INPUT]) {
      const r = parseSweepSpec(input);
      expect(r.ok, JSON.stringify(!r.ok && r.errors)).toBe(true);
    }
    expect(EXAMPLE_SPECS.sizing.version).toBe(1);
    expect(EXAMPLE_SPECS.sizing.losses).toEqual({});
    expect(EXAMPLE_SPECS.payload.target.reserve).toEqual({ deltaV: 0, fraction: 0.01 });
  });

  test('case counts: grid = product of level counts, sampled = samples', () => {
    // 0.06..0.10 step 0.01 → 5 levels (the last kept despite rounding), 3 choices, 5 counts.
    expect(estimateCaseCount(EXAMPLE_SPECS.sizing)).toBe(5 * 3 * 5);
    expect(estimateCaseCount(EXAMPLE_SPECS.payload)).toBe(500);
    expect(estimateCaseCount(EXAMPLE_SPECS.ascent)).toBe(4);
  });
});

describe('field errors name the field', () => {
  const cases: [string, (s: Loose) => void, string, RegExp][] = [
    ['vacuum Isp below sea-level Isp', (s) => (s.baseline.stages[1].propulsion.ispVacuum = 150), 'baseline.stages.1.propulsion.ispVacuum', /at least the sea-level/],
    ['negative structural coefficient', (s) => (s.baseline.stages[0].structuralCoefficient = -0.1), 'baseline.stages.0.structuralCoefficient', /greater than 0/],
    ['structural coefficient of 1', (s) => (s.baseline.stages[0].structuralCoefficient = 1), 'baseline.stages.0.structuralCoefficient', /less than 1/],
    ['no structure given', (s) => delete s.baseline.stages[1].structuralCoefficient, 'baseline.stages.1.structuralCoefficient', /structural coefficient, or dry and propellant/],
    ['thrust and T/W both given', (s) => (s.baseline.stages[0].thrustVacuum = 500_000), 'baseline.stages.0.thrustToWeight', /not both/],
    ['sizing without T/W', (s) => { delete s.baseline.stages[1].thrustToWeight; s.baseline.stages[1].thrustVacuum = 30_000; }, 'baseline.stages.1.thrustToWeight', /sizing needs/],
    ['five stages', (s) => s.baseline.stages.push(...s.baseline.stages, ...s.baseline.stages.slice(0, 1)), 'baseline.stages', /at most 4/],
    ['no stage', (s) => (s.baseline.stages = []), 'baseline.stages', /at least one/],
    ['Mach not increasing', (s) => (s.baseline.dragCoefficient = [[0, 0.3], [1.2, 0.5], [1.0, 0.4]]), 'baseline.dragCoefficient.2.0', /increase/],
    ['perigee above apogee', (s) => (s.target.orbit = { kind: 'elliptical', perigeeAltitude: 800e3, apogeeAltitude: 400e3 }), 'target.orbit.perigeeAltitude', /not exceed the apogee/],
    ['latitude beyond 90', (s) => (s.target.launchLatitude = 91), 'target.launchLatitude', /at most 90/],
    ['latitude below −90', (s) => (s.target.launchLatitude = -90.5), 'target.launchLatitude', /at least -90/],
    ['inclination as text', (s) => (s.target.inclination = '53'), 'target.inclination', /finite number/],
    ['payload missing when sizing', (s) => delete s.problem.payloadMass, 'problem.payloadMass', /required/],
    ['unknown problem', (s) => (s.problem = { kind: 'orbit' }), 'problem.kind', /size.*payload/],
    ['range with min > max', (s) => (s.sweep.parameters[0].values = { kind: 'step', min: 0.1, max: 0.06, step: 0.01 }), 'sweep.parameters.0.values.min', /not exceed max/],
    ['zero step', (s) => (s.sweep.parameters[0].values = { kind: 'step', min: 0.06, max: 0.1, step: 0 }), 'sweep.parameters.0.values.step', /greater than 0/],
    ['swept value outside the physical limits', (s) => (s.sweep.parameters[0].values = { kind: 'list', values: [0.05, 1.2] }), 'sweep.parameters.0.values.values.1', /less than 1/],
    ['unknown path', (s) => (s.sweep.parameters[0].path = 'stages.0.colour'), 'sweep.parameters.0.path', /unknown parameter path/],
    ['stage out of range', (s) => (s.sweep.parameters[0].path = 'stages.3.ispVacuum'), 'sweep.parameters.0.path', /stage 3 does not exist/],
    ['the same quantity twice (alias of lift-off T/W)', (s) => s.sweep.parameters.push({ path: 'stages.0.thrustToWeight', values: { kind: 'list', values: [1.3] } }), 'sweep.parameters.3.path', /already swept by parameter 2/],
    ['propulsion and Isp of one stage', (s) => s.sweep.parameters.push({ path: 'stages.1.ispVacuum', values: { kind: 'list', values: [330] } }), 'sweep.parameters.3.path', /conflicts with the propulsion choice/],
    ['choices on a numeric path', (s) => (s.sweep.parameters[1].path = 'stages.1.ispVacuum'), 'sweep.parameters.1.values.kind', /only to a stage propulsion/],
    ['a distribution on a full grid', (s) => (s.sweep.parameters[0].values = { kind: 'uniform', min: 0.06, max: 0.1 }), 'sweep.parameters.0.values.kind', /sampled plan/],
    ['duplicate catalogue ids', (s) => (s.sweep.parameters[1].values.options[1].id = s.sweep.parameters[1].values.options[0].id), 'sweep.parameters.1.values.options.1.id', /listed twice/],
    ['one objective', (s) => (s.objectives = [{ metric: 'glow', direction: 'min' }]), 'objectives', /at least 2/],
    ['five objectives', (s) => (s.objectives = ['glow', 'dryMass', 'payloadFraction', 'totalLosses', 'maxAxialAcceleration'].map((metric) => ({ metric, direction: 'min' }))), 'objectives', /at most 4/],
    ['the same objective twice', (s) => s.objectives.push({ metric: 'glow', direction: 'max' }), 'objectives.2.metric', /chosen twice/],
    ['an unknown objective', (s) => (s.objectives[1].metric = 'cost'), 'objectives.1.metric', /must be one of/],
    ['a bad direction', (s) => (s.objectives[1].direction = 'up'), 'objectives.1.direction', /"min" or "max"/],
    ['acceleration limit in both units', (s) => (s.constraints.maxAxialAcceleration = 50), 'constraints.maxAxialAccelerationG', /not both/],
    ['seedless random plan', (s) => (s.sweep.sampling = { plan: 'random', samples: 100 }), 'sweep.sampling.seed', /required/],
    ['fractional sample count', (s) => (s.sweep.sampling = { plan: 'latinHypercube', samples: 10.5, seed: 1 }), 'sweep.sampling.samples', /whole number/],
    ['empty name', (s) => (s.name = '   '), 'name', /needs a name/],
    ['unknown mode', (s) => (s.mode = 'fast'), 'mode', /budget.*ascent/]
  ];
  for (const [label, mutate, key, message] of cases) {
    test(label, () => {
      const s = clone(EXAMPLE_SIZING_INPUT);
      mutate(s);
      const errors = errorsOf(s);
      expect(Object.keys(errors)).toContain(key);
      expect(errors[key]).toMatch(message);
    });
  }

  test('a given vehicle needs propellant masses; payload cannot be swept', () => {
    const s = clone(EXAMPLE_PAYLOAD_INPUT);
    delete s.baseline.stages[0].propellantMass;
    s.baseline.stages[0].structuralCoefficient = 0.08;
    delete s.baseline.stages[0].dryMass;
    s.sweep.parameters.push({ path: 'payloadMass', values: { kind: 'uniform', min: 100, max: 500 } });
    const errors = errorsOf(s);
    expect(errors['baseline.stages.0.propellantMass']).toMatch(/propellant mass of every stage/);
    expect(errors['sweep.parameters.2.path']).toMatch(/sweep it only when sizing/);
  });

  test('a normal whose bounds keep almost nothing, and a mean outside the bounds', () => {
    const s = clone(EXAMPLE_PAYLOAD_INPUT);
    s.sweep.parameters[1].values = { kind: 'normal', mean: 340, sd: 0.0001, min: 340.1, max: 352 };
    expect(errorsOf(s)['sweep.parameters.1.values.mean']).toMatch(/between min and max/);
    s.sweep.parameters[1].values = { kind: 'normal', mean: 340, sd: 1e-9, min: 340, max: 340 };
    expect(errorsOf(s)['sweep.parameters.1.values.sd']).toMatch(/almost none/);
  });

  test('not an object: a root error', () => {
    expect(Object.keys(errorsOf(42))).toEqual([ROOT_ERROR_KEY]);
  });

  test('assertSweepSpec throws a SweepSpecError carrying the field errors', () => {
    const s = clone(EXAMPLE_SIZING_INPUT);
    s.target.inclination = 200;
    try {
      assertSweepSpec(s);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(SweepSpecError);
      expect((e as SweepSpecError).errors['target.inclination']).toMatch(/at most 180/);
    }
  });
});

describe('case cap', () => {
  test('a grid over the default cap of 2,000,000 is refused on sweep.parameters', () => {
    const s = clone(EXAMPLE_SIZING_INPUT);
    // 5 × 3 × 200 × 1000 = 3,000,000 cases.
    s.sweep.parameters[2].values = { kind: 'count', min: 1.2, max: 1.6, count: 200 };
    s.sweep.parameters.push({ path: 'target.altitude', values: { kind: 'count', min: 300e3, max: 900e3, count: 1000 } });
    expect(DEFAULT_CASE_CAP).toBe(2_000_000);
    expect(errorsOf(s)['sweep.parameters']).toMatch(/3,000,000 cases, more than the cap of 2,000,000/);
    // The same grid at 1,000 altitudes... × 0.6 is under the cap.
    s.sweep.parameters[3].values.count = 600;
    expect(parseSweepSpec(s).ok).toBe(true);
  });

  test('a grid whose count overflows is refused, not accepted', () => {
    const s = clone(EXAMPLE_SIZING_INPUT);
    s.sweep.parameters = Array.from({ length: 10 }, (_, i) => ({
      path: ['stages.0.ispVacuum', 'stages.0.ispSeaLevel', 'stages.1.ispVacuum', 'stages.1.ispSeaLevel', 'stages.0.structuralCoefficient', 'stages.1.structuralCoefficient', 'liftoffThrustToWeight', 'upperStageThrustToWeight', 'target.inclination', 'target.altitude'][i],
      values: { kind: 'count', min: i === 9 ? 300e3 : i >= 8 ? 50 : i >= 6 ? 1 : i >= 4 ? 0.05 : 200, max: i === 9 ? 900e3 : i >= 8 ? 60 : i >= 6 ? 2 : i >= 4 ? 0.1 : 300, count: 1_000_000 }
    }));
    expect(errorsOf(s)['sweep.parameters']).toMatch(/more than the cap/);
  });

  test('sampled plans are capped on sweep.sampling.samples; the cap is configurable', () => {
    const s = clone(EXAMPLE_PAYLOAD_INPUT);
    s.sweep.sampling.samples = 2_000_001;
    expect(errorsOf(s)['sweep.sampling.samples']).toMatch(/at most 2,000,000 samples/);
    s.sweep.sampling.samples = 2_000_000;
    expect(parseSweepSpec(s).ok).toBe(true);
    expect(errorsOf(s, 1000)['sweep.sampling.samples']).toMatch(/at most 1,000 samples/);
    expect(errorsOf(EXAMPLE_SIZING_INPUT, 74)['sweep.parameters']).toMatch(/75 cases/);
    expect(parseSweepSpec(EXAMPLE_SIZING_INPUT, { caseCap: 75 }).ok).toBe(true);
  });
});

describe('levels and paths', () => {
  test('stepped ranges keep a last point lost to rounding; counts are evenly spaced', () => {
    expect(levelCount({ kind: 'step', min: 0.1, max: 0.3, step: 0.1 })).toBe(3);
    expect(Array.from(numericLevels({ kind: 'step', min: 0.1, max: 0.3, step: 0.1 }))).toEqual([0.1, 0.2, 0.30000000000000004].map((x) => Math.min(x, 0.3)));
    expect(Array.from(numericLevels({ kind: 'count', min: 1, max: 2, count: 5 }))).toEqual([1, 1.25, 1.5, 1.75, 2]);
    expect(levelCount({ kind: 'step', min: 0, max: 0.95, step: 0.1 })).toBe(10);
  });

  test('paths parse to a quantity and a 0-based stage', () => {
    expect(parseParameterPath('stages.1.ispVacuum')).toEqual({ quantity: 'ispVacuum', stage: 1, categorical: false });
    expect(parseParameterPath('stages.0.propulsion')).toEqual({ quantity: 'propulsion', stage: 0, categorical: true });
    expect(parseParameterPath('target.inclination')?.quantity).toBe('inclination');
    expect(parseParameterPath('toString')).toBeNull();
    expect(parseParameterPath('stages.1.massRatio')).toEqual({ quantity: 'massRatio', stage: 1, categorical: false });
    expect(parseParameterPath('stages.1.massratio')).toBeNull();
  });
});

describe('stage mass ratio', () => {
  const withMassRatio = (values: Loose): Loose => {
    const s = clone(EXAMPLE_SIZING_INPUT);
    s.sweep.parameters = [{ path: 'stages.1.massRatio', values }];
    return s;
  };

  test('a swept mass ratio above 1 is accepted when sizing in budget mode', () => {
    expect(parseSweepSpec(withMassRatio({ kind: 'count', min: 2, max: 6, count: 5 })).ok).toBe(true);
    const s = clone(EXAMPLE_SIZING_INPUT);
    s.baseline.stages[1].massRatio = 3.5;
    expect(parseSweepSpec(s).ok).toBe(true);
  });

  test('a ratio of 1 or less is a field error naming the value', () => {
    expect(errorsOf(withMassRatio({ kind: 'list', values: [2, 1] }))['sweep.parameters.0.values.values.1']).toBe('stage mass ratio must be greater than 1');
    expect(errorsOf(withMassRatio({ kind: 'count', min: 0.5, max: 3, count: 4 }))['sweep.parameters.0.values.min']).toBe('stage mass ratio must be greater than 1');
    const s = clone(EXAMPLE_SIZING_INPUT);
    s.baseline.stages[0].massRatio = 1;
    expect(errorsOf(s)['baseline.stages.0.massRatio']).toBe('mass ratio must be greater than 1');
  });

  test('refused for a given vehicle and in ascent mode', () => {
    const p = clone(EXAMPLE_PAYLOAD_INPUT);
    p.sweep.parameters = [{ path: 'stages.0.massRatio', values: { kind: 'uniform', min: 2, max: 4 } }];
    expect(errorsOf(p)['sweep.parameters.0.path']).toMatch(/only when sizing/);
    const a = withMassRatio({ kind: 'list', values: [3, 4] });
    a.mode = 'ascent';
    expect(errorsOf(a)['sweep.parameters.0.path']).toMatch(/budget-mode/);
  });
});
