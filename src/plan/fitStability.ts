/**
 * Stability tables of a clock fit (pure; no I/O): the fit residuals and the raw phase (offsets with
 * only the periodic term removed; the deviations ignore the constant offset, and OHDEV also the
 * rate). Rows are placed on the grid of their dominant spacing; rejected rows and gaps are left
 * missing (NIST SP 1065 §5.15), not interpolated.
 */
import type { PowerLawAlpha } from '../clock/edf.ts';
import type { DeviationInterval } from '../clock/edf.ts';
import { regularGrid } from '../clock/grid.ts';
import { stabilityTable, type StabilityTable } from '../clock/stabilityTable.ts';
import { InputError } from '../errors.ts';

/** One stability row of `fit`: the version-1 numbers plus the intervals and noise type. */
export interface FitStabilityRow {
  /** Averaging time, s. */
  tauS: number;
  /** Overlapping Allan deviation (dimensionless). */
  oadev: number;
  /** Modified Allan deviation (dimensionless). */
  mdev: number;
  /** Number of terms in the overlapping Allan variance sum. */
  count: number;
  /** Averaging factor. */
  m: number;
  /** Identified noise type α (2 white PM … −2 random-walk FM), null with too few points. */
  alpha: PowerLawAlpha | null;
  /** OADEV with EDF and 68/95 % intervals. */
  oadevInterval: DeviationInterval;
  /** MDEV with EDF and intervals. */
  mdevInterval: DeviationInterval;
  /** Time deviation, s, with intervals, or null. */
  tdevS: DeviationInterval | null;
  /** Overlapping Hadamard deviation with intervals, or null. */
  ohdev: DeviationInterval | null;
}

/** Relative tolerance of a time on its grid point. */
const GRID_REL_TOL = 1e-3;

/**
 * Stability table of a time series of offsets, or the reason there is none.
 * @param timesS   times of the rows, s (strictly increasing)
 * @param valuesNs offsets or residuals, ns; NaN = left out (rejected)
 */
export function offsetStability(timesS: readonly number[], valuesNs: readonly number[]): { table: StabilityTable | null; note: string | null } {
  if (timesS.length < 3) return { table: null, note: 'no stability table: fewer than 3 samples' };
  let grid;
  try {
    grid = regularGrid(timesS, valuesNs.map((v) => v * 1e-9), GRID_REL_TOL, 'measurements');
  } catch (e) {
    if (e instanceof InputError) return { table: null, note: `no stability table: ${e.what}` };
    throw e;
  }
  const present = grid.values.reduce((n, v) => n + (Number.isNaN(v) ? 0 : 1), 0);
  if (present < 3) return { table: null, note: 'no stability table: fewer than 3 samples on the grid' };
  const table = stabilityTable({ xS: grid.values, tau0S: grid.tau0S });
  const note = table.missing > 0 ? `${table.missing} grid point(s) without a used sample (gaps or rejected rows) left missing` : null;
  return { table, note };
}

/** The fit's row shape from a table (rows where OADEV exists). */
export function fitStabilityRows(table: StabilityTable | null): FitStabilityRow[] {
  if (table === null) return [];
  const out: FitStabilityRow[] = [];
  for (const r of table.rows) {
    if (r.oadev === null || r.mdev === null) continue;
    out.push({
      tauS: r.tauS,
      oadev: r.oadev.value,
      mdev: r.mdev.value,
      count: r.oadevTerms,
      m: r.m,
      alpha: r.alpha,
      oadevInterval: r.oadev,
      mdevInterval: r.mdev,
      tdevS: r.tdevS,
      ohdev: r.ohdev,
    });
  }
  return out;
}
