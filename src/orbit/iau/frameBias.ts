/**
 * Frame bias B: the fixed rotation from the GCRS (ICRS axes) to the J2000.0 mean equator and
 * dynamical equinox, ≈ 23 mas (IERS Conventions 2010 §5.6.4). With IAU 2006 it is the
 * Fukushima–Williams matrix at t = 0 (so that B, P·B and N·P·B share one parametrisation).
 */
import { biasPrecessionMatrix } from './precession.ts';
import { multiply, transposeMatrix, type Matrix3 } from './rotation.ts';

let bias: Matrix3 | null = null;

/** B (GCRS → J2000 mean equator and equinox). */
export function frameBiasMatrix(): Matrix3 {
  bias ??= biasPrecessionMatrix(0);
  return bias;
}

/** Precession alone, P = (P·B)·Bᵀ, at t (TT Julian centuries since J2000.0). */
export function precessionMatrix(t: number): Matrix3 {
  return multiply(biasPrecessionMatrix(t), transposeMatrix(frameBiasMatrix()));
}
