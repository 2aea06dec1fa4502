/** `tauplan compare SCENARIO [--from --to] [--against ID [--pairs all]] [--shard K/N|auto]`. */
import type { Argv } from 'yargs';
import { runCompare as compareScenario, type CompareRun } from '../../api/compare.ts';
import { loadScenario } from '../../io/loadScenario.ts';
import type { ScenarioSpec } from '../../model/scenario.ts';
import { compareToCsv, compareToJson, compareToText } from '../../report/analysisReports.ts';
import { compareFigures, compareSection, page, windowMeta } from '../../report/htmlReport.ts';
import type { TimeSystem } from '../../time/timeSystem.ts';
import type { CompareShare } from '../compareShard.ts';
import type { Rendered } from '../emit.ts';

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

/** The comparison of a scenario file (also a part of `report`); `parsed`: the scenario already read. */
export function computeCompare(a: CompareArgs, ts: TimeSystem, parsed?: ScenarioSpec, share?: Pick<CompareShare, 'clocks' | 'rows'>): CompareRun {
  return compareScenario(parsed ?? loadScenario(a.scenario, ts), { timeSystem: ts, from: a.from, to: a.to, against: a.against, pairs: a.pairs as 'all' | 'against' | undefined, clocks: share?.clocks, rows: share?.rows });
}

/** The whole comparison, or with `share` one shard's rows and pairs (JSON and CSV only). */
export function runCompare(a: CompareArgs, ts: TimeSystem, share?: CompareShare): Rendered {
  const run = computeCompare(a, ts, share?.scenario, share);
  const { meta, notes } = run;
  const result = share === undefined ? run.result : { ...run.result, clocks: run.result.clocks.filter((c) => share.keepClock(c.id)), pairs: run.result.pairs.filter((p) => share.keepPair(p.a, p.b)) };
  return {
    notes,
    json: () => compareToJson(result, ts, meta),
    csv: () => compareToCsv(result, ts),
    text: () => compareToText(result, ts, meta),
    html: () => page('tauplan — clock comparison', meta.scenario, windowMeta(ts, meta.fromTtJ2000S, meta.toTtJ2000S, meta.against ?? 'TT'), [compareSection(ts, result, meta, compareFigures(ts, result))], notes),
  };
}
