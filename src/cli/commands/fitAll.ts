/**
 * `tauplan fit FILE --all`: every clock of the file fitted (worker threads for more than a few),
 * one survey row each, in file order: rate, relativistic part, hardware part, drift, rms, skipped
 * samples and the residuals' stability at 1000 s and 1 d where the data reach. A clock that cannot
 * be fitted is a row with its reason; the run goes on.
 */
import { InputError } from '../../errors.ts';
import { readClockFile } from '../../io/clockFormats.ts';
import { toJsonText, writeFileAtomic } from '../../io/output.ts';
import { failedSurveyRow, fitSurveyOne, type FitSurveyOptions, type FitSurveyRow } from '../../api/fitFile.ts';
import type { MeasurementSeries } from '../../model/measurements.ts';
import { surveyToCsv, surveyToHtml, surveyToJson, surveyToJsonl, surveyToText, type SurveyMeta } from '../../report/fitAllReport.ts';
import type { TimeSystem } from '../../time/timeSystem.ts';
import { checkJobs, jobsFor, runPool } from '../workers.ts';
import type { FitWorkerTask } from '../fitWorker.ts';
import { clockFileOptions, maxRowsOption, type FitArgs } from './fit.ts';

/** The plain-data arguments a worker needs. */
export type FitSurveyArgs = FitSurveyOptions;

/** Series shorter than this are fitted in process: a worker's start-up costs more than the fit. */
const MIN_SERIES_FOR_WORKERS = 4;

function failure(e: unknown): string {
  if (e instanceof InputError) return `${e.what} (${e.where})`;
  throw e;
}

/** `fit FILE --all`. */
export async function runFitAll(a: FitArgs & { format: string; out?: string; jobs?: number; quiet?: boolean }, ts: TimeSystem): Promise<void> {
  if (a.updateScenario !== undefined) throw new InputError('--update-scenario writes one clock', '--update-scenario', 'leave out --all, and name the clock with --sat');
  if (a.sat !== undefined) throw new InputError('--sat and --all given together', '--sat', 'leave out --sat to survey every clock, or --all to fit one');
  checkJobs(a.jobs);
  const file = await readClockFile(a.measurements, { ...clockFileOptions(a, ts, null), ...maxRowsOption() });
  const args: FitSurveyArgs = {
    measurements: a.measurements,
    fileFormat: file.format,
    degree: a.degree,
    clip: a.clip,
    ...(a.orbit === undefined ? {} : { orbit: a.orbit }),
    ...(a.scenario === undefined ? {} : { scenario: a.scenario }),
    ...(a.gravity === undefined ? {} : { gravity: a.gravity }),
    ...(a.periodic === undefined ? {} : { periodic: a.periodic }),
    ...(a.epoch === undefined ? {} : { epoch: a.epoch }),
  };
  const series = file.clocks.map((c) => file.series.get(c)).filter((s): s is MeasurementSeries => s !== undefined);
  if (series.length === 0) throw new InputError(`${file.fileName} holds no clock`, 'measurements', 'give a file with clock records');
  const jobs = jobsFor(a.jobs, series.length, ['clock', 'clocks'], a.quiet === true);
  let rows: FitSurveyRow[];
  if (jobs <= 1 || series.length < MIN_SERIES_FOR_WORKERS) {
    rows = series.map((s) => {
      try {
        return fitSurveyOne(s, args, ts);
      } catch (e) {
        return failedSurveyRow(s, failure(e));
      }
    });
  } else {
    rows = await runPool<FitWorkerTask, FitSurveyRow>('fitWorker', null, series.map((s) => ({ args, series: s })), jobs);
  }
  if (a.quiet !== true) {
    for (const r of rows) if (r.error !== null) process.stderr.write(`tauplan: ${r.satellite} not fitted: ${r.error}\n`);
  }
  const meta: SurveyMeta = { file: file.fileName, format: file.format, notes: file.notes, orbit: args.orbit ?? (file.format === 'sp3' ? 'the SP3 file itself' : null), degree: a.degree };
  let body: string;
  switch (a.format) {
    case 'csv':
      body = surveyToCsv(rows, meta);
      break;
    case 'jsonl':
      body = surveyToJsonl(rows);
      break;
    case 'json':
      body = toJsonText(surveyToJson(rows, meta));
      break;
    case 'html':
      body = surveyToHtml(rows, meta);
      break;
    default:
      body = surveyToText(rows, meta);
  }
  if (a.out === undefined) process.stdout.write(body);
  else writeFileAtomic(a.out, body);
}
