/**
 * Orbits about the Moon. The state is Moon-centred in LCRS (the Moon-centred frame with ICRS axes,
 * as GCRS is Earth-centred with them); it is propagated either
 * - exactly as a two-body orbit about the Moon's point mass (`forces` all off: the closed-form checks), or
 * - numerically (Cowell, the Gragg–Bulirsch–Stoer stepper of ./numericalStepper.ts, quintic Hermite
 *   dense output of ./numericalDense.ts) with the Moon's point mass, J2 and C22 in the IAU rotation
 *   model's axes, and the Earth and the Sun as third bodies (point masses; the frame's acceleration,
 *   the Moon's own, is subtracted: a = GM_b·[(s − ρ)/|s − ρ|³ − s/|s|³]).
 * States are served geocentric, in TEME of date, like every other source (the Moon's geocentric state
 * from ./lunarEphemeris.ts added and rotated), so the clock, pass and plan code takes them as they are.
 *
 * Left out: the Moon's field beyond degree 2 (mascons perturb low orbits by up to km/day), solar
 * radiation pressure, the Earth's J2 (1e-7 of the Earth's tidal pull at the Moon), relativity in
 * the dynamics.
 */
import { IERS2010_GM_SUN_M3_PER_S2, WGS84_GM_M3_PER_S2 } from '../constants.ts';
import { InputError, InternalError } from '../errors.ts';
import { elementsFromState, keplerState, type KeplerianElements } from './keplerian.ts';
import { checkLunarEphemerisSpan, moonStateGcrfInto, sunStateGcrfInto } from './lunarEphemeris.ts';
import { lcrsToLunarElements } from './lunarFrames.ts';
import { DE430_GM_MOON_M3_PER_S2, IAU_MOON_MEAN_RADIUS_M, icrfToMoonFixedInto } from './moonBody.ts';
import { moonAccelerationInertialInto, type MoonGravityModel } from './moonGravity.ts';
import { hermiteInto } from './numericalDense.ts';
import { GbsStepper, K_MAX, K_MIN, WORK, type Force } from './numericalStepper.ts';
import { gcrfToTemeInto, rotateInto } from './temeOfDate.ts';
import { checkSpan, type StateBlock, type Trajectory } from './trajectory.ts';
import { vec3, type StateM } from './vec.ts';

/** Forces on a lunar orbiter. */
export interface LunarForces {
  /** The Moon's field (point mass, or with J2 and C22). */
  moon: MoonGravityModel;
  /** Earth as a third body (point mass). */
  earth: boolean;
  /** Sun as a third body (point mass). */
  sun: boolean;
}

/** Options of {@link LunarOrbitTrajectory}. Positions [m], velocities [m/s], times TT s since J2000.0. */
export interface LunarOrbitOptions {
  id: string;
  epochTtJ2000S: number;
  /** Moon-centred position [m], LCRS (ICRS axes). */
  positionM: readonly number[];
  /** Moon-centred velocity [m/s], LCRS. */
  velocityMPerS: readonly number[];
  fromTtJ2000S: number;
  toTtJ2000S: number;
  forces: LunarForces;
  /** Relative tolerance per step; default 1e-12. */
  relTol?: number;
  /** Cap on integration steps; default 2 000 000. */
  maxSteps?: number;
  /** Integrate numerically even for a point-mass Moon alone (checks of the integrator). */
  forceNumerical?: boolean;
}

/** An orbit that meets the lunar reference sphere inside the span: bad input. */
export class LunarImpactError extends InputError {
  constructor(
    readonly satelliteId: string,
    readonly ttJ2000S: number,
    readonly radiusKm: number,
  ) {
    super(
      `orbit of ${satelliteId} comes within ${radiusKm.toFixed(1)} km of the Moon's centre (below the 1737.4 km reference sphere) at TT ${ttJ2000S.toFixed(0)} s after J2000.0`,
      satelliteId,
      'raise the periselene (a·(1 − e) > 1737.4 km) or end the span before the impact',
    );
    this.name = 'LunarImpactError';
  }
}

const NODE = 9;
const DENSE_TARGET_M = 1e-4;
const DENSE_REJECT_M = 3e-4;

/** A Moon-centred orbit, served as geocentric TEME states. */
export class LunarOrbitTrajectory implements Trajectory {
  readonly id: string;
  readonly frame = 'TEME' as const;
  readonly body = 'moon' as const;
  readonly epochTtJ2000S: number;
  readonly validFromTtJ2000S: number;
  readonly validToTtJ2000S: number;
  readonly sourceLabel: string;
  readonly forces: LunarForces;
  /** Osculating two-body elements about the Moon at the epoch, LCRS axes. */
  readonly elements: KeplerianElements;
  private readonly taus: Float64Array;
  private readonly nodes: Float64Array;
  private readonly analytic: boolean;
  private readonly moon = new Float64Array(6);
  private readonly rot = new Float64Array(9);
  private readonly lr = new Float64Array(3);
  private readonly lv = new Float64Array(3);

  constructor(opts: LunarOrbitOptions) {
    this.id = opts.id;
    this.epochTtJ2000S = opts.epochTtJ2000S;
    this.forces = opts.forces;
    const values = [opts.epochTtJ2000S, opts.fromTtJ2000S, opts.toTtJ2000S, ...opts.positionM, ...opts.velocityMPerS];
    if (opts.positionM.length !== 3 || opts.velocityMPerS.length !== 3 || !values.every(Number.isFinite)) {
      throw new InputError(`initial state or span of ${opts.id} has a missing or non-finite value`, opts.id, 'give a 3-vector position and velocity and finite times');
    }
    if (!(opts.fromTtJ2000S <= opts.toTtJ2000S)) throw new InputError(`span of ${opts.id} ends before it starts`, opts.id, 'give the start of the span before its end');
    checkLunarEphemerisSpan(opts.fromTtJ2000S, opts.id);
    checkLunarEphemerisSpan(opts.toTtJ2000S, opts.id);
    const gm = opts.forces.moon.gmM3PerS2;
    this.elements = elementsFromState(opts.positionM, opts.velocityMPerS, gm, opts.epochTtJ2000S);
    const el = this.elements;
    if (!(el.aM > 0 && el.e < 1)) {
      throw new InputError(`state of ${opts.id} is not bound to the Moon (a = ${(el.aM / 1000).toFixed(1)} km, e = ${el.e.toFixed(4)})`, opts.id, 'give a Moon-centred state (km, km/s) of a closed lunar orbit');
    }
    const periRadiusM = el.aM * (1 - el.e);
    if (periRadiusM < IAU_MOON_MEAN_RADIUS_M) throw new LunarImpactError(opts.id, opts.epochTtJ2000S, periRadiusM / 1000);
    this.validFromTtJ2000S = opts.fromTtJ2000S;
    this.validToTtJ2000S = opts.toTtJ2000S;
    const f = opts.forces;
    this.analytic = f.moon.j2 === 0 && f.moon.c22 === 0 && !f.earth && !f.sun && opts.forceNumerical !== true;
    const terms = ['point mass', f.moon.j2 !== 0 ? 'J2' : '', f.moon.c22 !== 0 ? 'C22' : '', f.earth ? 'Earth' : '', f.sun ? 'Sun' : ''].filter((s) => s !== '');
    this.sourceLabel = this.analytic ? 'two-body about the Moon (osculating elements)' : `numerical about the Moon (Cowell, Bulirsch–Stoer; Moon ${terms.join(' + ')})`;
    if (this.analytic) {
      this.taus = new Float64Array(0);
      this.nodes = new Float64Array(0);
      return;
    }
    const { taus, nodes } = this.integrate(opts);
    this.taus = taus;
    this.nodes = nodes;
  }

  /** Osculating elements about the Moon at an instant (Moon mean equator of that instant), two-body about GM_M. */
  osculatingAt(ttJ2000S: number): KeplerianElements {
    const r = new Float64Array(3);
    const v = new Float64Array(3);
    this.lcrsStateInto(ttJ2000S, r, v, 0);
    return lcrsToLunarElements({ positionM: [r[0], r[1], r[2]], velocityMPerS: [v[0], v[1], v[2]] }, this.forces.moon.gmM3PerS2, ttJ2000S);
  }

  /** Orbital period of the osculating epoch elements about the Moon [s]. */
  get periodS(): number {
    return 2 * Math.PI * Math.sqrt(this.elements.aM ** 3 / this.forces.moon.gmM3PerS2);
  }

  private forceFn(): Force {
    const f = this.forces;
    const ep = this.epochTtJ2000S;
    const m = new Float64Array(6);
    const s = new Float64Array(6);
    const rot = new Float64Array(9);
    const third = (gm: number, sx: number, sy: number, sz: number, x: number, y: number, z: number, out: Float64Array, o: number): void => {
      const dx = sx - x;
      const dy = sy - y;
      const dz = sz - z;
      const d3 = Math.pow(dx * dx + dy * dy + dz * dz, 1.5);
      const s3 = Math.pow(sx * sx + sy * sy + sz * sz, 1.5);
      out[o] += gm * (dx / d3 - sx / s3);
      out[o + 1] += gm * (dy / d3 - sy / s3);
      out[o + 2] += gm * (dz / d3 - sz / s3);
    };
    return (tau, x, y, z, out, o) => {
      const t = ep + tau;
      icrfToMoonFixedInto(t, rot);
      moonAccelerationInertialInto(f.moon, rot, x, y, z, out, o);
      if (f.earth || f.sun) moonStateGcrfInto(t, m, 0);
      if (f.earth) third(WGS84_GM_M3_PER_S2, -m[0], -m[1], -m[2], x, y, z, out, o);
      if (f.sun) {
        sunStateGcrfInto(t, s, 0);
        third(IERS2010_GM_SUN_M3_PER_S2, s[0] - m[0], s[1] - m[1], s[2] - m[2], x, y, z, out, o);
      }
    };
  }

  /** Both legs from the epoch; nodes (r, v, a) sorted by τ. */
  private integrate(opts: LunarOrbitOptions): { taus: Float64Array; nodes: Float64Array } {
    const gm = this.forces.moon.gmM3PerS2;
    const stepper = new GbsStepper(this.forceFn(), gm, opts.relTol ?? 1e-12);
    const maxSteps = opts.maxSteps ?? 2_000_000;
    const y0 = Float64Array.from([...opts.positionM, ...opts.velocityMPerS]);
    const a0 = new Float64Array(3);
    stepper.accel(0, y0[0], y0[1], y0[2], a0, 0);
    const fwd = this.leg(stepper, y0, a0, Math.max(0, opts.toTtJ2000S - opts.epochTtJ2000S), maxSteps);
    const bwd = this.leg(stepper, y0, a0, Math.min(0, opts.fromTtJ2000S - opts.epochTtJ2000S), maxSteps);
    const count = fwd.taus.length + bwd.taus.length - 1;
    const taus = new Float64Array(count);
    const nodes = new Float64Array(count * NODE);
    let k = 0;
    for (let i = bwd.taus.length - 1; i >= 1; i--, k++) {
      taus[k] = bwd.taus[i];
      nodes.set(bwd.nodes.subarray(i * NODE, (i + 1) * NODE), k * NODE);
    }
    for (let i = 0; i < fwd.taus.length; i++, k++) {
      taus[k] = fwd.taus[i];
      nodes.set(fwd.nodes.subarray(i * NODE, (i + 1) * NODE), k * NODE);
    }
    return { taus, nodes };
  }

  private leg(stepper: GbsStepper, y0: Float64Array, a0: Float64Array, target: number, maxSteps: number): { taus: number[]; nodes: Float64Array } {
    const taus = [0];
    const out: number[] = [...y0, ...a0];
    if (target === 0) return { taus, nodes: Float64Array.from(out) };
    const dir = target > 0 ? 1 : -1;
    const y = Float64Array.from(y0);
    const prev = new Float64Array(NODE);
    const next = new Float64Array(NODE);
    const yNew = new Float64Array(6);
    const pr = new Float64Array(3);
    const pv = new Float64Array(3);
    const aMid = new Float64Array(3);
    prev.set(y0, 0);
    prev.set(a0, 6);
    let tau = 0;
    let hAbs = this.periodS / 100;
    for (let steps = 0; dir * (target - tau) > 0; steps++) {
      if (steps > maxSteps) throw new InternalError(`lunar orbit integration of ${this.id} exceeded ${maxSteps} steps`, 'steps');
      const rN = Math.hypot(y[0], y[1], y[2]);
      hAbs = Math.min(hAbs, 0.25 * Math.sqrt((rN * rN * rN) / this.forces.moon.gmM3PerS2));
      const remaining = dir * (target - tau);
      const last = remaining <= hAbs * (1 + 1e-12);
      if (last) hAbs = remaining;
      if (hAbs < 1e-6) throw new InternalError(`lunar orbit step underflow for ${this.id} at τ = ${tau} s`, 'stepS');
      const h = dir * hAbs;
      const k = stepper.step(tau, y, prev.subarray(6, 9), h, yNew);
      if (k < 0) {
        hAbs *= Math.min(0.7, Math.max(0.2, stepper.fac[K_MAX]));
        continue;
      }
      const tauNew = last ? target : tau + h;
      next.set(yNew, 0);
      stepper.accel(tauNew, yNew[0], yNew[1], yNew[2], next, 6);
      const tauMid = 0.5 * (tau + tauNew);
      hermiteInto(tau, prev, 0, tauNew, next, 0, tauMid, pr, pv, 0);
      stepper.accel(tauMid, pr[0], pr[1], pr[2], aMid, 0);
      let dA2 = 0;
      for (let c = 0; c < 3; c++) dA2 += ((1.5 * (next[3 + c] - prev[3 + c])) / h - 0.25 * (prev[6 + c] + next[6 + c]) - aMid[c]) ** 2;
      const denseErrM = (h * h * Math.sqrt(dA2)) / 24;
      const hDense = hAbs * Math.min(4, 0.9 * Math.pow(DENSE_TARGET_M / Math.max(denseErrM, 1e-300), 1 / 6));
      if (denseErrM > DENSE_REJECT_M) {
        hAbs = hDense;
        continue;
      }
      const rNew = Math.hypot(yNew[0], yNew[1], yNew[2]);
      const rMid = Math.hypot(pr[0], pr[1], pr[2]);
      if (Math.min(rNew, rMid) < IAU_MOON_MEAN_RADIUS_M) throw new LunarImpactError(this.id, this.epochTtJ2000S + tauNew, Math.min(rNew, rMid) / 1000);
      y.set(yNew);
      prev.set(next);
      tau = tauNew;
      taus.push(tau);
      for (let c = 0; c < NODE; c++) out.push(next[c]);
      let bestW = Infinity;
      let bestH = hAbs;
      for (let j = K_MIN; j <= k; j++) {
        const hj = hAbs * Math.min(4, Math.max(0.2, stepper.fac[j]));
        if (WORK[j] / hj < bestW) {
          bestW = WORK[j] / hj;
          bestH = hj;
        }
      }
      hAbs = Math.min(bestH, hDense);
    }
    return { taus, nodes: Float64Array.from(out) };
  }

  /** Moon-centred state (LCRS) [m, m/s] at TT s since J2000.0, into outR/outV at offset o. */
  lcrsStateInto(ttJ2000S: number, outR: Float64Array, outV: Float64Array, o = 0): void {
    const tau = ttJ2000S - this.epochTtJ2000S;
    if (this.analytic) {
      const { r, v } = keplerState(this.elements, this.forces.moon.gmM3PerS2, tau);
      for (let c = 0; c < 3; c++) {
        outR[o + c] = r[c];
        outV[o + c] = v[c];
      }
      return;
    }
    const ts = this.taus;
    let lo = 0;
    let hi = ts.length - 2;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (ts[mid] <= tau) lo = mid;
      else hi = mid - 1;
    }
    if (ts.length === 1) {
      for (let c = 0; c < 3; c++) {
        outR[o + c] = this.nodes[c];
        outV[o + c] = this.nodes[3 + c];
      }
      return;
    }
    hermiteInto(ts[lo], this.nodes, NODE * lo, ts[lo + 1], this.nodes, NODE * (lo + 1), tau, outR, outV, o);
  }

  /** Geocentric GCRF state into r/v at offset o. */
  private geocentricInto(ttJ2000S: number, outR: Float64Array, outV: Float64Array, o: number): void {
    this.lcrsStateInto(ttJ2000S, this.lr, this.lv, 0);
    const m = moonStateGcrfInto(ttJ2000S, this.moon, 0);
    const q = gcrfToTemeInto(ttJ2000S, this.rot);
    const r = this.lr;
    const v = this.lv;
    for (let c = 0; c < 3; c++) {
      r[c] += m[c];
      v[c] += m[3 + c];
    }
    rotateInto(q, r, 0, outR, o);
    rotateInto(q, v, 0, outV, o);
  }

  stateAt(ttJ2000S: number): StateM<'TEME'> {
    checkSpan(this, ttJ2000S);
    const r = new Float64Array(3);
    const v = new Float64Array(3);
    this.geocentricInto(ttJ2000S, r, v, 0);
    return { ttJ2000S, positionM: vec3(r[0], r[1], r[2]), velocityMPerS: vec3(v[0], v[1], v[2]) };
  }

  sampleInto(ttJ2000S: Float64Array, out: StateBlock): void {
    for (let i = 0; i < ttJ2000S.length; i++) {
      checkSpan(this, ttJ2000S[i]);
      this.geocentricInto(ttJ2000S[i], out.positionM, out.velocityMPerS, 3 * i);
    }
  }

  /** Integrator nodes (diagnostics). */
  get nodeCount(): number {
    return this.taus.length;
  }
}

/** True for a trajectory about the Moon (a lunar orbit, or a Moon-centred OEM), not a clock at rest on it. */
export function isLunarOrbiter(traj: Trajectory): boolean {
  return traj instanceof LunarOrbitTrajectory || ((traj as { body?: string }).body === 'moon' && !('site' in traj));
}

/**
 * Osculating two-body elements about the Moon (GM of DE430) at an instant, for any lunar orbiter:
 * the lunar orbit's own, or from its geocentric state less the Moon's (TEME axes: a, e and the
 * period are what the callers use).
 */
export function lunarElementsAt(traj: Trajectory, ttJ2000S: number): KeplerianElements {
  if (traj instanceof LunarOrbitTrajectory) return traj.osculatingAt(ttJ2000S);
  const s = traj.stateAt(ttJ2000S);
  const g = moonStateGcrfInto(ttJ2000S, new Float64Array(6), 0);
  const q = gcrfToTemeInto(ttJ2000S, new Float64Array(9));
  const m = new Float64Array(6);
  rotateInto(q, g, 0, m, 0);
  rotateInto(q, g, 3, m, 3);
  const r = [s.positionM[0] - m[0], s.positionM[1] - m[1], s.positionM[2] - m[2]];
  const v = [s.velocityMPerS[0] - m[3], s.velocityMPerS[1] - m[4], s.velocityMPerS[2] - m[5]];
  return elementsFromState(r, v, DE430_GM_MOON_M3_PER_S2, ttJ2000S);
}
