/**
 * Scenario commands (`passes`, `resets`) over worker threads, one satellite per task: the task and
 * reply messages, the worker's computation (the same library call as in process), and the main
 * thread's side. Faults travel as data and are raised again in the main thread.
 */
import { runPasses, type PassClockRow } from '../api/passes.ts';
import { runResets, type SatelliteResetPlan } from '../api/resets.ts';
import { InputError } from '../errors.ts';
import { loadScenario } from '../io/loadScenario.ts';
import type { TimeSystem } from '../time/timeSystem.ts';
import { jobsFor, runPool, worthWorkers } from './workers.ts';

/** The flags of a scenario command that a worker needs, with `sat` narrowed to one satellite. */
export interface ScenarioTaskArgs {
  scenario: string;
  sat: string;
  from?: string;
  to?: string;
  station?: string;
  horizon?: string;
}

export interface ScenarioTask {
  task: 'passes' | 'resets';
  args: ScenarioTaskArgs;
}

/** Data every scenario worker starts with. */
export interface ScenarioWorkerInit {
  /** What `now` means in the arguments (the main thread's reading, s since J2000.0 TT), if it has one. */
  nowTtJ2000S?: number;
}

export interface ScenarioReply {
  rows?: PassClockRow[];
  plans?: SatelliteResetPlan[];
  notes: string[];
  usedPastExpiry: boolean;
  error?: { input: boolean; what: string; where: string; fix: string };
}

/** One task: the same library call as in process, faults returned as data. */
export function runScenarioTask(task: ScenarioTask, ts: TimeSystem): ScenarioReply {
  try {
    const a = task.args;
    const scenario = loadScenario(a.scenario, ts);
    const sel = { timeSystem: ts, from: a.from, to: a.to, sat: a.sat, station: a.station };
    if (task.task === 'passes') {
      const r = runPasses(scenario, sel);
      return { rows: r.rows, notes: r.meta.notes, usedPastExpiry: ts.leap.usedPastExpiry };
    }
    const r = runResets(scenario, { ...sel, horizon: a.horizon });
    return { plans: r.plans, notes: r.meta.notes, usedPastExpiry: ts.leap.usedPastExpiry };
  } catch (e) {
    return e instanceof InputError
      ? { notes: [], usedPastExpiry: false, error: { input: true, what: e.what, where: e.where, fix: e.fix } }
      : { notes: [], usedPastExpiry: false, error: { input: false, what: e instanceof Error ? `${e.name}: ${e.message}` : String(e), where: '', fix: '' } };
  }
}

/** The reply's data, or its fault raised again (an input fault stays an input fault). */
function unwrap(reply: ScenarioReply, ts: TimeSystem): ScenarioReply {
  if (reply.usedPastExpiry) ts.leap.usedPastExpiry = true;
  if (reply.error !== undefined) {
    if (reply.error.input) throw new InputError(reply.error.what, reply.error.where, reply.error.fix);
    throw new Error(reply.error.what);
  }
  return reply;
}

/** What a scenario command asks of the pool. */
export interface ScenarioSpread {
  task: 'passes' | 'resets';
  args: Omit<ScenarioTaskArgs, 'sat'>;
  /** `--jobs` as given. */
  jobs: number | undefined;
  quiet: boolean;
  /** The satellites of the run and its window length [s]. */
  satellites: readonly string[];
  spanS: number;
}

/**
 * The replies of one task per satellite, in satellite order, or null when the run is better done
 * in process (one thread or satellite, or too little work without an explicit `--jobs`).
 */
export async function spreadOverWorkers(s: ScenarioSpread, ts: TimeSystem): Promise<ScenarioReply[] | null> {
  const threads = jobsFor(s.jobs, s.satellites.length, ['satellite', 'satellites'], s.quiet);
  if (!worthWorkers(threads, s.jobs, s.satellites.length, (s.satellites.length * s.spanS) / 86400)) return null;
  const tasks: ScenarioTask[] = s.satellites.map((sat) => ({ task: s.task, args: { ...s.args, sat } }));
  const init: ScenarioWorkerInit = { nowTtJ2000S: ts.nowIfUsed?.ttJ2000S };
  const replies = await runPool<ScenarioTask, ScenarioReply>('scenarioWorker', init, tasks, threads);
  return replies.map((r) => unwrap(r, ts));
}
