/**
 * Propulsion catalogue CSV: parsing (papaparse) and per-row validation, pure so the page,
 * the server action and the tests share it. An import is all-or-nothing: the caller imports
 * `entries` only when `errors` is empty.
 *
 * Columns (header row required, order free, case-insensitive):
 *   name, propellants, isp_sl_s (may be blank: vacuum-only engine), isp_vac_s,
 *   thrust_n or thrust_lbf (vacuum thrust), mass_kg or mass_lb, notes (optional)
 * Rows are numbered as in a spreadsheet: the header is row 1, the first entry row 2.
 */
import Papa from 'papaparse';
import { CatalogueEntryInput, ENTRY_FIELDS, fieldErrors, type EntryField } from '../schemas/catalogue';
import { KG_PER_LB, N_PER_LBF, parseNumber } from '../units';

export const CSV_MAX_BYTES = 256 * 1024;
export const CSV_MAX_ROWS = 2000;

export const CSV_TEMPLATE =
  'name,propellants,isp_sl_s,isp_vac_s,thrust_n,mass_kg,notes\n' +
  'Example K-1,LOX/RP-1,290,322,850000,1100,Gas-generator cycle\n';

export interface RowError {
  /** Spreadsheet row number (header = 1); 0 for a problem with the file as a whole. */
  row: number;
  /** CSV column the problem is in ('' for the file or the whole row). */
  field: string;
  message: string;
}

export interface CsvResult {
  entries: CatalogueEntryInput[];
  /** Spreadsheet row number of each entry, parallel to `entries`. */
  rows: number[];
  errors: RowError[];
}

type Column = 'name' | 'propellants' | 'isp_sl_s' | 'isp_vac_s' | 'thrust_n' | 'thrust_lbf' | 'mass_kg' | 'mass_lb' | 'notes';
const KNOWN: readonly Column[] = ['name', 'propellants', 'isp_sl_s', 'isp_vac_s', 'thrust_n', 'thrust_lbf', 'mass_kg', 'mass_lb', 'notes'];

/** The CSV column an entry field came from, so errors name what the user sees in the file. */
function columnOf(field: EntryField | 'form', thrustCol: Column, massCol: Column): string {
  switch (field) {
    case 'ispSeaLevelS':
      return 'isp_sl_s';
    case 'ispVacuumS':
      return 'isp_vac_s';
    case 'thrustVacuumN':
      return thrustCol;
    case 'massKg':
      return massCol;
    case 'form':
      return '';
    default:
      return field;
  }
}

function fileError(message: string): CsvResult {
  return { entries: [], rows: [], errors: [{ row: 0, field: '', message }] };
}

export function parseCatalogueCsv(text: string): CsvResult {
  if (text.includes('\u0000')) return fileError('The file is not a text CSV file');
  const clean = text.replace(/^\uFEFF/, ''); // spreadsheet exports often start with a BOM
  if (clean.trim() === '') return fileError('The file is empty');

  const parsed = Papa.parse<string[]>(clean, { skipEmptyLines: false });
  const rows = parsed.data;
  // A trailing newline leaves one empty row; blank rows are skipped below, keeping numbering.
  const head = (rows[0] ?? []).map((h) => h.trim().toLowerCase());

  const errors: RowError[] = [];
  const unknown = head.filter((h) => h !== '' && !KNOWN.includes(h as Column));
  if (unknown.length) {
    errors.push({ row: 1, field: unknown[0], message: `Unknown column "${unknown.join('", "')}"; expected ${KNOWN.join(', ')}` });
  }
  const dup = head.find((h, i) => h !== '' && head.indexOf(h) !== i);
  if (dup) errors.push({ row: 1, field: dup, message: `Column "${dup}" appears twice` });
  const has = (c: Column) => head.includes(c);
  for (const c of ['name', 'propellants', 'isp_vac_s'] as const) {
    if (!has(c)) errors.push({ row: 1, field: c, message: `Missing column "${c}"` });
  }
  if (!has('isp_sl_s')) errors.push({ row: 1, field: 'isp_sl_s', message: 'Missing column "isp_sl_s" (leave cells blank for vacuum-only engines)' });
  if (has('thrust_n') === has('thrust_lbf')) {
    errors.push({ row: 1, field: 'thrust_n', message: 'Give exactly one thrust column: thrust_n or thrust_lbf' });
  }
  if (has('mass_kg') === has('mass_lb')) {
    errors.push({ row: 1, field: 'mass_kg', message: 'Give exactly one mass column: mass_kg or mass_lb' });
  }
  if (errors.length) return { entries: [], rows: [], errors };

  const thrustCol: Column = has('thrust_n') ? 'thrust_n' : 'thrust_lbf';
  const massCol: Column = has('mass_kg') ? 'mass_kg' : 'mass_lb';
  const idx = (c: Column) => head.indexOf(c);

  const body = rows.slice(1);
  const filled = body.filter((r) => r.some((c) => c.trim() !== '')).length;
  if (filled === 0) return fileError('The file has a header but no entries');
  if (filled > CSV_MAX_ROWS) return fileError(`The file has ${filled} entries; at most ${CSV_MAX_ROWS} are imported at once`);

  const entries: CatalogueEntryInput[] = [];
  const entryRows: number[] = [];
  const seen = new Map<string, number>();

  body.forEach((cells, i) => {
    const row = i + 2;
    if (!cells.some((c) => c.trim() !== '')) return;
    const rowErrors: RowError[] = [];
    if (cells.length !== head.length) {
      errors.push({ row, field: '', message: `Row has ${cells.length} cells; the header has ${head.length}` });
      return;
    }
    const cell = (c: Column) => (cells[idx(c)] ?? '').trim();
    const num = (c: Column, label: string, factor = 1): number | undefined => {
      const r = parseNumber(cell(c), label);
      if (!r.ok) {
        rowErrors.push({ row, field: c, message: r.error });
        return undefined;
      }
      return r.value * factor;
    };

    const sl = cell('isp_sl_s') === '' ? null : num('isp_sl_s', ENTRY_FIELDS.ispSeaLevelS);
    const vac = num('isp_vac_s', ENTRY_FIELDS.ispVacuumS);
    const thrust = num(thrustCol, ENTRY_FIELDS.thrustVacuumN, thrustCol === 'thrust_lbf' ? N_PER_LBF : 1);
    const mass = num(massCol, ENTRY_FIELDS.massKg, massCol === 'mass_lb' ? KG_PER_LB : 1);

    const candidate = {
      name: cell('name'),
      propellants: cell('propellants'),
      ispSeaLevelS: sl ?? null,
      ispVacuumS: vac ?? ISP_PLACEHOLDER,
      thrustVacuumN: thrust ?? 1,
      massKg: mass ?? 1,
      notes: has('notes') ? cell('notes') : ''
    };
    const res = CatalogueEntryInput.safeParse(candidate);
    if (!res.success) {
      const already = new Set(rowErrors.map((e) => e.field));
      for (const [field, message] of Object.entries(fieldErrors(res.error.issues))) {
        const col = columnOf(field as EntryField, thrustCol, massCol);
        // A number that did not parse already has its error; skip the follow-on ones.
        if (already.has(col) || (field === 'ispSeaLevelS' && vac === undefined)) continue;
        rowErrors.push({ row, field: col, message: message! });
      }
    }
    if (res.success && rowErrors.length === 0) {
      const key = res.data.name.toLowerCase();
      const first = seen.get(key);
      if (first) rowErrors.push({ row, field: 'name', message: `Name "${res.data.name}" is already used in row ${first}` });
      else seen.set(key, row);
    }
    if (rowErrors.length) errors.push(...rowErrors);
    else if (res.success) {
      entries.push(res.data);
      entryRows.push(row);
    }
  });

  return errors.length ? { entries: [], rows: [], errors } : { entries, rows: entryRows, errors };
}

/** Entries → CSV in the import format (SI columns), so an export imports back unchanged. */
export function catalogueToCsv(entries: readonly CatalogueEntryInput[]): string {
  return (
    Papa.unparse({
      fields: ['name', 'propellants', 'isp_sl_s', 'isp_vac_s', 'thrust_n', 'mass_kg', 'notes'],
      data: entries.map((e) => [e.name, e.propellants, e.ispSeaLevelS ?? '', e.ispVacuumS, e.thrustVacuumN, e.massKg, e.notes])
    }) + '\r\n'
  );
}

// Stands in for an unparsable vacuum Isp so the other fields still get checked.
const ISP_PLACEHOLDER = 300;

/** "Row 4, isp_vac_s: Vacuum Isp must be a number" */
export function describeRowError(e: RowError): string {
  if (e.row === 0) return e.message;
  return `Row ${e.row}${e.field ? `, ${e.field}` : ''}: ${e.message}`;
}
