/**
 * Events of the numerical propagator: meeting the Earth's surface (WGS-84 ellipsoid, 1 m slack)
 * and the end of a ballistic flight (first downward crossing of a radius), both located on the
 * dense-output interpolant of the step where they happen.
 */
import { WGS84_A_M, WGS84_INV_F } from '../constants.ts';
import { InputError, InternalError } from '../errors.ts';
import { hermiteInto } from './numericalDense.ts';

/** WGS-84 polar semi-axis [m], b = a(1 − f). Derived from NIMA TR8350.2 a and 1/f. */
const WGS84_B_M = WGS84_A_M * (1 - 1 / WGS84_INV_F);
/** A state more than this far inside the ellipsoid counts as having hit the surface [m]. */
const SURFACE_SLACK_M = 1;
const SURFACE_Q_LIMIT = (1 - SURFACE_SLACK_M / WGS84_A_M) ** 2;

/** Component of r [m] along the true pole of the instant τ [s]: identity in true-pole axes. */
export type PoleComponent = (tauS: number, x: number, y: number, z: number) => number;

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

/** True when r [m] is inside the ellipsoid; `zPole` is its component along the true pole. */
export function insideEarth(x: number, y: number, z: number, zPole: number): boolean {
  const r2 = x * x + y * y + z * z;
  const q = (r2 - zPole * zPole) / (WGS84_A_M * WGS84_A_M) + (zPole * zPole) / (WGS84_B_M * WGS84_B_M);
  return q < SURFACE_Q_LIMIT;
}

/** τ [s] where |r| falls through radiusM inside a step, on the Hermite interpolant; safeguarded Newton to 0.1 µs. */
export function radiusCrossing(id: string, tauA: number, nA: Float64Array, tauB: number, nB: Float64Array, radiusM: number, pr: Float64Array, pv: Float64Array): number {
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
  throw new InternalError(`radius crossing of ${id} did not converge`, 'flightEnd');
}

/** First τ [s] inside the ellipsoid on [tauA, hi] by bisection to 0.1 ms (the node at tauA is outside). */
export function surfaceEntry(pole: PoleComponent, tauA: number, nA: Float64Array, tauB: number, nB: Float64Array, hi: number, pr: Float64Array, pv: Float64Array): number {
  let lo = tauA;
  for (let it = 0; it < 80 && Math.abs(hi - lo) > 1e-4; it++) {
    const mid = 0.5 * (lo + hi);
    hermiteInto(tauA, nA, 0, tauB, nB, 0, mid, pr, pv, 0);
    if (insideEarth(pr[0], pr[1], pr[2], pole(mid, pr[0], pr[1], pr[2]))) hi = mid;
    else lo = mid;
  }
  return hi;
}
