/**
 * The prediction band the planner uses (physics.md §6): one function gives the band's 1-σ at a
 * horizon τ counted from the last known state (the plan start, or the last adjustment, where a
 * fresh measurement is assumed). It is the derived band of `clock/predictionBand.ts` through
 * `clock/noise.ts` (the old rule σx(τ) ≈ τ·σy(τ) stays there as the documented fallback).
 *
 * For white FM and random-walk FM the rule equals the Wiener-process result
 * σx²(τ) = q1·τ + q2·τ³/3 (Zucca & Tavella 2005, eq. for the two-state clock model; derived), since
 * σy²(τ) = q1/τ + q2·τ/3 for those two noises; flicker FM has no exact state form and the rule is a
 * rule of thumb there.
 */
import { PREDICTION_RULE_TEXT, Z95 } from '../clock/noise.ts';
import type { NoiseLevels } from '../clock/oscillator.ts';
import { SECONDS_PER_DAY } from '../constants.ts';

export { Z95 };

/** How the band is computed, as printed in every output that uses it. */
export const BAND_RULE_TEXT = PREDICTION_RULE_TEXT;

/** 1-σ of the offset prediction [ns] after τ [s] from a known state; 0 without noise or at τ ≤ 0. */
export function bandSigmaNs(noise: NoiseLevels | null, tauS: number): number {
  return bandSigmaOf(noise)(tauS);
}

/** Half-width [ns] of the 95 % band after τ [s]. */
export function band95Ns(noise: NoiseLevels | null, tauS: number): number {
  return Z95 * bandSigmaNs(noise, tauS);
}

const NO_BAND = (): number => 0;

/**
 * `bandSigmaNs` for one noise as a function of τ [s], its coefficients worked out once: the
 * planner's scans call it millions of times. predictionBandAt (clock/predictionBand.ts) with no fit
 * and no random run, without its allocations: the same operations in the same order, so the same
 * result to the last bit (x² is exactly x·x in the platform's pow; τ³ stays a pow, as there).
 */
export function bandSigmaOf(noise: NoiseLevels | null): (tauS: number) => number {
  if (noise === null) return NO_BAND;
  const a = noise.whiteFmAdev1s ?? 0;
  const c = noise.randomWalkFmAdev1d ?? 0;
  const f = noise.flickerFmFloor ?? 0;
  const whiteNs2PerS = a * a;
  const rwPerS3 = (3 * c * c) / SECONDS_PER_DAY;
  return (tauS: number): number => {
    if (!(tauS > 0)) return 0;
    const white = whiteNs2PerS * tauS;
    const rw = (rwPerS3 * tauS ** 3) / 3;
    const ft = f * tauS;
    return Math.sqrt((white + rw + 0 + ft * ft) * 1e18 + 0);
  };
}

/** `band95Ns` for one noise as a function of τ [s] (see bandSigmaOf). */
export function band95Of(noise: NoiseLevels | null): (tauS: number) => number {
  if (noise === null) return NO_BAND;
  const sigma = bandSigmaOf(noise);
  return (tauS: number): number => Z95 * sigma(tauS);
}

/** Standard normal upper tail Q(z) = P(Z > z) (Abramowitz & Stegun 7.1.26 through erfc; |error| < 1.5e-7). */
export function normalTail(z: number): number {
  const x = Math.abs(z) / Math.SQRT2;
  const t = 1 / (1 + 0.3275911 * x);
  const erfc = t * (0.254829592 + t * (-0.284496736 + t * (1.421413741 + t * (-1.453152027 + t * 1.061405429)))) * Math.exp(-x * x);
  return z >= 0 ? 0.5 * erfc : 1 - 0.5 * erfc;
}

/**
 * Probability [0, 1] that the offset is outside ±L at one instant, for a predicted offset x [ns]
 * with normal error of 1-σ `sigmaNs` (both tails). With σ = 0 it is 1 outside and 0 inside.
 */
export function outsideProbability(xNs: number, sigmaNs: number, limitNs: number): number {
  if (!(sigmaNs > 0)) return Math.abs(xNs) >= limitNs ? 1 : 0;
  return normalTail((limitNs - xNs) / sigmaNs) + normalTail((limitNs + xNs) / sigmaNs);
}
