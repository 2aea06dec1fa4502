/**
 * The Earth's rotation along an evenly spaced time grid, for searches that turn many inertial
 * states earth-fixed: cos and sin of the sidereal angle at t0 + k·step.
 *
 * The angle is evaluated exactly (the caller's `gmstRadAt`) only at anchors: the first, middle and
 * last sample of each block of up to {@link BLOCK_SAMPLES}. In between it advances at the block's
 * mean rate, by a rotation recurrence (no trigonometry per sample). GMST is linear in UTC up to a
 * quadratic term whose effect over a block (≤ 255 steps of ≤ 600 s) is below 1e-12 rad, so the
 * middle anchor agrees with the line through the end anchors to rounding. When it does not (by
 * more than {@link ANCHOR_MISMATCH_RAD}), the block holds a UTC jump (a leap second turns the Earth
 * by ω·1 s = 7.3e-5 rad, which puts half of it at the middle) or the caller's angle is not linear
 * in time there: the block is then evaluated exactly sample by sample. Refinement instants between
 * two samples of one linear block take the angle from the sample before them and the block's rate
 * ({@link earthRotationAtGridTime}); elsewhere the caller evaluates it.
 */
import type { GmstRadAt } from './passes.ts';

/** Samples per block of the recurrence; its rounding grows by ~1e-16 rad per step. */
const BLOCK_SAMPLES = 256;
/**
 * Largest mismatch [rad] between the middle anchor and the line through the end anchors for the
 * recurrence to be used. 1e-9 rad is 4 cm at GEO radius and moves an elevation by 1e-9 rad, under
 * 1e-5 s of AOS/LOS even at MEO elevation rates; the quadratic term and rounding stay below 1e-11.
 */
const ANCHOR_MISMATCH_RAD = 1e-9;
/** Nominal sidereal rate [rad/s] (IAU-82 GMST rate, 7.2921158553e-5), only to unwrap whole turns. */
const NOMINAL_SIDEREAL_RATE_RAD_PER_S = 7.2921158553e-5;
const TWO_PI = 2 * Math.PI;

/** The angle wrapped to (−π, π]. */
function wrapPi(a: number): number {
  return a - TWO_PI * Math.round(a / TWO_PI);
}

/**
 * cos and sin of the sidereal angle at t0 + k·stepS, k = 0 … n − 1, into cosOut[k] and sinOut[k],
 * and into rateOut[k] the angle's rate [rad/s] over the block of sample k when that block is linear
 * (NaN when it was evaluated sample by sample). Exact at the anchors; elsewhere within 1e-9 rad of
 * `gmstRadAt` (see the module comment).
 */
export function earthRotationAlongGrid(gmstRadAt: GmstRadAt, t0: number, stepS: number, n: number, cosOut: Float64Array, sinOut: Float64Array, rateOut: Float64Array): void {
  for (let start = 0; start < n; start += BLOCK_SAMPLES) {
    const m = Math.min(BLOCK_SAMPLES, n - start);
    const ta = t0 + start * stepS;
    rateOut.fill(Number.NaN, start, start + m);
    if (m < 3) {
      for (let k = 0; k < m; k++) {
        const g = gmstRadAt(ta + k * stepS);
        cosOut[start + k] = Math.cos(g);
        sinOut[start + k] = Math.sin(g);
      }
      continue;
    }
    const last = m - 1;
    const mid = last >> 1;
    const thA = gmstRadAt(ta);
    const thB = gmstRadAt(ta + last * stepS);
    const thM = gmstRadAt(ta + mid * stepS);
    const raw = thB - thA;
    const span = raw + TWO_PI * Math.round((NOMINAL_SIDEREAL_RATE_RAD_PER_S * last * stepS - raw) / TWO_PI);
    const perStep = span / last;
    if (!(Math.abs(wrapPi(thM - thA - perStep * mid)) <= ANCHOR_MISMATCH_RAD)) {
      for (let k = 0; k < m; k++) {
        const g = gmstRadAt(ta + k * stepS);
        cosOut[start + k] = Math.cos(g);
        sinOut[start + k] = Math.sin(g);
      }
      continue;
    }
    rateOut.fill(perStep / stepS, start, start + m);
    const cStep = Math.cos(perStep);
    const sStep = Math.sin(perStep);
    let c = Math.cos(thA);
    let s = Math.sin(thA);
    for (let k = 0; k < last; k++) {
      cosOut[start + k] = c;
      sinOut[start + k] = s;
      const cNext = c * cStep - s * sStep;
      s = s * cStep + c * sStep;
      c = cNext;
    }
    // The end anchor exactly, not the recurrence's last step.
    cosOut[start + last] = Math.cos(thB);
    sinOut[start + last] = Math.sin(thB);
  }
}

/**
 * cos and sin [into out[0], out[1]] of the sidereal angle at a time t inside a grid filled by
 * {@link earthRotationAlongGrid} (samples t0 + k·stepS, k < n): from the sample before t and its
 * block's rate when the samples on both sides of t belong to the same linear block (a UTC jump
 * between two blocks is in neither), else false (the caller evaluates the angle itself). The turn
 * over less than a step (≤ 0.044 rad) is a Taylor series to the 7th power: error < 1e-15.
 */
export function earthRotationAtGridTime(t: number, t0: number, stepS: number, n: number, cosG: Float64Array, sinG: Float64Array, rateG: Float64Array, out: Float64Array): boolean {
  const k = Math.floor((t - t0) / stepS);
  if (!(k >= 0 && k + 1 < n) || (k + 1) % BLOCK_SAMPLES === 0) return false;
  const rate = rateG[k];
  if (Number.isNaN(rate)) return false;
  const d = rate * (t - (t0 + k * stepS));
  const d2 = d * d;
  const cd = 1 - (d2 / 2) * (1 - (d2 / 12) * (1 - d2 / 30));
  const sd = d * (1 - (d2 / 6) * (1 - (d2 / 20) * (1 - d2 / 42)));
  const c = cosG[k];
  const s = sinG[k];
  out[0] = c * cd - s * sd;
  out[1] = s * cd + c * sd;
  return true;
}
