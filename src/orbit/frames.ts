/**
 * The frame chain, in one place.
 *
 *   GCRF ──(precession + nutation, IAU 2000B via astronomy-engine Rotation_EQJ_EQD)──▶ TOD
 *   TOD  ──(equation of the equinoxes, a rotation about the shared pole)─────────────▶ TEME
 *   TEME ──(GMST, IAU-82 as SGP4 uses it; UT1 ≈ UTC)─────────────────────────────────▶ ECEF
 *
 * - Zonal gravity needs only the true pole of date, which TOD and TEME share, so the clock
 *   rate is evaluated in either. GCRF input is rotated to TOD first.
 * - Polar motion (< 15 m at the surface) and UT1 − UTC (< 0.9 s, about 400 m at the equator
 *   for earth-fixed positions) are neglected: fine for passes and look angles, documented in reports.
 * - SP3 files are earth-fixed: their velocities become inertial by `ecefToTeme`, which adds ω × r.
 */
import { e_tilt, MakeTime, Rotation_EQJ_EQD } from 'astronomy-engine';
import { WGS84_OMEGA_RAD_PER_S } from '../constants.ts';
import { vec3, type Vec3 } from './vec.ts';

/** Julian date of J2000.0. */
const JD_J2000 = 2451545.0;

/**
 * Greenwich mean sidereal time [rad], IAU-82 form used by SGP4 (Vallado et al. 2006, gstime).
 * @param jdUt1 Julian date in UT1 (UTC is used as a stand-in by callers).
 */
export function gmstRad(jdUt1: number): number {
  const t = (jdUt1 - JD_J2000) / 36525;
  let s = -6.2e-6 * t * t * t + 0.093104 * t * t + (876600 * 3600 + 8640184.812866) * t + 67310.54841;
  s = ((s * Math.PI) / 180 / 240) % (2 * Math.PI);
  return s < 0 ? s + 2 * Math.PI : s;
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

/** 3×3 rotation as rows. */
export type Matrix3 = readonly [readonly [number, number, number], readonly [number, number, number], readonly [number, number, number]];

/**
 * Rotation GCRF → true-of-date at a UTC Julian date (astronomy-engine's EQJ → EQD: IAU 2006
 * precession and IAU 2000B nutation). The matrix applied as `r_tod = M · r_gcrf`.
 */
export function gcrfToTodMatrix(jdUtc: number): Matrix3 {
  const time = MakeTime(jdUtc - JD_J2000);
  const rot = Rotation_EQJ_EQD(time).rot; // astronomy-engine stores column-major: rot[i][j] maps component i to j
  return [
    [rot[0][0], rot[1][0], rot[2][0]],
    [rot[0][1], rot[1][1], rot[2][1]],
    [rot[0][2], rot[1][2], rot[2][2]],
  ];
}

export function applyMatrix<A extends 'GCRF' | 'TOD', B extends 'GCRF' | 'TOD'>(m: Matrix3, v: Vec3<A>): Vec3<B> {
  return vec3<B>(
    m[0][0] * v[0] + m[0][1] * v[1] + m[0][2] * v[2],
    m[1][0] * v[0] + m[1][1] * v[1] + m[1][2] * v[2],
    m[2][0] * v[0] + m[2][1] * v[1] + m[2][2] * v[2],
  );
}

/**
 * Equation of the equinoxes [rad] (GAST − GMST) at a UTC Julian date, from astronomy-engine's
 * nutation (IAU 2000B). TEME's x axis is the mean equinox projected on the true equator, so
 * r_TEME = Rz(EqEq)·r_TOD.
 */
export function equationOfEquinoxesRad(jdUtc: number): number {
  const eeSecondsOfTime = e_tilt(MakeTime(jdUtc - JD_J2000)).ee;
  return (eeSecondsOfTime * 15 * Math.PI) / (180 * 3600);
}

function rotZ<A extends 'TOD' | 'TEME', B extends 'TOD' | 'TEME'>(v: readonly number[], angleRad: number): Vec3<B> {
  const c = Math.cos(angleRad);
  const s = Math.sin(angleRad);
  return vec3<B>(c * v[0] + s * v[1], -s * v[0] + c * v[1], v[2]) as Vec3<B> & { __from?: A };
}

/** True-of-date to TEME (same pole; rotation by the equation of the equinoxes). */
export function todToTeme(r: Vec3<'TOD'>, eqEqRad: number): Vec3<'TEME'> {
  return rotZ<'TOD', 'TEME'>(r, eqEqRad);
}

/** TEME to true-of-date. */
export function temeToTod(r: Vec3<'TEME'>, eqEqRad: number): Vec3<'TOD'> {
  return rotZ<'TEME', 'TOD'>(r, -eqEqRad);
}

/** Transpose of a rotation (its inverse). */
export function transpose(m: Matrix3): Matrix3 {
  return [
    [m[0][0], m[1][0], m[2][0]],
    [m[0][1], m[1][1], m[2][1]],
    [m[0][2], m[1][2], m[2][2]],
  ];
}
