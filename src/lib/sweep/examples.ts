/**
 * Example sweep specifications for tests and demo seeding. An INVENTED scenario: the fictional
 * company Pellmore Launch Co. studies its two-stage small launcher "Quill" flying from its
 * fictional site at Harrowgate Point (latitude 45° N). Round, plausible numbers of the kind a
 * conceptual study starts from (common practice, from memory); no real vehicle's data.
 */
import { assertSweepSpec, type CatalogueEntry, type SweepSpec, type SweepSpecInput } from './spec';

/** Demo propulsion catalogue (typical trade values for each propellant family, from memory). */
export const EXAMPLE_CATALOGUE: readonly CatalogueEntry[] = Object.freeze([
  { id: 'pl-kx-booster', name: 'Kerosene/LOX gas generator, sea-level nozzle', ispSeaLevel: 285, ispVacuum: 315 },
  { id: 'pl-kx-vac', name: 'Kerosene/LOX gas generator, vacuum nozzle', ispSeaLevel: 180, ispVacuum: 340 },
  { id: 'pl-mx-vac', name: 'Methane/LOX staged combustion, vacuum nozzle', ispSeaLevel: 200, ispVacuum: 365 },
  { id: 'pl-hx-vac', name: 'Hydrogen/LOX expander, vacuum nozzle', ispSeaLevel: 200, ispVacuum: 450 }
]);

const quillDrag: [number, number][] = [
  [0, 0.3],
  [0.8, 0.3],
  [1.1, 0.55],
  [2, 0.4],
  [4, 0.27]
];

/** Sizing: which structure, upper-stage propulsion and lift-off T/W give the lightest Quill for 500 kg? */
export const EXAMPLE_SIZING_INPUT: SweepSpecInput = {
  name: 'Quill sizing for 500 kg to 500 km',
  question:
    'Which first-stage structure, upper-stage propulsion and lift-off T/W give the lightest Quill that puts 500 kg into a 500 km, 53° orbit from Harrowgate Point?',
  baseline: {
    name: 'Quill (Pellmore Launch Co.)',
    stages: [
      {
        name: 'Quill first stage',
        propulsion: { catalogueId: 'pl-kx-booster', ispSeaLevel: 285, ispVacuum: 315 },
        structuralCoefficient: 0.08,
        thrustToWeight: 1.4
      },
      {
        name: 'Quill upper stage',
        propulsion: { catalogueId: 'pl-kx-vac', ispSeaLevel: 180, ispVacuum: 340 },
        structuralCoefficient: 0.1,
        thrustToWeight: 0.9
      }
    ],
    dragCoefficient: quillDrag,
    referenceArea: 1.8
  },
  problem: { kind: 'size', payloadMass: 500 },
  target: {
    orbit: { kind: 'circular', altitude: 500_000 },
    inclination: 53,
    launchLatitude: 45,
    reserve: { deltaV: 50, fraction: 0 }
  },
  sweep: {
    parameters: [
      { path: 'stages.0.structuralCoefficient', values: { kind: 'step', min: 0.06, max: 0.1, step: 0.01 } },
      { path: 'stages.1.propulsion', values: { kind: 'choices', options: EXAMPLE_CATALOGUE.slice(1).map((e) => ({ ...e })) } },
      { path: 'liftoffThrustToWeight', values: { kind: 'count', min: 1.2, max: 1.6, count: 5 } }
    ],
    sampling: { plan: 'grid' }
  },
  mode: 'budget',
  constraints: { minLiftoffThrustToWeight: 1.25, maxAxialAccelerationG: 7, glowCeiling: 60_000 },
  objectives: [
    { metric: 'glow', direction: 'min' },
    { metric: 'dryMass', direction: 'min' }
  ]
};

/** Payload of the given Quill across target inclinations and upper-stage Isp scatter. */
export const EXAMPLE_PAYLOAD_INPUT: SweepSpecInput = {
  name: 'Quill payload across inclinations',
  question: 'How much can the Quill as designed carry to 500 km across inclinations, allowing for upper-stage Isp scatter?',
  baseline: {
    name: 'Quill (Pellmore Launch Co.)',
    stages: [
      {
        name: 'Quill first stage',
        propulsion: { catalogueId: 'pl-kx-booster', ispSeaLevel: 285, ispVacuum: 315 },
        dryMass: 2_000,
        propellantMass: 24_000,
        thrustVacuum: 420_000
      },
      {
        name: 'Quill upper stage',
        propulsion: { catalogueId: 'pl-kx-vac', ispSeaLevel: 180, ispVacuum: 340 },
        dryMass: 400,
        propellantMass: 3_000,
        thrustVacuum: 35_000
      }
    ],
    dragCoefficient: quillDrag,
    referenceArea: 1.8
  },
  problem: { kind: 'payload' },
  target: {
    orbit: { kind: 'circular', altitude: 500_000 },
    inclination: 53,
    launchLatitude: 45,
    reserve: { deltaV: 0, fraction: 0.01 }
  },
  sweep: {
    parameters: [
      { path: 'target.inclination', values: { kind: 'uniform', min: 45, max: 98 } },
      { path: 'stages.1.ispVacuum', values: { kind: 'normal', mean: 340, sd: 4, min: 328, max: 352 } }
    ],
    sampling: { plan: 'latinHypercube', samples: 500, seed: 20240611 }
  },
  mode: 'budget',
  constraints: { payloadFloor: 150, maxAxialAcceleration: 70 },
  objectives: [
    { metric: 'payloadMass', direction: 'max' },
    { metric: 'totalLosses', direction: 'min' },
    { metric: 'maxAxialAcceleration', direction: 'min' }
  ]
};

/** Ascent mode: simulated losses and max-Q of the given Quill over lift-off T/W. */
export const EXAMPLE_ASCENT_INPUT: SweepSpecInput = {
  ...EXAMPLE_PAYLOAD_INPUT,
  name: 'Quill ascent over lift-off T/W',
  question: 'How do max-Q and payload trade against lift-off thrust for the Quill?',
  sweep: {
    parameters: [{ path: 'stages.0.thrustToWeight', values: { kind: 'list', values: [1.2, 1.35, 1.5, 1.65] } }],
    sampling: { plan: 'grid' }
  },
  baseline: {
    ...EXAMPLE_PAYLOAD_INPUT.baseline,
    stages: EXAMPLE_PAYLOAD_INPUT.baseline.stages.map((s, i) =>
      i === 0 ? { ...s, thrustVacuum: undefined, thrustToWeight: 1.35 } : { ...s }
    )
  },
  mode: 'ascent',
  ascent: { verticalRiseTime: 10 },
  constraints: { maxDynamicPressure: 45_000, maxAxialAccelerationG: 8 },
  objectives: [
    { metric: 'payloadMass', direction: 'max' },
    { metric: 'maxDynamicPressure', direction: 'min' }
  ]
};

export const EXAMPLE_SIZING_SPEC: SweepSpec = assertSweepSpec(EXAMPLE_SIZING_INPUT);
export const EXAMPLE_PAYLOAD_SPEC: SweepSpec = assertSweepSpec(EXAMPLE_PAYLOAD_INPUT);
export const EXAMPLE_ASCENT_SPEC: SweepSpec = assertSweepSpec(EXAMPLE_ASCENT_INPUT);

/** All example specs by a short key (for demo seeding). */
export const EXAMPLE_SPECS: Readonly<Record<'sizing' | 'payload' | 'ascent', SweepSpec>> = Object.freeze({
  sizing: EXAMPLE_SIZING_SPEC,
  payload: EXAMPLE_PAYLOAD_SPEC,
  ascent: EXAMPLE_ASCENT_SPEC
});
