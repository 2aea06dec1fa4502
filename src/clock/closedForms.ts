/**
 * Closed forms for two-body orbits (physics.md §2–3). Used as checks on the numerical path and
 * as a fast path for sweeps. All rates are dimensionless fractional offsets against TT.
 */
import { EGM2008_J, IERS2010_L_G, WGS84_A_M, WGS84_GM_M3_PER_S2 } from '../constants.ts';
import { SPEED_OF_LIGHT_SQUARED_M2_PER_S2 as C2 } from './rate.ts';

/** Mean fractional offset of a clock on a Keplerian orbit of semi-major axis a [m]: L_G − 3GM/(2ac²). */
export function keplerMeanFractionalOffset(aM: number, gmM3PerS2 = WGS84_GM_M3_PER_S2): number {
  return IERS2010_L_G - (3 * gmM3PerS2) / (2 * aM * C2);
}

/** Mean gravitational part L_G − GM/(ac²) (time mean of GM/r over an orbit is GM/a). */
export function keplerMeanGravitational(aM: number, gmM3PerS2 = WGS84_GM_M3_PER_S2): number {
  return IERS2010_L_G - gmM3PerS2 / (aM * C2);
}

/** Mean velocity part −GM/(2ac²). */
export function keplerMeanVelocity(aM: number, gmM3PerS2 = WGS84_GM_M3_PER_S2): number {
  return -gmM3PerS2 / (2 * aM * C2);
}

/** Amplitude of the eccentricity term 2√(GMa)·e/c² [s] (IERS 2010 eqs. 10.10–10.11). */
export function eccentricityAmplitudeS(aM: number, e: number, gmM3PerS2 = WGS84_GM_M3_PER_S2): number {
  return (2 * Math.sqrt(gmM3PerS2 * aM) * e) / C2;
}

/** d⟨y⟩/da = 3GM/(2a²c²) [1/m]. */
export function keplerSensitivityPerM(aM: number, gmM3PerS2 = WGS84_GM_M3_PER_S2): number {
  return (3 * gmM3PerS2) / (2 * aM * aM * C2);
}

/** Radius [m] of the circular orbit whose clock keeps geoid rate: a = 3GM/(2 L_G c²). */
export function breakEvenRadiusM(gmM3PerS2 = WGS84_GM_M3_PER_S2): number {
  return (3 * gmM3PerS2) / (2 * IERS2010_L_G * C2);
}

/**
 * Amplitude [s] of the J2 periodic clock term left by the conventional correction, circular orbit:
 * (3/2)·J2·(a_E²/c²)·√(GM/a³)·sin²i (Springer Handbook of GNSS, 2017, eq. 19.18; physics.md §3).
 * A direct integration differs by ~15 % (physics.md §3): a check, not the truth.
 */
export function j2ResidualAmplitudeS(aM: number, iRad: number, gmM3PerS2 = WGS84_GM_M3_PER_S2): number {
  return 1.5 * EGM2008_J[2] * (WGS84_A_M * WGS84_A_M / C2) * Math.sqrt(gmM3PerS2 / (aM * aM * aM)) * Math.sin(iRad) ** 2;
}
