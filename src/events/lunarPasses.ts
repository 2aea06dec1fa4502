/**
 * Passes that involve the Moon: a station on the Moon seeing any satellite, and a station on the
 * Earth seeing a satellite about the Moon, with the one-way signal terms at TCA.
 *
 * Visibility: g(t) = min(elevation − mask, clearance of the line of sight past the other body).
 * - Elevation is geometric, above the local horizon: on the Moon, the plane normal to the radius of
 *   the 1737.4 km sphere at the station; on the Earth, the geodetic horizon (WGS-84).
 * - The line of sight is blocked by the body the station is not on (the Moon for Earth stations,
 *   the Earth for lunar stations): clearance = (distance of the segment from that body's centre −
 *   its radius) / station-to-centre distance, an angle in radians (the Moon as a 1737.4 km sphere,
 *   the Earth as a 6378.137 km sphere). The body a station stands on blocks through its horizon.
 * Passes are the spans with g > 0: sign changes on a grid of step clamp(min(minPassS/2, τp/4), 10 s,
 * 600 s) (τp the periapsis passage time of the orbit about its body), refined to 1 ms; a dip shorter
 * than a grid step inside a pass (a grazing occultation) can go unseen. TCA: the maximum elevation,
 * by golden-section search around the best grid sample (1 ms).
 *
 * Signal terms at TCA (received at the station):
 * - light time solved iteratively in the geocentric inertial frame (transmit time from
 *   |r_sat(t_t) − r_sta(t_r)| = c (t_r − t_t), to 1e-12 s; about 1.3 s from the Earth to the Moon);
 * - Sagnac: the rotating-frame term of the station's body, ω (x_s y_r − y_s x_r)/c², in that body's
 *   fixed axes (the Earth: ω_E, ECEF as in ./oneWay.ts; the Moon: ω_M, the IAU ME frame);
 * - Shapiro: the Earth's and the Moon's, (2GM/c³) ln((r_s + r_r + ρ)/(r_s + r_r − ρ)) each, with
 *   the radii from each body's centre (IERS Conventions 2010, ch. 11).
 */
import { SPEED_OF_LIGHT_M_PER_S, WGS84_A_M, WGS84_GM_M3_PER_S2 } from '../constants.ts';
import { InternalError } from '../errors.ts';
import { ecefToTemePosition, temeToEcefPosition } from '../orbit/frames.ts';
import { moonStateGcrfInto } from '../orbit/lunarEphemeris.ts';
import { isLunarOrbiter, lunarElementsAt } from '../orbit/lunarOrbit.ts';
import { LunarSurfaceTrajectory } from '../orbit/lunarSurface.ts';
import { DE430_GM_MOON_M3_PER_S2, IAU_MOON_MEAN_RADIUS_M, IAU_MOON_ROTATION_RAD_PER_S, icrfToMoonFixedInto } from '../orbit/moonBody.ts';
import { gcrfToTemeInto } from '../orbit/temeOfDate.ts';
import type { Trajectory } from '../orbit/trajectory.ts';
import { vec3 } from '../orbit/vec.ts';
import { bracketedRoot, passGridStepS, type GmstRadAt, type Pass } from './passes.ts';
import { sagnacDelayNs, type OneWayTerms } from './oneWay.ts';
import { geodeticToEcefM, type Station } from './station.ts';

const C = SPEED_OF_LIGHT_M_PER_S;
const DEG = Math.PI / 180;
/** Refinement tolerance of AOS, LOS and TCA [s]. */
const TIME_TOL_S = 1e-3;
const GOLDEN_MAX_ITERATIONS = 80;
const LIGHT_TIME_MAX_ITERATIONS = 20;
const LIGHT_TIME_TOLERANCE_S = 1e-12;

/** A station as the lunar pass finder sees it: where it is and which way is up, in TEME of date. */
export interface LinkStation {
  id: string;
  body: 'earth' | 'moon';
  maskDeg: number;
  minPassS: number;
  /** Geocentric position [m], TEME of date. */
  positionAt(ttJ2000S: number): [number, number, number];
  /** Unit local vertical, TEME of date. */
  upAt(ttJ2000S: number): [number, number, number];
  /** Body-fixed position [m] (ECEF or Moon ME), for the Sagnac term. */
  fixedM: [number, number, number];
}

/** The Moon's geocentric position [m], TEME of date. */
export function moonTemeM(ttJ2000S: number): [number, number, number] {
  const g = moonStateGcrfInto(ttJ2000S, new Float64Array(6), 0);
  const m = gcrfToTemeInto(ttJ2000S, new Float64Array(9));
  return [m[0] * g[0] + m[1] * g[1] + m[2] * g[2], m[3] * g[0] + m[4] * g[1] + m[5] * g[2], m[6] * g[0] + m[7] * g[1] + m[8] * g[2]];
}

/** An Earth station for the lunar pass finder. */
export function earthLinkStation(st: Station, gmstRadAt: GmstRadAt): LinkStation {
  const ecef = geodeticToEcefM(st.latDeg, st.lonDeg, st.heightM);
  const la = st.latDeg * DEG;
  const lo = st.lonDeg * DEG;
  const nEcef = vec3<'ECEF'>(Math.cos(la) * Math.cos(lo), Math.cos(la) * Math.sin(lo), Math.sin(la));
  return {
    id: st.id,
    body: 'earth',
    maskDeg: st.maskDeg,
    minPassS: st.minPassS,
    positionAt: (t) => [...ecefToTemePosition(ecef, gmstRadAt(t))] as [number, number, number],
    upAt: (t) => [...ecefToTemePosition(nEcef, gmstRadAt(t))] as [number, number, number],
    fixedM: [ecef[0], ecef[1], ecef[2]],
  };
}

/** A station on the Moon (selenographic, height above 1737.4 km) for the lunar pass finder. */
export function lunarLinkStation(st: Station, fromTtJ2000S: number, toTtJ2000S: number): LinkStation {
  const traj = new LunarSurfaceTrajectory(st.id, { latDeg: st.latDeg, lonDeg: st.lonDeg, heightM: st.heightM }, fromTtJ2000S - 10, toTtJ2000S + 10);
  const r = IAU_MOON_MEAN_RADIUS_M + st.heightM;
  const la = st.latDeg * DEG;
  const lo = st.lonDeg * DEG;
  return {
    id: st.id,
    body: 'moon',
    maskDeg: st.maskDeg,
    minPassS: st.minPassS,
    positionAt: (t) => {
      const p = traj.stateAt(t).positionM;
      return [p[0], p[1], p[2]];
    },
    upAt: (t) => {
      const p = traj.stateAt(t).positionM;
      const m = moonTemeM(t);
      const d = [p[0] - m[0], p[1] - m[1], p[2] - m[2]];
      const n = Math.hypot(d[0], d[1], d[2]);
      return [d[0] / n, d[1] / n, d[2] / n];
    },
    fixedM: [r * Math.cos(la) * Math.cos(lo), r * Math.cos(la) * Math.sin(lo), r * Math.sin(la)],
  };
}

/** Clearance [rad] of the segment p → s past a sphere (centre c, radius R), seen from p. */
function clearanceRad(p: readonly number[], s: readonly number[], c: readonly number[], radiusM: number): number {
  const d = [s[0] - p[0], s[1] - p[1], s[2] - p[2]];
  const w = [c[0] - p[0], c[1] - p[1], c[2] - p[2]];
  const dd = d[0] * d[0] + d[1] * d[1] + d[2] * d[2];
  const k = Math.max(0, Math.min(1, (w[0] * d[0] + w[1] * d[1] + w[2] * d[2]) / dd));
  const q = [p[0] + k * d[0] - c[0], p[1] + k * d[1] - c[1], p[2] + k * d[2] - c[2]];
  return (Math.hypot(q[0], q[1], q[2]) - radiusM) / Math.hypot(w[0], w[1], w[2]);
}

/** Elevation [rad] of the satellite above the station's horizon at t. */
function elevationAt(traj: Trajectory, st: LinkStation, t: number): number {
  const s = traj.stateAt(t).positionM;
  const p = st.positionAt(t);
  const u = st.upAt(t);
  const d = [s[0] - p[0], s[1] - p[1], s[2] - p[2]];
  return Math.asin((d[0] * u[0] + d[1] * u[1] + d[2] * u[2]) / Math.hypot(d[0], d[1], d[2]));
}

/** g(t): positive when the satellite is above the mask and the line of sight is clear. */
function visibility(traj: Trajectory, st: LinkStation, t: number): number {
  const elev = elevationAt(traj, st, t) - st.maskDeg * DEG;
  const s = traj.stateAt(t).positionM;
  const p = st.positionAt(t);
  const clear = st.body === 'earth' ? clearanceRad(p, s, moonTemeM(t), IAU_MOON_MEAN_RADIUS_M) : clearanceRad(p, s, [0, 0, 0], WGS84_A_M);
  return Math.min(elev, clear);
}

/** Grid step [s] for a satellite: by its periapsis passage about its own body. */
function gridStepS(traj: Trajectory, st: LinkStation, t: number): number {
  if (isLunarOrbiter(traj)) {
    const el = lunarElementsAt(traj, t);
    const rp = el.aM * (1 - el.e);
    const vp = Math.sqrt((DE430_GM_MOON_M3_PER_S2 * (1 + el.e)) / rp);
    return Math.max(10, Math.min(600, Math.min(st.minPassS / 2 || 600, rp / vp / 4)));
  }
  const s = traj.stateAt(t);
  return passGridStepS(s.positionM, s.velocityMPerS, st.minPassS);
}

/** Passes of `traj` over one station in [from, to] (TT s since J2000.0), sorted by AOS. */
export function findLunarPasses(traj: Trajectory, st: LinkStation, fromTtJ2000S: number, toTtJ2000S: number): { passes: Pass[]; statesEvaluated: number } {
  let states = 0;
  const g = (t: number): number => {
    states++;
    return visibility(traj, st, t);
  };
  const h = gridStepS(traj, st, fromTtJ2000S);
  const n = Math.max(1, Math.ceil((toTtJ2000S - fromTtJ2000S) / h));
  if (n > 5_000_000) throw new InternalError(`pass grid of ${n} points for ${traj.id}`, 'gridStepS');
  const ts: number[] = [];
  const gs: number[] = [];
  for (let i = 0; i <= n; i++) {
    const t = i === n ? toTtJ2000S : fromTtJ2000S + i * h;
    ts.push(t);
    gs.push(g(t));
  }
  const passes: Pass[] = [];
  let aos: number | null = gs[0] > 0 ? fromTtJ2000S : null;
  const close = (los: number, losTruncated: boolean): void => {
    const a = aos as number;
    const aosTruncated = a === fromTtJ2000S && gs[0] > 0;
    const tca = culmination(traj, st, a, los, h, () => states++);
    const durationS = los - a;
    if (durationS >= st.minPassS || aosTruncated || losTruncated) {
      passes.push({
        satelliteId: traj.id,
        stationId: st.id,
        aosTtJ2000S: a,
        tcaTtJ2000S: tca.t,
        losTtJ2000S: los,
        maxElevationDeg: tca.elevationRad / DEG,
        durationS,
        truncated: aosTruncated || losTruncated,
        aosTruncated,
        losTruncated,
      });
    }
    aos = null;
  };
  for (let i = 1; i <= n; i++) {
    const a = gs[i - 1];
    const b = gs[i];
    if (a <= 0 && b > 0) aos = bracketedRoot(g, ts[i - 1], ts[i], a, b, TIME_TOL_S, 'lunar AOS');
    else if (a > 0 && b <= 0 && aos !== null) close(bracketedRoot(g, ts[i - 1], ts[i], a, b, TIME_TOL_S, 'lunar LOS'), false);
  }
  if (aos !== null) close(toTtJ2000S, true);
  return { passes, statesEvaluated: states };
}

/** Time and value of the maximum elevation in [a, b]: best of a coarse scan, then golden section. */
function culmination(traj: Trajectory, st: LinkStation, a: number, b: number, h: number, count: () => void): { t: number; elevationRad: number } {
  const e = (t: number): number => {
    count();
    return elevationAt(traj, st, t);
  };
  const steps = Math.max(2, Math.min(2000, Math.ceil((b - a) / h)));
  let bestT = a;
  let bestE = -Infinity;
  for (let k = 0; k <= steps; k++) {
    const t = a + ((b - a) * k) / steps;
    const v = e(t);
    if (v > bestE) {
      bestE = v;
      bestT = t;
    }
  }
  const w = (b - a) / steps;
  let lo = Math.max(a, bestT - w);
  let hi = Math.min(b, bestT + w);
  const phi = (Math.sqrt(5) - 1) / 2;
  let x1 = hi - phi * (hi - lo);
  let x2 = lo + phi * (hi - lo);
  let f1 = e(x1);
  let f2 = e(x2);
  for (let k = 0; k < GOLDEN_MAX_ITERATIONS && hi - lo > TIME_TOL_S; k++) {
    if (f1 > f2) {
      hi = x2;
      x2 = x1;
      f2 = f1;
      x1 = hi - phi * (hi - lo);
      f1 = e(x1);
    } else {
      lo = x1;
      x1 = x2;
      f1 = f2;
      x2 = lo + phi * (hi - lo);
      f2 = e(x2);
    }
  }
  const t = 0.5 * (lo + hi);
  const v = e(t);
  return v >= bestE ? { t, elevationRad: v } : { t: bestT, elevationRad: bestE };
}

/** Shapiro delay [ns] of one body: (2GM/c³) ln((r_s + r_r + ρ)/(r_s + r_r − ρ)). */
function shapiroNs(gm: number, rs: number, rr: number, rho: number): number {
  const sum = rs + rr;
  return ((2 * gm) / (C * C * C)) * Math.log((sum + rho) / (sum - rho)) * 1e9;
}

/** One-way terms of a signal from the satellite received at the station at `receiveTtJ2000S`. */
export function lunarOneWayTerms(traj: Trajectory, st: LinkStation, gmstRadAt: GmstRadAt, receiveTtJ2000S: number): OneWayTerms {
  const p = st.positionAt(receiveTtJ2000S);
  const at = (t: number): readonly number[] => traj.stateAt(t).positionM;
  let tau = 0;
  let s = at(receiveTtJ2000S);
  let iterations = 0;
  for (;;) {
    if (++iterations > LIGHT_TIME_MAX_ITERATIONS) throw new InternalError(`light time for ${traj.id} did not converge`, 'lightTimeNs');
    const next = Math.hypot(s[0] - p[0], s[1] - p[1], s[2] - p[2]) / C;
    const change = Math.abs(next - tau);
    tau = next;
    s = at(receiveTtJ2000S - tau);
    if (change < LIGHT_TIME_TOLERANCE_S) break;
  }
  const transmit = receiveTtJ2000S - tau;
  const rho = tau * C;
  let sagnac: number;
  if (st.body === 'earth') {
    const satEcef = temeToEcefPosition(vec3<'TEME'>(s[0], s[1], s[2]), gmstRadAt(transmit));
    sagnac = sagnacDelayNs(satEcef, vec3<'ECEF'>(st.fixedM[0], st.fixedM[1], st.fixedM[2]));
  } else {
    // The Moon's analogue: satellite in ME axes at transmit, station fixed in ME.
    const m = moonTemeM(transmit);
    const q = gcrfToTemeInto(transmit, new Float64Array(9));
    const d = [s[0] - m[0], s[1] - m[1], s[2] - m[2]];
    const gc = [q[0] * d[0] + q[3] * d[1] + q[6] * d[2], q[1] * d[0] + q[4] * d[1] + q[7] * d[2], q[2] * d[0] + q[5] * d[1] + q[8] * d[2]];
    const f = icrfToMoonFixedInto(transmit, new Float64Array(9));
    const xs = f[0] * gc[0] + f[1] * gc[1] + f[2] * gc[2];
    const ys = f[3] * gc[0] + f[4] * gc[1] + f[5] * gc[2];
    sagnac = ((IAU_MOON_ROTATION_RAD_PER_S * (xs * st.fixedM[1] - ys * st.fixedM[0])) / (C * C)) * 1e9;
  }
  const moonAtRx = moonTemeM(receiveTtJ2000S);
  const moonAtTx = moonTemeM(transmit);
  const shapiro =
    shapiroNs(WGS84_GM_M3_PER_S2, Math.hypot(s[0], s[1], s[2]), Math.hypot(p[0], p[1], p[2]), rho) +
    shapiroNs(DE430_GM_MOON_M3_PER_S2, Math.hypot(s[0] - moonAtTx[0], s[1] - moonAtTx[1], s[2] - moonAtTx[2]), Math.hypot(p[0] - moonAtRx[0], p[1] - moonAtRx[1], p[2] - moonAtRx[2]), rho);
  return { receiveTtJ2000S, transmitTtJ2000S: transmit, lightTimeNs: tau * 1e9, rangeM: rho, sagnacNs: sagnac, shapiroNs: shapiro, iterations };
}

/** True when a pass of this satellite over this station needs the lunar pass finder. */
export function needsLunarPasses(traj: Trajectory, station: { body?: 'earth' | 'moon' }): boolean {
  return station.body === 'moon' || isLunarOrbiter(traj);
}
