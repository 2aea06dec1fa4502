/** The SGP4 engine the library and the CLI share. */
import { enableWasmSgp4 } from '../orbit/sgp4.ts';

/**
 * Load satellite.js's WASM SGP4 once per process (deep-space resonant orbits use it, so that
 * library, CLI and worker threads give the same numbers to the last bit). The library entry does
 * this on import; the CLI before a command that propagates, and in each worker thread.
 */
export async function enableSgp4Engine(): Promise<void> {
  await enableWasmSgp4();
}
