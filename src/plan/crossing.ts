/**
 * Crossings of a keep-in limit, one side at a time (physics.md §6–7). For the side s (+1 upper,
 * −1 lower) the predicted crossing is the first t with s·x(t) ≥ L; the 95 % band's edge nearer
 * that limit (s·x + b ≥ L) gives `earliest`, the far edge (s·x − b ≥ L) gives `latest`. The two
 * limits are never mixed: a band that touches the other limit first is reported as `otherSide`.
 * Roots come from one coarse scan (the caller's step, short enough that the orbit's periodic term
 * cannot hide a crossing) and a capped bisection to 0.1 s.
 */
import { InternalError } from '../errors.ts';

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
  let prev = from;
  const wanted = (): boolean => {
    for (let i = 0; i < count; i++) if (state[i] >= 0) return true;
    return false;
  };
  for (let k = 1; k <= n && wanted(); k++) {
    const t = Math.min(to, from + k * stepS);
    const x = offsetNs(t);
    const b = bandNs(t);
    for (let i = 0; i < count; i++) {
      if (state[i] < 0) continue;
      const v = g(i, x, b);
      if (state[i] === 0) {
        if (v < 0) state[i] = 1;
        continue;
      }
      if (v >= 0) {
        found[i] = bisect((tt) => g(i, offsetNs(tt), bandNs(tt)), prev, t);
        state[i] = -1;
      }
    }
    settle();
    prev = t;
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
