/**
 * U.S. Standard Atmosphere 1976 (COESA, NOAA-S/T 76-1562, U.S. Government Printing Office,
 * Washington D.C., October 1976), SI units throughout.
 *
 * Public API:
 * - `atmosphere(altitude)` → a new `{ temperature, pressure, density, speedOfSound }` object.
 * - `atmosphereInto(altitude, out)` → writes the same four fields into `out` and returns it;
 *   allocates nothing, meant for the inner loop of an ODE integrator (reuse one `out` object).
 * - `createAtmosphereState()` → a zeroed state object to pass to `atmosphereInto`.
 * - `ATMOSPHERE_MIN_ALTITUDE` (−5,000 m) and `ATMOSPHERE_FIT_TOP_ALTITUDE` (1,000,000 m).
 *
 * Model:
 * - −5 km to 86 km geometric altitude: the standard itself. Geometric altitude Z is converted to
 *   geopotential altitude H = r0·Z/(r0 + Z) with r0 = 6,356,766 m (the standard's eq. 18), and
 *   the seven layers of its Table 4 (base geopotential heights, molecular-scale temperatures,
 *   lapse rates and base pressures) are evaluated with the hydrostatic equations (eqs. 33a/33b).
 *   Density ρ = P·M0/(R*·T_M) (eq. 42) and speed of sound a = √(γ·R*·T_M/M0) (eq. 50) use the
 *   molecular-scale temperature; the kinetic temperature reported between 80 and 86 km is
 *   T = T_M·(M/M0) with the standard's M/M0 ratios (Table 8, linearly interpolated).
 * - Above 86 km (the standard no longer follows a closed form there; its pressures and densities
 *   come from integrating species number densities): a FIT, not the standard. Temperature is
 *   the standard's own closed-form kinetic temperature profile (eqs. 25–31: isothermal to 91 km,
 *   elliptical to 110 km, linear to 120 km, exponential towards T∞ = 1000 K above). Pressure and
 *   density are piecewise exponential in geometric altitude (log-linear interpolation) through
 *   the standard's tabulated values (Table I, values written from memory) at 86, 90, 95, 100,
 *   110, 120, 130, 140, 150, 160, 180, 200, 250, …, 1000 km; the value at 86 km is the one the
 *   lower model computes, so the two parts join continuously. Above 1,000 km the last segment's
 *   scale height is extrapolated (density keeps falling; no error is raised, the ascent code may
 *   step there). The speed of sound, which the standard tabulates only to 86 km, is taken as
 *   a = √(γ·P/ρ) with γ = 1.4 above 86 km (a convention: the gas becomes partly monatomic there,
 *   but drag models hold Cd constant at such Mach numbers anyway).
 */

/** Lowest geometric altitude accepted [m] (the standard's tables start at −5 km). */
export const ATMOSPHERE_MIN_ALTITUDE = -5000;
/** Top of the tabulated fit [m]; above it the last exponential segment is extrapolated. */
export const ATMOSPHERE_FIT_TOP_ALTITUDE = 1_000_000;

/** Effective Earth radius for the geopotential conversion [m], USSA 1976 §1.2.2 (r0). */
export const USSA_R0 = 6356766;
/** Sea-level mean molecular weight [kg/kmol], USSA 1976 Table 3 (M0). */
export const USSA_M0 = 28.9644;
/** Universal gas constant as used by the standard [J/(kmol·K)], USSA 1976 Table 2 (R*). */
export const USSA_R_STAR = 8314.32;
/** Ratio of specific heats for air, USSA 1976 §1.3.10 (γ). */
export const USSA_GAMMA = 1.4;
/** Standard gravity used by the standard [m/s²], USSA 1976 Table 2 (g0'). */
const USSA_G0 = 9.80665;

/** Atmospheric state at one altitude, SI units. */
export interface AtmosphereState {
  /** Kinetic temperature [K]. */
  temperature: number;
  /** Pressure [Pa]. */
  pressure: number;
  /** Mass density [kg/m³]. */
  density: number;
  /** Speed of sound [m/s]. */
  speedOfSound: number;
}

// Hydrostatic constant g0·M0/R* [K/m] (USSA 1976 eq. 33, ≈ 34.1632 K/km).
const GMR = (USSA_G0 * USSA_M0) / USSA_R_STAR;
// Specific gas constant of sea-level air R*/M0 [J/(kg·K)] (USSA 1976 eq. 42).
const R_AIR = USSA_R_STAR / USSA_M0;
// γ·R*/M0 for the speed of sound (USSA 1976 eq. 50).
const GAMMA_R_AIR = USSA_GAMMA * R_AIR;

// USSA 1976 Table 4: layer bases in geopotential metres, molecular-scale temperatures [K],
// lapse rates [K/m] and base pressures [Pa] (Table 4 values; from memory).
const H_BASE = new Float64Array([0, 11000, 20000, 32000, 47000, 51000, 71000, 84852]);
const T_BASE = new Float64Array([288.15, 216.65, 216.65, 228.65, 270.65, 270.65, 214.65, 186.946]);
const LAPSE = new Float64Array([-0.0065, 0, 0.001, 0.0028, 0, -0.0028, -0.002]);
const P_BASE = new Float64Array([101325, 22632.06, 5474.889, 868.0187, 110.9063, 66.93887, 3.95642]);
// Exponent −g0·M0/(R*·L) for the gradient layers (USSA 1976 eq. 33a); 0 for isothermal layers.
const EXPONENT = new Float64Array(7);
for (let i = 0; i < 7; i++) EXPONENT[i] = LAPSE[i] === 0 ? 0 : GMR / LAPSE[i];

// USSA 1976 Table 8: M/M0 from 80 to 86 km geometric, every 0.5 km (from memory).
const MM0_Z0 = 80000;
const MM0_STEP = 500;
const MM0 = new Float64Array([
  1.0, 0.999996, 0.999989, 0.999971, 0.999941, 0.999909, 0.99987, 0.999829, 0.999786, 0.999741,
  0.999694, 0.999641, 0.999579
]);

/** Geometric altitude at the top of the closed-form part [m]. */
const Z_86 = 86000;

// Upper-atmosphere fit nodes: geometric altitude [m], pressure [Pa], density [kg/m³]
// (USSA 1976 Table I, from memory). The 86 km node is replaced by the lower model's values.
const UPPER_NODES: ReadonlyArray<readonly [number, number, number]> = [
  [86000, 3.7338e-1, 6.958e-6],
  [90000, 1.8359e-1, 3.416e-6],
  [95000, 7.5966e-2, 1.393e-6],
  [100000, 3.2011e-2, 5.604e-7],
  [110000, 7.1042e-3, 9.708e-8],
  [120000, 2.5382e-3, 2.222e-8],
  [130000, 1.2505e-3, 8.152e-9],
  [140000, 7.2028e-4, 3.831e-9],
  [150000, 4.5422e-4, 2.076e-9],
  [160000, 3.0395e-4, 1.233e-9],
  [180000, 1.5271e-4, 5.194e-10],
  [200000, 8.4736e-5, 2.541e-10],
  [250000, 2.4767e-5, 6.073e-11],
  [300000, 8.7704e-6, 1.916e-11],
  [350000, 3.4518e-6, 7.014e-12],
  [400000, 1.4518e-6, 2.803e-12],
  [450000, 6.4468e-7, 1.184e-12],
  [500000, 3.0236e-7, 5.215e-13],
  [600000, 8.213e-8, 1.137e-13],
  [700000, 3.1908e-8, 3.07e-14],
  [800000, 1.7036e-8, 1.136e-14],
  [900000, 1.0873e-8, 5.759e-15],
  [1000000, 7.5138e-9, 3.561e-15]
];
const N_UP = UPPER_NODES.length;
const UP_Z = new Float64Array(N_UP);
const UP_LNP = new Float64Array(N_UP);
const UP_LNRHO = new Float64Array(N_UP);
// Log-slopes of each segment [1/m]; the last entry extrapolates above the top node.
const UP_KP = new Float64Array(N_UP);
const UP_KRHO = new Float64Array(N_UP);

// Upper thermosphere constants, USSA 1976 eqs. 27–31 (kilometre units as in the standard).
const T_ISO_86_91 = 186.8673; // K, eq. 26
const TC_ELLIPSE = 263.1905; // K, eq. 27
const A_ELLIPSE = -76.3232; // K, eq. 27
const a_ELLIPSE_KM = -19.9429; // km, eq. 27
const T_110 = 240; // K
const LAPSE_110_120 = 12; // K/km, eq. 29
const T_INF = 1000; // K, eq. 31
const T_120 = 360; // K
const LAMBDA = 0.01875; // 1/km, eq. 31
const R0_KM = USSA_R0 / 1000;

/** Closed-form part (−5…86 km) into `out`; z is geometric altitude [m], already validated. */
function lowerInto(z: number, out: AtmosphereState): AtmosphereState {
  // Geopotential altitude, USSA 1976 eq. 18.
  const h = (USSA_R0 * z) / (USSA_R0 + z);
  let i = 0;
  if (h >= 11000) {
    i = h < 20000 ? 1 : h < 32000 ? 2 : h < 47000 ? 3 : h < 51000 ? 4 : h < 71000 ? 5 : 6;
  }
  const tb = T_BASE[i];
  const lapse = LAPSE[i];
  const dh = h - H_BASE[i];
  let tm: number;
  let p: number;
  if (lapse === 0) {
    tm = tb;
    // Isothermal hydrostatic layer, USSA 1976 eq. 33b.
    p = P_BASE[i] * Math.exp((-GMR * dh) / tb);
  } else {
    // Linear molecular-scale temperature, USSA 1976 eq. 23.
    tm = tb + lapse * dh;
    // Gradient hydrostatic layer, USSA 1976 eq. 33a.
    p = P_BASE[i] * Math.pow(tb / tm, EXPONENT[i]);
  }
  let t = tm;
  if (z > MM0_Z0) {
    // Kinetic temperature T = T_M·M/M0, USSA 1976 eq. 21 with Table 8 (linear interpolation).
    const u = (z - MM0_Z0) / MM0_STEP;
    let k = Math.floor(u);
    if (k >= MM0.length - 1) k = MM0.length - 2;
    t = tm * (MM0[k] + (MM0[k + 1] - MM0[k]) * (u - k));
  }
  out.temperature = t;
  out.pressure = p;
  // Equation of state with molecular-scale temperature, USSA 1976 eq. 42.
  out.density = p / (R_AIR * tm);
  // Speed of sound, USSA 1976 eq. 50.
  out.speedOfSound = Math.sqrt(GAMMA_R_AIR * tm);
  return out;
}

/** Kinetic temperature above 86 km [K], USSA 1976 eqs. 25–31; z in metres. */
function upperTemperature(z: number): number {
  const zk = z / 1000;
  if (zk < 91) return T_ISO_86_91; // isothermal layer, eq. 26
  if (zk < 110) {
    // Elliptical layer, eq. 27.
    const s = (zk - 91) / a_ELLIPSE_KM;
    return TC_ELLIPSE + A_ELLIPSE * Math.sqrt(1 - s * s);
  }
  if (zk < 120) return T_110 + LAPSE_110_120 * (zk - 110); // linear layer, eq. 29
  // Exponential approach to T∞, eq. 31 with ξ from eq. 31's geopotential-like variable.
  const xi = ((zk - 120) * (R0_KM + 120)) / (R0_KM + zk);
  return T_INF - (T_INF - T_120) * Math.exp(-LAMBDA * xi);
}

// Build the fit's log tables once, pinning the 86 km node to the closed-form model.
{
  const at86 = lowerInto(Z_86, { temperature: 0, pressure: 0, density: 0, speedOfSound: 0 });
  for (let i = 0; i < N_UP; i++) {
    const [z, p, rho] = UPPER_NODES[i];
    UP_Z[i] = z;
    UP_LNP[i] = Math.log(i === 0 ? at86.pressure : p);
    UP_LNRHO[i] = Math.log(i === 0 ? at86.density : rho);
  }
  for (let i = 0; i < N_UP - 1; i++) {
    const dz = UP_Z[i + 1] - UP_Z[i];
    UP_KP[i] = (UP_LNP[i + 1] - UP_LNP[i]) / dz;
    UP_KRHO[i] = (UP_LNRHO[i + 1] - UP_LNRHO[i]) / dz;
  }
  UP_KP[N_UP - 1] = UP_KP[N_UP - 2];
  UP_KRHO[N_UP - 1] = UP_KRHO[N_UP - 2];
}

/** Fitted part (above 86 km) into `out`; z geometric altitude [m]. */
function upperInto(z: number, out: AtmosphereState): AtmosphereState {
  let i = 0;
  while (i < N_UP - 1 && z >= UP_Z[i + 1]) i++;
  const dz = z - UP_Z[i];
  // Piecewise-exponential (log-linear) fit through USSA 1976 Table I values.
  const p = Math.exp(UP_LNP[i] + UP_KP[i] * dz);
  const rho = Math.exp(UP_LNRHO[i] + UP_KRHO[i] * dz);
  out.temperature = upperTemperature(z);
  out.pressure = p;
  out.density = rho;
  // Ideal-gas speed of sound a = √(γ·P/ρ) (convention above 86 km, see file header).
  out.speedOfSound = Math.sqrt((USSA_GAMMA * p) / rho);
  return out;
}

/**
 * Atmospheric state at a geometric altitude, written into `out` (no allocation).
 *
 * Same model and validation as {@link atmosphere}; use it in inner loops with one reused object.
 *
 * @param altitude geometric altitude above mean sea level [m], finite and ≥ −5,000 m.
 * @param out object that receives temperature [K], pressure [Pa], density [kg/m³] and
 *   speed of sound [m/s]; returned for chaining.
 * @returns `out`.
 * @throws RangeError when `altitude` is not finite or below −5,000 m.
 * @see U.S. Standard Atmosphere 1976, NOAA-S/T 76-1562, Table 4 and eqs. 18, 23, 33, 42, 50.
 * @example
 * const s = createAtmosphereState();
 * atmosphereInto(11000, s).pressure; // ≈ 22699.9 Pa (geometric 11 km)
 */
export function atmosphereInto(altitude: number, out: AtmosphereState): AtmosphereState {
  if (!(altitude >= ATMOSPHERE_MIN_ALTITUDE) || altitude === Infinity) {
    throw new RangeError(
      `altitude must be a finite number ≥ ${ATMOSPHERE_MIN_ALTITUDE} m, got ${altitude}`
    );
  }
  return altitude <= Z_86 ? lowerInto(altitude, out) : upperInto(altitude, out);
}

/**
 * U.S. Standard Atmosphere 1976 at a geometric altitude.
 *
 * Below 86 km: T_M = T_b + L_b·(H − H_b); P = P_b·(T_b/T_M)^(g0·M0/(R*·L_b)) or
 * P = P_b·exp(−g0·M0·(H − H_b)/(R*·T_b)) when L_b = 0; ρ = P·M0/(R*·T_M); a = √(γ·R*·T_M/M0);
 * H = r0·Z/(r0 + Z). Above 86 km: the standard's kinetic temperature and a piecewise-exponential
 * fit of its tabulated pressure and density (see the file header).
 *
 * @param altitude geometric altitude above mean sea level [m], finite and ≥ −5,000 m
 *   (valid to 1,000,000 m; above, the last exponential segment is extrapolated).
 * @returns `{ temperature [K], pressure [Pa], density [kg/m³], speedOfSound [m/s] }`.
 * @throws RangeError when `altitude` is not finite or below −5,000 m.
 * @see U.S. Standard Atmosphere 1976, NOAA-S/T 76-1562 (COESA 1976), Tables 4, 8 and I.
 * @example
 * atmosphere(0); // { temperature: 288.15, pressure: 101325, density: ≈1.2250, speedOfSound: ≈340.294 }
 */
export function atmosphere(altitude: number): AtmosphereState {
  return atmosphereInto(altitude, { temperature: 0, pressure: 0, density: 0, speedOfSound: 0 });
}

/**
 * A zeroed {@link AtmosphereState} to reuse with {@link atmosphereInto}.
 *
 * @returns `{ temperature: 0, pressure: 0, density: 0, speedOfSound: 0 }`.
 * @example
 * const s = createAtmosphereState();
 * for (const h of [0, 1000, 2000]) atmosphereInto(h, s);
 */
export function createAtmosphereState(): AtmosphereState {
  return { temperature: 0, pressure: 0, density: 0, speedOfSound: 0 };
}
