/**
 * Use case `sweep --body moon`: the mean rate of a clock in a circular (or given-eccentricity) orbit
 * about the Moon against its altitude above the 1737.4 km sphere, against the lunar surface reference
 * clock and against TT, and the altitude where an orbiting clock matches the surface clock.
 *
 * Each row integrates the orbit over two periods (at most one day) against the surface reference
 * over the same span: that difference hardly depends on the span (the monthly Earth–Moon term is
 * common). The rate against TT is that difference plus the reference's long-term rate, taken once
 * over an anomalistic month. For two-body motion the match is at a = 3R/2 (868.7 km altitude;
 * derived from −(3GM_M/(2a) − GM_M/R)/c² = 0).
 */
import { InputError, InternalError } from '../errors.ts';
import { LunarExternalField } from '../clock/lunarRate.ts';
import type { GravityModel } from '../orbit/gravity.ts';
import { lunarForces, lunarOrbitFromElements, type LunarForceModelName } from '../orbit/lunarOrbitInput.ts';
import { LunarSurfaceTrajectory, MEAN_SUB_EARTH_POINT, type SelenographicSite } from '../orbit/lunarSurface.ts';
import { IAU_MOON_MEAN_RADIUS_M } from '../orbit/moonBody.ts';
import { analyseLunarRate, ANOMALISTIC_MONTH_S } from './lunarRates.ts';
import { sizeLunarClock } from './lunarSize.ts';

export interface LunarSweepRequest {
  fromKm: number;
  toKm: number;
  points: number;
  e: number;
  iDeg: number;
  earthGravity: GravityModel;
  forces: LunarForceModelName;
  epochTtJ2000S: number;
  reference?: SelenographicSite;
}

export interface LunarSweepRow {
  /** Altitude of the semi-major axis above the 1737.4 km sphere [km]. */
  altitudeKm: number;
  /** Long-term rate against TT (dimensionless). */
  meanFractionalOffset: number;
  /** Rate against the lunar surface reference (dimensionless). */
  meanFractionalOffsetVsLunarSurface: number;
  /** Gravitational (Earth + Moon + Sun) and velocity parts of the rate over the row's span. */
  gravitational: number;
  velocity: number;
}

export interface LunarSweepResult {
  rows: LunarSweepRow[];
  /** The reference clock's long-term rate against TT (one anomalistic month). */
  referenceFractionalOffset: number;
  /** Altitude [km] where the orbiting clock keeps the surface reference's rate; null when the range holds none. */
  surfaceMatchAltitudeKm: number | null;
}

const MOON_R_KM = IAU_MOON_MEAN_RADIUS_M / 1000;
const MAX_BISECTIONS = 40;

function rowAt(req: LunarSweepRequest, altitudeKm: number, refMean: number): LunarSweepRow {
  const aKm = MOON_R_KM + altitudeKm;
  const periodS = 2 * Math.PI * Math.sqrt((aKm * 1e3) ** 3 / 4.902800066e12);
  const spanS = Math.min(86_400, 2 * periodS);
  const span = { fromTtJ2000S: req.epochTtJ2000S, toTtJ2000S: req.epochTtJ2000S + spanS };
  const el = { epochTtJ2000S: req.epochTtJ2000S, aKm, e: req.e, iDeg: req.iDeg, raanDeg: 0, argpDeg: 90, meanAnomalyDeg: 0 };
  const built = lunarOrbitFromElements(`${altitudeKm} km`, el, lunarForces(req.forces), span, { a: '--from-km/--to-km', e: '--e' });
  const r = sizeLunarClock({ trajectory: built.trajectory, earthGravity: req.earthGravity, fromTtJ2000S: span.fromTtJ2000S, spanS, nominalHz: 10.23e6, reference: req.reference });
  const vs = r.meanFractionalOffsetVsLunarSurface;
  return { altitudeKm, meanFractionalOffset: refMean + vs, meanFractionalOffsetVsLunarSurface: vs, gravitational: r.parts.earth + r.parts.moon + r.parts.sun, velocity: r.parts.velocity };
}

/** Sweep altitudes about the Moon. */
export function sweepLunarAltitude(req: LunarSweepRequest): LunarSweepResult {
  if (!(req.points >= 2 && req.points <= 2000 && Number.isInteger(req.points))) throw new InputError(`${req.points} points`, '--points', 'give a whole number of points, 2 … 2000');
  if (!(req.fromKm < req.toKm)) throw new InputError(`altitude range ${req.fromKm} … ${req.toKm} km is empty`, '--from-km/--to-km', 'give --from-km below --to-km');
  if ((MOON_R_KM + req.fromKm) * (1 - req.e) <= MOON_R_KM) {
    throw new InputError(`the lowest orbit (altitude ${req.fromKm} km, e = ${req.e}) intersects the Moon`, '--from-km', 'raise --from-km or lower --e so that the periselene stays above 1737.4 km');
  }
  const reference = req.reference ?? MEAN_SUB_EARTH_POINT;
  const month = { from: req.epochTtJ2000S, to: req.epochTtJ2000S + ANOMALISTIC_MONTH_S };
  const refTraj = new LunarSurfaceTrajectory('lunar surface reference', reference, month.from, month.to);
  const refMean = analyseLunarRate(refTraj, req.earthGravity, new LunarExternalField(), month.from, ANOMALISTIC_MONTH_S, 3600, false).meanFractionalOffset;
  const rows: LunarSweepRow[] = [];
  for (let i = 0; i < req.points; i++) rows.push(rowAt(req, req.fromKm + ((req.toKm - req.fromKm) * i) / (req.points - 1), refMean));
  let match: number | null = null;
  for (let i = 1; i < rows.length && match === null; i++) {
    const a = rows[i - 1];
    const b = rows[i];
    if (Math.sign(a.meanFractionalOffsetVsLunarSurface) === Math.sign(b.meanFractionalOffsetVsLunarSurface)) continue;
    let lo = a.altitudeKm;
    let hi = b.altitudeKm;
    let flo = a.meanFractionalOffsetVsLunarSurface;
    for (let k = 0; k < MAX_BISECTIONS && hi - lo > 1e-3; k++) {
      const mid = 0.5 * (lo + hi);
      const f = rowAt(req, mid, refMean).meanFractionalOffsetVsLunarSurface;
      if (Math.sign(f) === Math.sign(flo)) {
        lo = mid;
        flo = f;
      } else hi = mid;
    }
    match = 0.5 * (lo + hi);
  }
  if (rows.some((r) => !Number.isFinite(r.meanFractionalOffset))) throw new InternalError('non-finite rate in the lunar sweep', 'meanFractionalOffset');
  return { rows, referenceFractionalOffset: refMean, surfaceMatchAltitudeKm: match };
}
