/**
 * Use case `size`: the factory frequency offset that makes an onboard clock keep ground (TT) rate
 * in orbit, with the split into gravitational and velocity parts, the periodic terms and the
 * sensitivity to the orbit. Contract: `tauplan size`.
 */
import { InternalError } from '../errors.ts';
import { clockStepS, GAUSS_POINTS_PER_STEP, integrateBulkAlong, nodeQuadratureWeights } from '../clock/integrate.ts';
import type { GravityModel } from '../orbit/gravity.ts';
import { conventionalPeriodicS, SPEED_OF_LIGHT_SQUARED_M2_PER_S2 as C2, totalPotentialM2PerS2 } from '../clock/rate.ts';
import { IERS2010_L_G, SECONDS_PER_DAY } from '../constants.ts';
import { elementsFromState } from '../orbit/keplerian.ts';
import type { Trajectory } from '../orbit/trajectory.ts';
import { isLunarOrbiter, lunarElementsAt } from '../orbit/lunarOrbit.ts';
import { sizeLunarClock } from './lunarSize.ts';
import { DE430_GM_MOON_M3_PER_S2, IAU_MOON_MEAN_RADIUS_M } from '../orbit/moonBody.ts';

export interface SizeRequest {
  trajectory: Trajectory;
  gravity: GravityModel;
  fromTtJ2000S: number;
  spanS: number;
  nominalHz: number;
  /**
   * Rebuilds the orbit with its semi-major axis changed by `deltaAKm`, for a measured sensitivity.
   * Absent for sources with no elements to change (the closed form 3GM/(2a²c²) is used then).
   */
  rebuildWithDeltaAKm?: (deltaAKm: number) => Trajectory;
}

/** Osculating two-body summary at the start of the span (for the report). */
export interface OrbitSummary {
  aKm: number;
  e: number;
  iDeg: number;
  periodS: number;
  perigeeAltitudeKm: number;
  apogeeAltitudeKm: number;
}

export interface SizeResult {
  satellite: string;
  source: string;
  gravity: string;
  fromTtJ2000S: number;
  spanS: number;
  orbit: OrbitSummary;
  /** Slope of the LS line through the proper-time offset after removing −2r·v/c² (dimensionless). */
  meanFractionalOffset: number;
  driftNsPerDay: number;
  components: { gravitational: number; velocity: number };
  nominalHz: number;
  recommendedHz: number;
  recommendedOffsetHz: number;
  eccentricityAmplitudeNs: number;
  residualPeriodicAmplitudeNs: number;
  sensitivityPerKm: number;
  /** 'finite difference ±1 km' or 'closed form 3GM/(2a²c²)'. */
  sensitivityMethod: string;
  /** Time mean of y over the span, (x(end) − x(start))/span; differs from the slope by the periodic term's end points. */
  spanMeanFractionalOffset: number;
  integrationStepS: number;
  statesEvaluated: number;
}

interface Core {
  meanFractionalOffset: number;
  gravitational: number;
  velocity: number;
  eccentricityAmplitudeS: number;
  residualAmplitudeS: number;
  spanMean: number;
  stepS: number;
  states: number;
}

function analyse(traj: Trajectory, gravity: GravityModel, fromTt: number, spanS: number, orbit: OrbitSummary): Core {
  const stepS = clockStepS(orbit.periodS, orbit.e);
  const gm = gravity.gmM3PerS2;
  // The conventional term is taken at the integration nodes themselves: no second sampling.
  const nodeCount = Math.max(1, Math.ceil(spanS / stepS - 1e-9)) * GAUSS_POINTS_PER_STEP;
  const t = new Float64Array(nodeCount);
  const p = new Float64Array(nodeCount);
  let filled = 0;
  const nodeGrav = new Float64Array(nodeCount);
  const nodeVel = new Float64Array(nodeCount);
  const [grav, vel] = integrateBulkAlong(
    traj,
    fromTt,
    fromTt + spanS,
    stepS,
    2,
    (r, v, count, outs, times) => {
      // Both parts in one loop (the hot path of sizing): gravitational L_G − U/c², velocity −v²/(2c²).
      const g = outs[0];
      const w = outs[1];
      for (let i = 0; i < count; i++) {
        const vx = v[3 * i];
        const vy = v[3 * i + 1];
        const vz = v[3 * i + 2];
        g[i] = IERS2010_L_G - totalPotentialM2PerS2(gravity, r[3 * i], r[3 * i + 1], r[3 * i + 2], times[i]) / C2;
        w[i] = (-0.5 * (vx * vx + vy * vy + vz * vz)) / C2;
      }
    },
    (times, block, count) => {
      const r = block.positionM;
      const v = block.velocityMPerS;
      for (let i = 0; i < count; i++, filled++) {
        t[filled] = times[i];
        p[filled] = conventionalPeriodicS(r[3 * i], r[3 * i + 1], r[3 * i + 2], v[3 * i], v[3 * i + 1], v[3 * i + 2]);
      }
    },
    [nodeGrav, nodeVel],
    false,
  );
  const m = filled;
  const xt = new Float64Array(m);
  const xg = new Float64Array(m);
  const xv = new Float64Array(m);
  let pMin = Infinity;
  let pMax = -Infinity;
  for (let i = 0; i < m; i++) {
    const pi = p[i];
    if (pi < pMin) pMin = pi;
    if (pi > pMax) pMax = pi;
    const g = nodeGrav[i];
    const v = nodeVel[i];
    xt[i] = g + v - pi;
    // Each part carries half of the conventional term (exact for two-body motion, where both parts
    // share the periodic −GM/(rc²)), so the parts' slopes add up to the total's slope.
    xg[i] = g - 0.5 * pi;
    xv[i] = v - 0.5 * pi;
  }
  // Weighted by the quadrature weights, so that the node fit is the continuous least-squares line
  // over the span (unweighted Gauss nodes, crowded at the step ends, bias it by ~1e-17 on a Molniya).
  const w = nodeQuadratureWeights(m);
  const lt = lineFit(t, xt, w);
  const lg = lineFit(t, xg, w);
  const lv = lineFit(t, xv, w);
  const residualAmplitudeS = halfRangeAboutLine(t, xt, lt);
  // Less than one period shows only part of the eccentricity term: use the osculating closed form then.
  const eccAmp = spanS >= orbit.periodS ? (pMax - pMin) / 2 : (2 * Math.sqrt(gm * orbit.aKm * 1000) * orbit.e) / C2;
  return {
    meanFractionalOffset: lt.slope,
    gravitational: lg.slope,
    velocity: lv.slope,
    eccentricityAmplitudeS: eccAmp,
    residualAmplitudeS,
    spanMean: (grav.total + vel.total) / spanS,
    stepS: grav.stepS,
    states: m,
  };
}

/**
 * Least-squares line through (t, x) with centred time for precision; with weights w (e.g. the
 * quadrature weights of the nodes) the weighted fit Σ wᵢ (xᵢ − a − b tᵢ)².
 */
export function lineFit(t: Float64Array, x: Float64Array, w?: Float64Array): { slope: number; intercept: number; tMean: number } {
  const n = t.length;
  let sw = 0;
  let tm = 0;
  let xm = 0;
  for (let i = 0; i < n; i++) {
    const wi = w === undefined ? 1 : w[i];
    sw += wi;
    tm += wi * t[i];
    xm += wi * x[i];
  }
  tm /= sw;
  xm /= sw;
  let sxx = 0;
  let sxy = 0;
  for (let i = 0; i < n; i++) {
    const wi = w === undefined ? 1 : w[i];
    const dt = t[i] - tm;
    sxx += wi * dt * dt;
    sxy += wi * dt * (x[i] - xm);
  }
  if (!(sxx > 0)) throw new InternalError('line fit over a zero-length span', 'meanFractionalOffset');
  return { slope: sxy / sxx, intercept: xm, tMean: tm };
}

/** Half the spread (max − min)/2 of x about a fitted line, in x's unit: what swings about the trend. */
export function halfRangeAboutLine(t: Float64Array, x: Float64Array, line: { slope: number; intercept: number; tMean: number }): number {
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < x.length; i++) {
    const d = x[i] - (line.intercept + line.slope * (t[i] - line.tMean));
    lo = Math.min(lo, d);
    hi = Math.max(hi, d);
  }
  return (hi - lo) / 2;
}

/** Osculating summary of a trajectory at an instant. */
export function orbitSummaryAt(traj: Trajectory, ttJ2000S: number, gmM3PerS2: number): OrbitSummary {
  if (isLunarOrbiter(traj)) {
    // About the Moon: elements, period and altitudes (above the 1737.4 km sphere) of the lunar orbit.
    const el = lunarElementsAt(traj, ttJ2000S);
    const aKm = el.aM / 1000;
    const rKm = IAU_MOON_MEAN_RADIUS_M / 1000;
    const periodS = 2 * Math.PI * Math.sqrt(el.aM ** 3 / DE430_GM_MOON_M3_PER_S2);
    return { aKm, e: el.e, iDeg: (el.iRad * 180) / Math.PI, periodS, perigeeAltitudeKm: aKm * (1 - el.e) - rKm, apogeeAltitudeKm: aKm * (1 + el.e) - rKm };
  }
  const s = traj.stateAt(ttJ2000S);
  const el = elementsFromState(s.positionM, s.velocityMPerS, gmM3PerS2, ttJ2000S);
  const aKm = el.aM / 1000;
  return {
    aKm,
    e: el.e,
    iDeg: (el.iRad * 180) / Math.PI,
    periodS: el.aM > 0 ? 2 * Math.PI * Math.sqrt(el.aM ** 3 / gmM3PerS2) : NaN,
    perigeeAltitudeKm: aKm * (1 - el.e) - 6378.137,
    apogeeAltitudeKm: aKm * (1 + el.e) - 6378.137,
  };
}

/** Run the sizing for one orbit. */
export function sizeClock(req: SizeRequest): SizeResult {
  const { trajectory: traj, gravity, fromTtJ2000S: from, spanS } = req;
  // About the Moon: the lunar sizing (lunar periodic terms, rate against a lunar surface clock).
  if (isLunarOrbiter(traj)) return sizeLunarClock({ trajectory: traj, earthGravity: gravity, fromTtJ2000S: from, spanS, nominalHz: req.nominalHz, rebuildWithDeltaAKm: req.rebuildWithDeltaAKm });
  const orbit = orbitSummaryAt(traj, from, gravity.gmM3PerS2);
  if (!(orbit.aKm > 0) || orbit.e >= 1) {
    throw new InternalError(`orbit of ${traj.id} is not closed (a = ${orbit.aKm} km, e = ${orbit.e})`, 'orbit');
  }
  const core = analyse(traj, gravity, from, spanS, orbit);
  let sensitivityPerKm: number;
  let sensitivityMethod: string;
  let states = core.states;
  if (req.rebuildWithDeltaAKm !== undefined) {
    const up = req.rebuildWithDeltaAKm(+1);
    const down = req.rebuildWithDeltaAKm(-1);
    const cu = analyse(up, gravity, from, spanS, orbitSummaryAt(up, from, gravity.gmM3PerS2));
    const cd = analyse(down, gravity, from, spanS, orbitSummaryAt(down, from, gravity.gmM3PerS2));
    sensitivityPerKm = (cu.meanFractionalOffset - cd.meanFractionalOffset) / 2;
    sensitivityMethod = 'central difference, semi-major axis ±1 km, same model';
    states += cu.states + cd.states;
  } else {
    const aM = orbit.aKm * 1000;
    sensitivityPerKm = ((3 * gravity.gmM3PerS2) / (2 * aM * aM * C2)) * 1000;
    sensitivityMethod = 'closed form 3GM/(2a²c²) at the osculating a';
  }
  const y = core.meanFractionalOffset;
  // Computed as a product, not as a difference of two 10 MHz numbers, to keep its digits.
  const recommendedOffsetHz = -req.nominalHz * y;
  const recommendedHz = req.nominalHz + recommendedOffsetHz;
  return {
    satellite: traj.id,
    source: traj.sourceLabel,
    gravity: gravity.name,
    fromTtJ2000S: from,
    spanS,
    orbit,
    meanFractionalOffset: y,
    driftNsPerDay: y * SECONDS_PER_DAY * 1e9,
    components: { gravitational: core.gravitational, velocity: core.velocity },
    nominalHz: req.nominalHz,
    recommendedHz,
    recommendedOffsetHz,
    eccentricityAmplitudeNs: core.eccentricityAmplitudeS * 1e9,
    residualPeriodicAmplitudeNs: core.residualAmplitudeS * 1e9,
    sensitivityPerKm,
    sensitivityMethod,
    spanMeanFractionalOffset: core.spanMean,
    integrationStepS: core.stepS,
    statesEvaluated: states,
  };
}
