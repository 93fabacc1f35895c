/**
 * The standard normal distribution, for sampled sweep parameters given as a (truncated) normal.
 * No npm package in the tree provides these without pulling a large library into the hot loop
 * (mathjs has erf, but not the quantile), so two classical approximations are written out here.
 */

/**
 * Complementary error function, Chebyshev fit with fractional error below 1.2·10⁻⁷ everywhere
 * (W. H. Press et al., Numerical Recipes in C, 2nd ed., §6.2, `erfcc`; coefficients from memory,
 * checked in the tests against mathjs's `erf`).
 */
export function erfc(x: number): number {
  const z = Math.abs(x);
  const t = 1 / (1 + 0.5 * z);
  const r =
    t *
    Math.exp(
      -z * z -
        1.26551223 +
        t *
          (1.00002368 +
            t *
              (0.37409196 +
                t *
                  (0.09678418 +
                    t *
                      (-0.18628806 +
                        t *
                          (0.27886807 +
                            t * (-1.13520398 + t * (1.48851587 + t * (-0.82215223 + t * 0.17087277))))))))
    );
  return x >= 0 ? r : 2 - r;
}

/** Standard normal CDF Φ(x) = ½·erfc(−x/√2). */
export function normalCdf(x: number): number {
  return 0.5 * erfc(-x / Math.SQRT2);
}

// P. J. Acklam's rational approximation of the normal quantile (2003), relative error below
// 1.15·10⁻⁹ on (0, 1). Coefficients from memory, checked in the tests against published
// quantiles of the standard normal table.
const A = [
  -3.969683028665376e1, 2.209460984245205e2, -2.759285104469687e2, 1.38357751867269e2,
  -3.066479806614716e1, 2.506628277459239
];
const B = [
  -5.447609879822406e1, 1.615858368580409e2, -1.556989798598866e2, 6.680131188771972e1,
  -1.328068155288572e1
];
const C = [
  -7.784894002430293e-3, -3.223964580411365e-1, -2.400758277161838, -2.549732539343734,
  4.374664141464968, 2.938163982698783
];
const D = [7.784695709041462e-3, 3.224671290700398e-1, 2.445134137142996, 3.754408661907416];
const P_LOW = 0.02425;

/** Standard normal quantile Φ⁻¹(p) for p in (0, 1); ±Infinity at the ends, NaN outside. */
export function normalQuantile(p: number): number {
  if (!(p >= 0 && p <= 1)) return NaN;
  if (p === 0) return -Infinity;
  if (p === 1) return Infinity;
  if (p < P_LOW) {
    const q = Math.sqrt(-2 * Math.log(p));
    return (
      (((((C[0] * q + C[1]) * q + C[2]) * q + C[3]) * q + C[4]) * q + C[5]) /
      ((((D[0] * q + D[1]) * q + D[2]) * q + D[3]) * q + 1)
    );
  }
  if (p > 1 - P_LOW) {
    const q = Math.sqrt(-2 * Math.log(1 - p));
    return -(
      (((((C[0] * q + C[1]) * q + C[2]) * q + C[3]) * q + C[4]) * q + C[5]) /
      ((((D[0] * q + D[1]) * q + D[2]) * q + D[3]) * q + 1)
    );
  }
  const q = p - 0.5;
  const r = q * q;
  return (
    ((((((A[0] * r + A[1]) * r + A[2]) * r + A[3]) * r + A[4]) * r + A[5]) * q) /
    (((((B[0] * r + B[1]) * r + B[2]) * r + B[3]) * r + B[4]) * r + 1)
  );
}

/**
 * Probability mass a normal(mean, sd) distribution keeps inside [min, max]. The spec refuses
 * truncation windows that keep almost nothing (sampling there would be numerically empty).
 */
export function truncatedNormalMass(mean: number, sd: number, min: number, max: number): number {
  return normalCdf((max - mean) / sd) - normalCdf((min - mean) / sd);
}

/**
 * Inverse CDF of a normal(mean, sd) truncated to [min, max], at u in (0, 1): the sampled value
 * for one unit draw (so a Latin-hypercube stratum maps to a stratum of the truncated law).
 * The result is clamped to [min, max] against rounding.
 */
export function truncatedNormalInverse(
  u: number,
  mean: number,
  sd: number,
  min: number,
  max: number
): number {
  const lo = normalCdf((min - mean) / sd);
  const hi = normalCdf((max - mean) / sd);
  const x = mean + sd * normalQuantile(lo + u * (hi - lo));
  return x < min ? min : x > max ? max : x;
}
