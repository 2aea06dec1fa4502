/**
 * Worker thread of `size --all`: sizes batches of element sets and posts the outcomes back
 * (the pool is ../workers.ts; started by src/cli/commands/sizeAll.ts).
 */
import { parentPort, workerData } from 'node:worker_threads';
import { catalogueGravity, sizeCatalogueItem, type CatalogueItem, type CatalogueOutcome, type CatalogueSizeOptions } from '../api/catalogue.ts';
import { enableSgp4Engine } from '../api/engine.ts';
import { defaultTimeSystem } from '../io/tables.ts';
import { serveTasks } from './workers.ts';

/** Data the worker starts with. */
export interface WorkerInit {
  options: CatalogueSizeOptions;
}

/** Outcomes of one batch, in the batch's order. */
export interface WorkerReply {
  outcomes: CatalogueOutcome[];
  /** The leap-second table was used past its expiry while sizing (for the CLI's warning). */
  usedPastExpiry: boolean;
}

if (parentPort !== null) {
  await enableSgp4Engine();
  const { options } = workerData as WorkerInit;
  const ts = defaultTimeSystem();
  const gravity = catalogueGravity(options.gravityName);
  serveTasks(parentPort, (items: CatalogueItem[]): WorkerReply => ({ outcomes: items.map((item) => sizeCatalogueItem(item, options, ts, gravity)), usedPastExpiry: ts.leap.usedPastExpiry }));
}
