/**
 * 3×3 rotations in the SOFA/ERFA convention (IERS Conventions 2010 ch. 5 writes the same
 * matrices as R1, R2, R3): Rx(φ) = [[1,0,0],[0,c,s],[0,−s,c]], Ry(θ) = [[c,0,−s],[0,1,0],[s,0,c]],
 * Rz(ψ) = [[c,s,0],[−s,c,0],[0,0,1]]. A positive angle rotates the axes anticlockwise seen from
 * the positive axis, so a fixed vector's components turn the other way. Rows are stored first.
 */

/** 3×3 matrix, rows first. */
export type Matrix3 = readonly [readonly [number, number, number], readonly [number, number, number], readonly [number, number, number]];

/** Arcseconds to radians. */
export const ARCSEC_TO_RAD = Math.PI / 648000;
/** Full turn [rad]. */
export const TWO_PI = 2 * Math.PI;
/** Julian days per Julian century. */
export const DAYS_PER_JULIAN_CENTURY = 36525;
/** Seconds per day. */
export const SECONDS_PER_DAY = 86400;

/** Rotation about x by `a` [rad]. */
export function rotX(a: number): Matrix3 {
  const c = Math.cos(a);
  const s = Math.sin(a);
  return [
    [1, 0, 0],
    [0, c, s],
    [0, -s, c],
  ];
}

/** Rotation about y by `a` [rad]. */
export function rotY(a: number): Matrix3 {
  const c = Math.cos(a);
  const s = Math.sin(a);
  return [
    [c, 0, -s],
    [0, 1, 0],
    [s, 0, c],
  ];
}

/** Rotation about z by `a` [rad]. */
export function rotZ(a: number): Matrix3 {
  const c = Math.cos(a);
  const s = Math.sin(a);
  return [
    [c, s, 0],
    [-s, c, 0],
    [0, 0, 1],
  ];
}

/** Product a·b. */
export function multiply(a: Matrix3, b: Matrix3): Matrix3 {
  const row = (i: number): [number, number, number] => [
    a[i][0] * b[0][0] + a[i][1] * b[1][0] + a[i][2] * b[2][0],
    a[i][0] * b[0][1] + a[i][1] * b[1][1] + a[i][2] * b[2][1],
    a[i][0] * b[0][2] + a[i][1] * b[1][2] + a[i][2] * b[2][2],
  ];
  return [row(0), row(1), row(2)];
}

/** Product of several matrices, left to right: multiplyAll(a, b, c) = a·b·c. */
export function multiplyAll(...ms: Matrix3[]): Matrix3 {
  return ms.reduce((acc, m) => multiply(acc, m));
}

/** Transpose (the inverse of a rotation). */
export function transposeMatrix(m: Matrix3): Matrix3 {
  return [
    [m[0][0], m[1][0], m[2][0]],
    [m[0][1], m[1][1], m[2][1]],
    [m[0][2], m[1][2], m[2][2]],
  ];
}

/** m·v. */
export function rotate(m: Matrix3, v: readonly number[]): [number, number, number] {
  return [m[0][0] * v[0] + m[0][1] * v[1] + m[0][2] * v[2], m[1][0] * v[0] + m[1][1] * v[1] + m[1][2] * v[2], m[2][0] * v[0] + m[2][1] * v[1] + m[2][2] * v[2]];
}

/** Angle reduced to [0, 2π). */
export function normalizeAngleRad(a: number): number {
  const w = a % TWO_PI;
  return w < 0 ? w + TWO_PI : w;
}
