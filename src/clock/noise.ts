/**
 * Prediction band from the noise model (physics.md §6). The rule, stated in every output that
 * uses it: σ_x(τ) ≈ τ·σ_y(τ), σ_y the root sum of squares of the white-FM, flicker-FM and
 * random-walk-FM levels at τ; the 95 % band is ±1.96 σ_x (common practice, no single source).
 */
import { SECONDS_PER_DAY } from '../constants.ts';
import type { NoiseLevels } from './oscillator.ts';

/** The rule as printed in reports. */
export const PREDICTION_RULE_TEXT =
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

/** 1-σ time prediction error [ns] after a horizon τ [s]. Zero at τ = 0. */
export function predictionSigmaNs(noise: NoiseLevels, tauS: number): number {
  if (!(tauS > 0)) return 0;
  return tauS * sigmaY(noise, tauS) * 1e9;
}
