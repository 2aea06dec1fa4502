/** `tauplan resets SCENARIO [--horizon 180d --from --sat --station --jobs]`. */
import type { Argv } from 'yargs';
import { PREDICTION_BAND_RULE, resetsMeta, resetsParts, runResets as resetsOf, type ResetsOptions, type ResetsRun } from '../../api/resets.ts';
import { loadScenario } from '../../io/loadScenario.ts';
import type { ScenarioSpec } from '../../model/scenario.ts';
import { modelsSection, page, resetsSection, windowMeta } from '../../report/htmlReport.ts';
import { resetsToCsv, resetsToJson, resetsToText } from '../../report/resetsReport.ts';
import type { TimeSystem } from '../../time/timeSystem.ts';
import type { Rendered } from '../emit.ts';
import { spreadOverWorkers } from '../scenarioTasks.ts';
import { checkJobs, coresAvailable } from '../workers.ts';

export function resetsOptions<T>(y: Argv<T>) {
  return y
    .positional('scenario', { type: 'string', demandOption: true, describe: 'scenario file (JSON or YAML)' })
    .option('horizon', { type: 'string', requiresArg: true, describe: 'how far ahead to plan (default: policy.horizon, else 180d)' })
    .option('from', { type: 'string', requiresArg: true, describe: 'plan start (default: scenario window start)' })
    .option('sat', { type: 'string', requiresArg: true, describe: 'only these satellites (comma-separated)' })
    .option('station', { type: 'string', requiresArg: true, describe: 'only contacts with these stations (comma-separated)' })
    .option('jobs', { type: 'number', requiresArg: true, describe: 'worker threads, one satellite each (default: available cores, capped by the satellites; 1 = none)' });
}

export interface ResetsArgs {
  scenario: string;
  horizon?: string;
  from?: string;
  sat?: string;
  station?: string;
  jobs?: number;
  format?: string;
  quiet?: boolean;
}

function optionsOf(a: ResetsArgs, ts: TimeSystem): ResetsOptions {
  return { timeSystem: ts, horizon: a.horizon, from: a.from, sat: a.sat, station: a.station };
}

/** The plans of a scenario file, in process (also a part of `report`). */
export function computeResets(a: ResetsArgs, ts: TimeSystem): ResetsRun {
  return resetsOf(loadScenario(a.scenario, ts), optionsOf(a, ts));
}

/**
 * Satellites spread over worker threads (text, JSON and CSV); plans come back in scenario order.
 * `parsed`: the scenario file already read (by --shard), so it is not read twice.
 */
export async function runResets(a: ResetsArgs, ts: TimeSystem, parsed?: ScenarioSpec): Promise<Rendered & { noteStages: string[][] }> {
  checkJobs(a.jobs);
  const scenario = parsed ?? loadScenario(a.scenario, ts);
  const options = optionsOf(a, ts);
  // One thread (--jobs 1, or one core) never asks for the parts: the run goes straight to the library.
  if (a.format !== 'html' && (a.jobs ?? coresAvailable()) > 1) {
    const parts = resetsParts(scenario, options);
    const args = { scenario: a.scenario, horizon: a.horizon, from: a.from, station: a.station };
    const replies = await spreadOverWorkers({ task: 'resets', args, jobs: a.jobs, quiet: a.quiet === true, satellites: parts.satellites, spanS: parts.toTtJ2000S - parts.fromTtJ2000S }, ts);
    if (replies !== null) {
      const plans = replies.flatMap((r) => r.plans ?? []);
      const meta = resetsMeta(scenario, replies.flatMap((r) => r.notes), parts.fromTtJ2000S, parts.toTtJ2000S);
      return { notes: meta.notes, noteStages: [meta.notes, plans.flatMap((p) => p.notes)], json: () => resetsToJson(plans, meta, ts), csv: () => resetsToCsv(plans, ts, meta), text: () => resetsToText(plans, meta, ts) };
    }
  }
  const { context: ctx, plans, meta } = resetsOf(scenario, options);
  return {
    notes: meta.notes,
    // The notes' stages, for --shard (src/cli/shard.ts): the orbits' notes, then each plan's.
    noteStages: [meta.notes, plans.flatMap((p) => p.notes)],
    html: () => page('tauplan — keep-in adjustment plan', ctx.scenario.name, windowMeta(ts, ctx.fromTtJ2000S, ctx.toTtJ2000S, ctx.scenario.reference), [resetsSection(ts, ctx.runs, plans, ctx.fromTtJ2000S, ctx.toTtJ2000S, PREDICTION_BAND_RULE, [...meta.notes, ...plans.flatMap((p) => p.notes)]), modelsSection()]),
    json: () => resetsToJson(plans, meta, ts),
    csv: () => resetsToCsv(plans, ts, meta),
    text: () => resetsToText(plans, meta, ts),
  };
}
