/** Library use case: passes over the stations with the onboard clock offsets (command `passes`). */
import type { ScenarioSpec } from '../model/scenario.ts';
import { comparePassRows, planPasses, type PassClockRow } from '../plan/passes.ts';
import { runNotes } from '../plan/scenarioResets.ts';
import { prepareScenario, resolveWindow, selectSatellites, type ScenarioContext } from '../plan/scenarioRuns.ts';
import { passesToJson, type PassesJson, type PassesMeta } from '../report/passesReport.ts';
import { timeSystemOf, type CommonOptions, type TimeInput } from './common.ts';
import { resolveOrbit } from './scenario.ts';

export type { PassClockRow } from '../plan/passes.ts';
export type { PassesMeta } from '../report/passesReport.ts';
export type { ScenarioContext } from '../plan/scenarioRuns.ts';

/** Options of {@link predictPasses}: the `passes` flags in camelCase. */
export interface PassesOptions extends CommonOptions {
  /** Window start (default: the scenario window). */
  from?: TimeInput;
  /** Window end (default: the scenario window). */
  to?: TimeInput;
  /** Only these satellites: comma-separated ids or names. */
  sat?: string;
  /** Only these stations: comma-separated ids. */
  station?: string;
}

/** Everything the `passes` writers need: the prepared scenario, the rows (sorted by AOS) and the header. */
export interface PassesRun {
  context: ScenarioContext;
  rows: PassClockRow[];
  meta: PassesMeta;
}

/** The header of the `passes` output; `notes` are the run's findings about its inputs. */
export function passesMeta(scenario: ScenarioSpec, notes: string[], fromTtJ2000S: number, toTtJ2000S: number, gravityName: string): PassesMeta {
  return { notes, scenario: scenario.name, fromTtJ2000S, toTtJ2000S, reference: scenario.reference, gravity: gravityName };
}

/**
 * The satellites a `passes` run covers (in scenario order) and its window [s since J2000.0 TT],
 * without preparing any orbit: what a caller needs to split the run over threads or shards, one
 * satellite per part (`sat: id`); {@link mergePassRows} joins the parts' rows.
 */
export function passesParts(scenario: ScenarioSpec, options?: PassesOptions): { satellites: string[]; fromTtJ2000S: number; toTtJ2000S: number } {
  const ts = timeSystemOf(options);
  const sats = selectSatellites(scenario, options ?? {});
  const { from, to } = resolveWindow(scenario, ts, options ?? {}, scenario.fileName);
  return { satellites: sats.map((s) => s.id), fromTtJ2000S: from, toTtJ2000S: to };
}

/** The rows of several parts of one run in the order one run gives (by AOS, then satellite and station). */
export function mergePassRows(parts: readonly (readonly PassClockRow[])[]): PassClockRow[] {
  return parts.flat().sort(comparePassRows);
}

/** Compute the passes of a scenario selection (the writers' input; {@link predictPasses} gives the JSON). */
export function runPasses(scenario: ScenarioSpec, options?: PassesOptions): PassesRun {
  const ts = timeSystemOf(options);
  const context = prepareScenario(scenario, ts, options ?? {}, resolveOrbit, scenario.fileName);
  const plan = planPasses(context.runs, context.stations, context.gmstRadAt, context.fromTtJ2000S, context.toTtJ2000S);
  return { context, rows: plan.rows, meta: passesMeta(scenario, runNotes(context), context.fromTtJ2000S, context.toTtJ2000S, context.gravity.name) };
}

/**
 * Every pass of the selected satellites over the selected stations, with the clock offset at AOS
 * and LOS [ns], the periodic relativistic term and the one-way signal terms at TCA [ns]: the object
 * `tauplan passes --format json` prints. Times are UTC ISO strings.
 */
export function predictPasses(scenario: ScenarioSpec, options?: PassesOptions): PassesJson {
  const ts = timeSystemOf(options);
  const r = runPasses(scenario, options);
  return passesToJson(r.rows, r.meta, ts);
}
