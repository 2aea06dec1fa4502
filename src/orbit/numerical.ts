/**
 * Numerical (Cowell) orbit propagation under zonal gravity: r̈ = ∇U(r), integrated once over the
 * requested span with a Gragg–Bulirsch–Stoer integrator (./numericalStepper.ts), served by quintic
 * Hermite dense output (./numericalDense.ts), with surface and flight-end events
 * (./numericalEvents.ts).
 *
 * Axes (`axes` option):
 * - `gcrf` (state vectors and Keplerian elements): the state is taken to GCRF at its epoch and
 *   integrated there; the zonal field is evaluated about the true pole of each instant (IAU
 *   2006/2000A, ./temeOfDate.ts). States are served in TEME of date (the axes of each instant),
 *   the frame of every other orbit source: rotation keeps the speed the clock needs.
 * - `fixed`: the input's true-pole axes of the epoch are used for the whole run (the pole of the
 *   epoch is frozen). Kept for checks of the integrator itself, where a static field makes energy
 *   and polar angular momentum exact integrals. The pole drifts about 20″/yr plus nutation, so
 *   the axes are wrong by ~0.14″/day for real use.
 *
 * Long spans: nodes are kept in chunks; past ~300 000 nodes the least recently used chunks are
 * dropped and rebuilt on demand from their start state, so memory stays bounded up to the
 * 10-year cap of the contract.
 *
 * Left out: air drag, Sun and Moon, solar radiation pressure, tesseral harmonics. Time is TT
 * seconds since J2000.0 (`ttJ2000S`) throughout; internally the offset τ from the epoch.
 */
import { InputError, InternalError } from '../errors.ts';
import { accelerationInto, type GravityModel } from './gravity.ts';
import { CHUNK_NODES, hermiteInto, makeChunk, NODE_WIDTH, NodeStore, type Checkpoint, type Chunk } from './numericalDense.ts';
import { insideEarth, radiusCrossing, SurfaceImpactError, surfaceEntry, type PoleComponent } from './numericalEvents.ts';
import { GbsStepper, K_MAX, K_MIN, WORK, type Force } from './numericalStepper.ts';
import { gcrfToTodMatrixAtTt } from './frames.ts';
import { gcrfToTemeInto, rotateBackInto, rotateInto } from './temeOfDate.ts';
import { checkSpan, type StateBlock, type Trajectory } from './trajectory.ts';
import { vec3, type StateM } from './vec.ts';

export { SurfaceImpactError } from './numericalEvents.ts';

/** Frames whose z axis is the true pole of date, in which zonal gravity can be evaluated. */
export type TruePoleFrame = 'TOD' | 'TEME';
/** Frames a numerical orbit's initial state may be given in (TOD and TEME: of the epoch). */
export type NumericalInputFrame = 'GCRF' | TruePoleFrame;

/** Default relative tolerance per step: keeps position error well under 1 m per day (see tests). */
export const DEFAULT_RELATIVE_TOLERANCE = 1e-12;
/** Default cap on integrator steps: a 10-year LEO needs about 5 million. */
export const DEFAULT_MAX_STEPS = 20_000_000;

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

/** Options of {@link NumericalTrajectory}. Positions [m], velocities [m/s], times TT s since J2000.0. */
export interface NumericalTrajectoryOptions {
  /** Satellite id, used in messages. */
  id: string;
  /** Frame of the initial state (TOD and TEME: of the epoch). */
  frame: NumericalInputFrame;
  /** `gcrf` (default for GCRF input) or `fixed` (default for TOD/TEME input; see the module note). */
  axes?: 'gcrf' | 'fixed';
  /** Epoch of the initial state, TT seconds since J2000.0. */
  epochTtJ2000S: number;
  /** Initial position [m], frame `frame`. */
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
  /** Cap on integration steps (accepted + rejected); reaching it is an InternalError. Default 2e7. */
  maxSteps?: number;
  /** Text for reports; default names the method and gravity model. */
  sourceLabel?: string;
  /** Most nodes kept in memory (default ~300 000); older chunks are rebuilt on demand. */
  maxResidentNodes?: number;
}

/** How one leg run ends. */
interface LegEnd {
  steps: number;
  eventTauS: number | null;
}

/**
 * Orbit states from a numerical integration of zonal gravity. Integrated once at construction
 * over [from, to] (both directions from the epoch); `stateAt` and `sampleInto` interpolate between
 * stored nodes with quintic Hermite polynomials built from position, velocity and acceleration.
 * Steps are sized so that the interpolation error estimated at each mid-step stays near 0.1 mm
 * (< 1 mm; tested). `sampleInto` allocates nothing for chunks in memory.
 */
export class NumericalTrajectory implements Trajectory {
  readonly id: string;
  /** Frame of the states served: TEME of date (`gcrf` axes) or the input's axes (`fixed`). */
  readonly frame: TruePoleFrame;
  readonly axes: 'gcrf' | 'fixed';
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

  private readonly store: NodeStore;
  private readonly stepper: GbsStepper;
  private readonly pole: PoleComponent;
  private readonly legEnd: { fwd: number; bwd: number };
  private readonly stopRadiusM: number | null;
  private readonly scratchR = new Float64Array(3);
  private readonly scratchV = new Float64Array(3);
  private readonly rot = new Float64Array(9);

  constructor(opts: NumericalTrajectoryOptions) {
    const { id, gravity } = opts;
    this.id = id;
    this.gravity = gravity;
    this.epochTtJ2000S = opts.epochTtJ2000S;
    this.relTol = opts.relTol ?? DEFAULT_RELATIVE_TOLERANCE;
    this.axes = opts.axes ?? (opts.frame === 'GCRF' ? 'gcrf' : 'fixed');
    if (this.axes === 'fixed' && opts.frame === 'GCRF') throw new InternalError('fixed axes need a true-pole input frame (TOD or TEME)', 'axes');
    this.frame = this.axes === 'gcrf' ? 'TEME' : (opts.frame as TruePoleFrame);
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
    this.stopRadiusM = opts.stopAtRadiusM ?? null;
    const maxSteps = opts.maxSteps ?? DEFAULT_MAX_STEPS;
    const { force, pole } = this.forceModel();
    this.pole = pole;
    const stepper = new GbsStepper(force, gravity.gmM3PerS2, this.relTol);
    this.stepper = stepper;
    this.store = new NodeStore((c) => this.rebuildChunk(c), opts.maxResidentNodes);

    const y0 = new Float64Array([...opts.positionM, ...opts.velocityMPerS]);
    if (this.axes === 'gcrf' && opts.frame !== 'GCRF') this.toGcrfAtEpoch(opts.frame, y0);
    const a0 = new Float64Array(3);
    stepper.accel(0, y0[0], y0[1], y0[2], a0, 0);

    const fwdEnd = Math.max(0, opts.toTtJ2000S - opts.epochTtJ2000S);
    const bwdEnd = Math.min(0, opts.fromTtJ2000S - opts.epochTtJ2000S);
    const fwdTarget = ballistic ? Math.max(fwdEnd, opts.maxFlightS ?? 30 * 86_400) : fwdEnd;
    this.legEnd = { fwd: fwdTarget, bwd: bwdEnd };
    const start: Checkpoint = { tauS: 0, y: y0, a: a0, hAbsS: Number.POSITIVE_INFINITY };
    const fwd = this.runLeg(start, fwdTarget, this.stopRadiusM, maxSteps, Number.POSITIVE_INFINITY, null);
    if (ballistic && fwd.eventTauS === null) {
      throw new InputError(
        `${id} does not come back down to its starting radius within ${((opts.maxFlightS ?? 30 * 86_400) / 86_400).toFixed(1)} d`,
        id,
        'give a sub-orbital state (one that falls back), or a longer flight limit',
      );
    }
    const bwd = bwdEnd < 0 ? this.runLeg(start, bwdEnd, null, maxSteps - fwd.steps, Number.POSITIVE_INFINITY, null) : { steps: 0, eventTauS: null };
    if (this.store.chunkCount === 0) this.store.add(makeChunk(start, 1, Float64Array.of(0), Float64Array.from([...y0, ...a0])));
    this.store.finish();
    this.flightEndTtJ2000S = fwd.eventTauS === null ? null : opts.epochTtJ2000S + fwd.eventTauS;
    this.validFromTtJ2000S = opts.fromTtJ2000S;
    this.validToTtJ2000S = this.flightEndTtJ2000S ?? opts.toTtJ2000S;
    this.stepCount = fwd.steps + bwd.steps;
    this.evaluationCount = stepper.evaluations;
  }

  /** Acceleration and pole component in the chosen axes. */
  private forceModel(): { force: Force; pole: PoleComponent } {
    const model = this.gravity;
    if (this.axes === 'fixed') {
      const acc = new Float64Array(3);
      const force: Force = (_t, x, y, z, out, o) => {
        accelerationInto(model, x, y, z, acc);
        out[o] = acc[0];
        out[o + 1] = acc[1];
        out[o + 2] = acc[2];
      };
      return { force, pole: (_t, _x, _y, z) => z };
    }
    const m = new Float64Array(9);
    const rT = new Float64Array(3);
    const aT = new Float64Array(3);
    const ep = this.epochTtJ2000S;
    const force: Force = (tau, x, y, z, out, o) => {
      gcrfToTemeInto(ep + tau, m);
      rT[0] = m[0] * x + m[1] * y + m[2] * z;
      rT[1] = m[3] * x + m[4] * y + m[5] * z;
      rT[2] = m[6] * x + m[7] * y + m[8] * z;
      accelerationInto(model, rT[0], rT[1], rT[2], aT);
      rotateBackInto(m, aT, 0, out, o);
    };
    const pm = new Float64Array(9);
    const pole: PoleComponent = (tau, x, y, z) => {
      gcrfToTemeInto(ep + tau, pm);
      return pm[6] * x + pm[7] * y + pm[8] * z;
    };
    return { force, pole };
  }

  /** TEME or TOD state of the epoch (in place) to GCRF. */
  private toGcrfAtEpoch(frame: TruePoleFrame, y: Float64Array): void {
    // TOD → GCRF by (N·P·B)ᵀ; TEME → GCRF by the transpose of the interpolated chain.
    const m = frame === 'TOD' ? Float64Array.from(gcrfToTodMatrixAtTt(this.epochTtJ2000S).flat()) : gcrfToTemeInto(this.epochTtJ2000S, this.rot);
    rotateBackInto(m, y, 0, y, 0);
    rotateBackInto(m, y, 3, y, 3);
  }

  /**
   * Integrate from `start` toward τ = target [s], storing accepted nodes in chunks of the store,
   * or, when `only` is given, collecting one chunk's nodes into it (stops after `maxNodes`).
   */
  private runLeg(start: Checkpoint, target0: number, stopRadiusM: number | null, maxSteps: number, maxNodes: number, only: { taus: number[]; nodes: number[] } | null): LegEnd {
    const stepper = this.stepper;
    const gm = this.gravity.gmM3PerS2;
    const dir: 1 | -1 = target0 >= start.tauS ? 1 : -1;
    const y = Float64Array.from(start.y);
    const a = Float64Array.from(start.a);
    const yNew = new Float64Array(6);
    const prevNode = new Float64Array(9);
    const newNode = new Float64Array(9);
    const pr = new Float64Array(3);
    const pv = new Float64Array(3);
    const aMid = new Float64Array(3);
    let tau = start.tauS;
    let target = target0;
    let eventTau: number | null = null;
    let steps = 0;
    let hAbs = start.hAbsS;
    let accepted = 0;
    // Current chunk under construction.
    let cur: Checkpoint = start;
    let curT: number[] = [tau];
    let curN: number[] = [...y, ...a];
    const flush = (): void => {
      if (only !== null || curT.length < 2) return;
      this.store.add(makeChunk(cur, dir, Float64Array.from(curT), Float64Array.from(curN)));
    };
    while (dir * (target - tau) > 0 && accepted < maxNodes) {
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
      const k = stepper.step(tau, y, a, bigH, yNew);
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
      stepper.accel(tauNew, yNew[0], yNew[1], yNew[2], newNode, 6);

      // Dense-output check at mid-step: Hermite acceleration 1.5(v1 − v0)/h − (a0 + a1)/4 vs gravity there.
      const tauMid = 0.5 * (tau + tauNew);
      hermiteInto(tau, prevNode, 0, tauNew, newNode, 0, tauMid, pr, pv, 0);
      stepper.accel(tauMid, pr[0], pr[1], pr[2], aMid, 0);
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
          eventTau = radiusCrossing(this.id, tau, prevNode, tauNew, newNode, stopRadiusM, pr, pv);
          // Redo the last stretch so that the final node falls exactly on the event.
          target = eventTau;
          hAbs = Math.abs(eventTau - tau);
          continue;
        }
      }
      // Surface: check the new node and the step midpoint (a grazing dip shorter than half a step may pass unseen).
      hermiteInto(tau, prevNode, 0, tauNew, newNode, 0, tauMid, pr, pv, 0);
      const midInside = insideEarth(pr[0], pr[1], pr[2], this.pole(tauMid, pr[0], pr[1], pr[2]));
      if (midInside || insideEarth(yNew[0], yNew[1], yNew[2], this.pole(tauNew, yNew[0], yNew[1], yNew[2]))) {
        const hi = midInside ? tauMid : tauNew;
        throw new SurfaceImpactError(this.id, this.epochTtJ2000S + surfaceEntry(this.pole, tau, prevNode, tauNew, newNode, hi, pr, pv));
      }

      for (let c = 0; c < 6; c++) y[c] = yNew[c];
      for (let c = 0; c < 3; c++) a[c] = newNode[6 + c];
      tau = tauNew;
      accepted++;
      const sinkT = only === null ? curT : only.taus;
      const sinkN = only === null ? curN : only.nodes;
      sinkT.push(tauNew);
      for (let c = 0; c < 9; c++) sinkN.push(newNode[c]);
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
      if (only === null && curT.length > CHUNK_NODES) {
        flush();
        cur = { tauS: tau, y: Float64Array.from(y), a: Float64Array.from(a), hAbsS: hAbs };
        curT = [tau];
        curN = [...y, ...a];
      }
    }
    flush();
    return { steps, eventTauS: eventTau };
  }

  /** Integrate a dropped chunk again from its start state (same steps, same nodes). */
  private rebuildChunk(c: Chunk): { taus: Float64Array; nodes: Float64Array } {
    const only = { taus: [c.start.tauS], nodes: [...c.start.y, ...c.start.a] };
    const target = c.dir === 1 ? this.legEnd.fwd : this.legEnd.bwd;
    this.runLeg(c.start, target, c.dir === 1 ? this.stopRadiusM : null, DEFAULT_MAX_STEPS, c.count, only);
    if (only.taus.length !== c.count + 1) throw new InternalError(`rebuilding nodes of ${this.id} gave ${only.taus.length - 1} nodes, not ${c.count}`, 'nodes');
    return { taus: Float64Array.from(only.taus), nodes: Float64Array.from(only.nodes) };
  }

  /** Interpolated state at offset τ [s] from the epoch into outR/outV at offset oo, in the integration axes. */
  private interpolateInto(tau: number, outR: Float64Array, outV: Float64Array, oo: number): void {
    const c = this.store.chunkAt(tau);
    const ts = c.taus!;
    const nd = c.nodes!;
    if (ts.length === 1) {
      for (let k = 0; k < 3; k++) {
        outR[oo + k] = nd[k];
        outV[oo + k] = nd[3 + k];
      }
      return;
    }
    let lo = 0;
    let hi = ts.length - 2;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (ts[mid] <= tau) lo = mid;
      else hi = mid - 1;
    }
    hermiteInto(ts[lo], nd, NODE_WIDTH * lo, ts[lo + 1], nd, NODE_WIDTH * (lo + 1), tau, outR, outV, oo);
  }

  /** State into outR/outV at offset oo in the served frame. */
  private serveInto(ttJ2000S: number, outR: Float64Array, outV: Float64Array, oo: number): void {
    this.interpolateInto(ttJ2000S - this.epochTtJ2000S, outR, outV, oo);
    if (this.axes === 'gcrf') {
      const m = gcrfToTemeInto(ttJ2000S, this.rot);
      rotateInto(m, outR, oo, outR, oo);
      rotateInto(m, outV, oo, outV, oo);
    }
  }

  /** State [m, m/s] at TT seconds since J2000.0 in `this.frame`. SpanError outside the span. */
  stateAt(ttJ2000S: number): StateM<TruePoleFrame> {
    checkSpan(this, ttJ2000S);
    const r = this.scratchR;
    const v = this.scratchV;
    this.serveInto(ttJ2000S, r, v, 0);
    return { ttJ2000S, positionM: vec3(r[0], r[1], r[2]), velocityMPerS: vec3(v[0], v[1], v[2]) };
  }

  /** States at many instants (TT s since J2000.0) into `out` [m, m/s], frame `this.frame`. */
  sampleInto(ttJ2000S: Float64Array, out: StateBlock): void {
    for (let i = 0; i < ttJ2000S.length; i++) {
      checkSpan(this, ttJ2000S[i]);
      this.serveInto(ttJ2000S[i], out.positionM, out.velocityMPerS, 3 * i);
    }
  }

  /** Node times, TT s since J2000.0 (for diagnostics and tests; visits every chunk). */
  nodeTimesTtJ2000S(): Float64Array {
    const out: number[] = [];
    for (const c of this.store.all()) {
      const ts = c.taus!;
      for (let i = out.length === 0 ? 0 : 1; i < ts.length; i++) out.push(ts[i] + this.epochTtJ2000S);
    }
    return Float64Array.from(out);
  }

  /** Nodes in memory now (diagnostics: bounded by `maxResidentNodes` plus one chunk). */
  get residentNodeCount(): number {
    return this.store.residentNodes;
  }

  /** Number of node chunks (diagnostics). */
  get chunkCount(): number {
    return this.store.chunkCount;
  }
}
