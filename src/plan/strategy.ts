/**
 * Sizing one keep-in adjustment under each strategy (physics.md §7), for a clock whose trend (the
 * offset without the orbit's periodic swing) moves as x0 + r·τ + d·τ²/2 inside a usable band ±B
 * (B = limit − margin − periodic half-amplitude). The 95 % prediction band narrows B further: the
 * phase and combined strategies solve b + band95(T(b)) = B for the effective half-width b, with
 * T(b) the interval they would reach; the frequency strategy checks the band along each trajectory.
 * - phase: offset to the value that keeps the clock inside longest (adjust.ts bestPhaseNs), or to
 *   the target when the target lasts to the horizon anyway;
 * - frequency: no phase step; the rate that brings the trend to the target and then keeps it inside
 *   longest (a numeric search over the time to reach the target); never parks it at the limit;
 * - combined: offset and rate together (adjust.ts combinedStart), T = 4·√(b/|d|) without noise.
 * Units: ns, s, ns/s, ns/s²; steps are reported fractional (ns/s × 1e-9).
 */
import { bestPhaseNs, combinedStart, timeToLeaveS } from './adjust.ts';
import { frequencyCandidates, quantisePhaseNs, type ClockSteps } from './quantise.ts';

/** How the planner adjusts a clock. */
export type Strategy = 'phase' | 'frequency' | 'combined';

export interface SizingInput {
  strategy: Strategy;
  /** Trend offset at the adjustment [ns]. */
  trendNs: number;
  /** Trend rate at the adjustment [ns/s]. */
  rateNsPerS: number;
  /** Aging [ns/s²]. */
  agingNsPerS2: number;
  /** Usable half-band B [ns] (limit − margin − periodic allowance). */
  usableNs: number;
  /** Target offset [ns], |target| < B. */
  targetNs: number;
  /** Time left to the horizon [s]. */
  remainingS: number;
  /** Half-width of the 95 % band [ns] τ seconds after the adjustment. */
  band95Ns: (tauS: number) => number;
  steps: ClockSteps;
}

export interface Sizing {
  /** Applied (quantised) phase step [ns] and fractional frequency step. */
  phaseStepNs: number;
  frequencyStep: number;
  /** The same before rounding to the hardware's resolution. */
  exactPhaseStepNs: number;
  exactFrequencyStep: number;
  /** Effective half-band used [ns] after the prediction band. */
  effectiveBandNs: number;
}

const BAND_BISECTIONS = 60;
const RATE_GRID_POINTS = 241;
const EXIT_SCAN_POINTS = 1500;
const EXIT_BISECTIONS = 40;
/** Shortest time to reach the target the frequency search tries [s]. */
const MIN_RETURN_S = 600;

/** Time inside ±b [s] from x0 (moved just inside, so a start on the edge moving inward is not an exit). */
function insideS(x0: number, r: number, d: number, b: number): number {
  const x = Math.max(-b, Math.min(b, x0)) * (1 - 1e-12);
  return timeToLeaveS(x, r, d, b);
}

/** Solve b + band95(min(T(b), H)) = B for b ∈ [0, B] by bisection (b + band grows with b). */
function effectiveBand(usable: number, interval: (b: number) => number, input: SizingInput): number {
  if (!(usable > 0)) return 0;
  const f = (b: number): number => b + input.band95Ns(Math.min(interval(b), input.remainingS)) - usable;
  if (f(usable) <= 0) return usable;
  let lo = 0;
  let hi = usable;
  for (let k = 0; k < BAND_BISECTIONS; k++) {
    const mid = 0.5 * (lo + hi);
    if (f(mid) <= 0) lo = mid;
    else hi = mid;
  }
  return lo;
}

/** Size one adjustment. */
export function sizeAdjustment(input: SizingInput): Sizing {
  if (input.strategy === 'phase') return sizePhase(input);
  if (input.strategy === 'combined') return sizeCombined(input);
  return sizeFrequency(input);
}

function sizePhase(input: SizingInput): Sizing {
  const { rateNsPerS: r, agingNsPerS2: d, targetNs: target, remainingS: h } = input;
  const b = effectiveBand(input.usableNs, (bb) => insideS(bestPhaseNs(r, d, bb), r, d, bb), input);
  let x = bestPhaseNs(r, d, b);
  if (Math.abs(target) < b && insideS(target, r, d, b) >= h) x = target;
  const exact = x - input.trendNs;
  return { phaseStepNs: quantisePhaseNs(exact, input.steps), frequencyStep: 0, exactPhaseStepNs: exact, exactFrequencyStep: 0, effectiveBandNs: b };
}

function sizeCombined(input: SizingInput): Sizing {
  const { rateNsPerS: r, agingNsPerS2: d, targetNs: target, remainingS: h } = input;
  const b = effectiveBand(input.usableNs, (bb) => combinedStart(d, bb, target, h).intervalS, input);
  const start = combinedStart(d, b, target, h);
  const exactFreq = (start.rateNsPerS - r) * 1e-9;
  // Of the realisable rate steps, the one that keeps the clock inside longest (a rate a little too
  // large would let the vertex overshoot the far limit and halve the interval).
  let best: { freq: number; x: number; t: number } | null = null;
  for (const freq of frequencyCandidates(exactFreq, input.steps)) {
    const rNew = r + freq * 1e9;
    const exactRate = freq === exactFreq;
    for (const x of exactRate ? [start.offsetNs] : [start.offsetNs, bestPhaseNs(rNew, d, b)]) {
      const t = Math.min(h, insideS(x, rNew, d, b));
      if (best === null || t > best.t * (1 + 1e-9)) best = { freq, x, t };
    }
  }
  const chosen = best as { freq: number; x: number };
  const exactPhase = start.offsetNs - input.trendNs;
  return { phaseStepNs: quantisePhaseNs(chosen.x - input.trendNs, input.steps), frequencyStep: chosen.freq, exactPhaseStepNs: exactPhase, exactFrequencyStep: exactFreq, effectiveBandNs: b };
}

/**
 * band95Ns at the scan points of exitWithBandS over (0, H]: the same for every candidate rate of
 * one sizing, so worked out once.
 */
export function exitBandGrid(band95Ns: (tauS: number) => number, horizonS: number): Float64Array {
  const dt = horizonS / EXIT_SCAN_POINTS;
  const grid = new Float64Array(EXIT_SCAN_POINTS + 1);
  grid[0] = band95Ns(0);
  for (let k = 1; k <= EXIT_SCAN_POINTS; k++) grid[k] = band95Ns(k * dt);
  return grid;
}

/**
 * First τ ∈ (0, H] at which the trend with its 95 % band leaves ±B, counted once the trend is
 * inside (a start at the edge does not count); H when it stays inside, 0 when it never gets in.
 */
export function exitWithBandS(x0: number, r: number, d: number, usable: number, band95Ns: (tauS: number) => number, horizonS: number, bandGridNs: Float64Array = exitBandGrid(band95Ns, horizonS)): number {
  // v(τ) = |x0 + r·τ + d·τ²/2| + band95Ns(τ) − usable; at the k-th scan point the band is read
  // from the grid (the same value band95Ns gives there).
  const vAt = (k: number, tau: number): number => Math.abs(x0 + r * tau + 0.5 * d * tau * tau) + bandGridNs[k] - usable;
  const dt = horizonS / EXIT_SCAN_POINTS;
  let inside = vAt(0, 0) < 0;
  let k = 1;
  while (k <= EXIT_SCAN_POINTS) {
    // A run of points where v keeps its sign (inside: < 0; not yet inside: ≥ 0) changes nothing.
    const kb = Math.min(EXIT_SCAN_POINTS, k + EXIT_BLOCK_POINTS - 1);
    if (kb > k && keepsSign(x0, r, d, usable, k * dt, kb * dt, bandGridNs[k], bandGridNs[kb], inside)) {
      k = kb + 1;
      continue;
    }
    for (; k <= kb; k++) {
      const tau = k * dt;
      const vt = vAt(k, tau);
      if (!inside) {
        inside = vt < 0;
        continue;
      }
      if (vt >= 0) {
        let lo = (k - 1) * dt;
        let hi = tau;
        // The band at lo and hi (computed there, or a point beyond) brackets it at mid: when the
        // bracket settles the sign of v(mid) = |trend| + band − B, the band need not be computed.
        let bandLo = bandGridNs[k - 1];
        let bandHi = bandGridNs[k];
        for (let i = 0; i < EXIT_BISECTIONS; i++) {
          const mid = 0.5 * (lo + hi);
          const trend = Math.abs(x0 + r * mid + 0.5 * d * mid * mid);
          let leaves: boolean;
          if (trend + bandLo * (1 - EXIT_ROUNDING) >= usable) leaves = true;
          else if (trend + bandHi * (1 + EXIT_ROUNDING) < usable) leaves = false;
          else {
            const band = band95Ns(mid);
            leaves = trend + band - usable >= 0;
            if (leaves) bandHi = band;
            else bandLo = band;
          }
          if (leaves) hi = mid;
          else lo = mid;
        }
        return hi;
      }
    }
  }
  return inside ? horizonS : 0;
}

/** The trend x0 + r·τ + d·τ²/2 [ns], computed as exitWithBandS computes it. */
function trendAt(x0: number, r: number, d: number, tau: number): number {
  return x0 + r * tau + 0.5 * d * tau * tau;
}

/** Scan points exitWithBandS tries to pass over at once. */
const EXIT_BLOCK_POINTS = 32;
/** Relative rounding allowance on the quadratic's and the band's computed values. */
const EXIT_ROUNDING = 1e-12;

/**
 * True when v(τ) = |x0 + r·τ + d·τ²/2| + band(τ) − B stays < 0 (inside) or ≥ 0 (not inside)
 * at every scan point in [ta, tb], as computed: the quadratic's range over the interval comes from
 * its ends and its vertex, the band (growing with τ) lies between its values at the ends.
 */
function keepsSign(x0: number, r: number, d: number, usable: number, ta: number, tb: number, bandA: number, bandB: number, inside: boolean): boolean {
  const qa = trendAt(x0, r, d, ta);
  const qb = trendAt(x0, r, d, tb);
  let hi = Math.max(Math.abs(qa), Math.abs(qb));
  let lo = qa > 0 === qb > 0 && qa !== 0 && qb !== 0 ? Math.min(Math.abs(qa), Math.abs(qb)) : 0;
  const vertex = d !== 0 ? -r / d : NaN;
  if (vertex > ta && vertex < tb) {
    const qv = trendAt(x0, r, d, vertex);
    hi = Math.max(hi, Math.abs(qv));
    if (qv > 0 !== qa > 0 || qv === 0) lo = 0;
    else lo = Math.min(lo, Math.abs(qv));
  }
  const tol = EXIT_ROUNDING * (Math.abs(x0) + Math.abs(r) * Math.abs(tb) + Math.abs(0.5 * d) * tb * tb + hi + Math.max(bandA, bandB) + Math.abs(usable)) + EXIT_ROUNDING;
  if (inside) return hi + Math.max(bandA, bandB) * (1 + EXIT_ROUNDING) - usable + tol < 0;
  return lo + Math.min(bandA, bandB) * (1 - EXIT_ROUNDING) - usable - tol >= 0;
}

function sizeFrequency(input: SizingInput): Sizing {
  const { trendNs: x0, rateNsPerS: r, agingNsPerS2: d, targetNs: target, remainingS: h, usableNs: usable } = input;
  const maxFreq = input.steps.maxFrequencyStep ?? Infinity;
  const lo = Math.min(MIN_RETURN_S, h / 4);
  const hi = 4 * Math.max(h, lo);
  type Cand = { freq: number; score: number; returnS: number; reaches: boolean };
  const cands: Cand[] = [];
  const bandGridNs = exitBandGrid(input.band95Ns, h);
  for (let k = 0; k < RATE_GRID_POINTS; k++) {
    // τc: time for the trend to reach the target; the rate follows from it.
    const tauC = lo * (hi / lo) ** (k / (RATE_GRID_POINTS - 1));
    const rate = (target - x0 - 0.5 * d * tauC * tauC) / tauC;
    const freq = (rate - r) * 1e-9;
    if (Math.abs(freq) > maxFreq) continue;
    const exit = exitWithBandS(x0, rate, d, usable, input.band95Ns, h, bandGridNs);
    cands.push({ freq, score: exit, returnS: tauC, reaches: exit >= Math.min(tauC, h) });
  }
  const pool = cands.some((c) => c.reaches) ? cands.filter((c) => c.reaches) : cands;
  let best: Cand | null = null;
  for (const c of pool) {
    if (best === null || c.score > best.score * (1 + 1e-6) || (c.score >= best.score * (1 - 1e-6) && Math.abs(c.returnS - h) < Math.abs(best.returnS - h))) best = c;
  }
  // No realisable rate at all within the largest step: the largest step toward the target.
  const exact = best?.freq ?? Math.sign(target - x0) * maxFreq;
  return { phaseStepNs: 0, frequencyStep: frequencyCandidates(exact, input.steps)[0], exactPhaseStepNs: 0, exactFrequencyStep: exact, effectiveBandNs: usable };
}
