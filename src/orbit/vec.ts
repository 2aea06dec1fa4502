/**
 * Frame-branded 3-vectors. An earth-fixed vector cannot be passed where an inertial one is
 * expected: the brand is a phantom type, free at run time.
 *
 * Frames:
 * - `GCRF`: geocentric celestial reference frame (J2000 mean equator and equinox, to < 0.1").
 * - `TOD`: true equator and equinox of date (precession + nutation applied to GCRF).
 * - `TEME`: true equator, mean equinox of date; SGP4's output frame. Same pole as TOD.
 * - `ECEF`: earth-fixed (pseudo earth-fixed: polar motion is neglected, < 15 m at the surface).
 */
export type Frame = 'GCRF' | 'TOD' | 'TEME' | 'ECEF';
/** Frames whose axes do not rotate with the Earth; velocities in them feed the clock rate. */
export type InertialFrame = 'GCRF' | 'TOD' | 'TEME';

export type Vec3<F extends Frame> = readonly [number, number, number] & { readonly __frame?: F };

export function vec3<F extends Frame>(x: number, y: number, z: number): Vec3<F> {
  return [x, y, z] as unknown as Vec3<F>;
}

export function dot(a: readonly number[], b: readonly number[]): number {
  return a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
}

export function norm(a: readonly number[]): number {
  return Math.hypot(a[0], a[1], a[2]);
}

export function cross<F extends Frame>(a: Vec3<F>, b: Vec3<F>): Vec3<F> {
  return vec3<F>(a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]);
}

/** Position [m] and velocity [m/s] in one frame at one instant. */
export interface StateM<F extends Frame> {
  /** Seconds since J2000.0 TT. */
  ttJ2000S: number;
  positionM: Vec3<F>;
  velocityMPerS: Vec3<F>;
}
