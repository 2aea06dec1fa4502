/**
 * The scenario's noise levels estimated from a stability table (pure; no I/O).
 *
 * Estimator (stated in outputs): weighted least squares of σ_y²(τ) = A/τ + B + C·τ on the
 * overlapping Allan variances of the table, with weights edf/(2σ⁴) (the chi-squared variance of
 * each variance estimate, NIST SP 1065 §5.3), all three terms kept ≥ 0 by trying every subset of
 * terms and keeping the best non-negative one. Only averaging times whose identified noise is an
 * FM type (α ≤ 0; where too few points identify it, the type carried from the nearest shorter τ)
 * and τ ≤ span/8 are used: phase-noise types (measurement noise) are
 * not the clock's, and the fitted polynomial removes power near the span. Levels:
 * whiteFmAdev1s = √(A/1 s), flickerFmFloor = √B, randomWalkFmAdev1d = √(C·86400 s); 1σ from the
 * covariance, σ(√X) = σ_X/(2√X). Adjacent octave points are correlated, so the 1σ are optimistic.
 */
import { SECONDS_PER_DAY } from '../constants.ts';
import type { StabilityTableRow } from './stabilityTable.ts';

/** Estimated levels with 1σ (null: the term was not needed or not identifiable). */
export interface NoiseModelEstimate {
  whiteFmAdev1s: number;
  whiteFmAdev1sSigma: number | null;
  flickerFmFloor: number;
  flickerFmFloorSigma: number | null;
  randomWalkFmAdev1d: number;
  randomWalkFmAdev1dSigma: number | null;
  /** Averaging times used, s. */
  tausUsedS: number[];
  /** χ² per degree of freedom of the weighted fit (null when as many points as terms). */
  reducedChiSquare: number | null;
  /** One sentence on the estimator, for outputs. */
  method: string;
}

export const NOISE_FIT_METHOD =
  'weighted least squares of OADEV² = A/τ + B + C·τ (weights edf/2σ⁴, terms ≥ 0) over FM-noise averaging times up to span/8';

function solveSmall(a: number[][], b: number[]): number[] | null {
  const n = b.length;
  const m = a.map((row, i) => [...row, b[i]]);
  for (let c = 0; c < n; c++) {
    let p = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(m[r][c]) > Math.abs(m[p][c])) p = r;
    [m[c], m[p]] = [m[p], m[c]];
    if (!(Math.abs(m[c][c]) > 0)) return null;
    for (let r = 0; r < n; r++) {
      if (r === c) continue;
      const f = m[r][c] / m[c][c];
      for (let k = c; k <= n; k++) m[r][k] -= f * m[c][k];
    }
  }
  return m.map((row, i) => row[n] / row[i]);
}

function invert(a: number[][]): number[][] | null {
  const n = a.length;
  const cols: number[][] = [];
  for (let j = 0; j < n; j++) {
    const e = Array.from({ length: n }, (_, i) => (i === j ? 1 : 0));
    const x = solveSmall(a, e);
    if (x === null) return null;
    cols.push(x);
  }
  return a.map((_, i) => cols.map((c) => c[i]));
}

/**
 * Estimate the noise levels, or null with the reason.
 * @param rows  stability rows (OADEV with EDF; α per τ)
 * @param spanS span of the data, s
 */
export function estimateNoiseModel(rows: readonly StabilityTableRow[], spanS: number): { estimate: NoiseModelEstimate | null; reason: string | null } {
  const use = rows.filter((r) => r.oadev !== null && r.oadev.value > 0 && r.alphaForEdf <= 0 && r.tauS <= spanS / 8);
  if (use.length < 2) return { estimate: null, reason: 'fewer than 2 averaging times with frequency-type noise below span/8' };
  const tau = use.map((r) => r.tauS);
  const v = use.map((r) => (r.oadev?.value ?? 0) ** 2);
  const w = use.map((r, i) => (r.oadev?.edf ?? 1) / (2 * v[i] * v[i]));
  const basis = [(t: number) => 1 / t, () => 1, (t: number) => t];
  let best: { terms: number[]; coef: number[]; chi: number; cov: number[][] } | null = null;
  for (let mask = 1; mask < 8; mask++) {
    const terms = [0, 1, 2].filter((k) => (mask >> k) & 1);
    if (terms.length > use.length) continue;
    const ata = terms.map((p) => terms.map((q) => tau.reduce((s, t, i) => s + w[i] * basis[p](t) * basis[q](t), 0)));
    const atb = terms.map((p) => tau.reduce((s, t, i) => s + w[i] * basis[p](t) * v[i], 0));
    const coef = solveSmall(ata, atb);
    if (coef === null || coef.some((c) => !(c >= 0))) continue;
    const chi = tau.reduce((s, t, i) => {
      const model = terms.reduce((acc, p, k) => acc + coef[k] * basis[p](t), 0);
      return s + w[i] * (v[i] - model) ** 2;
    }, 0);
    const cov = invert(ata);
    if (cov === null) continue;
    if (best === null || chi < best.chi) best = { terms, coef, chi, cov };
  }
  if (best === null) return { estimate: null, reason: 'no non-negative combination of white, flicker and random-walk FM fits the table' };
  const full = [0, 0, 0];
  const sig: (number | null)[] = [null, null, null];
  best.terms.forEach((p, k) => {
    full[p] = best.coef[k];
    sig[p] = Math.sqrt(Math.max(0, best.cov[k][k]));
  });
  const root = (x: number, s: number | null, scale: number): [number, number | null] => {
    const val = Math.sqrt(x * scale);
    return [val, s === null || val === 0 ? null : (s * scale) / (2 * val)];
  };
  const [a, sa] = root(full[0], sig[0], 1);
  const [b, sb] = root(full[1], sig[1], 1);
  const [c, sc] = root(full[2], sig[2], SECONDS_PER_DAY);
  const dof = use.length - best.terms.length;
  return {
    estimate: {
      whiteFmAdev1s: a,
      whiteFmAdev1sSigma: sa,
      flickerFmFloor: b,
      flickerFmFloorSigma: sb,
      randomWalkFmAdev1d: c,
      randomWalkFmAdev1dSigma: sc,
      tausUsedS: tau,
      reducedChiSquare: dof > 0 ? best.chi / dof : null,
      method: NOISE_FIT_METHOD,
    },
    reason: null,
  };
}
