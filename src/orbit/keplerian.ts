/**
 * Two-body Keplerian elements and states. Used for design orbits (osculating elements), as the
 * initial state of numerical propagation, and as an exact point-mass trajectory.
 */
import { InputError } from '../errors.ts';
import { WGS84_A_M } from '../constants.ts';
import { sampleByStateAt, checkSpan, type StateBlock, type Trajectory } from './trajectory.ts';
import { vec3, type StateM, type Vec3 } from './vec.ts';

const DEG = Math.PI / 180;

/** Osculating Keplerian elements at an epoch, true-of-date axes. */
export interface KeplerianElements {
  /** Epoch, seconds since J2000.0 TT. */
  epochTtJ2000S: number;
  aM: number;
  /** Eccentricity, 0 ≤ e < 1. */
  e: number;
  iRad: number;
  raanRad: number;
  argpRad: number;
  meanAnomalyRad: number;
}

/** Elements in the user's degree/km form. */
export interface KeplerianDegKm {
  epochTtJ2000S: number;
  aKm: number;
  e: number;
  iDeg: number;
  raanDeg: number;
  argpDeg: number;
  meanAnomalyDeg: number;
}

/** The surface an orbit must clear, with the words of its messages. */
export interface CentralBodySurface {
  /** Reference radius [m]. */
  radiusM: number;
  /** e.g. "perigee radius 6000.000 km is below <surface>". */
  periapsisWord: string;
  surface: string;
  /** An example of a, for the fix. */
  aHint: string;
}

/** The Earth: the WGS-84 equatorial radius. */
export const EARTH_SURFACE: CentralBodySurface = {
  radiusM: WGS84_A_M,
  periapsisWord: 'perigee',
  surface: "the Earth's surface (6378.137 km)",
  aHint: 'give a in km, e.g. 26561.75',
};

/** Refuse impossible elements about `body`; `where` prefixes the field names. */
export function checkElementsDegKm(p: KeplerianDegKm, where: { a: string; e: string }, body: CentralBodySurface): void {
  if (!Number.isFinite(p.e) || p.e < 0 || p.e >= 1) throw new InputError(`eccentricity ${p.e} is not in [0, 1)`, where.e, 'give 0 ≤ e < 1 (closed orbits only)');
  if (!Number.isFinite(p.aKm) || p.aKm <= 0) throw new InputError(`semi-major axis ${p.aKm} km is not positive`, where.a, body.aHint);
  const periKm = p.aKm * (1 - p.e);
  if (periKm * 1000 < body.radiusM) {
    const radiusKm = body.radiusM / 1000;
    throw new InputError(`${body.periapsisWord} radius ${periKm.toFixed(3)} km is below ${body.surface}`, where.a, `raise a or lower e so that a·(1 − e) > ${radiusKm} km`);
  }
}

/** Build elements from the user's degree/km form, refusing impossible orbits about the Earth. `where` prefixes the field names. */
export function elementsFromDegKm(p: KeplerianDegKm, where: { a: string; e: string }): KeplerianElements {
  checkElementsDegKm(p, where, EARTH_SURFACE);
  return elementsInRadM(p);
}

/** Degree/km elements in radians and metres (unchecked). */
export function elementsInRadM(p: KeplerianDegKm): KeplerianElements {
  return {
    epochTtJ2000S: p.epochTtJ2000S,
    aM: p.aKm * 1000,
    e: p.e,
    iRad: p.iDeg * DEG,
    raanRad: p.raanDeg * DEG,
    argpRad: p.argpDeg * DEG,
    meanAnomalyRad: p.meanAnomalyDeg * DEG,
  };
}

/** Solve Kepler's equation M = E − e sin E for E [rad]; Newton with a capped iteration count. */
export function eccentricAnomalyRad(meanAnomalyRad: number, e: number): number {
  const m = ((meanAnomalyRad % (2 * Math.PI)) + 3 * Math.PI) % (2 * Math.PI) - Math.PI;
  let ecc = e < 0.8 ? m : Math.PI * Math.sign(m || 1);
  for (let k = 0; k < 50; k++) {
    const f = ecc - e * Math.sin(ecc) - m;
    const d = f / (1 - e * Math.cos(ecc));
    ecc -= d;
    if (Math.abs(d) < 1e-15) break;
  }
  return ecc + (meanAnomalyRad - m);
}

/** State [m, m/s] from elements at time offset dtS from the epoch, two-body motion under `gm`. */
export function keplerState(el: KeplerianElements, gmM3PerS2: number, dtS: number): { r: Vec3<'TOD'>; v: Vec3<'TOD'> } {
  const n = Math.sqrt(gmM3PerS2 / (el.aM * el.aM * el.aM));
  const ecc = eccentricAnomalyRad(el.meanAnomalyRad + n * dtS, el.e);
  const cosE = Math.cos(ecc);
  const sinE = Math.sin(ecc);
  const b = el.aM * Math.sqrt(1 - el.e * el.e);
  // Perifocal coordinates.
  const xp = el.aM * (cosE - el.e);
  const yp = b * sinE;
  const edot = n / (1 - el.e * cosE);
  const vxp = -el.aM * sinE * edot;
  const vyp = b * cosE * edot;
  const cO = Math.cos(el.raanRad);
  const sO = Math.sin(el.raanRad);
  const cw = Math.cos(el.argpRad);
  const sw = Math.sin(el.argpRad);
  const ci = Math.cos(el.iRad);
  const si = Math.sin(el.iRad);
  const px = cO * cw - sO * sw * ci;
  const py = sO * cw + cO * sw * ci;
  const pz = sw * si;
  const qx = -cO * sw - sO * cw * ci;
  const qy = -sO * sw + cO * cw * ci;
  const qz = cw * si;
  return {
    r: vec3<'TOD'>(px * xp + qx * yp, py * xp + qy * yp, pz * xp + qz * yp),
    v: vec3<'TOD'>(px * vxp + qx * vyp, py * vxp + qy * vyp, pz * vxp + qz * vyp),
  };
}

/** Classical elements from a state [m, m/s] (two-body, for reports and round-trip checks). */
export function elementsFromState(r: readonly number[], v: readonly number[], gmM3PerS2: number, epochTtJ2000S: number): KeplerianElements {
  const rn = Math.hypot(r[0], r[1], r[2]);
  const v2 = v[0] * v[0] + v[1] * v[1] + v[2] * v[2];
  const h = [r[1] * v[2] - r[2] * v[1], r[2] * v[0] - r[0] * v[2], r[0] * v[1] - r[1] * v[0]];
  const hn = Math.hypot(h[0], h[1], h[2]);
  const rv = r[0] * v[0] + r[1] * v[1] + r[2] * v[2];
  const ev = [0, 1, 2].map((k) => ((v2 - gmM3PerS2 / rn) * r[k] - rv * v[k]) / gmM3PerS2);
  const e = Math.hypot(ev[0], ev[1], ev[2]);
  const a = 1 / (2 / rn - v2 / gmM3PerS2);
  const i = Math.acos(h[2] / hn);
  const nv = [-h[1], h[0], 0];
  const nn = Math.hypot(nv[0], nv[1]);
  let raan = nn > 1e-12 ? Math.atan2(nv[1], nv[0]) : 0;
  if (raan < 0) raan += 2 * Math.PI;
  let argp = 0;
  let nu: number;
  if (nn > 1e-12 && e > 1e-12) {
    argp = Math.acos(Math.max(-1, Math.min(1, (nv[0] * ev[0] + nv[1] * ev[1]) / (nn * e))));
    if (ev[2] < 0) argp = 2 * Math.PI - argp;
  }
  if (e > 1e-12) {
    nu = Math.acos(Math.max(-1, Math.min(1, (ev[0] * r[0] + ev[1] * r[1] + ev[2] * r[2]) / (e * rn))));
    if (rv < 0) nu = 2 * Math.PI - nu;
  } else {
    // Circular: measure from the node (argument of latitude).
    const base = nn > 1e-12 ? nv : [1, 0, 0];
    const bn = Math.hypot(base[0], base[1], base[2]);
    nu = Math.acos(Math.max(-1, Math.min(1, (base[0] * r[0] + base[1] * r[1] + base[2] * r[2]) / (bn * rn))));
    if (r[2] < 0) nu = 2 * Math.PI - nu;
  }
  const ecc = 2 * Math.atan2(Math.sqrt(1 - e) * Math.sin(nu / 2), Math.sqrt(1 + e) * Math.cos(nu / 2));
  const m = ecc - e * Math.sin(ecc);
  return { epochTtJ2000S, aM: a, e, iRad: i, raanRad: raan, argpRad: argp, meanAnomalyRad: (m + 2 * Math.PI) % (2 * Math.PI) };
}

/** Exact two-body trajectory (point-mass gravity) from osculating elements, frame TOD. */
export class KeplerianTrajectory implements Trajectory {
  readonly frame = 'TOD' as const;
  readonly sourceLabel = 'Keplerian two-body (osculating elements)';
  readonly epochTtJ2000S: number;
  constructor(
    readonly id: string,
    readonly elements: KeplerianElements,
    readonly gmM3PerS2: number,
    readonly validFromTtJ2000S: number = -Infinity,
    readonly validToTtJ2000S: number = Infinity,
  ) {
    this.epochTtJ2000S = elements.epochTtJ2000S;
  }
  stateAt(ttJ2000S: number): StateM<'TOD'> {
    checkSpan(this, ttJ2000S);
    const { r, v } = keplerState(this.elements, this.gmM3PerS2, ttJ2000S - this.elements.epochTtJ2000S);
    return { ttJ2000S, positionM: r, velocityMPerS: v };
  }
  sampleInto(ttJ2000S: Float64Array, out: StateBlock): void {
    sampleByStateAt(this, ttJ2000S, out);
  }
  /** Orbital period [s]. */
  get periodS(): number {
    return 2 * Math.PI * Math.sqrt(this.elements.aM ** 3 / this.gmM3PerS2);
  }
}
