/**
 * The relativistic fractional offset of a clock against TT (IERS Conventions 2010, eqs. 10.7–10.9;
 * physics.md §1):  y = L_G − (v²/2 + U)/c².  Positive: the clock runs fast against ground time.
 * Velocity must be geocentric non-rotating (GCRF/TOD/TEME); position in true-of-date axes.
 * Left out: solar and lunar tidal potentials (< 1e-15 up to GNSS altitude, IERS §10.2).
 */
import { IERS2010_L_G, SPEED_OF_LIGHT_M_PER_S } from '../constants.ts';
import { potentialM2PerS2, type GravityModel } from '../orbit/gravity.ts';

const C2 = SPEED_OF_LIGHT_M_PER_S * SPEED_OF_LIGHT_M_PER_S;

/** The two parts of y. Their sum is the fractional offset. */
export interface RateParts {
  /** L_G − U/c² (dimensionless). */
  gravitational: number;
  /** −v²/(2c²) (dimensionless). */
  velocity: number;
}

/**
 * Fractional offset y (dimensionless) at position [m] and inertial velocity [m/s]. The tidal term
 * of the model, when it has one, needs the instant `ttJ2000S` (s since J2000.0 TT).
 */
export function fractionalOffset(model: GravityModel, x: number, y: number, z: number, vx: number, vy: number, vz: number, ttJ2000S = NaN): number {
  const u = totalPotentialM2PerS2(model, x, y, z, ttJ2000S);
  return IERS2010_L_G - (0.5 * (vx * vx + vy * vy + vz * vz) + u) / C2;
}

/** Earth's potential plus the tidal potential when the model carries one [m²/s²]. */
export function totalPotentialM2PerS2(model: GravityModel, x: number, y: number, z: number, ttJ2000S: number): number {
  const u = potentialM2PerS2(model, x, y, z);
  return model.tides === undefined ? u : u + model.tides.potentialM2PerS2(ttJ2000S, x, y, z);
}

/** Gravitational and velocity parts of y. */
export function rateParts(model: GravityModel, x: number, y: number, z: number, vx: number, vy: number, vz: number): RateParts {
  const u = potentialM2PerS2(model, x, y, z);
  return { gravitational: IERS2010_L_G - u / C2, velocity: (-0.5 * (vx * vx + vy * vy + vz * vz)) / C2 };
}

/** The conventional periodic term −2 r·v/c² [s] (IS-GPS-200 §20.3.3.3.3.1; IERS 2010 eq. 10.11). r [m], v [m/s]. */
export function conventionalPeriodicS(x: number, y: number, z: number, vx: number, vy: number, vz: number): number {
  return (-2 * (x * vx + y * vy + z * vz)) / C2;
}

/** c² [m²/s²], exported for closed forms. */
export const SPEED_OF_LIGHT_SQUARED_M2_PER_S2 = C2;
