/**
 * Writers for the result of `tauplan fit` ({@link FitResult} from src/plan/fit.ts): JSON object,
 * CSV and a plain-text worksheet. Pure string building; the CLI does the writing.
 */
import { lazyPackage } from '../lazyPackage.ts';
import { InternalError } from '../errors.ts';
import type { FitResult } from '../plan/fit.ts';
import type { TimeSystem } from '../time/timeSystem.ts';
import { Instant } from '../time/instant.ts';
import { textTable } from './format.ts';
import type { DeviationInterval } from '../plan/stability.ts';
import { noiseTypeName } from './stabilityReport.ts';

const csvStringify = lazyPackage<typeof import('csv-stringify/sync')>('csv-stringify/sync');

/** JSON shape of `tauplan fit`: the fit result without its internal time coordinate. */
export type FitJson = Omit<FitResult, 'epochTtJ2000S' | 'stabilityAtTaus'>;

/**
 * The JSON-ready object of a fit: every number finite (checked; a non-finite value is a bug and
 * throws InternalError), unknown values as null. Serialise with `JSON.stringify`.
 */
export function fitToJson(result: FitResult): FitJson {
  const json: FitJson = {
    epoch: result.epoch,
    offsetNs: result.offsetNs,
    offsetSigmaNs: result.offsetSigmaNs,
    fractionalFrequency: result.fractionalFrequency,
    fractionalFrequencySigma: result.fractionalFrequencySigma,
    driftPerDay: result.driftPerDay,
    driftPerDaySigma: result.driftPerDaySigma,
    rmsNs: result.rmsNs,
    used: result.used,
    rejected: result.rejected.map((r) => ({ line: r.line, time: r.time, offsetNs: r.offsetNs, residualNs: r.residualNs })),
    stability: result.stability,
    rawStability: result.rawStability,
    rejectedFraction: result.rejectedFraction,
    clipStopped: result.clipStopped,
    warnings: result.warnings,
    steps: result.steps,
    noiseModel: result.noiseModel,
    noiseModelNote: result.noiseModelNote,
    predictionBand: result.predictionBand,
    segmentJumps: result.segmentJumps,
    degree: result.degree,
    stabilityNote: result.stabilityNote,
    sigmaSource: result.sigmaSource,
    reducedChiSquare: result.reducedChiSquare,
    periodicRemoved: result.periodicRemoved,
    clipSigma: result.clipSigma,
    iterations: result.iterations,
    spanS: result.spanS,
    correlation: result.correlation,
    segmentOffsetsNs: result.segmentOffsetsNs,
    source: result.source,
    relativisticMeanFractionalOffset: result.relativisticMeanFractionalOffset,
    hardwareFractionalOffset: result.hardwareFractionalOffset,
    notes: result.notes,
  };
  requireFinite(json, '$');
  return json;
}

/** CSV columns of {@link fitToCsv}, in order. */
export const FIT_CSV_COLUMNS = [
  'epoch',
  'degree',
  'offsetNs',
  'offsetSigmaNs',
  'fractionalFrequency',
  'fractionalFrequencySigma',
  'driftPerDay',
  'driftPerDaySigma',
  'rmsNs',
  'used',
  'rejected',
  'sigmaSource',
  'reducedChiSquare',
  'periodicRemoved',
  'rejectedFraction',
  'clipStopped',
  'satellite',
  'format',
  'periodicTerm',
  'relativisticMeanFractionalOffset',
  'hardwareFractionalOffset',
] as const;

/**
 * CSV of a fit: one header line ({@link FIT_CSV_COLUMNS}) and one row of parameters, so fits of
 * many files concatenate into one table. `rejected` is the count of rejected rows (their lines are
 * in the JSON and text outputs); null values are empty fields. Numbers are full precision.
 */
export function fitToCsv(result: FitResult): string {
  const j = fitToJson(result);
  const row: (string | number | boolean | null)[] = [
    j.epoch,
    j.degree,
    j.offsetNs,
    j.offsetSigmaNs,
    j.fractionalFrequency,
    j.fractionalFrequencySigma,
    j.driftPerDay,
    j.driftPerDaySigma,
    j.rmsNs,
    j.used,
    j.rejected.length,
    j.sigmaSource,
    j.reducedChiSquare,
    j.periodicRemoved,
    j.rejectedFraction,
    j.clipStopped,
    j.source?.satellite ?? null,
    j.source?.format ?? null,
    j.source?.periodicTerm ?? null,
    j.relativisticMeanFractionalOffset,
    j.hardwareFractionalOffset,
  ];
  const warnings = j.warnings.map((w) => `# WARNING: ${w}\n`).join('');
  const notes = j.notes.map((n) => `# ${n}\n`).join('');
  return warnings + notes + csvStringify().stringify([[...FIT_CSV_COLUMNS], row.map((v) => (v === null ? '' : String(v)))]);
}

/**
 * Engineer's worksheet: parameters with units and ±1σ, where the sigmas come from, the rejected
 * rows, and the stability table of the residuals.
 * @param timeSystem used to show the epoch also in GPS time
 */
export function fitToText(result: FitResult, timeSystem: TimeSystem): string {
  const j = fitToJson(result);
  const pm = (v: number | null, s: number | null, fmt: (x: number) => string, unit: string): string =>
    v === null ? 'not fitted' : `${fmt(v)} ± ${s === null ? '(unknown)' : fmt(s)}${unit}`;
  const e = (x: number): string => x.toExponential(4);
  const ns = (x: number): string => x.toFixed(3);
  const epochGps = timeSystem.format(Instant.fromTtJ2000S(result.epochTtJ2000S), 'GPS');
  const out: string[] = [];
  for (const w of j.warnings) out.push(`WARNING: ${w}`);
  if (j.warnings.length > 0) out.push('');
  out.push(`Clock fit, degree ${j.degree} (${['offset', 'offset + frequency', 'offset + frequency + drift'][j.degree]})`);
  out.push(`Model: offset(t) = x0 + y·t + D·t²/2, t from the epoch; y > 0 means the clock runs fast.`);
  if (j.source !== null) {
    const src = j.source;
    out.push(`Source: ${src.format}, clock ${src.satellite}, ${src.samples} samples${src.skipped > 0 ? `, ${src.skipped} absent or bad skipped` : ''}${src.segments > 1 ? `, ${src.segments} segments (one offset each)` : ''}, times in ${src.timeScale}`);
    out.push(`Periodic term −2r·v/c²: ${src.periodicTerm} in the data`);
  }
  out.push('');
  out.push(`  epoch                  ${j.epoch}  (${epochGps})`);
  out.push(`  offset x0              ${pm(j.offsetNs, j.offsetSigmaNs, ns, ' ns')}`);
  out.push(`  fractional frequency y ${pm(j.fractionalFrequency, j.fractionalFrequencySigma, e, '')}`);
  if (j.fractionalFrequency !== null) out.push(`    = ${(j.fractionalFrequency * 86400e9).toFixed(3)} ns/day`);
  out.push(`  drift D                ${pm(j.driftPerDay, j.driftPerDaySigma, e, ' per day')}`);
  if (j.source?.statedDrift != null) out.push(`  drift stated in file   ${e(j.source.statedDrift)} (mean CLOCK_DRIFT, s/s), beside the fitted y`);
  out.push('  (± values are 1σ)');
  if (j.relativisticMeanFractionalOffset !== null && j.hardwareFractionalOffset !== null) {
    const rel = j.relativisticMeanFractionalOffset;
    const hw = j.hardwareFractionalOffset;
    const gap = hw + rel;
    out.push('');
    out.push('Relativity and hardware (y = relativistic mean rate + hardware offset):');
    out.push(`  relativistic mean rate ${e(rel)}  (${(rel * 86400e9).toFixed(3)} ns/day), along the orbit over the fitted span`);
    out.push(`  hardware offset        ${e(hw)}  (${(hw * 86400e9).toFixed(3)} ns/day)`);
    out.push(`  hardware + relativity  ${(gap * 1e13).toFixed(3)} parts in 1e13 (${(gap * 86400e9).toFixed(3)} ns/day): how far the`);
    out.push('                         oscillator is from exactly cancelling the relativistic rate');
  }
  out.push('');
  out.push(`  rows used              ${j.used}, spanning ${(j.spanS / 86400).toFixed(4)} d`);
  out.push(`  rms residual           ${ns(j.rmsNs)} ns`);
  const chi = j.reducedChiSquare === null ? 'undefined (as many rows as parameters)' : j.reducedChiSquare.toPrecision(4);
  if (j.sigmaSource === 'given') {
    out.push(`  sigmas                 from the sigmaNs column; reduced χ² = ${chi} (≈ 1 if the sigmas are right)`);
  } else {
    out.push(`  sigmas                 no sigmaNs column: unit weights, covariance scaled by the reduced χ²`);
    out.push(`                         (= residual variance ${chi} ns²)`);
  }
  if (j.periodicRemoved) {
    out.push('  periodic term          the relativistic periodic term along the orbit was removed before fitting,');
    out.push('                         so y is the hardware offset plus the mean relativistic offset');
  }
  out.push(`  clipping               ${j.clipSigma === null ? 'off' : `${j.clipSigma}σ, ${j.iterations} pass(es)${j.clipStopped ? ', stopped at the 10 % limit' : ''}`}`);
  out.push(`  rejected fraction      ${(j.rejectedFraction * 100).toFixed(1)} % (${j.rejected.length} of ${j.used + j.rejected.length} rows)`);
  if (j.noiseModel !== null) {
    const nm = j.noiseModel;
    const lv = (v: number, sd: number | null): string => `${v.toExponential(3)}${sd === null ? '' : ` ± ${sd.toExponential(2)}`}`;
    out.push(`  noise model            white FM ${lv(nm.whiteFmAdev1s, nm.whiteFmAdev1sSigma)} at 1 s, flicker floor ${lv(nm.flickerFmFloor, nm.flickerFmFloorSigma)},`);
    out.push(`                         random-walk FM ${lv(nm.randomWalkFmAdev1d, nm.randomWalkFmAdev1dSigma)} at 1 d (${nm.method})`);
  } else {
    out.push(`  noise model            none: ${j.noiseModelNote ?? 'no stability table'}`);
  }
  for (const sj of j.segmentJumps) out.push(`  phase jump removed     ${sj.sizeNs.toFixed(3)} ± ${sj.sizeSigmaNs.toFixed(3)} ns from line ${sj.line} (${sj.time}) on (--segments auto; parameter 1σ leave out its uncertainty)`);
  if (j.steps.length > 0) {
    out.push('');
    out.push(`Steps in the residuals (${j.steps.length}; windowed test on the sample-to-sample frequency):`);
    out.push(
      indent(
        textTable(
          ['kind', 'line', 'time (UTC)', 'size', 'sigmas'],
          j.steps.map((st) => [st.kind, String(st.line), st.time, st.sizeNs !== null ? `${st.sizeNs.toFixed(3)} ns` : (st.fractionalStep as number).toExponential(3), st.sigmas.toFixed(1)]),
          [false, true, false, true, true],
        ),
      ),
    );
  }
  if (j.segmentOffsetsNs.length > 1) out.push(`  segment offsets        ${j.segmentOffsetsNs.map((x) => ns(x)).join(', ')} ns`);
  if (j.notes.length > 0) {
    out.push('');
    out.push('Notes:');
    for (const n of j.notes) out.push(`  - ${n}`);
  }
  out.push('');
  if (j.rejected.length === 0) {
    out.push('Rejected rows: none');
  } else {
    out.push(`Rejected rows (${j.rejected.length}):`);
    out.push(
      indent(
        textTable(
          ['line', 'time (UTC)', 'offsetNs', 'residualNs'],
          j.rejected.map((r) => [String(r.line), r.time, r.offsetNs.toFixed(3), r.residualNs.toFixed(3)]),
        ),
      ),
    );
  }
  out.push('');
  if (j.stability.length === 0) {
    out.push(`Stability: ${j.stabilityNote ?? 'none'}`);
  } else {
    out.push('Stability of the fit residuals (NIST SP 1065; noise type by lag-1 autocorrelation; [68 % interval]):');
    out.push(indent(fitStabilityText(j.stability)));
    if (j.rawStability.length > 0) {
      out.push('Stability of the raw phase (offsets with only the periodic term removed):');
      out.push(indent(fitStabilityText(j.rawStability)));
    }
    out.push('  The fitted polynomial is removed first, which lowers the values at long tau.');
    if (j.stabilityNote !== null) out.push(`  Note: ${j.stabilityNote}.`);
  }
  return `${out.join('\n')}\n`;
}

function fitStabilityText(rows: FitResult['stability']): string {
  const ci = (v: DeviationInterval | null): string => (v === null ? '—' : `${v.value.toExponential(3)} [${v.ci68[0].toExponential(2)}, ${v.ci68[1].toExponential(2)}]`);
  return textTable(
    ['tau [s]', 'noise', 'OADEV', 'MDEV', 'TDEV [s]', 'OHDEV', 'terms'],
    rows.map((s) => [formatTau(s.tauS), noiseTypeName(s.alpha), ci(s.oadevInterval), ci(s.mdevInterval), ci(s.tdevS), ci(s.ohdev), String(s.count)]),
  );
}

function formatTau(tauS: number): string {
  return Number.isInteger(tauS) ? String(tauS) : tauS.toPrecision(6);
}

function indent(text: string): string {
  return text
    .split('\n')
    .map((l) => `  ${l}`)
    .join('\n');
}

function requireFinite(value: unknown, path: string): void {
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) throw new InternalError(`non-finite number ${value} at ${path} in the fit output`, path);
  } else if (Array.isArray(value)) {
    value.forEach((v, i) => requireFinite(v, `${path}[${i}]`));
  } else if (value !== null && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) requireFinite(v, `${path}.${k}`);
  }
}
