/**
 * `tauplan navclock SCENARIO [--sat ID] [--from --to] [--interval 2h] [--fit-interval 4h]
 * [--system gps|galileo] [--degree 1|2]`: quantised navigation-message clock parameter sets.
 */
import type { Argv } from 'yargs';
import { InputError } from '../../errors.ts';
import { PREDICTION_RULE_TEXT } from '../../clock/noise.ts';
import type { NavSystem } from '../../clock/navMessage.ts';
import { navigationClockSets, type NavClockOptions, type NavClockResult, type PredictedClock } from '../../plan/navclock.ts';
import { predictedFromRun } from '../../plan/navclockSources.ts';
import { navClockToCsv, navClockToJson, navClockToText, type NavClockMeta } from '../../report/navclockReport.ts';
import { navClockToHtml } from '../../report/navclockHtml.ts';
import { parsePositiveDurationS } from '../../time/duration.ts';
import { Instant } from '../../time/instant.ts';
import type { TimeSystem } from '../../time/timeSystem.ts';
import type { Rendered } from '../emit.ts';
import { loadScenarioContext } from '../scenarioContext.ts';
import { runNavEval } from './navclockEval.ts';
import { computeNavclockMeasured } from './navclockMeasured.ts';

/** Spacing of the prediction samples the polynomial is fitted to [s] (default of --spacing). */
export const DEFAULT_PREDICTION_SPACING_S = 300;

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

/** The generation options shared by the scenario and measurement modes. */
export function navClockOptionsFrom(a: NavclockArgs, ts: TimeSystem, fromTtJ2000S: number, toTtJ2000S: number): NavClockOptions {
  if (a.degree !== 1 && a.degree !== 2) throw new InputError(`degree ${a.degree} is not 1 or 2`, '--degree', 'use 1 (offset and rate) or 2 (and drift)');
  const system = a.system ?? 'gps';
  if (system !== 'gps' && system !== 'galileo') throw new InputError(`system ${JSON.stringify(a.system)}`, '--system', 'use gps or galileo');
  return {
    system: system as NavSystem,
    degree: a.degree,
    intervalS: parsePositiveDurationS(a.interval, '--interval'),
    fitIntervalS: parsePositiveDurationS(a.fitInterval, '--fit-interval'),
    spacingS: a.spacing === undefined ? DEFAULT_PREDICTION_SPACING_S : parsePositiveDurationS(a.spacing, '--spacing'),
    fromTtJ2000S,
    toTtJ2000S,
    gpsWeekOf: (t) => ts.gpsWeek(Instant.fromTtJ2000S(t)),
    utcOf: (t) => ts.format(Instant.fromTtJ2000S(t)),
  };
}

/** Parameter sets for the satellites of a scenario. */
export function computeNavclockScenario(a: NavclockArgs & { scenario: string }, ts: TimeSystem): { result: NavClockResult; meta: NavClockMeta } {
  const ctx = loadScenarioContext(a.scenario, ts, a);
  const options = navClockOptionsFrom(a, ts, ctx.fromTtJ2000S, ctx.toTtJ2000S);
  const clocks: PredictedClock[] = ctx.runs.map(predictedFromRun);
  const result = navigationClockSets(clocks, options);
  const notes = ctx.runs.flatMap((r) => (r.note === null ? [] : [r.note]));
  for (const r of ctx.runs) if (r.clock.params?.noise === undefined) notes.push(`${r.id}: no noise model in the scenario, so the prediction band is 0`);
  return { result, meta: { source: `scenario ${ctx.scenario.name} (${a.scenario})`, bandRule: PREDICTION_RULE_TEXT, notes } };
}

export function runNavclock(a: NavclockArgs, ts: TimeSystem): Rendered {
  if (a.nav !== undefined) {
    if (a.scenario !== undefined) throw new InputError('both a scenario and --nav given', '--nav', 'judge a navigation file (--nav --precise --orbit) or generate sets from a scenario, one at a time');
    return runNavEval({ nav: a.nav, precise: a.precise, orbit: a.orbit, system: a.system }, ts);
  }
  if (a.measurements !== undefined && a.scenario !== undefined) throw new InputError('both a scenario and --measurements given', '--measurements', 'generate sets from a scenario or from measurements, one at a time');
  if (a.measurements === undefined && a.scenario === undefined) throw new InputError('no scenario given', 'navclock', 'give a scenario file (tauplan navclock data/demo/tessera.yaml), or --measurements with --orbit, or --nav');
  const { result, meta } = a.measurements !== undefined ? computeNavclockMeasured({ ...a, measurements: a.measurements }, ts) : computeNavclockScenario({ ...a, scenario: a.scenario as string }, ts);
  return {
    html: () => navClockToHtml(result, meta, ts),
    json: () => navClockToJson(result, meta, ts),
    csv: () => navClockToCsv(result, ts),
    text: () => navClockToText(result, meta, ts),
  };
}
