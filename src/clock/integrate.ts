/**
 * Integration of the fractional offset along a trajectory (physics.md §1): x(t) = ∫ y dt.
 * The span is cut into equal steps; each step uses an n-point Gauss–Legendre rule
 * (exact for polynomials of degree 2n − 1). The n node values also define an interpolating
 * polynomial per step, integrated analytically for dense output, so x is continuous and
 * available at any instant without re-sampling the orbit.
 *
 * Accuracy: with n = 8 and steps of at most P/40 (P the period, shorter near perigee) the error
 * is far below 1 ps/day (tests/clock-integration.test.ts measures it against a 1-s reference).
 */
import { InternalError } from '../errors.ts';
import type { StateBlock, Trajectory } from '../orbit/trajectory.ts';
import { allocStateBlock } from '../orbit/trajectory.ts';
import { gaussLegendre, inverseVandermonde } from './quadrature.ts';

/** Quadrature points per step. */
export const GAUSS_POINTS_PER_STEP = 8;
const RULE = gaussLegendre(GAUSS_POINTS_PER_STEP);
const VINV = inverseVandermonde(RULE.nodes);
/**
 * NODE_INT[j·n + i]: weight of node value y_i in ∫ from the step start to node j, in units of h/2
 * (the interpolating polynomial integrated analytically), so node integrals need no polynomial.
 */
const NODE_INT = (() => {
  const n = RULE.nodes.length;
  const w = new Float64Array(n * n);
  for (let j = 0; j < n; j++) {
    const u = RULE.nodes[j];
    for (let i = 0; i < n; i++) {
      let acc = 0;
      let up = u;
      let lowp = -1;
      for (let r = 0; r < n; r++) {
        acc += (VINV[r * n + i] * (up - lowp)) / (r + 1);
        up *= u;
        lowp = -lowp;
      }
      w[j * n + i] = acc;
    }
  }
  return w;
})();

/**
 * Quadrature weights of `count` integration nodes laid out as {@link integrateBulkAlong} lays them
 * (steps of equal length, GAUSS_POINTS_PER_STEP nodes each), in units of half a step. Σ wᵢ·f(tᵢ)
 * is then ∫ f dt / (h/2) to the rule's order: the weights a least-squares fit over the nodes needs
 * to stand for the continuous fit over the span.
 */
export function nodeQuadratureWeights(count: number): Float64Array {
  const w = new Float64Array(count);
  for (let i = 0; i < count; i++) w[i] = RULE.weights[i % GAUSS_POINTS_PER_STEP];
  return w;
}

/** A function of one state: position [m] and inertial velocity [m/s], in true-of-date axes. */
export type StateFunction = (x: number, y: number, z: number, vx: number, vy: number, vz: number, ttJ2000S: number) => number;

/** Dense integral X(t) = ∫_{from}^{t} f dt [s·(unit of f)] over a span, built once. */
export class IntegratedTrack {
  constructor(
    /** Start of the span, seconds since J2000.0 TT. */
    readonly fromTtJ2000S: number,
    /** Step length [s]. */
    readonly stepS: number,
    /** Number of steps. */
    readonly stepCount: number,
    /** Monomial coefficients of f on each step in u ∈ [−1, 1], n per step. */
    private readonly coeffs: Float64Array,
    /** X at each step start (stepCount + 1 values). */
    private readonly xAtStepStart: Float64Array,
  ) {}

  get toTtJ2000S(): number {
    return this.fromTtJ2000S + this.stepS * this.stepCount;
  }

  /** Step index of an instant (no allocation: the hot path of every offset query). */
  private stepOf(rel: number): number {
    if (this.coeffs.length === 0) throw new InternalError('clock track built without dense output was queried between nodes', 'clock offset');
    if (rel < -1e-9 || rel > this.stepCount + 1e-9) {
      throw new InternalError(`clock track queried outside its span (step ${rel.toFixed(3)} of ${this.stepCount})`, 'clock offset');
    }
    return Math.min(this.stepCount - 1, Math.max(0, Math.floor(rel)));
  }

  /** X(t) = ∫_{from}^{t} f dt. */
  integralAt(ttJ2000S: number): number {
    const rel = (ttJ2000S - this.fromTtJ2000S) / this.stepS;
    const k = this.stepOf(rel);
    const u = 2 * (rel - k) - 1;
    const n = GAUSS_POINTS_PER_STEP;
    let sum = 0;
    let up = u;
    let lowp = -1;
    for (let j = 0; j < n; j++) {
      sum += (this.coeffs[k * n + j] * (up - lowp)) / (j + 1);
      up *= u;
      lowp *= -1;
    }
    return this.xAtStepStart[k] + 0.5 * this.stepS * sum;
  }

  /** f(t) from the step's interpolating polynomial. */
  valueAt(ttJ2000S: number): number {
    const rel = (ttJ2000S - this.fromTtJ2000S) / this.stepS;
    const k = this.stepOf(rel);
    const u = 2 * (rel - k) - 1;
    const n = GAUSS_POINTS_PER_STEP;
    let v = 0;
    for (let j = n - 1; j >= 0; j--) v = v * u + this.coeffs[k * n + j];
    return v;
  }

  /**
   * Bounds on the interpolant f over steps `first`..`last` (clamped to the track), read from its
   * monomial coefficients c_j in u ∈ [−1, 1]: `slopePerU` = max Σ j·|c_j| ≥ |df/du|, `value` =
   * max Σ |c_j| ≥ |f|, and `jump` = the largest |f| jump where two of these steps meet (the
   * polynomials' end values, as integralAt integrates them). For the offset bending bounds of the
   * keep-in scans (plan/offsetBend.ts); no allocation beyond the result.
   */
  polynomialBounds(first: number, last: number): { slopePerU: number; value: number; jump: number } {
    const n = GAUSS_POINTS_PER_STEP;
    const c = this.coeffs;
    const lo = Math.max(0, first);
    const hi = Math.min(this.stepCount - 1, last);
    let slopePerU = 0;
    let value = 0;
    let jump = 0;
    let prevRight = Number.NaN;
    for (let k = lo; k <= hi; k++) {
      let slope = 0;
      let abs = 0;
      let left = 0;
      let right = 0;
      for (let j = 0; j < n; j++) {
        const cj = c[k * n + j];
        slope += j * Math.abs(cj);
        abs += Math.abs(cj);
        left += j % 2 === 0 ? cj : -cj;
        right += cj;
      }
      if (slope > slopePerU) slopePerU = slope;
      if (abs > value) value = abs;
      if (k > lo) jump = Math.max(jump, Math.abs(left - prevRight));
      prevRight = right;
    }
    return { slopePerU, value, jump };
  }

  /** X over the whole span. */
  get total(): number {
    return this.xAtStepStart[this.stepCount];
  }
}

/** Called with every chunk of sampled nodes (times and states), for callers that need the states too. */
export type NodeVisitor = (ttJ2000S: Float64Array, states: StateBlock, count: number) => void;

/**
 * Step length [s] for a trajectory: ≤ 1800 s, ≤ P/8, shorter for eccentric orbits (perigee passes,
 * where the rate changes on a time scale of (1 − e)^1.5 of the mean). With 8 Gauss points this is
 * still far below 1 ps/day (tests/clock-integration.test.ts), at a few hundred states per day.
 */
export function clockStepS(periodS: number, e: number): number {
  const raw = (periodS / 8) * Math.pow(Math.max(1 - e, 0.05), 1.5);
  return Math.min(1800, Math.max(5, raw));
}

/**
 * Integrate several state functions along `traj` over [from, to]. The span is rounded up to a
 * whole number of steps of at most `maxStepS` (the last step ends exactly at `to`).
 * One bulk sampling of the trajectory feeds all functions.
 */
export function integrateAlong(
  traj: Trajectory,
  fromTtJ2000S: number,
  toTtJ2000S: number,
  maxStepS: number,
  fns: readonly StateFunction[],
  visit?: NodeVisitor,
  /** When given, receives ∫ f from the span start to every node, per function (stepCount·8 values each). */
  nodeIntegrals?: Float64Array[],
  /** False skips the per-step polynomials: the tracks then give only `total` (callers that use node integrals). */
  denseOutput = true,
): IntegratedTrack[] {
  const evaluate: BulkEvaluator = (p, v, count, outs, t) => {
    for (let f = 0; f < fns.length; f++) {
      const fn = fns[f];
      const o = outs[f];
      for (let i = 0; i < count; i++) o[i] = fn(p[3 * i], p[3 * i + 1], p[3 * i + 2], v[3 * i], v[3 * i + 1], v[3 * i + 2], t[i]);
    }
  };
  return integrateBulkAlong(traj, fromTtJ2000S, toTtJ2000S, maxStepS, fns.length, evaluate, visit, nodeIntegrals, denseOutput);
}

/**
 * Fills `outs[f][i]` with function f at state i of a sampled chunk (positions [m], inertial
 * velocities [m/s], packed xyz). One call per chunk: hot callers evaluate all functions in one loop.
 */
export type BulkEvaluator = (positionM: Float64Array, velocityMPerS: Float64Array, count: number, outs: Float64Array[], ttJ2000S: Float64Array) => void;

/** {@link integrateAlong} with the functions evaluated in bulk by `evaluate` (`functionCount` of them). */
export function integrateBulkAlong(
  traj: Trajectory,
  fromTtJ2000S: number,
  toTtJ2000S: number,
  maxStepS: number,
  functionCount: number,
  evaluate: BulkEvaluator,
  visit?: NodeVisitor,
  nodeIntegrals?: Float64Array[],
  denseOutput = true,
): IntegratedTrack[] {
  const spanS = toTtJ2000S - fromTtJ2000S;
  if (!(spanS > 0)) throw new InternalError(`integration span ${spanS} s is not positive`, 'clock span');
  const stepCount = Math.max(1, Math.ceil(spanS / maxStepS - 1e-9));
  const stepS = spanS / stepCount;
  const n = GAUSS_POINTS_PER_STEP;
  const k = functionCount;
  // Sample in chunks so memory stays bounded on long horizons.
  const chunkSteps = Math.min(4096, stepCount);
  const coeffs = Array.from({ length: k }, () => new Float64Array(denseOutput ? stepCount * n : 0));
  const xs = Array.from({ length: k }, () => new Float64Array(stepCount + 1));
  const times = new Float64Array(chunkSteps * n);
  const block: StateBlock = allocStateBlock(chunkSteps * n);
  const vals = Array.from({ length: k }, () => new Float64Array(chunkSteps * n));
  for (let s0 = 0; s0 < stepCount; s0 += chunkSteps) {
    const s1 = Math.min(stepCount, s0 + chunkSteps);
    const count = (s1 - s0) * n;
    const t = count === times.length ? times : times.subarray(0, count);
    for (let s = s0; s < s1; s++) {
      const mid = fromTtJ2000S + (s + 0.5) * stepS;
      for (let j = 0; j < n; j++) t[(s - s0) * n + j] = mid + 0.5 * stepS * RULE.nodes[j];
    }
    const out: StateBlock = count === times.length ? block : { positionM: block.positionM.subarray(0, 3 * count), velocityMPerS: block.velocityMPerS.subarray(0, 3 * count) };
    traj.sampleInto(t, out);
    if (visit !== undefined) visit(t, out, count);
    evaluate(out.positionM, out.velocityMPerS, count, vals, t);
    for (let f = 0; f < k; f++) {
      const values = vals[f];
      const c = coeffs[f];
      const x = xs[f];
      const nodeOut = nodeIntegrals?.[f];
      for (let s = s0; s < s1; s++) {
        const base = (s - s0) * n;
        let integral = 0;
        for (let j = 0; j < n; j++) integral += RULE.weights[j] * values[base + j];
        if (!Number.isFinite(integral)) throw new InternalError(`non-finite clock rate at step ${s} of ${traj.id}`, 'fractional offset');
        if (denseOutput) {
          for (let r = 0; r < n; r++) {
            let cr = 0;
            for (let j = 0; j < n; j++) cr += VINV[r * n + j] * values[base + j];
            c[s * n + r] = cr;
          }
        }
        if (nodeOut !== undefined) {
          for (let j = 0; j < n; j++) {
            let acc = 0;
            for (let i = 0; i < n; i++) acc += NODE_INT[j * n + i] * values[base + i];
            nodeOut[s * n + j] = x[s] + 0.5 * stepS * acc;
          }
        }
        x[s + 1] = x[s] + 0.5 * stepS * integral;
      }
    }
  }
  return Array.from({ length: k }, (_, f) => new IntegratedTrack(fromTtJ2000S, stepS, stepCount, coeffs[f], xs[f]));
}
