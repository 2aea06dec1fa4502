/**
 * The relativistic part of a measured satellite clock, for `fit --scenario`: the periodic term to
 * remove from the measurements and the mean relativistic rate (to split a fitted frequency into
 * relativity and hardware).
 */
import { conventionalPeriodicS } from '../clock/rate.ts';
import { allocStateBlock } from '../orbit/trajectory.ts';
import type { SatelliteClockRun } from './satelliteClock.ts';
import { lineFit } from './size.ts';

/** What {@link relativityForFit} gives. */
export interface FitRelativity {
  /** Periodic relativistic offset [ns] at a time (s since J2000.0 TT), to subtract before the fit. */
  periodicNs: (ttJ2000S: number) => number;
  /** Mean relativistic fractional frequency over the measurements [1]. */
  meanFractionalOffset: number;
}

/**
 * Periodic part: the relativistic offset minus its trend, the trend being the straight line through
 * it with −2r·v/c² removed (the `size` mean rate). A plain line through the offset would be biased by
 * the eccentricity term whenever the span is not a whole number of orbits. `run` is a clock run
 * without an oscillator model covering `timesTtJ2000S` (s since J2000.0 TT, increasing).
 */
export function relativityForFit(run: SatelliteClockRun, timesTtJ2000S: readonly number[]): FitRelativity {
  const t = Float64Array.from(timesTtJ2000S);
  const block = allocStateBlock(t.length);
  run.trajectory.sampleInto(t, block);
  const p = block.positionM;
  const v = block.velocityMPerS;
  const xc = Float64Array.from(t, (tt, i) => run.clock.relativisticNs(tt) - 1e9 * conventionalPeriodicS(p[3 * i], p[3 * i + 1], p[3 * i + 2], v[3 * i], v[3 * i + 1], v[3 * i + 2]));
  const line = t.length >= 2 && t[t.length - 1] > t[0] ? lineFit(t, xc) : { slope: 0, intercept: xc[0], tMean: t[0] };
  return {
    periodicNs: (tt) => run.clock.relativisticNs(tt) - (line.intercept + line.slope * (tt - line.tMean)),
    meanFractionalOffset: line.slope * 1e-9,
  };
}
