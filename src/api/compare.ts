/** Library use case: satellite and station clocks side by side (command `compare`). */
import { InputError } from '../errors.ts';
import type { ScenarioSpec } from '../model/scenario.ts';
import type { CompareResult } from '../plan/compare.ts';
import { compareScenario } from '../plan/scenarioCompare.ts';
import { scenarioGravity } from '../plan/scenarioRuns.ts';
import { compareToJson, type CompareJson } from '../report/analysisReports.ts';
import { timeArg, timeSystemOf, type CommonOptions, type TimeInput } from './common.ts';
import { resolveOrbit } from './scenario.ts';

/** Options of {@link compareClocks}: the `compare` flags in camelCase. */
export interface CompareOptions extends CommonOptions {
  /** Window start (default: the scenario window). */
  from?: TimeInput;
  /** Window end (default: the scenario window). */
  to?: TimeInput;
}

/** A comparison and its header. */
export interface CompareRun {
  result: CompareResult;
  meta: { scenario: string; gravity: string; fromTtJ2000S: number; toTtJ2000S: number };
}

/** Compare the clocks (the writers' input; {@link compareClocks} gives the JSON). */
export function runCompare(scenario: ScenarioSpec, options?: CompareOptions): CompareRun {
  const ts = timeSystemOf(options);
  const path = scenario.fileName;
  const gravity = scenarioGravity(scenario, ts, path);
  const from = timeArg(ts, options?.from, '--from') ?? scenario.window.start.ttJ2000S;
  const to = timeArg(ts, options?.to, '--to') ?? scenario.window.end.ttJ2000S;
  if (!(to > from)) throw new InputError('the window ends before it starts', options?.to !== undefined ? '--to' : `${path} window`, 'give an end after the start');
  const result = compareScenario(scenario, ts, gravity, from, to, resolveOrbit);
  return { result, meta: { scenario: scenario.name, gravity: gravity.name, fromTtJ2000S: from, toTtJ2000S: to } };
}

/**
 * Every clock of the scenario (satellites and stations) over one window: mean fractional offset
 * [1], drift [ns/day], periodic amplitude [ns] and elapsed proper time minus TT [ns], and the
 * differences of every pair [ns]: the object `tauplan compare --format json` prints. Relativity
 * only, no oscillator model.
 */
export function compareClocks(scenario: ScenarioSpec, options?: CompareOptions): CompareJson {
  const ts = timeSystemOf(options);
  const r = runCompare(scenario, options);
  return compareToJson(r.result, ts, r.meta);
}
