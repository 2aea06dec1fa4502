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
 * in time there: the block is then evaluated exactly sample by sample.
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
 * cos and sin of the sidereal angle at t0 + k·stepS, k = 0 … n − 1, into cosOut[k] and sinOut[k].
 * Exact at the anchors; elsewhere within 1e-9 rad of `gmstRadAt` (see the module comment).
 */
export function earthRotationAlongGrid(gmstRadAt: GmstRadAt, t0: number, stepS: number, n: number, cosOut: Float64Array, sinOut: Float64Array): void {
  for (let start = 0; start < n; start += BLOCK_SAMPLES) {
    const m = Math.min(BLOCK_SAMPLES, n - start);
    const ta = t0 + start * stepS;
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
