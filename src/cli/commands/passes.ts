/** `tauplan passes SCENARIO [--from --to --sat --station]`. */
import type { Argv } from 'yargs';
import { comparePassRows, planPasses, type PassClockRow } from '../../plan/passes.ts';
import type { SatelliteClockRun } from '../../plan/satelliteClock.ts';
import { loadScenario } from '../../io/loadScenario.ts';
import { jobsOf, unwrap, MIN_SATELLITE_DAYS_FOR_WORKERS, type ScenarioReply, type ScenarioTask } from '../scenarioTasks.ts';
import { runPool } from '../workers.ts';
import { passesToCsv, passesToJson, passesToText } from '../../report/passesReport.ts';
import type { TimeSystem } from '../../time/timeSystem.ts';
import type { Rendered } from '../emit.ts';
import { loadScenarioContext, resolveWindow, selectSatellites } from '../scenarioContext.ts';

/** Notes of satellites whose orbit source failed inside the window. */
export function notesOf(runs: readonly SatelliteClockRun[]): string[] {
  return runs.flatMap((r) => (r.note === null ? [] : [r.note]));
}
import { modelsSection, page, passesSections, windowMeta } from '../../report/htmlReport.ts';

export function passesOptions<T>(y: Argv<T>) {
  return y
    .positional('scenario', { type: 'string', demandOption: true, describe: 'scenario file (JSON or YAML)' })
    .option('from', { type: 'string', requiresArg: true, describe: 'window start (default: scenario window)' })
    .option('to', { type: 'string', requiresArg: true, describe: 'window end (default: scenario window)' })
    .option('sat', { type: 'string', requiresArg: true, describe: 'only these satellites (comma-separated ids or names)' })
    .option('station', { type: 'string', requiresArg: true, describe: 'only these stations (comma-separated ids)' })
    .option('jobs', { type: 'number', requiresArg: true, describe: 'worker threads, one satellite each (default: available cores; 1 = none)' });
}

export interface PassesArgs {
  scenario: string;
  from?: string;
  to?: string;
  sat?: string;
  station?: string;
  jobs?: number;
  format?: string;
}

/** The pass rows of a scenario selection, in process (what a worker computes for one satellite). */
export function computePassRows(a: PassesArgs, ts: TimeSystem): { rows: PassClockRow[]; notes: string[] } {
  const ctx = loadScenarioContext(a.scenario, ts, a);
  return { rows: planPasses(ctx.runs, ctx.stations, ctx.gmstRadAt, ctx.fromTtJ2000S, ctx.toTtJ2000S).rows, notes: notesOf(ctx.runs) };
}

/**
 * Satellites spread over worker threads (text, JSON and CSV; HTML needs the clocks here). The rows
 * are merged in the same order as one process gives, whatever the number of workers.
 */
export async function runPasses(a: PassesArgs, ts: TimeSystem): Promise<Rendered> {
  const jobs = jobsOf(a.jobs);
  if (jobs > 1 && a.format !== 'html') {
    const scenario = loadScenario(a.scenario, ts);
    const sats = selectSatellites(scenario, a);
    const { from, to } = resolveWindow(scenario, ts, a, a.scenario);
    if (sats.length > 1 && (a.jobs !== undefined || (sats.length * (to - from)) / 86400 >= MIN_SATELLITE_DAYS_FOR_WORKERS)) {
      const replies = await runPool<ScenarioTask, ScenarioReply>('scenarioWorker', sats.map((s) => ({ task: 'passes', args: { ...a, sat: s.id, jobs: 1 }, nowTtJ2000S: ts.nowIfUsed?.ttJ2000S })), jobs);
      const rows = replies.flatMap((r) => unwrap(r, ts).rows ?? []);
      rows.sort(comparePassRows);
      const meta = { notes: replies.flatMap((r) => r.notes), scenario: scenario.name, fromTtJ2000S: from, toTtJ2000S: to, reference: scenario.reference, gravity: scenario.gravity };
      return { notes: meta.notes, json: () => passesToJson(rows, meta, ts), csv: () => passesToCsv(rows, ts), text: () => passesToText(rows, meta, ts) };
    }
  }
  return runPassesInProcess(a, ts);
}

function runPassesInProcess(a: PassesArgs, ts: TimeSystem): Rendered {
  const ctx = loadScenarioContext(a.scenario, ts, a);
  const plan = planPasses(ctx.runs, ctx.stations, ctx.gmstRadAt, ctx.fromTtJ2000S, ctx.toTtJ2000S);
  const meta = { notes: notesOf(ctx.runs), scenario: ctx.scenario.name, fromTtJ2000S: ctx.fromTtJ2000S, toTtJ2000S: ctx.toTtJ2000S, reference: ctx.scenario.reference, gravity: ctx.gravity.name };
  return {
    notes: meta.notes,
    json: () => passesToJson(plan.rows, meta, ts),
    csv: () => passesToCsv(plan.rows, ts),
    text: () => passesToText(plan.rows, meta, ts),
    html: () =>
      page('tauplan — passes and onboard clock offsets', ctx.scenario.name, windowMeta(ts, ctx.fromTtJ2000S, ctx.toTtJ2000S, ctx.scenario.reference), [...passesSections(ts, ctx.runs, plan.rows, ctx.stations.map((s) => s.id), ctx.fromTtJ2000S, ctx.toTtJ2000S), modelsSection()], meta.notes),
  };
}
