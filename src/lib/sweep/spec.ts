/**
 * The sweep specification: ONE zod schema shared by the sweep builder form, the JSON API and
 * the worker. SI units throughout (kg, m, s, N, Pa, m/s, m/s²; angles in degrees, as at the
 * physics API); the UI converts at its edge.
 *
 * Shape (see `SweepSpec`):
 * - `name`, `question`
 * - `baseline`: the vehicle — 1–4 stages bottom first, drag coefficient shape, reference area
 * - `problem`: `size` (size the vehicle for a required payload → GLOW) or `payload` (payload of a
 *   given vehicle)
 * - `target`: orbit (circular altitude or perigee/apogee), inclination, launch latitude, reserve
 * - `sweep`: swept `parameters` (path + values) and the `sampling` plan
 * - `mode` (`budget` | `ascent`), `ascent` options, budget-mode `losses` allowances
 * - `constraints`, `objectives` (2–4)
 *
 * Bad input is refused with field errors keyed by the zod path (`fieldErrors`), e.g.
 * `{ "baseline.stages.1.propulsion.ispVacuum": "vacuum Isp must be at least the sea-level Isp" }`.
 */
import { z } from 'zod';
import { DEFAULT_DRAG_COEFFICIENT } from '../physics/drag';
import { truncatedNormalMass } from './distributions';

export const MAX_STAGES = 4;
export const MAX_PARAMETERS = 10;
/** Default hard cap on the number of cases of one sweep. */
export const DEFAULT_CASE_CAP = 2_000_000;
/** Largest number of levels one swept parameter may expand to. */
export const MAX_LEVELS_PER_PARAMETER = 1_000_000;
/**
 * A truncated normal must keep at least this share of its probability mass inside its bounds;
 * a window far out in a tail would make the sampled values numerically meaningless.
 */
export const MIN_TRUNCATED_NORMAL_MASS = 1e-6;

// ---------------------------------------------------------------------------------------------
// Number fields with messages that say what the field is and which limit it broke

interface Bounds {
  gt?: number;
  ge?: number;
  lt?: number;
  le?: number;
  int?: boolean;
}

function withUnit(value: number, unit: string): string {
  // '–' marks a dimensionless quantity in PARAMETER_INFO; nothing to print after the number.
  return unit && unit !== '–' ? `${value} ${unit}` : `${value}`;
}

/** A finite number field named `label` (unit shown in messages), with optional limits. */
function num(label: string, unit: string, b: Bounds = {}) {
  let s = z.number({
    error: (iss) =>
      iss.input === undefined
        ? `${label} is required`
        : `${label} must be a finite number${unit ? ` (${unit})` : ''}`
  });
  if (b.int) s = s.int(`${label} must be a whole number`);
  if (b.gt !== undefined) s = s.gt(b.gt, `${label} must be greater than ${withUnit(b.gt, unit)}`);
  if (b.ge !== undefined) s = s.gte(b.ge, `${label} must be at least ${withUnit(b.ge, unit)}`);
  if (b.lt !== undefined) s = s.lt(b.lt, `${label} must be less than ${withUnit(b.lt, unit)}`);
  if (b.le !== undefined) s = s.lte(b.le, `${label} must be at most ${withUnit(b.le, unit)}`);
  return s;
}

function text(label: string, max: number) {
  return z
    .string({ error: `${label} must be text` })
    .trim()
    .max(max, `${label} must be at most ${max} characters`);
}

// ---------------------------------------------------------------------------------------------
// Physical limits shared by baseline fields and swept values

/** Limits of each swept quantity; also the limits of the matching baseline field. */
export const LIMITS = Object.freeze({
  ispVacuum: { gt: 0, le: 1000 },
  ispSeaLevel: { ge: 0, le: 1000 },
  structuralCoefficient: { gt: 0, lt: 1 },
  /** Stage mass ratio m_ignition/m_burnout: above 1 (the stage burns propellant); 100 is far beyond any stage. */
  massRatio: { gt: 1, le: 100 },
  thrustToWeight: { gt: 0, le: 10 },
  altitude: { ge: 80_000, le: 400_000_000 },
  inclination: { ge: 0, le: 180 },
  latitude: { ge: -90, le: 90 },
  payloadMass: { gt: 0, le: 1e9 },
  stageMass: { gt: 0, le: 1e9 },
  thrust: { gt: 0, le: 1e9 }
} satisfies Record<string, Bounds>);

const ispSeaLevel = () => num('sea-level Isp', 's', LIMITS.ispSeaLevel);
const ispVacuum = () => num('vacuum Isp', 's', LIMITS.ispVacuum);

// ---------------------------------------------------------------------------------------------
// Baseline vehicle

/** Propulsion of one stage: Isp at sea level and in vacuum, optionally from the catalogue. */
export const propulsionSchema = z
  .object({
    catalogueId: text('catalogue id', 64).min(1, 'catalogue id must not be empty').optional(),
    name: text('propulsion name', 120).optional(),
    /** Specific impulse at sea level [s]; 0 for a vacuum-only engine. */
    ispSeaLevel: ispSeaLevel(),
    /** Specific impulse in vacuum [s]. */
    ispVacuum: ispVacuum()
  })
  .superRefine((p, ctx) => {
    if (p.ispVacuum < p.ispSeaLevel)
      ctx.addIssue({
        code: 'custom',
        path: ['ispVacuum'],
        message: 'vacuum Isp must be at least the sea-level Isp'
      });
  });

/**
 * One stage. Structure: a structural coefficient ε = m_dry/(m_dry + m_propellant), or dry and
 * propellant masses (ε then follows), or ε with a propellant mass (the dry mass then follows).
 * Thrust: a vacuum thrust [N] or a thrust-to-weight ratio at the stage's ignition (first
 * stage: sea-level thrust over lift-off weight; upper stages: vacuum thrust over the weight at
 * ignition, weight = mass·G0).
 */
export const stageSchema = z
  .object({
    name: text('stage name', 60).optional(),
    propulsion: propulsionSchema,
    structuralCoefficient: num('structural coefficient', '', LIMITS.structuralCoefficient).optional(),
    /**
     * Fixed stage mass ratio n = m_ignition/m_burnout (sizing in budget mode only); omitted,
     * the staging optimum chooses it.
     */
    massRatio: num('mass ratio', '', LIMITS.massRatio).optional(),
    dryMass: num('dry mass', 'kg', LIMITS.stageMass).optional(),
    propellantMass: num('propellant mass', 'kg', LIMITS.stageMass).optional(),
    thrustVacuum: num('vacuum thrust', 'N', LIMITS.thrust).optional(),
    thrustToWeight: num('thrust-to-weight ratio', '', LIMITS.thrustToWeight).optional()
  })
  .superRefine((s, ctx) => {
    const hasEps = s.structuralCoefficient !== undefined;
    const hasDry = s.dryMass !== undefined;
    const hasProp = s.propellantMass !== undefined;
    if (hasEps && hasDry)
      ctx.addIssue({
        code: 'custom',
        path: ['dryMass'],
        message: 'give a structural coefficient or a dry mass, not both'
      });
    else if (!hasEps && !(hasDry && hasProp))
      ctx.addIssue({
        code: 'custom',
        path: hasDry ? ['propellantMass'] : ['structuralCoefficient'],
        message: hasDry
          ? 'a propellant mass is needed with a dry mass'
          : 'give a structural coefficient, or dry and propellant masses'
      });
    const hasThrust = s.thrustVacuum !== undefined;
    const hasTw = s.thrustToWeight !== undefined;
    if (hasThrust === hasTw)
      ctx.addIssue({
        code: 'custom',
        path: hasThrust ? ['thrustToWeight'] : ['thrustVacuum'],
        message: hasThrust
          ? 'give a vacuum thrust or a thrust-to-weight ratio, not both'
          : 'give a vacuum thrust or a thrust-to-weight ratio'
      });
  });

const dragPointSchema = z.tuple(
  [num('Mach number', '', { ge: 0, le: 50 }), num('drag coefficient', '', { ge: 0, le: 5 })],
  { error: 'each drag point must be a [mach, cd] pair' }
);

export const vehicleSchema = z.object({
  name: text('vehicle name', 120).optional(),
  stages: z
    .array(stageSchema, { error: 'stages must be a list' })
    .min(1, 'a vehicle needs at least one stage')
    .max(MAX_STAGES, `a vehicle has at most ${MAX_STAGES} stages`),
  /** Axial drag coefficient against Mach, `[mach, cd][]`, linear between points. */
  dragCoefficient: z
    .array(dragPointSchema, { error: 'the drag coefficient must be a list of [mach, cd] pairs' })
    .min(1, 'the drag coefficient needs at least one [mach, cd] point')
    .max(64, 'the drag coefficient has at most 64 points')
    .superRefine((pts, ctx) => {
      for (let k = 1; k < pts.length; k++)
        if (!(pts[k][0] > pts[k - 1][0]))
          ctx.addIssue({
            code: 'custom',
            path: [k, 0],
            message: 'Mach numbers must increase from one point to the next'
          });
    })
    .default(() => DEFAULT_DRAG_COEFFICIENT.map(([m, cd]) => [m, cd] as [number, number])),
  /** Aerodynamic reference area [m²] (maximum cross-section). */
  referenceArea: num('reference area', 'm²', { gt: 0, le: 1000 })
});

// ---------------------------------------------------------------------------------------------
// Problem and target

export const problemSchema = z.discriminatedUnion(
  'kind',
  [
    z.object({
      kind: z.literal('size'),
      /** Required payload [kg]. */
      payloadMass: num('payload mass', 'kg', LIMITS.payloadMass)
    }),
    z.object({ kind: z.literal('payload') })
  ],
  { error: 'problem.kind must be "size" or "payload"' }
);

const altitude = (label: string) => num(label, 'm', LIMITS.altitude);

export const orbitSchema = z
  .discriminatedUnion(
    'kind',
    [
      z.object({ kind: z.literal('circular'), altitude: altitude('orbit altitude') }),
      z.object({
        kind: z.literal('elliptical'),
        perigeeAltitude: altitude('perigee altitude'),
        apogeeAltitude: altitude('apogee altitude')
      })
    ],
    { error: 'orbit kind must be "circular" or "elliptical"' }
  )
  .superRefine((o, ctx) => {
    if (o.kind === 'elliptical' && o.perigeeAltitude > o.apogeeAltitude)
      ctx.addIssue({
        code: 'custom',
        path: ['perigeeAltitude'],
        message: 'perigee altitude must not exceed the apogee altitude'
      });
  });

export const targetSchema = z.object({
  orbit: orbitSchema,
  /** Orbit inclination [deg], 0–180. */
  inclination: num('inclination', 'deg', LIMITS.inclination),
  /** Launch-site geodetic latitude [deg], −90–90. */
  launchLatitude: num('launch latitude', 'deg', LIMITS.latitude),
  /** Performance reserve: a fixed delta-v [m/s] and/or a share of the rest of the budget. */
  reserve: z
    .object({
      deltaV: num('reserve delta-v', 'm/s', { ge: 0, le: 5000 }).default(0),
      fraction: num('reserve fraction', '', { ge: 0, le: 0.5 }).default(0)
    })
    .default({ deltaV: 0, fraction: 0 })
});

// ---------------------------------------------------------------------------------------------
// Swept parameters

/** A propulsion choice from the workspace catalogue. */
export const catalogueEntrySchema = z
  .object({
    id: text('catalogue id', 64).min(1, 'catalogue id must not be empty'),
    name: text('propulsion name', 120).min(1, 'propulsion name must not be empty'),
    ispSeaLevel: ispSeaLevel(),
    ispVacuum: ispVacuum()
  })
  .superRefine((p, ctx) => {
    if (p.ispVacuum < p.ispSeaLevel)
      ctx.addIssue({
        code: 'custom',
        path: ['ispVacuum'],
        message: 'vacuum Isp must be at least the sea-level Isp'
      });
  });
export type CatalogueEntry = z.output<typeof catalogueEntrySchema>;

const valueNum = (label: string) => num(label, '');

export const parameterValuesSchema = z.discriminatedUnion(
  'kind',
  [
    /** Explicit values. */
    z.object({
      kind: z.literal('list'),
      values: z
        .array(valueNum('value'))
        .min(1, 'give at least one value')
        .max(10_000, 'a list has at most 10,000 values')
    }),
    /** min, min + step, ... up to max (inclusive when it falls on a step). */
    z.object({
      kind: z.literal('step'),
      min: valueNum('min'),
      max: valueNum('max'),
      step: num('step', '', { gt: 0 })
    }),
    /** `count` evenly spaced values from min to max inclusive. */
    z.object({
      kind: z.literal('count'),
      min: valueNum('min'),
      max: valueNum('max'),
      count: num('count', '', { ge: 1, le: MAX_LEVELS_PER_PARAMETER, int: true })
    }),
    /** Sampled plans only: uniform on [min, max]. */
    z.object({ kind: z.literal('uniform'), min: valueNum('min'), max: valueNum('max') }),
    /** Sampled plans only: normal(mean, sd) truncated to [min, max]. */
    z.object({
      kind: z.literal('normal'),
      mean: valueNum('mean'),
      sd: num('standard deviation', '', { gt: 0 }),
      min: valueNum('min'),
      max: valueNum('max')
    }),
    /** Categorical: propulsion options from the catalogue. */
    z.object({
      kind: z.literal('choices'),
      options: z
        .array(catalogueEntrySchema)
        .min(1, 'give at least one option')
        .max(200, 'at most 200 options')
    })
  ],
  { error: 'values.kind must be one of list, step, count, uniform, normal, choices' }
);
export type ParameterValues = z.output<typeof parameterValuesSchema>;

export const parameterSchema = z.object({
  /** What is swept, e.g. `stages.1.ispVacuum`, `target.inclination` (see `PARAMETER_PATHS`). */
  path: text('parameter path', 64),
  values: parameterValuesSchema
});

export const samplingSchema = z.discriminatedUnion(
  'plan',
  [
    z.object({ plan: z.literal('grid') }),
    z.object({
      plan: z.literal('latinHypercube'),
      samples: num('sample count', '', { ge: 1, int: true }),
      seed: num('seed', '', { ge: 0, le: 0xffffffff, int: true })
    }),
    z.object({
      plan: z.literal('random'),
      samples: num('sample count', '', { ge: 1, int: true }),
      seed: num('seed', '', { ge: 0, le: 0xffffffff, int: true })
    })
  ],
  { error: 'sampling.plan must be one of grid, latinHypercube, random' }
);

// ---------------------------------------------------------------------------------------------
// Mode options, constraints, objectives

/**
 * Ascent-mode options (simulated ascent, targeted by the physics core's shooting method). All
 * optional; the physics defaults apply.
 */
export const ascentOptionsSchema = z.object({
  /** Vertical rise before the pitch-over [s]; default: until ≈ 50 m/s. */
  verticalRiseTime: num('vertical rise time', 's', { ge: 0, le: 120 }).optional(),
  /** Integration step in the atmosphere [s] (physics default 1 s). */
  timeStepAtmosphere: num('atmospheric time step', 's', { gt: 0, le: 10 }).optional(),
  /** Integration step of the steered, near-vacuum phase [s] (physics default 8 s). */
  timeStepVacuum: num('vacuum time step', 's', { gt: 0, le: 30 }).optional(),
  /** Targeting: accepted altitude miss at insertion [m] (physics default 50 m). */
  altitudeTolerance: num('altitude tolerance', 'm', { gt: 0, le: 100_000 }).optional(),
  /** Targeting: accepted speed miss at insertion [m/s] (physics default 0.5 m/s). */
  speedTolerance: num('speed tolerance', 'm/s', { gt: 0, le: 1000 }).optional(),
  /** Targeting: most simulated flights per case (physics default 60). */
  maxSimulations: num('flight budget', '', { ge: 5, le: 1000, int: true }).optional()
});

/** Budget-mode loss allowances [m/s]; each omitted one comes from the physics correlation. */
export const lossAllowancesSchema = z.object({
  gravity: num('gravity-loss allowance', 'm/s', { ge: 0, le: 5000 }).optional(),
  drag: num('drag-loss allowance', 'm/s', { ge: 0, le: 5000 }).optional(),
  steering: num('steering-loss allowance', 'm/s', { ge: 0, le: 5000 }).optional()
});

export const constraintsSchema = z
  .object({
    /** Lowest acceptable lift-off T/W (sea-level thrust / lift-off weight). */
    minLiftoffThrustToWeight: num('minimum lift-off T/W', '', { gt: 0, le: 10 }).optional(),
    /** Highest acceptable dynamic pressure [Pa]. */
    maxDynamicPressure: num('max-Q limit', 'Pa', { gt: 0, le: 1e7 }).optional(),
    /** Highest acceptable axial acceleration [m/s²]. */
    maxAxialAcceleration: num('axial acceleration limit', 'm/s²', { gt: 0, le: 2000 }).optional(),
    /** The same limit given in multiples of G0 (converted with G0 = 9.80665 m/s²). */
    maxAxialAccelerationG: num('axial acceleration limit', 'g', { gt: 0, le: 200 }).optional(),
    /** Smallest acceptable payload [kg]. */
    payloadFloor: num('payload floor', 'kg', { gt: 0, le: 1e9 }).optional(),
    /** Largest acceptable gross lift-off mass [kg]. */
    glowCeiling: num('GLOW ceiling', 'kg', { gt: 0, le: 1e10 }).optional()
  })
  .superRefine((c, ctx) => {
    if (c.maxAxialAcceleration !== undefined && c.maxAxialAccelerationG !== undefined)
      ctx.addIssue({
        code: 'custom',
        path: ['maxAxialAccelerationG'],
        message: 'give the axial acceleration limit in m/s² or in g, not both'
      });
  });

/** Result quantities that can be objectives, with their natural direction and unit. */
export const OBJECTIVE_METRICS = Object.freeze({
  glow: { label: 'gross lift-off mass', unit: 'kg', direction: 'min' },
  payloadMass: { label: 'payload', unit: 'kg', direction: 'max' },
  payloadFraction: { label: 'payload fraction', unit: '', direction: 'max' },
  dryMass: { label: 'dry mass', unit: 'kg', direction: 'min' },
  propellantMass: { label: 'propellant mass', unit: 'kg', direction: 'min' },
  /** Budget mode: the physics correlation's estimate; ascent mode: simulated. */
  maxDynamicPressure: { label: 'max-Q', unit: 'Pa', direction: 'min' },
  maxAxialAcceleration: { label: 'max axial acceleration', unit: 'm/s²', direction: 'min' },
  totalLosses: { label: 'total losses', unit: 'm/s', direction: 'min' },
  requiredDeltaV: { label: 'required delta-v', unit: 'm/s', direction: 'min' }
} as const);
export type ObjectiveMetric = keyof typeof OBJECTIVE_METRICS;
const METRIC_NAMES = Object.keys(OBJECTIVE_METRICS) as [ObjectiveMetric, ...ObjectiveMetric[]];

export const objectiveSchema = z.object({
  metric: z.enum(METRIC_NAMES, { error: `objective must be one of ${METRIC_NAMES.join(', ')}` }),
  direction: z.enum(['min', 'max'], { error: 'direction must be "min" or "max"' })
});
export type Objective = z.output<typeof objectiveSchema>;


// ---------------------------------------------------------------------------------------------
// Parameter paths

/** The quantity a path sweeps. */
export type ParameterQuantity =
  | 'ispVacuum'
  | 'ispSeaLevel'
  | 'structuralCoefficient'
  | 'massRatio'
  | 'thrustToWeight'
  | 'propulsion'
  | 'liftoffThrustToWeight'
  | 'upperStageThrustToWeight'
  | 'targetAltitude'
  | 'targetPerigeeAltitude'
  | 'targetApogeeAltitude'
  | 'inclination'
  | 'launchLatitude'
  | 'payloadMass';

export interface ParsedPath {
  quantity: ParameterQuantity;
  /** 0-based stage index (bottom stage 0) for stage quantities, else −1. */
  stage: number;
  categorical: boolean;
}

const STAGE_QUANTITIES = [
  'ispVacuum',
  'ispSeaLevel',
  'structuralCoefficient',
  'massRatio',
  'thrustToWeight',
  'propulsion'
] as const;

const GLOBAL_PATHS: Record<string, ParameterQuantity> = {
  liftoffThrustToWeight: 'liftoffThrustToWeight',
  upperStageThrustToWeight: 'upperStageThrustToWeight',
  'target.altitude': 'targetAltitude',
  'target.perigeeAltitude': 'targetPerigeeAltitude',
  'target.apogeeAltitude': 'targetApogeeAltitude',
  'target.inclination': 'inclination',
  'target.launchLatitude': 'launchLatitude',
  payloadMass: 'payloadMass'
};

/**
 * Every path form, for forms and docs. `N` is the 0-based stage index (0 = first stage).
 * `upperStageThrustToWeight` is the T/W of the top stage; `liftoffThrustToWeight` that of stage 0.
 */
export const PARAMETER_PATHS = Object.freeze([
  ...STAGE_QUANTITIES.map((q) => `stages.N.${q}`),
  ...Object.keys(GLOBAL_PATHS)
]);

/** Label, unit and limits of each quantity. */
export const PARAMETER_INFO: Readonly<
  Record<ParameterQuantity, { label: string; unit: string; limits: Bounds | null }>
> = Object.freeze({
  ispVacuum: { label: 'vacuum Isp', unit: 's', limits: LIMITS.ispVacuum },
  ispSeaLevel: { label: 'sea-level Isp', unit: 's', limits: LIMITS.ispSeaLevel },
  structuralCoefficient: {
    label: 'structural coefficient',
    unit: '',
    limits: LIMITS.structuralCoefficient
  },
  massRatio: { label: 'stage mass ratio', unit: '–', limits: LIMITS.massRatio },
  thrustToWeight: { label: 'thrust-to-weight ratio', unit: '', limits: LIMITS.thrustToWeight },
  propulsion: { label: 'propulsion', unit: '', limits: null },
  liftoffThrustToWeight: { label: 'lift-off T/W', unit: '', limits: LIMITS.thrustToWeight },
  upperStageThrustToWeight: {
    label: 'upper-stage T/W',
    unit: '',
    limits: LIMITS.thrustToWeight
  },
  targetAltitude: { label: 'orbit altitude', unit: 'm', limits: LIMITS.altitude },
  targetPerigeeAltitude: { label: 'perigee altitude', unit: 'm', limits: LIMITS.altitude },
  targetApogeeAltitude: { label: 'apogee altitude', unit: 'm', limits: LIMITS.altitude },
  inclination: { label: 'inclination', unit: 'deg', limits: LIMITS.inclination },
  launchLatitude: { label: 'launch latitude', unit: 'deg', limits: LIMITS.latitude },
  payloadMass: { label: 'payload mass', unit: 'kg', limits: LIMITS.payloadMass }
});

const STAGE_PATH = /^stages\.(\d)\.([A-Za-z]+)$/;

/** Parses a parameter path, or returns null when it is not one of `PARAMETER_PATHS`. */
export function parseParameterPath(path: string): ParsedPath | null {
  const global = GLOBAL_PATHS[path];
  if (global !== undefined && Object.prototype.hasOwnProperty.call(GLOBAL_PATHS, path))
    return { quantity: global, stage: -1, categorical: false };
  const m = STAGE_PATH.exec(path);
  if (!m) return null;
  const q = m[2] as (typeof STAGE_QUANTITIES)[number];
  if (!(STAGE_QUANTITIES as readonly string[]).includes(q)) return null;
  return { quantity: q, stage: Number(m[1]), categorical: q === 'propulsion' };
}

/**
 * The stage a stage-level or alias path acts on (for conflicts), given the stage count.
 * `liftoffThrustToWeight` acts on stage 0's T/W; `upperStageThrustToWeight` on the top stage's.
 */
function effectiveTarget(p: ParsedPath, stageCount: number): string {
  if (p.quantity === 'liftoffThrustToWeight') return 'stages.0.thrustToWeight';
  if (p.quantity === 'upperStageThrustToWeight') return `stages.${stageCount - 1}.thrustToWeight`;
  if (p.stage >= 0) return `stages.${p.stage}.${p.quantity}`;
  return p.quantity;
}

// ---------------------------------------------------------------------------------------------
// Levels and case counts

/** Number of levels of a discrete value set; NaN for distributions (no levels). */
export function levelCount(v: ParameterValues): number {
  switch (v.kind) {
    case 'list':
      return v.values.length;
    case 'count':
      return v.count;
    case 'step':
      // A tiny tolerance so that e.g. 0.1..0.3 step 0.1 keeps its last point despite rounding.
      return v.max >= v.min ? Math.floor((v.max - v.min) / v.step + 1e-9) + 1 : 0;
    case 'choices':
      return v.options.length;
    default:
      return NaN;
  }
}

/** The levels of a discrete numeric value set, in order (list order as given). */
export function numericLevels(v: ParameterValues): Float64Array {
  switch (v.kind) {
    case 'list':
      return Float64Array.from(v.values);
    case 'count': {
      const out = new Float64Array(v.count);
      if (v.count === 1) out[0] = v.min;
      else for (let i = 0; i < v.count; i++) out[i] = v.min + ((v.max - v.min) * i) / (v.count - 1);
      return out;
    }
    case 'step': {
      const n = levelCount(v);
      const out = new Float64Array(n);
      for (let i = 0; i < n; i++) out[i] = Math.min(v.min + i * v.step, v.max);
      return out;
    }
    default:
      throw new RangeError(`values of kind "${v.kind}" have no numeric levels`);
  }
}

/**
 * Number of cases a spec expands to: the product of level counts for a full grid (Infinity
 * when it overflows), the sample count for sampled plans. A grid of no parameters is 1 case
 * (the baseline).
 */
export function estimateCaseCount(spec: Pick<SweepSpec, 'sweep'>): number {
  const { sampling, parameters } = spec.sweep;
  if (sampling.plan !== 'grid') return sampling.samples;
  let n = 1;
  for (const p of parameters) {
    n *= levelCount(p.values);
    if (!Number.isFinite(n)) return Infinity;
  }
  return n;
}

// ---------------------------------------------------------------------------------------------
// The whole spec

export interface SpecOptions {
  /** Hard cap on the number of cases (default 2,000,000). */
  caseCap?: number;
}

const baseSpecSchema = z.object({
  /** Spec format version, for stored specs. */
  version: z.literal(1, { error: 'spec version must be 1' }).default(1),
  name: text('sweep name', 120).min(1, 'the sweep needs a name'),
  /** The question the sweep answers, in words. */
  question: text('question', 2000).default(''),
  baseline: vehicleSchema,
  problem: problemSchema,
  target: targetSchema,
  sweep: z.object({
    parameters: z
      .array(parameterSchema)
      .max(MAX_PARAMETERS, `at most ${MAX_PARAMETERS} swept parameters`)
      .default([]),
    sampling: samplingSchema
  }),
  mode: z.enum(['budget', 'ascent'], { error: 'mode must be "budget" or "ascent"' }),
  ascent: ascentOptionsSchema.default({}),
  losses: lossAllowancesSchema.default({}),
  constraints: constraintsSchema.default({}),
  objectives: z
    .array(objectiveSchema)
    .min(2, 'choose at least 2 objectives')
    .max(4, 'choose at most 4 objectives')
});

type Ctx = z.core.$RefinementCtx<z.output<typeof baseSpecSchema>>;

function issue(ctx: Ctx, path: (string | number)[], message: string): void {
  ctx.addIssue({ code: 'custom', path, message });
}

function checkInLimits(
  ctx: Ctx,
  path: (string | number)[],
  value: number,
  limits: Bounds,
  label: string,
  unit: string
): void {
  const u = (x: number) => withUnit(x, unit);
  if (limits.gt !== undefined && !(value > limits.gt))
    issue(ctx, path, `${label} must be greater than ${u(limits.gt)}`);
  else if (limits.ge !== undefined && !(value >= limits.ge))
    issue(ctx, path, `${label} must be at least ${u(limits.ge)}`);
  else if (limits.lt !== undefined && !(value < limits.lt))
    issue(ctx, path, `${label} must be less than ${u(limits.lt)}`);
  else if (limits.le !== undefined && !(value <= limits.le))
    issue(ctx, path, `${label} must be at most ${u(limits.le)}`);
}

function checkParameters(spec: z.output<typeof baseSpecSchema>, ctx: Ctx): void {
  const stageCount = spec.baseline.stages.length;
  const grid = spec.sweep.sampling.plan === 'grid';
  const seen = new Map<string, number>();
  spec.sweep.parameters.forEach((param, k) => {
    const at = (...rest: (string | number)[]) => ['sweep', 'parameters', k, ...rest];
    const parsed = parseParameterPath(param.path);
    if (!parsed) {
      issue(ctx, at('path'), `unknown parameter path "${param.path}"`);
      return;
    }
    if (parsed.stage >= stageCount) {
      issue(
        ctx,
        at('path'),
        `stage ${parsed.stage} does not exist (the vehicle has stages 0–${stageCount - 1})`
      );
      return;
    }
    const key = effectiveTarget(parsed, stageCount);
    const earlier = seen.get(key);
    if (earlier !== undefined) {
      issue(ctx, at('path'), `"${param.path}" is already swept by parameter ${earlier}`);
      return;
    }
    seen.set(key, k);
    // Propulsion sets the stage's Isp values: sweeping both is a conflict too.
    if (parsed.quantity === 'propulsion' || parsed.quantity === 'ispVacuum' || parsed.quantity === 'ispSeaLevel') {
      const prop = `stages.${parsed.stage}.propulsion`;
      const vac = `stages.${parsed.stage}.ispVacuum`;
      const sl = `stages.${parsed.stage}.ispSeaLevel`;
      const clash =
        parsed.quantity === 'propulsion'
          ? (seen.get(vac) ?? seen.get(sl))
          : seen.get(prop);
      if (clash !== undefined && clash !== k) {
        issue(ctx, at('path'), `"${param.path}" conflicts with the propulsion choice of parameter ${clash}`);
        return;
      }
    }

    const q = parsed.quantity;
    if (q === 'massRatio' && spec.problem.kind !== 'size')
      issue(ctx, at('path'), 'a given vehicle\'s mass ratios follow from its masses; sweep the mass ratio only when sizing');
    else if (q === 'massRatio' && spec.mode !== 'budget')
      issue(ctx, at('path'), 'a fixed stage mass ratio is a budget-mode sizing input; ascent-mode sizing optimises the staging');
    if (q === 'payloadMass' && spec.problem.kind !== 'size')
      issue(ctx, at('path'), 'payload mass is the result when finding the payload of a given vehicle; sweep it only when sizing');
    if (q === 'targetAltitude' && spec.target.orbit.kind !== 'circular')
      issue(ctx, at('path'), 'the orbit altitude can be swept only for a circular orbit; sweep perigee or apogee altitude');
    if ((q === 'targetPerigeeAltitude' || q === 'targetApogeeAltitude') && spec.target.orbit.kind !== 'elliptical')
      issue(ctx, at('path'), 'perigee and apogee altitudes can be swept only for an elliptical orbit; sweep target.altitude');

    const v = param.values;
    if (parsed.categorical !== (v.kind === 'choices')) {
      issue(
        ctx,
        at('values', 'kind'),
        parsed.categorical
          ? 'propulsion is chosen from catalogue entries: use values of kind "choices"'
          : 'catalogue choices apply only to a stage propulsion path'
      );
      return;
    }
    if (grid && (v.kind === 'uniform' || v.kind === 'normal'))
      issue(ctx, at('values', 'kind'), 'a distribution needs a sampled plan (latinHypercube or random), not a full grid');

    const info = PARAMETER_INFO[q];
    if (v.kind === 'list') {
      v.values.forEach((x, j) => info.limits && checkInLimits(ctx, at('values', 'values', j), x, info.limits, info.label, info.unit));
    } else if (v.kind === 'choices') {
      const ids = new Set<string>();
      v.options.forEach((o, j) => {
        if (ids.has(o.id)) issue(ctx, at('values', 'options', j, 'id'), `catalogue entry "${o.id}" is listed twice`);
        ids.add(o.id);
      });
    } else {
      if (v.min > v.max) issue(ctx, at('values', 'min'), 'min must not exceed max');
      if (info.limits) {
        checkInLimits(ctx, at('values', 'min'), v.min, info.limits, info.label, info.unit);
        checkInLimits(ctx, at('values', 'max'), v.max, info.limits, info.label, info.unit);
      }
      if (v.kind === 'count' && v.count === 1 && v.min !== v.max)
        issue(ctx, at('values', 'count'), 'a count of 1 needs min = max; use at least 2 values for a range');
      if (v.kind === 'step' && v.min <= v.max && levelCount(v) > MAX_LEVELS_PER_PARAMETER)
        issue(ctx, at('values', 'step'), `the step gives more than ${MAX_LEVELS_PER_PARAMETER.toLocaleString('en-US')} values`);
      if (v.kind === 'normal') {
        if (v.mean < v.min || v.mean > v.max)
          issue(ctx, at('values', 'mean'), 'the mean must lie between min and max');
        else if (truncatedNormalMass(v.mean, v.sd, v.min, v.max) < MIN_TRUNCATED_NORMAL_MASS)
          issue(ctx, at('values', 'sd'), 'min and max keep almost none of the distribution: widen them or the standard deviation');
      }
    }
  });
}

function buildSpecSchema(caseCap: number) {
  return baseSpecSchema.superRefine((spec, ctx) => {
    const stages = spec.baseline.stages;
    const sizing = spec.problem.kind === 'size';
    stages.forEach((s, i) => {
      const at = (...rest: (string | number)[]) => ['baseline', 'stages', i, ...rest];
      if (sizing && s.thrustToWeight === undefined)
        issue(ctx, at('thrustToWeight'), 'sizing needs a thrust-to-weight ratio per stage (the thrust follows from the sized mass)');
      if (s.massRatio !== undefined && !sizing)
        issue(ctx, at('massRatio'), 'a given vehicle\'s mass ratio follows from its masses; fix a mass ratio only when sizing');
      else if (s.massRatio !== undefined && spec.mode !== 'budget')
        issue(ctx, at('massRatio'), 'a fixed stage mass ratio is a budget-mode sizing input; ascent-mode sizing optimises the staging');
      if (!sizing && s.propellantMass === undefined)
        issue(ctx, at('propellantMass'), 'a given vehicle needs the propellant mass of every stage');
      if (i === 0 && !(s.propulsion.ispSeaLevel > 0))
        issue(ctx, at('propulsion', 'ispSeaLevel'), 'the first stage must produce thrust at sea level (sea-level Isp above 0 s)');
    });

    checkParameters(spec, ctx);

    const metrics = new Set<string>();
    spec.objectives.forEach((o, k) => {
      if (metrics.has(o.metric)) issue(ctx, ['objectives', k, 'metric'], `objective "${o.metric}" is chosen twice`);
      metrics.add(o.metric);
    });

    const n = estimateCaseCount(spec);
    if (n > caseCap) {
      const cap = caseCap.toLocaleString('en-US');
      if (spec.sweep.sampling.plan === 'grid')
        issue(ctx, ['sweep', 'parameters'], `the full grid has ${Number.isFinite(n) ? n.toLocaleString('en-US') : 'too many'} cases, more than the cap of ${cap}`);
      else issue(ctx, ['sweep', 'sampling', 'samples'], `at most ${cap} samples`);
    }
  });
}

/** The sweep specification schema with the default case cap. */
export const sweepSpecSchema = buildSpecSchema(DEFAULT_CASE_CAP);
/** A schema with another case cap (e.g. from server config). */
export function makeSweepSpecSchema(options: SpecOptions = {}) {
  const cap = options.caseCap ?? DEFAULT_CASE_CAP;
  if (!(Number.isInteger(cap) && cap >= 1)) throw new RangeError(`caseCap must be a positive integer, got ${cap}`);
  return cap === DEFAULT_CASE_CAP ? sweepSpecSchema : buildSpecSchema(cap);
}

/** A parsed, validated spec (defaults filled in). */
export type SweepSpec = z.output<typeof baseSpecSchema>;
/** What a form or API client sends (defaults may be omitted). */
export type SweepSpecInput = z.input<typeof baseSpecSchema>;
export type StageSpec = SweepSpec['baseline']['stages'][number];
export type SweepParameter = SweepSpec['sweep']['parameters'][number];

/** Field-keyed error messages: `{ "baseline.stages.1.propulsion.ispVacuum": "..." }`. */
export type FieldErrors = Record<string, string>;

/** Key used for issues on the spec as a whole (e.g. the input is not an object). */
export const ROOT_ERROR_KEY = '_';

/**
 * Flattens a zod error into one message per field, keyed by the dotted zod path; the first
 * issue of a path wins (the most basic one, since zod reports type errors before refinements).
 */
export function fieldErrors(error: z.ZodError): FieldErrors {
  const out: FieldErrors = {};
  for (const iss of error.issues) {
    const key = iss.path.length ? iss.path.map(String).join('.') : ROOT_ERROR_KEY;
    if (!(key in out)) out[key] = iss.message;
  }
  return out;
}

export type ParseResult = { ok: true; spec: SweepSpec } | { ok: false; errors: FieldErrors };

/** Validates unknown input as a sweep spec; never throws. */
export function parseSweepSpec(input: unknown, options: SpecOptions = {}): ParseResult {
  const r = makeSweepSpecSchema(options).safeParse(input);
  return r.success ? { ok: true, spec: r.data } : { ok: false, errors: fieldErrors(r.error) };
}

/** Thrown by `assertSweepSpec` (the worker turns it into an unrecoverable job failure). */
export class SweepSpecError extends Error {
  constructor(readonly errors: FieldErrors) {
    const first = Object.entries(errors)[0];
    super(`invalid sweep spec: ${first ? `${first[0]}: ${first[1]}` : 'unknown error'}`);
    this.name = 'SweepSpecError';
  }
}

/** Validates and returns the spec, or throws a `SweepSpecError` carrying the field errors. */
export function assertSweepSpec(input: unknown, options: SpecOptions = {}): SweepSpec {
  const r = parseSweepSpec(input, options);
  if (!r.ok) throw new SweepSpecError(r.errors);
  return r.spec;
}
