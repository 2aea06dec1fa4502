/**
 * Use case `sweep`: the mean fractional offset and its split against altitude, and the break-even
 * altitude where an orbiting clock keeps a geoid clock's rate (y = 0). Each row is a full sizing
 * (same integration as `size`) over two orbital periods (at most one day).
 */
import type { GravityModel } from '../orbit/gravity.ts';
import { WGS84_A_M, GNSS_NOMINAL_HZ } from '../constants.ts';
import { InputError, InternalError } from '../errors.ts';
import { elementsFromDegKm } from '../orbit/keplerian.ts';
import { trajectoryFromKeplerian } from '../orbit/stateVector.ts';
import { sizeClock } from './size.ts';

export interface SweepRequest {
  fromKm: number;
  toKm: number;
  points: number;
  e: number;
  iDeg: number;
  gravity: GravityModel;
  epochTtJ2000S: number;
}

export interface SweepRow {
  altitudeKm: number;
  meanFractionalOffset: number;
  gravitational: number;
  velocity: number;
}

export interface SweepResult {
  rows: SweepRow[];
  /** Altitude [km] above 6378.137 km of the break-even orbit; null when the range holds no sign change. */
  breakEvenAltitudeKm: number | null;
  breakEvenIterations: number;
}

const EARTH_RADIUS_KM = WGS84_A_M / 1000;
const MAX_BRENT_ITERATIONS = 60;

function sizeAt(req: SweepRequest, altitudeKm: number): SweepRow {
  const aKm = EARTH_RADIUS_KM + altitudeKm;
  const el = elementsFromDegKm({ epochTtJ2000S: req.epochTtJ2000S, aKm, e: req.e, iDeg: req.iDeg, raanDeg: 0, argpDeg: 0, meanAnomalyDeg: 0 }, { a: '--from-km', e: '--e' });
  const periodS = 2 * Math.PI * Math.sqrt((aKm * 1000) ** 3 / req.gravity.gmM3PerS2);
  const spanS = Math.min(86400, 2 * periodS);
  const traj = trajectoryFromKeplerian(el, req.gravity, { fromTtJ2000S: req.epochTtJ2000S, toTtJ2000S: req.epochTtJ2000S + spanS }, `sweep ${altitudeKm.toFixed(1)} km`);
  const r = sizeClock({ trajectory: traj, gravity: req.gravity, fromTtJ2000S: req.epochTtJ2000S, spanS, nominalHz: GNSS_NOMINAL_HZ });
  return { altitudeKm, meanFractionalOffset: r.meanFractionalOffset, gravitational: r.components.gravitational, velocity: r.components.velocity };
}

/** Validate and run the sweep. */
export function sweepAltitude(req: SweepRequest): SweepResult {
  if (!(req.points >= 2 && Number.isInteger(req.points) && req.points <= 5000)) throw new InputError(`--points ${req.points} is not a whole number from 2 to 5000`, '--points', 'give e.g. 200');
  if (!(req.toKm > req.fromKm)) throw new InputError(`--to-km ${req.toKm} is not above --from-km ${req.fromKm}`, '--to-km', 'give a range with to > from');
  if ((EARTH_RADIUS_KM + req.fromKm) * (1 - req.e) <= EARTH_RADIUS_KM) {
    throw new InputError(`perigee below the Earth's surface at ${req.fromKm} km with e = ${req.e}`, '--from-km', 'raise --from-km or lower --e so that (6378.137 + altitude)·(1 − e) > 6378.137 km');
  }
  const rows: SweepRow[] = [];
  for (let k = 0; k < req.points; k++) rows.push(sizeAt(req, req.fromKm + ((req.toKm - req.fromKm) * k) / (req.points - 1)));
  // Bracket the first sign change, then Brent's method on the full model.
  let breakEven: number | null = null;
  let iterations = 0;
  for (let k = 1; k < rows.length; k++) {
    const fa = rows[k - 1].meanFractionalOffset;
    const fb = rows[k].meanFractionalOffset;
    if (fa === 0) {
      breakEven = rows[k - 1].altitudeKm;
      break;
    }
    if (Math.sign(fa) !== Math.sign(fb)) {
      const root = brent((h) => sizeAt(req, h).meanFractionalOffset, rows[k - 1].altitudeKm, rows[k].altitudeKm, fa, fb, 1e-4);
      breakEven = root.x;
      iterations = root.iterations;
      break;
    }
  }
  return { rows, breakEvenAltitudeKm: breakEven, breakEvenIterations: iterations };
}

/** Brent's root finder on [a, b] with f(a)·f(b) < 0, to `tol` in x. Capped. */
export function brent(f: (x: number) => number, a: number, b: number, fa: number, fb: number, tol: number): { x: number; iterations: number } {
  let c = a;
  let fc = fa;
  let d = b - a;
  let e = d;
  for (let it = 1; it <= MAX_BRENT_ITERATIONS; it++) {
    if (Math.sign(fb) === Math.sign(fc)) {
      c = a;
      fc = fa;
      d = b - a;
      e = d;
    }
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b;
      b = c;
      c = a;
      fa = fb;
      fb = fc;
      fc = fa;
    }
    const tol1 = 2 * Number.EPSILON * Math.abs(b) + 0.5 * tol;
    const m = 0.5 * (c - b);
    if (Math.abs(m) <= tol1 || fb === 0) return { x: b, iterations: it };
    if (Math.abs(e) >= tol1 && Math.abs(fa) > Math.abs(fb)) {
      const s = fb / fa;
      let p: number;
      let q: number;
      if (a === c) {
        p = 2 * m * s;
        q = 1 - s;
      } else {
        const qq = fa / fc;
        const r = fb / fc;
        p = s * (2 * m * qq * (qq - r) - (b - a) * (r - 1));
        q = (qq - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q;
      else p = -p;
      if (2 * p < Math.min(3 * m * q - Math.abs(tol1 * q), Math.abs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = m;
        e = d;
      }
    } else {
      d = m;
      e = d;
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tol1 ? d : Math.sign(m) * tol1;
    fb = f(b);
  }
  throw new InternalError('break-even root finder did not converge', 'breakEvenAltitudeKm');
}
