/**
 * The sweep builder's starting specification: valid, and its baseline case (what the builder's
 * preview evaluates) closes, so a new sweep does not open on an infeasible vehicle.
 */
import { describe, expect, it } from 'vitest';
import { starterSpec, type StarterEntry } from '$lib/server/sweeps/starter';
import { evaluateOne, prepareSweep } from '$lib/server/sweeps/engine';
import { DEMO_CATALOGUE } from '$lib/server/db/seed-catalogue';
import { assertSweepSpec, type SweepSpecInput } from '$lib/sweep/spec';

const asEntries = (slug: string): StarterEntry[] =>
  DEMO_CATALOGUE[slug].map((e, i) => ({ id: String(i + 1), name: e.name, ispSeaLevel: e.ispSeaLevelS ?? 0, ispVacuum: e.ispVacuumS }));

/** The builder's preview: the baseline alone, with no swept parameter. */
function baselineOf(spec: SweepSpecInput) {
  return evaluateOne(prepareSweep({ ...structuredClone(spec), sweep: { parameters: [], sampling: { plan: 'grid' } } }), 0);
}

describe('starterSpec', () => {
  for (const slug of Object.keys(DEMO_CATALOGUE)) {
    it(`opens on a feasible baseline with the ${slug} demo catalogue`, () => {
      const entries = asEntries(slug);
      const spec = starterSpec(entries);
      expect(() => assertSweepSpec(spec)).not.toThrow();
      const base = baselineOf(spec);
      expect(base.reasons).toEqual([]);
      expect(base.feasible).toBe(true);
      // Its upper-stage engine is the lightest feasible choice among the vacuum engines.
      const chosen = spec.baseline.stages[1].propulsion as { catalogueId: string };
      for (const e of entries.filter((x) => x.ispSeaLevel === 0 || x.ispVacuum - x.ispSeaLevel > 60)) {
        const trial = structuredClone(spec);
        trial.baseline.stages[1].propulsion = { ispSeaLevel: e.ispSeaLevel, ispVacuum: e.ispVacuum };
        const r = baselineOf(trial);
        if (r.feasible) expect(base.values.glow!).toBeLessThanOrEqual(r.values.glow!);
        if (e.id === chosen.catalogueId) expect(r.values.glow).toBeCloseTo(base.values.glow!, 6);
      }
    });
  }

  it('falls back to the highest-Isp upper engine when no choice closes', () => {
    // Two poor vacuum engines: 500 kg to 500 km does not close under the GLOW ceiling with either.
    const entries: StarterEntry[] = [
      { id: 'a', name: 'Booster', ispSeaLevel: 250, ispVacuum: 270 },
      { id: 'b', name: 'Poor upper', ispSeaLevel: 0, ispVacuum: 150 },
      { id: 'c', name: 'Poorer upper', ispSeaLevel: 0, ispVacuum: 140 }
    ];
    const spec = starterSpec(entries);
    expect(() => assertSweepSpec(spec)).not.toThrow();
    expect(baselineOf(spec).feasible).toBe(false);
    expect((spec.baseline.stages[1].propulsion as { catalogueId: string }).catalogueId).toBe('b');
  });

  it('keeps the example propulsion when the catalogue is empty', () => {
    const spec = starterSpec([]);
    expect(() => assertSweepSpec(spec)).not.toThrow();
    expect(baselineOf(spec).feasible).toBe(true);
  });
});
