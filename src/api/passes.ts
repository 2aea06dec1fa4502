/** Library use case: passes over the stations with the onboard clock offsets (command `passes`). */
import type { ScenarioSpec } from '../model/scenario.ts';
import { planPasses, type PassClockRow } from '../plan/passes.ts';
import { runNotes } from '../plan/scenarioResets.ts';
import { prepareScenario, type ScenarioContext } from '../plan/scenarioRuns.ts';
import { passesToJson, type PassesJson, type PassesMeta } from '../report/passesReport.ts';
import { timeSystemOf, type CommonOptions, type TimeInput } from './common.ts';
import { resolveOrbit } from './scenario.ts';

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

/** Compute the passes of a scenario selection (the writers' input; {@link predictPasses} gives the JSON). */
export function runPasses(scenario: ScenarioSpec, options?: PassesOptions): PassesRun {
  const ts = timeSystemOf(options);
  const context = prepareScenario(scenario, ts, options ?? {}, resolveOrbit, scenario.fileName);
  const plan = planPasses(context.runs, context.stations, context.gmstRadAt, context.fromTtJ2000S, context.toTtJ2000S);
  const meta: PassesMeta = {
    notes: runNotes(context),
    scenario: scenario.name,
    fromTtJ2000S: context.fromTtJ2000S,
    toTtJ2000S: context.toTtJ2000S,
    reference: scenario.reference,
    gravity: context.gravity.name,
  };
  return { context, rows: plan.rows, meta };
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
