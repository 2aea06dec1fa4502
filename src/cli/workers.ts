/**
 * The one worker pool of the CLI, and the one `--jobs` check.
 *
 * Workers start on either form of the CLI: from the bundle in dist/ (each worker has its own
 * bundle, no loader needed) or from the TypeScript sources (the worker registers the tsx loader
 * itself: a loader given to the parent, or `--import` in execArgv, does not reach a worker on Node 20).
 *
 * `--jobs` is a whole number ≥ 1 in every command that takes it (default: the available cores),
 * and the threads started are capped by the work and by the cores: more threads than cores only
 * add memory (tens of MB each) and start-up time. An explicit `--jobs` that is capped says so on
 * stderr in one line.
 */
import { availableParallelism } from 'node:os';
import { Worker, type MessagePort } from 'node:worker_threads';
import { InOrderBuffer } from '../api/catalogue.ts';
import { InputError, InternalError } from '../errors.ts';

export type WorkerModule = 'sizeWorker' | 'scenarioWorker' | 'fitWorker';

/** Refuse a `--jobs` that is not a whole number ≥ 1 (absent is fine: the default). */
export function checkJobs(jobs: number | undefined): void {
  if (jobs !== undefined && !(Number.isSafeInteger(jobs) && jobs >= 1)) {
    throw new InputError(`--jobs ${jobs} is not a whole number ≥ 1`, '--jobs', 'give e.g. --jobs 4, or --jobs 1 to run without worker threads');
  }
}

/** How the pieces of work of a command are named in the cap message: [one, many]. */
export type WorkUnit = readonly [string, string];

/** The cores the pool may use (os.availableParallelism; a seam for tests through TAUPLAN_CORES is not offered). */
export function coresAvailable(): number {
  return Math.max(1, availableParallelism());
}

/**
 * Worker threads for `work` independent pieces: `--jobs` (checked; default the available cores),
 * capped by the work and by the cores. When an explicit `--jobs` is capped, one line on stderr says
 * so (unless `quiet`).
 */
export function jobsFor(jobs: number | undefined, work: number, unit: WorkUnit, quiet: boolean): number {
  checkJobs(jobs);
  const cores = coresAvailable();
  const pieces = Math.max(1, work);
  const capped = Math.max(1, Math.min(jobs ?? cores, cores, pieces));
  if (jobs !== undefined && capped < jobs && !quiet) {
    const n = (count: number, [one, many]: WorkUnit): string => `${count} ${count === 1 ? one : many}`;
    process.stderr.write(`tauplan: --jobs ${jobs} capped at ${capped} (${n(cores, ['core', 'cores'])}, ${n(work, unit)})\n`);
  }
  return capped;
}

/**
 * Starting a worker costs about half a second, so without an explicit --jobs only scenario runs of
 * at least this many satellite-days (satellites × window days) are spread over workers.
 */
export const MIN_SATELLITE_DAYS_FOR_WORKERS = 30;

/** Whether a scenario run goes to workers: more than one thread and satellite, and enough work unless --jobs was given. */
export function worthWorkers(threads: number, given: number | undefined, satellites: number, satelliteDays: number): boolean {
  return threads > 1 && satellites > 1 && (given !== undefined || satelliteDays >= MIN_SATELLITE_DAYS_FOR_WORKERS);
}

/** Threads started by this process so far (for the tests: `--jobs 1000` must not start 1000). */
let started = 0;

/** Worker threads this process has started. */
export function workersStarted(): number {
  return started;
}

export function startModuleWorker(name: WorkerModule, workerData: unknown): Worker {
  started++;
  if (/\/dist\/[^/]*$/.test(import.meta.url)) return new Worker(new URL(`./${name}.mjs`, import.meta.url), { workerData });
  const tsxApi = import.meta.resolve('tsx/esm/api');
  const workerModule = new URL(`./${name}.ts`, import.meta.url).href;
  const boot = `import(${JSON.stringify(tsxApi)}).then((m) => { m.register(); return import(${JSON.stringify(workerModule)}); });`;
  return new Worker(boot, { eval: true, workerData });
}

/** A numbered piece of work sent to a worker. */
export interface PoolMessage<T> {
  n: number;
  payload: T;
}

/** A worker's answer to one {@link PoolMessage}. */
export interface PoolReply<R> {
  n: number;
  result: R;
}

/**
 * Worker side of the pool: answer each numbered message with `handle(payload)`; `null` stops.
 * Every worker module is one call of this.
 */
export function serveTasks<T, R>(port: MessagePort, handle: (payload: T) => R): void {
  port.on('message', (msg: PoolMessage<T> | null) => {
    if (msg === null) {
      port.close();
      return;
    }
    const reply: PoolReply<R> = { n: msg.n, result: handle(msg.payload) };
    port.postMessage(reply);
  });
}

/**
 * The pool: run `tasks` on at most `threads` worker threads of module `name` (each started once
 * with `workerData`), and call `onResult` with the results **in task order**, each as soon as every
 * task before it is done. A worker holds at most two tasks, and no task is sent more than
 * `64 × threads` ahead of the oldest unfinished one, so a slow task (deep-space orbits) holds back
 * a bounded number of results.
 */
export async function runOrderedPool<T, R>(name: WorkerModule, workerData: unknown, tasks: readonly T[], threads: number, onResult: (result: R, n: number) => void): Promise<void> {
  if (tasks.length === 0) return;
  const workerCount = Math.max(1, Math.min(threads, tasks.length));
  const window = workerCount * 64;
  const order = new InOrderBuffer<R>();
  const workers: Worker[] = [];
  try {
    await new Promise<void>((resolve, reject) => {
      let next = 0;
      let done = 0;
      let failed = false;
      const inFlight = new Map<Worker, number>();
      const fail = (e: unknown): void => {
        if (failed) return;
        failed = true;
        reject(e instanceof Error ? e : new InternalError(String(e), 'worker'));
      };
      const feed = (w: Worker): void => {
        while (!failed && (inFlight.get(w) ?? 0) < 2 && next < tasks.length && next < order.next + window) {
          const n = next++;
          const msg: PoolMessage<T> = { n, payload: tasks[n] };
          inFlight.set(w, (inFlight.get(w) ?? 0) + 1);
          w.postMessage(msg);
        }
      };
      for (let i = 0; i < workerCount; i++) {
        const w = startModuleWorker(name, workerData);
        workers.push(w);
        inFlight.set(w, 0);
        w.on('message', (reply: PoolReply<R>) => {
          if (failed) return;
          inFlight.set(w, (inFlight.get(w) ?? 1) - 1);
          try {
            const first = order.next;
            order.put(reply.n, reply.result).forEach((r, k) => {
              done++;
              onResult(r, first + k);
            });
          } catch (e) {
            fail(e);
            return;
          }
          if (done === tasks.length) {
            resolve();
            return;
          }
          // A released prefix may open the window for every worker, not only this one.
          for (const other of workers) feed(other);
        });
        w.on('error', (e) => fail(new InternalError(`${name} failed: ${e instanceof Error ? e.message : String(e)}`, 'worker')));
        w.on('exit', (code) => {
          if (done < tasks.length) fail(new InternalError(`${name} exited early with code ${code}`, 'worker'));
        });
      }
      for (const w of workers) feed(w);
    });
  } finally {
    await Promise.all(workers.map((w) => w.terminate()));
  }
}

/** Run `tasks` on the pool and return their results in task order. */
export async function runPool<T, R>(name: WorkerModule, workerData: unknown, tasks: readonly T[], threads: number): Promise<R[]> {
  const results: R[] = [];
  await runOrderedPool<T, R>(name, workerData, tasks, threads, (r) => results.push(r));
  return results;
}
