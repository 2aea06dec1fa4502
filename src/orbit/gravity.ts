/**
 * Earth's gravity potential U (positive sign) and its gradient, for the clock rate and for
 * orbit propagation. Zonal terms only: U = GM/r · [1 − Σₙ Jₙ (a_E/r)ⁿ Pₙ(sin φ)], n = 2..N.
 * Positions must be in a frame whose z axis is the true pole of date (TOD or TEME).
 */
import { EGM2008_J, WGS84_A_M, WGS84_GM_M3_PER_S2 } from '../constants.ts';
import { InputError } from '../errors.ts';
import type { GravityModelName } from '../model/scenario.ts';

export type { GravityModelName };

/** Gravity choices offered to users. */
export const GRAVITY_MODEL_NAMES: readonly GravityModelName[] = ['point', 'j2', 'zonal'];

/** Earth's gravity field as the orbit propagator and the clock rate use it (one type for both). */
export interface GravityModel {
  readonly name: GravityModelName;
  /** GM [m³/s²]. */
  readonly gmM3PerS2: number;
  /** Reference radius of the Jₙ [m]. */
  readonly radiusM: number;
  /** Jₙ by degree; entries 0 and 1 are zero. */
  readonly j: readonly number[];
  /** Solar and lunar tidal potential, when asked for (off by default: < 1e-15 up to GNSS altitude). */
  readonly tides?: { potentialM2PerS2(ttJ2000S: number, x: number, y: number, z: number): number };
}

/** Build one of the named models with the contract's default constants (WGS-84 GM, EGM2008 Jₙ). */
export function gravityModel(name: string, where = '--gravity'): GravityModel {
  switch (name) {
    case 'point':
      return { name, gmM3PerS2: WGS84_GM_M3_PER_S2, radiusM: WGS84_A_M, j: [0, 0] };
    case 'j2':
      return { name, gmM3PerS2: WGS84_GM_M3_PER_S2, radiusM: WGS84_A_M, j: [0, 0, EGM2008_J[2]] };
    case 'zonal':
      return { name, gmM3PerS2: WGS84_GM_M3_PER_S2, radiusM: WGS84_A_M, j: EGM2008_J };
    default:
      throw new InputError(`unknown gravity model ${JSON.stringify(name)}`, where, 'use point, j2 or zonal');
  }
}

/** Legendre polynomials P0..Pn at s, into `p` (length ≥ n+1); derivatives into `dp`. */
function legendre(s: number, n: number, p: Float64Array, dp: Float64Array): void {
  p[0] = 1;
  dp[0] = 0;
  if (n >= 1) {
    p[1] = s;
    dp[1] = 1;
  }
  for (let k = 2; k <= n; k++) {
    p[k] = ((2 * k - 1) * s * p[k - 1] - (k - 1) * p[k - 2]) / k;
    dp[k] = k * p[k - 1] + s * dp[k - 1];
  }
}

const P = new Float64Array(16);
const DP = new Float64Array(16);

/** Recurrence factors of the Legendre polynomials: P_k = A_k·s·P_{k−1} − B_k·P_{k−2}. */
const LEGENDRE_A = Float64Array.from({ length: 16 }, (_, k) => (k < 2 ? 0 : (2 * k - 1) / k));
const LEGENDRE_B = Float64Array.from({ length: 16 }, (_, k) => (k < 2 ? 0 : (k - 1) / k));

/**
 * Potential U [m²/s²] (positive) at position (x, y, z) [m], true-of-date axes. The hot path of the
 * clock rate: Legendre values by recurrence with precomputed factors, no derivatives, no allocation.
 */
export function potentialM2PerS2(model: GravityModel, x: number, y: number, z: number): number {
  const r = Math.sqrt(x * x + y * y + z * z);
  const j = model.j;
  const n = j.length - 1;
  if (n < 2) return model.gmM3PerS2 / r;
  const invR = 1 / r;
  const s = z * invR;
  const q = model.radiusM * invR;
  let pPrev = 1; // P0
  let p = s; // P1
  let qn = q;
  let sum = 0;
  for (let k = 2; k <= n; k++) {
    const next = LEGENDRE_A[k] * s * p - LEGENDRE_B[k] * pPrev;
    pPrev = p;
    p = next;
    qn *= q;
    sum += j[k] * qn * p;
  }
  return model.gmM3PerS2 * invR * (1 - sum);
}

/**
 * Gravitational acceleration ∇U [m/s²] at (x, y, z) [m], written to `out[0..2]`.
 * ∇U = ∂U/∂r · r̂ + ∂U/∂s · (ẑ − s r̂)/r, with s = z/r.
 */
export function accelerationInto(model: GravityModel, x: number, y: number, z: number, out: Float64Array | number[]): void {
  const r2 = x * x + y * y + z * z;
  const r = Math.sqrt(r2);
  const gm = model.gmM3PerS2;
  const n = model.j.length - 1;
  if (n < 2) {
    const f = -gm / (r2 * r);
    out[0] = f * x;
    out[1] = f * y;
    out[2] = f * z;
    return;
  }
  const s = z / r;
  legendre(s, n, P, DP);
  const q = model.radiusM / r;
  let qn = q * q;
  let radialSum = 0;
  let latSum = 0;
  for (let k = 2; k <= n; k++) {
    radialSum += (k + 1) * model.j[k] * qn * P[k];
    latSum += model.j[k] * qn * DP[k];
    qn *= q;
  }
  const dUdr = (-gm / r2) * (1 - radialSum);
  const dUds = (-gm / r) * latSum;
  // ∇U = dUdr·r̂ + dUds·(ẑ − s r̂)/r
  const radial = (dUdr - (dUds * s) / r) / r;
  const polar = dUds / r;
  out[0] = radial * x;
  out[1] = radial * y;
  out[2] = radial * z + polar;
}
