/**
 * Unevenly spaced samples onto a regular grid at their dominant spacing, missing points left
 * missing (NaN), for the gap-tolerant estimators of deviations.ts. Pure; no I/O.
 */
import { InputError } from '../errors.ts';

/** Result of {@link regularGrid}. */
export interface RegularGrid {
  /** Values on the grid, NaN where no sample fell. */
  values: Float64Array;
  /** Grid spacing, s: the median of the positive steps. */
  tau0S: number;
  /** Time of grid point 0 (the first sample), same scale as the input times. */
  startS: number;
  /** Grid points with no sample. */
  missing: number;
  /** Grid index of each input sample. */
  index: Int32Array;
}

/** A grid may be at most this many times longer than the data (plus a constant). */
const GRID_GROWTH_LIMIT = 20;

/**
 * Place samples on the grid t0 + k·τ0, τ0 the median step. Every time must lie within
 * `relTol`·τ0 of a grid point; else the data are on no common grid and are refused.
 * @param timesS  strictly increasing times, s (any uniform scale)
 * @param values  one value per time
 * @param relTol  tolerance as a fraction of τ0 (e.g. 1e-3)
 * @param source  file name for error locations
 * @param lines   1-based source line of each sample, for error locations (optional)
 */
export function regularGrid(timesS: readonly number[], values: readonly number[], relTol: number, source: string, lines?: readonly number[]): RegularGrid {
  const n = timesS.length;
  const where = (i: number): string => (lines === undefined ? source : `${source}:${lines[i]}`);
  if (n < 2) throw new InputError(`${n} sample(s)`, source, 'give at least 3 samples for a stability table');
  const steps: number[] = [];
  for (let i = 1; i < n; i++) {
    const step = timesS[i] - timesS[i - 1];
    if (!(step > 0)) throw new InputError(`time does not increase (step ${step} s)`, where(i), 'sort the samples by time, one per instant');
    steps.push(step);
  }
  steps.sort((a, b) => a - b);
  const tau0S = steps[Math.floor((steps.length - 1) / 2)];
  const startS = timesS[0];
  const index = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    const k = Math.round((timesS[i] - startS) / tau0S);
    const offS = timesS[i] - startS - k * tau0S;
    if (Math.abs(offS) > relTol * tau0S) {
      throw new InputError(
        `sample is ${offS.toPrecision(3)} s off the ${tau0S} s grid of the other samples`,
        where(i),
        'stability needs samples on a common grid (gaps allowed); resample the data first',
      );
    }
    if (i > 0 && k === index[i - 1]) throw new InputError(`two samples on one ${tau0S} s grid point`, where(i), 'give one sample per grid point');
    index[i] = k;
  }
  const length = index[n - 1] + 1;
  if (length > GRID_GROWTH_LIMIT * n + 1000) {
    throw new InputError(
      `gaps make the ${tau0S} s grid ${length} points long for ${n} samples`,
      source,
      'analyse the evenly spaced stretches separately, or give the spacing that fits the data',
    );
  }
  const grid = new Float64Array(length).fill(Number.NaN);
  for (let i = 0; i < n; i++) grid[index[i]] = values[i];
  return { values: grid, tau0S, startS, missing: length - n, index };
}
