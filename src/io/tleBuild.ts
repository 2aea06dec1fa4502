/**
 * Writing element sets in the TLE column layout (for invented demo and benchmark data).
 * Columns follow the NORAD two-line format; checksums come from formatTleLine.
 */
import { InputError } from '../errors.ts';
import { formatTleLine } from './tle.ts';

export interface TleElements {
  /** Catalogue number 1–99999. */
  catalogNumber: number;
  /** International designator, up to 8 characters, e.g. `27001A`. */
  designator: string;
  /** Epoch year (4 digits) and day of year with fraction (1.0 = Jan 1 00:00 UTC). */
  epochYear: number;
  epochDayOfYear: number;
  inclinationDeg: number;
  raanDeg: number;
  eccentricity: number;
  argpDeg: number;
  meanAnomalyDeg: number;
  meanMotionRevPerDay: number;
  /** B* drag term [1/earth radii]; 0 for none. */
  bstar?: number;
  /** First derivative of mean motion / 2 [rev/day²], as line 1 carries it; 0 for none. */
  meanMotionDotRevPerDay2?: number;
  elementSetNumber?: number;
  revolutionNumber?: number;
}

/** TLE exponent field like ` 12345-4` (value = 0.12345e-4). */
function expField(value: number): string {
  if (value === 0) return ' 00000-0';
  const sign = value < 0 ? '-' : ' ';
  let exp = Math.floor(Math.log10(Math.abs(value))) + 1;
  let mant = Math.round((Math.abs(value) / 10 ** exp) * 1e5);
  if (mant >= 100000) {
    mant = Math.round(mant / 10);
    exp += 1;
  }
  const expSign = exp < 0 ? '-' : '+';
  return `${sign}${String(mant).padStart(5, '0')}${expSign}${Math.abs(exp)}`;
}

function num(value: number, width: number, decimals: number): string {
  const s = value.toFixed(decimals);
  if (s.length > width) throw new InputError(`value ${value} does not fit ${width} columns`, 'TLE writer', 'check the element ranges');
  return s.padStart(width, ' ');
}

/** The two element lines (with checksums) for `el`. */
export function buildTleLines(el: TleElements): [string, string] {
  const sat = String(el.catalogNumber).padStart(5, '0');
  const yy = String(el.epochYear % 100).padStart(2, '0');
  const day = el.epochDayOfYear.toFixed(8).padStart(12, '0');
  const set = String(el.elementSetNumber ?? 1).padStart(4, ' ');
  const ndot = el.meanMotionDotRevPerDay2 ?? 0;
  if (!(Math.abs(ndot) < 1)) throw new InputError(`mean-motion derivative ${ndot} cannot be written in a TLE`, 'TLE writer', 'use |ṅ/2| < 1 rev/day²');
  const ndotField = `${ndot < 0 ? '-' : ' '}${Math.abs(ndot).toFixed(8).slice(1)}`;
  const line1 = `1 ${sat}U ${el.designator.padEnd(8, ' ')} ${yy}${day} ${ndotField}  00000-0 ${expField(el.bstar ?? 0)} 0 ${set}`;
  const ecc = Math.round(el.eccentricity * 1e7);
  if (ecc < 0 || ecc > 9999999) throw new InputError(`eccentricity ${el.eccentricity} cannot be written in a TLE`, 'TLE writer', 'use 0 ≤ e < 1');
  const rev = String(el.revolutionNumber ?? 0).padStart(5, ' ');
  const line2 = `2 ${sat} ${num(el.inclinationDeg, 8, 4)} ${num(el.raanDeg, 8, 4)} ${String(ecc).padStart(7, '0')} ${num(el.argpDeg, 8, 4)} ${num(el.meanAnomalyDeg, 8, 4)} ${num(el.meanMotionRevPerDay, 11, 8)}${rev}`;
  return [formatTleLine(line1), formatTleLine(line2)];
}
