/** Library use case: sizing a clock about or on the Moon (command `size --body moon`). */
import { GNSS_NOMINAL_HZ } from '../constants.ts';
import { InputError } from '../errors.ts';
import { IAU_MOON_MEAN_RADIUS_M } from '../orbit/moonBody.ts';
import { checkSelenographicSite, LunarSurfaceTrajectory, MEAN_SUB_EARTH_POINT, type SelenographicSite } from '../orbit/lunarSurface.ts';
import { lunarForces, lunarOrbitFromElements, type LunarForceModelName } from '../orbit/lunarOrbitInput.ts';
import { LUNAR_DEFAULT_SPAN_S, sizeLunarClock, type LunarKeep, type LunarSizeResult } from '../plan/lunarSize.ts';
import { lunarSizeToJson, type LunarSizeJson } from '../report/lunarSizeReport.ts';
import type { GravityModelName } from '../orbit/gravity.ts';
import { durationArg, gravityArg, timeArg, timeSystemOf, type CommonOptions, type DurationInput, type TimeInput } from './common.ts';
import { DEFAULT_ELEMENTS_EPOCH } from './size.ts';

/**
 * Osculating elements about the Moon, referred to the Moon's mean equator of the epoch (IAU pole).
 * Give exactly one of `aKm` (from the Moon's centre) and `altitudeKm` (above the 1737.4 km sphere).
 */
export interface LunarKeplerianOrbit {
  aKm?: number;
  altitudeKm?: number;
  /** Eccentricity [1], default 0. */
  e?: number;
  /** Inclination to the lunar equator [deg], default 0. */
  iDeg?: number;
  /** Node on the lunar equator [deg], measured from the ascending node of the lunar equator on the ICRF equator; default 0. */
  raanDeg?: number;
  /** Argument of periselene [deg], default 0. */
  argpDeg?: number;
  /** Mean anomaly at the epoch [deg], default 0. */
  mDeg?: number;
  /** Epoch (default 2027-01-01T00:00:00Z). */
  epoch?: TimeInput;
}

/** A clock at rest on the Moon (selenographic, mean-Earth/polar-axis frame). */
export interface LunarSurfaceClock {
  surface: SelenographicSite;
  /** Start of the span when `from` is not given. */
  epoch?: TimeInput;
}

/** Options of {@link sizeLunarOrbit}: the `size --body moon` flags in camelCase. */
export interface LunarSizeOptions extends CommonOptions {
  /** The Earth's field: point, j2 or zonal (default zonal). */
  gravity?: GravityModelName;
  /** Forces on the orbit: `full` (Moon J2 + C22, Earth, Sun; default) or `point` (two-body about the Moon). */
  lunarForces?: LunarForceModelName;
  /** Start of the span (default: the epoch). */
  from?: TimeInput;
  /** Length of the span (default one anomalistic month, 27.55455 d). */
  span?: DurationInput;
  /** Nominal oscillator frequency [Hz] (default 10.23e6). */
  nominalHz?: number;
  /** What the recommended frequency keeps: `TT` (default) or `lunar-surface`. */
  keep?: LunarKeep;
  /** The lunar surface reference clock (default the mean sub-Earth point, (0°, 0°), on the 1737.4 km sphere). */
  reference?: SelenographicSite;
}

function isSurface(o: LunarKeplerianOrbit | LunarSurfaceClock): o is LunarSurfaceClock {
  return 'surface' in o;
}

/** Size a lunar clock (the writers' input; {@link sizeLunarOrbit} gives the JSON). */
export function runLunarSize(orbit: LunarKeplerianOrbit | LunarSurfaceClock, options?: LunarSizeOptions): LunarSizeResult {
  const ts = timeSystemOf(options);
  const earthGravity = gravityArg(options?.gravity ?? 'zonal', false, ts);
  const spanS = options?.span === undefined ? LUNAR_DEFAULT_SPAN_S : durationArg(options.span, '--span');
  const nominalHz = options?.nominalHz ?? GNSS_NOMINAL_HZ;
  if (!(nominalHz > 0)) throw new InputError(`nominal frequency ${nominalHz} Hz is not positive`, '--nominal-hz', 'give e.g. 10.23e6');
  const keep = options?.keep ?? 'TT';
  if (keep !== 'TT' && keep !== 'lunar-surface') throw new InputError(`unknown reference to keep ${JSON.stringify(keep)}`, '--keep', 'give TT or lunar-surface');
  const reference = options?.reference ?? MEAN_SUB_EARTH_POINT;
  checkSelenographicSite(reference, '--reference');
  const epoch = timeArg(ts, orbit.epoch ?? DEFAULT_ELEMENTS_EPOCH, '--epoch') as number;
  const from = timeArg(ts, options?.from, '--from') ?? epoch;
  const span = { fromTtJ2000S: Math.min(from, epoch), toTtJ2000S: Math.max(from + spanS, epoch) };
  const common = { earthGravity, fromTtJ2000S: from, spanS, nominalHz, keep, reference };
  if (isSurface(orbit)) {
    return sizeLunarClock({ ...common, trajectory: new LunarSurfaceTrajectory('lunar surface clock', orbit.surface, span.fromTtJ2000S, span.toTtJ2000S) });
  }
  const forceName = options?.lunarForces ?? 'full';
  if (forceName !== 'full' && forceName !== 'point') throw new InputError(`unknown lunar force model ${JSON.stringify(forceName)}`, '--lunar-forces', 'give full or point');
  if (orbit.aKm !== undefined && orbit.altitudeKm !== undefined) throw new InputError('both --a-km and --altitude-km given', '--a-km/--altitude-km', 'give one of them');
  if (orbit.aKm === undefined && orbit.altitudeKm === undefined) throw new InputError('no semi-major axis given', '--a-km', 'give --a-km (from the Moon\'s centre) or --altitude-km (above 1737.4 km)');
  const aKm = orbit.aKm ?? IAU_MOON_MEAN_RADIUS_M / 1000 + (orbit.altitudeKm as number);
  const elements = { epochTtJ2000S: epoch, aKm, e: orbit.e ?? 0, iDeg: orbit.iDeg ?? 0, raanDeg: orbit.raanDeg ?? 0, argpDeg: orbit.argpDeg ?? 0, meanAnomalyDeg: orbit.mDeg ?? 0 };
  const built = lunarOrbitFromElements('lunar orbit', elements, lunarForces(forceName), span, { a: orbit.aKm !== undefined ? '--a-km' : '--altitude-km', e: '--e' });
  return sizeLunarClock({ ...common, trajectory: built.trajectory, rebuildWithDeltaAKm: built.rebuildWithDeltaAKm });
}

/**
 * Frequency-offset sizing of a clock about the Moon (Keplerian elements about the Moon) or at rest on
 * it: the mean fractional offset [1] against TT and against a lunar surface reference clock, the
 * Earth/Moon/Sun/velocity parts [1], the frequency to set on the ground [Hz] for the reference kept,
 * the periodic amplitudes [ns]: the object `tauplan size --body moon --format json` prints.
 * Planning aid: verify independently before any uplink.
 */
export function sizeLunarOrbit(orbit: LunarKeplerianOrbit | LunarSurfaceClock, options?: LunarSizeOptions): LunarSizeJson {
  return lunarSizeToJson(runLunarSize(orbit, options), timeSystemOf(options));
}

export type { LunarForceModelName, LunarKeep, LunarSizeResult };
