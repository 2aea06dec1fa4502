/**
 * What the time word `now` means on the command line: the system clock, read once per run, or
 * `TAUPLAN_NOW` (any time the CLI accepts, e.g. `2027-03-01T00:00:00Z`) for reproducible runs and
 * tests. Only the CLI reads the clock; the core receives the instant.
 */
import type { TimeSystem } from '../time/timeSystem.ts';

/** Environment variable that fixes `now`. */
export const NOW_ENV = 'TAUPLAN_NOW';

/** `ts` with `now` bound to TAUPLAN_NOW or to the system clock, read at the first use of `now`. */
export function withCliNow(ts: TimeSystem): TimeSystem {
  return ts.withNow(() => {
    const fixed = process.env[NOW_ENV];
    if (fixed !== undefined && fixed.trim() !== '') return ts.parse(fixed, NOW_ENV, null);
    return ts.fromPosixMs(Date.now());
  });
}
