/**
 * The tidal potential of the Sun and the Moon on a clock near the Earth (IERS Conventions 2010,
 * §10.2): in the geocentric frame only the part that varies across the Earth acts,
 *   U_tide(r) = Σ GM_b · [ 1/|R_b − r| − 1/|R_b| − R_b·r/|R_b|³ ],
 * positive like U. It stays below 1e-15 in rate up to GNSS altitude, so it is an option, off by
 * default. Sun and Moon positions come from astronomy-engine (geometric, J2000 equator), rotated to
 * true-of-date axes; positions at the clock's instant (light time and aberration neglected: < 1e-5
 * relative change of the term).
 */
import { lazyPackage } from '../lazyPackage.ts';
import { IAU2012_AU_M, IERS2010_GM_SUN_M3_PER_S2, IERS2010_MOON_EARTH_MASS_RATIO, WGS84_GM_M3_PER_S2, JD_J2000 } from '../constants.ts';
import { gcrfToTemeInto, rotateInto } from '../orbit/temeOfDate.ts';

const astronomy = lazyPackage<typeof import('astronomy-engine')>('astronomy-engine');

/** GM of the Moon [m³/s²], from the IERS mass ratio and the contract's GM of the Earth. */
export const GM_MOON_M3_PER_S2 = IERS2010_MOON_EARTH_MASS_RATIO * WGS84_GM_M3_PER_S2;

/** Tidal term of one body at geocentric position r [m], body at R [m] (same axes). */
export function tidalPotentialM2PerS2(gm: number, rx: number, ry: number, rz: number, bx: number, by: number, bz: number): number {
  const dx = bx - rx;
  const dy = by - ry;
  const dz = bz - rz;
  const d = Math.sqrt(dx * dx + dy * dy + dz * dz);
  const rb2 = bx * bx + by * by + bz * bz;
  const rb = Math.sqrt(rb2);
  // 1/d − 1/R − R·r/R³, written to keep its digits: the first two terms nearly cancel.
  const dot = bx * rx + by * ry + bz * rz;
  const diff = (rb - d) / (d * rb); // 1/d − 1/R
  return gm * (diff - dot / (rb2 * rb));
}

/** Sun and Moon positions [m] in TEME-of-date axes (the states' axes) at an instant. */
export interface BodyPositions {
  sun: readonly [number, number, number];
  moon: readonly [number, number, number];
}

/**
 * Sun and Moon as a function of time, for a clock-rate term. `jdUtcAt` maps seconds since J2000.0
 * TT to a UTC Julian date (the edge supplies it from the leap-second table).
 */
export class TidalField {
  private readonly matrix = new Float64Array(9);

  constructor(private readonly jdUtcAt: (ttJ2000S: number) => number) {}

  bodiesAt(ttJ2000S: number): BodyPositions {
    const jd = this.jdUtcAt(ttJ2000S);
    const { Body, GeoMoon, GeoVector, MakeTime } = astronomy();
    const time = MakeTime(jd - JD_J2000);
    // Into the satellite states' axes (TEME of date), from the interpolated IAU 2006/2000A chain.
    const m = gcrfToTemeInto(ttJ2000S, this.matrix);
    const s = GeoVector(Body.Sun, time, false);
    const l = GeoMoon(time);
    const sun = new Float64Array(3);
    const moon = new Float64Array(3);
    rotateInto(m, [s.x * IAU2012_AU_M, s.y * IAU2012_AU_M, s.z * IAU2012_AU_M], 0, sun, 0);
    rotateInto(m, [l.x * IAU2012_AU_M, l.y * IAU2012_AU_M, l.z * IAU2012_AU_M], 0, moon, 0);
    return { sun: [sun[0], sun[1], sun[2]], moon: [moon[0], moon[1], moon[2]] };
  }

  /** Sun plus Moon tidal potential [m²/s²] at geocentric r [m] (TEME of date, true pole) at an instant. */
  potentialM2PerS2(ttJ2000S: number, rx: number, ry: number, rz: number): number {
    const b = this.bodiesAt(ttJ2000S);
    return (
      tidalPotentialM2PerS2(IERS2010_GM_SUN_M3_PER_S2, rx, ry, rz, b.sun[0], b.sun[1], b.sun[2]) +
      tidalPotentialM2PerS2(GM_MOON_M3_PER_S2, rx, ry, rz, b.moon[0], b.moon[1], b.moon[2])
    );
  }
}
