/**
 * One object of a CCSDS OEM as a {@link Trajectory} in TOD (true pole of date), metres and m/s.
 * Nodes are turned into TOD once, through the frame functions of ./frames.ts: EME2000 and GCRF
 * by the GCRF → TOD rotation (EME2000's frame bias from GCRF, < 0.1", is neglected), TEME by the
 * equation of the equinoxes, ITRF by GMST (earth-fixed velocities get ω × r) then TEME → TOD.
 * Interpolation per segment as the file says: Lagrange of degree d over d + 1 nodes (positions and
 * velocities each), or Hermite over ⌈(d + 1)/2⌉ nodes using positions and velocities (degree
 * 2n − 1 ≥ d). The span runs from the first segment's usable start to the last one's usable stop;
 * an instant in a gap between segments is refused (SpanError), so a window that crosses a gap is.
 */
import { InputError, SpanError } from '../errors.ts';
import type { OemFile, OemSegment } from '../model/oem.ts';
import { checkLunarEphemerisSpan, moonStateGcrfInto } from './lunarEphemeris.ts';
import { gcrfToTemeMatrixAtTt } from './frames.ts';
import { applyMatrix, ecefToTeme, equationOfEquinoxesRad, gcrfToTodMatrix, temeToTod } from './frames.ts';
import { sampleByStateAt, type StateBlock, type Trajectory } from './trajectory.ts';
import { vec3, type StateM, type Vec3 } from './vec.ts';

/** Earth-orientation inputs, from the caller's time system (the core reads no tables). */
export interface OemTimeFunctions {
  /** UTC Julian date (stand-in for UT1) at a ttJ2000S. */
  jdUtcAt: (ttJ2000S: number) => number;
  /** GMST [rad] at a ttJ2000S. */
  gmstRadAt: (ttJ2000S: number) => number;
  /** Readable time for messages. */
  format: (ttJ2000S: number) => string;
}

interface Seg {
  from: number;
  to: number;
  times: Float64Array;
  /** TOD states [m, m/s], 6 per node. */
  states: Float64Array;
  hermite: boolean;
  points: number;
}

/** Names of the objects in an OEM (OBJECT_NAME, with OBJECT_ID in brackets). */
export function oemObjects(file: OemFile): string[] {
  return [...new Set(file.segments.map((s) => `${s.objectName} (${s.objectId})`))];
}

/** The segments of `object` (OBJECT_NAME or OBJECT_ID); the only object when not given. */
export function oemSegmentsOf(file: OemFile, object: string | undefined, where: string): OemSegment[] {
  const names = new Set(file.segments.map((s) => s.objectName));
  if (object === undefined) {
    if (names.size !== 1) throw new InputError(`${file.fileName} holds ${names.size} objects`, where, `name one: ${oemObjects(file).join(', ')}`);
    return file.segments;
  }
  const segs = file.segments.filter((s) => s.objectName === object || s.objectId === object);
  if (segs.length === 0) throw new InputError(`object ${JSON.stringify(object)} is not in ${file.fileName}`, where, `use one of ${oemObjects(file).join(', ')}`);
  return segs;
}

export class OemTrajectory implements Trajectory {
  /** TOD; TEME of date for a Moon-centred file (the axes the lunar clock field takes: see ../clock/lunarRate.ts). */
  readonly frame: 'TOD' | 'TEME';
  /** `moon` when the ephemeris is Moon-centred (CENTER_NAME = MOON); states are served geocentric all the same. */
  readonly body: 'earth' | 'moon';
  readonly epochTtJ2000S = null;
  readonly sourceLabel: string;
  readonly validFromTtJ2000S: number;
  readonly validToTtJ2000S: number;
  private readonly segs: Seg[];

  constructor(
    readonly file: OemFile,
    readonly id: string,
    segments: readonly OemSegment[],
    private readonly time: OemTimeFunctions,
  ) {
    this.frame = segments[0]?.centerName === 'MOON' ? 'TEME' : 'TOD';
    this.segs = segments.map((s) => {
      const hermite = s.interpolation === 'HERMITE';
      const points = hermite ? Math.ceil((s.degree + 1) / 2) : s.degree + 1;
      if (s.nodes.length < points) {
        throw new InputError(`segment at line ${s.line} has ${s.nodes.length} data lines; ${s.interpolation} of degree ${s.degree} needs ${points}`, file.fileName, 'give more epochs or a lower INTERPOLATION_DEGREE');
      }
      const states = new Float64Array(6 * s.nodes.length);
      s.nodes.forEach((n, k) => {
        const r = vec3<'GCRF'>(n.positionKm[0] * 1000, n.positionKm[1] * 1000, n.positionKm[2] * 1000);
        const v = vec3<'GCRF'>(n.velocityKmPerS[0] * 1000, n.velocityKmPerS[1] * 1000, n.velocityKmPerS[2] * 1000);
        const [rt, vt] = this.toTod(s, n.ttJ2000S, r, v);
        states.set([rt[0], rt[1], rt[2], vt[0], vt[1], vt[2]], 6 * k);
      });
      return { from: s.usableFromTtJ2000S, to: s.usableToTtJ2000S, times: Float64Array.from(s.nodes, (n) => n.ttJ2000S), states, hermite, points };
    });
    this.body = segments[0].centerName === 'MOON' ? 'moon' : 'earth';
    if (segments.some((s) => (s.centerName === 'MOON') !== (this.body === 'moon'))) {
      throw new InputError('segments of one object have different CENTER_NAME', file.fileName, 'give all segments of an object about the same body');
    }
    this.validFromTtJ2000S = this.segs[0].from;
    this.validToTtJ2000S = this.segs[this.segs.length - 1].to;
    const s0 = segments[0];
    this.sourceLabel = `CCSDS OEM ${file.version} (${file.fileName}, ${s0.objectName}, ${s0.frameText}, ${s0.timeSystem}, ${s0.interpolation} degree ${s0.degree}, ${segments.length} segment(s))`;
  }

  private toTod(s: OemSegment, tt: number, r0: Vec3<'GCRF'>, v0: Vec3<'GCRF'>): [Vec3<'TOD'>, Vec3<'TOD'>] {
    const jd = this.time.jdUtcAt(tt);
    let r = r0;
    let v = v0;
    if (s.centerName === 'MOON') {
      // LCRS node → geocentric GCRF: add the Moon's geocentric state (./lunarEphemeris.ts).
      checkLunarEphemerisSpan(tt, this.file.fileName);
      const m = moonStateGcrfInto(tt, new Float64Array(6), 0);
      r = vec3<'GCRF'>(r0[0] + m[0], r0[1] + m[1], r0[2] + m[2]);
      v = vec3<'GCRF'>(v0[0] + m[3], v0[1] + m[4], v0[2] + m[5]);
      // Served in TEME of date, the axes of the Moon's position in the clock field (TOD differs by
      // the equation of the equinoxes, ~1″: 2 km at the Moon's distance).
      const q = gcrfToTemeMatrixAtTt(tt);
      return [applyMatrix<'GCRF', 'TOD'>(q, r), applyMatrix<'GCRF', 'TOD'>(q, v)];
    }
    switch (s.frame) {
      case 'EME2000':
      case 'GCRF': {
        const m = gcrfToTodMatrix(jd);
        return [applyMatrix<'GCRF', 'TOD'>(m, r), applyMatrix<'GCRF', 'TOD'>(m, v)];
      }
      case 'TEME': {
        const eq = equationOfEquinoxesRad(jd);
        return [temeToTod(r as unknown as Vec3<'TEME'>, eq), temeToTod(v as unknown as Vec3<'TEME'>, eq)];
      }
      default: {
        const teme = ecefToTeme(r as unknown as Vec3<'ECEF'>, v as unknown as Vec3<'ECEF'>, this.time.gmstRadAt(tt));
        const eq = equationOfEquinoxesRad(jd);
        return [temeToTod(teme.r, eq), temeToTod(teme.v, eq)];
      }
    }
  }

  private segmentAt(tt: number): Seg {
    const seg = this.segs.find((s) => tt >= s.from - 1e-3 && tt <= s.to + 1e-3);
    if (seg !== undefined) return seg;
    const from = this.time.format(this.validFromTtJ2000S);
    const to = this.time.format(this.validToTtJ2000S);
    if (tt > this.validFromTtJ2000S && tt < this.validToTtJ2000S) {
      throw new SpanError(`time ${this.time.format(tt)} falls in a gap between segments of the OEM`, this.id, from, to, 'choose a window inside one segment, or fill the gap in the ephemeris');
    }
    throw new SpanError(`time ${this.time.format(tt)} is outside the OEM's span ${from} to ${to}`, this.id, from, to, 'shorten the window to the ephemeris span');
  }

  /** State in `this.frame` (typed TOD for the callers of Earth-centred files; TEME values for a Moon-centred one). */
  stateAt(ttJ2000S: number): StateM<'TOD'> {
    const s = this.segmentAt(ttJ2000S);
    const n = s.times.length;
    // The window of nodes around t, kept inside the segment.
    let hi = 0;
    while (hi < n && s.times[hi] < ttJ2000S) hi++;
    let start = Math.min(Math.max(0, hi - Math.ceil(s.points / 2)), n - s.points);
    start = Math.max(0, start);
    const out = new Float64Array(6);
    if (s.hermite) hermite(s, start, ttJ2000S, out);
    else lagrange(s, start, ttJ2000S, out);
    return { ttJ2000S, positionM: vec3<'TOD'>(out[0], out[1], out[2]), velocityMPerS: vec3<'TOD'>(out[3], out[4], out[5]) };
  }

  sampleInto(ttJ2000S: Float64Array, out: StateBlock): void {
    sampleByStateAt(this, ttJ2000S, out);
  }
}

/** Lagrange interpolation of positions and velocities over nodes start … start + points − 1. */
function lagrange(s: Seg, start: number, t: number, out: Float64Array): void {
  const t0 = s.times[start];
  for (let i = 0; i < s.points; i++) {
    let w = 1;
    const ti = s.times[start + i] - t0;
    for (let j = 0; j < s.points; j++) if (j !== i) w *= (t - t0 - (s.times[start + j] - t0)) / (ti - (s.times[start + j] - t0));
    for (let c = 0; c < 6; c++) out[c] += w * s.states[6 * (start + i) + c];
  }
}

/** Hermite interpolation (positions and their derivatives) over nodes start … start + points − 1. */
function hermite(s: Seg, start: number, t: number, out: Float64Array): void {
  const m = s.points;
  const t0 = s.times[start];
  const x = (k: number): number => s.times[start + k] - t0;
  const u = t - t0;
  for (let i = 0; i < m; i++) {
    const xi = x(i);
    let li = 1;
    let dLiAtXi = 0;
    for (let j = 0; j < m; j++) {
      if (j === i) continue;
      li *= (u - x(j)) / (xi - x(j));
      dLiAtXi += 1 / (xi - x(j));
    }
    // L_i'(u) by the product rule.
    let dLi = 0;
    for (let k = 0; k < m; k++) {
      if (k === i) continue;
      let p = 1 / (xi - x(k));
      for (let j = 0; j < m; j++) if (j !== i && j !== k) p *= (u - x(j)) / (xi - x(j));
      dLi += p;
    }
    const a = 1 - 2 * (u - xi) * dLiAtXi;
    const h = a * li * li;
    const k = (u - xi) * li * li;
    const dh = -2 * dLiAtXi * li * li + a * 2 * li * dLi;
    const dk = li * li + (u - xi) * 2 * li * dLi;
    for (let c = 0; c < 3; c++) {
      const p = s.states[6 * (start + i) + c];
      const v = s.states[6 * (start + i) + 3 + c];
      out[c] += h * p + k * v;
      out[3 + c] += dh * p + dk * v;
    }
  }
}
