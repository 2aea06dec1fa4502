/**
 * Prediction band from the noise model (physics.md §6), now derived from the clock model of
 * Zucca & Tavella 2005 (src/clock/predictionBand.ts): σ_x²(t) = q1·t + q2·t³/3 + (b·t)². For
 * white FM and random-walk FM this equals the old common-practice rule σ_x(τ) ≈ τ·σ_y(τ) exactly;
 * for a flicker floor both use b·τ (an approximation). The old rule stays available as
 * {@link ruleOfThumbSigmaNs}, the documented fallback. The 95 % band is ±1.96 σ_x.
 */
import { SECONDS_PER_DAY } from '../constants.ts';
import type { NoiseLevels } from './oscillator.ts';
import { PREDICTION_BAND_TEXT, predictionBandAt } from './predictionBand.ts';

/** The band as printed in reports. */
export const PREDICTION_RULE_TEXT = PREDICTION_BAND_TEXT;

/** The old rule as printed (fallback). */
export const RULE_OF_THUMB_TEXT =
  'σx(τ) ≈ τ·σy(τ), σy = RSS of white FM (a/√τ), flicker floor (b) and random-walk FM (c·√(τ/1 d)); 95 % band = ±1.96·σx (common practice)';

/** 95 % two-sided normal quantile. */
export const Z95 = 1.96;

/** σ_y(τ) (dimensionless) from the levels. τ [s] > 0. */
export function sigmaY(noise: NoiseLevels, tauS: number): number {
  const w = (noise.whiteFmAdev1s ?? 0) / Math.sqrt(tauS);
  const f = noise.flickerFmFloor ?? 0;
  const r = (noise.randomWalkFmAdev1d ?? 0) * Math.sqrt(tauS / SECONDS_PER_DAY);
  return Math.sqrt(w * w + f * f + r * r);
}

/** 1-σ time prediction error [ns] after a horizon τ [s] (derived band). Zero at τ = 0. */
export function predictionSigmaNs(noise: NoiseLevels, tauS: number): number {
  if (!(tauS > 0)) return 0;
  return predictionBandAt(noise, tauS).sigmaNs;
}

/** The old rule σ_x(τ) = τ·σ_y(τ), ns (common practice; fallback). */
export function ruleOfThumbSigmaNs(noise: NoiseLevels, tauS: number): number {
  if (!(tauS > 0)) return 0;
  return tauS * sigmaY(noise, tauS) * 1e9;
}
