/**
 * Gap-tolerant overlapping deviations of phase data on a regular grid (pure; no I/O).
 *
 * Definitions (W. J. Riley, NIST SP 1065, 2008): overlapping Allan variance §5.2.4, modified
 * Allan variance §5.2.5, time variance §5.2.6 (σ_x² = τ²/3 · Mod σ_y²), overlapping Hadamard
 * variance §5.2.9. Phase x is in seconds at spacing τ0; τ = m·τ0.
 *
 * Gaps (in the spirit of SP 1065 §5.15): a missing phase point is NaN and stays missing; a term
 * of a sum is used only when every phase point it reads is present and no increment inside its
 * span is unknown (frequency data with a missing sample leave the phase continuous but that
 * increment unknown). Each variance divides by the number of terms actually used.
 *
 * Cost: O(N) per averaging factor. The modified variance keeps the inner sum of m second
 * differences as a running (cumulative) sum, updated by one term in and one out per step, and
 * counts invalid terms in the window the same way; no nested loops.
 */
import { InputError } from '../errors.ts';

/** Phase on a regular grid, with what is missing. */
export interface PhaseGrid {
  /** Phase, s; NaN where missing. */
  xS: Float64Array;
  /** Grid spacing, s (> 0). */
  tau0S: number;
  /**
   * Per increment k (x_k → x_{k+1}), 1 when it is unknown although both ends are present
   * (frequency data with a missing sample). Omitted: every increment with both ends is known.
   */
  brokenIncrement?: Uint8Array;
}

/** One variance estimate. */
export interface DeviationEstimate {
  /** The deviation (dimensionless; TDEV in s), or null when no term could be formed. */
  value: number | null;
  /** Number of terms summed (after gaps). */
  terms: number;
}

/**
 * Phase from fractional frequency: x_0 = 0, x_{k+1} = x_k + y_k·τ0. A missing y (NaN) leaves the
 * phase flat across it and marks that increment unknown, so no term spans it.
 * @param y     fractional frequency (dimensionless), NaN where missing
 * @param tau0S spacing, s
 */
export function phaseGridFromFrequency(y: ArrayLike<number>, tau0S: number): PhaseGrid {
  const xS = new Float64Array(y.length + 1);
  const broken = new Uint8Array(y.length);
  for (let k = 0; k < y.length; k++) {
    const v = y[k];
    if (Number.isNaN(v)) {
      broken[k] = 1;
      xS[k + 1] = xS[k];
    } else xS[k + 1] = xS[k] + v * tau0S;
  }
  return { xS, tau0S, brokenIncrement: broken };
}

/** Prefix counts of missing points (length N + 1) and of broken increments (length N). */
interface GapIndex {
  missing: Int32Array;
  broken: Int32Array;
  anyGap: boolean;
}

const gapCache = new WeakMap<PhaseGrid, GapIndex>();

function gapIndex(g: PhaseGrid): GapIndex {
  const cached = gapCache.get(g);
  if (cached !== undefined) return cached;
  const n = g.xS.length;
  const missing = new Int32Array(n + 1);
  const broken = new Int32Array(n);
  for (let i = 0; i < n; i++) missing[i + 1] = missing[i] + (Number.isNaN(g.xS[i]) ? 1 : 0);
  const b = g.brokenIncrement;
  for (let k = 0; k + 1 < n; k++) broken[k + 1] = broken[k] + (b !== undefined && b[k] === 1 ? 1 : 0);
  const idx = { missing, broken, anyGap: missing[n] > 0 || broken[n - 1 >= 0 ? n - 1 : 0] > 0 };
  gapCache.set(g, idx);
  return idx;
}

/** True when points i..j (inclusive) are all present and no increment in [i, j) is broken. */
function spanClean(gi: GapIndex, i: number, j: number): boolean {
  return gi.missing[j + 1] - gi.missing[i] === 0 && gi.broken[j] - gi.broken[i] === 0;
}

/** True when the points i, i+m, ... i+k·m are present and no increment in [i, i+k·m) is broken. */
function tapsClean(g: PhaseGrid, gi: GapIndex, i: number, m: number, k: number): boolean {
  for (let t = 0; t <= k; t++) if (Number.isNaN(g.xS[i + t * m])) return false;
  return gi.broken[i + k * m] - gi.broken[i] === 0;
}

function checkFactor(g: PhaseGrid, m: number): void {
  if (!(g.tau0S > 0) || !Number.isFinite(g.tau0S)) throw new InputError(`sample spacing τ0 = ${g.tau0S} s`, '--tau0', 'give a positive sample spacing, e.g. --tau0 1s');
  if (!Number.isInteger(m) || m < 1) throw new InputError(`averaging factor ${m}`, 'stability', 'give a whole number m ≥ 1');
}

/**
 * Overlapping Allan deviation (SP 1065 §5.2.4):
 * σ_y²(τ) = Σ (x_{i+2m} − 2x_{i+m} + x_i)² / (2 τ² M), M the number of valid terms.
 */
export function oadevGrid(g: PhaseGrid, m: number): DeviationEstimate {
  checkFactor(g, m);
  const x = g.xS;
  const gi = gapIndex(g);
  const tauS = m * g.tau0S;
  let sum = 0;
  let terms = 0;
  for (let i = 0; i + 2 * m < x.length; i++) {
    if (gi.anyGap && !tapsClean(g, gi, i, m, 2)) continue;
    const d = x[i + 2 * m] - 2 * x[i + m] + x[i];
    sum += d * d;
    terms++;
  }
  return { value: terms === 0 ? null : Math.sqrt(sum / (2 * tauS * tauS * terms)), terms };
}

/**
 * Overlapping Hadamard deviation (SP 1065 §5.2.9, from phase):
 * H σ_y²(τ) = Σ (x_{i+3m} − 3x_{i+2m} + 3x_{i+m} − x_i)² / (6 τ² M). Insensitive to linear drift.
 */
export function ohdevGrid(g: PhaseGrid, m: number): DeviationEstimate {
  checkFactor(g, m);
  const x = g.xS;
  const gi = gapIndex(g);
  const tauS = m * g.tau0S;
  let sum = 0;
  let terms = 0;
  for (let i = 0; i + 3 * m < x.length; i++) {
    if (gi.anyGap && !tapsClean(g, gi, i, m, 3)) continue;
    const d = x[i + 3 * m] - 3 * x[i + 2 * m] + 3 * x[i + m] - x[i];
    sum += d * d;
    terms++;
  }
  return { value: terms === 0 ? null : Math.sqrt(sum / (6 * tauS * tauS * terms)), terms };
}

/**
 * Modified Allan deviation (SP 1065 §5.2.5):
 * Mod σ_y²(τ) = Σ_j [Σ_{i=j}^{j+m−1} (x_{i+2m} − 2x_{i+m} + x_i)]² / (2 m² τ² M).
 * The inner sum is a running sum (one term in, one out per step).
 */
export function mdevGrid(g: PhaseGrid, m: number): DeviationEstimate {
  checkFactor(g, m);
  const x = g.xS;
  const n = x.length;
  const gi = gapIndex(g);
  const tauS = m * g.tau0S;
  const windows = n - 3 * m + 1;
  if (windows <= 0) return { value: null, terms: 0 };
  // Second difference at i, 0 when it reads a missing point (the window is then skipped anyway).
  const second = (i: number): number => {
    const d = x[i + 2 * m] - 2 * x[i + m] + x[i];
    return Number.isNaN(d) ? 0 : d;
  };
  let inner = 0;
  for (let i = 0; i < m; i++) inner += second(i);
  let sum = 0;
  let terms = 0;
  for (let j = 0; j < windows; j++) {
    if (j > 0) inner += second(j + m - 1) - second(j - 1);
    if (gi.anyGap && !spanClean(gi, j, j + 3 * m - 1)) continue;
    sum += inner * inner;
    terms++;
  }
  return { value: terms === 0 ? null : Math.sqrt(sum / (2 * m * m * tauS * tauS * terms)), terms };
}

/** Time deviation (SP 1065 §5.2.6): σ_x(τ) = τ/√3 · Mod σ_y(τ), in seconds. */
export function tdevGrid(g: PhaseGrid, m: number): DeviationEstimate {
  const mod = mdevGrid(g, m);
  const tauS = m * g.tau0S;
  return { value: mod.value === null ? null : (tauS / Math.sqrt(3)) * mod.value, terms: mod.terms };
}

/** Number of phase points present (not NaN). */
export function presentCount(g: PhaseGrid): number {
  const gi = gapIndex(g);
  return g.xS.length - gi.missing[g.xS.length];
}
