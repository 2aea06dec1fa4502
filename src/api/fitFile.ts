/**
 * Library use case: fitting a measured clock read from a file (CSV, RINEX clock, SP3 clock column,
 * CCSDS TDM), with its orbit from `orbit` (SP3, OEM, TLE/3LE, OMM or scenario) or the SP3 file
 * itself, as `tauplan fit FILE` and `fit FILE --all` do. The caller reads the clock file
 * (src/io/clockFormats.ts); the orbit file is read here (./fitOrbit.ts).
 */
import { InputError } from '../errors.ts';
import type { ClockFile } from '../io/clockReader.ts';
import { pickSeries } from '../io/clockFormats.ts';
import type { MeasurementFormat, MeasurementSeries, PeriodicTerm } from '../model/measurements.ts';
import { fitSeries } from '../plan/clockFit.ts';
import type { FitResult } from '../plan/fit.ts';
import { failedRow, SURVEY_TAUS_S, surveyRow, type FitSurveyRow } from '../plan/fitAll.ts';
import { Instant, type TimeScale } from '../time/instant.ts';
import type { TimeSystem } from '../time/timeSystem.ts';
import { fitOrbit } from './fitOrbit.ts';

export type { FitResult } from '../plan/fit.ts';
export type { FitSurveyRow } from '../plan/fitAll.ts';

/** The `fit` flags in camelCase (`measurements` is the file's name, for messages and the report). */
export interface FitFileOptions {
  measurements: string;
  /** 0 offset, 1 + frequency, 2 + drift. */
  degree: number;
  /** Sigma-clipping threshold (0 disables). */
  clip: number;
  /** `none` or `auto` (fit and remove the phase jumps found in the residuals). */
  segments?: string;
  /** The clock to fit; for a CSV, the satellite in `orbit`/`scenario`. */
  sat?: string;
  /** Orbit file of the clock (SP3, OEM, TLE/3LE, OMM or scenario). */
  orbit?: string;
  /** Scenario file whose satellite orbit gives the relativistic terms. */
  scenario?: string;
  /** Gravity model of the clock rate for non-scenario orbits (default zonal). */
  gravity?: string;
  /** Whether the data contain the periodic term −2r·v/c²: `included` or `excluded`. */
  periodic?: string;
  /** Epoch the parameters refer to (ISO text; default the first sample). */
  epoch?: string;
  /** Read the file as this format instead of recognising it. */
  inputFormat?: string;
  /** Scale of CSV times written without Z or a scale name. */
  timeScale?: string;
}

/** Seconds in a day. */
const DAY_S = 86_400;

/**
 * A fit epoch must lie near the data: within the data span, widened on each side by the span itself
 * (at least one day). Further out the fitted offset is an extrapolation whose error grows with the
 * square (degree 2: the cube) of the distance, and the message says so instead of printing it.
 * @param epochTtJ2000S the epoch asked for; first/last the first and last sample (s since J2000.0 TT)
 * @param format formats an instant for the message
 */
export function checkEpochNearData(epochTtJ2000S: number, firstTtJ2000S: number, lastTtJ2000S: number, format: (t: number) => string, flag = '--epoch'): void {
  const marginS = Math.max(lastTtJ2000S - firstTtJ2000S, DAY_S);
  if (epochTtJ2000S >= firstTtJ2000S - marginS && epochTtJ2000S <= lastTtJ2000S + marginS) return;
  const awayDays = (epochTtJ2000S < firstTtJ2000S ? firstTtJ2000S - epochTtJ2000S : epochTtJ2000S - lastTtJ2000S) / DAY_S;
  throw new InputError(
    `epoch ${format(epochTtJ2000S)} is ${awayDays.toFixed(1)} days outside the data (${format(firstTtJ2000S)} to ${format(lastTtJ2000S)})`,
    flag,
    `give an epoch within ${(marginS / DAY_S).toFixed(1)} days of the data, or leave ${flag} out (the first sample)`,
  );
}

/** Refuse a degree, clipping threshold or segment mode the fit cannot use. */
export function checkFitOptions(a: Pick<FitFileOptions, 'degree' | 'clip' | 'segments'>): void {
  if (a.degree !== 0 && a.degree !== 1 && a.degree !== 2) throw new InputError(`degree ${a.degree} is not 0, 1 or 2`, '--degree', 'use 0, 1 or 2');
  if (!(a.clip >= 0)) throw new InputError(`--clip ${a.clip} is negative`, '--clip', 'give a threshold ≥ 0 (0 disables clipping)');
  const segments = a.segments ?? 'none';
  if (segments !== 'none' && segments !== 'auto') throw new InputError(`--segments ${JSON.stringify(segments)}`, '--segments', 'use none or auto');
}

/** Reading options of the clock-file readers (src/io/clockFormats.ts) for these fit options. */
export function clockFileOptions(a: Pick<FitFileOptions, 'inputFormat' | 'timeScale'>, ts: TimeSystem, wanted: ReadonlySet<string> | null) {
  return {
    timeSystem: ts,
    wanted,
    ...(a.inputFormat === undefined ? {} : { format: a.inputFormat as MeasurementFormat }),
    ...(a.timeScale === undefined ? {} : { defaultScale: a.timeScale as TimeScale }),
  };
}

/**
 * Fit one clock of a read file: offset [ns], fractional frequency [1] and drift [1/day] with their
 * 1-σ, the rate split into relativity and hardware when there is an orbit (from `orbit`,
 * `scenario`, or the SP3 file itself), the residuals' stability and the noise model.
 */
export function fitFromFile(file: ClockFile, a: FitFileOptions, ts: TimeSystem, series: MeasurementSeries = pickSeries(file, a.sat)): FitResult {
  const first = series.ttJ2000S[0];
  const last = series.ttJ2000S[series.ttJ2000S.length - 1];
  if (series.format === 'csv' && a.sat !== undefined && a.orbit === undefined && a.scenario === undefined) {
    throw new InputError('--sat without --scenario or --orbit (a CSV holds one clock; --sat names its satellite in the orbit file)', '--sat', 'give --scenario FILE or --orbit FILE too, or leave out --sat');
  }
  if (a.epoch !== undefined && series.ttJ2000S.length > 0) {
    checkEpochNearData(ts.parse(a.epoch, '--epoch').ttJ2000S, first, last, (t) => ts.format(Instant.fromTtJ2000S(t)));
  }
  const orbitSat = series.kind === 'unknown' ? a.sat : series.clock;
  if (series.kind === 'receiver' && (a.orbit !== undefined || a.scenario !== undefined)) {
    throw new InputError(`${series.clock} is a receiver (AR) clock, which has no orbit`, '--orbit', 'leave out --orbit for station clocks');
  }
  const orbit = series.kind === 'receiver' ? null : fitOrbit(a, orbitSat, file, ts, first, last);
  const result = fitSeries(series, {
    degree: a.degree as 0 | 1 | 2,
    timeSystem: ts,
    clipSigma: a.clip,
    segments: (a.segments ?? 'none') as 'none' | 'auto',
    sourceName: file.fileName,
    trajectory: orbit?.trajectory ?? null,
    ...(orbit === null ? {} : { gravity: orbit.gravity, orbitWhere: orbit.where }),
    ...(a.periodic === undefined ? {} : { periodic: a.periodic as PeriodicTerm, periodicReason: 'set with --periodic' }),
    ...(a.epoch === undefined ? {} : { epochTtJ2000S: ts.parse(a.epoch, '--epoch').ttJ2000S }),
  });
  const notes = [...file.notes.map((n) => `source: ${n}`), ...(orbit === null ? [] : [`orbit: ${orbit.label}, ${orbit.gravity.name} gravity`]), ...result.notes];
  return { ...result, notes };
}

/** The options a `fit --all` survey passes to each clock (plain data, for worker threads). */
export interface FitSurveyOptions {
  measurements: string;
  fileFormat: MeasurementFormat;
  degree: number;
  clip: number;
  orbit?: string;
  scenario?: string;
  gravity?: string;
  periodic?: string;
  epoch?: string;
}

/**
 * One survey row of `fit --all` for one clock: rate, relativistic part, hardware part, drift, RMS,
 * skipped samples and the residuals' stability at 1000 s and 1 d where the data reach.
 */
export function fitSurveyOne(series: MeasurementSeries, a: FitSurveyOptions, ts: TimeSystem): FitSurveyRow {
  if (series.ttJ2000S.length === 0) return failedRow(series.clock, series.kind, 0, series.skipped, 'no usable value');
  const first = series.ttJ2000S[0];
  const last = series.ttJ2000S[series.ttJ2000S.length - 1];
  const flags = { orbit: a.orbit ?? (a.fileFormat === 'sp3' ? a.measurements : undefined), scenario: a.scenario, gravity: a.gravity };
  const orbit = series.kind === 'receiver' ? null : fitOrbit(flags, series.clock, null, ts, first, last);
  const r = fitSeries(series, {
    degree: a.degree as 0 | 1 | 2,
    timeSystem: ts,
    clipSigma: a.clip,
    sourceName: a.measurements,
    trajectory: orbit?.trajectory ?? null,
    ...(orbit === null ? {} : { gravity: orbit.gravity }),
    ...(a.periodic === undefined ? {} : { periodic: a.periodic as PeriodicTerm, periodicReason: 'set with --periodic' }),
    ...(a.epoch === undefined ? {} : { epochTtJ2000S: ts.parse(a.epoch, '--epoch').ttJ2000S }),
    stabilityTausS: SURVEY_TAUS_S,
  });
  return surveyRow(series.kind, r);
}

/** The survey row of a clock that could not be fitted, with its reason. */
export function failedSurveyRow(series: MeasurementSeries, reason: string): FitSurveyRow {
  return failedRow(series.clock, series.kind, series.ttJ2000S.length, series.skipped, reason);
}
