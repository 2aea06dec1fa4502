/**
 * Option handling shared by the library functions: the time system, times and durations given as
 * text (as on the command line) or as values, and the gravity model. Messages name the matching
 * command-line flag, so a library caller and a CLI user read the same error.
 */
import { InputError } from '../errors.ts';
import { defaultTimeSystem } from '../io/tables.ts';
import type { GravityModel, GravityModelName } from '../orbit/gravity.ts';
import { gravityWithTides } from '../plan/scenarioRuns.ts';
import { parsePositiveDurationS } from '../time/duration.ts';
import { Instant } from '../time/instant.ts';
import type { TimeSystem } from '../time/timeSystem.ts';

/** Options every library function takes. */
export interface CommonOptions {
  /**
   * Time scales and leap seconds. Default: the packaged leap-second table (read once per process
   * from the package's `data/` folder), or the file named by TAUPLAN_LEAP_SECONDS.
   */
  timeSystem?: TimeSystem;
}

/** A time: ISO 8601 text as the CLI takes it (`2027-01-01T00:00:00Z`, `... GPS`), or an Instant. */
export type TimeInput = string | Instant;

/** A duration: text as the CLI takes it (`90min`, `7d`, `P1DT12H`) or a number of seconds. */
export type DurationInput = string | number;

/** The time system of `options`, or the default one. */
export function timeSystemOf(options: CommonOptions | undefined): TimeSystem {
  return options?.timeSystem ?? defaultTimeSystem();
}

/** A time option as seconds since J2000.0 TT, or null when absent. `flag` names it in messages. */
export function timeArg(ts: TimeSystem, value: TimeInput | undefined, flag: string): number | null {
  if (value === undefined) return null;
  return value instanceof Instant ? value.ttJ2000S : ts.parse(value, flag).ttJ2000S;
}

/** A positive duration option [s]. */
export function durationArg(value: DurationInput, flag: string): number {
  if (typeof value === 'number') {
    if (!(Number.isFinite(value) && value > 0)) throw new InputError(`${flag} ${value} s is not a positive duration`, flag, 'give a span greater than zero, e.g. 1d or 86400');
    return value;
  }
  return parsePositiveDurationS(value, flag);
}

/** A named gravity model, with the solar and lunar tidal potential when `tides` is true. */
export function gravityArg(name: GravityModelName | string, tides: boolean, ts: TimeSystem, where = '--gravity'): GravityModel {
  return gravityWithTides(name, tides, ts, where);
}

/** Epoch of elements given without one (sizing and sweeps). */
export const DEFAULT_ELEMENTS_EPOCH = '2027-01-01T00:00:00Z';

/** The orbit shape of an altitude sweep, checked: eccentricity [1], inclination [deg], epoch [TT s since J2000.0]. */
export function sweepShapeArgs(ts: TimeSystem, options: { e?: number; iDeg?: number; epoch?: TimeInput } | undefined): { e: number; iDeg: number; epochTtJ2000S: number } {
  const e = options?.e ?? 0;
  const iDeg = options?.iDeg ?? 0;
  if (!(e >= 0 && e < 1)) throw new InputError(`eccentricity ${e} is not in [0, 1)`, '--e', 'give 0 ≤ e < 1');
  if (!(iDeg >= 0 && iDeg <= 180)) throw new InputError(`inclination ${iDeg}° is not in [0, 180]`, '--i-deg', 'give 0–180');
  const epochTtJ2000S = timeArg(ts, options?.epoch ?? DEFAULT_ELEMENTS_EPOCH, '--epoch') as number;
  return { e, iDeg, epochTtJ2000S };
}
