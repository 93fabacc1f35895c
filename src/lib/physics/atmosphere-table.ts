/**
 * A tabulated fast path of the U.S. Standard Atmosphere 1976 model of `./atmosphere` for the
 * ascent integrator's inner loop (≈ 5 derivative evaluations per step, thousands of flights a
 * second).
 *
 * Method: the exact model (`atmosphereInto`) is sampled once, on first use, every 50 m —
 * in geopotential altitude below 86 km (so the layer bases of the standard fall on nodes) and in
 * geometric altitude from 86 to 300 km (so the fit's nodes do) — and pressure, density and speed
 * of sound are then linearly interpolated (no `exp`/`pow` per call). Linear interpolation of an exponential with scale
 * height H over a spacing Δ errs by at most ≈ (Δ/H)²/8: ≈ 1e-5 relative for Δ = 50 m and
 * H ≥ 5 km (tests/unit/physics/ascent-atmosphere-table.test.ts measures the maximum over the
 * range against `atmosphere()`). Above 300 km the exact model is called directly.
 */
import { atmosphereInto, createAtmosphereState, USSA_R0, type AtmosphereState } from './atmosphere';

/** Lowest altitude tabulated [m] (the standard's lower limit). */
export const ATMOSPHERE_TABLE_BOTTOM = -5000;
/** Highest tabulated altitude [m]; above it the exact model is evaluated. */
export const ATMOSPHERE_TABLE_TOP = 300_000;
/** Table spacing [m] (geopotential below 86 km, geometric above). */
export const ATMOSPHERE_TABLE_STEP = 50;

/** Effective Earth radius of the standard's geopotential conversion [m] (USSA 1976 r0). */
const R0 = USSA_R0;
/** Geometric altitude where the standard's closed form ends and the fit begins [m]. */
const Z_86 = 86000;
// Lower grid: geopotential metres, from −5,000 m (geometric −4,996 m; the 4 m below are linearly
// extrapolated from the first cell) to 84,900 m (above H(86 km));
// its nodes fall on every layer base of USSA 1976 Table 4 (0, 11, 20, 32, 47, 51, 71 km), so the
// temperature kinks of the standard sit on nodes and linear interpolation stays smooth in between.
const LO_H0 = -5000;
const LO_N = Math.round((84900 - LO_H0) / ATMOSPHERE_TABLE_STEP) + 1;
// Upper grid: geometric metres from 86 km; nodes on every node of the fit (86, 90, 95, 100 … km).
const UP_Z0 = Z_86;
const UP_N = Math.round((ATMOSPHERE_TABLE_TOP - UP_Z0) / ATMOSPHERE_TABLE_STEP) + 1;
const INV_STEP = 1 / ATMOSPHERE_TABLE_STEP;
let TAB: Float64Array | null = null; // [p, ρ, a] interleaved: lower grid then upper grid

function build(): Float64Array {
  const tab = new Float64Array(3 * (LO_N + UP_N));
  const s = createAtmosphereState();
  for (let i = 0; i < LO_N + UP_N; i++) {
    let z: number;
    if (i < LO_N) {
      const h = LO_H0 + i * ATMOSPHERE_TABLE_STEP;
      // Geometric from geopotential, inverse of USSA 1976 eq. 18: Z = r0·H/(r0 − H).
      z = Math.max(ATMOSPHERE_TABLE_BOTTOM, (R0 * h) / (R0 - h));
    } else {
      z = UP_Z0 + (i - LO_N) * ATMOSPHERE_TABLE_STEP;
    }
    atmosphereInto(z, s);
    tab[3 * i] = s.pressure;
    tab[3 * i + 1] = s.density;
    tab[3 * i + 2] = s.speedOfSound;
  }
  TAB = tab;
  return tab;
}

/**
 * Pressure, density and speed of sound at a geometric altitude from the 50 m table, written into
 * `out` (temperature is not filled: the ascent does not need it). No allocation, no validation:
 * altitudes below −5 km are clamped to −5 km (the integrator may probe slightly below ground
 * inside a step before it detects a fall-back).
 *
 * Below 86 km: H = r0·Z/(r0 + Z) (USSA 1976 eq. 18), then p(H) ≈ p_k + (H − H_k)/Δ·(p_{k+1} − p_k),
 * likewise ρ and a (piecewise-linear interpolation). 86–300 km: the same in geometric altitude.
 * Above 300 km: the exact model.
 *
 * @param altitude geometric altitude [m], any finite value.
 * @param out receives `pressure` [Pa], `density` [kg/m³], `speedOfSound` [m/s].
 * @returns `out`.
 * @see U.S. Standard Atmosphere 1976 (NOAA-S/T 76-1562) through `./atmosphere`.
 * @example
 * const s = createAtmosphereState();
 * atmosphereTableInto(11000, s).pressure; // ≈ 22699.9 Pa (within 3e-5 relative of atmosphere())
 */
export function atmosphereTableInto(altitude: number, out: AtmosphereState): AtmosphereState {
  if (altitude >= ATMOSPHERE_TABLE_TOP) return atmosphereInto(altitude, out);
  const tab = TAB ?? build();
  let u: number;
  if (altitude <= Z_86) {
    const z = altitude > ATMOSPHERE_TABLE_BOTTOM ? altitude : ATMOSPHERE_TABLE_BOTTOM;
    // Geopotential altitude, USSA 1976 eq. 18.
    u = ((R0 * z) / (R0 + z) - LO_H0) * INV_STEP;
    if (u > LO_N - 1.000001) u = LO_N - 1.000001;
  } else {
    u = LO_N + (altitude - UP_Z0) * INV_STEP;
  }
  const k = u | 0;
  const f = u - k;
  const j = 3 * k;
  // Piecewise-linear interpolation between nodes k and k+1.
  out.pressure = tab[j] + f * (tab[j + 3] - tab[j]);
  out.density = tab[j + 1] + f * (tab[j + 4] - tab[j + 1]);
  out.speedOfSound = tab[j + 2] + f * (tab[j + 5] - tab[j + 2]);
  return out;
}
