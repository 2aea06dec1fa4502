/**
 * Trajectory from an SP3 precise ephemeris (one satellite of a parsed {@link Sp3File}).
 *
 * - SP3 positions are earth-fixed (the IGS realisation of ITRF, IGS20 and the like). They are
 *   interpolated in the earth-fixed frame, where the motion is smooth, by a Lagrange polynomial
 *   (order 9 = 10 nodes by default) over a window centred on the request; the window slides
 *   inwards at the file's ends, which makes the first and last few intervals less accurate.
 * - Velocity: the derivative of the same polynomial, or the interpolated `V` records when the
 *   file has them. Either is an earth-fixed velocity; the clock needs an inertial one, so each
 *   state goes through {@link ecefToTeme}, which adds ω × r (ω = WGS-84 7.292115e-5 rad/s)
 *   and rotates by GMST. Output frame TEME.
 * - GMST: the IAU-82 formula of {@link gmstRad}, evaluated with the time argument split into
 *   whole days and seconds ({@link gmstRadFromUtcJ2000S}). A single-double Julian date resolves
 *   only ~40 µs, i.e. centimetres of rotation at GNSS radii, too coarse for SP3.
 * - Neglected: polar motion (< 15 m at the surface, a few metres of pole tilt at orbit height)
 *   and UT1 − UTC (UTC stands in for UT1; < 0.9 s of rotation). ω differs from the GMST rate
 *   (7.2921158553e-5 rad/s, which includes precession in right ascension) by 8.6e-12 rad/s, so a
 *   velocity differs from the time derivative of TEME coordinates by up to 8.6e-12·r
 *   (2.3e-4 m/s at GNSS radius): a 2e-17 effect on the clock rate.
 * - Epoch times are read in the file's time system (`%c`) and converted through the
 *   {@link TimeSystem} to seconds since J2000.0 TT.
 * - Missing records (absent epochs, all-zero positions) and maneuvers (`M` flag: a maneuver
 *   between the previous epoch and the flagged one) are never interpolated across: a request
 *   whose window would use them is refused with a {@link SpanError} naming the satellite and the
 *   refused span.
 */
import { InputError, SpanError } from '../errors.ts';
import type { Sp3File } from '../model/sp3.ts';
import { daysFromCivil } from '../time/calendar.ts';
import { Instant } from '../time/instant.ts';
import type { TimeSystem } from '../time/timeSystem.ts';
import { ecefToTeme, gmstRadFromUtcJ2000S } from './frames.ts';

export { gmstRadFromUtcJ2000S } from './frames.ts';
import { checkSpan, type StateBlock, type Trajectory } from './trajectory.ts';
import { vec3, type StateM } from './vec.ts';

/** UTC label seconds (since 1970-01-01) of 2000-01-01T12:00:00, the J2000 point of the GMST formula. */
const J2000_UTC_LABEL_S = daysFromCivil(2000, 1, 1) * 86400 + 43200;

/**
 * GMST [rad] at seconds since J2000.0 TT, with UTC from the leap-second table standing in for UT1.
 * This is the rotation the SP3 reader uses; fixture writers should use the same one.
 */
export function gmstRadAtTt(time: TimeSystem, ttJ2000S: number): number {
  const t = Instant.fromTtJ2000S(ttJ2000S);
  const { utcWholeS } = time.leap.taiToUtcLabel(t.taiWholeS);
  return gmstRadFromUtcJ2000S(utcWholeS - J2000_UTC_LABEL_S, t.taiFracS);
}

/** Options of {@link Sp3Trajectory}. */
export interface Sp3TrajectoryOptions {
  /** Polynomial order; the window has order + 1 epochs. Default 9. Must be 3–15. */
  order?: number;
  /**
   * `records`: interpolate the `V` records; `derivative`: differentiate the position polynomial;
   * `auto` (default): records when the satellite has any, else the derivative.
   */
  velocitySource?: 'auto' | 'records' | 'derivative';
  /** GMST [rad] at a ttJ2000S; default {@link gmstRadAtTt} with the given TimeSystem. */
  gmstRadAt?: (ttJ2000S: number) => number;
}

interface Node {
  ttJ2000S: number;
  /** Why the node cannot be used, or null. */
  bad: string | null;
  /** Set when an `M` flag says a maneuver took place between the previous node and this one. */
  maneuverLine: number | null;
}

/**
 * One satellite of an SP3 file as a {@link Trajectory}: TEME, metres and m/s, seconds since
 * J2000.0 TT. Valid from the satellite's first to its last epoch with a usable position.
 */
export class Sp3Trajectory implements Trajectory {
  readonly frame = 'TEME' as const;
  readonly sourceLabel: string;
  readonly epochTtJ2000S = null;
  readonly validFromTtJ2000S: number;
  readonly validToTtJ2000S: number;
  /** Polynomial order in use. */
  readonly order: number;
  /** Whether velocities come from the `V` records (else from the polynomial's derivative). */
  readonly velocityFromRecords: boolean;
  private readonly nodes: Node[];
  private readonly times: Float64Array;
  private readonly posM: Float64Array;
  private readonly velM: Float64Array;
  private readonly first: number;
  private readonly last: number;
  private readonly gmstAt: (ttJ2000S: number) => number;
  private readonly w = new Float64Array(16);
  private readonly dw = new Float64Array(16);

  /**
   * @param file        parsed SP3 file
   * @param id          satellite id as in the `+` list (e.g. `G05`)
   * @param time        time system for the file's epochs and for Earth rotation (UTC ≈ UT1)
   */
  constructor(
    readonly file: Sp3File,
    readonly id: string,
    private readonly time: TimeSystem,
    options: Sp3TrajectoryOptions = {},
  ) {
    const order = options.order ?? 9;
    if (!Number.isInteger(order) || order < 3 || order > 15) throw new InputError(`interpolation order ${order} is not a whole number 3–15`, 'sp3 order', 'use 9 (10-point Lagrange), the usual choice for 15-min SP3');
    this.order = order;
    if (!file.satelliteIds.includes(id)) {
      throw new InputError(`satellite ${id} is not in the SP3 file`, file.fileName, `use one of ${file.satelliteIds.join(', ')}`);
    }
    this.gmstAt = options.gmstRadAt ?? ((t: number) => gmstRadAtTt(time, t));
    const anyV = file.epochs.some((e) => e.records.get(id)?.velocity?.velocityDmPerS != null);
    const source = options.velocitySource ?? 'auto';
    if (source === 'records' && !anyV) throw new InputError(`satellite ${id} has no V (velocity) records`, file.fileName, 'use velocitySource "derivative" or a file with V records');
    this.velocityFromRecords = source === 'records' || (source === 'auto' && anyV);
    this.sourceLabel = `SP3-${file.version} precise ephemeris (${file.fileName}, ${id}, ${order + 1}-point Lagrange, velocity from ${this.velocityFromRecords ? 'V records' : 'position derivative'})`;

    // A regular grid: epochs left out of the file become missing nodes.
    const nodes: Node[] = [];
    const pos: number[] = [];
    const vel: number[] = [];
    file.epochs.forEach((ep, k) => {
      const inst = file.timeScale === 'UTC' ? time.fromUtc(ep.scaleCivil, `${file.fileName}:${ep.line}`) : time.fromScale(file.timeScale, ep.scaleCivil, `${file.fileName}:${ep.line}`);
      const t = inst.ttJ2000S;
      if (k > 0) {
        const prev = file.epochs[k - 1];
        const stepS = ep.labelWholeS - prev.labelWholeS + (ep.labelFracS - prev.labelFracS);
        const skipped = Math.round(stepS / file.intervalS) - 1;
        for (let j = 1; j <= skipped; j++) {
          nodes.push({ ttJ2000S: t - (skipped + 1 - j) * file.intervalS, bad: `absent from the file (no epoch between lines ${prev.line} and ${ep.line})`, maneuverLine: null });
          pos.push(0, 0, 0);
          vel.push(0, 0, 0);
        }
      }
      const rec = ep.records.get(id);
      let bad: string | null = null;
      if (rec === undefined) bad = `absent from the epoch at line ${ep.line} (no P record)`;
      else if (rec.positionKm === null) bad = `marked bad (position 0,0,0 at line ${rec.line})`;
      else if (this.velocityFromRecords && (rec.velocity === null || rec.velocity.velocityDmPerS === null)) {
        bad = `without a usable V record (P record at line ${rec.line})`;
      }
      const p = rec?.positionKm ?? [0, 0, 0];
      const v = rec?.velocity?.velocityDmPerS ?? [0, 0, 0];
      pos.push(p[0] * 1000, p[1] * 1000, p[2] * 1000);
      vel.push(v[0] * 0.1, v[1] * 0.1, v[2] * 0.1);
      nodes.push({ ttJ2000S: t, bad, maneuverLine: rec?.maneuver === true ? rec.line : null });
    });
    this.nodes = nodes;
    this.times = Float64Array.from(nodes, (n) => n.ttJ2000S);
    this.posM = Float64Array.from(pos);
    this.velM = Float64Array.from(vel);
    const first = nodes.findIndex((n) => n.bad === null);
    let last = nodes.length - 1;
    while (last >= 0 && nodes[last].bad !== null) last--;
    if (first < 0 || last - first < order) {
      throw new InputError(
        `satellite ${id} has ${first < 0 ? 0 : last - first + 1} epochs from its first to its last usable record; ${order + 1}-point interpolation needs ${order + 1}`,
        file.fileName,
        'use a longer SP3 file, or a lower interpolation order',
      );
    }
    // A maneuver flagged on the first usable node refers to time before the span: harmless.
    if (nodes[first].maneuverLine !== null) nodes[first] = { ...nodes[first], maneuverLine: null };
    this.first = first;
    this.last = last;
    this.validFromTtJ2000S = nodes[first].ttJ2000S;
    this.validToTtJ2000S = nodes[last].ttJ2000S;
  }

  /** ISO UTC text of a ttJ2000S, for messages. */
  formatTime(ttJ2000S: number): string {
    return this.time.format(Instant.fromTtJ2000S(ttJ2000S));
  }

  /** State in TEME [m, m/s]. Throws SpanError outside the span or where the window meets a gap or maneuver. */
  stateAt(ttJ2000S: number): StateM<'TEME'> {
    const out = new Float64Array(6);
    this.evaluate(ttJ2000S, out, 0);
    return { ttJ2000S, positionM: vec3<'TEME'>(out[0], out[1], out[2]), velocityMPerS: vec3<'TEME'>(out[3], out[4], out[5]) };
  }

  sampleInto(ttJ2000S: Float64Array, out: StateBlock): void {
    const tmp = new Float64Array(6);
    for (let i = 0; i < ttJ2000S.length; i++) {
      this.evaluate(ttJ2000S[i], tmp, 0);
      out.positionM.set(tmp.subarray(0, 3), 3 * i);
      out.velocityMPerS.set(tmp.subarray(3, 6), 3 * i);
    }
  }

  /** Index of the first node of the window used for interval k (nodes k, k+1 bracket the request). */
  private windowStart(k: number): number {
    const n = this.order + 1;
    const s = k - Math.floor((n - 1) / 2);
    return Math.min(Math.max(s, this.first), this.last - n + 1);
  }

  /** Interval index k with times[k] ≤ t < times[k+1], within [first, last − 1]. */
  private intervalOf(t: number): number {
    let lo = this.first;
    let hi = this.last - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (this.times[mid] <= t) lo = mid;
      else hi = mid - 1;
    }
    return lo;
  }

  /** The first node in window [s, s+n) that blocks interpolation, or −1. */
  private blocker(s: number): number {
    const n = this.order + 1;
    for (let j = s; j < s + n; j++) {
      if (this.nodes[j].bad !== null) return j;
      if (j > s && this.nodes[j].maneuverLine !== null) return j;
    }
    return -1;
  }

  private refuse(t: number, b: number): never {
    const node = this.nodes[b];
    const isGap = node.bad !== null;
    // The run of intervals whose windows meet the same blocker.
    let kMin = Number.POSITIVE_INFINITY;
    let kMax = Number.NEGATIVE_INFINITY;
    const n = this.order + 1;
    for (let k = Math.max(this.first, b - 2 * n); k <= Math.min(this.last - 1, b + 2 * n); k++) {
      const s = this.windowStart(k);
      const hits = isGap ? s <= b && b < s + n : s < b && b < s + n;
      if (hits) {
        kMin = Math.min(kMin, k);
        kMax = Math.max(kMax, k);
      }
    }
    const from = this.formatTime(this.times[kMin]);
    const to = this.formatTime(this.times[kMax + 1]);
    const cause = isGap
      ? `the epoch ${this.formatTime(node.ttJ2000S)} is ${node.bad}`
      : `an M flag (${this.file.fileName}:${node.maneuverLine}) says ${this.id} maneuvered between ${this.formatTime(this.times[b - 1])} and ${this.formatTime(node.ttJ2000S)}`;
    throw new SpanError(
      `SP3 satellite ${this.id} cannot be interpolated at ${this.formatTime(t)}: ${cause}; the ${n}-point windows for ${from} to ${to} would use it`,
      `${this.id} in ${this.file.fileName}`,
      this.formatTime(this.validFromTtJ2000S),
      this.formatTime(this.validToTtJ2000S),
      isGap
        ? `ask for times outside ${from} to ${to}, or use a file without the gap (a neighbouring day's or a combined product)`
        : `split the window at the maneuver and ask for times outside ${from} to ${to}`,
    );
  }

  /** Writes x y z [m] and vx vy vz [m/s] (TEME) at out[o..o+5]. */
  private evaluate(t: number, out: Float64Array, o: number): void {
    checkSpan(this, t, (x) => this.formatTime(x));
    const n = this.order + 1;
    const k = this.intervalOf(t);
    const s = this.windowStart(k);
    const b = this.blocker(s);
    if (b >= 0) this.refuse(t, b);
    // Lagrange basis and its derivative on a scaled abscissa (unit = nominal interval) for conditioning.
    const h = this.file.intervalS;
    const ts = this.times;
    const x = (t - ts[s]) / h;
    const w = this.w;
    const dw = this.dw;
    for (let j = 0; j < n; j++) {
      const xj = (ts[s + j] - ts[s]) / h;
      let num = 1;
      let den = 1;
      let dnum = 0;
      for (let m = 0; m < n; m++) {
        if (m === j) continue;
        const xm = (ts[s + m] - ts[s]) / h;
        den *= xj - xm;
        // d/dx Π(x − xm): product rule, accumulated alongside the product.
        dnum = dnum * (x - xm) + num;
        num *= x - xm;
      }
      w[j] = num / den;
      dw[j] = dnum / den / h;
    }
    const p = this.posM;
    const vr = this.velM;
    let rx = 0;
    let ry = 0;
    let rz = 0;
    let vx = 0;
    let vy = 0;
    let vz = 0;
    for (let j = 0; j < n; j++) {
      const q = 3 * (s + j);
      rx += w[j] * p[q];
      ry += w[j] * p[q + 1];
      rz += w[j] * p[q + 2];
      if (this.velocityFromRecords) {
        vx += w[j] * vr[q];
        vy += w[j] * vr[q + 1];
        vz += w[j] * vr[q + 2];
      } else {
        vx += dw[j] * p[q];
        vy += dw[j] * p[q + 1];
        vz += dw[j] * p[q + 2];
      }
    }
    const gmst = this.gmstAt(t);
    const st = ecefToTeme(vec3<'ECEF'>(rx, ry, rz), vec3<'ECEF'>(vx, vy, vz), gmst);
    out[o] = st.r[0];
    out[o + 1] = st.r[1];
    out[o + 2] = st.r[2];
    out[o + 3] = st.v[0];
    out[o + 4] = st.v[1];
    out[o + 5] = st.v[2];
  }
}
