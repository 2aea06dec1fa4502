/**
 * A diagnostic count of the orbit states a run evaluates, for the benchmark's floor (states × the
 * per-state time of bare SGP4). A state is one instant at which an orbit source was asked for a
 * position (with or without velocity); `propagations` counts the SGP4 calls made for them (the
 * velocity may take more than one). Kept on a process-wide symbol so that the bundled CLI and the
 * sources share one count. No environment is read; nothing prints it unless a caller asks.
 */

interface Counts {
  states: number;
  propagations: number;
}

const KEY = Symbol.for('tauplan.orbitStateCount');
const holder = globalThis as unknown as Record<symbol, Counts | undefined>;
const counts: Counts = (holder[KEY] ??= { states: 0, propagations: 0 });

/** Add `states` evaluated states that took `propagations` SGP4 calls. */
export function countStates(states: number, propagations: number): void {
  counts.states += states;
  counts.propagations += propagations;
}

/** States and SGP4 propagations counted since the process started (or the last reset). */
export function orbitStateCounts(): { states: number; propagations: number } {
  return { states: counts.states, propagations: counts.propagations };
}

/** Start the count again at zero. */
export function resetOrbitStateCounts(): void {
  counts.states = 0;
  counts.propagations = 0;
}
