/**
 * A tabulated fast path of the U.S. Standard Atmosphere 1976 model of `./atmosphere` for the
 * ascent integrator's inner loop (≈ 5 derivative evaluations per step, thousands of flights a
 * second).
 *
 * Method: the exact model (`atmosphereInto`) is sampled once, on first use, every 50 m from
 * −5 km to 300 km geometric altitude; pressure, density and speed of sound are then linearly
 * interpolated (no `exp`/`pow` per call). Linear interpolation of an exponential with scale
 * height H over a spacing Δ errs by at most ≈ (Δ/H)²/8: ≈ 1e-5 relative for Δ = 50 m and
 * H ≥ 5 km (tests/unit/physics/ascent-atmosphere-table.test.ts measures the maximum over the
 * range against `atmosphere()`). Above 300 km the exact model is called directly.
 */
import { atmosphereInto, createAtmosphereState, type AtmosphereState } from './atmosphere';

/** Lowest tabulated altitude [m] (the standard's lower limit). */
export const ATMOSPHERE_TABLE_BOTTOM = -5000;
/** Highest tabulated altitude [m]; above it the exact model is evaluated. */
export const ATMOSPHERE_TABLE_TOP = 300_000;
/** Table spacing [m]. */
export const ATMOSPHERE_TABLE_STEP = 50;

const N = Math.round((ATMOSPHERE_TABLE_TOP - ATMOSPHERE_TABLE_BOTTOM) / ATMOSPHERE_TABLE_STEP) + 1;
const INV_STEP = 1 / ATMOSPHERE_TABLE_STEP;
let P: Float64Array | null = null;
let RHO: Float64Array | null = null;
let A: Float64Array | null = null;

function build(): void {
  const p = new Float64Array(N);
  const rho = new Float64Array(N);
  const a = new Float64Array(N);
  const s = createAtmosphereState();
  for (let i = 0; i < N; i++) {
    atmosphereInto(ATMOSPHERE_TABLE_BOTTOM + i * ATMOSPHERE_TABLE_STEP, s);
    p[i] = s.pressure;
    rho[i] = s.density;
    a[i] = s.speedOfSound;
  }
  P = p;
  RHO = rho;
  A = a;
}

/**
 * Pressure, density and speed of sound at a geometric altitude from the 50 m table, written into
 * `out` (temperature is not filled: the ascent does not need it). No allocation, no validation:
 * altitudes below −5 km are clamped to −5 km (the integrator may probe slightly below ground
 * inside a step before it detects a fall-back).
 *
 * p(h) ≈ p_k + (h − h_k)/Δ·(p_{k+1} − p_k), likewise ρ and a (piecewise-linear interpolation of
 * USSA 1976 values); exact model above 300 km.
 *
 * @param altitude geometric altitude [m], any finite value.
 * @param out receives `pressure` [Pa], `density` [kg/m³], `speedOfSound` [m/s].
 * @returns `out`.
 * @see U.S. Standard Atmosphere 1976 (NOAA-S/T 76-1562) through `./atmosphere`.
 * @example
 * const s = createAtmosphereState();
 * atmosphereTableInto(11000, s).pressure; // ≈ 22699.9 Pa (table value within 1e-5 relative)
 */
export function atmosphereTableInto(altitude: number, out: AtmosphereState): AtmosphereState {
  if (altitude >= ATMOSPHERE_TABLE_TOP) return atmosphereInto(altitude, out);
  if (P === null) build();
  const u = (altitude > ATMOSPHERE_TABLE_BOTTOM ? altitude - ATMOSPHERE_TABLE_BOTTOM : 0) * INV_STEP;
  const k = u | 0;
  const f = u - k;
  const p = P as Float64Array;
  const rho = RHO as Float64Array;
  const a = A as Float64Array;
  // Piecewise-linear interpolation between nodes k and k+1.
  out.pressure = p[k] + f * (p[k + 1] - p[k]);
  out.density = rho[k] + f * (rho[k + 1] - rho[k]);
  out.speedOfSound = a[k] + f * (a[k + 1] - a[k]);
  return out;
}
