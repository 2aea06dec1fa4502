/**
 * An instant carried exactly: whole TAI seconds (an integer, exact in a double up to 2^53 s)
 * plus a fraction in [0, 1). The scale it was given in travels with it, for display only;
 * every conversion goes through TAI.
 */
import { TAI_MINUS_BDT_S, TAI_MINUS_GPS_S, TAI_MINUS_GST_S, TT_MINUS_TAI_S } from '../constants.ts';
import { daysFromCivil } from './calendar.ts';

/** Time scales tauplan reads and writes. */
export type TimeScale = 'UTC' | 'TAI' | 'TT' | 'GPS' | 'GST' | 'BDT';

export const TIME_SCALES: readonly TimeScale[] = ['UTC', 'TAI', 'TT', 'GPS', 'GST', 'BDT'];

/** Offset (scale − TAI) [s] for the uniform scales. UTC is not uniform and is not listed. */
export const SCALE_MINUS_TAI_S: Record<Exclude<TimeScale, 'UTC'>, number> = {
  TAI: 0,
  TT: TT_MINUS_TAI_S,
  GPS: -TAI_MINUS_GPS_S,
  GST: -TAI_MINUS_GST_S,
  BDT: -TAI_MINUS_BDT_S,
};

/** TAI label seconds of 2000-01-01T12:00:00 TT (J2000.0), from 1970-01-01T00:00:00 TAI. */
const J2000_TT_AS_TAI_WHOLE_S = daysFromCivil(2000, 1, 1) * 86400 + 43200 - 33; // 12:00:00 TT = 11:59:27.816 TAI
const J2000_TT_AS_TAI_FRAC_S = 1 - 0.184;

export class Instant {
  /** Whole TAI seconds since 1970-01-01T00:00:00 TAI (label arithmetic, 86400 s per day). */
  readonly taiWholeS: number;
  /** Fraction of a second, 0 ≤ taiFracS < 1. */
  readonly taiFracS: number;
  /** Scale the instant was given in; used for display, never for arithmetic. */
  readonly scale: TimeScale;

  constructor(taiWholeS: number, taiFracS: number, scale: TimeScale = 'TAI') {
    let carry = Math.floor(taiFracS);
    let frac = taiFracS - carry;
    // Snap sub-picosecond rounding noise at a whole second (e.g. from TT's 32.184 s offset) onto it.
    if (1 - frac < 1e-12) {
      carry += 1;
      frac = 0;
    }
    this.taiWholeS = taiWholeS + carry;
    this.taiFracS = frac;
    this.scale = scale;
  }

  /** From seconds since J2000.0 TT (the core's time coordinate). Precision is that of the double given. */
  static fromTtJ2000S(ttJ2000S: number, scale: TimeScale = 'TT'): Instant {
    const whole = Math.floor(ttJ2000S);
    return new Instant(J2000_TT_AS_TAI_WHOLE_S + whole, J2000_TT_AS_TAI_FRAC_S + (ttJ2000S - whole), scale);
  }

  /** Seconds since J2000.0 TT (2000-01-01T12:00:00 TT). A double: 0.1 µs resolution over decades. */
  get ttJ2000S(): number {
    return this.taiWholeS - J2000_TT_AS_TAI_WHOLE_S + (this.taiFracS - J2000_TT_AS_TAI_FRAC_S);
  }

  /** This instant moved by `spanS` seconds (SI seconds; TAI is uniform). */
  plusS(spanS: number): Instant {
    const whole = Math.floor(spanS);
    return new Instant(this.taiWholeS + whole, this.taiFracS + (spanS - whole), this.scale);
  }

  /** `this − other` in seconds, exact to the fraction's precision. */
  minusS(other: Instant): number {
    return this.taiWholeS - other.taiWholeS + (this.taiFracS - other.taiFracS);
  }

  /** Same instant, shown in another scale. */
  inScale(scale: TimeScale): Instant {
    return new Instant(this.taiWholeS, this.taiFracS, scale);
  }

  /** Label seconds of a uniform scale: whole and fraction since 1970-01-01T00:00:00 of that scale. */
  labelS(scale: Exclude<TimeScale, 'UTC'>): { wholeS: number; fracS: number } {
    const off = SCALE_MINUS_TAI_S[scale];
    const offWhole = Math.floor(off);
    let frac = this.taiFracS + (off - offWhole);
    let whole = this.taiWholeS + offWhole;
    if (frac >= 1) {
      frac -= 1;
      whole += 1;
    }
    return { wholeS: whole, fracS: frac };
  }

  compare(other: Instant): number {
    return this.minusS(other);
  }
}

/** Build an instant from label seconds of a uniform scale. */
export function instantFromLabel(scale: Exclude<TimeScale, 'UTC'>, wholeS: number, fracS: number): Instant {
  const off = SCALE_MINUS_TAI_S[scale];
  const offWhole = Math.floor(off);
  return new Instant(wholeS - offWhole, fracS - (off - offWhole), scale);
}
