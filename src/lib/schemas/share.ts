/**
 * The "create a share link" form of the sweep page: label, lifetime and the display units
 * of the shared report. Pure (no server imports), so the page and the action read the same
 * choices. Units left out default to the creating user's own setting.
 */
import { z } from 'zod';
import { UNIT_SYSTEMS, type UnitSystem } from '../units';
import { errorsOf } from './errors';

/** Lifetimes an engineer can choose, in days. */
export const SHARE_EXPIRY_DAYS = [1, 7, 30, 90];

const daysMessage = `choose ${SHARE_EXPIRY_DAYS.join(', ')} days`;

export const ShareLinkForm = z.object({
  label: z.string().trim().max(120, 'the label is at most 120 characters'),
  days: z.coerce.number({ error: daysMessage }).refine((d) => SHARE_EXPIRY_DAYS.includes(d), daysMessage),
  units: z.enum(UNIT_SYSTEMS as ['si', 'us'], { error: 'choose si (SI) or us (US customary) units for the report' })
});
export type ShareLinkInput = z.output<typeof ShareLinkForm>;

export type ShareLinkParse =
  | { ok: true; data: ShareLinkInput }
  | { ok: false; values: Record<'label' | 'days' | 'units', string>; errors: Record<string, string> };

/** Reads the submitted form; an empty or missing `units` means the creator's own units. */
export function parseShareLinkForm(form: FormData, defaultUnits: UnitSystem): ShareLinkParse {
  const text = (k: string) => {
    const v = form.get(k);
    return typeof v === 'string' ? v : '';
  };
  const values = { label: text('label').trim(), days: text('days'), units: text('units') || defaultUnits };
  const parsed = ShareLinkForm.safeParse(values);
  if (parsed.success) return { ok: true, data: parsed.data };
  return { ok: false, values, errors: errorsOf(parsed.error.issues) };
}
