/**
 * Library use cases around the navigation message's clock polynomial (command `navclock`):
 * - {@link navigationClockSets}: quantised af0/af1/af2 sets for the satellites of a scenario;
 * - {@link runNavClockFromMeasurements}: the same from measured offsets, fitted and predicted forward;
 * - {@link evaluateBroadcastClocks}: the error of broadcast clocks (a RINEX 3 navigation file read
 *   by `parseRinexNav`) against precise clocks (an SP3 file read by `parseSp3`).
 * Times are seconds since J2000.0 TT inside, UTC ISO text in the JSON; clock values in seconds or
 * nanoseconds as the names say.
 */
import { isLunarOrbiter } from '../orbit/lunarOrbit.ts';
import { conventionalPeriodicS } from '../clock/rate.ts';
import { InputError } from '../errors.ts';
import type { MeasurementRow } from '../io/measurements.ts';
import type { RinexNavFile } from '../io/rinexNav.ts';
import type { Sp3File } from '../model/sp3.ts';
import { Sp3Trajectory } from '../orbit/sp3.ts';
import type { Trajectory } from '../orbit/trajectory.ts';
import { fitClock } from '../plan/fit.ts';
import { navigationClockSets as clockSets, type NavClockOptions, type NavClockResult, type PredictedClock } from '../plan/navclock.ts';
import { evaluateBroadcastClocks as evaluateBroadcast, type BroadcastEvalResult, type NavSystem, type PreciseClockSeries } from '../plan/navclockBroadcast.ts';
import { predictedFromFit, predictedFromRun } from '../plan/navclockSources.ts';
import { BAND_RULE_TEXT } from '../plan/band.ts';
import { prepareScenario } from '../plan/scenarioRuns.ts';
import type { ScenarioSpec } from '../model/scenario.ts';
import { broadcastEvalToJson, type BroadcastEvalMeta } from '../report/navclockEvalReport.ts';
import { navClockToJson, type NavClockMeta } from '../report/navclockReport.ts';
import { durationArg, timeArg, timeSystemOf, type CommonOptions, type DurationInput, type TimeInput } from './common.ts';
import { resolveOrbit } from './scenario.ts';
import { Instant, instantFromLabel } from '../time/instant.ts';
import type { TimeSystem } from '../time/timeSystem.ts';

export type { NavClockResult } from '../plan/navclock.ts';
export type { BroadcastEvalResult, NavSystem } from '../plan/navclockBroadcast.ts';
export type { NavClockMeta } from '../report/navclockReport.ts';
export type { BroadcastEvalMeta } from '../report/navclockEvalReport.ts';

/** Spacing of the prediction samples the polynomial is fitted to [s] (default of `spacing`). */
export const DEFAULT_PREDICTION_SPACING_S = 300;

const DAY_S = 86_400;

/** How the sets are made: the `navclock` flags in camelCase. */
export interface NavClockSetOptions extends CommonOptions {
  /** Message: `gps` (LNAV, default) or `galileo` (I/NAV, F/NAV). */
  system?: string;
  /** Polynomial degree, 1 or 2 (default 2). */
  degree?: number;
  /** Spacing of successive toc (default 2 h). */
  interval?: DurationInput;
  /** Fit interval centred on toc (default 4 h). */
  fitInterval?: DurationInput;
  /** Spacing of the prediction samples (default 300 s). */
  spacing?: DurationInput;
  /** Window start. */
  from?: TimeInput;
  /** Window end. */
  to?: TimeInput;
  /** Only these satellites (comma-separated ids or names; scenario mode). */
  sat?: string;
}

/** The sets and their header, for the writers. */
export interface NavClockRun {
  result: NavClockResult;
  meta: NavClockMeta;
}

/** The generation options over [from, to] (s since J2000.0 TT), checked; faults name the flags. */
export function navClockOptions(o: NavClockSetOptions, ts: TimeSystem, fromTtJ2000S: number, toTtJ2000S: number): NavClockOptions {
  const degree = o.degree ?? 2;
  if (degree !== 1 && degree !== 2) throw new InputError(`degree ${degree} is not 1 or 2`, '--degree', 'use 1 (offset and rate) or 2 (and drift)');
  const system = o.system ?? 'gps';
  if (system !== 'gps' && system !== 'galileo') throw new InputError(`system ${JSON.stringify(o.system)}`, '--system', 'use gps or galileo');
  return {
    system,
    degree,
    intervalS: durationArg(o.interval ?? '2h', '--interval'),
    fitIntervalS: durationArg(o.fitInterval ?? '4h', '--fit-interval'),
    spacingS: o.spacing === undefined ? DEFAULT_PREDICTION_SPACING_S : durationArg(o.spacing, '--spacing'),
    fromTtJ2000S,
    toTtJ2000S,
    gpsWeekOf: (t) => ts.gpsWeek(Instant.fromTtJ2000S(t)),
    utcOf: (t) => ts.format(Instant.fromTtJ2000S(t)),
  };
}

/** The sets of a scenario's satellites (the writers' input; {@link navigationClockSets} gives the JSON). */
export function runNavClockSets(scenario: ScenarioSpec, options?: NavClockSetOptions): NavClockRun {
  const ts = timeSystemOf(options);
  const ctx = prepareScenario(scenario, ts, { from: options?.from, to: options?.to, sat: options?.sat }, resolveOrbit, scenario.fileName);
  const o = navClockOptions(options ?? {}, ts, ctx.fromTtJ2000S, ctx.toTtJ2000S);
  const clocks: PredictedClock[] = ctx.runs.map(predictedFromRun);
  const result = clockSets(clocks, o);
  const notes = ctx.runs.flatMap((r) => (r.note === null ? [] : [r.note]));
  for (const r of ctx.runs) if (r.clock.params?.noise === undefined) notes.push(`${r.id}: no noise model in the scenario, so the prediction band is 0`);
  for (const r of ctx.runs) {
    if (isLunarOrbiter(r.trajectory)) notes.push(`${r.id} orbits the Moon: the periodic term removed before the fit (and left to the user) is −2ρ·u/c² − v_M·ρ/c² (Moon-centred), not −2r·v/c²`);
  }
  return { result, meta: { source: `scenario ${ctx.scenario.name} (${scenario.fileName})`, bandRule: BAND_RULE_TEXT, notes } };
}

/**
 * Navigation-message clock parameter sets for the satellites of a scenario: every `interval` a toc
 * at the centre of its fit interval, af0 [s], af1 [s/s] and af2 [s/s²] as the message quantises
 * them (IS-GPS-200 / Galileo OS SIS ICD scale factors), fitted to the predicted clock with the
 * periodic term −2r·v/c² removed, and the expected error [ns] at the ages of data 0, one
 * interval, one fit interval and 24 h: the object `tauplan navclock SCENARIO --format json` prints.
 */
export function navigationClockSets(scenario: ScenarioSpec, options?: NavClockSetOptions) {
  const ts = timeSystemOf(options);
  const r = runNavClockSets(scenario, options);
  return navClockToJson(r.result, r.meta, ts);
}

/** A measured clock and its orbit for {@link runNavClockFromMeasurements}. */
export interface MeasuredClockInput {
  /** The measurement rows (src/io/measurements.ts), in time order. */
  rows: readonly MeasurementRow[];
  /** Name of the measurements (messages, report). */
  measurementsName: string;
  /** The satellite's trajectory over the measurements (−2r·v/c² along it is removed). */
  trajectory: Trajectory;
  /** Name of the orbit (report). */
  orbitName: string;
  /** The satellite id the sets carry. */
  satellite: string;
}

/**
 * Fit the measured clock (degree 2 from four rows, else 1; epoch at the last row), predict it
 * forward from the last measurement over [from, to] (default one day), and make the sets.
 */
export function runNavClockFromMeasurements(input: MeasuredClockInput, options?: NavClockSetOptions): NavClockRun {
  const ts = timeSystemOf(options);
  const rows = input.rows;
  const first = rows[0].ttJ2000S;
  const last = rows[rows.length - 1].ttJ2000S;
  const trajectory = input.trajectory;
  if (first < trajectory.validFromTtJ2000S || last > trajectory.validToTtJ2000S) {
    throw new InputError(`the measurements (${rows.length} rows) reach outside the orbit's span`, '--orbit', `give an orbit that covers ${input.measurementsName}`);
  }
  const periodicNs = (t: number): number => {
    const s = trajectory.stateAt(t);
    return conventionalPeriodicS(s.positionM[0], s.positionM[1], s.positionM[2], s.velocityMPerS[0], s.velocityMPerS[1], s.velocityMPerS[2]) * 1e9;
  };
  const fit = fitClock(rows, { degree: rows.length > 3 ? 2 : 1, timeSystem: ts, epochTtJ2000S: last, periodicNs, sourceName: input.measurementsName });
  const from = timeArg(ts, options?.from, '--from') ?? last;
  const to = timeArg(ts, options?.to, '--to') ?? from + DAY_S;
  if (!(to > from)) throw new InputError('the window ends before it starts', '--to', 'give an end after the start');
  const o = navClockOptions(options ?? {}, ts, from, to);
  const result = clockSets([predictedFromFit(input.satellite, fit, to)], o);
  return {
    result,
    meta: {
      source: `clock fit to ${input.measurementsName} (${fit.used} of ${rows.length} rows, degree ${fit.degree}, RMS ${fit.rmsNs.toFixed(3)} ns, −2 r·v/c² from ${input.orbitName} removed), predicted from ${fit.epoch}`,
      bandRule: '±1.96 σ of the fitted polynomial extrapolated to that age (parameter covariance), combined with the fit residual RMS; no noise model',
      notes: fit.rejected.length > 0 ? [`${fit.rejected.length} measurement rows rejected by the fit's clipping`] : [],
    },
  };
}

/** The trajectory of satellite `id` in an SP3 file (10-point Lagrange; gaps refused for the span they touch). */
export function sp3Trajectory(file: Sp3File, id: string, options?: CommonOptions): Trajectory {
  return new Sp3Trajectory(file, id, timeSystemOf(options));
}

/** Broadcast records, precise clocks and orbit for {@link evaluateBroadcastClocks}. */
export interface BroadcastEvalInput {
  /** The navigation file (parseRinexNav). */
  nav: RinexNavFile;
  /** Precise clocks: the SP3 clock column (parseSp3). */
  precise: Sp3File;
  /** Precise orbit for −2r·v/c² (an SP3 file; may be the same as `precise`). */
  orbit: Sp3File;
  /** Names of the three files, for the report. */
  navFile: string;
  preciseFile: string;
  orbitFile: string;
}

/** Options of {@link evaluateBroadcastClocks}. */
export interface BroadcastEvalOptions extends CommonOptions {
  /** The one system to judge, `gps` or `galileo` (default both). */
  system?: NavSystem;
}

/** Precise clock series (SP3 clock column, µs → s) of the satellites of the wanted systems. */
function preciseFromSp3(file: Sp3File, systems: readonly NavSystem[]): PreciseClockSeries[] {
  if (file.timeScale === 'UTC') throw new InputError(`SP3 time system ${file.timeSystemCode}`, file.fileName, 'give an SP3 file in GPS or Galileo time');
  const letters: string[] = systems.map((s) => (s === 'gps' ? 'G' : 'E'));
  const ids = file.satelliteIds.filter((id) => letters.includes(id[0]));
  const scale = file.timeScale;
  const series = new Map<string, { t: number[]; c: number[] }>(ids.map((id) => [id, { t: [], c: [] }]));
  for (const ep of file.epochs) {
    const t = instantFromLabel(scale, ep.labelWholeS, ep.labelFracS).ttJ2000S;
    for (const [id, rec] of ep.records) {
      const s = series.get(id);
      if (s === undefined || rec.clockUs === null || rec.clockEvent) continue;
      s.t.push(t);
      s.c.push(rec.clockUs * 1e-6);
    }
  }
  return [...series.entries()].map(([satellite, s]) => ({ satellite, ttJ2000S: s.t, clockS: s.c }));
}

/** The broadcast-clock evaluation (the writers' input; {@link evaluateBroadcastClocks} gives the JSON). */
export function runBroadcastEval(input: BroadcastEvalInput, options?: BroadcastEvalOptions): { result: BroadcastEvalResult; meta: BroadcastEvalMeta } {
  const ts = timeSystemOf(options);
  const systems: NavSystem[] = options?.system === undefined ? ['gps', 'galileo'] : [options.system];
  const { nav, precise: preciseFile, orbit: orbitFile } = input;
  const trajectories = new Map<string, Sp3Trajectory | null>();
  const periodicS = (sat: string, t: number): number | null => {
    let tr = trajectories.get(sat);
    if (tr === undefined) {
      tr = orbitFile.satelliteIds.includes(sat) ? new Sp3Trajectory(orbitFile, sat, ts) : null;
      trajectories.set(sat, tr);
    }
    if (tr === null || t < tr.validFromTtJ2000S || t > tr.validToTtJ2000S) return null;
    try {
      const s = tr.stateAt(t);
      return conventionalPeriodicS(s.positionM[0], s.positionM[1], s.positionM[2], s.velocityMPerS[0], s.velocityMPerS[1], s.velocityMPerS[2]);
    } catch (e) {
      if (e instanceof InputError) return null; // a gap or manoeuvre in the orbit: that epoch is left out
      throw e;
    }
  };
  const result = evaluateBroadcast({ records: nav.records, precise: preciseFromSp3(preciseFile, systems), periodicS, systems, navFile: input.navFile, preciseFile: input.preciseFile });
  const skipped = Object.entries(nav.skippedOtherSystems).map(([s, n]) => `${n} ${s}`).join(', ');
  const notes = [
    `${input.navFile}: RINEX ${nav.version.toFixed(2)}, ${nav.records.length} GPS and Galileo records read${skipped.length > 0 ? `; records of other systems skipped: ${skipped}` : ''}${nav.skippedIncomplete > 0 ? `; ${nav.skippedIncomplete} GPS/Galileo records with a missing field skipped (first at line ${nav.firstIncompleteLine})` : ''}`,
    `${result.unmatched} satellite-epochs without a usable broadcast record or orbit state; ${result.droppedLoneEpochs} dropped (alone in their system at that epoch); ${result.unhealthyRecords} unhealthy records not used`,
  ];
  return { result, meta: { navFile: input.navFile, preciseFile: input.preciseFile, orbitFile: input.orbitFile, preciseAgency: preciseFile.agency, systems, notes } };
}

/**
 * The error of broadcast clocks against precise clocks, per satellite and by age of data: the
 * broadcast polynomial plus its relativistic term Δt_r (from the broadcast elements) against the
 * precise clock plus −2r·v/c² (from the precise orbit), after removing each epoch's system mean
 * (the precise clocks' reference) — RMS and 95th percentile [ns]: the object
 * `tauplan navclock --nav N --precise P --orbit O --format json` prints.
 */
export function evaluateBroadcastClocks(input: BroadcastEvalInput, options?: BroadcastEvalOptions) {
  const r = runBroadcastEval(input, options);
  return broadcastEvalToJson(r.result, r.meta);
}
