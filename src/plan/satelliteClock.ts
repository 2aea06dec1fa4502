/**
 * One satellite ready for planning: its trajectory and its onboard clock (relativity integrated
 * once over the whole span, plus the oscillator model).
 */
import { clockStepS, integrateAlong } from '../clock/integrate.ts';
import type { GravityModel } from '../orbit/gravity.ts';
import { OnboardClock, type OscillatorParams } from '../clock/oscillator.ts';
import { fractionalOffset } from '../clock/rate.ts';
import type { Trajectory } from '../orbit/trajectory.ts';
import { orbitSummaryAt, type OrbitSummary } from './size.ts';
import { InputError } from '../errors.ts';

export interface SatelliteClockRun {
  id: string;
  name: string;
  trajectory: Trajectory;
  clock: OnboardClock;
  orbit: OrbitSummary;
  /** Keep-in limit [ns], or null. */
  keepInNs: number | null;
  /** End of the usable span: the window end, or earlier when the orbit source fails (decay) or a flight lands. */
  endTtJ2000S: number;
  /** Start of the usable span when later than the window start (a sub-orbital flight launched inside it). */
  startTtJ2000S?: number;
  /** Why the span ends early, or null. */
  note: string | null;
}

/**
 * Last instant in [from, to] at which the trajectory still gives a state: a coarse 10-min scan, then
 * bisection to 1 s on the first failure (an SGP4 decay, for example). Returns `to` when all is well.
 */
export function usableEnd(trajectory: Trajectory, fromTtJ2000S: number, toTtJ2000S: number): { endTtJ2000S: number; failure: Error | null } {
  const ok = (t: number): Error | null => {
    try {
      trajectory.stateAt(t);
      return null;
    } catch (e) {
      if (e instanceof InputError) return e;
      throw e;
    }
  };
  const first = ok(fromTtJ2000S);
  if (first !== null) throw first;
  let good = fromTtJ2000S;
  for (let t = fromTtJ2000S; t < toTtJ2000S + 600; t += 600) {
    const probe = Math.min(t, toTtJ2000S);
    const err = ok(probe);
    if (err === null) {
      good = probe;
      if (probe === toTtJ2000S) break;
      continue;
    }
    let bad = probe;
    for (let it = 0; it < 40 && bad - good > 1; it++) {
      const mid = 0.5 * (good + bad);
      if (ok(mid) === null) good = mid;
      else bad = mid;
    }
    return { endTtJ2000S: good, failure: err };
  }
  return { endTtJ2000S: toTtJ2000S, failure: null };
}

/**
 * Integrate the relativistic rate over [from, to] (widened to hold the oscillator epoch) and wrap
 * it with the oscillator model.
 */
export function prepareSatelliteClock(
  id: string,
  name: string,
  trajectory: Trajectory,
  gravity: GravityModel,
  params: OscillatorParams | null,
  fromTtJ2000S: number,
  toTtJ2000S: number,
): SatelliteClockRun {
  const start = params === null ? fromTtJ2000S : Math.min(fromTtJ2000S, params.epochTtJ2000S);
  const end = params === null ? toTtJ2000S : Math.max(toTtJ2000S, params.epochTtJ2000S + 1);
  const orbit = orbitSummaryAt(trajectory, Math.max(start, trajectory.validFromTtJ2000S), gravity.gmM3PerS2);
  const stepS = clockStepS(Number.isFinite(orbit.periodS) ? orbit.periodS : 86400, Math.min(orbit.e, 0.95));
  const [track] = integrateAlong(trajectory, start, end, stepS, [(x, y, z, vx, vy, vz, t) => fractionalOffset(gravity, x, y, z, vx, vy, vz, t)]);
  return { id, name, trajectory, clock: new OnboardClock(track, params), orbit, keepInNs: params?.keepInNs ?? null, endTtJ2000S: toTtJ2000S, note: null };
}
