/**
 * `tauplan stability`: a phase or frequency record → the stability table (pure; no I/O).
 * Evenly spaced records go straight on the grid; time-stamped ones are placed on the grid of
 * their dominant spacing with gaps left missing (src/clock/grid.ts).
 */
import { InputError } from '../errors.ts';
import { phaseGridFromFrequency, type PhaseGrid } from '../clock/deviations.ts';
import { regularGrid } from '../clock/grid.ts';
import { stabilityTable, type StabilityTable, type TauSet } from '../clock/stabilityTable.ts';

/** What the samples are. */
/** Row and interval types of the tables, for the writers. */
export type { StabilityTableRow } from '../clock/stabilityTable.ts';
export type { DeviationInterval } from '../clock/edf.ts';

export type StabilityDataType = 'phase' | 'frequency';

/** Input of {@link stabilityOfRecord}. */
export interface StabilityRecord {
  /** Phase in s, or fractional frequency; NaN = missing sample. */
  values: ArrayLike<number>;
  dataType: StabilityDataType;
  /** Sample spacing, s; required without times, else checked against them when given. */
  tau0S: number | null;
  /** Sample times, s (any uniform scale), or null for an evenly spaced record. */
  timesS: readonly number[] | null;
  /** 1-based source line of each sample, for messages. */
  lines?: readonly number[];
  /** Number of NaN samples in `values`. */
  nanCount: number;
  source: string;
  tauSet?: TauSet;
}

/** Result: the table plus what the record was. */
export interface StabilityResult extends StabilityTable {
  dataType: StabilityDataType;
  source: string;
}

/** Relative tolerance of a time on its grid point. */
const GRID_REL_TOL = 1e-3;

/**
 * Compute the stability table of a record.
 * @throws InputError when τ0 is missing or not positive, when times go backwards or lie on no
 *   common grid, or when too few samples remain
 */
export function stabilityOfRecord(r: StabilityRecord): StabilityResult {
  let values: Float64Array;
  let tau0S: number;
  let missing = r.nanCount;
  if (r.timesS !== null) {
    const grid = regularGrid(r.timesS, Array.from(r.values), GRID_REL_TOL, r.source, r.lines);
    if (r.tau0S !== null && Math.abs(r.tau0S - grid.tau0S) > GRID_REL_TOL * grid.tau0S) {
      throw new InputError(`--tau0 ${r.tau0S} s differs from the ${grid.tau0S} s spacing of the times`, '--tau0', 'leave --tau0 out for time-stamped data, or give the spacing the times have');
    }
    values = grid.values;
    tau0S = grid.tau0S;
    missing += grid.missing;
  } else {
    if (r.tau0S === null) throw new InputError('sample spacing τ0 missing', '--tau0', 'give the spacing of the samples, e.g. --tau0 1s');
    values = Float64Array.from(r.values as ArrayLike<number>);
    tau0S = r.tau0S;
  }
  if (!(tau0S > 0) || !Number.isFinite(tau0S)) throw new InputError(`sample spacing τ0 = ${tau0S} s`, '--tau0', 'give a positive spacing, e.g. --tau0 1s');
  const present = values.length - countNaN(values);
  const grid: PhaseGrid = r.dataType === 'phase' ? { xS: values, tau0S } : phaseGridFromFrequency(values, tau0S);
  if (r.dataType === 'frequency' && present < 2) {
    throw new InputError(`${present} frequency sample(s)`, r.source, 'OADEV needs at least 2 frequency samples (3 phase points); MDEV, TDEV and OHDEV need 3');
  }
  const table = stabilityTable(grid, { source: r.source, tauSet: r.tauSet ?? 'octave', points: present, missing });
  if (missing > 0) table.notes.push(`${missing} sample(s) missing on the ${tau0S} s grid; terms touching them are left out (NIST SP 1065 §5.15)`);
  return { ...table, dataType: r.dataType, source: r.source };
}

function countNaN(a: Float64Array): number {
  let n = 0;
  for (const v of a) if (Number.isNaN(v)) n++;
  return n;
}
