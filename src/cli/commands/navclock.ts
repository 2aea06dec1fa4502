/**
 * `tauplan navclock SCENARIO [--sat ID] [--from --to] [--interval 2h] [--fit-interval 4h]
 * [--system gps|galileo] [--degree 1|2]`: quantised navigation-message clock parameter sets.
 */
import type { Argv } from 'yargs';
import { InputError } from '../../errors.ts';
import { DEFAULT_PREDICTION_SPACING_S, runNavClockSets, type NavClockRun, type NavClockSetOptions } from '../../api/navclock.ts';
import { loadScenario } from '../../io/loadScenario.ts';
import type { ScenarioSpec } from '../../model/scenario.ts';
import { navClockToCsv, navClockToJson, navClockToText } from '../../report/navclockReport.ts';
import { navClockToHtml } from '../../report/navclockHtml.ts';
import type { TimeSystem } from '../../time/timeSystem.ts';
import type { Rendered } from '../emit.ts';
import { runNavEval } from './navclockEval.ts';
import { computeNavclockMeasured } from './navclockMeasured.ts';

export { DEFAULT_PREDICTION_SPACING_S };

export function navclockOptions<T>(y: Argv<T>) {
  return y
    .positional('scenario', { type: 'string', describe: 'scenario file (JSON or YAML); not with --measurements or --nav' })
    .option('sat', { type: 'string', requiresArg: true, describe: 'only these satellites (comma-separated)' })
    .option('from', { type: 'string', requiresArg: true, describe: 'window start (default: scenario window start)' })
    .option('to', { type: 'string', requiresArg: true, describe: 'window end (default: scenario window end)' })
    .option('interval', { type: 'string', requiresArg: true, default: '2h', describe: 'spacing of successive toc' })
    .option('fit-interval', { type: 'string', requiresArg: true, default: '4h', describe: 'fit interval, centred on toc' })
    .option('spacing', { type: 'string', requiresArg: true, describe: `spacing of the prediction samples (default ${DEFAULT_PREDICTION_SPACING_S} s)` })
    .option('system', { type: 'string', requiresArg: true, choices: ['gps', 'galileo'], describe: 'message: GPS LNAV (default) or Galileo I/NAV-F/NAV; with --nav, the one system to judge (default both)' })
    .option('degree', { type: 'number', requiresArg: true, default: 2, describe: 'polynomial degree, 1 or 2' })
    .option('nav', { type: 'string', requiresArg: true, describe: 'judge a RINEX 3 navigation file (3.02–3.05) against --precise and --orbit' })
    .option('precise', { type: 'string', requiresArg: true, describe: 'precise clocks (SP3, gzip accepted) for --nav' })
    .option('orbit', { type: 'string', requiresArg: true, describe: 'orbit for the −2 r·v/c² term: SP3 with --nav; TLE, OMM or SP3 with --measurements' })
    .option('measurements', { type: 'string', requiresArg: true, describe: 'measured clock offsets (CSV as for fit): fit, predict forward from the last row, make the sets' });
}

export interface NavclockArgs {
  scenario?: string;
  sat?: string;
  from?: string;
  to?: string;
  interval: string;
  fitInterval: string;
  spacing?: string;
  system?: string;
  degree: number;
  nav?: string;
  precise?: string;
  orbit?: string;
  measurements?: string;
}

/** The `navclock` flags as the library's options. */
export function navClockSetOptions(a: NavclockArgs, ts: TimeSystem): NavClockSetOptions {
  return { timeSystem: ts, system: a.system, degree: a.degree, interval: a.interval, fitInterval: a.fitInterval, spacing: a.spacing, from: a.from, to: a.to, sat: a.sat };
}

/** Parameter sets for the satellites of a scenario. */
export function computeNavclockScenario(a: NavclockArgs & { scenario: string }, ts: TimeSystem, parsed?: ScenarioSpec): NavClockRun {
  return runNavClockSets(parsed ?? loadScenario(a.scenario, ts), navClockSetOptions(a, ts));
}

/** `parsed`: the scenario file already read (by --shard), so it is not read twice. */
export function runNavclock(a: NavclockArgs, ts: TimeSystem, parsed?: ScenarioSpec): Rendered {
  if (a.nav !== undefined) {
    if (a.scenario !== undefined) throw new InputError('both a scenario and --nav given', '--nav', 'judge a navigation file (--nav --precise --orbit) or generate sets from a scenario, one at a time');
    return runNavEval({ nav: a.nav, precise: a.precise, orbit: a.orbit, system: a.system }, ts);
  }
  if (a.measurements !== undefined && a.scenario !== undefined) throw new InputError('both a scenario and --measurements given', '--measurements', 'generate sets from a scenario or from measurements, one at a time');
  if (a.measurements === undefined && a.scenario === undefined) throw new InputError('no scenario given', 'navclock', 'give a scenario file (tauplan navclock data/demo/tessera.yaml), or --measurements with --orbit, or --nav');
  const { result, meta } = a.measurements !== undefined ? computeNavclockMeasured({ ...a, measurements: a.measurements }, ts) : computeNavclockScenario({ ...a, scenario: a.scenario as string }, ts, parsed);
  return {
    html: () => navClockToHtml(result, meta, ts),
    json: () => navClockToJson(result, meta, ts),
    csv: () => navClockToCsv(result, ts),
    text: () => navClockToText(result, meta, ts),
  };
}
