/**
 * Demo studies and one small completed sweep, for the invented Tarnwick Orbital scenario of
 * src/lib/server/db/seed.ts (fictional company, vehicle and range; round numbers of the kind
 * a first study starts from, from memory — no real vehicle's data). Idempotent.
 */
import { caseCount } from '../../sweep/cases';
import { assertSweepSpec, type SweepSpecInput } from '../../sweep/spec';
import { Study, Sweep, type User, type Workspace } from '../db/models';
import { chunkSizeFor, MODEL_VERSION } from './engine';
import { runSweepInline } from './inline';
import { closeRawPool } from './pool';

const FENNEL_SPEC: SweepSpecInput = {
  name: 'Fennel-2 sizing for 500 kg to 500 km SSO',
  question: 'Which first-stage structure, upper-stage propulsion and lift-off T/W give the lightest Fennel-2 for 500 kg to a 500 km sun-synchronous orbit from Cape Tarnwick?',
  baseline: {
    name: 'Fennel-2 (Tarnwick Orbital)',
    stages: [
      {
        name: 'Fennel-2 booster',
        propulsion: { catalogueId: 'tw-kerolox-sl', name: 'Kerosene/LOX, sea-level nozzle', ispSeaLevel: 282, ispVacuum: 312 },
        structuralCoefficient: 0.085,
        thrustToWeight: 1.35
      },
      {
        name: 'Fennel-2 upper stage',
        propulsion: { catalogueId: 'tw-kerolox-vac', name: 'Kerosene/LOX, vacuum nozzle', ispSeaLevel: 170, ispVacuum: 338 },
        structuralCoefficient: 0.11,
        thrustToWeight: 0.85
      }
    ],
    referenceArea: 1.6
  },
  problem: { kind: 'size', payloadMass: 500 },
  target: {
    orbit: { kind: 'circular', altitude: 500_000 },
    inclination: 97.4,
    launchLatitude: 34.6,
    reserve: { deltaV: 60, fraction: 0 }
  },
  sweep: {
    parameters: [
      { path: 'stages.0.structuralCoefficient', values: { kind: 'step', min: 0.06, max: 0.11, step: 0.01 } },
      {
        path: 'stages.1.propulsion',
        values: {
          kind: 'choices',
          options: [
            { id: 'tw-kerolox-vac', name: 'Kerosene/LOX, vacuum nozzle', ispSeaLevel: 170, ispVacuum: 338 },
            { id: 'tw-methalox-vac', name: 'Methane/LOX, vacuum nozzle', ispSeaLevel: 190, ispVacuum: 362 },
            { id: 'tw-hydrolox-vac', name: 'Hydrogen/LOX, vacuum nozzle', ispSeaLevel: 200, ispVacuum: 445 }
          ]
        }
      },
      { path: 'liftoffThrustToWeight', values: { kind: 'count', min: 1.2, max: 1.7, count: 11 } },
      { path: 'stages.1.structuralCoefficient', values: { kind: 'list', values: [0.09, 0.11, 0.13] } }
    ],
    sampling: { plan: 'grid' }
  },
  mode: 'budget',
  constraints: { minLiftoffThrustToWeight: 1.25, maxAxialAccelerationG: 6, glowCeiling: 45_000 },
  objectives: [
    { metric: 'glow', direction: 'min' },
    { metric: 'maxAxialAcceleration', direction: 'min' }
  ]
};

export async function seedDemoSweeps(users: Map<string, User>, workspaces: Map<string, Workspace>) {
  const ws = workspaces.get('small-launcher');
  const engineer = users.get('engineer@tarnwick.example');
  if (!ws || !engineer) return;
  const [study] = await Study.findOrCreate({
    where: { workspaceId: ws.id, name: 'Fennel-2 upper-stage propulsion trade' },
    defaults: {
      workspaceId: ws.id,
      name: 'Fennel-2 upper-stage propulsion trade',
      question: FENNEL_SPEC.question ?? '',
      notes: 'Demo study (invented scenario). Budget-mode sizing; ascent-mode checks of the short list to follow.',
      createdBy: engineer.id
    }
  });
  const heavy = workspaces.get('heavy-concepts');
  if (heavy)
    await Study.findOrCreate({
      where: { workspaceId: heavy.id, name: 'Thistle-3 staging options' },
      defaults: {
        workspaceId: heavy.id,
        name: 'Thistle-3 staging options',
        question: 'Two or three stages for 4 t to a 500 km, 53° orbit?',
        notes: 'Demo study (invented scenario).',
        createdBy: engineer.id
      }
    });
  if (await Sweep.findOne({ where: { studyId: study.id } })) return;
  const spec = assertSweepSpec(FENNEL_SPEC);
  const total = caseCount(spec);
  const chunkSize = chunkSizeFor(spec.mode, total);
  const sweep = await Sweep.create({
    workspaceId: ws.id,
    studyId: study.id,
    ownerId: engineer.id,
    name: spec.name,
    spec,
    mode: spec.mode,
    totalCases: total,
    chunkSize,
    chunkCount: Math.ceil(total / chunkSize),
    modelVersion: MODEL_VERSION
  });
  try {
    await runSweepInline(sweep.id);
  } finally {
    // The CLI closes Sequelize only; the raw pool is re-created lazily if used again.
    await closeRawPool();
  }
}
