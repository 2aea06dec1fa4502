/**
 * Worker thread for multi-satellite scenarios: computes `passes` or `resets` for one satellite of a
 * scenario (the same library call as in process) and posts the plain-data result back.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { enableSgp4Engine } from '../api/engine.ts';
import { defaultTimeSystem } from '../io/tables.ts';
import { Instant } from '../time/instant.ts';
import { withCliNow } from './now.ts';
import { runScenarioTask, type ScenarioTask, type ScenarioWorkerInit } from './scenarioTasks.ts';
import { serveTasks } from './workers.ts';

if (parentPort !== null) {
  await enableSgp4Engine();
  const init = (workerData ?? {}) as ScenarioWorkerInit;
  // `now` as the main thread read it; the worker's own reading only if the main thread never used it.
  const base = withCliNow(defaultTimeSystem());
  const ts = init.nowTtJ2000S === undefined ? base : base.withNow(Instant.fromTtJ2000S(init.nowTtJ2000S, 'UTC'));
  serveTasks(parentPort, (task: ScenarioTask) => runScenarioTask(task, ts));
}
