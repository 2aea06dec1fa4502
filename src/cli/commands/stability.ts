/** `tauplan stability FILE [--tau0 1s] [--data phase|frequency] [--sat ID]`. */
import type { Argv } from 'yargs';
import { InputError } from '../../errors.ts';
import { parseMeasurementsCsv } from '../../io/measurements.ts';
import { readInputText } from '../../io/textSource.ts';
import { looksLikeMeasurementCsv, parseSingleColumn } from '../../io/stabilityInput.ts';
import { frequencyStability, type StabilityDataType, type StabilityRecord } from '../../api/stability.ts';
import { page } from '../../report/htmlReport.ts';
import { stabilitySection, stabilityToCsv, stabilityToJson, stabilityToText } from '../../report/stabilityReport.ts';
import { parsePositiveDurationS } from '../../time/duration.ts';
import type { TimeSystem } from '../../time/timeSystem.ts';
import type { Rendered } from '../emit.ts';

export function stabilityOptions<T>(y: Argv<T>) {
  return y
    .positional('file', { type: 'string', demandOption: true, describe: 'one numeric column (# comments, gzip ok) or a time,offsetNs CSV' })
    .option('tau0', { type: 'string', requiresArg: true, describe: 'sample spacing of a one-column file, e.g. 1s (time-stamped files carry their own)' })
    .option('data', { type: 'string', requiresArg: true, default: 'phase', describe: 'phase (seconds) | frequency (fractional)' })
    .option('taus', { type: 'string', requiresArg: true, default: 'octave', describe: 'averaging times: octave | decade | all' })
    .option('sat', { type: 'string', requiresArg: true, describe: 'satellite in a multi-satellite clock file' });
}

export interface StabilityArgs {
  file: string;
  tau0?: string;
  data: string;
  taus: string;
  sat?: string;
}

export function computeStability(a: StabilityArgs, ts: TimeSystem) {
  if (a.data !== 'phase' && a.data !== 'frequency') throw new InputError(`--data ${JSON.stringify(a.data)}`, '--data', 'use phase or frequency');
  if (a.taus !== 'octave' && a.taus !== 'decade' && a.taus !== 'all') throw new InputError(`--taus ${JSON.stringify(a.taus)}`, '--taus', 'use octave, decade or all');
  const tau0S = a.tau0 === undefined ? null : parsePositiveDurationS(a.tau0, '--tau0');
  const text = readInputText(a.file, 'stability FILE', 'measurements');
  let record: StabilityRecord;
  if (looksLikeMeasurementCsv(text)) {
    if (a.sat !== undefined) throw new InputError('--sat with a single-clock CSV', '--sat', 'leave --sat out: the CSV holds one clock');
    const m = parseMeasurementsCsv(text, a.file, ts);
    // Offsets in ns are phase; frequency data need a one-column file.
    if (a.data !== 'phase') throw new InputError('--data frequency with a time,offsetNs CSV', '--data', 'offsets are phase: leave --data out');
    record = {
      values: m.rows.map((r) => r.offsetNs * 1e-9),
      dataType: 'phase',
      tau0S,
      timesS: m.rows.map((r) => r.ttJ2000S),
      lines: m.rows.map((r) => r.line),
      nanCount: 0,
      source: a.file,
      tauSet: a.taus,
    };
  } else {
    if (a.sat !== undefined) throw new InputError('--sat with a one-column file', '--sat', 'leave --sat out: the file holds one clock');
    const col = parseSingleColumn(text, a.file);
    record = { values: col.values, dataType: a.data as StabilityDataType, tau0S, timesS: null, lines: Array.from(col.lines), nanCount: col.nanCount, source: a.file, tauSet: a.taus };
  }
  return frequencyStability(record);
}

export function runStability(a: StabilityArgs, ts: TimeSystem): Rendered {
  const r = computeStability(a, ts);
  return {
    json: () => stabilityToJson(r),
    csv: () => stabilityToCsv(r),
    text: () => stabilityToText(r),
    html: () => page('tauplan — frequency stability', a.file, [{ label: 'τ0', value: `${r.tau0S} s` }, { label: 'samples', value: `${r.points} (${r.missing} missing)` }], [stabilitySection(r)]),
  };
}
