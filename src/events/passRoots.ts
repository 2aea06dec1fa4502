/**
 * Root finding for the pass search (./passes.ts): a bracketed Illinois regula falsi that needs only
 * values, and first guesses from the Hermite interpolant of a grid bin (values, rates and, when
 * known, second rates at both ends), which put a Newton iteration within reach of the root in one or two steps.
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
 * A root in (0, 1) of c[0] + c[1]·x + … + c[degree]·x^degree, given that its values at 0 and 1
 * have opposite signs: Newton steps kept inside a shrinking bracket (bisection when a step leaves it).
 */
function polyRootIn01(c: Float64Array, degree: number): number {
  let lo = 0;
  let hi = 1;
  const loNegative = c[0] < 0;
  let x = 0.5;
  for (let k = 0; k < POLY_MAX_ITERATIONS && hi - lo > POLY_TOLERANCE; k++) {
    let p = c[degree];
    let dp = 0;
    for (let j = degree - 1; j >= 0; j--) {
      dp = dp * x + p;
      p = p * x + c[j];
    }
    if (p === 0) return x;
    if (p < 0 === loNegative) lo = x;
    else hi = x;
    const next = x - p / dp;
    x = next > lo && next < hi ? next : 0.5 * (lo + hi);
  }
  return x;
}

/**
 * Coefficients in x = τ/H ∈ [0, 1] (constant term first, into out[0..5]) of the Hermite interpolant
 * on a bin of width H [s] with values fa, fb, rates da, db [1/s] and second rates aa, ab [1/s²] at
 * its ends: quintic, or cubic (out[4] = out[5] = 0) when a second rate is not finite.
 */
function hermiteCoefficients(fa: number, da: number, aa: number, fb: number, db: number, ab: number, widthS: number, out: Float64Array): void {
  const ma = widthS * da;
  const mb = widthS * db;
  out[0] = fa;
  out[1] = ma;
  if (Number.isFinite(aa) && Number.isFinite(ab)) {
    const qa = widthS * widthS * aa;
    const qb = widthS * widthS * ab;
    out[2] = 0.5 * qa;
    out[3] = -10 * fa - 6 * ma - 1.5 * qa + 0.5 * qb - 4 * mb + 10 * fb;
    out[4] = 15 * fa + 8 * ma + 1.5 * qa - qb + 7 * mb - 15 * fb;
    out[5] = -6 * fa - 3 * ma - 0.5 * qa + 0.5 * qb - 3 * mb + 6 * fb;
  } else {
    out[2] = -3 * fa - 2 * ma + 3 * fb - mb;
    out[3] = 2 * fa + ma - 2 * fb + mb;
    out[4] = 0;
    out[5] = 0;
  }
}

const coef = new Float64Array(6);
const slope = new Float64Array(5);

/**
 * Offset [s] in (0, widthS) where the Hermite interpolant of a bin (see hermiteCoefficients; second
 * rates NaN for the cubic) crosses zero, for end values of opposite signs: a first guess for the root.
 */
export function hermiteRootGuessS(fa: number, da: number, aa: number, fb: number, db: number, ab: number, widthS: number): number {
  hermiteCoefficients(fa, da, aa, fb, db, ab, widthS, coef);
  return widthS * polyRootIn01(coef, 5);
}

/**
 * Offset [s] in (0, widthS) of the extremum of the Hermite interpolant of a bin whose end rates
 * da, db [1/s] have opposite signs: a first guess for the time of the maximum or minimum.
 */
export function hermiteExtremumGuessS(fa: number, da: number, aa: number, fb: number, db: number, ab: number, widthS: number): number {
  hermiteCoefficients(fa, da, aa, fb, db, ab, widthS, coef);
  for (let j = 0; j < 5; j++) slope[j] = (j + 1) * coef[j + 1];
  return widthS * polyRootIn01(slope, 4);
}
