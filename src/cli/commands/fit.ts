/**
 * `tauplan fit FILE`: a measured clock (CSV, RINEX clock, SP3 clock column, CCSDS TDM; gzip or
 * not) fitted with offset, rate and drift, and, given an orbit, its rate split into relativity and
 * hardware. `--all` surveys every clock of the file (src/cli/commands/fitAll.ts).
 */
import type { Argv } from 'yargs';
import { InputError } from '../../errors.ts';
import { checkFitOptions, clockFileOptions, fitFromFile, type FitResult } from '../../api/fitFile.ts';
import { MEASUREMENT_FORMATS, readClockFile, readClockText } from '../../io/clockFormats.ts';
import { readTextWhole } from '../../io/textSource.ts';
import { updateScenarioClock } from '../../io/updateScenario.ts';
import type { MeasurementFormat } from '../../model/measurements.ts';
import { fitToCsv, fitToJson, fitToText } from '../../report/fitReport.ts';
import { fitSection, page } from '../../report/htmlReport.ts';
import { TIME_SCALES, type TimeScale } from '../../time/instant.ts';
import type { TimeSystem } from '../../time/timeSystem.ts';
import type { Rendered } from '../emit.ts';

export function fitOptions<T>(y: Argv<T>) {
  return y
    .positional('measurements', { type: 'string', demandOption: true, describe: 'clock measurements: CSV (time,offsetNs[,sigmaNs]), RINEX clock, SP3 or CCSDS TDM (KVN); gzip or not; - for stdin' })
    .option('format', { type: 'string', requiresArg: true, choices: ['text', 'json', 'csv', 'html', 'jsonl'], default: 'text', describe: 'output format (jsonl with --all)' })
    .option('input-format', { type: 'string', requiresArg: true, choices: MEASUREMENT_FORMATS as MeasurementFormat[], describe: 'read the file as this format instead of recognising it' })
    .option('sat', { type: 'string', requiresArg: true, describe: 'clock to fit (satellite such as E14, or a station for RINEX AR records); for a CSV, the satellite in --orbit/--scenario' })
    .option('all', { type: 'boolean', default: false, describe: 'fit every clock in the file, one row each' })
    .option('jobs', { type: 'number', requiresArg: true, describe: 'worker threads for --all (default: available cores)' })
    .option('orbit', { type: 'string', requiresArg: true, describe: 'orbit of the clock: SP3, TLE/3LE, OMM or scenario file (an SP3 input is its own orbit)' })
    .option('scenario', { type: 'string', requiresArg: true, describe: 'scenario whose satellite orbit gives the relativistic terms (same as --orbit SCENARIO)' })
    .option('gravity', { type: 'string', requiresArg: true, choices: ['point', 'j2', 'zonal'], describe: 'gravity model of the clock rate for non-scenario orbits (default zonal)' })
    .option('periodic', { type: 'string', requiresArg: true, choices: ['included', 'excluded'], describe: 'whether the data contain the periodic term −2r·v/c² (default: the source convention)' })
    .option('time-scale', { type: 'string', requiresArg: true, choices: TIME_SCALES as TimeScale[], describe: 'scale of CSV times written without Z or a scale name' })
    .option('degree', { type: 'number', requiresArg: true, default: 2, describe: '0 offset, 1 + frequency, 2 + drift' })
    .option('clip', { type: 'number', requiresArg: true, default: 4, describe: 'sigma-clipping threshold (0 disables); never removes more than 10 % of the rows' })
    .option('segments', { type: 'string', requiresArg: true, default: 'none', describe: 'none | auto: fit and remove the phase jumps found in the residuals' })
    .option('epoch', { type: 'string', requiresArg: true, describe: 'epoch the parameters refer to (default: first sample)' })
    .option('update-scenario', { type: 'string', requiresArg: true, describe: 'write the fitted clock block of --sat into this scenario file (atomically)' });
}

export { clockFileOptions, fitFromFile };

export interface FitArgs {
  measurements: string;
  degree: number;
  scenario?: string;
  orbit?: string;
  sat?: string;
  clip: number;
  epoch?: string;
  updateScenario?: string;
  inputFormat?: string;
  periodic?: string;
  timeScale?: string;
  gravity?: string;
  segments?: string;
}

function checkArgs(a: FitArgs): void {
  checkFitOptions(a);
}

/** Environment variable that sets the most CSV rows `fit` reads. */
export const MAX_ROWS_ENV = 'TAUPLAN_MAX_ROWS';
/**
 * Default most CSV rows [rows]. Measured: 1 million rows peak at 0.8 GB RSS, 5 million (58 days at
 * 1 Hz) at 2.5 GB, about 0.43 GB per million; 7 million stay below Node's default heap (4.3 GB here).
 */
export const DEFAULT_MAX_ROWS = 7_000_000;

/** The row limit of `fit` ({@link MAX_ROWS_ENV}, else the default) and the way out. */
export function maxRowsOption(): { maxRows: number; maxRowsFix: string } {
  const raw = process.env[MAX_ROWS_ENV];
  let maxRows = DEFAULT_MAX_ROWS;
  if (raw !== undefined && raw.trim() !== '') {
    maxRows = /^\d+$/.test(raw.trim()) ? Number(raw.trim()) : Number.NaN;
    if (!(maxRows >= 1) || !Number.isSafeInteger(maxRows)) throw new InputError(`${MAX_ROWS_ENV}=${JSON.stringify(raw)} is not a whole number of rows`, MAX_ROWS_ENV, 'give a positive whole number, or unset it');
  }
  return {
    maxRows,
    maxRowsFix: `the limit is ${maxRows} rows (${MAX_ROWS_ENV}); thin the file to a coarser interval or fit it in shorter spans, or raise ${MAX_ROWS_ENV} and Node's heap (NODE_OPTIONS=--max-old-space-size=MB)`,
  };
}

/** Fit a file read whole (small files, the demo, library callers). */
export function computeFit(a: FitArgs, ts: TimeSystem): { result: FitResult; meanRelativistic: number } {
  checkArgs(a);
  const wanted = a.sat === undefined ? null : new Set([a.sat]);
  const file = readClockText(readTextWhole(a.measurements, 'measurements', 'measurements'), a.measurements, clockFileOptions(a, ts, wanted));
  const result = fitFromFile(file, a, ts);
  return { result, meanRelativistic: result.relativisticMeanFractionalOffset ?? 0 };
}

/** `tauplan fit FILE` (one clock), streaming the file. */
export async function runFit(a: FitArgs & { format: string }, ts: TimeSystem): Promise<Rendered> {
  checkArgs(a);
  if (a.format === 'jsonl') throw new InputError('jsonl output is for surveys', '--format', 'add --all, or use text, json, csv or html');
  if (a.updateScenario !== undefined && a.sat === undefined) {
    throw new InputError('--update-scenario needs --scenario and --sat (or --orbit and --sat)', '--update-scenario', 'give the orbit and the satellite the measurements belong to');
  }
  const wanted = a.sat === undefined ? null : new Set([a.sat]);
  const file = await readClockFile(a.measurements, { ...clockFileOptions(a, ts, wanted), ...maxRowsOption() });
  const result = fitFromFile(file, a, ts);
  if ((a as { quiet?: boolean }).quiet !== true) for (const w of result.warnings) process.stderr.write(`tauplan: warning: ${w}\n`);
  if (a.updateScenario !== undefined) {
    if (result.fractionalFrequency === null) throw new InputError('a degree-0 fit has no frequency to write', '--degree', 'use --degree 1 or 2 with --update-scenario');
    if (result.hardwareFractionalOffset === null) throw new InputError('no orbit, so no hardware offset to write', '--update-scenario', 'give --orbit or --scenario so the fit can split the rate into relativity and hardware');
    // The scenario's model adds relativity itself, so the hardware offset is what it needs.
    updateScenarioClock(a.updateScenario, a.sat as string, {
      epoch: result.epoch,
      offsetNs: result.offsetNs,
      hardwareFractionalOffset: result.hardwareFractionalOffset,
      ...(result.driftPerDay === null ? {} : { agingPerDay: result.driftPerDay }),
      ...(result.noiseModel === null
        ? {}
        : { noise: { whiteFmAdev1s: result.noiseModel.whiteFmAdev1s, flickerFmFloor: result.noiseModel.flickerFmFloor, randomWalkFmAdev1d: result.noiseModel.randomWalkFmAdev1d } }),
    }, ts);
  }
  return {
    json: () => fitToJson(result),
    csv: () => fitToCsv(result),
    text: () => fitToText(result, ts),
    html: () => page('tauplan — clock fit', a.measurements, [{ label: 'epoch', value: result.epoch }], [fitSection(result)]),
  };
}
