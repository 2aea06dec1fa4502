/**
 * How much a clock's offset can bend between two instants, so that a scan may pass over a stretch
 * where no level can be met without looking at every instant in it (crossing.ts).
 *
 * The offset is x(t) = 1e9·(X(t) − X(t0)) + x0 + 1e9·(y·(t − t0) + D·(t − t0)²/2) plus the plan's
 * steps (straight lines), X the clock track's integral of the relativistic rate f. On each step of
 * the track f is a polynomial (its interpolant, clock/integrate.ts), so x'' = 1e9·(f' + D) there,
 * and x' may jump by 1e9·Δf where two steps meet. For t in [a, b] (W = b − a) the offset then
 * lies within max/min(x(a), x(b)) ± (M·W²/8 + Σ|Δx'|·W/4) (the error of the straight line through
 * the ends, with its Green's function bounded by W²/8 and W/4), M = max |x''|.
 *
 * f' is bounded from the track's own polynomials: on each step f = Σ c_j·u^j in u ∈ [−1, 1] (the
 * interpolant the offset integrates, clock/integrate.ts), so |df/du| ≤ Σ j·|c_j| and |f| ≤ Σ |c_j|,
 * and the jumps are the polynomials' end values where steps meet. Rounding in all this is some
 * 1e-16 of the values; the bounds below carry far more headroom than that (BEND_HEADROOM, SLACK_*).
 * (A looser bound only makes the scans look at more instants: their results do not change.)
 */
import type { OnboardClock } from '../clock/oscillator.ts';
import { SECONDS_PER_DAY } from '../constants.ts';

/** Bounds on the bending of one clock's offset over a span. */
export interface OffsetBend {
  /** Largest |x''| over the span [ns/s²]. */
  curvatureNsPerS2: number;
  /** Largest jump of x' where two track steps meet [ns/s]. */
  kinkNsPerS: number;
  /** Largest jump of x itself there (rounding only) [ns]. */
  kinkValueNs: number;
  /** Track steps: start [s since J2000.0 TT] and length [s], to count the joins in an interval. */
  trackFromTtJ2000S: number;
  trackStepS: number;
  /** Size of the terms the offset is summed from [ns], for the rounding allowance. */
  magnitudeNs: number;
}

/** Multiplier on the computed bounds (they are exact up to rounding; this is the margin). */
const BEND_HEADROOM = 2;
/** Rounding allowance: absolute [ns] and relative to the size of the summed terms. */
const SLACK_ABS_NS = 1e-6;
const SLACK_REL = 1e-12;

/**
 * Bend bounds of `clock`'s offset over [from, to], or null when that span is not inside its track
 * (the scans then look at every instant).
 */
export function offsetBend(clock: OnboardClock, from: number, to: number): OffsetBend | null {
  const track = clock.relativistic;
  const h = track.stepS;
  if (!(to >= from) || !(h > 0) || from < track.fromTtJ2000S || to > track.toTtJ2000S) return null;
  const first = Math.max(0, Math.floor((from - track.fromTtJ2000S) / h) - 1);
  const last = Math.min(track.stepCount - 1, Math.floor((to - track.fromTtJ2000S) / h) + 1);
  const bounds = track.polynomialBounds(first, last);
  const slopeU = bounds.slopePerU;
  const kink = bounds.jump;
  // Scale of the rounding allowance: twice a bound on |f|, for room.
  const maxF = 2 * bounds.value;
  const p = clock.params;
  const agingNsPerS2 = p === null ? 0 : Math.abs(p.agingPerDay / SECONDS_PER_DAY) * 1e9;
  const epoch = clock.epochTtJ2000S;
  const spanS = Math.max(Math.abs(to - epoch), Math.abs(from - epoch), Math.abs(to - track.fromTtJ2000S));
  const magnitudeNs =
    1e9 * maxF * (track.toTtJ2000S - track.fromTtJ2000S + spanS) + (p === null ? 0 : Math.abs(p.offsetNs) + 1e9 * Math.abs(p.hardwareFractionalOffset) * spanS + agingNsPerS2 * spanS * spanS);
  return {
    curvatureNsPerS2: BEND_HEADROOM * (1e9 * slopeU * (2 / h) + agingNsPerS2),
    kinkNsPerS: BEND_HEADROOM * 1e9 * kink,
    kinkValueNs: BEND_HEADROOM * 1e9 * (1e-9 * maxF * h) + SLACK_ABS_NS,
    trackFromTtJ2000S: track.fromTtJ2000S,
    trackStepS: h,
    magnitudeNs,
  };
}

/**
 * Largest amount [ns] by which the offset (as computed, rounding included) at any instant in
 * [a, b] can lie above the larger, or below the smaller, of its computed values at a and b.
 * `extraMagnitudeNs`: size of terms added on top of the free-running offset (the plan's steps).
 */
export function bendAllowanceNs(bend: OffsetBend, a: number, b: number, extraMagnitudeNs: number): number {
  const w = b - a;
  const joins = Math.floor((b - bend.trackFromTtJ2000S) / bend.trackStepS) - Math.floor((a - bend.trackFromTtJ2000S) / bend.trackStepS) + 1;
  const rounding = SLACK_ABS_NS + SLACK_REL * (bend.magnitudeNs + extraMagnitudeNs);
  return (bend.curvatureNsPerS2 * w * w) / 8 + joins * (bend.kinkNsPerS * (w / 4) + bend.kinkValueNs) + 2 * rounding;
}
