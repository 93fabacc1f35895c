/**
 * Demo propulsion catalogue for the invented Tarnwick Orbital scenario. Engine names are
 * made up; the figures are typical trade values for each propellant combination (common
 * practice ranges: kerosene/oxygen Isp about 285–300 s at sea level and 310–340 s in vacuum,
 * methane/oxygen a little higher, hydrogen/oxygen upper stages about 440–460 s in vacuum,
 * composite solids about 240–285 s), not data of any real engine.
 * Idempotent: an entry is added only when its name is not yet in the workspace.
 */
import type { CatalogueEntryInput } from '../../schemas/catalogue';
import { CatalogueEntry, type Workspace } from './models';

export const DEMO_CATALOGUE: Record<string, CatalogueEntryInput[]> = {
  'small-launcher': [
    {
      name: 'Tallow T-90',
      propellants: 'LOX/RP-1',
      ispSeaLevelS: 288,
      ispVacuumS: 312,
      thrustVacuumN: 95_000,
      massKg: 118,
      notes: 'Gas-generator cycle, booster cluster engine (9 per first stage).'
    },
    {
      name: 'Tallow T-90V',
      propellants: 'LOX/RP-1',
      ispSeaLevelS: null,
      ispVacuumS: 336,
      thrustVacuumN: 31_000,
      massKg: 64,
      notes: 'Vacuum-nozzle variant for the second stage; no sea-level rating.'
    },
    {
      name: 'Marsh M-220',
      propellants: 'LOX/CH4',
      ispSeaLevelS: 309,
      ispVacuumS: 342,
      thrustVacuumN: 220_000,
      massKg: 240,
      notes: 'Staged-combustion study engine; reusable-booster option.'
    },
    {
      name: 'Hollin H-60',
      propellants: 'LOX/LH2',
      ispSeaLevelS: null,
      ispVacuumS: 448,
      thrustVacuumN: 62_000,
      massKg: 165,
      notes: 'Expander cycle upper-stage engine.'
    },
    {
      name: 'Brack S-40',
      propellants: 'HTPB/AP (solid)',
      ispSeaLevelS: 246,
      ispVacuumS: 279,
      thrustVacuumN: 410_000,
      massKg: 1_350,
      notes: 'Solid motor; mass is the inert motor (case, nozzle, igniter) without propellant.'
    },
    {
      name: 'Reed N-10',
      propellants: 'N2O4/MMH',
      ispSeaLevelS: null,
      ispVacuumS: 316,
      thrustVacuumN: 10_500,
      massKg: 22,
      notes: 'Pressure-fed hypergolic kick-stage engine.'
    }
  ],
  'heavy-concepts': [
    {
      name: 'Bramble B-1000',
      propellants: 'LOX/RP-1',
      ispSeaLevelS: 297,
      ispVacuumS: 329,
      thrustVacuumN: 1_020_000,
      massKg: 1_180,
      notes: 'Oxidiser-rich staged combustion, core-stage candidate.'
    },
    {
      name: 'Marsh M-2100',
      propellants: 'LOX/CH4',
      ispSeaLevelS: 318,
      ispVacuumS: 351,
      thrustVacuumN: 2_100_000,
      massKg: 1_650,
      notes: 'Full-flow study engine; figures are the concept target.'
    },
    {
      name: 'Hollin H-110',
      propellants: 'LOX/LH2',
      ispSeaLevelS: null,
      ispVacuumS: 455,
      thrustVacuumN: 110_000,
      massKg: 290,
      notes: 'Expander cycle, third stage.'
    }
  ]
};

export async function seedCatalogue(workspaces: Map<string, Workspace>) {
  for (const [slug, entries] of Object.entries(DEMO_CATALOGUE)) {
    const ws = workspaces.get(slug);
    if (!ws) continue;
    for (const e of entries) {
      await CatalogueEntry.findOrCreate({ where: { workspaceId: ws.id, name: e.name }, defaults: { workspaceId: ws.id, ...e } });
    }
  }
}
