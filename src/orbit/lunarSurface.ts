/**
 * A point at rest on the Moon (a lunar surface station or the lunar surface reference clock) as a
 * trajectory: selenographic latitude and longitude in the mean-Earth/polar-axis frame (IAU rotation
 * model, ./moonBody.ts), height above the 1737.4 km reference sphere. Served as geocentric states in
 * TEME of date, like every other source, so any clock or pass computation takes it as it is.
 *
 * Selenographic (0°, 0°) is the mean sub-Earth point (the ME frame's prime meridian is defined by
 * the mean direction to the Earth); the true sub-Earth point wanders about it by the librations
 * (±7.9° in longitude, ±6.7° in latitude).
 */
import { InputError } from '../errors.ts';
import { checkLunarEphemerisSpan, moonStateGcrfInto } from './lunarEphemeris.ts';
import { moonFixedToLcrsState, selenographicToMoonFixedM } from './moonBody.ts';
import { gcrfToTemeInto, rotateInto } from './temeOfDate.ts';
import { checkSpan, sampleByStateAt, type StateBlock, type Trajectory } from './trajectory.ts';
import { vec3, type StateM } from './vec.ts';

/** Where a clock sits on the Moon. */
export interface SelenographicSite {
  /** Selenographic latitude [deg], −90..90. */
  latDeg: number;
  /** Selenographic longitude [deg], east positive. */
  lonDeg: number;
  /** Height above the 1737.4 km reference sphere [m]. */
  heightM: number;
}

/** The default lunar surface reference: the mean sub-Earth point on the reference sphere. */
export const MEAN_SUB_EARTH_POINT: SelenographicSite = { latDeg: 0, lonDeg: 0, heightM: 0 };

/** Refuse a site off the sphere of coordinates. `where` names the field (e.g. `stations[1]`). */
export function checkSelenographicSite(site: SelenographicSite, where: string): void {
  if (!(Math.abs(site.latDeg) <= 90)) throw new InputError(`selenographic latitude ${site.latDeg}° is outside −90..90`, `${where}.latDeg`, 'give a latitude between −90 and 90 degrees');
  if (!Number.isFinite(site.lonDeg)) throw new InputError(`selenographic longitude ${site.lonDeg} is not a number`, `${where}.lonDeg`, 'give a longitude in degrees, east positive');
  if (!(site.heightM > -20_000 && site.heightM < 1e7)) {
    throw new InputError(`height ${site.heightM} m above the lunar reference sphere is out of range`, `${where}.heightM`, 'give a height in metres above 1737.4 km (lunar relief spans about −9 km to +11 km)');
  }
}

/** A clock at rest on (or above) the Moon. States: geocentric, TEME of date, m and m/s. */
export class LunarSurfaceTrajectory implements Trajectory {
  readonly frame = 'TEME' as const;
  readonly body = 'moon' as const;
  readonly epochTtJ2000S = null;
  readonly sourceLabel: string;
  private readonly fixedM: [number, number, number];
  private readonly moon = new Float64Array(6);
  private readonly rot = new Float64Array(9);

  constructor(
    readonly id: string,
    readonly site: SelenographicSite,
    readonly validFromTtJ2000S: number,
    readonly validToTtJ2000S: number,
  ) {
    checkSelenographicSite(site, id);
    checkLunarEphemerisSpan(validFromTtJ2000S, id);
    checkLunarEphemerisSpan(validToTtJ2000S, id);
    this.fixedM = selenographicToMoonFixedM(site.latDeg, site.lonDeg, site.heightM);
    this.sourceLabel = `at rest on the Moon (${site.latDeg}°, ${site.lonDeg}°, ${site.heightM} m above 1737.4 km)`;
  }

  /** Moon-centred state (LCRS: ICRS axes) [m, m/s]. */
  lcrsStateAt(ttJ2000S: number): { positionM: [number, number, number]; velocityMPerS: [number, number, number] } {
    return moonFixedToLcrsState(ttJ2000S, this.fixedM);
  }

  stateAt(ttJ2000S: number): StateM<'TEME'> {
    checkSpan(this, ttJ2000S);
    const l = this.lcrsStateAt(ttJ2000S);
    const m = moonStateGcrfInto(ttJ2000S, this.moon, 0);
    const r = [m[0] + l.positionM[0], m[1] + l.positionM[1], m[2] + l.positionM[2]];
    const v = [m[3] + l.velocityMPerS[0], m[4] + l.velocityMPerS[1], m[5] + l.velocityMPerS[2]];
    const q = gcrfToTemeInto(ttJ2000S, this.rot);
    const rt = new Float64Array(3);
    const vt = new Float64Array(3);
    rotateInto(q, r, 0, rt, 0);
    rotateInto(q, v, 0, vt, 0);
    return { ttJ2000S, positionM: vec3(rt[0], rt[1], rt[2]), velocityMPerS: vec3(vt[0], vt[1], vt[2]) };
  }

  sampleInto(ttJ2000S: Float64Array, out: StateBlock): void {
    sampleByStateAt(this, ttJ2000S, out);
  }
}
