/**
 * Display units: the one place where Loftwise converts between SI (stored and computed
 * everywhere) and US customary units (shown and typed by users who choose them in
 * Settings). Pure: no $app, $env or DOM, so pages, API routes and the worker can all use it.
 *
 * Exact factors from NIST Special Publication 811 (2008), "Guide for the Use of the
 * International System of Units", Appendix B.8/B.9:
 *   1 lb (avoirdupois pound)   = 0.453 592 37 kg     (exact)
 *   1 ft                       = 0.3048 m            (exact)
 *   1 mi (international mile)  = 1609.344 m          (exact)
 *   1 lbf                      = 4.448 221 615 260 5 N (exact: 1 lb × standard gravity 9.806 65 m/s²)
 * Pressure in psf is derived from those: 1 lbf/ft² = 4.4482216152605 / 0.3048² Pa.
 * Specific impulse in seconds is the same in both systems (F / (ṁ·g0) with g0 exact).
 */

export type UnitSystem = 'si' | 'us';
export const UNIT_SYSTEMS: readonly UnitSystem[] = ['si', 'us'];
export const UNIT_SYSTEM_LABELS: Record<UnitSystem, string> = {
  si: 'SI (kg, N, m, km, m/s)',
  us: 'US customary (lb, lbf, ft, mi, ft/s)'
};

export const KG_PER_LB = 0.45359237;
export const M_PER_FT = 0.3048;
export const M_PER_MI = 1609.344;
export const N_PER_LBF = 4.4482216152605;
export const PA_PER_PSF = N_PER_LBF / (M_PER_FT * M_PER_FT);
/** Square foot in square metres (exact: 0.3048² = 0.09290304, NIST SP 811 B.8). */
export const M2_PER_FT2 = M_PER_FT * M_PER_FT;

/** What a number measures. Each kind has one SI display unit and one US display unit. */
export type Quantity =
  | 'mass'
  | 'force'
  | 'thrust'
  | 'length'
  | 'altitude'
  | 'distance'
  | 'speed'
  | 'pressure'
  | 'area'
  | 'isp';

interface UnitDef {
  /** Label shown after values and in column headers. */
  label: string;
  /** How many SI base units (kg, N, m, m/s, Pa, s) one display unit is. */
  si: number;
}

/**
 * Display unit per quantity and system. Thrust is shown in kN (SI) because engine thrusts
 * run to six or seven digits in newtons; altitude and distance in km (US: statute miles), like
 * orbit figures — a 500 km orbit reads 310.7 mi, not 1,640,420 ft.
 */
export const UNITS: Record<Quantity, Record<UnitSystem, UnitDef>> = {
  mass: { si: { label: 'kg', si: 1 }, us: { label: 'lb', si: KG_PER_LB } },
  force: { si: { label: 'N', si: 1 }, us: { label: 'lbf', si: N_PER_LBF } },
  thrust: { si: { label: 'kN', si: 1000 }, us: { label: 'lbf', si: N_PER_LBF } },
  length: { si: { label: 'm', si: 1 }, us: { label: 'ft', si: M_PER_FT } },
  altitude: { si: { label: 'km', si: 1000 }, us: { label: 'mi', si: M_PER_MI } },
  distance: { si: { label: 'km', si: 1000 }, us: { label: 'mi', si: M_PER_MI } },
  speed: { si: { label: 'm/s', si: 1 }, us: { label: 'ft/s', si: M_PER_FT } },
  pressure: { si: { label: 'kPa', si: 1000 }, us: { label: 'psf', si: PA_PER_PSF } },
  area: { si: { label: 'm²', si: 1 }, us: { label: 'ft²', si: M2_PER_FT2 } },
  isp: { si: { label: 's', si: 1 }, us: { label: 's', si: 1 } }
};

export function isUnitSystem(v: unknown): v is UnitSystem {
  return v === 'si' || v === 'us';
}

/** The label of a quantity's display unit: unitLabel('thrust', 'us') → 'lbf'. */
export function unitLabel(q: Quantity, system: UnitSystem): string {
  return UNITS[q][system].label;
}

/** SI base value → display value: toDisplay('mass', 1, 'us') → 2.2046226218487757 (lb). */
export function toDisplay(q: Quantity, siValue: number, system: UnitSystem): number {
  return siValue / UNITS[q][system].si;
}

/** Display value → SI base value: fromDisplay('thrust', 1, 'si') → 1000 (N). */
export function fromDisplay(q: Quantity, value: number, system: UnitSystem): number {
  return value * UNITS[q][system].si;
}

export interface FormatOptions {
  /** Significant digits kept (default 4); integers above that are shown whole. */
  digits?: number;
  /** Fixed decimals instead of significant digits. */
  decimals?: number;
  /** Add the unit label (default true). */
  unit?: boolean;
}

/** Formats a number for tables: thousands grouping, no exponent, '—' for null/NaN. */
export function formatNumber(value: number | null | undefined, opts: FormatOptions = {}): string {
  if (value == null || !Number.isFinite(value)) return '—';
  if (opts.decimals != null) {
    return value.toLocaleString('en-US', {
      minimumFractionDigits: opts.decimals,
      maximumFractionDigits: opts.decimals
    });
  }
  const digits = opts.digits ?? 4;
  const abs = Math.abs(value);
  // Whole numbers at or above the significant-digit budget are shown whole (845 300, not 845 300.0).
  const intDigits = abs > 0 ? Math.floor(Math.log10(abs)) + 1 : 1;
  const decimals = Math.min(20, Math.max(0, digits - intDigits));
  const rounded = Number(value.toFixed(decimals));
  return rounded.toLocaleString('en-US', { maximumFractionDigits: decimals, minimumFractionDigits: 0 });
}

/**
 * SI value → display string in the user's system:
 * formatQuantity('thrust', 845_000, 'si') → '845 kN'; formatQuantity('mass', 1000, 'us') → '2,205 lb'.
 */
export function formatQuantity(
  q: Quantity,
  siValue: number | null | undefined,
  system: UnitSystem,
  opts: FormatOptions = {}
): string {
  if (siValue == null || !Number.isFinite(siValue)) return '—';
  const text = formatNumber(toDisplay(q, siValue, system), opts);
  return opts.unit === false ? text : `${text} ${unitLabel(q, system)}`;
}

/**
 * SI value → the plain string a form input should start with (no grouping, so it parses
 * back): inputValue('mass', 1000, 'us') → '2204.623'.
 */
export function inputValue(q: Quantity, siValue: number | null | undefined, system: UnitSystem, digits = 7): string {
  if (siValue == null || !Number.isFinite(siValue)) return '';
  const v = toDisplay(q, siValue, system);
  return String(Number(v.toPrecision(digits)));
}

export type ParseResult = { ok: true; value: number } | { ok: false; error: string };

// Plain decimals with optional exponent, or thousands grouped with commas (1,234,567.5).
const PLAIN = /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i;
const GROUPED = /^[+-]?\d{1,3}(,\d{3})+(\.\d*)?$/;

/**
 * Reads a number typed by a user. Accepts "1234.5", "1,234.5", "1.2e6" and surrounding
 * spaces; rejects anything else (including "1,5", which is ambiguous) with a message that
 * names the field.
 */
export function parseNumber(input: unknown, field = 'Value'): ParseResult {
  const text = typeof input === 'string' ? input.trim().replace(/[\s\u00a0\u202f]/g, '') : '';
  if (text === '') return { ok: false, error: `${field} is required` };
  if (!PLAIN.test(text) && !GROUPED.test(text)) return { ok: false, error: `${field} must be a number` };
  const value = Number(text.replace(/,/g, ''));
  if (!Number.isFinite(value)) return { ok: false, error: `${field} must be a finite number` };
  return { ok: true, value };
}

/**
 * Reads a form input given in the user's display unit and returns the SI value:
 * parseQuantity('thrust', '200,000', 'us', 'Thrust') → { ok: true, value: 889644.32… }.
 */
export function parseQuantity(q: Quantity, input: unknown, system: UnitSystem, field = 'Value'): ParseResult {
  const r = parseNumber(input, field);
  return r.ok ? { ok: true, value: fromDisplay(q, r.value, system) } : r;
}

/** Column header text with the unit: header('Thrust', 'thrust', 'us') → 'Thrust (lbf)'. */
export function header(label: string, q: Quantity, system: UnitSystem): string {
  return `${label} (${unitLabel(q, system)})`;
}
