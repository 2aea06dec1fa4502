/**
 * The Moon's gravity field to degree 2: point mass plus J2 and C22 (constants in ./moonBody.ts),
 *   U_M(ρ) = GM/ρ + GM·R²·Q(ρ)/ρ⁵,   Q = −(J2/2)(3z² − ρ²) + 3·C22·(x² − y²),
 * with (x, y, z) in the Moon's ME body-fixed axes, positive like U. Used by the lunar orbit
 * propagator and by the exact lunar potential in the clock rate.
 *
 * Left out: degree ≥ 3 and the other degree-2 terms (C21, S21, S22 are zero in the principal-axis
 * frame and below 1e-8 in ME), tides raised on the Moon (k2 ≈ 0.024: 1e-7 of the field).
 */
import { DE430_GM_MOON_M3_PER_S2, GRAIL_MOON_C22, GRAIL_MOON_J2, GRAIL_MOON_REFERENCE_RADIUS_M } from './moonBody.ts';

/** The Moon's field as used here: which terms are on. */
export interface MoonGravityModel {
  /** GM [m³/s²]. */
  readonly gmM3PerS2: number;
  /** Reference radius of J2, C22 [m]. */
  readonly radiusM: number;
  readonly j2: number;
  readonly c22: number;
}

/** Point mass only. */
export const MOON_POINT_MASS: MoonGravityModel = { gmM3PerS2: DE430_GM_MOON_M3_PER_S2, radiusM: GRAIL_MOON_REFERENCE_RADIUS_M, j2: 0, c22: 0 };
/** Point mass + J2 + C22 (GRAIL-era values). */
export const MOON_DEGREE_2: MoonGravityModel = { gmM3PerS2: DE430_GM_MOON_M3_PER_S2, radiusM: GRAIL_MOON_REFERENCE_RADIUS_M, j2: GRAIL_MOON_J2, c22: GRAIL_MOON_C22 };

/** Potential [m²/s²] at body-fixed (x, y, z) [m] from the Moon's centre. */
export function moonPotentialFixedM2PerS2(model: MoonGravityModel, x: number, y: number, z: number): number {
  const r2 = x * x + y * y + z * z;
  const r = Math.sqrt(r2);
  const gm = model.gmM3PerS2;
  if (model.j2 === 0 && model.c22 === 0) return gm / r;
  const q = -0.5 * model.j2 * (3 * z * z - r2) + 3 * model.c22 * (x * x - y * y);
  return gm / r + (gm * model.radiusM * model.radiusM * q) / (r2 * r2 * r);
}

/** Acceleration ∇U_M [m/s²] at body-fixed (x, y, z) [m], into out[o..o+2] (body-fixed axes). */
export function moonAccelerationFixedInto(model: MoonGravityModel, x: number, y: number, z: number, out: Float64Array, o: number): void {
  const r2 = x * x + y * y + z * z;
  const r = Math.sqrt(r2);
  const gm = model.gmM3PerS2;
  const f = -gm / (r2 * r);
  let ax = f * x;
  let ay = f * y;
  let az = f * z;
  if (model.j2 !== 0 || model.c22 !== 0) {
    // ∇(Q/ρ⁵) = ∇Q/ρ⁵ − 5Q·r/ρ⁷, with ∇Q = (x(J2 + 6C22), y(J2 − 6C22), −2J2·z).
    const k = gm * model.radiusM * model.radiusM;
    const q = -0.5 * model.j2 * (3 * z * z - r2) + 3 * model.c22 * (x * x - y * y);
    const r5 = r2 * r2 * r;
    const r7 = r5 * r2;
    ax += k * ((x * (model.j2 + 6 * model.c22)) / r5 - (5 * q * x) / r7);
    ay += k * ((y * (model.j2 - 6 * model.c22)) / r5 - (5 * q * y) / r7);
    az += k * ((-2 * model.j2 * z) / r5 - (5 * q * z) / r7);
  }
  out[o] = ax;
  out[o + 1] = ay;
  out[o + 2] = az;
}

/** Potential [m²/s²] at an inertial Moon-centred position ρ [m], given the ICRF → ME matrix `m` (rows first). */
export function moonPotentialInertialM2PerS2(model: MoonGravityModel, m: ArrayLike<number>, rx: number, ry: number, rz: number): number {
  if (model.j2 === 0 && model.c22 === 0) return model.gmM3PerS2 / Math.sqrt(rx * rx + ry * ry + rz * rz);
  const x = m[0] * rx + m[1] * ry + m[2] * rz;
  const y = m[3] * rx + m[4] * ry + m[5] * rz;
  const z = m[6] * rx + m[7] * ry + m[8] * rz;
  return moonPotentialFixedM2PerS2(model, x, y, z);
}

const FIXED = new Float64Array(3);

/** Acceleration [m/s²] at an inertial Moon-centred position [m], inertial axes, given the ICRF → ME matrix. */
export function moonAccelerationInertialInto(model: MoonGravityModel, m: ArrayLike<number>, rx: number, ry: number, rz: number, out: Float64Array, o: number): void {
  const x = m[0] * rx + m[1] * ry + m[2] * rz;
  const y = m[3] * rx + m[4] * ry + m[5] * rz;
  const z = m[6] * rx + m[7] * ry + m[8] * rz;
  moonAccelerationFixedInto(model, x, y, z, FIXED, 0);
  const [ax, ay, az] = FIXED;
  out[o] = m[0] * ax + m[3] * ay + m[6] * az;
  out[o + 1] = m[1] * ax + m[4] * ay + m[7] * az;
  out[o + 2] = m[2] * ax + m[5] * ay + m[8] * az;
}
