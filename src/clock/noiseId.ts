/**
 * Power-law noise identification by the lag-1 autocorrelation (W. J. Riley and C. A. Greenhall,
 * "Power law noise identification using the lag 1 autocorrelation", Proc. 18th EFTF, 2004).
 * Pure; no I/O. Procedure as recalled (from memory; checked on simulated noise of every type in
 * tests/riley-greenhall-2004.test.ts):
 *
 * 1. At averaging factor m, decimate the phase (every m-th point; frequency data would be
 *    averaged over m, which is the first difference of the decimated phase).
 * 2. With d = 0: compute the lag-1 autocorrelation r1 of the series (mean removed) and
 *    δ = r1/(1 + r1). If δ < 0.25 or d = dmax (2), stop; otherwise difference the series,
 *    d += 1, and repeat.
 * 3. p = −2(δ + d) estimates the spectral exponent of the phase; α = p + 2 for phase data,
 *    rounded to the nearest integer: α = 2 − round(2δ) − 2d, clamped to [−2, 2].
 *
 * Below {@link NOISE_ID_MIN_POINTS} decimated points the type is not identified (null).
 */
import type { PowerLawAlpha } from './edf.ts';

/** Fewest decimated phase points for an identification (from memory: about 30). */
export const NOISE_ID_MIN_POINTS = 30;
/** Largest number of differences (random-walk FM needs 2 on phase data). */
const D_MAX = 2;

/** One identification. */
export interface NoiseIdentification {
  /** Rounded power-law exponent α of S_y(f) ∝ f^α, or null when too few points. */
  alpha: PowerLawAlpha | null;
  /** The unrounded estimate p + 2. */
  alphaEstimate: number | null;
  /** Number of differences taken. */
  differences: number;
  /** Points in the decimated series (present ones). */
  points: number;
}

/** Lag-1 autocorrelation of the present values (NaN skipped pairwise), mean removed. */
export function lag1Autocorrelation(z: ArrayLike<number>): number {
  let mean = 0;
  let n = 0;
  for (let i = 0; i < z.length; i++) {
    if (!Number.isNaN(z[i])) {
      mean += z[i];
      n++;
    }
  }
  if (n < 2) return Number.NaN;
  mean /= n;
  let num = 0;
  let den = 0;
  for (let i = 0; i < z.length; i++) {
    const a = z[i] - mean;
    if (Number.isNaN(a)) continue;
    den += a * a;
    if (i + 1 < z.length) {
      const b = z[i + 1] - mean;
      if (!Number.isNaN(b)) num += a * b;
    }
  }
  return den === 0 ? Number.NaN : num / den;
}

/**
 * Identify the dominant power-law noise of phase data at averaging factor m.
 * @param xS phase, s, NaN where missing (gaps become missing decimated points)
 * @param m  averaging factor ≥ 1
 */
export function identifyNoise(xS: ArrayLike<number>, m: number): NoiseIdentification {
  const count = Math.floor((xS.length - 1) / m) + 1;
  let z = new Float64Array(count);
  let present = 0;
  for (let k = 0; k < count; k++) {
    z[k] = xS[k * m];
    if (!Number.isNaN(z[k])) present++;
  }
  if (present < NOISE_ID_MIN_POINTS) return { alpha: null, alphaEstimate: null, differences: 0, points: present };
  for (let d = 0; d <= D_MAX; d++) {
    const r1 = lag1Autocorrelation(z);
    // A constant series (all values equal) carries no noise to identify.
    if (Number.isNaN(r1)) return { alpha: null, alphaEstimate: null, differences: d, points: present };
    // r1 → −1 (an over-differenced series) sends δ to −∞; −2 already rounds to the same type.
    const delta = Math.max(-2, r1 / (1 + r1));
    if (delta < 0.25 || d === D_MAX) {
      const estimate = 2 - 2 * (delta + d);
      const rounded = Math.max(-2, Math.min(2, 2 - Math.round(2 * delta) - 2 * d));
      return { alpha: (rounded === 0 ? 0 : rounded) as PowerLawAlpha, alphaEstimate: estimate, differences: d, points: present };
    }
    const next = new Float64Array(z.length - 1);
    for (let k = 0; k + 1 < z.length; k++) next[k] = z[k + 1] - z[k];
    z = next;
  }
  /* c8 ignore next */
  return { alpha: null, alphaEstimate: null, differences: D_MAX, points: present };
}
