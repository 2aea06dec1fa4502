/**
 * Equivalent degrees of freedom (EDF) of the stability estimators and their chi-squared
 * confidence intervals (pure; no I/O). Noise types are the power-law exponents α of the
 * fractional-frequency spectrum S_y(f) ∝ f^α: +2 white PM, +1 flicker PM, 0 white FM,
 * −1 flicker FM, −2 random-walk FM.
 *
 * - Overlapping Allan deviation: the simple approximations of NIST SP 1065 (Riley 2008) §5.3,
 *   Table 5 (after Howe, Allan & Barnes 1981), N phase points. Confirmed against two independent
 *   copies of the table.
 * - Modified Allan / time deviation and overlapping Hadamard deviation: the exact EDF of a mean
 *   of squares of a Gaussian stationary sequence z_j (derived, standard statistics):
 *   edf = 2 E[V]²/Var[V] = M / (1 + 2 Σ_{h=1}^{M−1} (1 − h/M) r(h)²), r the autocorrelation of z.
 *   r comes from the generalized autocovariance s(t) of discrete power-law phase noise (white PM
 *   iid; white FM a random walk; random-walk FM its sum; flicker PM and FM from fractional
 *   differencing with d = ±½, Kasdin 1995), so the same code checks itself against Table 5 for
 *   the Allan variance (tests/nist-sp1065.test.ts). Lags beyond 8 spans of the estimator are left
 *   out (r² there is below ~1e-4 for the flicker types, 0 for the others). For the modified
 *   variance with m > 64 the EDF of m = 64 and the same number of spans is used (the averaging
 *   makes the statistic scale with τ; an approximation, stated in outputs).
 */
import { InternalError } from '../errors.ts';
import { chiSquareQuantile } from './gamma.ts';

/** Power-law exponent of S_y(f): 2, 1, 0, −1 or −2. */
export type PowerLawAlpha = 2 | 1 | 0 | -1 | -2;

/** Two-sided 68.27 % (±1σ of a normal) and 95 % levels. */
export const LEVEL_68 = 0.682689492137086;
export const LEVEL_95 = 0.95;

/** Largest m for which the modified-variance EDF is computed exactly. */
const MDEV_EXACT_M_MAX = 64;
/** Lags kept in the exact EDF, in spans of the estimator (plus a constant). */
const LAG_SPANS = 8;
const LAG_EXTRA = 64;

/**
 * EDF of the overlapping Allan variance, NIST SP 1065 Table 5 (N phase points, factor m).
 *   white PM   (N+1)(N−2m) / (2(N−m))
 *   flicker PM exp{ [ln((N−1)/(2m)) · ln((2m+1)(N−1)/4)]^½ }
 *   white FM   [3(N−1)/(2m) − 2(N−2)/N] · 4m²/(4m²+5)
 *   flicker FM m = 1: 2(N−2)²/(2.3N−4.9); m ≥ 2: 5N²/(4m(N+3m))
 *   RW FM      (N−2)/m · [(N−1)² − 3m(N−1) + 4m²] / (N−3)²
 * With gaps, N is the number of terms used plus 2m.
 */
export function oadevEdfTable5(phasePoints: number, m: number, alpha: PowerLawAlpha): number {
  const N = phasePoints;
  if (!(N - 2 * m >= 1)) throw new InternalError(`Table 5 EDF needs N − 2m ≥ 1 (N = ${N}, m = ${m})`, 'edf');
  switch (alpha) {
    case 2:
      return ((N + 1) * (N - 2 * m)) / (2 * (N - m));
    case 1:
      return Math.exp(Math.sqrt(Math.log((N - 1) / (2 * m)) * Math.log(((2 * m + 1) * (N - 1)) / 4)));
    case 0:
      return ((3 * (N - 1)) / (2 * m) - (2 * (N - 2)) / N) * ((4 * m * m) / (4 * m * m + 5));
    case -1:
      return m === 1 ? (2 * (N - 2) ** 2) / (2.3 * N - 4.9) : (5 * N * N) / (4 * m * (N + 3 * m));
    case -2:
      return (((N - 2) / m) * ((N - 1) ** 2 - 3 * m * (N - 1) + 4 * m * m)) / (N - 3) ** 2;
  }
}

const gacvCache = new Map<PowerLawAlpha, Float64Array>();

/**
 * Generalized autocovariance s(t), t = 0..maxLag, of unit discrete power-law phase noise of type α
 * (any second-difference statistic's covariance is Σ c_a c_b s(h + b − a)).
 */
export function phaseGacv(alpha: PowerLawAlpha, maxLag: number): Float64Array {
  const cached = gacvCache.get(alpha);
  if (cached !== undefined && cached.length > maxLag) return cached;
  const n = Math.max(maxLag + 1, 2 * (cached?.length ?? 0), 1024);
  const s = new Float64Array(n);
  if (alpha === 2) s[0] = 1;
  else if (alpha === 0) for (let t = 0; t < n; t++) s[t] = -t / 2;
  else if (alpha === -2) for (let t = 0; t < n; t++) s[t] = (t * t * t - t) / 12;
  else {
    // Increments (α = 1) or second differences (α = −1) are fractionally differenced white noise
    // with d = −½: ρ(0) = 1, ρ(k) = ρ(k−1)(k − 1 + d)/(k − d).
    const d = -0.5;
    const g = new Float64Array(n);
    g[0] = 1;
    for (let k = 1; k < n; k++) g[k] = (g[k - 1] * (k - 1 + d)) / (k - d);
    if (alpha === 1) {
      // −(s(t+1) − 2s(t) + s(t−1)) = g(t), s even.
      s[1] = -g[0] / 2;
      for (let t = 1; t + 1 < n; t++) s[t + 1] = 2 * s[t] - s[t - 1] - g[t];
    } else {
      // Fourth central difference of s = g: two second-difference integrations.
      const u = new Float64Array(n);
      u[1] = g[0] / 2;
      for (let t = 1; t + 1 < n; t++) u[t + 1] = 2 * u[t] - u[t - 1] + g[t];
      s[1] = u[0] / 2;
      for (let t = 1; t + 1 < n; t++) s[t + 1] = 2 * s[t] - s[t - 1] + u[t];
    }
  }
  gacvCache.set(alpha, s);
  return s;
}

/** A linear statistic of phase: z_j = Σ weight·X_{j+offset}, X the phase summed over `sumOf` points. */
interface Taps {
  offsets: number[];
  weights: number[];
  /** X_j = Σ_{i=j}^{j+sumOf−1} x_i (1: X = x). */
  sumOf: number;
}

/** Exact Gaussian EDF of the mean of M squares of the statistic `taps` under noise α. */
function exactEdf(taps: Taps, terms: number, alpha: PowerLawAlpha): number {
  const span = Math.max(...taps.offsets) + taps.sumOf;
  const hMax = Math.min(terms - 1, LAG_SPANS * span + LAG_EXTRA);
  const maxLag = hMax + span + taps.sumOf + 2;
  const s = phaseGacv(alpha, maxLag);
  const at = (t: number): number => s[Math.abs(t)];
  const L = taps.sumOf;
  const sX = L === 1 ? at : (t: number): number => {
    let acc = 0;
    for (let u = -(L - 1); u <= L - 1; u++) acc += (L - Math.abs(u)) * at(t + u);
    return acc;
  };
  const cov = (h: number): number => {
    let acc = 0;
    for (let a = 0; a < taps.offsets.length; a++) {
      for (let b = 0; b < taps.offsets.length; b++) acc += taps.weights[a] * taps.weights[b] * sX(h + taps.offsets[b] - taps.offsets[a]);
    }
    return acc;
  };
  const r0 = cov(0);
  if (!(r0 > 0)) throw new InternalError(`statistic variance ${r0} under α = ${alpha}`, 'edf');
  let tail = 0;
  for (let h = 1; h <= hMax; h++) {
    const r = cov(h) / r0;
    tail += (1 - h / terms) * r * r;
  }
  return terms / (1 + 2 * tail);
}

/** Exact Gaussian EDF of the overlapping Allan variance (used to check the method against Table 5). */
export function oadevEdfExact(terms: number, m: number, alpha: PowerLawAlpha): number {
  return exactEdf({ offsets: [0, m, 2 * m], weights: [1, -2, 1], sumOf: 1 }, terms, alpha);
}

/** EDF of the overlapping Hadamard variance with `terms` terms at factor m (exact Gaussian). */
export function ohdevEdf(terms: number, m: number, alpha: PowerLawAlpha): number {
  return exactEdf({ offsets: [0, m, 2 * m, 3 * m], weights: [-1, 3, -3, 1], sumOf: 1 }, terms, alpha);
}

/** EDF of the modified Allan (and time) variance with `terms` terms at factor m. */
export function mdevEdf(terms: number, m: number, alpha: PowerLawAlpha): number {
  if (m > MDEV_EXACT_M_MAX) {
    const scaledTerms = Math.max(1, Math.round((terms * MDEV_EXACT_M_MAX) / m));
    return mdevEdf(scaledTerms, MDEV_EXACT_M_MAX, alpha);
  }
  return exactEdf({ offsets: [0, m, 2 * m], weights: [1, -2, 1], sumOf: m }, terms, alpha);
}

/** A deviation with its EDF and two-sided chi-squared intervals. */
export interface DeviationInterval {
  value: number;
  edf: number;
  ci68: [number, number];
  ci95: [number, number];
}

/**
 * Chi-squared confidence interval of a deviation (SP 1065 §5.3.2):
 * σ²·edf/χ²((1+L)/2; edf) ≤ σ_true² ≤ σ²·edf/χ²((1−L)/2; edf).
 * @param deviation estimate (≥ 0; 0 gives [0, 0])
 * @param edf       equivalent degrees of freedom (> 0)
 * @param level     two-sided level, e.g. {@link LEVEL_68}
 */
export function chiSquaredInterval(deviation: number, edf: number, level: number): [number, number] {
  const tail = (1 - level) / 2;
  const lo = deviation * Math.sqrt(edf / chiSquareQuantile(1 - tail, edf));
  const hi = deviation * Math.sqrt(edf / chiSquareQuantile(tail, edf));
  return [lo, hi];
}

/** {@link DeviationInterval} from a value and its EDF. */
export function withIntervals(value: number, edf: number): DeviationInterval {
  return { value, edf, ci68: chiSquaredInterval(value, edf, LEVEL_68), ci95: chiSquaredInterval(value, edf, LEVEL_95) };
}
