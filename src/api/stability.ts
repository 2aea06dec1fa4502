/** Library use case: frequency stability of a phase or frequency record (command `stability`). */
import { stabilityOfRecord, type StabilityRecord, type StabilityResult } from '../plan/stability.ts';

export type { StabilityDataType, StabilityRecord, StabilityResult, StabilityTableRow, DeviationInterval } from '../plan/stability.ts';

/**
 * The stability table of a record: overlapping Allan, modified Allan, time and overlapping
 * Hadamard deviations at the averaging times τ [s] of `record.tauSet` (octave, decade or all), each
 * with its equivalent degrees of freedom, 68 % and 95 % intervals and the dominant noise type.
 * Phase values are in seconds, frequency values fractional [1]; NaN marks a missing sample.
 * @throws InputError when τ0 is missing or not positive, when times go backwards or lie on no
 *   common grid, or when too few samples remain
 */
export function frequencyStability(record: StabilityRecord): StabilityResult {
  return stabilityOfRecord(record);
}
