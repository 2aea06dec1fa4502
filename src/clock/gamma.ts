/**
 * Regularized incomplete gamma function, its inverse, and chi-squared quantiles (pure; no I/O).
 *
 * P(a, x) = γ(a, x)/Γ(a) by its power series for x < a + 1 and by the Lentz continued fraction
 * of Q = 1 − P otherwise (the usual split; common practice). The inverse solves P(a, x) = p
 * (or Q(a, x) = 1 − p in the upper half, so tail quantiles keep full relative accuracy) by
 * Newton steps inside a bracket that shrinks every step, falling back to bisection when a step
 * leaves it. χ²(p; ν) = 2·P⁻¹(ν/2, p).
 */
import { InputError, InternalError } from '../errors.ts';

/** Relative convergence target of the series, fraction and inverse. */
const REL_TOL = 1e-15;
/** Iteration cap of every loop here (the series needs ~√a·10 terms; a reaches 1e6 for 2e6 EDF). */
const MAX_ITER = 200_000;

/** ln Γ(z) for z > 0, Lanczos approximation (g = 7, 9 terms; common practice, ~1e-15 relative). */
export function lnGamma(z: number): number {
  const c = [
    0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61502916214059, 12.507343278686905,
    -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7,
  ];
  if (z < 0.5) return Math.log(Math.PI / Math.abs(Math.sin(Math.PI * z))) - lnGamma(1 - z);
  const zz = z - 1;
  let sum = c[0];
  for (let i = 1; i < 9; i++) sum += c[i] / (zz + i);
  const t = zz + 7.5;
  return 0.5 * Math.log(2 * Math.PI) + (zz + 0.5) * Math.log(t) - t + Math.log(sum);
}

/** Both tails at once: { p: P(a, x), q: Q(a, x) }, each with full relative accuracy where it is small. */
export function gammaPQ(a: number, x: number): { p: number; q: number } {
  if (!(a > 0)) throw new InternalError(`incomplete gamma with a = ${a}`, 'gammaPQ');
  if (x <= 0) return { p: 0, q: 1 };
  const lnPrefix = a * Math.log(x) - x - lnGamma(a);
  if (x < a + 1) {
    let term = 1 / a;
    let sum = term;
    for (let n = 1; n < MAX_ITER; n++) {
      term *= x / (a + n);
      sum += term;
      if (Math.abs(term) < Math.abs(sum) * REL_TOL) {
        const p = sum * Math.exp(lnPrefix);
        return { p, q: 1 - p };
      }
    }
    throw new InternalError('incomplete gamma series did not converge', 'gammaPQ');
  }
  const tiny = 1e-300;
  let b = x + 1 - a;
  let c = 1 / tiny;
  let d = 1 / b;
  let h = d;
  for (let i = 1; i < MAX_ITER; i++) {
    const an = -i * (i - a);
    b += 2;
    d = an * d + b;
    if (Math.abs(d) < tiny) d = tiny;
    c = b + an / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < REL_TOL) {
      const q = Math.exp(lnPrefix) * h;
      return { p: 1 - q, q };
    }
  }
  throw new InternalError('incomplete gamma continued fraction did not converge', 'gammaPQ');
}

/** Regularized lower incomplete gamma P(a, x), a > 0, x ≥ 0. */
export function gammaP(a: number, x: number): number {
  return gammaPQ(a, x).p;
}

/**
 * Inverse of P(a, ·): the x ≥ 0 with P(a, x) = p, for a > 0 and 0 < p < 1.
 * Converges to ~1e-14 relative (checked against closed forms in tests/nist-sp1065.test.ts).
 */
export function gammaPInverse(a: number, p: number): number {
  if (!(a > 0 && p > 0 && p < 1)) throw new InternalError(`inverse incomplete gamma with a = ${a}, p = ${p}`, 'gammaPInverse');
  const upper = p > 0.5;
  const target = upper ? 1 - p : p;
  // f(x) increasing in x: P − p in the lower half, (1 − p) − Q in the upper half.
  const f = (x: number): number => {
    const g = gammaPQ(a, x);
    return upper ? target - g.q : g.p - target;
  };
  const lnGa = lnGamma(a);
  const density = (x: number): number => Math.exp((a - 1) * Math.log(x) - x - lnGa);
  // Bracket: grow hi until f(hi) ≥ 0.
  let lo = 0;
  let hi = Math.max(1, a);
  for (let i = 0; f(hi) < 0; i++) {
    lo = hi;
    hi *= 2;
    if (i > 200) throw new InternalError('inverse incomplete gamma bracket did not close', 'gammaPInverse');
  }
  // Start from the Wilson–Hilferty approximation when it falls inside the bracket.
  const z = normalQuantile(p);
  const wh = a * (1 - 1 / (9 * a) + z / (3 * Math.sqrt(a))) ** 3;
  let x = wh > lo && wh < hi ? wh : 0.5 * (lo + hi);
  for (let i = 0; i < MAX_ITER; i++) {
    const fx = f(x);
    if (fx === 0) return x;
    if (fx < 0) lo = x;
    else hi = x;
    const dens = density(x);
    let next = dens > 0 && Number.isFinite(dens) ? x - fx / dens : Number.NaN;
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
    if (Math.abs(next - x) <= 1e-14 * next || hi - lo <= 1e-15 * hi) return next;
    x = next;
  }
  throw new InternalError('inverse incomplete gamma did not converge', 'gammaPInverse');
}

/**
 * Quantile of the chi-squared distribution with `dof` degrees of freedom (dof > 0, 0 < p < 1):
 * the value below which a fraction p of the distribution lies.
 */
export function chiSquareQuantile(p: number, dof: number): number {
  if (!(p > 0 && p < 1 && dof > 0)) throw new InputError(`chi-square quantile p = ${p}, dof = ${dof}`, 'stability', 'use 0 < p < 1 and dof > 0');
  return 2 * gammaPInverse(dof / 2, p);
}

/**
 * Standard normal quantile (Acklam's rational approximation, ~1e-9 relative; common practice),
 * used only as a starting point and for the two-sided levels' z values.
 */
export function normalQuantile(p: number): number {
  const a = [-39.69683028665376, 220.9460984245205, -275.928510446969, 138.357751867269, -30.66479806614716, 2.506628277459239];
  const b = [-54.47609879822406, 161.5858368580409, -155.6989798598866, 66.80131188771972, -13.28068155288572];
  const c = [-0.007784894002430293, -0.3223964580411365, -2.400758277161838, -2.549732539343734, 4.374664141464968, 2.938163982698783];
  const d = [0.007784695709041462, 0.3224671290700398, 2.445134137142996, 3.754408661907416];
  const pLow = 0.02425;
  if (p < pLow) {
    const q = Math.sqrt(-2 * Math.log(p));
    return (((((c[0] * q + c[1]) * q + c[2]) * q + c[3]) * q + c[4]) * q + c[5]) / ((((d[0] * q + d[1]) * q + d[2]) * q + d[3]) * q + 1);
  }
  if (p > 1 - pLow) return -normalQuantile(1 - p);
  const q = p - 0.5;
  const r = q * q;
  return ((((((a[0] * r + a[1]) * r + a[2]) * r + a[3]) * r + a[4]) * r + a[5]) * q) / (((((b[0] * r + b[1]) * r + b[2]) * r + b[3]) * r + b[4]) * r + 1);
}
