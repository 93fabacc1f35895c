/**
 * Drag coefficient against Mach number for a slender launch vehicle, SI units throughout.
 *
 * Public API:
 * - `DEFAULT_DRAG_COEFFICIENT`: a documented default Cd–Mach shape, `[mach, cd][]`.
 * - `compileDragTable(points)`: validates a `[mach, cd][]` table once and packs it into typed
 *   arrays with precomputed slopes (a {@link DragTable}); the ascent integrator uses this.
 * - `dragCoefficient(table, mach)`: linear interpolation, held constant beyond the ends.
 *   Allocates nothing per call when given a compiled table.
 */

/** A validated, packed drag table: breakpoints, values and per-segment slopes. */
export interface DragTable {
  /** Mach breakpoints, strictly increasing. */
  readonly mach: Float64Array;
  /** Cd at each breakpoint. */
  readonly cd: Float64Array;
  /** Slope dCd/dMach of segment k (between breakpoints k and k+1). */
  readonly slope: Float64Array;
}

/**
 * Default zero-lift axial drag coefficient against Mach number for a slender two- or
 * three-stage launcher with an ogive payload fairing (fineness ratio ~10–15), referenced to the
 * body's maximum cross-section.
 *
 * Shape (common practice, values from memory, not from any one vehicle): subsonic Cd ≈ 0.25–0.3,
 * a transonic rise from Mach 0.8 to a peak ≈ 0.56 near Mach 1.2 (wave drag of the nose and the
 * base), then a fall through the supersonic range to ≈ 0.25 by Mach 4–5, held constant above.
 * Conceptual-design studies use such a curve when no wind-tunnel data exist; replace it with the
 * vehicle's own table when one is available.
 */
export const DEFAULT_DRAG_COEFFICIENT: ReadonlyArray<readonly [number, number]> = Object.freeze([
  [0, 0.28],
  [0.5, 0.26],
  [0.8, 0.28],
  [0.9, 0.33],
  [1.0, 0.45],
  [1.1, 0.53],
  [1.2, 0.56],
  [1.3, 0.55],
  [1.5, 0.5],
  [2.0, 0.41],
  [2.5, 0.35],
  [3.0, 0.31],
  [4.0, 0.27],
  [5.0, 0.25]
] as const);

/**
 * Validates a `[mach, cd][]` table and packs it for fast interpolation.
 *
 * Checks: at least one point; every Mach finite and ≥ 0, strictly increasing; every Cd finite
 * and ≥ 0. Slopes (Cd_{k+1} − Cd_k)/(M_{k+1} − M_k) are computed once (piecewise-linear
 * interpolation).
 *
 * @param points `[mach, cd][]`, Mach ≥ 0 strictly increasing, Cd ≥ 0 (dimensionless; typical
 *   0.1–1.5).
 * @param field name of the input field, used in error messages (default `dragCoefficient`).
 * @returns a {@link DragTable}.
 * @throws RangeError naming `field` (and the offending index) for an empty or malformed table.
 * @see any numerical-methods text on piecewise-linear interpolation.
 * @example
 * const t = compileDragTable([[0, 0.3], [1, 0.5]]);
 * dragCoefficient(t, 0.5); // 0.4
 */
export function compileDragTable(
  points: ReadonlyArray<readonly [number, number]>,
  field = 'dragCoefficient'
): DragTable {
  if (!Array.isArray(points) || points.length === 0) {
    throw new RangeError(`${field} must be a non-empty array of [mach, cd] pairs`);
  }
  const n = points.length;
  const mach = new Float64Array(n);
  const cd = new Float64Array(n);
  const slope = new Float64Array(Math.max(n - 1, 1));
  for (let i = 0; i < n; i++) {
    const p = points[i];
    if (!Array.isArray(p) || p.length !== 2) {
      throw new RangeError(`${field}[${i}] must be a [mach, cd] pair`);
    }
    const [m, c] = p;
    if (!Number.isFinite(m) || m < 0) {
      throw new RangeError(`${field}[${i}] Mach must be a finite number ≥ 0, got ${m}`);
    }
    if (!Number.isFinite(c) || c < 0) {
      throw new RangeError(`${field}[${i}] Cd must be a finite number ≥ 0, got ${c}`);
    }
    if (i > 0 && !(m > mach[i - 1])) {
      throw new RangeError(`${field}[${i}] Mach must be strictly increasing, got ${m} after ${mach[i - 1]}`);
    }
    mach[i] = m;
    cd[i] = c;
  }
  for (let k = 0; k < n - 1; k++) {
    // Secant slope of segment k (piecewise-linear interpolation).
    slope[k] = (cd[k + 1] - cd[k]) / (mach[k + 1] - mach[k]);
  }
  return { mach, cd, slope };
}

/**
 * Cd at a Mach number from a compiled table; the inner-loop kernel (no validation, no
 * allocation). Linear between breakpoints, constant beyond the first and last ones.
 *
 * Cd(M) = Cd_k + (M − M_k)·(Cd_{k+1} − Cd_k)/(M_{k+1} − M_k) for M_k ≤ M < M_{k+1}.
 *
 * @param table a {@link DragTable} from {@link compileDragTable}.
 * @param mach Mach number (any finite value; below the first breakpoint gives its Cd).
 * @returns the drag coefficient (dimensionless).
 * @see piecewise-linear interpolation (any numerical-methods text).
 * @example
 * cdAt(compileDragTable([[0, 0.3], [1, 0.5]]), 2); // 0.5 (held beyond the end)
 */
export function cdAt(table: DragTable, mach: number): number {
  const m = table.mach;
  const n = m.length;
  if (!(mach > m[0])) return table.cd[0];
  if (mach >= m[n - 1]) return table.cd[n - 1];
  // Tables are short (≈ 10–30 points): a linear scan beats a bisection here.
  let k = 0;
  while (mach >= m[k + 1]) k++;
  // Piecewise-linear interpolation on segment k.
  return table.cd[k] + (mach - m[k]) * table.slope[k];
}

/**
 * Drag coefficient at a Mach number: linear interpolation in a `[mach, cd][]` table, held
 * constant beyond its ends.
 *
 * Cd(M) = Cd_k + (M − M_k)·(Cd_{k+1} − Cd_k)/(M_{k+1} − M_k) for M_k ≤ M < M_{k+1};
 * Cd(M) = Cd_0 for M ≤ M_0; Cd(M) = Cd_{n−1} for M ≥ M_{n−1}.
 *
 * Pass a compiled {@link DragTable} in loops (no allocation, no validation per call); a raw
 * array is compiled (and validated) on every call.
 *
 * @param table `[mach, cd][]` (Mach ≥ 0 strictly increasing, Cd ≥ 0) or a compiled table;
 *   defaults to {@link DEFAULT_DRAG_COEFFICIENT} when omitted.
 * @param mach Mach number, finite and ≥ 0.
 * @returns Cd (dimensionless).
 * @throws RangeError naming `mach` when it is not finite or negative, or naming
 *   `dragCoefficient` when the table is malformed.
 * @see piecewise-linear interpolation; default shape: common practice (see DEFAULT_DRAG_COEFFICIENT).
 * @example
 * dragCoefficient([[0, 0.3], [1, 0.5]], 0.5); // 0.4
 * dragCoefficient(DEFAULT_DRAG_COEFFICIENT, 1.2); // 0.56 (transonic peak)
 */
export function dragCoefficient(
  table: DragTable | ReadonlyArray<readonly [number, number]>,
  mach: number
): number {
  if (!Number.isFinite(mach) || mach < 0) {
    throw new RangeError(`mach must be a finite number ≥ 0, got ${mach}`);
  }
  const t = isDragTable(table) ? table : compileDragTable(table);
  return cdAt(t, mach);
}

/**
 * True for a compiled {@link DragTable} (as opposed to a raw `[mach, cd][]`): a type guard on
 * the three Float64Array fields.
 *
 * @param x any value.
 * @returns whether `x` is a compiled drag table.
 * @see compileDragTable.
 * @example
 * isDragTable(compileDragTable([[0, 0.3]])); // true
 * isDragTable([[0, 0.3]]); // false
 */
export function isDragTable(x: unknown): x is DragTable {
  return (
    typeof x === 'object' &&
    x !== null &&
    (x as DragTable).mach instanceof Float64Array &&
    (x as DragTable).cd instanceof Float64Array &&
    (x as DragTable).slope instanceof Float64Array
  );
}
