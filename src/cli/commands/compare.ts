/** `tauplan compare SCENARIO [--from --to] [--against ID [--pairs all]]`. */
import type { Argv } from 'yargs';
import { runCompare as compareScenario, type CompareRun } from '../../api/compare.ts';
import { loadScenario } from '../../io/loadScenario.ts';
import { compareToCsv, compareToJson, compareToText } from '../../report/analysisReports.ts';
import { compareFigures, compareSection, page, windowMeta } from '../../report/htmlReport.ts';
import type { TimeSystem } from '../../time/timeSystem.ts';
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

/** The comparison of a scenario file (also a part of `report`). */
export function computeCompare(a: CompareArgs, ts: TimeSystem): CompareRun {
  return compareScenario(loadScenario(a.scenario, ts), { timeSystem: ts, from: a.from, to: a.to, against: a.against, pairs: a.pairs as 'all' | 'against' | undefined });
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
