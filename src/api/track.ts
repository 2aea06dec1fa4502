/** Library use case: sampled states and the clock along them for one satellite (command `track`). */
import { InputError } from '../errors.ts';
import { scenarioSatellite } from '../io/loadScenario.ts';
import type { ElementSetRecord } from '../model/elementSet.ts';
import type { ScenarioSpec } from '../model/scenario.ts';
import { gmstRadAtTt } from '../orbit/sp3.ts';
import type { GravityModelName } from '../orbit/gravity.ts';
import { orbitFromElementSet } from '../plan/orbitInput.ts';
import { prepareSatelliteClock, type SatelliteClockRun } from '../plan/satelliteClock.ts';
import { checkWindowInSpan, gravityWithTides, oscillatorParams, scenarioGravity, spanWithClockEpoch } from '../plan/scenarioRuns.ts';
import { trackSatellite as trackRows, TRACK_FRAMES, type TrackFrame, type TrackRow } from '../plan/track.ts';
import { trackToJson, type TrackJson } from '../report/analysisReports.ts';
import { durationArg, timeArg, timeSystemOf, type CommonOptions, type DurationInput, type TimeInput } from './common.ts';
import { resolveOrbit } from './scenario.ts';

/** What to track: a scenario (with `sat` in the options), or one parsed element set. */
export type TrackInput = ScenarioSpec | ElementSetRecord;

/** Options of {@link trackSatellite}: the `track` flags in camelCase. */
export interface TrackOptions extends CommonOptions {
  /** Satellite id or name in the scenario. */
  sat?: string;
  /** Start (default: the scenario window start, or the element-set epoch). */
  from?: TimeInput;
  /** End (default: the scenario window end, or start + 1 d). */
  to?: TimeInput;
  /** Sampling step (default 60 s). */
  step?: DurationInput;
  /** Output frame: GCRF, TEME or ECEF (default GCRF). */
  frame?: string;
  /** Gravity model (default: the scenario's, else zonal). */
  gravity?: GravityModelName;
}

/** Tracked rows and their header. */
export interface TrackRun {
  rows: TrackRow[];
  satellite: string;
  frame: TrackFrame;
}

function isElementSet(x: TrackInput): x is ElementSetRecord {
  return 'kind' in x && (x.kind === 'tle' || x.kind === 'omm');
}

/** The frame and step [s] of the options, checked (before any file is read). */
export function checkTrackOptions(options?: TrackOptions): { frame: TrackFrame; stepS: number } {
  const frameText = options?.frame ?? 'GCRF';
  const frame = frameText.toUpperCase() as TrackFrame;
  if (!TRACK_FRAMES.includes(frame)) throw new InputError(`unknown frame ${JSON.stringify(frameText)}`, '--frame', 'use GCRF, TEME or ECEF');
  return { frame, stepS: durationArg(options?.step ?? '60s', '--step') };
}

/**
 * Sample one satellite (the writers' input; {@link trackSatellite} gives the JSON). An element set
 * may be given as a function, called once the gravity model and the span are checked (the CLI reads
 * its file then).
 */
export function runTrack(input: TrackInput | (() => ElementSetRecord), options?: TrackOptions): TrackRun {
  const ts = timeSystemOf(options);
  const { frame, stepS } = checkTrackOptions(options);
  let run: SatelliteClockRun;
  let from: number;
  let to: number;
  if (typeof input !== 'function' && !isElementSet(input)) {
    const scenario = input;
    const gravity = scenarioGravity(scenario, ts, scenario.fileName, options?.gravity ?? scenario.gravity);
    const sat = scenarioSatellite(scenario, options?.sat);
    from = timeArg(ts, options?.from, '--from') ?? scenario.window.start.ttJ2000S;
    to = timeArg(ts, options?.to, '--to') ?? scenario.window.end.ttJ2000S;
    if (!(to > from)) throw new InputError('the span ends before it starts', '--to', 'give an end after the start');
    const params = oscillatorParams(sat.clock);
    const resolved = resolveOrbit(sat, scenario, ts, gravity, spanWithClockEpoch(from, to, params));
    const satPath = `${scenario.fileName} ${sat.path}`;
    checkWindowInSpan(resolved.trajectory, from, to, ts, satPath);
    if (params !== null) checkWindowInSpan(resolved.trajectory, Math.min(from, params.epochTtJ2000S), Math.max(to, params.epochTtJ2000S), ts, `${satPath}.clock.epoch`, 'give a clock epoch inside the orbit source span (the clock is integrated from it)');
    run = prepareSatelliteClock(sat.id, resolved.name, resolved.trajectory, gravity, params, from, to);
  } else {
    const gravity = gravityWithTides(options?.gravity ?? 'zonal', false, ts);
    const fromGiven = timeArg(ts, options?.from, '--from');
    const toGiven = timeArg(ts, options?.to, '--to');
    const record = typeof input === 'function' ? input() : input;
    const resolved = orbitFromElementSet(record, ts, (epoch) => {
      const f = fromGiven ?? epoch ?? 0;
      return { fromTtJ2000S: f, toTtJ2000S: toGiven ?? f + 86400 };
    });
    from = fromGiven ?? resolved.trajectory.epochTtJ2000S ?? resolved.trajectory.validFromTtJ2000S;
    to = toGiven ?? from + 86400;
    if (!(to > from)) throw new InputError('the span ends before it starts', '--to', 'give an end after the start');
    run = prepareSatelliteClock(resolved.trajectory.id, resolved.name, resolved.trajectory, gravity, null, from, to);
  }
  const rows = trackRows(run, from, to, stepS, frame, { gmstRadAt: (t) => gmstRadAtTt(ts, t), jdUtcAt: (t) => ts.jdUtcFromTtJ2000S(t) });
  return { rows, satellite: run.id, frame };
}

/**
 * The sampled trajectory [km, km/s] in the chosen frame and the clock along it: `y_rel` [1], the
 * clock offset [ns] and the periodic term −2r·v/c² [ns] per row: the object `tauplan track
 * --format json` prints.
 */
export function trackSatellite(input: TrackInput, options?: TrackOptions): TrackJson {
  const ts = timeSystemOf(options);
  const r = runTrack(input, options);
  return trackToJson(r.rows, ts, r.satellite, r.frame);
}
