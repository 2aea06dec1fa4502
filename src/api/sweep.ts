/** Library use case: mean clock rate against altitude (command `sweep`). */
import type { GravityModelName } from '../orbit/gravity.ts';
import { sweepAltitude as sweepRows, type SweepResult } from '../plan/sweep.ts';
import { sweepToJson, type SweepJson } from '../report/analysisReports.ts';
import { gravityArg, sweepShapeArgs, timeSystemOf, type CommonOptions, type TimeInput } from './common.ts';

/** Options of {@link sweepAltitude}: the `sweep` flags in camelCase. */
export interface SweepOptions extends CommonOptions {
  /** Lowest altitude [km] (default 300). */
  fromKm?: number;
  /** Highest altitude [km] (default 40000). */
  toKm?: number;
  /** Number of altitudes (default 200). */
  points?: number;
  /** Eccentricity [1] (default 0). */
  e?: number;
  /** Inclination [deg] (default 0). */
  iDeg?: number;
  /** Gravity model (default zonal). */
  gravity?: GravityModelName;
  /** Epoch of the orbits (default 2027-01-01T00:00:00Z). */
  epoch?: TimeInput;
}

/** A sweep and its header. */
export interface SweepRun {
  result: SweepResult;
  meta: { gravity: string; e: number; iDeg: number };
}

/** Sweep the altitudes (the writers' input; {@link sweepAltitude} gives the JSON). */
export function runSweep(options?: SweepOptions): SweepRun {
  const ts = timeSystemOf(options);
  const gravity = gravityArg(options?.gravity ?? 'zonal', false, ts);
  const { e, iDeg, epochTtJ2000S } = sweepShapeArgs(ts, options);
  const result = sweepRows({ fromKm: options?.fromKm ?? 300, toKm: options?.toKm ?? 40000, points: options?.points ?? 200, e, iDeg, gravity, epochTtJ2000S });
  return { result, meta: { gravity: gravity.name, e, iDeg } };
}

/**
 * The mean fractional offset [1] of circular (or given-eccentricity) orbits against altitude [km],
 * split into gravitational and velocity parts, and the break-even altitude [km] where an orbiting
 * clock runs at a geoid clock's rate: the object `tauplan sweep --format json` prints.
 */
export function sweepAltitude(options?: SweepOptions): SweepJson {
  const r = runSweep(options);
  return sweepToJson(r.result, r.meta);
}
