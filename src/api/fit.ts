/** Library use case: fitting offset, frequency and drift to measured clock offsets (command `fit`). */
import { InputError } from '../errors.ts';
import { parseMeasurementsCsv, type MeasurementRow, type Measurements } from '../io/measurements.ts';
import type { ScenarioSpec } from '../model/scenario.ts';
import { fitClock as fitRows, type FitResult } from '../plan/fit.ts';
import { relativityForFit, type FitRelativity } from '../plan/fitRelativity.ts';
import { prepareSatelliteClock } from '../plan/satelliteClock.ts';
import { checkWindowInSpan, scenarioGravity } from '../plan/scenarioRuns.ts';
import { scenarioSatellite } from '../io/loadScenario.ts';
import { fitToJson, type FitJson } from '../report/fitReport.ts';
import { timeArg, timeSystemOf, type CommonOptions, type TimeInput } from './common.ts';
import { resolveOrbit } from './scenario.ts';

/** One measured offset given as data rather than CSV text. */
export interface MeasurementInput {
  /** Time of the measurement. */
  time: TimeInput;
  /** Onboard clock reading minus the reference scale [ns]. */
  offsetNs: number;
  /** 1-σ uncertainty [ns]; give it on every row or on none. */
  sigmaNs?: number | null;
}

/** Options of {@link fitClock}: the `fit` flags in camelCase. */
export interface FitClockOptions extends CommonOptions {
  /** 0 offset, 1 + frequency, 2 + drift (default 2). */
  degree?: 0 | 1 | 2;
  /** Scenario whose satellite orbit gives the relativistic periodic term to remove. */
  scenario?: ScenarioSpec;
  /** Satellite id in `scenario`. */
  sat?: string;
  /** Sigma-clipping threshold (default 4; 0 disables). */
  clip?: number;
  /** Epoch the parameters refer to (default: the first sample). */
  epoch?: TimeInput;
  /** Name of the measurements in messages (default `measurements`). */
  sourceName?: string;
}

/** A fit and the mean relativistic rate that was removed with the periodic term (0 without a scenario). */
export interface FitRun {
  result: FitResult;
  /** Mean relativistic fractional frequency of the satellite over the measurements [1]. */
  meanRelativistic: number;
}

/** Measurements: CSV text (`time,offsetNs[,sigmaNs]`), rows as data, or a file already parsed by the CSV reader. */
export type MeasurementsInput = string | readonly MeasurementInput[] | Measurements;

function measurementRows(measurements: MeasurementsInput, options: FitClockOptions | undefined): MeasurementRow[] {
  const ts = timeSystemOf(options);
  const name = options?.sourceName ?? 'measurements';
  if (typeof measurements === 'string') return parseMeasurementsCsv(measurements, name, ts).rows;
  if (!Array.isArray(measurements)) return (measurements as Measurements).rows;
  return (measurements as readonly MeasurementInput[]).map((m, i) => ({
    line: i + 1,
    ttJ2000S: timeArg(ts, m.time, `${name}[${i}].time`) as number,
    timeText: typeof m.time === 'string' ? m.time : ts.format(m.time),
    offsetNs: m.offsetNs,
    sigmaNs: m.sigmaNs ?? null,
  }));
}

/** The relativity of `sat` in `scenario` over the measurement times. */
function scenarioRelativity(scenario: ScenarioSpec, sat: string | undefined, rows: readonly MeasurementRow[], options: FitClockOptions | undefined): FitRelativity {
  const ts = timeSystemOf(options);
  const gravity = scenarioGravity(scenario, ts, scenario.fileName);
  const satellite = scenarioSatellite(scenario, sat);
  const first = rows[0].ttJ2000S;
  const last = rows[rows.length - 1].ttJ2000S;
  const to = Math.max(last, first + 60);
  const resolved = resolveOrbit(satellite, scenario, ts, gravity, { fromTtJ2000S: first, toTtJ2000S: to });
  checkWindowInSpan(resolved.trajectory, first, last, ts, `${scenario.fileName} ${satellite.path}`, `use measurements inside the orbit source span, or a scenario whose orbit covers ${options?.sourceName ?? 'the measurements'}`);
  const run = prepareSatelliteClock(satellite.id, resolved.name, resolved.trajectory, gravity, null, first, to);
  return relativityForFit(run, rows.map((r) => r.ttJ2000S));
}

/** Fit the measurements (the writers' input; {@link fitClock} gives the JSON). */
export function runFit(measurements: MeasurementsInput, options?: FitClockOptions): FitRun {
  const degree = options?.degree ?? 2;
  const clip = options?.clip ?? 4;
  if (degree !== 0 && degree !== 1 && degree !== 2) throw new InputError(`degree ${String(degree)} is not 0, 1 or 2`, '--degree', 'use 0, 1 or 2');
  if (!(clip >= 0)) throw new InputError(`--clip ${clip} is negative`, '--clip', 'give a threshold ≥ 0 (0 disables clipping)');
  if (options?.sat !== undefined && options.scenario === undefined) throw new InputError('--sat without --scenario', '--sat', 'give --scenario FILE too');
  const ts = timeSystemOf(options);
  const rows = measurementRows(measurements, options);
  const relativity = options?.scenario === undefined ? null : scenarioRelativity(options.scenario, options.sat, rows, options);
  const epoch = timeArg(ts, options?.epoch, '--epoch');
  const result = fitRows(rows, {
    degree,
    timeSystem: ts,
    clipSigma: clip,
    sourceName: options?.sourceName ?? 'measurements',
    ...(epoch === null ? {} : { epochTtJ2000S: epoch }),
    ...(relativity === null ? {} : { periodicNs: relativity.periodicNs }),
  });
  return { result, meanRelativistic: relativity?.meanFractionalOffset ?? 0 };
}

/**
 * Least-squares offset [ns], fractional frequency [1] and drift [1/day] with their 1-σ, the RMS
 * residual [ns], the rows rejected by sigma clipping and the stability table (overlapping and
 * modified Allan deviation at octave τ [s]): the object `tauplan fit --format json` prints.
 * `measurements` is the CSV text (`time,offsetNs[,sigmaNs]`) or the rows as data.
 */
export function fitClock(measurements: MeasurementsInput, options?: FitClockOptions): FitJson {
  return fitToJson(runFit(measurements, options).result);
}
