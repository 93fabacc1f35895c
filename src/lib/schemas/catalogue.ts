/**
 * A propulsion catalogue entry, in SI, as stored and as served by
 * GET /api/workspaces/[id]/catalogue. Shared by the catalogue page's forms, the CSV import
 * and the API, so every path accepts and refuses the same values.
 *
 * Thrust is vacuum thrust. With one mass flow, sea-level thrust follows as
 * F_sl = F_vac · Isp_sl / Isp_vac.
 */
import { z } from 'zod';
import { errorsOf } from './errors';

/** Field names with a label each, used in error messages and CSV headers. */
export const ENTRY_FIELDS = {
  name: 'Name',
  propellants: 'Propellants',
  ispSeaLevelS: 'Sea-level Isp',
  ispVacuumS: 'Vacuum Isp',
  thrustVacuumN: 'Vacuum thrust',
  massKg: 'Engine mass',
  notes: 'Notes'
} as const;
export type EntryField = keyof typeof ENTRY_FIELDS;

/**
 * Bounds: chemical rockets run from about 150 s (cold gas) to about 465 s (hydrogen/oxygen
 * in vacuum) — common practice; 600 s leaves room for study values without admitting
 * typing slips such as 3200. Thrust up to 100 MN and engine mass up to 500 t cover the
 * largest solid motors with margin.
 */
export const ISP_MIN_S = 50;
export const ISP_MAX_S = 600;
export const THRUST_MAX_N = 100e6;
export const MASS_MAX_KG = 500e3;

const isp = (label: string) =>
  z
    .number({ error: `${label} must be a number` })
    .refine(Number.isFinite, `${label} must be a finite number`)
    .refine((v) => v >= ISP_MIN_S && v <= ISP_MAX_S, `${label} must be between ${ISP_MIN_S} and ${ISP_MAX_S} s`);

export const CatalogueEntryInput = z
  .object({
    name: z
      .string({ error: 'Name is required' })
      .trim()
      .min(1, 'Name is required')
      .max(120, 'Name must be at most 120 characters'),
    propellants: z
      .string({ error: 'Propellants are required' })
      .trim()
      .min(1, 'Propellants are required (for example LOX/RP-1)')
      .max(80, 'Propellants must be at most 80 characters'),
    /** Null for an engine that is only run in vacuum (large nozzle, no sea-level rating). */
    ispSeaLevelS: isp('Sea-level Isp').nullable(),
    ispVacuumS: isp('Vacuum Isp'),
    thrustVacuumN: z
      .number({ error: 'Vacuum thrust must be a number' })
      .refine((v) => Number.isFinite(v) && v > 0, 'Vacuum thrust must be greater than zero')
      .refine((v) => v <= THRUST_MAX_N, 'Vacuum thrust must be at most 100 MN'),
    massKg: z
      .number({ error: 'Engine mass must be a number' })
      .refine((v) => Number.isFinite(v) && v > 0, 'Engine mass must be greater than zero')
      .refine((v) => v <= MASS_MAX_KG, 'Engine mass must be at most 500 t'),
    notes: z.string().trim().max(2000, 'Notes must be at most 2000 characters').default('')
  })
  // Ambient pressure only subtracts thrust, so sea-level Isp is below vacuum Isp.
  .refine((e) => e.ispSeaLevelS == null || e.ispSeaLevelS < e.ispVacuumS, {
    path: ['ispSeaLevelS'],
    message: 'Sea-level Isp must be below vacuum Isp'
  });

export type CatalogueEntryInput = z.infer<typeof CatalogueEntryInput>;

export interface CatalogueEntry extends CatalogueEntryInput {
  id: number;
  workspaceId: string;
  createdAt: string;
  updatedAt: string;
}

/** Zod issues → { field: first message }. */
export function fieldErrors(issues: readonly z.core.$ZodIssue[]): Partial<Record<EntryField | 'form', string>> {
  return errorsOf(issues);
}
