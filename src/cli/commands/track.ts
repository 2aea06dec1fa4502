/** `tauplan track SCENARIO --sat ID` or `tauplan track --tle FILE [--sat N]`: states and the clock along them. */
import type { Argv } from 'yargs';
import { checkTrackOptions, runTrack as trackOne, type TrackOptions } from '../../api/track.ts';
import { InputError } from '../../errors.ts';
import { loadScenario } from '../../io/loadScenario.ts';
import { pickElementSet, readElementSets } from '../../io/orbitSources.ts';
import type { GravityModelName } from '../../model/scenario.ts';
import { trackToCsv, trackToJson, trackToText } from '../../report/analysisReports.ts';
import type { TimeSystem } from '../../time/timeSystem.ts';
import type { Rendered } from '../emit.ts';

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
  const options: TrackOptions = { timeSystem: ts, sat: a.sat, from: a.from, to: a.to, step: a.step, frame: a.frame, gravity: a.gravity as GravityModelName | undefined };
  checkTrackOptions(options);
  if ((a.scenario === undefined) === (a.tle === undefined)) throw new InputError('give a scenario file or --tle FILE (one of them)', 'command line', 'e.g. tauplan track scenario.yaml --sat S1');
  const tle = a.tle;
  // The element-set file is read once the options are checked, as for a scenario.
  const input = tle === undefined ? loadScenario(a.scenario as string, ts) : () => pickElementSet(readElementSets(tle, 'tle', '--tle'), a.sat, tle);
  const { rows, satellite, frame } = trackOne(input, options);
  return { json: () => trackToJson(rows, ts, satellite, frame), csv: () => trackToCsv(rows, ts), text: () => trackToText(rows, ts, satellite, frame) };
}
