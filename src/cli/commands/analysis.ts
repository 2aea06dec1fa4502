/** `tauplan compare`, `tauplan sweep`, `tauplan track`, `tauplan fit`. */
import type { Argv } from 'yargs';
import { checkEpochNearData } from '../options.ts';
import { Instant } from '../../time/instant.ts';
import { gravityModel } from '../../orbit/gravity.ts';
import { WGS84_GM_M3_PER_S2 } from '../../constants.ts';
import { InputError } from '../../errors.ts';
import { loadScenario, scenarioSatellite } from '../../io/loadScenario.ts';
import { parseMeasurementsCsv } from '../../io/measurements.ts';
import { readTextFile, trajectoryForSatellite } from '../../io/orbitSources.ts';
import { updateScenarioClock } from '../../io/updateScenario.ts';
import { NumericalTrajectory } from '../../orbit/numerical.ts';
import { gmstRadAtTt } from '../../orbit/sp3.ts';
import { compareClocks, type CompareSatellite } from '../../plan/compare.ts';
import { fitClock } from '../../plan/fit.ts';
import { prepareSatelliteClock } from '../../plan/satelliteClock.ts';
import { lineFit } from '../../plan/size.ts';
import { allocStateBlock } from '../../orbit/trajectory.ts';
import { conventionalPeriodicS } from '../../clock/rate.ts';
import { sweepAltitude } from '../../plan/sweep.ts';
import { trackSatellite, TRACK_FRAMES, type TrackFrame } from '../../plan/track.ts';
import { compareToCsv, compareToJson, compareToText, sweepToCsv, sweepToJson, sweepToText, trackToCsv, trackToJson, trackToText } from '../../report/analysisReports.ts';
import { fitToCsv, fitToJson, fitToText } from '../../report/fitReport.ts';
import { parsePositiveDurationS } from '../../time/duration.ts';
import type { TimeSystem } from '../../time/timeSystem.ts';
import type { Rendered } from '../emit.ts';
import { compareFigures, compareSection, fitSection, page, sweepSection, windowMeta } from '../../report/htmlReport.ts';
import { orbitFromFlags } from '../orbitArgs.ts';
import { missingGeoidNote } from '../../report/notes.ts';
import { checkWindowInSpan, oscillatorParams, scenarioGravity, spanWithClockEpoch } from '../scenarioContext.ts';

// ---- compare ----------------------------------------------------------------------------------

export function compareOptions<T>(y: Argv<T>) {
  return y
    .positional('scenario', { type: 'string', demandOption: true, describe: 'scenario file (JSON or YAML)' })
    .option('from', { type: 'string', requiresArg: true, describe: 'window start (default: scenario window)' })
    .option('to', { type: 'string', requiresArg: true, describe: 'window end (default: scenario window)' })
    .option('against', { type: 'string', requiresArg: true, describe: 'reference clock (satellite or station id): pairs against it only' })
    .option('pairs', { type: 'string', requiresArg: true, choices: ['all', 'against'], describe: 'with --against: all keeps every pair (default: pairs with the reference only)' });
}

export interface CompareArgs {
  scenario: string;
  from?: string;
  to?: string;
  against?: string;
  pairs?: string;
}

export function computeCompare(a: CompareArgs, ts: TimeSystem) {
  const scenario = loadScenario(a.scenario, ts);
  const gravity = scenarioGravity(scenario, ts, a.scenario);
  const from = a.from === undefined ? scenario.window.start.ttJ2000S : ts.parse(a.from, '--from').ttJ2000S;
  const to = a.to === undefined ? scenario.window.end.ttJ2000S : ts.parse(a.to, '--to').ttJ2000S;
  if (!(to > from)) throw new InputError('the window ends before it starts', a.to !== undefined ? '--to' : `${a.scenario} window`, 'give an end after the start');
  const ids = [...scenario.satellites.map((s) => s.id), ...scenario.stations.map((s) => s.id)];
  if (a.against !== undefined && !ids.includes(a.against)) throw new InputError(`no clock ${JSON.stringify(a.against)} in the scenario`, '--against', `use a satellite or station id (${ids.slice(0, 8).join(', ')})`);
  const sats: CompareSatellite[] = scenario.satellites.map((sat) => {
    const { trajectory } = trajectoryForSatellite(sat, scenario, ts, gravity, { fromTtJ2000S: from, toTtJ2000S: to });
    const flightEnd = trajectory instanceof NumericalTrajectory ? trajectory.flightEndTtJ2000S : null;
    return { id: sat.id, trajectory, flight: flightEnd === null ? null : { startTtJ2000S: trajectory.validFromTtJ2000S, endTtJ2000S: flightEnd } };
  });
  const stations = scenario.stations;
  const all = compareClocks(sats, stations, gravity, from, to, a.against);
  const keepAll = a.against === undefined || a.pairs === 'all';
  const result = keepAll ? all : { ...all, pairs: all.pairs.filter((p) => p.a === a.against || p.b === a.against) };
  const notes = stations.filter((s) => !s.geoidHeightGiven).map((s) => missingGeoidNote(s.id));
  return { result, notes, meta: { scenario: scenario.name, gravity: gravity.name, fromTtJ2000S: from, toTtJ2000S: to, against: a.against ?? null } };
}

export function runCompare(a: CompareArgs, ts: TimeSystem): Rendered {
  const { result, meta, notes } = computeCompare(a, ts);
  return {
    notes,
    json: () => compareToJson(result, ts, meta),
    csv: () => compareToCsv(result, ts),
    text: () => compareToText(result, ts, meta),
    html: () => page('tauplan — clock comparison', meta.scenario, windowMeta(ts, meta.fromTtJ2000S, meta.toTtJ2000S, meta.against ?? 'TT'), [compareSection(ts, result, meta, compareFigures(ts, result))], notes),
  };
}

// ---- sweep ------------------------------------------------------------------------------------

export function sweepOptions<T>(y: Argv<T>) {
  return y
    .option('from-km', { type: 'number', requiresArg: true, default: 300, describe: 'lowest altitude [km]' })
    .option('to-km', { type: 'number', requiresArg: true, default: 40000, describe: 'highest altitude [km]' })
    .option('points', { type: 'number', requiresArg: true, default: 200, describe: 'number of altitudes' })
    .option('e', { type: 'number', requiresArg: true, default: 0, describe: 'eccentricity' })
    .option('i-deg', { type: 'number', requiresArg: true, default: 0, describe: 'inclination [deg]' })
    .option('gravity', { type: 'string', requiresArg: true, default: 'zonal', describe: 'point | j2 | zonal' })
    .option('epoch', { type: 'string', requiresArg: true, default: '2027-01-01T00:00:00Z', describe: 'epoch of the orbits' });
}

export interface SweepArgs {
  fromKm: number;
  toKm: number;
  points: number;
  e: number;
  iDeg: number;
  gravity: string;
  epoch: string;
}

export function computeSweep(a: SweepArgs, ts: TimeSystem) {
  const gravity = gravityModel(a.gravity, '--gravity');
  if (!(a.e >= 0 && a.e < 1)) throw new InputError(`eccentricity ${a.e} is not in [0, 1)`, '--e', 'give 0 ≤ e < 1');
  if (!(a.iDeg >= 0 && a.iDeg <= 180)) throw new InputError(`inclination ${a.iDeg}° is not in [0, 180]`, '--i-deg', 'give 0–180');
  const result = sweepAltitude({ fromKm: a.fromKm, toKm: a.toKm, points: a.points, e: a.e, iDeg: a.iDeg, gravity, epochTtJ2000S: ts.parse(a.epoch, '--epoch').ttJ2000S });
  return { result, meta: { gravity: gravity.name, e: a.e, iDeg: a.iDeg } };
}

export function runSweep(a: SweepArgs, ts: TimeSystem): Rendered {
  const { result, meta } = computeSweep(a, ts);
  return {
    json: () => sweepToJson(result, meta),
    csv: () => sweepToCsv(result),
    text: () => sweepToText(result, meta),
    html: () => page('tauplan — clock rate against altitude', `gravity ${meta.gravity}, e = ${meta.e}, i = ${meta.iDeg}°`, [], [sweepSection(result, meta.gravity)]),
  };
}

// ---- track ------------------------------------------------------------------------------------

export function trackOptions<T>(y: Argv<T>) {
  return y
    .positional('scenario', { type: 'string', describe: 'scenario file (or give --tle FILE instead)' })
    .option('tle', { type: 'string', requiresArg: true, describe: 'TLE/3LE file instead of a scenario' })
    .option('sat', { type: 'string', requiresArg: true, describe: 'satellite id, name or catalogue number' })
    .option('from', { type: 'string', requiresArg: true, describe: 'start (default: scenario window start, or the element-set epoch)' })
    .option('to', { type: 'string', requiresArg: true, describe: 'end (default: scenario window end, or start + 1 d)' })
    .option('step', { type: 'string', requiresArg: true, default: '60s', describe: 'sampling step' })
    .option('frame', { type: 'string', requiresArg: true, default: 'GCRF', describe: 'GCRF | TEME | ECEF' })
    .option('gravity', { type: 'string', requiresArg: true, describe: 'point | j2 | zonal (default: the scenario’s, else zonal)' });
}

export interface TrackArgs {
  scenario?: string;
  tle?: string;
  sat?: string;
  from?: string;
  to?: string;
  step: string;
  frame: string;
  gravity?: string;
}

export function runTrack(a: TrackArgs, ts: TimeSystem): Rendered {
  const frame = a.frame.toUpperCase() as TrackFrame;
  if (!TRACK_FRAMES.includes(frame)) throw new InputError(`unknown frame ${JSON.stringify(a.frame)}`, '--frame', 'use GCRF, TEME or ECEF');
  const stepS = parsePositiveDurationS(a.step, '--step');
  if ((a.scenario === undefined) === (a.tle === undefined)) throw new InputError('give a scenario file or --tle FILE (one of them)', 'command line', 'e.g. tauplan track scenario.yaml --sat S1');
  let run;
  let from: number;
  let to: number;
  if (a.scenario !== undefined) {
    const scenario = loadScenario(a.scenario, ts);
    const gravity = scenarioGravity(scenario, ts, a.scenario, a.gravity ?? scenario.gravity);
    const sat = scenarioSatellite(scenario, a.sat);
    from = a.from === undefined ? scenario.window.start.ttJ2000S : ts.parse(a.from, '--from').ttJ2000S;
    to = a.to === undefined ? scenario.window.end.ttJ2000S : ts.parse(a.to, '--to').ttJ2000S;
    if (!(to > from)) throw new InputError('the span ends before it starts', '--to', 'give an end after the start');
    const params = oscillatorParams(sat.clock);
    const resolved = trajectoryForSatellite(sat, scenario, ts, gravity, spanWithClockEpoch(from, to, params));
    const satPath = `${a.scenario} ${sat.path}`;
    checkWindowInSpan(resolved.trajectory, from, to, ts, satPath);
    if (params !== null) checkWindowInSpan(resolved.trajectory, Math.min(from, params.epochTtJ2000S), Math.max(to, params.epochTtJ2000S), ts, `${satPath}.clock.epoch`, 'give a clock epoch inside the orbit source span (the clock is integrated from it)');
    run = prepareSatelliteClock(sat.id, resolved.name, resolved.trajectory, gravity, params, from, to);
  } else {
    const gravity = gravityModel(a.gravity ?? 'zonal', '--gravity');
    const fromGiven = a.from === undefined ? null : ts.parse(a.from, '--from').ttJ2000S;
    const toGiven = a.to === undefined ? null : ts.parse(a.to, '--to').ttJ2000S;
    const resolved = orbitFromFlags({ tle: a.tle, sat: a.sat, e: 0, iDeg: 0, raanDeg: 0, argpDeg: 0, mDeg: 0, epoch: '2027-01-01T00:00:00Z' }, ts, gravity, (epoch) => {
      const f = fromGiven ?? epoch ?? 0;
      return { fromTtJ2000S: f, toTtJ2000S: toGiven ?? f + 86400 };
    });
    from = fromGiven ?? resolved.trajectory.epochTtJ2000S ?? resolved.trajectory.validFromTtJ2000S;
    to = toGiven ?? from + 86400;
    if (!(to > from)) throw new InputError('the span ends before it starts', '--to', 'give an end after the start');
    run = prepareSatelliteClock(resolved.trajectory.id, resolved.name, resolved.trajectory, gravity, null, from, to);
  }
  const rows = trackSatellite(run, from, to, stepS, frame, { gmstRadAt: (t) => gmstRadAtTt(ts, t), jdUtcAt: (t) => ts.jdUtcFromTtJ2000S(t) });
  return { json: () => trackToJson(rows, ts, run.id, frame), csv: () => trackToCsv(rows, ts), text: () => trackToText(rows, ts, run.id, frame) };
}

// ---- fit: src/cli/commands/fit.ts (re-exported for existing callers) ------------------------

export { computeFit, fitOptions, runFit, type FitArgs } from './fit.ts';
