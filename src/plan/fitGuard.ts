/**
 * The fit guard (pure; no I/O): sigma clipping may remove at most 10 % of the rows. When it would
 * remove more, the fit stops clipping, keeps every row, and says why the residuals are so far from
 * the model: power at a period (an unremoved periodic term, e.g. the orbit's), a step (a phase
 * jump or frequency step, with its line), or a trend (the polynomial degree is too low).
 *
 * Diagnosis: the share of the residual variance each explanation removes by weighted-free least
 * squares on the residuals — a sinusoid (plus its first harmonic) at the orbital period when
 * known, else the best of ~300 trial periods between 4 samples and 1.5 spans; a step at the
 * largest detected event; two more polynomial degrees. The largest share above 30 % names the
 * cause (common practice; thresholds are ours).
 */
import type { DetectedStep } from './steps.ts';

/** Largest fraction of rows clipping may remove without stopping. */
export const MAX_REJECTED_FRACTION = 0.1;
/** Smallest explained share of the residual variance that names a cause. */
const CAUSE_MIN_SHARE = 0.3;
/** Trial periods of the scan without a known orbit. */
const TRIAL_PERIODS = 300;
/** Rows used by the period scan (evenly thinned beyond this). */
const SCAN_MAX_ROWS = 4000;

/** True when rejecting `rejectedTotal` of `rowCount` rows would pass the limit. */
export function clippingExceedsLimit(rejectedTotal: number, rowCount: number): boolean {
  return rejectedTotal > MAX_REJECTED_FRACTION * rowCount;
}

/** Why the residuals do not fit. */
export interface ResidualDiagnosis {
  cause: 'periodic term' | 'step' | 'trend' | 'unknown';
  /** Share of the residual variance the explanation removes (0–1). */
  share: number;
  /** Period found, s (periodic term only). */
  periodS: number | null;
  /** The sentence for the warning. */
  message: string;
}

/** Input of {@link diagnoseResiduals}. */
export interface DiagnosisInput {
  timesS: readonly number[];
  residualNs: readonly number[];
  degree: 0 | 1 | 2;
  /** Orbital period, s, when an orbit is known. */
  orbitalPeriodS: number | null;
  /** True when the relativistic periodic term was already removed. */
  periodicRemoved: boolean;
  steps: readonly DetectedStep[];
  /** Formats a time (s) for the message. */
  formatTime: (timeS: number) => string;
}

/**
 * Share of variance of y removed by LS on the given columns plus the fit's own polynomial
 * (`base`: constant, and u, u² up to the degree), which the residuals are already orthogonal to
 * but which an explanation must be free to re-use (a step minus its best line is not a step).
 */
function explainedShare(y: readonly number[], columns: number[][], base: number[][]): number {
  const n = y.length;
  const cols = [...base, ...columns];
  const p = cols.length;
  // Normal equations on at most 5 columns, solved by Gaussian elimination with pivoting.
  const a = Array.from({ length: p }, (_, r) => Array.from({ length: p + 1 }, (_, c) => {
    let acc = 0;
    const other = c === p ? y : cols[c];
    for (let i = 0; i < n; i++) acc += cols[r][i] * other[i];
    return acc;
  }));
  for (let c = 0; c < p; c++) {
    let piv = c;
    for (let r = c + 1; r < p; r++) if (Math.abs(a[r][c]) > Math.abs(a[piv][c])) piv = r;
    [a[c], a[piv]] = [a[piv], a[c]];
    if (Math.abs(a[c][c]) < 1e-300) return 0;
    for (let r = 0; r < p; r++) {
      if (r === c) continue;
      const f = a[r][c] / a[c][c];
      for (let k = c; k <= p; k++) a[r][k] -= f * a[c][k];
    }
  }
  const beta = a.map((row, r) => row[p] / row[r]);
  let mean = 0;
  for (const v of y) mean += v;
  mean /= n;
  let total = 0;
  let resid = 0;
  for (let i = 0; i < n; i++) {
    let fit = 0;
    for (let c = 0; c < p; c++) fit += beta[c] * cols[c][i];
    total += (y[i] - mean) ** 2;
    resid += (y[i] - fit) ** 2;
  }
  return total > 0 ? Math.max(0, 1 - resid / total) : 0;
}

function sinusoidColumns(t: readonly number[], periodS: number): number[][] {
  const w = (2 * Math.PI) / periodS;
  return [t.map((v) => Math.sin(w * v)), t.map((v) => Math.cos(w * v)), t.map((v) => Math.sin(2 * w * v)), t.map((v) => Math.cos(2 * w * v))];
}

/** Name the likely cause of residuals the model cannot follow. */
export function diagnoseResiduals(d: DiagnosisInput): ResidualDiagnosis {
  const n = d.timesS.length;
  const t0 = d.timesS[0];
  const t = d.timesS.map((v) => v - t0);
  const spanS = t[n - 1] || 1;
  const stride = Math.max(1, Math.ceil(n / SCAN_MAX_ROWS));
  const ts: number[] = [];
  const ys: number[] = [];
  for (let i = 0; i < n; i += stride) {
    ts.push(t[i]);
    ys.push(d.residualNs[i]);
  }
  const span = spanS;
  const polyBase = (times: readonly number[]): number[][] => {
    const u = times.map((v) => (2 * v) / span - 1);
    const out = [u.map(() => 1)];
    for (let k = 1; k <= d.degree; k++) out.push(u.map((v) => v ** k));
    return out;
  };
  const baseScan = polyBase(ts);
  const baseAll = polyBase(t);
  // Periodic term.
  let periodS: number | null = null;
  let periodicShare = 0;
  if (d.orbitalPeriodS !== null && d.orbitalPeriodS < 3 * spanS) {
    periodS = d.orbitalPeriodS;
    periodicShare = explainedShare(ys, sinusoidColumns(ts, periodS), baseScan);
  } else if (n >= 8) {
    const minP = (4 * spanS) / (n - 1);
    const maxP = 1.5 * spanS;
    for (let k = 0; k < TRIAL_PERIODS && maxP > minP; k++) {
      const p = minP * (maxP / minP) ** (k / (TRIAL_PERIODS - 1));
      const share = explainedShare(ys, sinusoidColumns(ts, p).slice(0, 2), baseScan);
      if (share > periodicShare) {
        periodicShare = share;
        periodS = p;
      }
    }
  }
  // Step at the strongest detected event.
  const strongest = [...d.steps].sort((a, b) => b.sigmas - a.sigmas)[0];
  let stepShare = 0;
  if (strongest !== undefined) {
    const at = strongest.timeS - t0;
    const cols = strongest.kind === 'phase jump' ? [t.map((v) => (v >= at ? 1 : 0))] : [t.map((v) => (v >= at ? v - at : 0))];
    stepShare = explainedShare(d.residualNs, cols, baseAll);
  }
  // Trend: two more polynomial degrees.
  const u = t.map((v) => (2 * v) / spanS - 1);
  const trendShare = explainedShare(d.residualNs, [u.map((v) => v ** (d.degree + 1)), u.map((v) => v ** (d.degree + 2))], baseAll);

  const best = Math.max(periodicShare, stepShare, trendShare);
  if (best < CAUSE_MIN_SHARE) {
    return { cause: 'unknown', share: best, periodS: null, message: 'no single cause found (no period, step or trend explains 30 % of the residuals): check the sigmas and look for outliers by eye' };
  }
  if (best === stepShare && strongest !== undefined) {
    const what = strongest.kind === 'phase jump' ? `a phase jump of ${(strongest.sizeNs as number).toFixed(3)} ns` : `a frequency step of ${(strongest.fractionalStep as number).toExponential(2)}`;
    return { cause: 'step', share: best, periodS: null, message: `${what} at line ${strongest.line} (${d.formatTime(strongest.timeS)}) explains ${(best * 100).toFixed(0)} % of the residuals: split the series there or use --segments auto` };
  }
  if (best === periodicShare && periodS !== null) {
    const hours = (periodS / 3600).toFixed(2);
    const known = d.orbitalPeriodS !== null && periodS === d.orbitalPeriodS;
    const fix = d.periodicRemoved
      ? 'a periodic term remains after the relativistic term was removed: check that the orbit belongs to these measurements'
      : 'an unremoved periodic term: give --scenario and --sat so the relativistic term along the orbit is removed first';
    return { cause: 'periodic term', share: best, periodS, message: `residual power at ${known ? 'the orbital period' : 'a period of'} ${hours} h (${(best * 100).toFixed(0)} % of the residuals): ${fix}` };
  }
  const next = d.degree < 2 ? `try --degree ${d.degree + 1}` : 'the clock is not quadratic over this span: fit a shorter span';
  return { cause: 'trend', share: best, periodS: null, message: `a trend remains (${(best * 100).toFixed(0)} % of the residuals): degree ${d.degree} is too low, ${next}` };
}

/** The one-line warning when clipping stopped. */
export function clipStoppedWarning(wouldReject: number, rowCount: number, clipSigma: number, diagnosis: ResidualDiagnosis): string {
  const pct = ((100 * wouldReject) / rowCount).toFixed(0);
  return `clipping at ${clipSigma}σ would reject ${wouldReject} of ${rowCount} rows (${pct} %, limit ${MAX_REJECTED_FRACTION * 100} %), so it was stopped and every row kept; likely cause: ${diagnosis.message}`;
}
