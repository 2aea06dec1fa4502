/** Use case `size` for one resolved orbit: the span checked against the source, then the sizing. */
import { InputError } from '../errors.ts';
import type { GravityModel } from '../orbit/gravity.ts';
import type { ResolvedOrbit } from '../orbit/source.ts';
import { Instant } from '../time/instant.ts';
import type { TimeSystem } from '../time/timeSystem.ts';
import { sizeClock, type SizeResult } from './size.ts';

/**
 * Size the clock over [from, from + spanS], `from` (s since J2000.0 TT) defaulting to the orbit's
 * epoch, or the start of its span when it has none. `nominalHz` [Hz] must be positive.
 */
export function sizeResolvedOrbit(orbit: ResolvedOrbit, gravity: GravityModel, fromTtJ2000S: number | null, spanS: number, nominalHz: number, ts: TimeSystem): SizeResult {
  if (!(nominalHz > 0)) throw new InputError(`nominal frequency ${nominalHz} Hz is not positive`, '--nominal-hz', 'give e.g. 10.23e6');
  const traj = orbit.trajectory;
  const from = fromTtJ2000S ?? traj.epochTtJ2000S ?? traj.validFromTtJ2000S;
  if (from < traj.validFromTtJ2000S - 1e-3 || from + spanS > traj.validToTtJ2000S + 1e-3) {
    const f = (t: number): string => ts.format(Instant.fromTtJ2000S(t));
    throw new InputError(
      `span ${f(from)} + ${spanS} s is outside the orbit source's span ${f(traj.validFromTtJ2000S)} to ${f(traj.validToTtJ2000S)}`,
      '--from/--span',
      'choose a span inside the source span',
    );
  }
  return sizeClock({ trajectory: traj, gravity, fromTtJ2000S: from, spanS, nominalHz, rebuildWithDeltaAKm: orbit.rebuildWithDeltaAKm });
}

/** The start of the span for an orbit with epoch `epochTtJ2000S`: `--from` when given, else the epoch. */
export function spanStart(fromGiven: number | null, epochTtJ2000S: number | null): number {
  const start = fromGiven ?? epochTtJ2000S;
  if (start === null) throw new InputError('this orbit source has no epoch to start from', '--from', 'give --from');
  return start;
}
