/**
 * Time-domain frequency stability from evenly spaced phase data (pure; no I/O).
 *
 * Reference: W. J. Riley, *Handbook of Frequency Stability Analysis*, NIST Special Publication
 * 1065 (2008), §5.2 (Allan, overlapping Allan and modified Allan variances) and §5.3 (confidence
 * intervals). Phase `x` is in seconds (time deviation), sampled every `tau0S` seconds;
 * fractional frequency `y` is dimensionless. The averaging time is `tauS = m · tau0S`.
 *
 * The gap-tolerant estimators with intervals and noise types are in deviations.ts, edf.ts,
 * noiseId.ts and stabilityTable.ts; this file keeps the plain estimators `fit` has always used.
 */
import { InputError } from '../errors.ts';
import { chiSquareQuantile } from './gamma.ts';

export { chiSquareQuantile, gammaP } from './gamma.ts';

/** One stability estimate. */
export interface StabilityPoint {
  /** Averaging factor m (τ = m·τ0). */
  m: number;
  /** Averaging time, s. */
  tauS: number;
  /** The deviation (dimensionless), or null when the data are too short for this m. */
  deviation: number | null;
  /** Number of terms summed. */
  count: number;
}

/**
 * Phase from fractional frequency: x_0 = 0, x_{i+1} = x_i + y_i·τ0 (SP 1065 §4).
 * @param y     fractional frequency samples (dimensionless), each the mean over τ0
 * @param tau0S sample spacing, s
 * @returns N+1 phase values, s
 */
export function phaseFromFrequency(y: readonly number[], tau0S: number): number[] {
  const x = new Array<number>(y.length + 1);
  x[0] = 0;
  for (let i = 0; i < y.length; i++) x[i + 1] = x[i] + y[i] * tau0S;
  return x;
}

/**
 * Non-overlapping Allan deviation (SP 1065 §5.2.2, from phase):
 * σ²(τ) = Σ_{j} (x_{(j+2)m} − 2x_{(j+1)m} + x_{jm})² / (2 τ² n), stride m, n terms.
 * @param x     phase, s
 * @param tau0S phase sample spacing, s
 * @param m     averaging factor, integer ≥ 1
 */
export function adev(x: readonly number[], tau0S: number, m: number): StabilityPoint {
  checkArgs(x, tau0S, m);
  const tauS = m * tau0S;
  let sum = 0;
  let n = 0;
  for (let i = 0; i + 2 * m < x.length; i += m) {
    const d = x[i + 2 * m] - 2 * x[i + m] + x[i];
    sum += d * d;
    n++;
  }
  return { m, tauS, deviation: n === 0 ? null : Math.sqrt(sum / (2 * tauS * tauS * n)), count: n };
}

/**
 * Overlapping Allan deviation (SP 1065 §5.2.4, from phase):
 * σ²(τ) = Σ_{i=0}^{N−2m−1} (x_{i+2m} − 2x_{i+m} + x_i)² / (2 τ² (N − 2m)).
 * @param x     phase, s (N values)
 * @param tau0S phase sample spacing, s
 * @param m     averaging factor, integer ≥ 1
 */
export function overlappingAdev(x: readonly number[], tau0S: number, m: number): StabilityPoint {
  checkArgs(x, tau0S, m);
  const tauS = m * tau0S;
  const n = x.length - 2 * m;
  if (n <= 0) return { m, tauS, deviation: null, count: 0 };
  let sum = 0;
  for (let i = 0; i < n; i++) {
    const d = x[i + 2 * m] - 2 * x[i + m] + x[i];
    sum += d * d;
  }
  return { m, tauS, deviation: Math.sqrt(sum / (2 * tauS * tauS * n)), count: n };
}

/**
 * Modified Allan deviation (SP 1065 §5.2.5, from phase):
 * Mod σ²(τ) = Σ_{j=0}^{N−3m} [ Σ_{i=j}^{j+m−1} (x_{i+2m} − 2x_{i+m} + x_i) ]² / (2 m² τ² (N − 3m + 1)).
 * The inner sum is kept as a running sum, so the cost is O(N) per m.
 * @param x     phase, s (N values)
 * @param tau0S phase sample spacing, s
 * @param m     averaging factor, integer ≥ 1
 */
export function modifiedAdev(x: readonly number[], tau0S: number, m: number): StabilityPoint {
  checkArgs(x, tau0S, m);
  const tauS = m * tau0S;
  const n = x.length - 3 * m + 1;
  if (n <= 0) return { m, tauS, deviation: null, count: 0 };
  const second = (i: number): number => x[i + 2 * m] - 2 * x[i + m] + x[i];
  let inner = 0;
  for (let i = 0; i < m; i++) inner += second(i);
  let sum = inner * inner;
  for (let j = 1; j < n; j++) {
    inner += second(j + m - 1) - second(j - 1);
    sum += inner * inner;
  }
  return { m, tauS, deviation: Math.sqrt(sum / (2 * m * m * tauS * tauS * n)), count: n };
}

/**
 * Octave-spaced averaging factors 1, 2, 4, ... for which both the overlapping and the modified
 * Allan deviation have at least `minTerms` terms (N − 3m + 1 ≥ minTerms).
 * @param phaseCount number of phase samples N
 * @param minTerms   smallest acceptable number of terms (default 1)
 */
export function octaveFactors(phaseCount: number, minTerms = 1): number[] {
  const out: number[] = [];
  for (let m = 1; phaseCount - 3 * m + 1 >= minTerms; m *= 2) out.push(m);
  return out;
}

/**
 * The common spacing of a time series, or null when it is not evenly spaced: every step must be
 * within `relTol` (relative) of the mean step (last − first)/(n − 1). Needs at least 2 times.
 * @param ttJ2000S times, s since J2000.0 TT (any uniform scale works)
 * @param relTol   relative tolerance on each step, e.g. 1e-3
 * @returns the mean step in s, or null
 */
export function evenSpacingS(ttJ2000S: readonly number[], relTol: number): number | null {
  const n = ttJ2000S.length;
  if (n < 2) return null;
  const stepS = (ttJ2000S[n - 1] - ttJ2000S[0]) / (n - 1);
  if (!(stepS > 0)) return null;
  for (let i = 1; i < n; i++) {
    if (Math.abs(ttJ2000S[i] - ttJ2000S[i - 1] - stepS) > relTol * stepS) return null;
  }
  return stepS;
}

/** True when {@link evenSpacingS} finds a common step. Times in s (any uniform scale). */
export function isEvenlySpaced(ttJ2000S: readonly number[], relTol: number): boolean {
  return evenSpacingS(ttJ2000S, relTol) !== null;
}

/** Power-law noise types for which an EDF formula is provided here. */
export type PowerLawNoise = 'white PM' | 'white FM';

/**
 * Equivalent degrees of freedom of the overlapping Allan variance, simple approximations of
 * NIST SP 1065 §5.3 (Table 5, after Howe, Allan & Barnes 1981). **From memory**; the two formulas
 * kept here agree with an independent third-party implementation that cites the same table.
 * The flicker and random-walk formulas are left out because they could not be confirmed.
 *   white PM: edf = (N+1)(N−2m) / (2(N−m))
 *   white FM: edf = [3(N−1)/(2m) − 2(N−2)/N] · 4m²/(4m²+5)
 * @param phaseCount N, number of phase samples
 * @param m          averaging factor
 * @param noise      dominant noise type (must be known or assumed by the caller)
 */
export function oadevEdf(phaseCount: number, m: number, noise: PowerLawNoise): number {
  const N = phaseCount;
  if (!(N - 2 * m >= 1)) throw new InputError(`N = ${N} phase samples is too few for m = ${m}`, 'stability', 'use m ≤ (N − 1)/2');
  if (noise === 'white PM') return ((N + 1) * (N - 2 * m)) / (2 * (N - m));
  return ((3 * (N - 1)) / (2 * m) - (2 * (N - 2)) / N) * ((4 * m * m) / (4 * m * m + 5));
}

/**
 * Chi-square confidence interval of a deviation (NIST SP 1065 §5.3.2):
 * σ²_min = σ²·edf/χ²(p_hi, edf), σ²_max = σ²·edf/χ²(p_lo, edf), with p_lo = (1 − level)/2.
 * @param deviation the estimated deviation (dimensionless)
 * @param edf       equivalent degrees of freedom (> 0)
 * @param level     two-sided confidence level, default 0.6827 (±1σ)
 */
export function chiSquareInterval(deviation: number, edf: number, level = 0.682689492137086): { low: number; high: number } {
  const pLo = (1 - level) / 2;
  const lo = chiSquareQuantile(pLo, edf);
  const hi = chiSquareQuantile(1 - pLo, edf);
  return { low: deviation * Math.sqrt(edf / hi), high: deviation * Math.sqrt(edf / lo) };
}

function checkArgs(x: readonly number[], tau0S: number, m: number): void {
  if (!(tau0S > 0) || !Number.isFinite(tau0S)) throw new InputError(`sample spacing ${tau0S} s`, 'stability', 'give a positive finite τ0 in seconds');
  if (!Number.isInteger(m) || m < 1) throw new InputError(`averaging factor ${m}`, 'stability', 'give a whole number m ≥ 1');
  if (x.length < 1) throw new InputError('no phase data', 'stability', 'give at least 3 phase samples');
}
