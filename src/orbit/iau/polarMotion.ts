/**
 * Polar motion matrix W (IERS Conventions 2010 eq. 5.3 with s′ from eq. 5.13):
 * ITRS → TIRS is W = R3(−s′)·R2(xp)·R1(yp); its transpose, TIRS → ITRS, is Rx(−yp)·Ry(−xp)·Rz(s′)
 * in the convention of ./rotation.ts. s′ = −47 µas · t (TT Julian centuries since J2000.0).
 * tauplan's products neglect polar motion (< 15 m at the surface); the tests use it to check
 * published worked examples.
 */
import { ARCSEC_TO_RAD, multiplyAll, rotX, rotY, rotZ, type Matrix3 } from './rotation.ts';

/** s′, the TIO locator [rad]. */
export function tioLocatorRad(t: number): number {
  return -47e-6 * t * ARCSEC_TO_RAD;
}

/** TIRS → ITRS rotation for pole coordinates xp, yp [rad]. */
export function polarMotionMatrix(xpRad: number, ypRad: number, t: number): Matrix3 {
  return multiplyAll(rotX(-ypRad), rotY(-xpRad), rotZ(tioLocatorRad(t)));
}
