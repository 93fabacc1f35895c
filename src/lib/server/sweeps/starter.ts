import { EXAMPLE_CATALOGUE, EXAMPLE_SIZING_INPUT } from '$lib/sweep/examples';
import type { SweepSpecInput } from '$lib/sweep/spec';
import { evaluateOne, prepareSweep } from './engine';

export type StarterEntry = { id: string; name: string; ispSeaLevel: number; ispVacuum: number };

/**
 * A valid starting point: the two-stage sizing example, with its propulsion taken from this
 * workspace's own catalogue when it has entries (its best sea-level engine below; vacuum engines
 * above, the three best of them as the swept choice). The baseline's upper-stage engine is the
 * one whose baseline case is feasible with the lightest lift-off mass, so a new sweep's preview
 * opens on a vehicle that closes; when none does, the highest-Isp one.
 */
export function starterSpec(entries: StarterEntry[]) {
  const spec = structuredClone(EXAMPLE_SIZING_INPUT) as typeof EXAMPLE_SIZING_INPUT & Record<string, unknown>;
  spec.name = 'New sweep';
  spec.question = '';
  delete spec.baseline.name;
  const booster = [...entries].filter((e) => e.ispSeaLevel > 0).sort((a, b) => b.ispSeaLevel - a.ispSeaLevel)[0];
  const upper = [...entries].filter((e) => e.ispSeaLevel === 0 || e.ispVacuum - e.ispSeaLevel > 60).sort((a, b) => b.ispVacuum - a.ispVacuum);
  const asPropulsion = (e: StarterEntry) => ({ catalogueId: e.id, name: e.name, ispSeaLevel: e.ispSeaLevel, ispVacuum: e.ispVacuum });
  const [s0, s1] = spec.baseline.stages;
  s0.name = 'First stage';
  s1.name = 'Upper stage';
  if (booster) s0.propulsion = asPropulsion(booster);
  if (upper.length) {
    s1.propulsion = asPropulsion(lightestFeasible(spec, upper) ?? upper[0]);
    const choice = spec.sweep.parameters?.find((p) => p.path === 'stages.1.propulsion');
    if (choice) choice.values = { kind: 'choices', options: upper.slice(0, 3).map((e) => ({ ...e })) };
  } else {
    // No catalogue: the example's own vacuum engines.
    const own = EXAMPLE_CATALOGUE.filter((e) => e.ispVacuum - e.ispSeaLevel > 60).map((e) => ({ ...e, name: e.name ?? e.id }));
    const pick = lightestFeasible(spec, own);
    if (pick) s1.propulsion = { catalogueId: pick.id, ispSeaLevel: pick.ispSeaLevel, ispVacuum: pick.ispVacuum };
  }
  return spec;
}

/** The upper-stage engine among `candidates` whose baseline case is feasible and lightest. */
function lightestFeasible(spec: SweepSpecInput, candidates: StarterEntry[]): StarterEntry | null {
  let best: { e: StarterEntry; glow: number } | null = null;
  for (const e of candidates) {
    const trial = structuredClone(spec);
    trial.baseline.stages[1].propulsion = { ispSeaLevel: e.ispSeaLevel, ispVacuum: e.ispVacuum };
    trial.sweep = { parameters: [], sampling: { plan: 'grid' } };
    try {
      const one = evaluateOne(prepareSweep(trial), 0);
      const glow = one.values.glow;
      if (one.feasible && glow != null && (!best || glow < best.glow)) best = { e, glow };
    } catch {
      // An entry the model cannot fly is simply not a candidate.
    }
  }
  return best?.e ?? null;
}
