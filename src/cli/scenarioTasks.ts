/**
 * Messages between the CLI and its scenario worker threads (src/cli/scenarioWorker.ts), and the
 * helpers both sides use. Faults travel as data and are raised again in the main thread.
 */
import { availableParallelism } from 'node:os';
import { InputError } from '../errors.ts';
import type { PassClockRow } from '../plan/passes.ts';
import type { SatelliteResetPlan } from '../plan/resets.ts';
import type { TimeSystem } from '../time/timeSystem.ts';

export interface ScenarioTask {
  task: 'passes' | 'resets';
  /** The command's arguments with `sat` narrowed to one satellite. */
  args: { scenario: string; sat: string } & Record<string, unknown>;
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

/** --jobs: a whole number ≥ 1, default the available cores. */
export function jobsOf(jobs: number | undefined): number {
  if (jobs === undefined) return availableParallelism();
  if (!(Number.isInteger(jobs) && jobs >= 1 && jobs <= 256)) throw new InputError(`--jobs ${jobs} is not a whole number from 1 to 256`, '--jobs', 'give e.g. --jobs 2, or --jobs 1 for no workers');
  return jobs;
}

/** The reply's data, or its fault raised again (an input fault stays an input fault). */
export function unwrap(reply: ScenarioReply, ts: TimeSystem): ScenarioReply {
  if (reply.usedPastExpiry) ts.leap.usedPastExpiry = true;
  if (reply.error !== undefined) {
    if (reply.error.input) throw new InputError(reply.error.what, reply.error.where, reply.error.fix);
    throw new Error(reply.error.what);
  }
  return reply;
}

/**
 * Starting a worker costs about half a second, so without an explicit --jobs only runs of at least
 * this many satellite-days (satellites × window days) are spread over workers.
 */
export const MIN_SATELLITE_DAYS_FOR_WORKERS = 30;
