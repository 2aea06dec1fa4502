/**
 * One satellite ready for planning: its trajectory and its onboard clock (relativity integrated
 * once over the whole span, plus the oscillator model).
 */
import { clockStepS, integrateAlong } from '../clock/integrate.ts';
import type { GravityModel } from '../clock/gravity.ts';
import { OnboardClock, type OscillatorParams } from '../clock/oscillator.ts';
import { fractionalOffset } from '../clock/rate.ts';
import type { Trajectory } from '../orbit/trajectory.ts';
import { orbitSummaryAt, type OrbitSummary } from './size.ts';

export interface SatelliteClockRun {
  id: string;
  name: string;
  trajectory: Trajectory;
  clock: OnboardClock;
  orbit: OrbitSummary;
  /** Keep-in limit [ns], or null. */
  keepInNs: number | null;
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
  const [track] = integrateAlong(trajectory, start, end, stepS, [(x, y, z, vx, vy, vz) => fractionalOffset(gravity, x, y, z, vx, vy, vz)]);
  return { id, name, trajectory, clock: new OnboardClock(track, params), orbit, keepInNs: params?.keepInNs ?? null };
}
