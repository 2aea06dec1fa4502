/**
 * The frame chain, in one place.
 *
 *   GCRF ──(N·P·B: frame bias, IAU 2006 precession, IAU 2000A nutation; ./iau)──▶ TOD
 *   TOD  ──(R3(EE): equation of the equinoxes with its complementary terms)──────▶ TEME
 *   TEME ──(R3(GMST), IAU-82 as SGP4 uses it; UT1 ≈ UTC)──────────────────────────▶ ECEF
 *
 * - GCRF ↔ TOD ↔ TEME follow IERS Conventions 2010 ch. 5 (IAU 2006/2000A, equinox based); the
 *   matrices meet the SOFA test values to 1e-12 (tests/sofa-iau2006.test.ts). Times are TT.
 * - TEME's x axis is the mean equinox projected on the true equator: r_TEME = R3(EE)·r_TOD.
 * - TEME → ECEF keeps the IAU-82 GMST that SGP4 and the element sets are built on. It differs
 *   from the IAU 2006 GMST by up to ~60 mas in the 2020s (~2 m at the surface); fine for passes.
 * - Trajectories serve states in TEME of date (the axes of each instant), whatever their input;
 *   the clock rate needs the true pole, which TEME and TOD share, and the speed, which a rotation
 *   keeps. Numerical orbits integrate in GCRF (see numerical.ts).
 * - Polar motion (< 15 m at the surface) and UT1 − UTC (< 0.9 s, about 400 m at the equator
 *   for earth-fixed positions) are neglected: fine for passes and look angles, documented in reports.
 * - SP3 files are earth-fixed: their velocities become inertial by `ecefToTeme`, which adds ω × r.
 */
import { WGS84_OMEGA_RAD_PER_S } from '../constants.ts';
import { biasPrecessionNutationMatrix, equationOfEquinoxesRad as iauEquationOfEquinoxesRad, meanObliquity2006Rad, multiply, nutation2006a, rotZ, type Matrix3 } from './iau/index.ts';
import { vec3, type Vec3 } from './vec.ts';

export type { Matrix3 } from './iau/index.ts';

/** Julian date of J2000.0. */
const JD_J2000 = 2451545.0;
/** Seconds per Julian century. */
const JULIAN_CENTURY_S = 36525 * 86400;

/** TT Julian centuries since J2000.0 from seconds since J2000.0 TT. */
export function ttCenturies(ttJ2000S: number): number {
  return ttJ2000S / JULIAN_CENTURY_S;
}

/**
 * Greenwich mean sidereal time [rad], IAU-82 form used by SGP4 (Vallado et al. 2006, gstime).
 * The one GMST of the TEME ↔ ECEF step. For sub-microsecond time resolution use
 * {@link gmstRadFromUtcJ2000S}.
 * @param jdUt1 Julian date in UT1 (UTC is used as a stand-in by callers).
 */
export function gmstRad(jdUt1: number): number {
  const d = jdUt1 - JD_J2000;
  const whole = Math.floor(d);
  return gmstRadFromUtcJ2000S(whole * 86400, (d - whole) * 86400);
}

/**
 * GMST [rad], IAU-82, from UT1 (UTC as a stand-in) seconds since 2000-01-01T12:00:00 given as a
 * whole part and a fraction, so that the angle keeps sub-microsecond time resolution. The
 * 876600 h·T term equals the elapsed seconds and is taken modulo a day exactly.
 */
export function gmstRadFromUtcJ2000S(wholeS: number, fracS: number): number {
  const tCenturies = (wholeS + fracS) / JULIAN_CENTURY_S;
  const dayS = (((wholeS % 86400) + 86400) % 86400) + fracS;
  const s = 67310.54841 + dayS + 8640184.812866 * tCenturies + 0.093104 * tCenturies * tCenturies - 6.2e-6 * tCenturies ** 3;
  const r = ((s % 86400) * 2 * Math.PI) / 86400;
  return r < 0 ? r + 2 * Math.PI : r;
}

/** TEME (or TOD, for positions) to earth-fixed at sidereal angle `gmst`. Position [any length unit]. */
export function temeToEcefPosition<U extends number>(r: Vec3<'TEME'>, gmst: U): Vec3<'ECEF'> {
  const c = Math.cos(gmst);
  const s = Math.sin(gmst);
  return vec3<'ECEF'>(c * r[0] + s * r[1], -s * r[0] + c * r[1], r[2]);
}

/** Earth-fixed position back to TEME. */
export function ecefToTemePosition(r: Vec3<'ECEF'>, gmst: number): Vec3<'TEME'> {
  const c = Math.cos(gmst);
  const s = Math.sin(gmst);
  return vec3<'TEME'>(c * r[0] - s * r[1], s * r[0] + c * r[1], r[2]);
}

/** TEME state to earth-fixed: v_ecef = R·v − ω × r_ecef. Units: m and m/s (or km and km/s). */
export function temeToEcef(r: Vec3<'TEME'>, v: Vec3<'TEME'>, gmst: number): { r: Vec3<'ECEF'>; v: Vec3<'ECEF'> } {
  const re = temeToEcefPosition(r, gmst);
  const vr = temeToEcefPosition(v as unknown as Vec3<'TEME'>, gmst);
  const w = WGS84_OMEGA_RAD_PER_S;
  return { r: re, v: vec3<'ECEF'>(vr[0] + w * re[1], vr[1] - w * re[0], vr[2]) };
}

/** Earth-fixed state to TEME: v = Rᵀ(v_ecef + ω × r_ecef). */
export function ecefToTeme(r: Vec3<'ECEF'>, v: Vec3<'ECEF'>, gmst: number): { r: Vec3<'TEME'>; v: Vec3<'TEME'> } {
  const w = WGS84_OMEGA_RAD_PER_S;
  const vi = vec3<'ECEF'>(v[0] - w * r[1], v[1] + w * r[0], v[2]);
  return { r: ecefToTemePosition(r, gmst), v: ecefToTemePosition(vi, gmst) };
}

/** GCRF → true of date (N·P·B, IAU 2006/2000A) at seconds since J2000.0 TT: `r_tod = M · r_gcrf`. */
export function gcrfToTodMatrixAtTt(ttJ2000S: number): Matrix3 {
  return biasPrecessionNutationMatrix(ttCenturies(ttJ2000S));
}

/**
 * GCRF → true of date at a Julian date (IAU 2006/2000A). The date is taken as TT: given UTC,
 * the 69 s of TT − UTC shift the matrix by about 0.1 mas; prefer {@link gcrfToTodMatrixAtTt}.
 */
export function gcrfToTodMatrix(jd: number): Matrix3 {
  return gcrfToTodMatrixAtTt((jd - JD_J2000) * 86400);
}

/** Equation of the equinoxes [rad] (GAST − GMST, IAU 2006/2000A with complementary terms) at seconds since J2000.0 TT. */
export function equationOfEquinoxesRadAtTt(ttJ2000S: number): number {
  const t = ttCenturies(ttJ2000S);
  return iauEquationOfEquinoxesRad(t, nutation2006a(t), meanObliquity2006Rad(t));
}

/** Equation of the equinoxes [rad] at a Julian date taken as TT (see {@link gcrfToTodMatrix}). */
export function equationOfEquinoxesRad(jd: number): number {
  return equationOfEquinoxesRadAtTt((jd - JD_J2000) * 86400);
}

/** GCRF → TEME of date, R3(EE)·N·P·B, at seconds since J2000.0 TT (one nutation evaluation). */
export function gcrfToTemeMatrixAtTt(ttJ2000S: number): Matrix3 {
  const t = ttCenturies(ttJ2000S);
  const n = nutation2006a(t);
  const ee = iauEquationOfEquinoxesRad(t, n, meanObliquity2006Rad(t));
  return multiply(rotZ(ee), biasPrecessionNutationMatrix(t, n));
}

export function applyMatrix<A extends 'GCRF' | 'TOD' | 'TEME', B extends 'GCRF' | 'TOD' | 'TEME'>(m: Matrix3, v: Vec3<A>): Vec3<B> {
  return vec3<B>(
    m[0][0] * v[0] + m[0][1] * v[1] + m[0][2] * v[2],
    m[1][0] * v[0] + m[1][1] * v[1] + m[1][2] * v[2],
    m[2][0] * v[0] + m[2][1] * v[1] + m[2][2] * v[2],
  );
}

function rotZVec<B extends 'TOD' | 'TEME'>(v: readonly number[], angleRad: number): Vec3<B> {
  const c = Math.cos(angleRad);
  const s = Math.sin(angleRad);
  return vec3<B>(c * v[0] + s * v[1], -s * v[0] + c * v[1], v[2]);
}

/** True-of-date to TEME (same pole; rotation by the equation of the equinoxes). */
export function todToTeme(r: Vec3<'TOD'>, eqEqRad: number): Vec3<'TEME'> {
  return rotZVec<'TEME'>(r, eqEqRad);
}

/** TEME to true-of-date. */
export function temeToTod(r: Vec3<'TEME'>, eqEqRad: number): Vec3<'TOD'> {
  return rotZVec<'TOD'>(r, -eqEqRad);
}

/** Transpose of a rotation (its inverse). */
export function transpose(m: Matrix3): Matrix3 {
  return [
    [m[0][0], m[1][0], m[2][0]],
    [m[0][1], m[1][1], m[2][1]],
    [m[0][2], m[1][2], m[2][2]],
  ];
}
