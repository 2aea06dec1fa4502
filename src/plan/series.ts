/**
 * Time series of a prepared satellite for the figures: the clock offset and the conventional
 * periodic term −2r·v/c², sampled evenly over the part of a window the satellite covers. The
 * writers (src/report) plot them and compute nothing physical.
 */
import { conventionalPeriodicS } from '../clock/rate.ts';
import { allocStateBlock } from '../orbit/trajectory.ts';
import type { SatelliteClockRun } from './satelliteClock.ts';

/** A sampled series: instants [s since J2000.0 TT] and values in the unit the name says. */
export interface TimeSeries {
  tTtJ2000S: Float64Array;
  values: number[];
}

/** The part of [from, to] a run covers (a sub-orbital flight or a decaying orbit covers less). */
export function runSpan(run: SatelliteClockRun, fromTt: number, toTt: number): { from: number; to: number } {
  return { from: Math.max(fromTt, run.startTtJ2000S ?? fromTt), to: Math.min(toTt, run.endTtJ2000S) };
}

/** n + 1 evenly spaced instants over [from, to]. */
export function sampleTimes(from: number, to: number, n: number): Float64Array {
  const t = new Float64Array(n + 1);
  for (let k = 0; k <= n; k++) t[k] = from + ((to - from) * k) / n;
  return t;
}

/** Samples of the offset figure over a window (about one per pixel of a page-wide plot). */
export const OFFSET_SAMPLES = 600;

/** The free-running clock offset [ns] at OFFSET_SAMPLES + 1 instants over the part of [from, to] the run covers. */
export function clockOffsetSeriesNs(run: SatelliteClockRun, fromTt: number, toTt: number): TimeSeries {
  const span = runSpan(run, fromTt, toTt);
  const t = sampleTimes(span.from, span.to, OFFSET_SAMPLES);
  return { tTtJ2000S: t, values: Array.from(t, (tt) => run.clock.offsetNs(tt)) };
}

/**
 * The conventional periodic term −2r·v/c² [ns] over the part of [from, to] the run covers: 60
 * samples per orbit, at least 400 and at most 6000.
 */
export function periodicSeriesNs(run: SatelliteClockRun, fromTt: number, toTt: number): TimeSeries {
  const span = runSpan(run, fromTt, toTt);
  const orbits = Number.isFinite(run.orbit.periodS) && run.orbit.periodS > 0 ? (span.to - span.from) / run.orbit.periodS : 1;
  const n = Math.min(6000, Math.max(400, Math.ceil(orbits * 60)));
  const t = sampleTimes(span.from, span.to, n);
  const block = allocStateBlock(n + 1);
  run.trajectory.sampleInto(t, block);
  const p = block.positionM;
  const v = block.velocityMPerS;
  const y: number[] = [];
  for (let i = 0; i <= n; i++) y.push(conventionalPeriodicS(p[3 * i], p[3 * i + 1], p[3 * i + 2], v[3 * i], v[3 * i + 1], v[3 * i + 2]) * 1e9);
  return { tTtJ2000S: t, values: y };
}
