/**
 * Worker thread of `fit --all`: fits one clock series per message (the same code as in process)
 * and posts its survey row back. The orbit file, when there is one, is read once per worker.
 */
import { parentPort } from 'node:worker_threads';
import { InputError } from '../errors.ts';
import { defaultTimeSystem } from '../io/tables.ts';
import type { MeasurementSeries } from '../model/measurements.ts';
import { enableSgp4Engine } from '../api/engine.ts';
import { serveTasks } from './workers.ts';
import { failedSurveyRow, fitSurveyOne, type FitSurveyOptions, type FitSurveyRow } from '../api/fitFile.ts';

/** One task: the run's arguments and one clock's series. */
export interface FitWorkerTask {
  args: FitSurveyOptions;
  series: MeasurementSeries;
}

if (parentPort !== null) {
  await enableSgp4Engine();
  const ts = defaultTimeSystem();
  serveTasks(parentPort, (task: FitWorkerTask): FitSurveyRow => {
    let row: FitSurveyRow;
    try {
      row = fitSurveyOne(task.series, task.args, ts);
    } catch (e) {
      const what = e instanceof InputError ? `${e.what} (${e.where})` : e instanceof Error ? `${e.name}: ${e.message}` : String(e);
      row = failedSurveyRow(task.series, what);
    }
    return row;
  });
}
