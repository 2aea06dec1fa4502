/**
 * Least-squares clock polynomial for a navigation message: x(t) ≈ af0 + af1·dt + af2·dt², dt = t − toc.
 * Solved by QR on the design matrix in the scaled time u = dt/h ∈ [−1, 1] (never normal equations),
 * so the columns are of one size whatever the fit interval. Pure.
 */
import { Matrix, solve } from 'ml-matrix';
import { assertFinite, InternalError } from '../errors.ts';
import type { ClockPolynomial } from './navMessage.ts';

/**
 * Fit a polynomial of `degree` (1 or 2) to samples.
 * @param u        scaled times (t − toc)/halfS, at least degree + 1 distinct values
 * @param valuesNs samples [ns] at those times
 * @param halfS    the scale h [s] (half the fit interval)
 * @returns unquantised coefficients in seconds (af0 [s], af1 [s/s], af2 [s/s²]; af2 = 0 at degree 1)
 */
export function fitClockPolynomial(u: Float64Array, valuesNs: Float64Array, halfS: number, degree: 1 | 2): ClockPolynomial {
  const p = degree + 1;
  if (u.length < p) throw new InternalError(`${u.length} samples for a degree-${degree} clock polynomial`, 'navigation clock fit');
  const a = new Matrix(u.length, p);
  const b = new Matrix(u.length, 1);
  for (let i = 0; i < u.length; i++) {
    a.set(i, 0, 1);
    a.set(i, 1, u[i]);
    if (p > 2) a.set(i, 2, u[i] * u[i]);
    b.set(i, 0, valuesNs[i]);
  }
  const c = solve(a, b);
  const c0 = c.get(0, 0);
  const c1 = c.get(1, 0);
  const c2 = p > 2 ? c.get(2, 0) : 0;
  return {
    af0S: assertFinite(c0 * 1e-9, 'af0'),
    af1: assertFinite((c1 / halfS) * 1e-9, 'af1'),
    af2PerS: assertFinite((c2 / (halfS * halfS)) * 1e-9, 'af2'),
  };
}
