/**
 * Clock estimation from offset measurements (`tauplan fit`), pure: no I/O.
 *
 * Model, with t = time − epoch in SI seconds (TT):
 *
 *     offsetNs(t) = x0 + y·t·1e9 + D·t²/2·1e9
 *
 * x0 = `offsetNs` at the epoch (ns), y = `fractionalFrequency` (dimensionless, positive = the clock
 * runs fast), D = drift of y per second; `driftPerDay` = D·86400 s (change of y per day). This is
 * the oscillator model of physics.md §6 with D = agingPerDay / 86400 s.
 *
 * Segments: when a clock event splits the series (SP3 flag `E`), each segment gets its own offset
 * x0_k and all share y and D; `offsetNs` is the first segment's.
 *
 * Method: weighted linear least squares solved by singular value decomposition (ml-matrix), never
 * by normal equations, with the time column scaled to ±1 for conditioning. Covariance is
 * (AᵀWA)⁻¹ = V S⁻² Vᵀ of the weighted, scaled design matrix.
 */
import { Matrix, SingularValueDecomposition } from 'ml-matrix';
import { InputError, InternalError, assertFinite } from '../errors.ts';
import type { TimeSystem } from '../time/timeSystem.ts';
import { Instant } from '../time/instant.ts';
import { evenSpacingS, modifiedAdev, octaveFactors, overlappingAdev } from '../clock/stability.ts';
import { clipStoppedWarning, clippingExceedsLimit, diagnoseResiduals } from './fitGuard.ts';
import { fitStabilityRows, offsetStability, type FitStabilityRow } from './fitStability.ts';
import { detectSteps, type DetectedStep } from './steps.ts';
import { estimateNoiseModel, type NoiseModelEstimate } from '../clock/noiseFit.ts';
import { bandSeries } from '../clock/predictionBand.ts';
import { fitWithAutoSegments, type FittedJump } from './segments.ts';

export type { FitStabilityRow } from './fitStability.ts';

/** One measurement as the fit needs it (a superset of `MeasurementRow` from src/io/measurements.ts works). */
export interface FitInputRow {
  /** 1-based line number in the source file, for the rejected list. */
  line: number;
  /** Time, s since J2000.0 TT. */
  ttJ2000S: number;
  /** Clock reading minus the reference scale, ns. */
  offsetNs: number;
  /** 1-σ uncertainty, ns, or null. Either every row has one or none does. */
  sigmaNs: number | null;
  /** Segment (a clock event starts a new one): each segment gets its own offset. Default 0. */
  segment?: number;
}

/** Options of {@link fitClock}. */
export interface FitOptions {
  /** Polynomial degree: 0 offset, 1 + frequency, 2 + drift. */
  degree: 0 | 1 | 2;
  /** Formats output times (UTC with `Z`); the leap-second table travels with it. */
  timeSystem: TimeSystem;
  /** Epoch the parameters refer to, s since J2000.0 TT. Default: the first row's time. */
  epochTtJ2000S?: number;
  /**
   * Sigma-clipping threshold k (default 4). A row is rejected when |residual| > k·σ_i with the
   * given sigmas, or > k·s without them (s = √(Σr²/(n−p)), the residual standard deviation).
   * 0 or Infinity disables clipping.
   */
  clipSigma?: number;
  /** Iteration cap for clipping (default 20). Rejection is monotone, so it also ends by itself. */
  maxClipIterations?: number;
  /**
   * Periodic term in ns at a time (s since J2000.0 TT), subtracted from every offset before the
   * fit; e.g. the relativistic −2 r·v/c² term of the satellite, supplied by the caller.
   */
  periodicNs?: (ttJ2000S: number) => number;
  /** Relative tolerance for "evenly spaced" in the stability table (default 1e-3). */
  spacingRelTol?: number;
  /** Name of the measurement file, for the location in error messages (default `measurements`). */
  sourceName?: string;
  /** Orbital period, s, when an orbit is known (names an unremoved periodic term in the fit guard). */
  orbitalPeriodS?: number;
  /** 'auto': fit the phase jumps found in the residuals jointly and remove them (src/plan/segments.ts). Default 'none'. */
  segments?: 'none' | 'auto';
  /** Averaging times [s] at which to give the residuals' OADEV besides the octave table (nearest multiple of the spacing). */
  stabilityTausS?: number[];
}

/** A row left out by sigma clipping. */
export interface RejectedRow {
  line: number;
  /** UTC, ISO 8601 with `Z` and milliseconds. */
  time: string;
  /** The offset as given, ns (before any periodic term is removed). */
  offsetNs: number;
  /** Residual against the final fit, ns (after the periodic term is removed). */
  residualNs: number;
}

/** Result of {@link fitClock}. Field names follow the contract (`tauplan fit`). */
export interface FitResult {
  /** Epoch of the parameters, UTC ISO 8601 with `Z`. */
  epoch: string;
  /** The same epoch, s since J2000.0 TT. */
  epochTtJ2000S: number;
  degree: 0 | 1 | 2;
  /** Offset at the epoch, ns, and its 1-σ. */
  offsetNs: number;
  offsetSigmaNs: number | null;
  /** Fractional frequency (dimensionless) and 1-σ; null at degree 0. */
  fractionalFrequency: number | null;
  fractionalFrequencySigma: number | null;
  /** Change of fractional frequency per day (1/day) and 1-σ; null below degree 2. */
  driftPerDay: number | null;
  driftPerDaySigma: number | null;
  /** Correlation matrix of the fitted parameters (offset, frequency, drift order), or null when sigmas are unknown. */
  correlation: number[][] | null;
  /** Unweighted root mean square of the residuals of the rows used, ns. */
  rmsNs: number;
  /** Number of rows used in the final fit. */
  used: number;
  rejected: RejectedRow[];
  /** Octave-spaced stability of the residual phase; empty when the rows are not evenly spaced. */
  stability: FitStabilityRow[];
  /** Why `stability` is empty, or how rejected rows were bridged; null when nothing to say. */
  stabilityNote: string | null;
  /** Where the parameter sigmas come from. */
  sigmaSource: 'given' | 'scaled by reduced chi-square';
  /** χ²/(n − p) of the final fit (with unit weights without sigmas); null when n = p. */
  reducedChiSquare: number | null;
  /** True when a periodic term was subtracted before fitting. */
  periodicRemoved: boolean;
  /** The clipping threshold used (null when disabled) and the number of fit passes. */
  clipSigma: number | null;
  iterations: number;
  /** Span of the rows used, s. */
  spanS: number;
  /** Rejected rows ÷ all rows (0 when clipping is off or stopped). */
  rejectedFraction: number;
  /** True when clipping would have removed more than 10 % of the rows and was stopped (every row kept). */
  clipStopped: boolean;
  /** Warnings to show loudly (stderr and every format). */
  warnings: string[];
  /** Phase jumps and frequency steps found in the residuals (src/plan/steps.ts). */
  steps: (Omit<DetectedStep, 'timeS' | 'index'> & { time: string })[];
  /** Stability of the raw phase (offsets with only the periodic term removed), same row shape. */
  rawStability: FitStabilityRow[];
  /** Noise levels estimated from the residual stability (src/clock/noiseFit.ts), or null. */
  noiseModel: NoiseModelEstimate | null;
  /** Why there is no noise model; null when there is one. */
  noiseModelNote: string | null;
  /** Phase jumps fitted and removed with `segments: 'auto'` (empty otherwise). */
  segmentJumps: FittedJump[];
  /** 95 % prediction band from the noise model and the fitted state's covariance, or null without a noise model. */
  predictionBand: { horizonS: number[]; halfWidth95Ns: number[] } | null;
  /** Offset at the epoch of each segment's line, ns (one entry without clock events). */
  segmentOffsetsNs: number[];
  /** Where the measurements came from; null when the caller gave bare rows. */
  source: FitSource | null;
  /**
   * Relativistic rate along the orbit over the fitted span (the slope of the least-squares line
   * through the relativistic proper-time offset with −2 r·v/c² removed, as `size` defines
   * meanFractionalOffset); null without an orbit.
   */
  relativisticMeanFractionalOffset: number | null;
  /** fractionalFrequency − relativisticMeanFractionalOffset: the oscillator's own offset; null without an orbit or at degree 0. */
  hardwareFractionalOffset: number | null;
  /** Sentences the reader should see (conventions used, samples left out). */
  notes: string[];
  /** OADEV of the residuals at the requested averaging times (null where the data do not reach), in request order. */
  stabilityAtTaus: { tauS: number; oadev: number | null }[];
}

/** The measurement source of a fit (contract: `source`). */
export interface FitSource {
  format: string;
  satellite: string;
  samples: number;
  skipped: number;
  segments: number;
  periodicTerm: 'included' | 'excluded';
  timeScale: string;
  /** Samples flagged as predicted (SP3 column 76). */
  predicted: number;
  /** Mean clock drift the file states (TDM CLOCK_DRIFT, s/s), or null. */
  statedDrift: number | null;
}

const SECONDS_PER_DAY = 86400;
/** Singular-value ratio below which the design is treated as rank-deficient. */
const CONDITION_LIMIT = 1e12;

interface Solution {
  /** Parameters in physical units: [ns per segment…, ns/s, ns/s²]. */
  params: number[];
  /** Covariance of `params` from the weights alone (unit weights → multiply by s²). */
  cov: number[][];
  residualNs: number[];
  chiSquare: number;
}

/**
 * Fit offset, fractional frequency and drift to clock-offset measurements, with iterative sigma
 * clipping and a stability table of the residuals.
 *
 * Without sigmas, rows have unit weight and the covariance is scaled by the reduced χ² (so the
 * sigmas come from the scatter). With sigmas, weights are 1/σ² and the covariance comes from the
 * sigmas alone; the reduced χ² is reported so a mismatch is visible.
 *
 * @param rows    measurements in strictly increasing time order (as parseMeasurementsCsv gives them)
 * @throws InputError when fewer rows than parameters remain (before or after clipping), when the
 *   times cannot separate the parameters, or when an option is out of range
 */
export function fitClock(rows: readonly FitInputRow[], options: FitOptions): FitResult {
  if (options.segments === 'auto') return fitWithAutoSegments(rows, options.periodicNs, (r) => fitClock(r, { ...options, segments: 'none' }));
  const degree = options.degree;
  if (degree !== 0 && degree !== 1 && degree !== 2) throw new InputError(`degree ${String(degree)}`, '--degree', 'use 0, 1 or 2');
  // Segments renumbered 0, 1, ... in order of appearance (rows may have been thinned).
  const segIndex = new Map<number, number>();
  const seg = rows.map((r) => {
    const k = r.segment ?? 0;
    let j = segIndex.get(k);
    if (j === undefined) {
      j = segIndex.size;
      segIndex.set(k, j);
    }
    return j;
  });
  const nSeg = Math.max(1, segIndex.size);
  const p = degree + nSeg;
  const clip = options.clipSigma ?? 4;
  if (Number.isNaN(clip) || clip < 0) throw new InputError(`clip ${clip}`, '--clip', 'give a number of sigmas ≥ 0 (0 disables clipping)');
  const clipOn = clip > 0 && Number.isFinite(clip);
  const maxIterations = options.maxClipIterations ?? 20;
  const source = options.sourceName ?? 'measurements';
  if (rows.length < p) {
    const lastLine = rows.length > 0 ? rows[rows.length - 1].line : 1;
    throw new InputError(`${rows.length} measurement rows for a degree-${degree} fit`, `${source}:${lastLine}, --degree`, `give at least ${p} rows, or lower --degree`);
  }
  const withSigma = rows[0].sigmaNs !== null;
  if (rows.some((r) => (r.sigmaNs !== null) !== withSigma)) {
    throw new InputError('some rows have sigmaNs and some do not', source, 'give sigmaNs on every row or on none');
  }
  for (let i = 1; i < rows.length; i++) {
    if (!(rows[i].ttJ2000S > rows[i - 1].ttJ2000S)) throw new InputError(`row at line ${rows[i].line} is not later than line ${rows[i - 1].line}`, source, 'sort the rows by time, one per instant');
  }
  const epochTt = options.epochTtJ2000S ?? rows[0].ttJ2000S;
  assertFinite(epochTt, 'fit epoch');

  const periodic = options.periodicNs;
  const yNs = rows.map((r) => r.offsetNs - (periodic === undefined ? 0 : assertFinite(periodic(r.ttJ2000S), 'periodic term')));
  const tS = rows.map((r) => r.ttJ2000S - epochTt);
  const sigma = rows.map((r) => r.sigmaNs ?? 1);

  let usedIdx = rows.map((_, i) => i);
  const rejectedIdx = new Set<number>();
  let sol = solve(usedIdx, tS, yNs, sigma, degree, seg, nSeg);
  let iterations = 1;
  let clipStoppedAt: number | null = null;
  while (clipOn && iterations < maxIterations) {
    const dof = usedIdx.length - p;
    if (dof <= 0) break;
    const scale = withSigma ? 1 : Math.sqrt(sol.chiSquare / dof);
    if (!(scale > 0)) break; // a perfect fit: nothing to clip against
    const out = usedIdx.filter((i, k) => Math.abs(sol.residualNs[k]) > clip * scale * sigma[i]);
    if (out.length === 0) break;
    if (clippingExceedsLimit(rejectedIdx.size + out.length, rows.length)) {
      // Runaway clipping means the model does not fit: keep every row and say why (fitGuard.ts).
      clipStoppedAt = rejectedIdx.size + out.length;
      rejectedIdx.clear();
      usedIdx = rows.map((_, i) => i);
      sol = solve(usedIdx, tS, yNs, sigma, degree, seg, nSeg);
      break;
    }
    for (const i of out) rejectedIdx.add(i);
    usedIdx = usedIdx.filter((i) => !rejectedIdx.has(i));
    if (usedIdx.length < p) {
      throw new InputError(
        `clipping at ${clip}σ left ${usedIdx.length} rows for a degree-${degree} fit`,
        source,
        `check the rejected rows, raise --clip, or use --clip 0 to keep every row`,
      );
    }
    sol = solve(usedIdx, tS, yNs, sigma, degree, seg, nSeg);
    iterations++;
  }

  const n = usedIdx.length;
  const dof = n - p;
  const reducedChiSquare = dof > 0 ? sol.chiSquare / dof : null;
  // Covariance scale: 1 with given sigmas; reduced χ² with unit weights (unknown when dof = 0).
  const covScale = withSigma ? 1 : reducedChiSquare;
  const sd = (k: number): number | null => (covScale === null ? null : Math.sqrt(sol.cov[k][k] * covScale));

  const x0 = sol.params[0];
  const yNsPerS = degree > 0 ? sol.params[nSeg] : 0;
  const dNsPerS2 = degree > 1 ? sol.params[nSeg + 1] : 0;
  const nsToFraction = 1e-9;
  const offsetSigmaNs = sd(0);
  const s1 = degree > 0 ? sd(nSeg) : null;
  const s2 = degree > 1 ? sd(nSeg + 1) : null;

  let correlation: number[][] | null = null;
  if (covScale !== null) {
    // Offset (first segment), frequency, drift: the contract's shape whatever the segment count.
    const keep = [0, ...Array.from({ length: degree }, (_, k) => nSeg + k)];
    correlation = keep.map((a) => keep.map((b) => sol.cov[a][b] / Math.sqrt(sol.cov[a][a] * sol.cov[b][b])));
  }

  // Residuals of every row against the final fit (rejected rows too, for the report).
  const model = (i: number): number => {
    const t = tS[i];
    return sol.params[seg[i]] + yNsPerS * t + (dNsPerS2 * t * t) / 2;
  };
  const rejected: RejectedRow[] = [...rejectedIdx]
    .sort((a, b) => a - b)
    .map((i) => ({
      line: rows[i].line,
      time: options.timeSystem.format(Instant.fromTtJ2000S(rows[i].ttJ2000S)),
      offsetNs: rows[i].offsetNs,
      residualNs: assertFinite(yNs[i] - model(i), 'residual'),
    }));

  let sumSq = 0;
  for (const r of sol.residualNs) sumSq += r * r;
  const rmsNs = Math.sqrt(sumSq / n);

  const usedTimesS = usedIdx.map((i) => rows[i].ttJ2000S);
  const residualOnAll = rows.map(() => Number.NaN);
  usedIdx.forEach((i, k) => (residualOnAll[i] = sol.residualNs[k]));
  const residualTable = offsetStability(rows.map((r) => r.ttJ2000S), residualOnAll);
  const stability = fitStabilityRows(residualTable.table);
  const note = residualTable.note;
  const rawStability = fitStabilityRows(offsetStability(rows.map((r) => r.ttJ2000S), yNs).table);
  const usedSpanS = usedTimesS[usedTimesS.length - 1] - usedTimesS[0];
  const noise = residualTable.table === null ? { estimate: null, reason: residualTable.note ?? 'no stability table' } : estimateNoiseModel(residualTable.table.rows, usedSpanS);
  const steps = detectSteps(usedTimesS, sol.residualNs, usedIdx.map((i) => rows[i].line));
  const formatTime = (t: number): string => options.timeSystem.format(Instant.fromTtJ2000S(t));
  const warnings: string[] = [];
  if (clipStoppedAt !== null) {
    const diagnosis = diagnoseResiduals({
      timesS: usedTimesS,
      residualNs: sol.residualNs,
      degree,
      orbitalPeriodS: options.orbitalPeriodS ?? null,
      periodicRemoved: periodic !== undefined,
      steps,
      formatTime,
    });
    warnings.push(clipStoppedWarning(clipStoppedAt, rows.length, clip, diagnosis));
  }
  const { atTaus } = residualStability(rows, usedIdx, sol.residualNs, options.spacingRelTol ?? 1e-3, options.stabilityTausS ?? []);

  const usedTimes = usedIdx.map((i) => rows[i].ttJ2000S);
  return {
    epoch: options.timeSystem.format(Instant.fromTtJ2000S(epochTt)),
    epochTtJ2000S: epochTt,
    degree,
    offsetNs: assertFinite(x0, 'offsetNs'),
    offsetSigmaNs,
    fractionalFrequency: degree > 0 ? assertFinite(yNsPerS * nsToFraction, 'fractionalFrequency') : null,
    fractionalFrequencySigma: s1 === null ? null : s1 * nsToFraction,
    driftPerDay: degree > 1 ? assertFinite(dNsPerS2 * nsToFraction * SECONDS_PER_DAY, 'driftPerDay') : null,
    driftPerDaySigma: s2 === null ? null : s2 * nsToFraction * SECONDS_PER_DAY,
    correlation,
    rmsNs,
    used: n,
    rejected,
    stability,
    stabilityNote: note,
    sigmaSource: withSigma ? 'given' : 'scaled by reduced chi-square',
    reducedChiSquare,
    periodicRemoved: periodic !== undefined,
    clipSigma: clipOn ? clip : null,
    iterations,
    spanS: usedTimes[usedTimes.length - 1] - usedTimes[0],
    rejectedFraction: rejected.length / rows.length,
    clipStopped: clipStoppedAt !== null,
    warnings,
    steps: steps.map(({ timeS, index: _index, ...rest }) => ({ ...rest, time: formatTime(timeS) })),
    rawStability,
    noiseModel: noise.estimate,
    noiseModelNote: noise.reason,
    segmentJumps: [],
    predictionBand: noise.estimate === null ? null : bandSeries(noise.estimate, [offsetSigmaNs, s1 === null ? null : s1 * nsToFraction, s2 === null ? null : s2 * nsToFraction * SECONDS_PER_DAY], correlation, Math.max(SECONDS_PER_DAY, 4 * usedSpanS)),
    segmentOffsetsNs: sol.params.slice(0, nSeg),
    source: null,
    relativisticMeanFractionalOffset: null,
    hardwareFractionalOffset: null,
    notes: [],
    stabilityAtTaus: atTaus,
  };
}

/** Weighted least squares on the rows `idx`: the scaled, weighted design reduced to R by Givens rotations, then the SVD of R. */
function solve(idx: readonly number[], tS: readonly number[], yNs: readonly number[], sigma: readonly number[], degree: number, seg: readonly number[], nSeg: number): Solution {
  const p = degree + nSeg;
  const n = idx.length;
  let scaleS = 0;
  for (const i of idx) scaleS = Math.max(scaleS, Math.abs(tS[i]));
  if (scaleS === 0) scaleS = 1;
  // The weighted design rows are folded one at a time into R (p × p) and Qᵀb by Givens rotations
  // (Golub & Van Loan, Matrix Computations, 4th ed., §5.2.5 and §5.3.3: QR least squares), so
  // memory is O(p²) whatever the number of rows; A and R share their singular values, and the SVD
  // of R gives the same solution and covariance as the SVD of A.
  const rUp = new Float64Array(p * p);
  const qtb = new Float64Array(p);
  const row = new Float64Array(p);
  for (const i of idx) {
    const u = tS[i] / scaleS;
    const w = 1 / sigma[i];
    row.fill(0);
    row[seg[i]] = w;
    if (degree > 0) row[nSeg] = u * w;
    if (degree > 1) row[nSeg + 1] = ((u * u) / 2) * w;
    let rhs = yNs[i] * w;
    for (let j = 0; j < p; j++) {
      const x = row[j];
      if (x === 0) continue;
      const d = rUp[j * p + j];
      const h = Math.hypot(d, x);
      const c = d / h;
      const sn = x / h;
      for (let k = j; k < p; k++) {
        const rk = rUp[j * p + k];
        const xk = row[k];
        rUp[j * p + k] = c * rk + sn * xk;
        row[k] = -sn * rk + c * xk;
      }
      const b0 = qtb[j];
      qtb[j] = c * b0 + sn * rhs;
      rhs = -sn * b0 + c * rhs;
    }
  }
  const rMatrix = new Matrix(p, p);
  for (let j = 0; j < p; j++) for (let k = 0; k < p; k++) rMatrix.set(j, k, rUp[j * p + k]);
  const svd = new SingularValueDecomposition(rMatrix, { autoTranspose: false });
  const s = svd.diagonal;
  const sMax = Math.max(...s);
  const sMin = Math.min(...s);
  if (!(sMin > sMax / CONDITION_LIMIT) || n < p) {
    throw new InputError(
      `the ${n} measurement times cannot separate ${p} parameters`,
      'measurements',
      'spread the measurements over more distinct times, or lower --degree',
    );
  }
  const v = svd.rightSingularVectors;
  const uR = svd.leftSingularVectors;
  // x = V S⁻¹ U_Rᵀ (Qᵀb), Cov = V S⁻² Vᵀ (scaled units).
  const utb = new Array<number>(p).fill(0);
  for (let j = 0; j < p; j++) {
    let acc = 0;
    for (let k = 0; k < p; k++) acc += uR.get(k, j) * qtb[k];
    utb[j] = acc / s[j];
  }
  const scaledParams = new Array<number>(p).fill(0);
  for (let q = 0; q < p; q++) for (let j = 0; j < p; j++) scaledParams[q] += v.get(q, j) * utb[j];
  const unit = [...new Array<number>(nSeg).fill(1), 1 / scaleS, 1 / (scaleS * scaleS)];
  const params = scaledParams.map((x, r) => x * unit[r]);
  const cov: number[][] = [];
  for (let r = 0; r < p; r++) {
    cov.push([]);
    for (let c = 0; c < p; c++) {
      let acc = 0;
      for (let j = 0; j < p; j++) acc += (v.get(r, j) * v.get(c, j)) / (s[j] * s[j]);
      cov[r].push(acc * unit[r] * unit[c]);
    }
  }
  const residualNs: number[] = [];
  let chiSquare = 0;
  idx.forEach((i) => {
    const t = tS[i];
    const m = params[seg[i]] + (degree > 0 ? params[nSeg] * t : 0) + (degree > 1 ? (params[nSeg + 1] * t * t) / 2 : 0);
    const r = yNs[i] - m;
    residualNs.push(r);
    chiSquare += (r / sigma[i]) ** 2;
  });
  if (!Number.isFinite(chiSquare)) throw new InternalError('least-squares residuals are not finite', 'chiSquare');
  return { params, cov, residualNs, chiSquare };
}

/**
 * Octave stability table of the residual phase (ns → s). Needs the rows, before clipping, to be
 * evenly spaced. A rejected row inside the series is filled by linear interpolation of its used
 * neighbours' residuals (so one outlier does not void the table); rejected rows at either end
 * are dropped. The note says when that happened.
 */
function residualStability(
  rows: readonly FitInputRow[],
  usedIdx: readonly number[],
  usedResidualNs: readonly number[],
  relTol: number,
  tausS: readonly number[],
): { stability: { tauS: number; oadev: number; mdev: number; count: number }[]; note: string | null; atTaus: { tauS: number; oadev: number | null }[] } {
  const tau0S = evenSpacingS(
    rows.map((r) => r.ttJ2000S),
    relTol,
  );
  if (tau0S === null) return { stability: [], note: 'no stability table: the samples are not evenly spaced', atTaus: tausS.map((tauS) => ({ tauS, oadev: null })) };
  const first = usedIdx[0];
  const last = usedIdx[usedIdx.length - 1];
  const residualByRow = new Map<number, number>();
  usedIdx.forEach((i, k) => residualByRow.set(i, usedResidualNs[k]));
  const x: number[] = [];
  let filled = 0;
  let prevUsed = first;
  for (let i = first; i <= last; i++) {
    const r = residualByRow.get(i);
    if (r !== undefined) {
      x.push(r * 1e-9);
      prevUsed = i;
      continue;
    }
    let nextUsed = i + 1;
    while (!residualByRow.has(nextUsed)) nextUsed++; // ends at `last`, which is used
    const a = residualByRow.get(prevUsed) as number;
    const b = residualByRow.get(nextUsed) as number;
    x.push((a + ((b - a) * (i - prevUsed)) / (nextUsed - prevUsed)) * 1e-9);
    filled++;
  }
  const dropped = rows.length - (last - first + 1);
  const atTaus = tausS.map((tauS) => {
    const m = Math.max(1, Math.round(tauS / tau0S));
    const o = overlappingAdev(x, tau0S, m);
    return { tauS: o.tauS, oadev: o.deviation };
  });
  const factors = octaveFactors(x.length);
  if (factors.length === 0) return { stability: [], note: 'no stability table: fewer than 3 evenly spaced samples', atTaus };
  const stability = factors.map((m) => {
    const o = overlappingAdev(x, tau0S, m);
    const d = modifiedAdev(x, tau0S, m);
    if (o.deviation === null || d.deviation === null) throw new InternalError(`stability undefined at m = ${m}`, 'stability');
    return { tauS: o.tauS, oadev: o.deviation, mdev: d.deviation, count: o.count };
  });
  const parts: string[] = [];
  if (filled > 0) parts.push(`${filled} rejected row(s) inside the series filled by linear interpolation of the neighbouring residuals`);
  if (dropped > 0) parts.push(`${dropped} rejected row(s) at the ends left out`);
  return { stability, note: parts.length === 0 ? null : parts.join('; '), atTaus };
}
