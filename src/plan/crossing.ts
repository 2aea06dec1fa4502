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
  const levels: Level[] = [];
  for (const sign of [1, -1] as const) for (const bandSign of [0, 1, -1] as const) levels.push({ sign, bandSign, levelNs: limitNs });
  const [upAt, upEarly, upLate, loAt, loEarly, loLate] = firstLevelTimes(offsetNs, bandNs, levels, from, to, stepS);
  if (upAt === null && loAt === null) return null;
  const upperFirst = loAt === null || (upAt !== null && upAt <= loAt);
  const [at, early, late, otherEarly] = upperFirst ? [upAt as number, upEarly, upLate, loEarly] : [loAt as number, loEarly, loLate, upEarly];
  const earliest = Math.min(early ?? at, at);
  return {
    atTtJ2000S: at,
    side: upperFirst ? 'upper' : 'lower',
    earliestTtJ2000S: earliest,
    latestTtJ2000S: late === null ? null : Math.max(late, at),
    otherSide: otherEarly !== null && otherEarly < earliest ? { side: upperFirst ? 'lower' : 'upper', earliestTtJ2000S: otherEarly } : null,
  };
}

/** Sign of a side: +1 upper, −1 lower. */
export const signOf = (side: Side): 1 | -1 => (side === 'upper' ? 1 : -1);
export { sideOf };
