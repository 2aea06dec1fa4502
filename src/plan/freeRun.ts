/**
 * The free-running clock over a keep-in plan's horizon (resets.ts): its offset at the scan instants
 * from the plan start, computed once per satellite, and the largest probability that it is outside
 * the limit at one instant.
 */
import type { NoiseLevels, OnboardClock } from '../clock/oscillator.ts';
import { bandSigmaOf, outsideProbability } from './band.ts';

/** What the free-running scans need of a plan request. */
export interface FreeRunInput {
  clock: OnboardClock;
  noise: NoiseLevels | null;
  limitNs: number;
  fromTtJ2000S: number;
  toTtJ2000S: number;
  /** Orbital period [s]. */
  periodS: number;
}

/** Scan step [s] of the keep-in scans: an eighth of the orbit, within [10 s, 600 s]. */
export const scanStepOf = (periodS: number): number => Math.max(10, Math.min(600, periodS / 8));

/** The free-running offset [ns] at the scan instants from the plan start: min(to, from + k·step), k = 0…n. */
export function freeGrid(req: FreeRunInput): Float64Array {
  const { fromTtJ2000S: from, toTtJ2000S: to } = req;
  const step = scanStepOf(req.periodS);
  const n = Math.ceil((to - from) / step);
  const grid = new Float64Array(Math.max(0, n + 1));
  for (let k = 0; k <= n; k++) grid[k] = req.clock.offsetNs(Math.min(to, from + k * step));
  return grid;
}

/**
 * The band's 1-σ [ns] at the scan instants from the plan start (NaN: not worked out yet), kept for
 * the next satellite with the same noise and span: a scenario's satellites mostly share both. A
 * cache of a pure function of its key, so the plans do not depend on the order they are made in.
 */
let sigmaGridMemo: { key: readonly (number | boolean)[]; sigmaNs: Float64Array } | null = null;

function sigmaGridFor(noise: NoiseLevels | null, from: number, to: number, stepS: number, count: number): Float64Array {
  const key = [noise === null, noise?.whiteFmAdev1s ?? 0, noise?.flickerFmFloor ?? 0, noise?.randomWalkFmAdev1d ?? 0, from, to, stepS, count];
  if (sigmaGridMemo === null || sigmaGridMemo.key.length !== key.length || sigmaGridMemo.key.some((v, i) => !Object.is(v, key[i]))) {
    sigmaGridMemo = { key, sigmaNs: new Float64Array(count).fill(NaN) };
  }
  return sigmaGridMemo.sigmaNs;
}

/** Scan points per block of crossingProbability. */
const PROBABILITY_BLOCK = 64;
/** Allowance [probability] for the normal tail's approximation (≤ 1.5e-7 per limit) and rounding. */
const PROBABILITY_SLACK = 1e-6;

/**
 * Largest probability over [from, to] that the free-running offset is outside ±L at one instant
 * (the largest over the scan points). Blocks of points are taken from the end, where the band is
 * widest: inside the limit the probability grows with |x| and with the band, so a block whose
 * largest |x| with its widest band stays below the largest so far cannot raise it and is passed.
 */
export function crossingProbability(req: FreeRunInput, freeGridNs: Float64Array): number {
  const { fromTtJ2000S: from, toTtJ2000S: to, limitNs: L } = req;
  const step = scanStepOf(req.periodS);
  const sigma = bandSigmaOf(req.noise);
  const known = sigmaGridFor(req.noise, from, to, step, freeGridNs.length);
  const sigmaAt = (k: number): number => {
    let v = known[k];
    if (v !== v) known[k] = v = sigma(Math.min(to, from + k * step) - from);
    return v;
  };
  let p = 0;
  for (let end = freeGridNs.length; end > 0; end -= PROBABILITY_BLOCK) {
    const start = Math.max(0, end - PROBABILITY_BLOCK);
    let xMaxNs = 0;
    for (let k = start; k < end; k++) xMaxNs = Math.max(xMaxNs, Math.abs(freeGridNs[k]));
    if (xMaxNs < L && outsideProbability(xMaxNs, sigmaAt(end - 1) * (1 + 1e-12), L) + PROBABILITY_SLACK < p) continue;
    for (let k = start; k < end; k++) p = Math.max(p, outsideProbability(freeGridNs[k], sigmaAt(k), L));
  }
  return p;
}
