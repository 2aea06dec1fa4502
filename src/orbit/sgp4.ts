/**
 * SGP4/SDP4 through satellite.js 7 — the only module that imports it. Its types and error codes
 * stop here: outside, an element set is a {@link Trajectory} in TEME, metres and m/s, and a failure
 * is a {@link PropagationError} naming the satellite and the UTC time.
 *
 * Theory: Vallado, Crawford, Hujsak & Kelso (2006), "Revisiting Spacetrack Report #3",
 * AIAA 2006-6753, with its WGS-72 constants (kept inside SGP4; the rest of tauplan uses WGS-84).
 * Output frame: TEME of date. Time: the element-set epoch is UTC; minutes since epoch are
 * computed from elapsed SI seconds, `(ttJ2000S − epochTtJ2000S) / 60`, so a leap second between
 * epoch and the requested time is counted as the second it is.
 *
 * Two paths:
 * - {@link Sgp4Trajectory} (synchronous): plain `sgp4()` per instant, for `stateAt` and `sampleInto`.
 *   It feeds SGP4 the exact minutes since epoch, so it reproduces the reference to rounding.
 * - {@link createBulkSgp4} (asynchronous): satellite.js's WASM `BulkPropagator`, whose input is
 *   `Date` objects (whole milliseconds, then a Julian-date double with ~40 µs steps). The adapter
 *   picks for each instant the Date nearest the exact time and corrects the state over the
 *   remaining ≤ 0.52 ms with a Taylor step (SGP4 velocity and two-body acceleration). Measured
 *   against the exact path: ≤ 0.61 mm and ≤ 1e-5 m/s (00005, e = 0.19; SGP4's velocity is not
 *   exactly the derivative of its position, which limits the step). Measured speed on Node 20 for
 *   one satellite × 1e5 instants: about the same as the JS loop (86 ms vs 79 ms), so
 *   `Sgp4Trajectory#sampleInto` keeps the exact JS loop, except for deep-space resonant orbits
 *   once {@link enableWasmSgp4} has run: there the JS port re-integrates the resonance terms from
 *   the epoch at every call (it does not keep them in the record), and WASM is ~20× faster.
 */
import {
  BulkPropagator,
  constants as sgp4Constants,
  createSingleThreadRuntime,
  EciBaseCalculator,
  jday,
  json2satrec,
  SatRecError,
  sgp4,
  twoline2satrec,
  type OMMJsonObject,
  type SatRec,
} from 'satellite.js';
import { PropagationError } from '../errors.ts';
import type { OmmRecord, TleRecord } from '../model/elementSet.ts';
import { Instant } from '../time/instant.ts';
import type { TimeSystem } from '../time/timeSystem.ts';
import { countStates } from './stateCount.ts';
import { rateCovers, rateRecordOf, sgp4WithRate, SGP4_OK, type Sgp4Constants, type Sgp4RateRecord, type Sgp4RecordFields } from './sgp4Rate.ts';
import { checkSpan, type StateBlock, type Trajectory } from './trajectory.ts';
import { vec3, type StateM } from './vec.ts';

/** Default validity half-span around the element-set epoch [s]: 30 days. */
export const SGP4_DEFAULT_HALF_SPAN_S = 30 * 86400;

/** An element set SGP4 can propagate. */
export type Sgp4ElementSet = TleRecord | OmmRecord;

/** Options for {@link Sgp4Trajectory}. */
export interface Sgp4Options {
  /** Satellite id used in messages and reports; default the catalogue number (TLE) or NORAD_CAT_ID / OBJECT_ID (OMM). */
  id?: string;
  /**
   * Validity span [s since J2000.0 TT]. Default: epoch ± 30 days. An SGP4 element set degrades by
   * about 1–3 km per day from its epoch, and drag makes long extrapolations meaningless; a month
   * either side covers a planning window without silently using a stale set for a season.
   */
  span?: { fromTtJ2000S: number; toTtJ2000S: number };
  /** The span as a function of the element-set epoch (one SGP4 initialisation instead of a probe). */
  spanFor?: (epochTtJ2000S: number) => { fromTtJ2000S: number; toTtJ2000S: number };
  /**
   * Velocity of `stateAt` and `sampleInto`: `derivative` (default) is the time derivative of SGP4's
   * position (carried through SGP4's arithmetic by sgp4Rate.ts; for deep-space resonant records a
   * five-point stencil over ±{@link DERIVATIVE_STEP_S}, ±2×), the velocity the satellite
   * really has along the positions SGP4 gives; `sgp4` is SGP4's own velocity output, which is not
   * that derivative (measured on invented 2027 element sets: ≤ 31 mm/s LEO, 17–21 mm/s MEO,
   * 76 mm/s GEO, 1.4 m/s Molniya; mean rate over a day shifted by −1.6e-15 LEO, +4e-17 GPS-like,
   * +1.4e-16 Galileo-like, −2.5e-15 GEO, +2e-16 Molniya). `stateAtMinutesSinceEpoch` always
   * returns SGP4's own output, for checks against published SGP4 runs.
   */
  velocity?: 'derivative' | 'sgp4';
}

/**
 * Step of the five-point derivative stencil (f(−2h) − 8f(−h) + 8f(h) − f(2h))/(12h) [s]. Truncation
 * (hω)⁴/30: below 1e-14 relative even in LEO. SGP4's positions carry ~1e-12 relative noise (its
 * Kepler-equation tolerance), which a shorter step would amplify (a ±0.05 s central difference
 * showed 2 mm/s); with h = 0.5 s the noise is ~3e-5 m/s per state and averages out.
 */
export const DERIVATIVE_STEP_S = 0.5;
/** Offsets (in h) and weights of the five-point stencil. */
const STENCIL: readonly (readonly [number, number])[] = [
  [-2, 1],
  [-1, -8],
  [1, 8],
  [2, -1],
];
/** The stencil step on the WASM path, whose instants are whole milliseconds (resonant 12-h and 24-h orbits only). */
const WASM_DERIVATIVE_STEP_MS = 1000;

/** Weights of the derivative at 0 of the cubic through values at x[0..3] (none at 0). */
function derivativeWeightsAtZero(x: readonly number[], out: Float64Array): void {
  for (let j = 0; j < 4; j++) {
    let sum = 0;
    for (let m = 0; m < 4; m++) {
      if (m === j) continue;
      let prod = 1 / (x[j] - x[m]);
      for (let l = 0; l < 4; l++) if (l !== j && l !== m) prod *= (0 - x[l]) / (x[j] - x[l]);
      sum += prod;
    }
    out[j] = sum;
  }
}

/** SGP4 mean elements at epoch, for reports. Un-Kozai'd (Brouwer) mean motion and the semi-major axis from it. */
export interface Sgp4MeanElementsSummary {
  /** Semi-major axis [km] (WGS-72 earth radius 6378.135 km). */
  semiMajorAxisKm: number;
  /** Eccentricity [1]. */
  eccentricity: number;
  /** Inclination [deg]. */
  inclinationDeg: number;
  /** Right ascension of the ascending node [deg], TEME. */
  raanDeg: number;
  /** Argument of perigee [deg]. */
  argOfPerigeeDeg: number;
  /** Mean anomaly [deg]. */
  meanAnomalyDeg: number;
  /** Mean motion [rev/day] (un-Kozai'd, as SGP4 uses internally). */
  meanMotionRevPerDay: number;
  /** Anomalistic period [min]. */
  periodMin: number;
  /** Perigee altitude above the WGS-72 equatorial radius [km]. */
  perigeeAltitudeKm: number;
  /** Apogee altitude above the WGS-72 equatorial radius [km]. */
  apogeeAltitudeKm: number;
  /** B* [1/earth radii]. */
  bstarPerEarthRadius: number;
  /** True when SGP4 uses its deep-space (SDP4) branch: period ≥ 225 min. */
  deepSpace: boolean;
}

/** SGP4's WGS-72 constants for the differentiated propagation (sgp4Rate.ts). */
const RATE_CONSTANTS: Sgp4Constants = { xke: sgp4Constants.xke, x2o3: sgp4Constants.x2o3, j2: sgp4Constants.j2, j3oj2: sgp4Constants.j3oj2, earthRadius: sgp4Constants.earthRadius };
/** Scratch for one differentiated state: position [km] and its derivative [km/s]. */
const rateOut = new Float64Array(6);

/** satellite.js records, kept out of the public surface. */
const satrecOf = new WeakMap<Sgp4Trajectory, SatRec>();


const RAD_TO_DEG = 180 / Math.PI;

/** An SGP4 trajectory in TEME from one element set (TLE or OMM). */
export class Sgp4Trajectory implements Trajectory {
  readonly id: string;
  /** The name line (TLE) or OBJECT_NAME (OMM), or null. */
  readonly name: string | null;
  readonly frame = 'TEME' as const;
  readonly validFromTtJ2000S: number;
  readonly validToTtJ2000S: number;
  readonly sourceLabel: string;
  /** Element-set epoch [s since J2000.0 TT] (the UTC epoch converted with the leap-second table). */
  readonly epochTtJ2000S: number;
  /** The element set this trajectory was built from. */
  readonly elements: Sgp4ElementSet;
  private readonly timeSystem: TimeSystem;
  /** Whether states carry the derivative of SGP4's position (default) or SGP4's velocity. */
  readonly derivativeVelocity: boolean;
  /** The compact record sgp4Rate.ts reads (null for resonant records: the stencil path). */
  #rate: Sgp4RateRecord | null;
  /** formatUtc bound once: span checks run per state and must not allocate a closure each time. */
  readonly #formatUtc = (t: number): string => this.formatUtc(t);

  constructor(elements: Sgp4ElementSet, timeSystem: TimeSystem, options: Sgp4Options = {}) {
    this.elements = elements;
    this.derivativeVelocity = (options.velocity ?? 'derivative') === 'derivative';
    this.timeSystem = timeSystem;
    let satrec: SatRec;
    let where: string;
    if (elements.kind === 'tle') {
      this.id = options.id ?? elements.catalogNumber;
      this.name = elements.name;
      this.sourceLabel = 'SGP4 (TLE)';
      where = `${elements.fileName}:${elements.lineNumberInFile}`;
      satrec = twoline2satrec(elements.line1, elements.line2);
    } else {
      this.id = options.id ?? elements.noradCatId ?? elements.objectId ?? 'OMM';
      this.name = elements.objectName;
      this.sourceLabel = 'SGP4 (OMM)';
      where = elements.where;
      satrec = json2satrec(ommJsonFor(elements));
    }
    this.epochTtJ2000S = timeSystem.fromUtc(elements.epochUtc, where).ttJ2000S;
    const span = options.span ?? options.spanFor?.(this.epochTtJ2000S);
    this.validFromTtJ2000S = span?.fromTtJ2000S ?? this.epochTtJ2000S - SGP4_DEFAULT_HALF_SPAN_S;
    this.validToTtJ2000S = span?.toTtJ2000S ?? this.epochTtJ2000S + SGP4_DEFAULT_HALF_SPAN_S;
    // sgp4init already propagated to t = 0; an error there means the element set itself is unusable.
    if (satrec.error !== SatRecError.None) throw this.propagationError(satrec.error, this.epochTtJ2000S);
    satrecOf.set(this, satrec);
    this.#rate = rateCovers(satrec as unknown as Sgp4RecordFields) ? rateRecordOf(satrec as unknown as Sgp4RecordFields, RATE_CONSTANTS) : null;
  }

  /** State at `ttJ2000S` [s since J2000.0 TT], TEME, metres and m/s. Throws SpanError outside the span. */
  stateAt(ttJ2000S: number): StateM<'TEME'> {
    checkSpan(this, ttJ2000S, this.#formatUtc);
    if (this.derivativeVelocity && this.#rate !== null) {
      this.differentiated(ttJ2000S);
      countStates(1, 1);
      const o = rateOut;
      return { ttJ2000S, positionM: vec3<'TEME'>(o[0] * 1000, o[1] * 1000, o[2] * 1000), velocityMPerS: vec3<'TEME'>(o[3] * 1000, o[4] * 1000, o[5] * 1000) };
    }
    const s = this.stateAtMinutesSinceEpoch((ttJ2000S - this.epochTtJ2000S) / 60, ttJ2000S);
    countStates(1, this.derivativeVelocity ? 5 : 1);
    if (!this.derivativeVelocity) return s;
    const h = DERIVATIVE_STEP_S;
    const m = (dt: number): number => (ttJ2000S + dt - this.epochTtJ2000S) / 60;
    const a = this.propagateKm(m(-2 * h), ttJ2000S).position;
    const b = this.propagateKm(m(-h), ttJ2000S).position;
    const c = this.propagateKm(m(h), ttJ2000S).position;
    const d = this.propagateKm(m(2 * h), ttJ2000S).position;
    const k = 1000 / (12 * h);
    return { ...s, velocityMPerS: vec3<'TEME'>((a.x - 8 * b.x + 8 * c.x - d.x) * k, (a.y - 8 * b.y + 8 * c.y - d.y) * k, (a.z - 8 * b.z + 8 * c.z - d.z) * k) };
  }

  /** State at `ttJ2000S` into out[0..5] (TEME, m and m/s): the numbers `stateAt` gives, with no allocation. */
  stateInto(ttJ2000S: number, out: Float64Array): void {
    if (!(this.derivativeVelocity && this.#rate !== null)) {
      const s = this.stateAt(ttJ2000S);
      for (let k = 0; k < 3; k++) {
        out[k] = s.positionM[k];
        out[3 + k] = s.velocityMPerS[k];
      }
      return;
    }
    checkSpan(this, ttJ2000S, this.#formatUtc);
    this.differentiated(ttJ2000S);
    countStates(1, 1);
    for (let k = 0; k < 6; k++) out[k] = rateOut[k] * 1000;
  }

  /** Position [m, TEME] at `ttJ2000S` into out[0..2]: one SGP4 call, the position `stateAt` gives. */
  positionInto(ttJ2000S: number, out: Float64Array): void {
    checkSpan(this, ttJ2000S, this.#formatUtc);
    if (this.#rate !== null) {
      // The differentiated pass gives the same position bits as satellite.js's sgp4, in less time.
      this.differentiated(ttJ2000S);
      countStates(1, 1);
      out[0] = rateOut[0] * 1000;
      out[1] = rateOut[1] * 1000;
      out[2] = rateOut[2] * 1000;
      return;
    }
    const p = this.propagateKm((ttJ2000S - this.epochTtJ2000S) / 60, ttJ2000S).position;
    countStates(1, 1);
    out[0] = p.x * 1000;
    out[1] = p.y * 1000;
    out[2] = p.z * 1000;
  }

  /**
   * State at a time given as minutes since the element-set epoch, as SGP4 and the verification
   * tables count it. No span check: for verification against published runs.
   * @param ttJ2000S the same instant, when the caller has it (default epoch + 60·minutes)
   */
  stateAtMinutesSinceEpoch(minutesSinceEpoch: number, ttJ2000S = this.epochTtJ2000S + 60 * minutesSinceEpoch): StateM<'TEME'> {
    const pv = this.propagateKm(minutesSinceEpoch, ttJ2000S);
    const p = pv.position;
    const v = pv.velocity;
    return {
      ttJ2000S,
      positionM: vec3<'TEME'>(p.x * 1000, p.y * 1000, p.z * 1000),
      velocityMPerS: vec3<'TEME'>(v.x * 1000, v.y * 1000, v.z * 1000),
    };
  }

  /** States at many instants, by a plain `sgp4()` loop (exact minutes since epoch, no allocation of states). */
  sampleInto(ttJ2000S: Float64Array, out: StateBlock): void {
    const n = ttJ2000S.length;
    if (n === 0) return;
    // One span check for the whole batch (its extremes), one record lookup: the loop is SGP4 only.
    let lo = ttJ2000S[0];
    let hi = ttJ2000S[0];
    for (let i = 1; i < n; i++) {
      const t = ttJ2000S[i];
      if (t < lo) lo = t;
      else if (t > hi) hi = t;
    }
    const fmt = (t: number): string => this.formatUtc(t);
    checkSpan(this, lo, fmt);
    checkSpan(this, hi, fmt);
    const satrec = satrecOf.get(this) as SatRec;
    const wasm = wasmFor(satrec, n);
    const epoch = this.epochTtJ2000S;
    const pOut = out.positionM;
    const vOut = out.velocityMPerS;
    if (wasm === null && this.derivativeVelocity && this.#rate !== null) {
      countStates(n, n);
      const o = rateOut;
      for (let i = 0; i < n; i++) {
        this.differentiated(ttJ2000S[i]);
        pOut[3 * i] = o[0] * 1000;
        pOut[3 * i + 1] = o[1] * 1000;
        pOut[3 * i + 2] = o[2] * 1000;
        vOut[3 * i] = o[3] * 1000;
        vOut[3 * i + 1] = o[4] * 1000;
        vOut[3 * i + 2] = o[5] * 1000;
      }
      return;
    }
    countStates(n, this.derivativeVelocity ? 5 * n : n);
    if (wasm !== null) {
      bulkSampleInto(this, satrec, wasm, ttJ2000S, out);
      return;
    }
    for (let i = 0; i < n; i++) {
      const t = ttJ2000S[i];
      const pv = sgp4(satrec, (t - epoch) / 60);
      if (pv === null || satrec.error !== SatRecError.None) throw this.propagationError(satrec.error, t);
      const p = pv.position;
      const v = pv.velocity;
      const x = p.x * 1000;
      const y = p.y * 1000;
      const z = p.z * 1000;
      if (!(Math.abs(x) + Math.abs(y) + Math.abs(z) < Infinity)) throw this.propagationError(-1, t);
      pOut[3 * i] = x;
      pOut[3 * i + 1] = y;
      pOut[3 * i + 2] = z;
      if (this.derivativeVelocity) {
        const h = DERIVATIVE_STEP_S;
        const k = 1000 / (12 * h);
        vOut[3 * i] = 0;
        vOut[3 * i + 1] = 0;
        vOut[3 * i + 2] = 0;
        for (const [dt, w] of STENCIL) {
          const q = sgp4(satrec, (t + dt * h - epoch) / 60);
          if (q === null || satrec.error !== SatRecError.None) throw this.propagationError(satrec.error, t);
          vOut[3 * i] += w * q.position.x * k;
          vOut[3 * i + 1] += w * q.position.y * k;
          vOut[3 * i + 2] += w * q.position.z * k;
        }
      } else {
        vOut[3 * i] = v.x * 1000;
        vOut[3 * i + 1] = v.y * 1000;
        vOut[3 * i + 2] = v.z * 1000;
      }
    }
  }

  /** Mean elements at epoch from the initialised SGP4 record, for reports. */
  meanElementsSummary(): Sgp4MeanElementsSummary {
    const s = satrecOf.get(this) as SatRec;
    const reKm = sgp4Constants.earthRadius;
    const aKm = s.a * reKm;
    return {
      semiMajorAxisKm: aKm,
      eccentricity: s.ecco,
      inclinationDeg: s.inclo * RAD_TO_DEG,
      raanDeg: s.nodeo * RAD_TO_DEG,
      argOfPerigeeDeg: s.argpo * RAD_TO_DEG,
      meanAnomalyDeg: s.mo * RAD_TO_DEG,
      meanMotionRevPerDay: (s.no * 1440) / (2 * Math.PI),
      periodMin: (2 * Math.PI) / s.no,
      perigeeAltitudeKm: aKm * (1 - s.ecco) - reKm,
      apogeeAltitudeKm: aKm * (1 + s.ecco) - reKm,
      bstarPerEarthRadius: s.bstar,
      deepSpace: s.method === 'd',
    };
  }

  /** UTC text of an instant, for messages. */
  formatUtc(ttJ2000S: number): string {
    return this.timeSystem.format(Instant.fromTtJ2000S(ttJ2000S));
  }

  private propagateKm(minutesSinceEpoch: number, ttJ2000S: number): { position: { x: number; y: number; z: number }; velocity: { x: number; y: number; z: number } } {
    const satrec = satrecOf.get(this) as SatRec;
    const pv = sgp4(satrec, minutesSinceEpoch);
    if (pv === null || satrec.error !== SatRecError.None) throw this.propagationError(satrec.error, ttJ2000S);
    const p = pv.position;
    if (!Number.isFinite(p.x) || !Number.isFinite(p.y) || !Number.isFinite(p.z)) throw this.propagationError(-1, ttJ2000S);
    return pv;
  }

  /** Position [km] and its time derivative [km/s] at t into {@link rateOut} (sgp4Rate.ts), errors as stateAt's. */
  private differentiated(ttJ2000S: number): void {
    const code = sgp4WithRate(this.#rate as Sgp4RateRecord, (ttJ2000S - this.epochTtJ2000S) / 60, RATE_CONSTANTS, rateOut);
    if (code !== SGP4_OK) throw this.propagationError(code, ttJ2000S);
    const o = rateOut;
    if (!(Math.abs(o[0]) + Math.abs(o[1]) + Math.abs(o[2]) + Math.abs(o[3]) + Math.abs(o[4]) + Math.abs(o[5]) < Infinity)) throw this.propagationError(-1, ttJ2000S);
  }

  /** @internal used by the bulk path. */
  propagationError(code: number, ttJ2000S: number): PropagationError {
    return sgp4Failure(this.id, this.formatUtc(ttJ2000S), code);
  }
}

/** Turn a satellite.js error code into our typed error. */
function sgp4Failure(satelliteId: string, atUtc: string, code: number): PropagationError {
  const stale = 'use a newer element set, or keep the window closer to the element-set epoch';
  switch (code) {
    case SatRecError.MeanEccentricityOutOfRange:
      return new PropagationError(`SGP4 failed: mean eccentricity left 0 ≤ e < 1`, satelliteId, atUtc, 'MeanEccentricityOutOfRange', stale);
    case SatRecError.MeanMotionBelowZero:
      return new PropagationError(`SGP4 failed: mean motion fell below zero`, satelliteId, atUtc, 'MeanMotionBelowZero', stale);
    case SatRecError.PerturbedEccentricityOutOfRange:
      return new PropagationError(`SGP4 failed: perturbed eccentricity left 0 ≤ e < 1`, satelliteId, atUtc, 'PerturbedEccentricityOutOfRange', stale);
    case SatRecError.SemiLatusRectumBelowZero:
      return new PropagationError(`SGP4 failed: semi-latus rectum fell below zero`, satelliteId, atUtc, 'SemiLatusRectumBelowZero', stale);
    case SatRecError.Decayed:
      return new PropagationError('SGP4 reports the satellite decayed (position below the Earth\'s surface)', satelliteId, atUtc, 'Decayed', 'end the window before the decay, or use a newer element set');
    default:
      return new PropagationError(`SGP4 failed with code ${code}`, satelliteId, atUtc, `Sgp4Error${code}`, stale);
  }
}

/** The JSON object json2satrec expects, from a parsed OMM (whatever its encoding was). */
function ommJsonFor(r: OmmRecord): OMMJsonObject {
  const c = r.epochUtc;
  const pad = (n: number, w = 2): string => String(n).padStart(w, '0');
  // json2satrec reads EPOCH through Date (whole ms). That epoch only seeds the deep-space
  // lunar-solar terms; minutes since epoch come from our exact epoch, so nothing else depends on it.
  const sec = Math.floor(c.second);
  const ms = Math.min(999, Math.floor((c.second - sec) * 1000));
  const epoch = `${pad(c.year, 4)}-${pad(c.month)}-${pad(c.day)}T${pad(c.hour)}:${pad(c.minute)}:${pad(sec)}.${pad(ms, 3)}Z`;
  return {
    OBJECT_NAME: r.objectName ?? '',
    OBJECT_ID: r.objectId ?? '',
    EPOCH: epoch,
    MEAN_MOTION: r.meanMotionRevPerDay,
    ECCENTRICITY: r.eccentricity,
    INCLINATION: r.inclinationDeg,
    RA_OF_ASC_NODE: r.raanDeg,
    ARG_OF_PERICENTER: r.argOfPericenterDeg,
    MEAN_ANOMALY: r.meanAnomalyDeg,
    NORAD_CAT_ID: r.noradCatId ?? r.objectId ?? '0',
    ELEMENT_SET_NO: r.elementSetNo ?? 0,
    BSTAR: r.bstarPerEarthRadius,
    MEAN_MOTION_DOT: r.meanMotionDotRevPerDay2,
    MEAN_MOTION_DDOT: r.meanMotionDdotRevPerDay3,
  };
}

/** Many SGP4 trajectories propagated through the WASM bulk propagator. Call `dispose()` when done. */
export interface BulkSgp4 {
  /** The trajectories, in the order given. */
  readonly trajectories: readonly Sgp4Trajectory[];
  /** Which engine runs: always 'wasm' (createBulkSgp4 rejects when the WASM module cannot load). */
  readonly engine: 'wasm';
  /**
   * States of trajectory `index` at the instants [s since J2000.0 TT] into `out` (TEME, m, m/s).
   * Same contract as Trajectory#sampleInto, including SpanError and PropagationError.
   */
  sampleInto(index: number, ttJ2000S: Float64Array, out: StateBlock): void;
  /** Release the WASM memory of the propagator. */
  dispose(): void;
}

let runtimePromise: ReturnType<typeof createSingleThreadRuntime> | null = null;
type EciPropagator = BulkPropagator<readonly [EciBaseCalculator], Awaited<ReturnType<typeof createSingleThreadRuntime>>>;
/** The process-wide WASM propagator once {@link enableWasmSgp4} has run, else null. */
let sharedPropagator: EciPropagator | null = null;

async function newPropagator(): Promise<EciPropagator> {
  runtimePromise ??= createSingleThreadRuntime();
  const runtime = await runtimePromise;
  return new BulkPropagator({ runtime, calculators: [new EciBaseCalculator()] as const, satRecsCount: 1, datesCount: 1 });
}

/**
 * Load satellite.js's WASM SGP4 once per process (the CLI does this at start). Afterwards
 * {@link Sgp4Trajectory#sampleInto} uses it for deep-space resonant orbits (12-h and 24-h periods):
 * the JavaScript SGP4 re-integrates their resonance terms from the epoch at every call, the WASM
 * one carries them from date to date, which is about 20 times faster three months from epoch.
 * Returns false (and changes nothing) when WASM cannot load.
 */
export async function enableWasmSgp4(): Promise<boolean> {
  if (sharedPropagator !== null) return true;
  try {
    sharedPropagator = await newPropagator();
    return true;
  } catch {
    return false;
  }
}

/**
 * States through the WASM propagator, with the sub-millisecond time residual corrected. With the
 * derivative velocity, each instant also gets the dates ±1 s and ±2 s (whole milliseconds): the
 * velocity is the derivative of the cubic through them at the minutes SGP4 actually used, and it
 * drives the residual step too.
 */
function bulkSampleInto(traj: Sgp4Trajectory, satrec: SatRec, propagator: EciPropagator, ttJ2000S: Float64Array, out: StateBlock): void {
  const gmKm3PerS2 = sgp4Constants.mu;
  const fmt = (t: number): string => traj.formatUtc(t);
  const n = ttJ2000S.length;
  const deriv = traj.derivativeVelocity;
  const per = deriv ? 5 : 1;
  const offsetsMs = [0, -2 * WASM_DERIVATIVE_STEP_MS, -WASM_DERIVATIVE_STEP_MS, WASM_DERIVATIVE_STEP_MS, 2 * WASM_DERIVATIVE_STEP_MS];
  // Unix milliseconds that satellite.js would map back to the satrec epoch.
  const epochUnixMs = (satrec.jdsatepoch - 2440587.5) * 86_400_000;
  const dates: Date[] = new Array<Date>(n * per);
  const usedS = new Float64Array(n * per);
  const residualS = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    checkSpan(traj, ttJ2000S[i], fmt);
    const elapsedS = ttJ2000S[i] - traj.epochTtJ2000S;
    const ms = Math.round(epochUnixMs + elapsedS * 1000);
    for (let j = 0; j < per; j++) {
      const date = new Date(ms + offsetsMs[j]);
      dates[per * i + j] = date;
      // The minutes SGP4 will actually use, computed as satellite.js does.
      usedS[per * i + j] = (jday(date) - satrec.jdsatepoch) * 1440 * 60;
    }
    residualS[i] = elapsedS - usedS[per * i];
  }
  propagator.setSatRecs([satrec]);
  propagator.setDates(dates);
  propagator.run();
  const raw = propagator.getRawOutput().eci;
  const w = new Float64Array(4);
  const xs = [0, 0, 0, 0];
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < per; j++) {
      const err = raw.error[per * i + j];
      if (err !== SatRecError.None) throw traj.propagationError(err, ttJ2000S[i]);
    }
    const o = 3 * per * i;
    const x = raw.position[o];
    const y = raw.position[o + 1];
    const z = raw.position[o + 2];
    let vx = raw.velocity[o];
    let vy = raw.velocity[o + 1];
    let vz = raw.velocity[o + 2];
    if (deriv) {
      // Derivative of the cubic through the four neighbours at the minutes SGP4 actually used.
      for (let j = 0; j < 4; j++) xs[j] = usedS[per * i + 1 + j] - usedS[per * i];
      derivativeWeightsAtZero(xs, w);
      vx = 0;
      vy = 0;
      vz = 0;
      for (let j = 0; j < 4; j++) {
        vx += w[j] * raw.position[o + 3 * (j + 1)];
        vy += w[j] * raw.position[o + 3 * (j + 1) + 1];
        vz += w[j] * raw.position[o + 3 * (j + 1) + 2];
      }
    }
    if (!Number.isFinite(x + y + z + vx + vy + vz)) throw traj.propagationError(-1, ttJ2000S[i]);
    // Second-order step over the sub-millisecond residual: two-body acceleration (J2 adds < 1e-5 m/s).
    const dt = residualS[i];
    const r = Math.hypot(x, y, z);
    const k = -gmKm3PerS2 / (r * r * r);
    const half = 0.5 * dt * dt * k;
    out.positionM[3 * i] = (x + vx * dt + half * x) * 1000;
    out.positionM[3 * i + 1] = (y + vy * dt + half * y) * 1000;
    out.positionM[3 * i + 2] = (z + vz * dt + half * z) * 1000;
    out.velocityMPerS[3 * i] = (vx + k * x * dt) * 1000;
    out.velocityMPerS[3 * i + 1] = (vy + k * y * dt) * 1000;
    out.velocityMPerS[3 * i + 2] = (vz + k * z * dt) * 1000;
  }
}

/** Used by {@link Sgp4Trajectory#sampleInto}: the shared WASM propagator for resonant orbits, or null. */
function wasmFor(satrec: SatRec, count: number): EciPropagator | null {
  return sharedPropagator !== null && satrec.irez !== 0 && count >= 8 ? sharedPropagator : null;
}

/**
 * Build a bulk SGP4 propagator (satellite.js WASM, single-thread runtime) for many element sets.
 * The runtime is created once per process and kept: its own dispose ends the WASM runtime.
 * Falls back to nothing: if WASM is unavailable the promise rejects and callers use
 * {@link Sgp4Trajectory#sampleInto}.
 */
export async function createBulkSgp4(sources: readonly (Sgp4ElementSet | Sgp4Trajectory)[], timeSystem: TimeSystem): Promise<BulkSgp4> {
  const trajectories = sources.map((s) => (s instanceof Sgp4Trajectory ? s : new Sgp4Trajectory(s, timeSystem)));
  const propagator = await newPropagator();
  return {
    trajectories,
    engine: 'wasm',
    sampleInto(index: number, ttJ2000S: Float64Array, out: StateBlock): void {
      const traj = trajectories[index];
      countStates(ttJ2000S.length, traj.derivativeVelocity ? 5 * ttJ2000S.length : ttJ2000S.length);
      bulkSampleInto(traj, satrecOf.get(traj) as SatRec, propagator, ttJ2000S, out);
    },
    dispose(): void {
      propagator.dispose();
    },
  };
}
