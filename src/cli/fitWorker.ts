/**
 * Worker thread of `fit --all`: fits one clock series per message (the same code as in process)
 * and posts its survey row back. The orbit file, when there is one, is read once per worker.
 */
import { parentPort } from 'node:worker_threads';
import { InputError } from '../errors.ts';
import { defaultTimeSystem } from '../io/tables.ts';
import type { MeasurementSeries } from '../model/measurements.ts';
import { enableWasmSgp4 } from '../orbit/sgp4.ts';
import { fitSurveyOne, type FitSurveyArgs } from './commands/fitAll.ts';
import type { FitSurveyRow } from '../plan/fitAll.ts';

/** One task: the run's arguments and one clock's series. */
export interface FitWorkerTask {
  args: FitSurveyArgs;
  series: MeasurementSeries;
}

if (parentPort !== null) {
  await enableWasmSgp4();
  const port = parentPort;
  const ts = defaultTimeSystem();
  port.on('message', (task: FitWorkerTask) => {
    let row: FitSurveyRow;
    try {
      row = fitSurveyOne(task.series, task.args, ts);
    } catch (e) {
      const what = e instanceof InputError ? `${e.what} (${e.where})` : e instanceof Error ? `${e.name}: ${e.message}` : String(e);
      row = { satellite: task.series.clock, kind: task.series.kind, samples: task.series.ttJ2000S.length, skipped: task.series.skipped, segments: 0, fractionalFrequency: null, relativisticMeanFractionalOffset: null, hardwareFractionalOffset: null, driftPerDay: null, rmsNs: null, adev1000: null, adev1000TauS: null, adev1d: null, error: what };
    }
    port.postMessage(row);
  });
}
