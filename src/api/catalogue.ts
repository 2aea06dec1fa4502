/**
 * Catalogue runs (`size --all`): one element set sized per item, shards, and the in-order buffer
 * that releases results in file order. The CLI spreads the items over worker threads.
 */
import { gravityModel, type GravityModel } from '../orbit/gravity.ts';

export { failureReason, inShard, InOrderBuffer, parseShard, sizeCatalogueItem, type CatalogueItem, type CatalogueOutcome, type CatalogueSizeOptions, type ShardSpec } from '../plan/catalogue.ts';

/** The gravity model of a catalogue run, by name (`--gravity`: point, j2 or zonal). */
export function catalogueGravity(name: string): GravityModel {
  return gravityModel(name, '--gravity');
}
