/** `tauplan resets SCENARIO [--horizon 180d]`. */
import type { Argv } from 'yargs';
import type { SatelliteResetPlan } from '../../plan/resets.ts';
import { planPreparedResets } from '../../api/resets.ts';
import { resetsToCsv, resetsToJson, resetsToText, type ResetsMeta } from '../../report/resetsReport.ts';
import { parsePositiveDurationS } from '../../time/duration.ts';
import type { TimeSystem } from '../../time/timeSystem.ts';
import type { Rendered } from '../emit.ts';
import { loadScenarioContext, resolveWindow, selectSatellites, type ScenarioContext } from '../scenarioContext.ts';
import { loadScenario } from '../../io/loadScenario.ts';
import type { ScenarioSpec } from '../../io/scenario.ts';
import { jobsOf, unwrap, MIN_SATELLITE_DAYS_FOR_WORKERS, type ScenarioReply, type ScenarioTask } from '../scenarioTasks.ts';
import { runPool } from '../workers.ts';
import { modelsSection, page, resetsSection, windowMeta } from '../../report/htmlReport.ts';
import { PREDICTION_RULE_TEXT } from '../../clock/noise.ts';

export function resetsOptions<T>(y: Argv<T>) {
  return y
    .positional('scenario', { type: 'string', demandOption: true, describe: 'scenario file (JSON or YAML)' })
    .option('horizon', { type: 'string', requiresArg: true, describe: 'how far ahead to plan (default: policy.horizon, else 180d)' })
    .option('from', { type: 'string', requiresArg: true, describe: 'plan start (default: scenario window start)' })
    .option('sat', { type: 'string', requiresArg: true, describe: 'only these satellites (comma-separated)' })
    .option('station', { type: 'string', requiresArg: true, describe: 'only contacts with these stations (comma-separated)' })
    .option('jobs', { type: 'number', requiresArg: true, describe: 'worker threads, one satellite each (default: available cores; 1 = none)' });
}

export interface ResetsArgs {
  scenario: string;
  horizon?: string;
  from?: string;
  sat?: string;
  station?: string;
  jobs?: number;
  format?: string;
}

export interface ResetsOutcome {
  ctx: ScenarioContext;
  plans: SatelliteResetPlan[];
  meta: ResetsMeta;
}

export function computeResets(a: ResetsArgs, ts: TimeSystem): ResetsOutcome {
  const scenario = loadScenario(a.scenario, ts);
  const ctx = loadScenarioContext(a.scenario, ts, { ...a, horizonS: horizonOf(a, scenario) }, scenario);
  // Contacts at uplink stations only, policy and hardware steps: the library's use case (same plans).
  const plans = planPreparedResets(ctx, a.scenario);
  const meta = metaOf(ctx.scenario, ctx.fromTtJ2000S, ctx.toTtJ2000S, ctx.runs.flatMap((r) => (r.note === null ? [] : [r.note])));
  return { ctx, plans, meta };
}

/** Header facts of a plan. */
function metaOf(scenario: ScenarioSpec, fromTtJ2000S: number, toTtJ2000S: number, notes: string[]): ResetsMeta {
  const p = scenario.policy;
  return { notes, scenario: scenario.name, fromTtJ2000S, toTtJ2000S, reference: scenario.reference, marginNs: p.marginNs, leadTimeS: p.leadTimeS ?? 0, prefer: p.prefer, targetNs: p.targetNs, minSpacingS: p.minSpacingS, blackouts: p.blackouts.length };
}

/** The horizon [s]: --horizon, else the scenario's policy.horizon (180 d by default). */
function horizonOf(a: ResetsArgs, scenario: ScenarioSpec): number {
  return a.horizon === undefined ? scenario.policy.horizonS : parsePositiveDurationS(a.horizon, '--horizon');
}

/** Satellites spread over worker threads (text, JSON and CSV); plans come back in scenario order. */
export async function runResets(a: ResetsArgs, ts: TimeSystem): Promise<Rendered> {
  const jobs = jobsOf(a.jobs);
  if (jobs > 1 && a.format !== 'html') {
    const scenario = loadScenario(a.scenario, ts);
    const sats = selectSatellites(scenario, a).filter((s) => s.clock !== null && s.clock.keepInNs !== null);
    const horizonS = horizonOf(a, scenario);
    const { from, to } = resolveWindow(scenario, ts, { ...a, horizonS }, a.scenario);
    if (sats.length > 1 && (a.jobs !== undefined || (sats.length * (to - from)) / 86400 >= MIN_SATELLITE_DAYS_FOR_WORKERS)) {
      const replies = await runPool<ScenarioTask, ScenarioReply>('scenarioWorker', sats.map((s) => ({ task: 'resets', args: { ...a, sat: s.id, jobs: 1 }, nowTtJ2000S: ts.nowIfUsed?.ttJ2000S })), jobs);
      const plans = replies.flatMap((r) => unwrap(r, ts).plans ?? []);
      const meta = metaOf(scenario, from, to, replies.flatMap((r) => r.notes));
      return { notes: meta.notes, json: () => resetsToJson(plans, meta, ts), csv: () => resetsToCsv(plans, ts, meta), text: () => resetsToText(plans, meta, ts) };
    }
  }
  return runResetsInProcess(a, ts);
}

function runResetsInProcess(a: ResetsArgs, ts: TimeSystem): Rendered {
  const { ctx, plans, meta } = computeResets(a, ts);
  return {
    notes: meta.notes,
    html: () => page('tauplan — keep-in adjustment plan', ctx.scenario.name, windowMeta(ts, ctx.fromTtJ2000S, ctx.toTtJ2000S, ctx.scenario.reference), [resetsSection(ts, ctx.runs, plans, ctx.fromTtJ2000S, ctx.toTtJ2000S, PREDICTION_RULE_TEXT, [...meta.notes, ...plans.flatMap((p) => p.notes)]), modelsSection()]),
    json: () => resetsToJson(plans, meta, ts),
    csv: () => resetsToCsv(plans, ts, meta),
    text: () => resetsToText(plans, meta, ts),
  };
}
