/**
 * Worker thread of `size --all`: sizes batches of element sets and posts the outcomes back.
 * Started by src/cli/commands/sizeAll.ts with the tsx loader in its execArgv.
 * Messages in: {@link WorkerBatch} or `null` (stop). Out: {@link WorkerReply}.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { gravityModel } from '../orbit/gravity.ts';
import { defaultTimeSystem } from '../io/tables.ts';
import { enableWasmSgp4 } from '../orbit/sgp4.ts';
import { sizeCatalogueItem, type CatalogueItem, type CatalogueOutcome, type CatalogueSizeOptions } from '../plan/catalogue.ts';

/** Data the worker starts with. */
export interface WorkerInit {
  options: CatalogueSizeOptions;
}

/** A batch of element sets, numbered in dispatch order. */
export interface WorkerBatch {
  batch: number;
  items: CatalogueItem[];
}

/** Outcomes of one batch, in the batch's order. */
export interface WorkerReply {
  batch: number;
  outcomes: CatalogueOutcome[];
  /** The leap-second table was used past its expiry while sizing (for the CLI's warning). */
  usedPastExpiry: boolean;
}

if (parentPort !== null) {
  await enableWasmSgp4();
  const port = parentPort;
  const { options } = workerData as WorkerInit;
  const ts = defaultTimeSystem();
  const gravity = gravityModel(options.gravityName, '--gravity');
  port.on('message', (msg: WorkerBatch | null) => {
    if (msg === null) {
      port.close();
      return;
    }
    const outcomes = msg.items.map((item) => sizeCatalogueItem(item, options, ts, gravity));
    const reply: WorkerReply = { batch: msg.batch, outcomes, usedPastExpiry: ts.leap.usedPastExpiry };
    port.postMessage(reply);
  });
}
