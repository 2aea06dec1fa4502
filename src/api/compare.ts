/** Library use case: satellite and station clocks side by side (command `compare`). */
import { InputError } from '../errors.ts';
import type { ScenarioSpec } from '../model/scenario.ts';
import type { CompareResult } from '../plan/compare.ts';
import { compareScenario } from '../plan/scenarioCompare.ts';
import { scenarioGravity } from '../plan/scenarioRuns.ts';
import { compareToJson, type CompareJson } from '../report/analysisReports.ts';
import { missingGeoidNote } from '../report/notes.ts';
import { timeArg, timeSystemOf, type CommonOptions, type TimeInput } from './common.ts';
import { resolveOrbit } from './scenario.ts';

/** Options of {@link compareClocks}: the `compare` flags in camelCase. */
export interface CompareOptions extends CommonOptions {
  /** Window start (default: the scenario window). */
  from?: TimeInput;
  /** Window end (default: the scenario window). */
  to?: TimeInput;
  /** Reference clock (a satellite or station id): differences are formed against it. */
  against?: string;
  /** With `against`: `all` keeps every pair, `against` (default) only the pairs with the reference. */
  pairs?: 'all' | 'against';
  /**
   * Only these clocks (satellite or station ids) and the pairs among them, e.g. for one shard of a
   * run; each figure equals that of the whole comparison bit for bit. Default: every clock.
   */
  clocks?: readonly string[];
  /**
   * Of `clocks`, those that get a row in `clocks` of the result (their mean rate, drift, periodic
   * amplitude); the others serve only as partners in pairs, which saves most of their cost.
   * Default: every computed clock.
   */
  rows?: readonly string[];
}

/** The header of a comparison. */
export interface CompareMeta {
  scenario: string;
  gravity: string;
  /** Window, s since J2000.0 TT. */
  fromTtJ2000S: number;
  toTtJ2000S: number;
  /** The reference clock, or null (against TT). */
  against: string | null;
}

/** A comparison, its header and its notes (stations without a geoid height). */
export interface CompareRun {
  result: CompareResult;
  meta: CompareMeta;
  notes: string[];
}

/** Compare the clocks (the writers' input; {@link compareClocks} gives the JSON). */
export function runCompare(scenario: ScenarioSpec, options?: CompareOptions): CompareRun {
  const ts = timeSystemOf(options);
  const path = scenario.fileName;
  const gravity = scenarioGravity(scenario, ts, path);
  const from = timeArg(ts, options?.from, '--from') ?? scenario.window.start.ttJ2000S;
  const to = timeArg(ts, options?.to, '--to') ?? scenario.window.end.ttJ2000S;
  if (!(to > from)) throw new InputError('the window ends before it starts', options?.to !== undefined ? '--to' : `${path} window`, 'give an end after the start');
  const against = options?.against;
  const ids = [...scenario.satellites.map((s) => s.id), ...scenario.stations.map((s) => s.id)];
  if (against !== undefined && !ids.includes(against)) throw new InputError(`no clock ${JSON.stringify(against)} in the scenario`, '--against', `use a satellite or station id (${ids.slice(0, 8).join(', ')})`);
  for (const id of [...(options?.clocks ?? []), ...(options?.rows ?? [])]) {
    if (!ids.includes(id)) throw new InputError(`no clock ${JSON.stringify(id)} in the scenario`, 'clocks', `use a satellite or station id (${ids.slice(0, 8).join(', ')})`);
  }
  const subset = { clocks: options?.clocks === undefined ? undefined : new Set(options.clocks), figures: options?.rows === undefined ? undefined : new Set(options.rows) };
  const all = compareScenario(scenario, ts, gravity, from, to, resolveOrbit, against, subset);
  const keepAll = against === undefined || options?.pairs === 'all';
  const result = keepAll ? all : { ...all, pairs: all.pairs.filter((p) => p.a === against || p.b === against) };
  const notes = scenario.stations.filter((s) => !s.geoidHeightGiven && s.body !== 'moon').map((s) => missingGeoidNote(s.id));
  return { result, notes, meta: { scenario: scenario.name, gravity: gravity.name, fromTtJ2000S: from, toTtJ2000S: to, against: against ?? null } };
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
