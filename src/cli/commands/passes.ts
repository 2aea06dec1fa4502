/** `tauplan passes SCENARIO [--from --to --sat --station --jobs]`. */
import type { Argv } from 'yargs';
import { mergePassRows, passesMeta, passesParts, runPasses as passesOf, type PassesOptions } from '../../api/passes.ts';
import { loadScenario } from '../../io/loadScenario.ts';
import type { ScenarioSpec } from '../../model/scenario.ts';
import { modelsSection, page, passesSections, windowMeta } from '../../report/htmlReport.ts';
import { passesToCsv, passesToJson, passesToText } from '../../report/passesReport.ts';
import type { TimeSystem } from '../../time/timeSystem.ts';
import type { Rendered } from '../emit.ts';
import { spreadOverWorkers } from '../scenarioTasks.ts';
import { checkJobs, coresAvailable } from '../workers.ts';

export function passesOptions<T>(y: Argv<T>) {
  return y
    .positional('scenario', { type: 'string', demandOption: true, describe: 'scenario file (JSON or YAML)' })
    .option('from', { type: 'string', requiresArg: true, describe: 'window start (default: scenario window)' })
    .option('to', { type: 'string', requiresArg: true, describe: 'window end (default: scenario window)' })
    .option('sat', { type: 'string', requiresArg: true, describe: 'only these satellites (comma-separated ids or names)' })
    .option('station', { type: 'string', requiresArg: true, describe: 'only these stations (comma-separated ids)' })
    .option('jobs', { type: 'number', requiresArg: true, describe: 'worker threads, one satellite each (default: available cores, capped by the satellites; 1 = none)' });
}

export interface PassesArgs {
  scenario: string;
  from?: string;
  to?: string;
  sat?: string;
  station?: string;
  jobs?: number;
  format?: string;
  quiet?: boolean;
}

/**
 * Satellites spread over worker threads (text, JSON and CSV; HTML needs the clocks here). The rows
 * are merged in the same order as one process gives, whatever the number of workers. `parsed`:
 * the scenario file already read (by --shard), so it is not read twice.
 */
export async function runPasses(a: PassesArgs, ts: TimeSystem, parsed?: ScenarioSpec): Promise<Rendered> {
  checkJobs(a.jobs);
  const scenario = parsed ?? loadScenario(a.scenario, ts);
  const options: PassesOptions = { timeSystem: ts, from: a.from, to: a.to, sat: a.sat, station: a.station };
  // One thread (--jobs 1, or one core) never asks for the parts: the run goes straight to the library.
  if (a.format !== 'html' && (a.jobs ?? coresAvailable()) > 1) {
    const parts = passesParts(scenario, options);
    const args = { scenario: a.scenario, from: a.from, to: a.to, station: a.station };
    const replies = await spreadOverWorkers({ task: 'passes', args, jobs: a.jobs, quiet: a.quiet === true, satellites: parts.satellites, spanS: parts.toTtJ2000S - parts.fromTtJ2000S }, ts);
    if (replies !== null) {
      const rows = mergePassRows(replies.map((r) => r.rows ?? []));
      const meta = passesMeta(scenario, replies.flatMap((r) => r.notes), parts.fromTtJ2000S, parts.toTtJ2000S, scenario.gravity);
      return { notes: meta.notes, json: () => passesToJson(rows, meta, ts), csv: () => passesToCsv(rows, ts), text: () => passesToText(rows, meta, ts) };
    }
  }
  const { context: ctx, rows, meta } = passesOf(scenario, options);
  return {
    notes: meta.notes,
    json: () => passesToJson(rows, meta, ts),
    csv: () => passesToCsv(rows, ts),
    text: () => passesToText(rows, meta, ts),
    html: () =>
      page('tauplan — passes and onboard clock offsets', ctx.scenario.name, windowMeta(ts, ctx.fromTtJ2000S, ctx.toTtJ2000S, ctx.scenario.reference), [...passesSections(ts, ctx.runs, rows, ctx.stations.map((s) => s.id), ctx.fromTtJ2000S, ctx.toTtJ2000S), modelsSection()], meta.notes),
  };
}
