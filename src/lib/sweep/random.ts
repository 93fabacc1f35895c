/**
 * Counter-based pseudo-random numbers for sweeps.
 *
 * Why not a sequential generator (seedrandom, xoshiro...): a worker that rebuilds case 1,234,567
 * must not replay the 1,234,566 draws before it. Every draw here is a pure hash of
 * (seed, stream, counter, dimension), so any case is computed on its own, in O(1), on any host.
 *
 * The mixer is the 32-bit "lowbias32" finaliser (C. Wellons, "Hash Prospector", 2018; the same
 * xorshift-multiply shape as MurmurHash3's fmix32, with constants searched for low bias). The
 * inputs are combined by hashing each into the running state, so nearby counters and dimensions
 * give unrelated outputs. Not cryptographic; meant for sampling plans only.
 */

/** lowbias32 finaliser: a bijection on 32-bit integers with good avalanche. */
export function mix32(x: number): number {
  x ^= x >>> 16;
  x = Math.imul(x, 0x7feb352d);
  x ^= x >>> 15;
  x = Math.imul(x, 0x846ca68b);
  x ^= x >>> 16;
  return x >>> 0;
}

/**
 * A 32-bit hash of (seed, stream, counter, dim), each read as an unsigned 32-bit integer.
 * Streams separate independent uses of the same seed (permutations, jitter, random draws).
 */
export function hash4(seed: number, stream: number, counter: number, dim: number): number {
  // Golden-ratio and π-digit offsets keep a zero input from mapping to zero.
  let h = mix32((seed ^ 0x243f6a88) >>> 0);
  h = mix32((h ^ mix32((stream + 0x9e3779b9) >>> 0)) >>> 0);
  h = mix32((h ^ mix32((counter + 0x7f4a7c15) >>> 0)) >>> 0);
  h = mix32((h ^ mix32((dim + 0x85ebca6b) >>> 0)) >>> 0);
  return h;
}

const TWO_POW_32 = 4294967296;

/*
 * hash4 in three stages, for hot loops that draw many numbers with one (seed, stream) and one
 * counter: hash4(s, t, c, d) = draw(counterKey(streamKey(s, t), c), dimKey(d)) exactly, so a
 * plan hashes (seed, stream) once, each case's counter once, and each dimension once.
 */

/** The (seed, stream) part of hash4. */
export function streamKey(seed: number, stream: number): number {
  const h = mix32((seed ^ 0x243f6a88) >>> 0);
  return mix32((h ^ mix32((stream + 0x9e3779b9) >>> 0)) >>> 0);
}

/** The counter step of hash4 on a streamKey. */
export function counterKey(key: number, counter: number): number {
  return mix32((key ^ mix32((counter + 0x7f4a7c15) >>> 0)) >>> 0);
}

/** The dimension's mixed value in hash4. */
export function dimKey(dim: number): number {
  return mix32((dim + 0x85ebca6b) >>> 0);
}

/** uniform01 from a counterKey and a dimKey: equal to uniform01(seed, stream, counter, dim). */
export function uniform01Keyed(counterHash: number, dimHash: number): number {
  return (mix32((counterHash ^ dimHash) >>> 0) + 0.5) / TWO_POW_32;
}

/**
 * A uniform number in the open interval (0, 1), from hash4. Resolution 2⁻³²: ample for
 * sampling plans of up to a few million cases, and never exactly 0 or 1 (safe for an inverse
 * CDF).
 */
export function uniform01(seed: number, stream: number, counter: number, dim: number): number {
  return (hash4(seed, stream, counter, dim) + 0.5) / TWO_POW_32;
}

/** A uniform integer in [0, n) for n ≤ 2³², by multiply-shift (Lemire); bias < n / 2³². */
export function uniformInt(
  n: number,
  seed: number,
  stream: number,
  counter: number,
  dim: number
): number {
  return Math.floor((hash4(seed, stream, counter, dim) * n) / TWO_POW_32);
}

/** Stream ids; changing them changes every sampled plan, so they are part of the model. */
export const STREAM = Object.freeze({
  lhsPermutation: 1,
  lhsJitter: 2,
  random: 3
});

/**
 * A seeded random permutation of 0..n−1 (Fisher–Yates, Durstenfeld's in-place form), each swap
 * index drawn from hash4(seed, stream, step, dim) so the result depends only on its arguments.
 * 4 bytes per element: 2,000,000 cases × 4 dimensions is 32 MB.
 */
export function seededPermutation(n: number, seed: number, stream: number, dim: number): Uint32Array {
  const perm = new Uint32Array(n);
  for (let i = 0; i < n; i++) perm[i] = i;
  for (let j = n - 1; j > 0; j--) {
    const k = uniformInt(j + 1, seed, stream, j, dim);
    const t = perm[j];
    perm[j] = perm[k];
    perm[k] = t;
  }
  return perm;
}
