/**
 * The catalogue entry form: reads the fields as typed (thrust and mass in the user's
 * display units), converts to SI and validates with the shared schema. Pure, so the form
 * action and the tests use the same code.
 */
import { CatalogueEntryInput, ENTRY_FIELDS, fieldErrors, type CatalogueEntry, type EntryField } from '../schemas/catalogue';
import { inputValue, parseNumber, parseQuantity, unitLabel, type UnitSystem } from '../units';

/** Form field names; thrust and mass carry the user's display unit. */
export const FORM_FIELDS = ['name', 'propellants', 'ispSeaLevelS', 'ispVacuumS', 'thrust', 'mass', 'notes'] as const;
export type FormField = (typeof FORM_FIELDS)[number];
export type FormValues = Record<FormField, string>;
export type FormErrors = Partial<Record<FormField | 'form', string>>;

const toFormField = (f: EntryField | 'form'): FormField | 'form' =>
  f === 'thrustVacuumN' ? 'thrust' : f === 'massKg' ? 'mass' : f;

export function emptyValues(): FormValues {
  return { name: '', propellants: '', ispSeaLevelS: '', ispVacuumS: '', thrust: '', mass: '', notes: '' };
}

/** An entry's values as the form shows them in the user's system. */
export function valuesOf(e: CatalogueEntry, system: UnitSystem): FormValues {
  return {
    name: e.name,
    propellants: e.propellants,
    ispSeaLevelS: e.ispSeaLevelS == null ? '' : String(e.ispSeaLevelS),
    ispVacuumS: String(e.ispVacuumS),
    thrust: inputValue('thrust', e.thrustVacuumN, system),
    mass: inputValue('mass', e.massKg, system),
    notes: e.notes
  };
}

export type ReadResult =
  | { ok: true; entry: CatalogueEntryInput; values: FormValues }
  | { ok: false; errors: FormErrors; values: FormValues };

export function readEntryForm(form: FormData, system: UnitSystem): ReadResult {
  const values = emptyValues();
  for (const f of FORM_FIELDS) {
    const v = form.get(f);
    values[f] = typeof v === 'string' ? v : '';
  }
  const errors: FormErrors = {};
  const num = (field: 'ispSeaLevelS' | 'ispVacuumS') => {
    const r = parseNumber(values[field], ENTRY_FIELDS[field]);
    if (!r.ok) errors[field] = r.error;
    return r.ok ? r.value : undefined;
  };
  const sl = values.ispSeaLevelS.trim() === '' ? null : num('ispSeaLevelS');
  const vac = num('ispVacuumS');
  const thrust = parseQuantity('thrust', values.thrust, system, ENTRY_FIELDS.thrustVacuumN);
  if (!thrust.ok) errors.thrust = thrust.error;
  const mass = parseQuantity('mass', values.mass, system, ENTRY_FIELDS.massKg);
  if (!mass.ok) errors.mass = mass.error;

  const res = CatalogueEntryInput.safeParse({
    name: values.name,
    propellants: values.propellants,
    ispSeaLevelS: sl ?? null,
    ispVacuumS: vac ?? 300,
    thrustVacuumN: thrust.ok ? thrust.value : 1,
    massKg: mass.ok ? mass.value : 1,
    notes: values.notes
  });
  if (!res.success) {
    for (const [f, message] of Object.entries(fieldErrors(res.error.issues))) {
      const key = toFormField(f as EntryField);
      if (key === 'ispSeaLevelS' && vac === undefined) continue;
      errors[key] ??= message;
    }
  }
  if (Object.keys(errors).length || !res.success) return { ok: false, errors, values };
  return { ok: true, entry: res.data, values };
}

/** Input label and unit, kept apart so the unit keeps its case under uppercase label styles. */
export function fieldLabel(f: FormField, system: UnitSystem): { text: string; unit: string | null } {
  switch (f) {
    case 'ispSeaLevelS':
      return { text: 'Sea-level Isp', unit: 's' };
    case 'ispVacuumS':
      return { text: 'Vacuum Isp', unit: 's' };
    case 'thrust':
      return { text: 'Vacuum thrust', unit: unitLabel('thrust', system) };
    case 'mass':
      return { text: 'Engine mass', unit: unitLabel('mass', system) };
    default:
      return { text: ENTRY_FIELDS[f], unit: null };
  }
}
