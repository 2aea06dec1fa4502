/**
 * Worker thread for multi-satellite scenarios: computes `passes` or `resets` for one satellite of a
 * scenario (the same code as in process) and posts the plain-data result back.
 */
import { parentPort } from 'node:worker_threads';
import { InputError } from '../errors.ts';
import { defaultTimeSystem } from '../io/tables.ts';
import { Instant } from '../time/instant.ts';
import { withCliNow } from './now.ts';
import { enableWasmSgp4 } from '../orbit/sgp4.ts';
import { computePassRows } from './commands/passes.ts';
import { computeResets } from './commands/resets.ts';
import type { ScenarioReply, ScenarioTask } from './scenarioTasks.ts';

/** One task: the same computation as in process, faults returned as data. */
function runTask(task: ScenarioTask, ts: ReturnType<typeof defaultTimeSystem>): ScenarioReply {
  try {
    if (task.task === 'passes') {
      const r = computePassRows(task.args as never, ts);
      return { rows: r.rows, notes: r.notes, usedPastExpiry: ts.leap.usedPastExpiry };
    }
    const r = computeResets(task.args as never, ts);
    return { plans: r.plans, notes: r.meta.notes, usedPastExpiry: ts.leap.usedPastExpiry };
  } catch (e) {
    return e instanceof InputError
      ? { notes: [], usedPastExpiry: false, error: { input: true, what: e.what, where: e.where, fix: e.fix } }
      : { notes: [], usedPastExpiry: false, error: { input: false, what: e instanceof Error ? `${e.name}: ${e.message}` : String(e), where: '', fix: '' } };
  }
}

if (parentPort !== null) {
  await enableWasmSgp4();
  const port = parentPort;
  // `now` as the main thread read it; the worker's own reading only if the main thread never used it.
  const ts = withCliNow(defaultTimeSystem());
  port.on('message', (task: ScenarioTask) => port.postMessage(runTask(task, task.nowTtJ2000S === undefined ? ts : ts.withNow(Instant.fromTtJ2000S(task.nowTtJ2000S, 'UTC')))));
}
