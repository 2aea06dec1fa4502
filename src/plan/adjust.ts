/**
 * Sizing one keep-in adjustment (physics.md §7).
 * Phase: step the offset to the value x0 in the usable band [−B, B] (B = keepIn − margin) that
 * gives the longest time until the next crossing, for a clock moving as x0 + r·τ + D·τ²/2.
 * Combined: set offset and rate together (combinedStart). Frequency sizing is numeric (strategy.ts).
 * The orbit's periodic term (a few ns to tens of ns) is left out of the choice; the planner
 * re-predicts with it after every adjustment.
 */

/**
 * First τ > 0 at which x0 + r·τ + D·τ²/2 reaches ±B, or Infinity if never. Units: any consistent
 * set (ns, s, ns/s, ns/s²). Assumes |x0| ≤ B.
 */
export function timeToLeaveS(x0: number, r: number, d: number, b: number): number {
  let best = Infinity;
  for (const edge of [b, -b]) {
    for (const tau of positiveRoots(0.5 * d, r, x0 - edge)) best = Math.min(best, tau);
  }
  return best;
}

function positiveRoots(a: number, b: number, c: number): number[] {
  if (Math.abs(a) < 1e-300) {
    if (b === 0) return [];
    const t = -c / b;
    return t > 0 ? [t] : [];
  }
  const disc = b * b - 4 * a * c;
  if (disc < 0) return [];
  const s = Math.sqrt(disc);
  // Numerically stable pair of roots.
  const q = -0.5 * (b + Math.sign(b || 1) * s);
  const roots = [q / a, q !== 0 ? c / q : -b / a];
  return roots.filter((t) => t > 0);
}

/**
 * The phase x0 ∈ [−B, B] that maximises the time to the next crossing, in closed form.
 * r: rate [ns/s]; d: rate change [ns/s²]; b: half-width of the usable band [ns].
 * - r and d push the same way (or d = 0): start at the far edge, −sign(r)·B.
 * - d turns the motion around: start so that the turning point just touches the near edge,
 *   x0 = sign(r)·(B − r²/(2|d|)), when that excursion fits in the band; otherwise the far edge.
 */
export function bestPhaseNs(r: number, d: number, b: number): number {
  if (r === 0 && d === 0) return 0;
  if (r === 0) return -Math.sign(d) * b; // pure aging: start at the edge it moves away from
  const dir = Math.sign(r);
  if (d === 0 || Math.sign(d) === dir) return -dir * b;
  const excursion = (r * r) / (2 * Math.abs(d));
  if (excursion <= 2 * b) return dir * (b - excursion);
  return -dir * b;
}

/**
 * Longest interval [s] a clock with constant aging d [ns/s²] and no noise can stay inside ±b [ns]
 * when offset and rate are both set: the parabola that starts on one limit, touches the other at
 * its vertex and comes back, T = 4·√(b/|d|) (b = |d|·(T/2)²/2 from the vertex). Infinity for d = 0.
 */
export function combinedIntervalS(b: number, d: number): number {
  if (d === 0) return Infinity;
  return 4 * Math.sqrt(Math.max(0, b) / Math.abs(d));
}

/**
 * The offset [ns] and rate [ns/s] the combined strategy sets, for aging d [ns/s²], usable half-band
 * b [ns], target offset [ns] and the time left to the horizon [s]:
 * - when the longest parabola would outlast the horizon and a smaller one centred on the target
 *   (half-width |d|·H²/16) fits, that one (the clock stays as near the target as it can);
 * - otherwise the longest: start on the limit aging pushes toward, x0 = sign(d)·b, rate −d·T/2.
 * With d = 0: the target offset and zero rate.
 */
export function combinedStart(d: number, b: number, targetNs: number, remainingS: number): { offsetNs: number; rateNsPerS: number; intervalS: number } {
  if (d === 0) return { offsetNs: targetNs, rateNsPerS: 0, intervalS: Infinity };
  const t = combinedIntervalS(b, d);
  const half = (Math.abs(d) * remainingS * remainingS) / 16;
  if (t >= remainingS && half <= b - Math.abs(targetNs)) {
    return { offsetNs: targetNs + Math.sign(d) * half, rateNsPerS: (-d * remainingS) / 2, intervalS: remainingS };
  }
  return { offsetNs: Math.sign(d) * b, rateNsPerS: (-d * t) / 2, intervalS: t };
}
