/**
 * One-way signal terms, satellite to station (physics.md §4): light time, the Sagnac (earth-rotation)
 * term and the Shapiro delay. Times are seconds since J2000.0 TT (coordinate time; the difference
 * from TCG over a light time, ~7e-10 relative, is far below these terms' accuracy).
 *
 * Frames: the trajectory's inertial states (TEME or TOD, both treated as TEME) and the station's
 * earth-fixed position rotated to inertial with `gmstRadAt`. Accuracy of `lightTimeNs` is limited by
 * that Earth orientation model, not by the iteration: UT1 ≈ UTC leaves up to 0.9 s of rotation
 * (≤ 420 m at the equator, ≤ 1.4 µs of light time), and a TOD source treated as TEME puts the station
 * up to 1.2" (≤ 37 m, ≤ 0.13 µs) off. `sagnacNs` and `shapiroNs` depend on the geometry only to first
 * order and are good to < 1 ps from these errors.
 */
import { SPEED_OF_LIGHT_M_PER_S, WGS84_GM_M3_PER_S2, WGS84_OMEGA_RAD_PER_S } from '../constants.ts';
import { assertFinite, InternalError } from '../errors.ts';
import { ecefToTemePosition, temeToEcefPosition } from '../orbit/frames.ts';
import type { Trajectory } from '../orbit/trajectory.ts';
import { vec3, type Vec3 } from '../orbit/vec.ts';
import type { GmstRadAt } from './passes.ts';

const C = SPEED_OF_LIGHT_M_PER_S;
/** Light-time iteration stops when successive values differ by less than this [s]. */
const LIGHT_TIME_TOLERANCE_S = 1e-12;
/** Cap on light-time iterations (the fixed point contracts by v/c ≈ 1e-5 per step; 3–4 suffice). */
const LIGHT_TIME_MAX_ITERATIONS = 20;

/** The one-way terms at one receive instant. */
export interface OneWayTerms {
  /** Receive time, seconds since J2000.0 TT. */
  receiveTtJ2000S: number;
  /** Transmit time solved from the light-time equation, seconds since J2000.0 TT. */
  transmitTtJ2000S: number;
  /** Light time t_r − t_t [ns]: |r_sat(t_t) − r_sta(t_r)| / c in the inertial frame. Includes the Sagnac effect. */
  lightTimeNs: number;
  /** Inertial distance satellite(t_t) → station(t_r) [m]. */
  rangeM: number;
  /**
   * Sagnac term [ns]: ω (x_s y_r − y_s x_r) / c², earth-fixed coordinates, satellite at transmit time.
   * This is what must be added to the earth-fixed geometric range delay (|r_s,ECEF(t_t) − r_r| / c) to get
   * the inertial light time: the IS-GPS-200 earth-rotation correction expressed as a delay. Negative
   * for a satellite east of the station (the station moves toward the signal).
   */
  sagnacNs: number;
  /** Shapiro (gravitational) delay [ns]: (2GM/c³) ln((r_s + r_r + ρ)/(r_s + r_r − ρ)). IERS Conventions 2010, ch. 11. Always ≥ 0. */
  shapiroNs: number;
  /** Light-time iterations used. */
  iterations: number;
}

/**
 * Sagnac term [ns] for satellite and receiver earth-fixed positions [m]:
 * ω_E (x_s y_r − y_s x_r) / c², with ω_E the WGS-84 rate. Sign: positive lengthens the light time.
 */
export function sagnacDelayNs(satEcefM: Vec3<'ECEF'>, receiverEcefM: Vec3<'ECEF'>): number {
  return ((WGS84_OMEGA_RAD_PER_S * (satEcefM[0] * receiverEcefM[1] - satEcefM[1] * receiverEcefM[0])) / (C * C)) * 1e9;
}

/**
 * Shapiro delay [ns] of a signal between geocentric radii `satRadiusM` and `receiverRadiusM` [m]
 * separated by `rangeM` [m], Earth's field only (GM = WGS-84, PPN γ = 1).
 */
export function shapiroDelayNs(satRadiusM: number, receiverRadiusM: number, rangeM: number): number {
  const sum = satRadiusM + receiverRadiusM;
  return ((2 * WGS84_GM_M3_PER_S2) / (C * C * C)) * Math.log((sum + rangeM) / (sum - rangeM)) * 1e9;
}

/**
 * One-way terms for a signal sent by the satellite and received at an earth-fixed station at
 * `receiveTtJ2000S`. The transmit time solves |r_sat(t_t) − r_sta(t_r)| = c (t_r − t_t) by fixed-point
 * iteration to 1e-12 s (the double time coordinate resolves ~1e-7 s near 2027, i.e. < 1 mm of motion).
 * Throws SpanError when t_t falls outside the trajectory's span.
 */
export function oneWayTerms(traj: Trajectory, stationEcefM: Vec3<'ECEF'>, gmstRadAt: GmstRadAt, receiveTtJ2000S: number): OneWayTerms {
  const receiverInertial = ecefToTemePosition(stationEcefM, gmstRadAt(receiveTtJ2000S));
  const distanceAt = (t: number): { d: number; pos: readonly number[] } => {
    const p = traj.stateAt(t).positionM;
    return { d: Math.hypot(p[0] - receiverInertial[0], p[1] - receiverInertial[1], p[2] - receiverInertial[2]), pos: p };
  };
  let tauS = distanceAt(receiveTtJ2000S).d / C;
  let iterations = 0;
  let last: { d: number; pos: readonly number[] } | null = null;
  for (;;) {
    if (iterations >= LIGHT_TIME_MAX_ITERATIONS) {
      throw new InternalError(`light time for ${traj.id} did not converge in ${LIGHT_TIME_MAX_ITERATIONS} iterations at ${receiveTtJ2000S} s TT`, 'lightTimeNs');
    }
    iterations++;
    last = distanceAt(receiveTtJ2000S - tauS);
    const next = last.d / C;
    const change = Math.abs(next - tauS);
    tauS = next;
    if (change < LIGHT_TIME_TOLERANCE_S) break;
  }
  const transmitTtJ2000S = receiveTtJ2000S - tauS;
  // The position used in the last distance was at receive − (previous τ), within 1e-12 s of t_t.
  const satInertial = last.pos;
  const satEcef = temeToEcefPosition(vec3<'TEME'>(satInertial[0], satInertial[1], satInertial[2]), gmstRadAt(transmitTtJ2000S));
  const rangeM = tauS * C;
  const satRadiusM = Math.hypot(satInertial[0], satInertial[1], satInertial[2]);
  const receiverRadiusM = Math.hypot(stationEcefM[0], stationEcefM[1], stationEcefM[2]);
  return {
    receiveTtJ2000S,
    transmitTtJ2000S,
    lightTimeNs: assertFinite(tauS * 1e9, 'lightTimeNs'),
    rangeM,
    sagnacNs: assertFinite(sagnacDelayNs(satEcef, stationEcefM), 'sagnacNs'),
    shapiroNs: assertFinite(shapiroDelayNs(satRadiusM, receiverRadiusM, rangeM), 'shapiroNs'),
    iterations,
  };
}
