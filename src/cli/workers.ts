/**
 * Starting worker threads on either form of the CLI: from the bundle in dist/ (each worker has its
 * own bundle, no loader needed) or from the TypeScript sources (the worker registers the tsx loader
 * itself: a loader given to the parent, or `--import` in execArgv, does not reach a worker on Node 20).
 */
import { Worker } from 'node:worker_threads';

export type WorkerModule = 'sizeWorker' | 'scenarioWorker' | 'fitWorker';

export function startModuleWorker(name: WorkerModule, workerData: unknown): Worker {
  if (/\/dist\/[^/]*$/.test(import.meta.url)) return new Worker(new URL(`./${name}.mjs`, import.meta.url), { workerData });
  const tsxApi = import.meta.resolve('tsx/esm/api');
  const workerModule = new URL(`./${name}.ts`, import.meta.url).href;
  const boot = `import(${JSON.stringify(tsxApi)}).then((m) => { m.register(); return import(${JSON.stringify(workerModule)}); });`;
  return new Worker(boot, { eval: true, workerData });
}

/**
 * Run `tasks` on at most `jobs` workers (each started once and fed one task after another);
 * results come back in task order. The worker answers each task message with one reply.
 */
export async function runPool<T, R>(name: WorkerModule, tasks: readonly T[], jobs: number): Promise<R[]> {
  const results = new Array<R>(tasks.length);
  let next = 0;
  const lane = (): Promise<void> =>
    new Promise<void>((resolve, reject) => {
      const w = startModuleWorker(name, null);
      let current = -1;
      const feed = (): void => {
        if (next >= tasks.length) {
          void w.terminate().then(() => resolve());
          return;
        }
        current = next++;
        w.postMessage(tasks[current]);
      };
      w.on('message', (r: R) => {
        results[current] = r;
        feed();
      });
      w.once('error', reject);
      w.once('exit', (code) => {
        if (next < tasks.length || current >= 0 && results[current] === undefined) reject(new Error(`worker exited with code ${code}`));
      });
      feed();
    });
  await Promise.all(Array.from({ length: Math.max(1, Math.min(jobs, tasks.length)) }, lane));
  return results;
}
