/**
 * Numerical (Cowell) orbit propagation under zonal gravity: r̈ = ∇U(r), integrated once over the
 * requested span with a Gragg–Bulirsch–Stoer integrator (modified midpoint + Richardson
 * extrapolation in h², written here; no dependency), then served by quintic Hermite dense output.
 *
 * Frame: the states stay in the input's true-pole frame (TOD or TEME). Zonal gravity needs only
 * the pole, and the pole of the epoch is used for the whole span: the axes do not follow
 * precession–nutation during the run. The true pole moves by about 20″/yr (precession) plus
 * nutation of ±9″ over 18.6 yr, so for spans of weeks the tilt is under ~2″ (1e-5 rad), whose
 * effect on J2 forces and on the clock rate is negligible.
 *
 * Left out: air drag, Sun and Moon, solar radiation pressure, tesseral harmonics. Time is TT
 * seconds since J2000.0 (`ttJ2000S`) throughout; internally the offset from the epoch is used
 * so that steps are exact.
 */
import { WGS84_A_M, WGS84_INV_F } from '../constants.ts';
import { InputError, InternalError } from '../errors.ts';
import { accelerationInto, type GravityModel } from './gravity.ts';
import { checkSpan, type StateBlock, type Trajectory } from './trajectory.ts';
import { vec3, type StateM } from './vec.ts';

/** Frames whose z axis is the true pole of date, in which zonal gravity can be evaluated. */
export type TruePoleFrame = 'TOD' | 'TEME';

/** Default relative tolerance per step: keeps position error well under 1 m per day (see tests). */
export const DEFAULT_RELATIVE_TOLERANCE = 1e-12;

/**
 * Largest step as a fraction of the local dynamical time min(r/|v|, √(r³/GM)) [1]: a safety cap.
 * The step is mainly limited by the dense-output error estimate below.
 */
const MAX_STEP_FRACTION = 0.25;
/**
 * Target for the quintic Hermite interpolation error at mid-step [m]. The estimate is
 * h²·|a_Hermite − a(r_Hermite)|/24 at the midpoint, where the error s³(1−s)³ peaks; a step whose
 * estimate exceeds DENSE_REJECT_M is redone shorter. Keeps dense output well under 1 mm (tested).
 */
const DENSE_TARGET_M = 1e-4;
const DENSE_REJECT_M = 3e-4;

/** WGS-84 polar semi-axis [m], b = a(1 − f). Derived from NIMA TR8350.2 a and 1/f. */
const WGS84_B_M = WGS84_A_M * (1 - 1 / WGS84_INV_F);
/** A state more than this far inside the ellipsoid counts as having hit the surface [m]. */
const SURFACE_SLACK_M = 1;

/** Step sequence n_k = 2(k+1) (Deuflhard's harmonic sequence), columns 0..K_MAX. */
const K_MAX = 8;
const K_MIN = 2;
const SEQ = Array.from({ length: K_MAX + 1 }, (_, k) => 2 * (k + 1));
/** Work A_k: evaluations to reach column k (plus the one at the step end). */
const WORK = SEQ.map((_, k) => 1 + SEQ.slice(0, k + 1).reduce((s, n) => s + n, 0));
/** Neville coefficients 1/((n_k/n_{k−j})² − 1). */
const COEF = SEQ.map((nk, k) => SEQ.map((_, j) => (j === 0 || j > k ? 0 : 1 / ((nk / SEQ[k - j]) ** 2 - 1))));

/** Options of {@link NumericalTrajectory}. Positions [m], velocities [m/s], times TT s since J2000.0. */
export interface NumericalTrajectoryOptions {
  /** Satellite id, used in messages. */
  id: string;
  /** Frame of the initial state; the states returned are in the same frame (of the epoch). */
  frame: TruePoleFrame;
  /** Epoch of the initial state, TT seconds since J2000.0. */
  epochTtJ2000S: number;
  /** Initial position [m], true-pole frame `frame`. */
  positionM: readonly number[];
  /** Initial velocity [m/s], same frame. */
  velocityMPerS: readonly number[];
  gravity: GravityModel;
  /** Span start, TT s since J2000.0; may be before the epoch (integrated backwards). */
  fromTtJ2000S: number;
  /** Span end, TT s since J2000.0; may be after the epoch. */
  toTtJ2000S: number;
  /** Relative error tolerance per step (position scaled by |r|, velocity by |v|). Default 1e-12. */
  relTol?: number;
  /**
   * Ballistic-flight mode: the forward integration ends at the first downward crossing of this
   * geocentric radius [m] (e.g. the launch radius), even beyond `toTtJ2000S`; the span then ends
   * there and {@link NumericalTrajectory.flightEndTtJ2000S} holds that instant.
   */
  stopAtRadiusM?: number;
  /** In ballistic mode, the longest flight searched [s]; default 30 d. Not returning is an InputError. */
  maxFlightS?: number;
  /** Cap on integration steps (accepted + rejected); reaching it is an InternalError. Default 1e6. */
  maxSteps?: number;
  /** Text for reports; default names the method and gravity model. */
  sourceLabel?: string;
}

/**
 * A state met the Earth's surface (WGS-84 ellipsoid, 1 m slack) inside the span. Carries the
 * satellite id and the first instant found below the surface (TT s since J2000.0, to ~0.1 ms)
 * so that the caller can format the time.
 */
export class SurfaceImpactError extends InputError {
  constructor(
    readonly satelliteId: string,
    readonly ttJ2000S: number,
  ) {
    super(
      `orbit of ${satelliteId} reaches the Earth's surface at TT ${ttJ2000S.toFixed(3)} s after J2000.0`,
      satelliteId,
      'check the state (units km and km/s, frame) or end the span before the impact',
    );
    this.name = 'SurfaceImpactError';
  }
}

/** Quintic Hermite position and velocity at τ on [τ0, τ1] from node records (r, v, a) at o0 and o1. */
function hermiteInto(
  tau0: number,
  n0: ArrayLike<number>,
  o0: number,
  tau1: number,
  n1: ArrayLike<number>,
  o1: number,
  tau: number,
  outR: Float64Array,
  outV: Float64Array,
  oo: number,
): void {
  const h = tau1 - tau0;
  if (h === 0) {
    for (let c = 0; c < 3; c++) {
      outR[oo + c] = n0[o0 + c];
      outV[oo + c] = n0[o0 + 3 + c];
    }
    return;
  }
  const s = (tau - tau0) / h;
  const s2 = s * s;
  const s3 = s2 * s;
  const s4 = s3 * s;
  const s5 = s4 * s;
  const h0 = 1 - 10 * s3 + 15 * s4 - 6 * s5;
  const h1 = s - 6 * s3 + 8 * s4 - 3 * s5;
  const h2 = 0.5 * (s2 - 3 * s3 + 3 * s4 - s5);
  const h3 = 10 * s3 - 15 * s4 + 6 * s5;
  const h4 = -4 * s3 + 7 * s4 - 3 * s5;
  const h5 = 0.5 * (s3 - 2 * s4 + s5);
  const d0 = -30 * s2 + 60 * s3 - 30 * s4;
  const d1 = 1 - 18 * s2 + 32 * s3 - 15 * s4;
  const d2 = 0.5 * (2 * s - 9 * s2 + 12 * s3 - 5 * s4);
  const d4 = -12 * s2 + 28 * s3 - 15 * s4;
  const d5 = 0.5 * (3 * s2 - 8 * s3 + 5 * s4);
  const hh = h * h;
  for (let c = 0; c < 3; c++) {
    const p0 = n0[o0 + c];
    const v0 = n0[o0 + 3 + c];
    const a0 = n0[o0 + 6 + c];
    const p1 = n1[o1 + c];
    const v1 = n1[o1 + 3 + c];
    const a1 = n1[o1 + 6 + c];
    const dp = p1 - p0; // H3 = 1 − H0, so write p0 + H3·(p1 − p0) for less rounding
    outR[oo + c] = p0 + h3 * dp + h * (h1 * v0 + h4 * v1) + hh * (h2 * a0 + h5 * a1);
    outV[oo + c] = (-d0 * dp) / h + d1 * v0 + d4 * v1 + h * (d2 * a0 + d5 * a1);
  }
}

/** Ellipsoid test value (x²+y²)/a² + z²/b²: below 1 means inside the WGS-84 ellipsoid. */
function ellipsoidQ(x: number, y: number, z: number): number {
  return (x * x + y * y) / (WGS84_A_M * WGS84_A_M) + (z * z) / (WGS84_B_M * WGS84_B_M);
}
const SURFACE_Q_LIMIT = (1 - SURFACE_SLACK_M / WGS84_A_M) ** 2;

/** Gragg–Bulirsch–Stoer stepper for y = (r, v), ẏ = (v, ∇U(r)). Buffers are reused: no allocation per step. */
class GbsStepper {
  private readonly table = new Float64Array((K_MAX + 1) * (K_MAX + 1) * 6);
  private readonly zPrev = new Float64Array(6);
  private readonly zCur = new Float64Array(6);
  private readonly acc = new Float64Array(3);
  /** Step-size factor proposed by column k after the last attempt. */
  readonly fac = new Float64Array(K_MAX + 1);
  /** Scaled error of column k after the last attempt (NaN if not reached). */
  readonly err = new Float64Array(K_MAX + 1);
  evaluations = 0;

  constructor(
    private readonly model: GravityModel,
    private readonly relTol: number,
  ) {}

  /** Acceleration [m/s²] at r into `out[o..o+2]`. */
  accel(x: number, y: number, z: number, out: Float64Array, o: number): void {
    accelerationInto(this.model, x, y, z, this.acc);
    this.evaluations++;
    out[o] = this.acc[0];
    out[o + 1] = this.acc[1];
    out[o + 2] = this.acc[2];
  }

  /** Gragg's modified midpoint with n substeps over bigH, from y0 (6) and a0 (3), into table row offset `out`. */
  private midpoint(y0: Float64Array, a0: Float64Array, bigH: number, n: number, out: number): void {
    const h = bigH / n;
    const zp = this.zPrev;
    const zc = this.zCur;
    const acc = this.acc;
    for (let c = 0; c < 3; c++) {
      zp[c] = y0[c];
      zp[c + 3] = y0[c + 3];
      zc[c] = y0[c] + h * y0[c + 3];
      zc[c + 3] = y0[c + 3] + h * a0[c];
    }
    const gm = this.model;
    for (let m = 1; m < n; m++) {
      accelerationInto(gm, zc[0], zc[1], zc[2], acc);
      for (let c = 0; c < 3; c++) {
        const nr = zp[c] + 2 * h * zc[c + 3];
        const nv = zp[c + 3] + 2 * h * acc[c];
        zp[c] = zc[c];
        zp[c + 3] = zc[c + 3];
        zc[c] = nr;
        zc[c + 3] = nv;
      }
    }
    accelerationInto(gm, zc[0], zc[1], zc[2], acc);
    this.evaluations += n;
    const t = this.table;
    for (let c = 0; c < 3; c++) {
      t[out + c] = 0.5 * (zc[c] + zp[c] + h * zc[c + 3]);
      t[out + c + 3] = 0.5 * (zc[c + 3] + zp[c + 3] + h * acc[c]);
    }
  }

  /**
   * One step of size bigH [s] (negative backwards). On success writes y(τ+H) into yOut and returns
   * the column that converged; returns −1 if no column up to K_MAX met the tolerance.
   */
  step(y0: Float64Array, a0: Float64Array, bigH: number, yOut: Float64Array): number {
    const t = this.table;
    const w = K_MAX + 1;
    this.err.fill(Number.NaN);
    for (let k = 0; k <= K_MAX; k++) {
      const rowK = k * w * 6;
      this.midpoint(y0, a0, bigH, SEQ[k], rowK);
      const rowP = (k - 1) * w * 6;
      for (let j = 1; j <= k; j++) {
        const cf = COEF[k][j];
        const cur = rowK + j * 6;
        const left = rowK + (j - 1) * 6;
        const up = rowP + (j - 1) * 6;
        for (let c = 0; c < 6; c++) t[cur + c] = t[left + c] + (t[left + c] - t[up + c]) * cf;
      }
      if (k < K_MIN) continue;
      const best = rowK + k * 6;
      const prev = rowK + (k - 1) * 6;
      const rNorm = Math.hypot(t[best], t[best + 1], t[best + 2]);
      const vNorm = Math.hypot(t[best + 3], t[best + 4], t[best + 5]);
      // Velocity floor (1e-3 of circular speed) keeps the scale finite at a ballistic apex.
      const vScale = Math.max(vNorm, 1e-3 * Math.sqrt(this.model.gmM3PerS2 / rNorm));
      const dr = Math.hypot(t[best] - t[prev], t[best + 1] - t[prev + 1], t[best + 2] - t[prev + 2]);
      const dv = Math.hypot(t[best + 3] - t[prev + 3], t[best + 4] - t[prev + 4], t[best + 5] - t[prev + 5]);
      const e = Math.max(dr / (this.relTol * rNorm), dv / (this.relTol * vScale));
      this.err[k] = e;
      // Step-size factor for which column k would just meet the tolerance (Hairer–Nørsett–Wanner II.9).
      this.fac[k] = Number.isFinite(e) ? 0.94 * Math.pow(0.65 / Math.max(e, 1e-300), 1 / (2 * k + 1)) : 0.1;
      if (e <= 1) {
        for (let c = 0; c < 6; c++) yOut[c] = t[best + c];
        return k;
      }
    }
    return -1;
  }
}

/** Result of integrating one direction from the epoch. Node τ are offsets from the epoch [s]. */
interface Leg {
  tauS: number[];
  /** 9 numbers per node: r [m], v [m/s], a [m/s²]. */
  nodes: number[];
  /** Offset of the ballistic-flight end from the epoch [s], or null. */
  eventTauS: number | null;
  steps: number;
}

/**
 * Orbit states from a numerical integration of zonal gravity, in the input's true-pole frame of the
 * epoch (TOD or TEME). Integrated once at construction over [from, to] (both directions from the
 * epoch); `stateAt` and `sampleInto` interpolate between stored nodes with quintic Hermite
 * polynomials built from position, velocity and acceleration. Steps are sized so that the
 * interpolation error estimated at each mid-step stays near 0.1 mm (< 1 mm; tested).
 * Lookups are O(log n) with a hint for increasing times; `sampleInto` allocates nothing.
 */
export class NumericalTrajectory implements Trajectory {
  readonly id: string;
  readonly frame: TruePoleFrame;
  readonly epochTtJ2000S: number;
  readonly validFromTtJ2000S: number;
  readonly validToTtJ2000S: number;
  readonly sourceLabel: string;
  readonly gravity: GravityModel;
  readonly relTol: number;
  /** End of a ballistic flight (first return to `stopAtRadiusM`), TT s since J2000.0; null otherwise. */
  readonly flightEndTtJ2000S: number | null;
  /** Accepted plus rejected integrator steps, and gravity evaluations (diagnostics). */
  readonly stepCount: number;
  readonly evaluationCount: number;

  /** Node offsets from the epoch [s], increasing. */
  private readonly tauS: Float64Array;
  /** 9 per node: r [m], v [m/s], a [m/s²]. */
  private readonly nodes: Float64Array;
  /** Segment index last used (hint for monotone sampling). */
  private hint = 0;
  private readonly scratchR = new Float64Array(3);
  private readonly scratchV = new Float64Array(3);

  constructor(opts: NumericalTrajectoryOptions) {
    const { id, gravity } = opts;
    this.id = id;
    this.frame = opts.frame;
    this.gravity = gravity;
    this.epochTtJ2000S = opts.epochTtJ2000S;
    this.relTol = opts.relTol ?? DEFAULT_RELATIVE_TOLERANCE;
    this.sourceLabel = opts.sourceLabel ?? `numerical integration (Cowell, Bulirsch–Stoer, ${gravity.name} gravity)`;
    const values = [opts.epochTtJ2000S, opts.fromTtJ2000S, opts.toTtJ2000S, ...opts.positionM, ...opts.velocityMPerS];
    if (opts.positionM.length !== 3 || opts.velocityMPerS.length !== 3 || !values.every(Number.isFinite)) {
      throw new InputError(`initial state or span of ${id} has a missing or non-finite value`, id, 'give a 3-vector position and velocity and finite times');
    }
    if (!(opts.fromTtJ2000S <= opts.toTtJ2000S)) {
      throw new InputError(`span of ${id} ends before it starts`, id, 'give the start of the span before its end');
    }
    if (!(this.relTol >= 1e-15 && this.relTol <= 1e-6)) {
      throw new InternalError(`relative tolerance ${this.relTol} outside [1e-15, 1e-6]`, 'relTol');
    }
    const ballistic = opts.stopAtRadiusM !== undefined;
    const maxSteps = opts.maxSteps ?? 1_000_000;
    const stepper = new GbsStepper(gravity, this.relTol);

    const y0 = new Float64Array([...opts.positionM, ...opts.velocityMPerS]);
    const a0 = new Float64Array(3);
    stepper.accel(y0[0], y0[1], y0[2], a0, 0);

    const fwdEnd = Math.max(0, opts.toTtJ2000S - opts.epochTtJ2000S);
    const bwdEnd = Math.min(0, opts.fromTtJ2000S - opts.epochTtJ2000S);
    const fwd = this.integrateLeg(stepper, y0, a0, ballistic ? Math.max(fwdEnd, opts.maxFlightS ?? 30 * 86_400) : fwdEnd, opts.stopAtRadiusM ?? null, maxSteps);
    if (ballistic && fwd.eventTauS === null) {
      throw new InputError(
        `${id} does not come back down to its starting radius within ${((opts.maxFlightS ?? 30 * 86_400) / 86_400).toFixed(1)} d`,
        id,
        'give a sub-orbital state (one that falls back), or a longer flight limit',
      );
    }
    const bwd = bwdEnd < 0 ? this.integrateLeg(stepper, y0, a0, bwdEnd, null, maxSteps - fwd.steps) : { tauS: [0], nodes: [], eventTauS: null, steps: 0 };
    const nB = bwd.tauS.length - 1; // backward nodes excluding the shared epoch node
    const n = nB + fwd.tauS.length;
    this.tauS = new Float64Array(n);
    this.nodes = new Float64Array(9 * n);
    for (let i = 0; i < nB; i++) {
      const src = nB - i; // reverse order, skip index 0 (the epoch)
      this.tauS[i] = bwd.tauS[src];
      for (let c = 0; c < 9; c++) this.nodes[9 * i + c] = bwd.nodes[9 * src + c];
    }
    for (let i = 0; i < fwd.tauS.length; i++) {
      this.tauS[nB + i] = fwd.tauS[i];
      for (let c = 0; c < 9; c++) this.nodes[9 * (nB + i) + c] = fwd.nodes[9 * i + c];
    }
    this.flightEndTtJ2000S = fwd.eventTauS === null ? null : opts.epochTtJ2000S + fwd.eventTauS;
    this.validFromTtJ2000S = opts.fromTtJ2000S;
    this.validToTtJ2000S = this.flightEndTtJ2000S ?? opts.toTtJ2000S;
    this.stepCount = fwd.steps + bwd.steps;
    this.evaluationCount = stepper.evaluations;
  }

  /** Integrate from the epoch (τ = 0) to τ = tauEnd [s], storing every accepted node. */
  private integrateLeg(stepper: GbsStepper, y0: Float64Array, a0: Float64Array, tauEnd: number, stopRadiusM: number | null, maxSteps: number): Leg {
    const gm = this.gravity.gmM3PerS2;
    const dir = tauEnd >= 0 ? 1 : -1;
    const tauS: number[] = [0];
    const nodes: number[] = [...y0, ...a0];
    const y = Float64Array.from(y0);
    const a = Float64Array.from(a0);
    const yNew = new Float64Array(6);
    const prevNode = new Float64Array(9);
    const newNode = new Float64Array(9);
    const pr = new Float64Array(3);
    const pv = new Float64Array(3);
    const aMid = new Float64Array(3);
    let tau = 0;
    let target = tauEnd;
    let eventTau: number | null = null;
    let steps = 0;
    let hAbs = Number.POSITIVE_INFINITY;
    while (dir * (target - tau) > 0) {
      const rN = Math.hypot(y[0], y[1], y[2]);
      const vN = Math.hypot(y[3], y[4], y[5]);
      const hCap = MAX_STEP_FRACTION * Math.min(vN > 0 ? rN / vN : Infinity, Math.sqrt((rN * rN * rN) / gm));
      hAbs = Math.min(hAbs, hCap);
      const remaining = dir * (target - tau);
      let last = false;
      if (remaining <= hAbs * (1 + 1e-12)) {
        hAbs = remaining;
        last = true;
      } else if (remaining < 2 * hAbs) {
        hAbs = remaining / 2; // two even steps rather than one tiny last step
      }
      if (hAbs < 1e-9 * Math.max(1, Math.abs(tau))) throw new InternalError(`integration step underflow for ${this.id} at τ = ${tau} s`, 'stepS');
      if (++steps > maxSteps) throw new InternalError(`integration of ${this.id} exceeded ${maxSteps} steps`, 'steps');
      const bigH = dir * hAbs;
      const k = stepper.step(y, a, bigH, yNew);
      if (k < 0) {
        hAbs *= Math.min(0.7, Math.max(0.2, stepper.fac[K_MAX]));
        continue;
      }
      const tauNew = last ? target : tau + bigH;
      for (let c = 0; c < 6; c++) {
        prevNode[c] = y[c];
        newNode[c] = yNew[c];
      }
      for (let c = 0; c < 3; c++) prevNode[6 + c] = a[c];
      stepper.accel(yNew[0], yNew[1], yNew[2], newNode, 6);

      // Dense-output check at mid-step: Hermite acceleration 1.5(v1 − v0)/h − (a0 + a1)/4 vs gravity there.
      const tauMid = 0.5 * (tau + tauNew);
      hermiteInto(tau, prevNode, 0, tauNew, newNode, 0, tauMid, pr, pv, 0);
      stepper.accel(pr[0], pr[1], pr[2], aMid, 0);
      let dA2 = 0;
      for (let c = 0; c < 3; c++) {
        const aHerm = (1.5 * (newNode[3 + c] - prevNode[3 + c])) / bigH - 0.25 * (prevNode[6 + c] + newNode[6 + c]);
        dA2 += (aHerm - aMid[c]) ** 2;
      }
      const denseErrM = (bigH * bigH * Math.sqrt(dA2)) / 24;
      // Error ∝ h⁶: the step that would meet the target.
      const hDense = hAbs * Math.min(4, 0.9 * Math.pow(DENSE_TARGET_M / Math.max(denseErrM, 1e-300), 1 / 6));
      if (denseErrM > DENSE_REJECT_M) {
        hAbs = hDense;
        continue;
      }

      // Ballistic flight end: first downward crossing of the stop radius.
      if (stopRadiusM !== null && eventTau === null) {
        const gPrev = Math.hypot(y[0], y[1], y[2]) - stopRadiusM;
        const gNew = Math.hypot(yNew[0], yNew[1], yNew[2]) - stopRadiusM;
        if (gPrev >= -1e-3 && gNew < 0) {
          eventTau = this.radiusCrossing(tau, prevNode, tauNew, newNode, stopRadiusM, pr, pv);
          // Redo the last stretch so that the final node falls exactly on the event.
          target = eventTau;
          hAbs = Math.abs(eventTau - tau);
          continue;
        }
      }
      // Surface: check the new node and the step midpoint (a grazing dip shorter than half a step may pass unseen).
      hermiteInto(tau, prevNode, 0, tauNew, newNode, 0, tauMid, pr, pv, 0);
      const midInside = ellipsoidQ(pr[0], pr[1], pr[2]) < SURFACE_Q_LIMIT;
      if (midInside || ellipsoidQ(yNew[0], yNew[1], yNew[2]) < SURFACE_Q_LIMIT) {
        const hi = midInside ? tauMid : tauNew;
        throw new SurfaceImpactError(this.id, this.epochTtJ2000S + this.surfaceEntry(tau, prevNode, tauNew, newNode, hi, pr, pv));
      }

      tauS.push(tauNew);
      for (let c = 0; c < 9; c++) nodes.push(newNode[c]);
      for (let c = 0; c < 6; c++) y[c] = yNew[c];
      for (let c = 0; c < 3; c++) a[c] = newNode[6 + c];
      tau = tauNew;
      // Next step: the cheapest column's proposal (work per unit time), growth limited to 4×.
      let bestW = Infinity;
      let bestH = hAbs;
      for (let j = K_MIN; j <= k; j++) {
        const hj = hAbs * Math.min(4, Math.max(0.2, stepper.fac[j]));
        const wj = WORK[j] / hj;
        if (wj < bestW) {
          bestW = wj;
          bestH = hj;
        }
      }
      hAbs = Math.min(bestH, hDense);
    }
    return { tauS, nodes, eventTauS: eventTau, steps };
  }

  /** τ [s] where |r| falls through radiusM inside a step, on the Hermite interpolant; safeguarded Newton to 0.1 µs. */
  private radiusCrossing(tauA: number, nA: Float64Array, tauB: number, nB: Float64Array, radiusM: number, pr: Float64Array, pv: Float64Array): number {
    let lo = tauA; // |r| ≥ R side
    let hi = tauB; // |r| < R side
    let t = 0.5 * (lo + hi);
    for (let it = 0; it < 100; it++) {
      hermiteInto(tauA, nA, 0, tauB, nB, 0, t, pr, pv, 0);
      const rn = Math.hypot(pr[0], pr[1], pr[2]);
      const g = rn - radiusM;
      if (g >= 0) lo = t;
      else hi = t;
      if (Math.abs(hi - lo) < 1e-7) return 0.5 * (lo + hi);
      const gd = (pr[0] * pv[0] + pr[1] * pv[1] + pr[2] * pv[2]) / rn;
      let tn = gd !== 0 ? t - g / gd : Number.NaN;
      // Fall back to bisection when Newton leaves the bracket.
      if (!(tn > Math.min(lo, hi) && tn < Math.max(lo, hi))) tn = 0.5 * (lo + hi);
      if (Math.abs(tn - t) < 1e-7) return tn;
      t = tn;
    }
    throw new InternalError(`radius crossing of ${this.id} did not converge`, 'flightEnd');
  }

  /** First τ [s] inside the ellipsoid on [tauA, hi] by bisection to 0.1 ms (the node at tauA is outside). */
  private surfaceEntry(tauA: number, nA: Float64Array, tauB: number, nB: Float64Array, hi: number, pr: Float64Array, pv: Float64Array): number {
    let lo = tauA;
    for (let it = 0; it < 80 && Math.abs(hi - lo) > 1e-4; it++) {
      const mid = 0.5 * (lo + hi);
      hermiteInto(tauA, nA, 0, tauB, nB, 0, mid, pr, pv, 0);
      if (ellipsoidQ(pr[0], pr[1], pr[2]) < SURFACE_Q_LIMIT) hi = mid;
      else lo = mid;
    }
    return hi;
  }

  /** Index i of the segment [τ_i, τ_{i+1}] holding τ (clamped to the stored range). */
  private segment(tau: number): number {
    const ts = this.tauS;
    const last = ts.length - 2;
    if (last < 0) return 0;
    const h = this.hint;
    if (h <= last && tau >= ts[h] && tau <= ts[h + 1]) return h;
    if (h + 1 <= last && tau >= ts[h + 1] && tau <= ts[h + 2]) return (this.hint = h + 1);
    let lo = 0;
    let hi = last;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (ts[mid] <= tau) lo = mid;
      else hi = mid - 1;
    }
    this.hint = lo;
    return lo;
  }

  /** Interpolated state at offset τ [s] from the epoch into outR/outV at offset oo. */
  private interpolateInto(tau: number, outR: Float64Array, outV: Float64Array, oo: number): void {
    const ts = this.tauS;
    if (ts.length === 1) {
      for (let c = 0; c < 3; c++) {
        outR[oo + c] = this.nodes[c];
        outV[oo + c] = this.nodes[3 + c];
      }
      return;
    }
    const i = this.segment(tau);
    hermiteInto(ts[i], this.nodes, 9 * i, ts[i + 1], this.nodes, 9 * (i + 1), tau, outR, outV, oo);
  }

  /** State [m, m/s] at TT seconds since J2000.0, frame `this.frame` of the epoch. SpanError outside the span. */
  stateAt(ttJ2000S: number): StateM<TruePoleFrame> {
    checkSpan(this, ttJ2000S);
    const r = this.scratchR;
    const v = this.scratchV;
    this.interpolateInto(ttJ2000S - this.epochTtJ2000S, r, v, 0);
    return { ttJ2000S, positionM: vec3(r[0], r[1], r[2]), velocityMPerS: vec3(v[0], v[1], v[2]) };
  }

  /** States at many instants (TT s since J2000.0) into `out` [m, m/s]; no allocation per state. */
  sampleInto(ttJ2000S: Float64Array, out: StateBlock): void {
    const ep = this.epochTtJ2000S;
    for (let i = 0; i < ttJ2000S.length; i++) {
      checkSpan(this, ttJ2000S[i]);
      this.interpolateInto(ttJ2000S[i] - ep, out.positionM, out.velocityMPerS, 3 * i);
    }
  }

  /** Node times, TT s since J2000.0 (a copy; for diagnostics and tests). */
  nodeTimesTtJ2000S(): Float64Array {
    return this.tauS.map((t) => t + this.epochTtJ2000S);
  }
}
