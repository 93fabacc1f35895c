/**
 * Machine-readable reasons shared by staging, budget and feasibility results.
 * Every infeasible or failed result in the physics core carries one of these codes.
 */

/** Reason codes, stable strings stored with sweep results. */
export const REASON_CODES = [
  'DELTA_V_UNREACHABLE',
  'STAGE_MASS_RATIO_UNREACHABLE',
  'PAYLOAD_NOT_POSITIVE',
  'LIFTOFF_THRUST_TO_WEIGHT_LOW',
  'STAGE_THRUST_TO_WEIGHT_LOW',
  'MAX_DYNAMIC_PRESSURE_HIGH',
  'MAX_AXIAL_ACCELERATION_HIGH',
  'PAYLOAD_BELOW_FLOOR',
  'GROSS_MASS_ABOVE_CEILING',
  'STRUCTURAL_COEFFICIENT_INVALID',
  'STRUCTURAL_COEFFICIENT_UNUSUAL',
  'MASS_RATIO_INVALID',
  'NON_FINITE_RESULT'
] as const;

/** One reason code. */
export type ReasonCode = (typeof REASON_CODES)[number];

/** Bit of a reason code in a `failMask` / `warnMask` (bit i ↔ REASON_CODES[i]). */
export const REASON_BIT: Readonly<Record<ReasonCode, number>> = Object.freeze(
  Object.fromEntries(REASON_CODES.map((c, i) => [c, 1 << i])) as Record<ReasonCode, number>
);

/**
 * A machine-readable reason: which check, its limit, the value found and the margin
 * (positive = inside the limit, negative = violated; same unit as `value`).
 */
export interface Reason {
  code: ReasonCode;
  /** The limit the value was checked against (SI). */
  limit: number;
  /** The value found (SI). */
  value: number;
  /** Signed distance to the limit, positive when satisfied (SI). */
  margin: number;
  /** 0-based stage index, bottom first, when the reason concerns one stage. */
  stage?: number;
  /** Human-readable explanation (English). */
  message: string;
}

/**
 * Codes of the bits set in a mask.
 *
 * @param mask bit mask built from {@link REASON_BIT}.
 * @returns codes in REASON_CODES order.
 * @example
 * codesFromMask(REASON_BIT.PAYLOAD_BELOW_FLOOR); // ['PAYLOAD_BELOW_FLOOR']
 */
export function codesFromMask(mask: number): ReasonCode[] {
  const codes: ReasonCode[] = [];
  for (let i = 0; i < REASON_CODES.length; i++) if (mask & (1 << i)) codes.push(REASON_CODES[i]);
  return codes;
}

/**
 * Replace a non-finite number by a fallback (so NaN and ±Infinity never leave the core).
 *
 * @param value any number.
 * @param fallback returned when `value` is NaN or infinite (default 0).
 * @returns `value` or `fallback`.
 * @example
 * finiteOr(NaN, 0); // 0
 */
export function finiteOr(value: number, fallback = 0): number {
  return Number.isFinite(value) ? value : fallback;
}

/**
 * Deep-copy a plain result, replacing every non-finite number by 0 and listing the paths that
 * were replaced, so callers can attach a `NON_FINITE_RESULT` reason. Typed arrays are copied.
 *
 * @param value a plain object / array / number tree (results of this module).
 * @returns `{ value, replaced }` where `replaced` lists dotted paths of replaced numbers.
 * @example
 * sanitizeNumbers({ a: 1, b: [NaN] }); // { value: { a: 1, b: [0] }, replaced: ['b.0'] }
 */
export function sanitizeNumbers<T>(value: T): { value: T; replaced: string[] } {
  const replaced: string[] = [];
  const walk = (v: unknown, path: string): unknown => {
    if (typeof v === 'number') {
      if (Number.isFinite(v)) return v;
      replaced.push(path);
      return 0;
    }
    if (v instanceof Float64Array || v instanceof Float32Array) {
      const copy = v.slice();
      for (let i = 0; i < copy.length; i++) {
        if (!Number.isFinite(copy[i])) {
          replaced.push(path ? `${path}.${i}` : String(i));
          copy[i] = 0;
        }
      }
      return copy;
    }
    if (Array.isArray(v)) return v.map((x, i) => walk(x, path ? `${path}.${i}` : String(i)));
    if (v && typeof v === 'object') {
      const o: Record<string, unknown> = {};
      for (const [k, x] of Object.entries(v)) o[k] = walk(x, path ? `${path}.${k}` : k);
      return o;
    }
    return v;
  };
  return { value: walk(value, '') as T, replaced };
}
