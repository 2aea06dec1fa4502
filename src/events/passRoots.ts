/**
 * Root finding for the pass search (./passes.ts): a bracketed Illinois regula falsi that needs only
 * values, and first guesses from the cubic Hermite interpolant of a grid bin (values and rates at
 * both ends), which put a Newton iteration within reach of the root in one or two steps.
 */
import { InternalError } from '../errors.ts';

/** Cap on root-finder iterations; 1 ms from a 600 s bracket needs about 20 bisections. */
const ROOT_MAX_ITERATIONS = 200;
/** Cap on the bisection-safeguarded Newton steps on a Hermite polynomial; each halves the bracket at worst. */
const POLY_MAX_ITERATIONS = 60;
/** Width in the unit interval at which a polynomial root is close enough to serve as a first guess. */
const POLY_TOLERANCE = 1e-12;

/**
 * Root of `fn` on [a, b] where fa and fb have opposite signs (or one is zero): Illinois-weighted
 * regula falsi, with a bisection whenever the bracket fails to halve within two steps. Works on
 * offsets from `a` to keep precision when a is ~1e9 s. Returns a time within `tolS` of the root.
 */
export function bracketedRoot(fn: (t: number) => number, a: number, b: number, fa: number, fb: number, tolS: number, what: string): number {
  if (fa === 0) return a;
  if (fb === 0) return b;
  if (Math.sign(fa) === Math.sign(fb)) throw new InternalError(`root of ${what} is not bracketed on [${a}, ${b}] (${fa}, ${fb})`, what);
  let lo = 0;
  let hi = b - a;
  let flo = fa;
  let fhi = fb;
  // Illinois weights: halve the value kept at an end that did not move.
  let side = 0;
  let widthTwoAgo = hi - lo;
  let widthOneAgo = hi - lo;
  for (let k = 0; k < ROOT_MAX_ITERATIONS; k++) {
    const width = hi - lo;
    if (width <= tolS) return a + 0.5 * (lo + hi);
    let x: number;
    if (k >= 2 && width > 0.5 * widthTwoAgo) {
      x = 0.5 * (lo + hi);
      side = 0;
    } else {
      x = lo + (flo * (lo - hi)) / (fhi - flo);
      // Stay strictly inside, at least a quarter tolerance from either end.
      const margin = 0.25 * tolS;
      if (!(x > lo + margin)) x = lo + margin;
      if (!(x < hi - margin)) x = hi - margin;
    }
    widthTwoAgo = widthOneAgo;
    widthOneAgo = width;
    const fx = fn(a + x);
    if (fx === 0) return a + x;
    if (Math.sign(fx) === Math.sign(flo)) {
      lo = x;
      flo = fx;
      if (side === -1) fhi *= 0.5;
      side = -1;
    } else {
      hi = x;
      fhi = fx;
      if (side === 1) flo *= 0.5;
      side = 1;
    }
  }
  throw new InternalError(`root finder for ${what} hit its cap of ${ROOT_MAX_ITERATIONS} iterations on [${a}, ${b}]`, what);
}

/**
 * A root in (0, 1) of c0 + c1·x + c2·x² + c3·x³, given that its values at 0 and 1 have opposite
 * signs: Newton steps kept inside a shrinking bracket (bisection when a step leaves it).
 */
function cubicRootIn01(c0: number, c1: number, c2: number, c3: number): number {
  let lo = 0;
  let hi = 1;
  const loNegative = c0 < 0;
  let x = 0.5;
  for (let k = 0; k < POLY_MAX_ITERATIONS && hi - lo > POLY_TOLERANCE; k++) {
    const p = c0 + x * (c1 + x * (c2 + x * c3));
    if (p === 0) return x;
    if (p < 0 === loNegative) lo = x;
    else hi = x;
    const dp = c1 + x * (2 * c2 + x * 3 * c3);
    const next = x - p / dp;
    x = next > lo && next < hi ? next : 0.5 * (lo + hi);
  }
  return x;
}

/**
 * Coefficients in x = τ/H ∈ [0, 1] of the cubic Hermite interpolant on a bin of width H [s] with
 * values fa, fb and rates da, db [1/s] at its ends, into out[0..3] (constant term first).
 */
function hermiteCoefficients(fa: number, da: number, fb: number, db: number, widthS: number, out: Float64Array): void {
  const ha = widthS * da;
  const hb = widthS * db;
  out[0] = fa;
  out[1] = ha;
  out[2] = -3 * fa - 2 * ha + 3 * fb - hb;
  out[3] = 2 * fa + ha - 2 * fb + hb;
}

const coef = new Float64Array(4);

/**
 * Offset [s] in (0, widthS) where the cubic Hermite interpolant of a bin crosses zero, for values
 * fa, fb of opposite signs and rates da, db [1/s] at the ends: a first guess for the root.
 */
export function hermiteRootGuessS(fa: number, da: number, fb: number, db: number, widthS: number): number {
  hermiteCoefficients(fa, da, fb, db, widthS, coef);
  return widthS * cubicRootIn01(coef[0], coef[1], coef[2], coef[3]);
}

/**
 * Offset [s] in (0, widthS) of the extremum of the cubic Hermite interpolant of a bin whose end
 * rates da, db [1/s] have opposite signs: a first guess for the time of the maximum or minimum.
 */
export function hermiteExtremumGuessS(fa: number, da: number, fb: number, db: number, widthS: number): number {
  hermiteCoefficients(fa, da, fb, db, widthS, coef);
  return widthS * cubicRootIn01(coef[1], 2 * coef[2], 3 * coef[3], 0);
}
