/**
 * An earth-fixed clock (physics.md §4): y = −(W(r) − W0)/c², W = U + ω²(x² + y²)/2, U from the same
 * gravity model as the orbits, W0 = L_G·c². A site geoid undulation N (given by the user; tauplan
 * carries no geoid model) lowers the rate by g·N/c². Without N the error is up to |N|·1.09e-16.
 */
import { IERS2010_L_G, STANDARD_GRAVITY_M_PER_S2, WGS84_OMEGA_RAD_PER_S } from '../constants.ts';
import { potentialM2PerS2, type GravityModel } from '../orbit/gravity.ts';
import { SPEED_OF_LIGHT_SQUARED_M2_PER_S2 as C2 } from './rate.ts';

/** Constant fractional offset (dimensionless) of a clock at rest at earth-fixed r [m]. */
export function groundClockFractionalOffset(model: GravityModel, xM: number, yM: number, zM: number, geoidHeightM = 0): number {
  const w = potentialM2PerS2(model, xM, yM, zM) + 0.5 * WGS84_OMEGA_RAD_PER_S ** 2 * (xM * xM + yM * yM);
  return -(w - IERS2010_L_G * C2) / C2 - (STANDARD_GRAVITY_M_PER_S2 * geoidHeightM) / C2;
}
