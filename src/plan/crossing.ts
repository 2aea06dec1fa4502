/**
 * Crossings of a keep-in limit, one side at a time (physics.md §6–7). For the side s (+1 upper,
 * −1 lower) the predicted crossing is the first t with s·x(t) ≥ L; the 95 % band's edge nearer
 * that limit (s·x + b ≥ L) gives `earliest`, the far edge (s·x − b ≥ L) gives `latest`. The two
 * limits are never mixed: a band that touches the other limit first is reported as `otherSide`.
 * Roots come from one coarse scan (the caller's step, short enough that the orbit's periodic term
 * cannot hide a crossing) and a capped bisection to 0.1 s.
 */
import { InternalError } from '../errors.ts';
import { bendAllowanceNs, type OffsetBend } from './offsetBend.ts';

/** Which keep-in limit. */
export type Side = 'upper' | 'lower';

/** A predicted crossing of one limit, with its 95 % band; times in s since J2000.0 TT. */
export interface Crossing {
  /** Central prediction reaches the limit. */
  atTtJ2000S: number;
  side: Side;
  /** The band edge nearer this limit reaches it (≤ at). */
  earliestTtJ2000S: number;
  /** The far band edge reaches it, or null when not within the horizon. */
  latestTtJ2000S: number | null;
  /** The band touches the opposite limit before `earliest`: when (a risk, not the predicted crossing). */
  otherSide: { side: Side; earliestTtJ2000S: number } | null;
}

const MAX_BISECTIONS = 80;
const CROSSING_RESOLUTION_S = 0.1;
/** Cap on scan points (a 10-year horizon at 10-min steps is about half a million). */
const MAX_SCAN_POINTS = 2_000_000;

/** One level condition: sign·x + bandSign·band − level ≥ 0. */
export interface Level {
  sign: 1 | -1;
  bandSign: 1 | 0 | -1;
  levelNs: number;
}

/**
 * First instants in [from, to] at which each level condition holds, or null. `enteringOnly`: a
 * condition already true at `from` does not count; wait until it is false, then find the next rise.
 * `offsetNs` and `bandNs` are continuous in t.
 */
export function firstLevelTimes(
  offsetNs: (t: number) => number,
  bandNs: (t: number) => number,
  levels: readonly Level[],
  from: number,
  to: number,
  stepS: number,
  enteringOnly = false,
): (number | null)[] {
  const g = (i: number, x: number, b: number): number => levels[i].sign * x + levels[i].bandSign * b - levels[i].levelNs;
  const found: (number | null)[] = levels.map(() => null);
  const armed = levels.map(() => false);
  let remaining = levels.length;
  const x0 = offsetNs(from);
  const b0 = bandNs(from);
  levels.forEach((_, i) => {
    if (g(i, x0, b0) < 0) armed[i] = true;
    else if (!enteringOnly) {
      found[i] = from;
      remaining--;
    }
  });
  const n = Math.ceil((to - from) / stepS);
  if (n > MAX_SCAN_POINTS) throw new InternalError(`crossing scan of ${n} points`, 'horizon');
  let prev = from;
  for (let k = 1; k <= n && remaining > 0; k++) {
    const t = Math.min(to, from + k * stepS);
    const x = offsetNs(t);
    const b = bandNs(t);
    for (let i = 0; i < levels.length; i++) {
      if (found[i] !== null) continue;
      const v = g(i, x, b);
      if (!armed[i]) {
        if (v < 0) armed[i] = true;
        continue;
      }
      if (v >= 0) {
        found[i] = bisect((tt) => g(i, offsetNs(tt), bandNs(tt)), prev, t);
        remaining--;
      }
    }
    prev = t;
  }
  return found;
}

function bisect(g: (t: number) => number, loIn: number, hiIn: number): number {
  let lo = loIn;
  let hi = hiIn;
  for (let it = 0; it < MAX_BISECTIONS && hi - lo > CROSSING_RESOLUTION_S; it++) {
    const mid = 0.5 * (lo + hi);
    if (g(mid) >= 0) hi = mid;
    else lo = mid;
  }
  if (hi - lo > CROSSING_RESOLUTION_S) throw new InternalError('crossing bisection did not converge', 'crossing time');
  return hi;
}

/** First time in [from, to] at which g(t) ≥ 0 (g continuous), or null. */
export function firstRoot(g: (t: number) => number, from: number, to: number, stepS: number, enteringOnly = false): number | null {
  return firstLevelTimes(g, () => 0, [{ sign: 1, bandSign: 0, levelNs: 0 }], from, to, stepS, enteringOnly)[0];
}

const sideOf = (s: 1 | -1): Side => (s > 0 ? 'upper' : 'lower');

/**
 * The first predicted crossing of ±`limitNs` after `from`, side by side. Null when the central
 * prediction stays inside to `to`.
 */
export function crossingAfter(offsetNs: (t: number) => number, bandNs: (t: number) => number, limitNs: number, from: number, to: number, stepS: number): Crossing | null {
  return crossingAndMargin(offsetNs, bandNs, limitNs, null, from, to, stepS).crossing;
}

/**
 * What lets a scan pass over stretches where nothing can happen: how much the offset can bend
 * (offsetBend.ts) and the size [ns] of what the plan adds to the free-running offset.
 */
export interface ScanSkip {
  bend: OffsetBend;
  extraMagnitudeNs: number;
}

/** Relative rounding allowance on the band's computed values and on a level's sum. */
const BAND_ROUNDING = 1e-12;
const ROUNDING = 1e-12;
/** Bending allowed over one first try at a block, as a share of the limit (smaller blocks are halved further). */
const BLOCK_BEND_SHARE = 0.5;
const MAX_BLOCK_POINTS = 256;

/** Scan points per first try: a power of two over which the bend stays a small share of the limit. */
function blockPoints(bend: OffsetBend, stepS: number, limitNs: number): number {
  const wS = Math.sqrt((8 * BLOCK_BEND_SHARE * Math.abs(limitNs)) / Math.max(bend.curvatureNsPerS2, 1e-300));
  let points = 1;
  while (points * 2 <= MAX_BLOCK_POINTS && points * 2 * stepS <= wS) points *= 2;
  return points;
}

/** Levels of crossingAndMargin: upper at, early, late; lower at, early, late; margin upper, lower. */
const UP_AT = 0;
const LO_AT = 3;
const LATE = 2;
const MARGIN = 6;

/**
 * `crossingAfter` and, in the same scan, the first instant after `from` at which the band's edge on
 * the crossing's side enters `marginLevelNs` (s·x + band ≥ level, counted only once it was below:
 * firstLevelTimes with enteringOnly), when that comes no later than the crossing's `earliest` —
 * later it cannot move a deadline min(marginAt, earliest), so it is null then, as when never.
 * The scan visits the same instants as firstLevelTimes and stops as soon as nothing it could still
 * find can change the answer: once the first central crossing is found (the other side's crossing
 * and every early edge can only come later), only that side's far edge (`latest`) is looked for.
 */
export function crossingAndMargin(
  offsetNs: (t: number) => number,
  bandNs: (t: number) => number,
  limitNs: number,
  marginLevelNs: number | null,
  from: number,
  to: number,
  stepS: number,
  skip: ScanSkip | null = null,
): { crossing: Crossing | null; marginAt: number | null } {
  const count = marginLevelNs === null ? 6 : 8;
  const sign = new Float64Array([1, 1, 1, -1, -1, -1, 1, -1]);
  const bandSign = new Float64Array([0, 1, -1, 0, 1, -1, 1, 1]);
  const levelNs = new Float64Array([limitNs, limitNs, limitNs, limitNs, limitNs, limitNs, marginLevelNs ?? 0, marginLevelNs ?? 0]);
  const found: (number | null)[] = [null, null, null, null, null, null, null, null];
  // 1: still wanted and below its level; 0: still wanted, not yet below (margin levels only); -1: done.
  const state = new Int8Array(8);
  const g = (i: number, x: number, b: number): number => sign[i] * x + bandSign[i] * b - levelNs[i];
  const x0 = offsetNs(from);
  const b0 = bandNs(from);
  for (let i = 0; i < count; i++) {
    if (g(i, x0, b0) < 0) state[i] = 1;
    else if (i < MARGIN) {
      found[i] = from;
      state[i] = -1;
    }
  }
  let side: 0 | 1 | -1 = 0;
  const settle = (): void => {
    if (side !== 0 || (found[UP_AT] === null && found[LO_AT] === null)) return;
    side = found[LO_AT] === null || (found[UP_AT] !== null && (found[UP_AT] as number) <= (found[LO_AT] as number)) ? 1 : -1;
    const late = side > 0 ? UP_AT + LATE : LO_AT + LATE;
    for (let i = 0; i < count; i++) if (i !== late) state[i] = -1;
  };
  settle();
  const n = Math.ceil((to - from) / stepS);
  if (n > MAX_SCAN_POINTS) throw new InternalError(`crossing scan of ${n} points`, 'horizon');
  const wanted = (): boolean => {
    for (let i = 0; i < count; i++) if (state[i] >= 0) return true;
    return false;
  };
  const tOf = (k: number): number => Math.min(to, from + k * stepS);
  // The k-th scan instant, with the offset and band there, as firstLevelTimes visits it.
  const visit = (k: number, x: number, b: number): void => {
    const t = tOf(k);
    for (let i = 0; i < count; i++) {
      if (state[i] < 0) continue;
      const v = g(i, x, b);
      if (state[i] === 0) {
        if (v < 0) state[i] = 1;
        continue;
      }
      if (v >= 0) {
        found[i] = bisect((tt) => g(i, offsetNs(tt), bandNs(tt)), tOf(k - 1), t);
        state[i] = -1;
      }
    }
    settle();
  };
  // True when no instant strictly between scan points ka and kb can change a wanted level's state.
  const quiet = (ta: number, xa: number, ba: number, tb: number, xb: number, bb: number): boolean => {
    if (skip === null) return false;
    const e = bendAllowanceNs(skip.bend, ta, tb, skip.extraMagnitudeNs);
    const hiX = Math.max(xa, xb) + e;
    const loX = Math.min(xa, xb) - e;
    // The band grows with τ, so between the ends it stays between them (rounding aside).
    const bLo = Math.min(ba, bb) * (1 - BAND_ROUNDING);
    const bHi = Math.max(ba, bb) * (1 + BAND_ROUNDING);
    for (let i = 0; i < count; i++) {
      if (state[i] < 0) continue;
      const tol = ROUNDING * (Math.abs(hiX) + Math.abs(loX) + bHi + Math.abs(levelNs[i])) + ROUNDING;
      const sxHi = sign[i] > 0 ? hiX : -loX;
      const sxLo = sign[i] > 0 ? loX : -hiX;
      const bandHi = bandSign[i] > 0 ? bHi : bandSign[i] < 0 ? -bLo : 0;
      const bandLo = bandSign[i] > 0 ? bLo : bandSign[i] < 0 ? -bHi : 0;
      if (state[i] === 1 && sxHi + bandHi - levelNs[i] + tol >= 0) return false;
      if (state[i] === 0 && sxLo + bandLo - levelNs[i] - tol < 0) return false;
    }
    return true;
  };
  // Scan points ka < k ≤ kb, the values at both ends known: skip the inside when it is quiet,
  // else halve (left half first, so levels change state in time order).
  const range = (ka: number, xa: number, ba: number, kb: number, xb: number, bb: number): void => {
    if (kb - ka > 1 && !quiet(tOf(ka), xa, ba, tOf(kb), xb, bb)) {
      const km = (ka + kb) >> 1;
      const tm = tOf(km);
      const xm = offsetNs(tm);
      const bm = bandNs(tm);
      range(ka, xa, ba, km, xm, bm);
      if (wanted()) range(km, xm, bm, kb, xb, bb);
      return;
    }
    visit(kb, xb, bb);
  };
  const block = skip === null ? 1 : blockPoints(skip.bend, stepS, limitNs);
  let ka = 0;
  let xa = x0;
  let ba = b0;
  while (ka < n && wanted()) {
    const kb = Math.min(n, ka + block);
    const tb = tOf(kb);
    const xb = offsetNs(tb);
    const bb = bandNs(tb);
    range(ka, xa, ba, kb, xb, bb);
    ka = kb;
    xa = xb;
    ba = bb;
  }
  const [upAt, upEarly, upLate, loAt, loEarly, loLate] = found;
  if (upAt === null && loAt === null) return { crossing: null, marginAt: null };
  const upperFirst = side > 0;
  const [at, early, late, otherEarly] = upperFirst ? [upAt as number, upEarly, upLate, loEarly] : [loAt as number, loEarly, loLate, upEarly];
  const earliest = Math.min(early ?? at, at);
  const marginAt = marginLevelNs === null ? null : found[upperFirst ? MARGIN : MARGIN + 1];
  return {
    crossing: {
      atTtJ2000S: at,
      side: upperFirst ? 'upper' : 'lower',
      earliestTtJ2000S: earliest,
      latestTtJ2000S: late === null ? null : Math.max(late, at),
      otherSide: otherEarly !== null && otherEarly < earliest ? { side: upperFirst ? 'lower' : 'upper', earliestTtJ2000S: otherEarly } : null,
    },
    marginAt: marginAt !== null && marginAt <= earliest ? marginAt : null,
  };
}

/** Sign of a side: +1 upper, −1 lower. */
export const signOf = (side: Side): 1 | -1 => (side === 'upper' ? 1 : -1);
export { sideOf };
