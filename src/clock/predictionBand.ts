/**
 * Prediction band of a free-running clock, derived from its noise (pure; no I/O).
 *
 * Clock model (L. Galleani, L. Sacerdote, P. Tavella, C. Zucca, Metrologia 40 (2003) S257;
 * C. Zucca and P. Tavella, IEEE UFFC 52(2):289, 2005): x' = y + √q1·ξ1, y' = d + √q2·ξ2,
 * d' = √q3·ξ3, ξ white. Its Allan variance is σ_y²(τ) = q1/τ + q2·τ/3 + q3·τ³/20, and the time
 * error after coasting t from a perfectly known state has variance
 *     σ_x²(t) = q1·t + q2·t³/3 + q3·t⁵/20
 * (derived here from the variances of once, twice and three times integrated Wiener processes;
 * the relation to the paper is from memory and checked by simulation in
 * tests/zucca-tavella-2005.test.ts). With the scenario's levels: q1 = whiteFmAdev1s²·1 s,
 * q2 = 3·randomWalkFmAdev1d²/86400 s. The model has no flicker FM; a flicker floor b adds
 * (b·t)² (the usual σ_x ≈ t·σ_y rule, an approximation). When the starting offset, rate and drift
 * come from a fit, their covariance Σ adds gᵀΣg with g = (1, t, t²/2) in the parameters' units.
 */
import { SECONDS_PER_DAY } from '../constants.ts';
import type { NoiseLevels } from './oscillator.ts';

/** Diffusion coefficients of the three-state clock model. */
export interface ClockDiffusion {
  /** White FM, s (σ_y²(τ) = q1/τ). */
  q1S: number;
  /** Random-walk FM, 1/s (σ_y²(τ) = q2·τ/3). */
  q2PerS: number;
  /** Random-run (drift random walk), 1/s³ (σ_y²(τ) = q3·τ³/20). */
  q3PerS3: number;
}

/** q values from the scenario's noise levels (random run 0: the scenario has no key for it). */
export function diffusionFromNoise(noise: NoiseLevels, q3PerS3 = 0): ClockDiffusion {
  const a = noise.whiteFmAdev1s ?? 0;
  const c = noise.randomWalkFmAdev1d ?? 0;
  return { q1S: a * a, q2PerS: (3 * c * c) / SECONDS_PER_DAY, q3PerS3 };
}

/**
 * Covariance of fitted (offset ns, fractional frequency, drift per day), as `fit` reports it:
 * sigmas and the correlation matrix (offset, frequency, drift order; shorter below degree 2).
 */
export interface FitCovariance {
  sigmas: number[];
  correlation: number[][];
}

/** The band at one horizon, with its parts (all 1σ, ns). */
export interface BandAt {
  /** Total 1σ, ns. */
  sigmaNs: number;
  /** Root of each contribution, ns. */
  whiteFmNs: number;
  flickerFmNs: number;
  randomWalkFmNs: number;
  randomRunNs: number;
  fitNs: number;
}

/**
 * 1σ time-prediction error after coasting `horizonS` seconds.
 * @param noise   the scenario's noise levels
 * @param horizonS time since the known state, s (≤ 0 gives the fit part only)
 * @param fit     covariance of the fitted starting state (optional)
 * @param q3PerS3 random-run diffusion, 1/s³ (optional)
 */
export function predictionBandAt(noise: NoiseLevels, horizonS: number, fit?: FitCovariance, q3PerS3 = 0): BandAt {
  const t = Math.max(0, horizonS);
  const q = diffusionFromNoise(noise, q3PerS3);
  const white = q.q1S * t;
  const rw = (q.q2PerS * t ** 3) / 3;
  const rr = (q.q3PerS3 * t ** 5) / 20;
  const flicker = ((noise.flickerFmFloor ?? 0) * t) ** 2;
  let fitVarNs2 = 0;
  if (fit !== undefined) {
    // Parameter units: ns, fractional (→ ns by t·1e9), per day (→ ns by t²/2/86400·1e9).
    const g = [1, t * 1e9, ((t * t) / 2 / SECONDS_PER_DAY) * 1e9].slice(0, fit.sigmas.length);
    for (let i = 0; i < g.length; i++) for (let j = 0; j < g.length; j++) fitVarNs2 += g[i] * g[j] * fit.sigmas[i] * fit.sigmas[j] * fit.correlation[i][j];
  }
  const ns2 = 1e18;
  const total = (white + rw + rr + flicker) * ns2 + Math.max(0, fitVarNs2);
  return {
    sigmaNs: Math.sqrt(total),
    whiteFmNs: Math.sqrt(white * ns2),
    flickerFmNs: Math.sqrt(flicker * ns2),
    randomWalkFmNs: Math.sqrt(rw * ns2),
    randomRunNs: Math.sqrt(rr * ns2),
    fitNs: Math.sqrt(Math.max(0, fitVarNs2)),
  };
}

/** The band as text for reports. */
export const PREDICTION_BAND_TEXT =
  'σx²(t) = q1·t + q2·t³/3 (+ (b·t)² for a flicker floor b) from the clock model of Zucca & Tavella 2005, q1 = whiteFmAdev1s²·1 s, q2 = 3·randomWalkFmAdev1d²/1 d; 95 % band = ±1.96·σx';

/**
 * The 95 % band (±1.96σ) at 60 horizons from 0 to `maxHorizonS`, for plots.
 * @param sigmas      1σ of (offset ns, fractional frequency, drift per day); nulls (unknown) end the list
 * @param correlation their correlation matrix, or null (then the fitted state is taken as exact)
 */
export function bandSeries(noise: NoiseLevels, sigmas: (number | null)[], correlation: number[][] | null, maxHorizonS: number): { horizonS: number[]; halfWidth95Ns: number[] } {
  const known: number[] = [];
  for (const v of sigmas) {
    if (v === null) break;
    known.push(v);
  }
  const fit = correlation === null || known.length === 0 ? undefined : { sigmas: known, correlation: correlation.slice(0, known.length).map((r) => r.slice(0, known.length)) };
  const horizonS: number[] = [];
  const halfWidth95Ns: number[] = [];
  for (let k = 0; k <= 60; k++) {
    const t = (maxHorizonS * k) / 60;
    horizonS.push(t);
    halfWidth95Ns.push(1.96 * predictionBandAt(noise, t, fit).sigmaNs);
  }
  return { horizonS, halfWidth95Ns };
}
