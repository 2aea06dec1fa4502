/** Library use case: clock rate against altitude above the Moon (command `sweep --body moon`). */
import { InputError } from '../errors.ts';
import type { GravityModelName } from '../orbit/gravity.ts';
import type { LunarForceModelName } from '../orbit/lunarOrbitInput.ts';
import type { SelenographicSite } from '../orbit/lunarSurface.ts';
import { sweepLunarAltitude as sweepRows, type LunarSweepResult } from '../plan/lunarSweep.ts';
import { lunarSweepToJson, type LunarSweepJson } from '../report/lunarSweepReport.ts';
import { gravityArg, sweepShapeArgs, timeSystemOf, type CommonOptions, type TimeInput } from './common.ts';

/** Options of {@link sweepLunarAltitude}: the `sweep --body moon` flags in camelCase. */
export interface LunarSweepOptions extends CommonOptions {
  /** Lowest altitude above 1737.4 km [km] (default 50). */
  fromKm?: number;
  /** Highest altitude [km] (default 10000). */
  toKm?: number;
  /** Number of altitudes (default 40). */
  points?: number;
  /** Eccentricity [1] (default 0). */
  e?: number;
  /** Inclination to the lunar equator [deg] (default 0). */
  iDeg?: number;
  /** The Earth's field (default zonal). */
  gravity?: GravityModelName;
  /** Forces on the orbits: `point` (two-body about the Moon; default) or `full`. */
  lunarForces?: LunarForceModelName;
  /** Epoch of the orbits (default 2027-01-01T00:00:00Z). */
  epoch?: TimeInput;
  /** The lunar surface reference clock (default the mean sub-Earth point). */
  reference?: SelenographicSite;
}

/** Sweep (the writers' input; {@link sweepLunarAltitude} gives the JSON). */
export function runLunarSweep(options?: LunarSweepOptions): { result: LunarSweepResult; meta: { e: number; iDeg: number; forces: string; gravity: string } } {
  const ts = timeSystemOf(options);
  const earthGravity = gravityArg(options?.gravity ?? 'zonal', false, ts);
  const { e, iDeg, epochTtJ2000S } = sweepShapeArgs(ts, options);
  const forces = options?.lunarForces ?? 'point';
  if (forces !== 'point' && forces !== 'full') throw new InputError(`unknown lunar force model ${JSON.stringify(forces)}`, '--lunar-forces', 'give point or full');
  const result = sweepRows({ fromKm: options?.fromKm ?? 50, toKm: options?.toKm ?? 10_000, points: options?.points ?? 40, e, iDeg, earthGravity, forces, epochTtJ2000S, reference: options?.reference });
  return { result, meta: { e, iDeg, forces, gravity: earthGravity.name } };
}

/**
 * The mean fractional offset [1] of orbits about the Moon against altitude [km] above the 1737.4 km
 * sphere, against TT and against the lunar surface reference, and the altitude [km] where an orbiting
 * clock keeps the surface clock's rate: the object `tauplan sweep --body moon --format json` prints.
 */
export function sweepLunarAltitude(options?: LunarSweepOptions): LunarSweepJson {
  const r = runLunarSweep(options);
  return lunarSweepToJson(r.result, r.meta);
}
