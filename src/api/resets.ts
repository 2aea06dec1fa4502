/** Library use case: keep-in adjustment plans (command `resets`). */
import type { ScenarioSpec } from '../model/scenario.ts';
import type { SatelliteResetPlan } from '../plan/resets.ts';
import { planScenarioResets, runNotes } from '../plan/scenarioResets.ts';
import { prepareScenario, type ScenarioContext } from '../plan/scenarioRuns.ts';
import { resetsToJson, type ResetsJson, type ResetsMeta } from '../report/resetsReport.ts';
import { durationArg, timeSystemOf, type CommonOptions, type DurationInput, type TimeInput } from './common.ts';
import { resolveOrbit } from './scenario.ts';

/** Options of {@link planResets}: the `resets` flags in camelCase. */
export interface ResetsOptions extends CommonOptions {
  /** How far ahead to plan (default: the scenario's policy.horizon, else 180 d). */
  horizon?: DurationInput;
  /** Plan start (default: the scenario window start). */
  from?: TimeInput;
  /** Only these satellites: comma-separated ids or names. */
  sat?: string;
  /** Only contacts with these stations: comma-separated ids. */
  station?: string;
}

/** Everything the `resets` writers need. */
export interface ResetsRun {
  context: ScenarioContext;
  plans: SatelliteResetPlan[];
  meta: ResetsMeta;
}

/** The horizon [s]: the option, else the scenario's policy.horizon (180 d by default). */
export function resetsHorizonS(scenario: ScenarioSpec, horizon: DurationInput | undefined): number {
  return horizon === undefined ? scenario.policy.horizonS : durationArg(horizon, '--horizon');
}

/** The header of the `resets` output. */
export function resetsMeta(scenario: ScenarioSpec, notes: string[], fromTtJ2000S: number, toTtJ2000S: number): ResetsMeta {
  const p = scenario.policy;
  return { notes, scenario: scenario.name, fromTtJ2000S, toTtJ2000S, reference: scenario.reference, marginNs: p.marginNs, leadTimeS: p.leadTimeS ?? 0, prefer: p.prefer };
}

/**
 * The keep-in plans of an already prepared scenario, one per satellite with a limit, in scenario
 * order (the CLI prepares the context itself). `path` names the scenario in messages.
 */
export function planPreparedResets(context: ScenarioContext, path: string): SatelliteResetPlan[] {
  return planScenarioResets(context, path);
}

/** Compute the keep-in plans (the writers' input; {@link planResets} gives the JSON). */
export function runResets(scenario: ScenarioSpec, options?: ResetsOptions): ResetsRun {
  const ts = timeSystemOf(options);
  const { horizon, ...sel } = options ?? {};
  const context = prepareScenario(scenario, ts, { ...sel, horizonS: resetsHorizonS(scenario, horizon) }, resolveOrbit, scenario.fileName);
  const plans = planScenarioResets(context, scenario.fileName);
  return { context, plans, meta: resetsMeta(scenario, runNotes(context), context.fromTtJ2000S, context.toTtJ2000S) };
}

/**
 * When each satellite clock with a keep-in limit (`clock.keepInNs`) first leaves it, with the 95 %
 * band from the noise model, and the adjustments (phase step [ns] or frequency step [1]) placed in
 * real passes before it: the object `tauplan resets --format json` prints.
 * @throws InputError when no selected satellite has a keep-in limit
 */
export function planResets(scenario: ScenarioSpec, options?: ResetsOptions): ResetsJson {
  const ts = timeSystemOf(options);
  const r = runResets(scenario, options);
  return resetsToJson(r.plans, r.meta, ts);
}
