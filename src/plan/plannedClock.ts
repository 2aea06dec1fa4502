/**
 * The clock a keep-in plan steers: the free-running clock with the plan's phase and frequency steps
 * applied at their instants (resets.ts).
 */
import type { OnboardClock } from '../clock/oscillator.ts';
import { InternalError } from '../errors.ts';

/** One adjustment as the clock sees it: a phase step [ns] and a fractional frequency step at an instant. */
export interface Step {
  atTtJ2000S: number;
  phaseNs: number;
  fractional: number;
}

/**
 * The clock with the plan's steps applied. Steps are appended in time order; prefix sums make the
 * steps' effect at t one binary search instead of a loop over every step.
 */
export class PlannedClock {
  private readonly at: number[] = [];
  private readonly cumPhaseNs: number[] = [];
  private readonly cumFractional: number[] = [];
  private readonly cumFractionalAtS: number[] = [];
  constructor(private readonly clock: OnboardClock) {}
  push(s: Step): void {
    const n = this.at.length;
    if (n > 0 && s.atTtJ2000S < this.at[n - 1]) throw new InternalError('adjustments out of time order', 'adjustments');
    this.at.push(s.atTtJ2000S);
    this.cumPhaseNs.push((n > 0 ? this.cumPhaseNs[n - 1] : 0) + s.phaseNs);
    this.cumFractional.push((n > 0 ? this.cumFractional[n - 1] : 0) + s.fractional);
    this.cumFractionalAtS.push((n > 0 ? this.cumFractionalAtS[n - 1] : 0) + s.fractional * s.atTtJ2000S);
  }
  offsetNs(t: number): number {
    return this.withStepsNs(this.clock.offsetNs(t), t);
  }
  /** The planned offset [ns] at t from the free-running offset x [ns] there. */
  withStepsNs(x: number, t: number): number {
    // Last step at or before t (the scans ask mostly after the last one).
    const count = this.at.length;
    let lo = count > 0 && this.at[count - 1] <= t ? count : 0;
    let hi = count;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (this.at[mid] <= t) lo = mid + 1;
      else hi = mid;
    }
    if (lo === 0) return x;
    const i = lo - 1;
    return x + this.cumPhaseNs[i] + 1e9 * (this.cumFractional[i] * t - this.cumFractionalAtS[i]);
  }
  /**
   * Smallest limitNs − |planned offset| [ns] over the scan instants min(to, from + k·step) whose
   * free-running offsets are `freeGridNs` (as offsetNs there; the steps found by walking forward).
   */
  minMarginNs(limitNs: number, freeGridNs: Float64Array, from: number, to: number, stepS: number): number {
    let minMarginNs = Infinity;
    let lo = 0;
    for (let k = 0; k < freeGridNs.length; k++) {
      const t = Math.min(to, from + k * stepS);
      while (lo < this.at.length && this.at[lo] <= t) lo++;
      const x = freeGridNs[k];
      const i = lo - 1;
      const planned = lo === 0 ? x : x + this.cumPhaseNs[i] + 1e9 * (this.cumFractional[i] * t - this.cumFractionalAtS[i]);
      minMarginNs = Math.min(minMarginNs, limitNs - Math.abs(planned));
    }
    return minMarginNs;
  }
  /** Size [ns] of the terms the steps add to the offset at instants up to |t| ≤ tMaxS (for rounding allowances). */
  stepsMagnitudeNs(tMaxS: number): number {
    const i = this.at.length - 1;
    if (i < 0) return 0;
    return Math.abs(this.cumPhaseNs[i]) + 1e9 * (Math.abs(this.cumFractional[i]) * Math.abs(tMaxS) + Math.abs(this.cumFractionalAtS[i]));
  }
  /** Window of one orbit centred on t, kept inside [from, to]. */
  private window(t: number, periodS: number, from: number, to: number): [number, number] {
    let a = Math.max(from, t - periodS / 2);
    const b = Math.min(to, a + periodS);
    a = Math.max(from, b - periodS);
    return b - a < 1 ? [Math.max(from, t - 60), Math.min(to, t + 60)] : [a, b];
  }
  /** Offset averaged over one orbit centred on t (Simpson, 64 intervals): the trend without the periodic swing. */
  meanOffsetNs(t: number, periodS: number, from: number, to: number): number {
    const [a, b] = this.window(t, periodS, from, to);
    const n = 64;
    let sum = 0;
    for (let k = 0; k <= n; k++) sum += (k === 0 || k === n ? 1 : k % 2 === 1 ? 4 : 2) * this.offsetNs(a + ((b - a) * k) / n);
    return sum / (3 * n);
  }
  /** Mean rate [ns/s] over one orbit centred on t (removes the orbit's periodic term). */
  meanRateNsPerS(t: number, periodS: number, from: number, to: number): number {
    const [a, b] = this.window(t, periodS, from, to);
    return (this.offsetNs(b) - this.offsetNs(a)) / (b - a);
  }
}
