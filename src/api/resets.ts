/** Library use case: keep-in adjustment plans (command `resets`). */
import type { ScenarioSpec } from '../model/scenario.ts';
import { BAND_RULE_TEXT } from '../plan/band.ts';
import type { SatelliteResetPlan } from '../plan/resets.ts';
import { planScenarioResets, runNotes } from '../plan/scenarioResets.ts';
import { prepareScenario, resolveWindow, selectSatellites, type ScenarioContext } from '../plan/scenarioRuns.ts';
import { resetsToJson, type ResetsJson, type ResetsMeta } from '../report/resetsReport.ts';
import { durationArg, timeSystemOf, type CommonOptions, type DurationInput, type TimeInput } from './common.ts';
import { resolveOrbit } from './scenario.ts';

export type { SatelliteResetPlan } from '../plan/resets.ts';
export type { ResetsMeta } from '../report/resetsReport.ts';

/** How the 95 % prediction band of a plan is formed, in words (the reports print it). */
export const PREDICTION_BAND_RULE: string = BAND_RULE_TEXT;

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
  /**
   * When no selected satellite has a keep-in limit: no plans (e.g. one shard of a run whose other
   * satellites have limits) instead of an input error. Default false.
   */
  noPlansWithoutLimit?: boolean;
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

/** The header of the `resets` output; `notes` are the run's findings about its inputs. */
export function resetsMeta(scenario: ScenarioSpec, notes: string[], fromTtJ2000S: number, toTtJ2000S: number): ResetsMeta {
  const p = scenario.policy;
  return { notes, scenario: scenario.name, fromTtJ2000S, toTtJ2000S, reference: scenario.reference, marginNs: p.marginNs, leadTimeS: p.leadTimeS ?? 0, prefer: p.prefer, targetNs: p.targetNs, minSpacingS: p.minSpacingS, blackouts: p.blackouts.length };
}

/**
 * The satellites a `resets` run plans (those the selection names that have a keep-in limit, in
 * scenario order) and its window [s since J2000.0 TT], without preparing any orbit: what a caller
 * needs to split the run over threads or shards, one satellite per part (`sat: id`).
 */
export function resetsParts(scenario: ScenarioSpec, options?: ResetsOptions): { satellites: string[]; fromTtJ2000S: number; toTtJ2000S: number } {
  const ts = timeSystemOf(options);
  const sats = selectSatellites(scenario, options ?? {}).filter((s) => s.clock !== null && s.clock.keepInNs !== null);
  const horizonS = resetsHorizonS(scenario, options?.horizon);
  const { from, to } = resolveWindow(scenario, ts, { ...(options ?? {}), horizonS }, scenario.fileName);
  return { satellites: sats.map((s) => s.id), fromTtJ2000S: from, toTtJ2000S: to };
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
  const { horizon, noPlansWithoutLimit, ...sel } = options ?? {};
  const context = prepareScenario(scenario, ts, { ...sel, horizonS: resetsHorizonS(scenario, horizon) }, resolveOrbit, scenario.fileName);
  const none = noPlansWithoutLimit === true && !context.runs.some((r) => r.keepInNs !== null);
  const plans = none ? [] : planScenarioResets(context, scenario.fileName);
  // Notes about the planned satellites only: what worker threads and shards (one planned satellite
  // each) report, so --jobs and --shard runs write the same notes as one process.
  const notes = runNotes({ runs: context.runs.filter((r) => r.keepInNs !== null) });
  return { context, plans, meta: resetsMeta(scenario, notes, context.fromTtJ2000S, context.toTtJ2000S) };
}

/**
 * When each satellite clock with a keep-in limit (`clock.keepInNs`) first leaves it, with the 95 %
 * band from the noise model, and the adjustments (phase step [ns] or frequency step [1]) placed in
 * real passes of uplink stations before it, respecting the policy's target, spacing and blackouts
 * and the clock's step resolution: the object `tauplan resets --format json` prints.
 * @throws InputError when no selected satellite has a keep-in limit
 */
export function planResets(scenario: ScenarioSpec, options?: ResetsOptions): ResetsJson {
  const ts = timeSystemOf(options);
  const r = runResets(scenario, options);
  return resetsToJson(r.plans, r.meta, ts);
}
