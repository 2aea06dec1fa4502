/**
 * The satellite clock polynomial of a navigation message (IS-GPS-200 §20.3.3.3.3.1; Galileo OS SIS
 * ICD §5.1.4):
 *
 *     Δt_sv(t) = af0 + af1·(t − toc) + af2·(t − toc)² + Δt_r,   Δt_r = F·e·√A·sin E
 *
 * with t − toc corrected for week crossovers (±302 400 s). The polynomial leaves out the periodic
 * relativistic term Δt_r, which the receiver adds; Δt_r equals −2 r·v/c² for a Keplerian orbit.
 * Pure: no I/O.
 */
import { InternalError } from '../errors.ts';
import {
  GALILEO_AF0_BITS,
  GALILEO_AF0_SCALE_S,
  GALILEO_AF1_BITS,
  GALILEO_AF1_SCALE,
  GALILEO_AF2_BITS,
  GALILEO_AF2_SCALE_PER_S,
  GALILEO_F_S_PER_SQRT_M,
  GALILEO_MU_M3_PER_S2,
  GALILEO_T0C_BITS,
  GALILEO_T0C_SCALE_S,
  GNSS_WEEK_S,
  GPS_F_S_PER_SQRT_M,
  GPS_HALF_WEEK_S,
  GPS_LNAV_AF0_BITS,
  GPS_LNAV_AF0_SCALE_S,
  GPS_LNAV_AF1_BITS,
  GPS_LNAV_AF1_SCALE,
  GPS_LNAV_AF2_BITS,
  GPS_LNAV_AF2_SCALE_PER_S,
  GPS_LNAV_TOC_BITS,
  GPS_LNAV_TOC_SCALE_S,
  GPS_MU_M3_PER_S2,
} from './navConstants.ts';

import type { NavSystem } from '../model/broadcastNav.ts';

export type { NavSystem } from '../model/broadcastNav.ts';

/** One quantised field: scale factor (value of one LSB) and bit width. */
export interface FieldFormat {
  scale: number;
  bits: number;
  signed: boolean;
}

/** Clock-field layout of one message. */
export interface NavClockFormat {
  system: NavSystem;
  /** Message name, for reports. */
  label: string;
  toc: FieldFormat;
  af0: FieldFormat;
  af1: FieldFormat;
  af2: FieldFormat;
  /** F of Δt_r [s/√m]. */
  fSPerSqrtM: number;
  /** μ of the user algorithm [m³/s²]. */
  muM3PerS2: number;
}

/** GPS LNAV subframe 1 (IS-GPS-200 Table 20-III). */
export const GPS_LNAV_FORMAT: NavClockFormat = {
  system: 'gps',
  label: 'GPS LNAV (IS-GPS-200 Table 20-III)',
  toc: { scale: GPS_LNAV_TOC_SCALE_S, bits: GPS_LNAV_TOC_BITS, signed: false },
  af0: { scale: GPS_LNAV_AF0_SCALE_S, bits: GPS_LNAV_AF0_BITS, signed: true },
  af1: { scale: GPS_LNAV_AF1_SCALE, bits: GPS_LNAV_AF1_BITS, signed: true },
  af2: { scale: GPS_LNAV_AF2_SCALE_PER_S, bits: GPS_LNAV_AF2_BITS, signed: true },
  fSPerSqrtM: GPS_F_S_PER_SQRT_M,
  muM3PerS2: GPS_MU_M3_PER_S2,
};

/** Galileo I/NAV and F/NAV clock correction parameters (Galileo OS SIS ICD §5.1.3). */
export const GALILEO_FORMAT: NavClockFormat = {
  system: 'galileo',
  label: 'Galileo I/NAV, F/NAV (OS SIS ICD §5.1.3)',
  toc: { scale: GALILEO_T0C_SCALE_S, bits: GALILEO_T0C_BITS, signed: false },
  af0: { scale: GALILEO_AF0_SCALE_S, bits: GALILEO_AF0_BITS, signed: true },
  af1: { scale: GALILEO_AF1_SCALE, bits: GALILEO_AF1_BITS, signed: true },
  af2: { scale: GALILEO_AF2_SCALE_PER_S, bits: GALILEO_AF2_BITS, signed: true },
  fSPerSqrtM: GALILEO_F_S_PER_SQRT_M,
  muM3PerS2: GALILEO_MU_M3_PER_S2,
};

/** The format of a system. */
export function navClockFormat(system: NavSystem): NavClockFormat {
  return system === 'gps' ? GPS_LNAV_FORMAT : GALILEO_FORMAT;
}

/** Largest and smallest integer a field can carry. */
export function fieldRange(f: FieldFormat): { minCount: number; maxCount: number } {
  return f.signed ? { minCount: -(2 ** (f.bits - 1)), maxCount: 2 ** (f.bits - 1) - 1 } : { minCount: 0, maxCount: 2 ** f.bits - 1 };
}

/** Result of quantising one value: the integer carried, the value it stands for, or an overflow. */
export type Quantised = { ok: true; count: number; value: number } | { ok: false; count: number; limit: number };

/** Round `value` to the field's LSB; `ok: false` when the count does not fit the bits. */
export function quantise(value: number, f: FieldFormat): Quantised {
  if (!Number.isFinite(value)) throw new InternalError(`non-finite value ${value} to quantise`, 'navigation field');
  const count = Math.round(value / f.scale);
  const { minCount, maxCount } = fieldRange(f);
  if (count < minCount || count > maxCount) return { ok: false, count, limit: (count < 0 ? minCount : maxCount) * f.scale };
  return { ok: true, count, value: count * f.scale };
}

/**
 * t − toc [s] from seconds of week, corrected for the week crossover: above +302 400 s subtract
 * 604 800 s, below −302 400 s add it (IS-GPS-200 §20.3.3.3.3.1).
 */
export function weekCrossoverS(tSecondsOfWeek: number, tocSecondsOfWeek: number): number {
  let dt = tSecondsOfWeek - tocSecondsOfWeek;
  if (dt > GPS_HALF_WEEK_S) dt -= GNSS_WEEK_S;
  else if (dt < -GPS_HALF_WEEK_S) dt += GNSS_WEEK_S;
  return dt;
}

/** Clock polynomial coefficients: af0 [s], af1 [s/s], af2 [s/s²]. */
export interface ClockPolynomial {
  af0S: number;
  af1: number;
  af2PerS: number;
}

/** af0 + af1·dt + af2·dt² [s], dt = t − toc [s] (already crossover-corrected). */
export function clockPolynomialS(p: ClockPolynomial, dtS: number): number {
  return p.af0S + (p.af1 + p.af2PerS * dtS) * dtS;
}

/** Δt_r = F·e·√A·sin E [s] (IS-GPS-200 §20.3.3.3.3.1). */
export function relativisticCorrectionS(fSPerSqrtM: number, e: number, sqrtAM: number, eccentricAnomalyRad: number): number {
  return fSPerSqrtM * e * sqrtAM * Math.sin(eccentricAnomalyRad);
}
