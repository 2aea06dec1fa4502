/**
 * Use case `size --body moon`: the factory frequency offset of a clock about (or on) the Moon, against
 * TT and against a lunar surface reference clock (a clock at rest on the 1737.4 km sphere at a chosen
 * selenographic point, by default the mean sub-Earth point), with the split into the Earth, Moon, Sun
 * and velocity parts (./lunarRates.ts; physics.md §12).
 *
 * The default span is one anomalistic month: the clock's rate against TT varies with the Earth–Moon
 * distance (0.47 µs amplitude, up to ±0.11 µs/day on a one-day slope), and the factory offset wants
 * the long-term mean. The rate against the lunar surface reference hardly depends on the span: the
 * monthly term is common to both clocks.
 */
import { SECONDS_PER_DAY } from '../constants.ts';
import { InputError, InternalError } from '../errors.ts';
import type { Trajectory } from '../orbit/trajectory.ts';
import { DE430_GM_MOON_M3_PER_S2 } from '../orbit/moonBody.ts';
import { SPEED_OF_LIGHT_SQUARED_M2_PER_S2 as C2 } from '../clock/rate.ts';
import { clockStepS } from '../clock/integrate.ts';
import { LunarExternalField, type LunarRateParts } from '../clock/lunarRate.ts';
import type { GravityModel } from '../orbit/gravity.ts';
import { isLunarOrbiter, LunarOrbitTrajectory } from '../orbit/lunarOrbit.ts';
import { LunarSurfaceTrajectory, MEAN_SUB_EARTH_POINT, type SelenographicSite } from '../orbit/lunarSurface.ts';
import { analyseLunarRate, ANOMALISTIC_MONTH_S } from './lunarRates.ts';
import { orbitSummaryAt, type OrbitSummary, type SizeResult } from './size.ts';

/** What the recommended frequency keeps: TT (a geoid clock's rate) or the lunar surface reference. */
export type LunarKeep = 'TT' | 'lunar-surface';

/** Default span of lunar sizing [s]: one anomalistic month. */
export const LUNAR_DEFAULT_SPAN_S = ANOMALISTIC_MONTH_S;

export interface LunarSizeRequest {
  /** A lunar orbit, a Moon-centred OEM, or a clock at rest on the Moon. */
  trajectory: Trajectory;
  /** The Earth's field (the scenario's or `--gravity`); the Moon's and Sun's come with the trajectory's model. */
  earthGravity: GravityModel;
  fromTtJ2000S: number;
  spanS: number;
  nominalHz: number;
  /** Where the lunar surface reference clock sits (default the mean sub-Earth point). */
  reference?: SelenographicSite;
  keep?: LunarKeep;
  /** The orbit with its semi-major axis changed by `deltaAKm` (for the measured sensitivity). */
  rebuildWithDeltaAKm?: (deltaAKm: number) => Trajectory;
}

/** {@link SizeResult} for a clock near the Moon, plus the lunar fields. Orbit altitudes are above 1737.4 km. */
export interface LunarSizeResult extends SizeResult {
  body: 'moon';
  keep: LunarKeep;
  /** Mean fractional offset against the lunar surface reference clock (dimensionless). */
  meanFractionalOffsetVsLunarSurface: number;
  /** The reference clock's mean fractional offset against TT over the same span. */
  lunarSurfaceReferenceFractionalOffset: number;
  lunarSurfaceReference: SelenographicSite;
  /** Earth, Moon, Sun and velocity parts of `meanFractionalOffset` (dimensionless). */
  parts: LunarRateParts;
  /** Half the peak-to-peak of the cross term −v_M·ρ/c² [ns]. */
  crossTermAmplitudeNs: number;
}

function summary(traj: Trajectory, t: number): OrbitSummary {
  if (traj instanceof LunarSurfaceTrajectory) {
    const h = traj.site.heightM / 1000;
    return { aKm: NaN, e: 0, iDeg: NaN, periodS: NaN, perigeeAltitudeKm: h, apogeeAltitudeKm: h };
  }
  return orbitSummaryAt(traj, t, DE430_GM_MOON_M3_PER_S2);
}

/** The step for a lunar clock: as for Earth orbits, by its period about the Moon; an hour for surface clocks. */
function stepFor(orbit: OrbitSummary): number {
  return Number.isFinite(orbit.periodS) ? Math.min(3600, clockStepS(orbit.periodS, orbit.e)) : 3600;
}

/** Size a clock near the Moon. */
export function sizeLunarClock(req: LunarSizeRequest): LunarSizeResult {
  const { trajectory: traj, earthGravity, fromTtJ2000S: from, spanS } = req;
  const keep = req.keep ?? 'TT';
  const reference = req.reference ?? MEAN_SUB_EARTH_POINT;
  if (!isLunarOrbiter(traj) && !(traj instanceof LunarSurfaceTrajectory)) {
    throw new InputError(`${traj.id} is not about the Moon`, '--body', 'give elements about the Moon, a Moon-centred OEM (CENTER_NAME = MOON) or a lunar scenario satellite, or leave --body at earth');
  }
  const orbiting = isLunarOrbiter(traj);
  const gmMoon = DE430_GM_MOON_M3_PER_S2;
  const field = new LunarExternalField(traj instanceof LunarOrbitTrajectory ? traj.forces.moon : undefined);
  const orbit = summary(traj, from);
  const step = stepFor(orbit);
  const run = analyseLunarRate(traj, earthGravity, field, from, spanS, step, orbiting);
  const refTraj = new LunarSurfaceTrajectory('lunar surface reference', reference, from, from + spanS);
  const ref = analyseLunarRate(refTraj, earthGravity, field, from, spanS, step, false);
  const y = run.meanFractionalOffset;
  const yVsSurface = y - ref.meanFractionalOffset;
  let sensitivityPerKm: number;
  let sensitivityMethod: string;
  let states = run.states + ref.states;
  if (orbiting && req.rebuildWithDeltaAKm !== undefined) {
    const ys = [+1, -1].map((d) => {
      const t = req.rebuildWithDeltaAKm!(d);
      const r = analyseLunarRate(t, earthGravity, field, from, spanS, step, true);
      states += r.states;
      return r.meanFractionalOffset;
    });
    sensitivityPerKm = (ys[0] - ys[1]) / 2;
    sensitivityMethod = 'central difference, semi-major axis ±1 km about the Moon, same model';
  } else if (orbiting) {
    const aM = orbit.aKm * 1000;
    sensitivityPerKm = ((3 * gmMoon) / (2 * aM * aM * C2)) * 1000;
    sensitivityMethod = "closed form 3GM_M/(2a²c²) at the osculating a about the Moon";
  } else {
    sensitivityPerKm = NaN;
    sensitivityMethod = 'not applicable: the clock is at rest on the Moon';
  }
  if (!Number.isFinite(y)) throw new InternalError(`non-finite lunar rate for ${traj.id}`, 'meanFractionalOffset');
  const kept = keep === 'TT' ? y : yVsSurface;
  const recommendedOffsetHz = -req.nominalHz * kept;
  const eccAmpS = !orbiting ? 0 : spanS >= orbit.periodS ? run.moonFieldPeriodicAmplitudeS : (2 * Math.sqrt(gmMoon * orbit.aKm * 1000) * orbit.e) / C2;
  return {
    satellite: traj.id,
    source: traj.sourceLabel,
    gravity: `${earthGravity.name} (Earth) + Moon ${traj instanceof LunarOrbitTrajectory && traj.forces.moon.j2 === 0 ? 'point mass' : 'point mass + J2 + C22'} (exact) + Sun (tidal)`,
    fromTtJ2000S: from,
    spanS,
    orbit,
    meanFractionalOffset: y,
    driftNsPerDay: y * SECONDS_PER_DAY * 1e9,
    components: { gravitational: run.parts.earth + run.parts.moon + run.parts.sun, velocity: run.parts.velocity },
    nominalHz: req.nominalHz,
    recommendedHz: req.nominalHz + recommendedOffsetHz,
    recommendedOffsetHz,
    eccentricityAmplitudeNs: eccAmpS * 1e9,
    residualPeriodicAmplitudeNs: run.residualAmplitudeS * 1e9,
    sensitivityPerKm,
    sensitivityMethod,
    spanMeanFractionalOffset: run.spanMeanFractionalOffset,
    integrationStepS: run.stepS,
    statesEvaluated: states,
    body: 'moon',
    keep,
    meanFractionalOffsetVsLunarSurface: yVsSurface,
    lunarSurfaceReferenceFractionalOffset: ref.meanFractionalOffset,
    lunarSurfaceReference: reference,
    parts: run.parts,
    crossTermAmplitudeNs: run.crossTermAmplitudeS * 1e9,
  };
}
