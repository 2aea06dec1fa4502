/**
 * The rate of a clock anywhere between the Earth and the Moon, against TT, in the geocentric frame
 * of the IAU 2000 resolutions (B1.3, B1.9; physics.md §12):
 *
 *   dτ/dTCG = 1 − (v²/2 + U_E + U_ext)/c²,   dTT/dTCG = 1 − L_G,
 *   y = dτ/dTT − 1 = (L_G − (v²/2 + U_E + U_ext)/c²) / (1 − L_G).
 *
 * - `v`: the clock's geocentric (GCRS) velocity; `U_E`: the Earth's zonal field (./gravity.ts model).
 * - `U_ext` = the Moon's potential taken exactly (point mass + J2 + C22 at the clock, ./moonGravity.ts)
 *   minus its value and gradient at the geocentre (point mass: the degree-2 terms there are below
 *   1e-8 of it), plus the Sun's tidal potential (same subtraction, IERS 2010 §10.2 form).
 * - Division by 1 − L_G: exact here; the Earth-orbit rate (./rate.ts) drops it (a 5e-19 difference).
 *
 * Positions come in TEME of date (the axes every trajectory serves); the external bodies are taken
 * from ../orbit/lunarEphemeris.ts (GCRF) and rotated with the interpolated GCRF → TEME matrix.
 */
import { IERS2010_GM_SUN_M3_PER_S2, IERS2010_L_G } from '../constants.ts';
import { potentialM2PerS2, type GravityModel } from '../orbit/gravity.ts';
import { moonStateGcrfInto, sunStateGcrfInto } from '../orbit/lunarEphemeris.ts';
import { icrfToMoonFixedInto } from '../orbit/moonBody.ts';
import { MOON_DEGREE_2, moonPotentialFixedM2PerS2, type MoonGravityModel } from '../orbit/moonGravity.ts';
import { gcrfToTemeInto } from '../orbit/temeOfDate.ts';
import { SPEED_OF_LIGHT_SQUARED_M2_PER_S2 as C2 } from './rate.ts';
import { tidalPotentialM2PerS2 } from './tides.ts';

/** The four parts of a lunar-era clock rate (dimensionless); their sum is y. */
export interface LunarRateParts {
  /** (L_G − U_E/c²)/(1 − L_G): the Earth's part, L_G included (a geoid clock's rate is 0). */
  earth: number;
  /** −U_M,ext/c² /(1 − L_G): the Moon's exact potential less its value and gradient at the geocentre. */
  moon: number;
  /** −U_S,tide/c² /(1 − L_G). */
  sun: number;
  /** −v²/(2c²) /(1 − L_G), v geocentric. */
  velocity: number;
}

const INV_ONE_MINUS_LG = 1 / (1 - IERS2010_L_G);

/** Body states at one instant in TEME axes, cached for the last instant asked (the integrator asks several parts at once). */
class BodyCache {
  t = Number.NaN;
  readonly moonTeme = new Float64Array(6);
  readonly sunTeme = new Float64Array(3);
  readonly gcrfToTeme = new Float64Array(9);
  readonly icrfToMoon = new Float64Array(9);
  private readonly gcrf = new Float64Array(6);

  at(t: number): this {
    if (t === this.t) return this;
    const m = gcrfToTemeInto(t, this.gcrfToTeme);
    const g = this.gcrf;
    moonStateGcrfInto(t, g, 0);
    for (let r = 0; r < 3; r++) {
      this.moonTeme[r] = m[3 * r] * g[0] + m[3 * r + 1] * g[1] + m[3 * r + 2] * g[2];
      this.moonTeme[3 + r] = m[3 * r] * g[3] + m[3 * r + 1] * g[4] + m[3 * r + 2] * g[5];
    }
    sunStateGcrfInto(t, g, 0);
    for (let r = 0; r < 3; r++) this.sunTeme[r] = m[3 * r] * g[0] + m[3 * r + 1] * g[1] + m[3 * r + 2] * g[2];
    icrfToMoonFixedInto(t, this.icrfToMoon);
    this.t = t;
    return this;
  }
}

/**
 * The external potential of the Moon (exact) and the Sun (tidal), as a field over geocentric TEME
 * positions. It has the shape of {@link GravityModel.tides}, so a gravity model carrying it gives
 * every command (compare, passes, track, resets) the lunar-era rate.
 */
export class LunarExternalField {
  private readonly cache = new BodyCache();
  private readonly rel = new Float64Array(3);

  constructor(readonly moon: MoonGravityModel = MOON_DEGREE_2) {}

  /** Moon and Sun parts [m²/s²] at TEME position (x, y, z) [m], instant t (TT s since J2000.0). */
  partsM2PerS2(t: number, x: number, y: number, z: number): { moon: number; sun: number } {
    const b = this.cache.at(t);
    const mt = b.moonTeme;
    let moon = tidalPotentialM2PerS2(this.moon.gmM3PerS2, x, y, z, mt[0], mt[1], mt[2]);
    if (this.moon.j2 !== 0 || this.moon.c22 !== 0) {
      // Degree-2 part at the clock: ρ (TEME) → GCRF → ME body-fixed.
      const g = b.gcrfToTeme;
      const rx = x - mt[0];
      const ry = y - mt[1];
      const rz = z - mt[2];
      const r = this.rel;
      r[0] = g[0] * rx + g[3] * ry + g[6] * rz;
      r[1] = g[1] * rx + g[4] * ry + g[7] * rz;
      r[2] = g[2] * rx + g[5] * ry + g[8] * rz;
      const f = b.icrfToMoon;
      const bx = f[0] * r[0] + f[1] * r[1] + f[2] * r[2];
      const by = f[3] * r[0] + f[4] * r[1] + f[5] * r[2];
      const bz = f[6] * r[0] + f[7] * r[1] + f[8] * r[2];
      const rho = Math.sqrt(bx * bx + by * by + bz * bz);
      moon += moonPotentialFixedM2PerS2(this.moon, bx, by, bz) - this.moon.gmM3PerS2 / rho;
    }
    const s = b.sunTeme;
    const sun = tidalPotentialM2PerS2(IERS2010_GM_SUN_M3_PER_S2, x, y, z, s[0], s[1], s[2]);
    return { moon, sun };
  }

  /** U_ext [m²/s²] (the {@link GravityModel.tides} signature). */
  potentialM2PerS2(t: number, x: number, y: number, z: number): number {
    const p = this.partsM2PerS2(t, x, y, z);
    return p.moon + p.sun;
  }

  /** The Moon's geocentric state [m, m/s] in TEME of date at t (shared cache). */
  moonTemeAt(t: number): Float64Array {
    return this.cache.at(t).moonTeme;
  }
}

/** The same Earth model with the lunar external field in place of any tidal option. */
export function withLunarField(gravity: GravityModel, field: LunarExternalField = new LunarExternalField()): GravityModel {
  return { ...gravity, tides: field };
}

/** The four parts of y at a geocentric TEME state (position [m], velocity [m/s]) at instant t. */
export function lunarRateParts(earth: GravityModel, field: LunarExternalField, t: number, x: number, y: number, z: number, vx: number, vy: number, vz: number): LunarRateParts {
  const ext = field.partsM2PerS2(t, x, y, z);
  const ue = potentialM2PerS2(earth, x, y, z);
  return {
    earth: (IERS2010_L_G - ue / C2) * INV_ONE_MINUS_LG,
    moon: (-ext.moon / C2) * INV_ONE_MINUS_LG,
    sun: (-ext.sun / C2) * INV_ONE_MINUS_LG,
    velocity: ((-0.5 * (vx * vx + vy * vy + vz * vz)) / C2) * INV_ONE_MINUS_LG,
  };
}

/** y (dimensionless) at a geocentric TEME state: the sum of {@link lunarRateParts}. */
export function lunarFractionalOffset(earth: GravityModel, field: LunarExternalField, t: number, x: number, y: number, z: number, vx: number, vy: number, vz: number): number {
  const p = lunarRateParts(earth, field, t, x, y, z, vx, vy, vz);
  return p.earth + p.moon + p.sun + p.velocity;
}

/**
 * The two periodic terms of a clock near the Moon [s] (Moon-centred ρ [m], u [m/s]; the Moon's
 * geocentric velocity v_M [m/s]; all in the same inertial axes): −2ρ·u/c² (the Moon's field, as
 * IERS 10.11 about the Earth) and −v_M·ρ/c² (the cross term of v² = (v_M + u)² in the geocentric frame).
 */
export function lunarPeriodicTermsS(rho: ArrayLike<number>, u: ArrayLike<number>, vMoon: ArrayLike<number>): { moonField: number; crossTerm: number } {
  const ru = rho[0] * u[0] + rho[1] * u[1] + rho[2] * u[2];
  const vr = vMoon[0] * rho[0] + vMoon[1] * rho[1] + vMoon[2] * rho[2];
  return { moonField: (-2 * ru) / C2, crossTerm: -vr / C2 };
}
