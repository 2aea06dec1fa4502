/**
 * Number formatting for the text reports. One minus sign everywhere: U+2212 in text and HTML,
 * ASCII hyphen-minus in CSV and JSON (those carry numbers as numbers and never pass through here).
 */
import { InternalError } from '../errors.ts';

/** The minus sign of the text and HTML reports. */
export const MINUS_SIGN = '\u2212';

/** A formatted number with U+2212 for its sign and its exponent's sign; a value that rounds to zero has no sign. */
function typographic(s: string): string {
  const bare = /^-0(\.0+)?(e[+-]\d+)?$/.test(s) ? s.slice(1) : s;
  return bare.replace(/-/g, MINUS_SIGN);
}

/** Fixed decimals, refusing non-finite values. */
export function fixed(value: number, digits: number, quantity = 'value'): string {
  if (!Number.isFinite(value)) throw new InternalError(`non-finite ${quantity}: ${value}`, quantity);
  return typographic(value.toFixed(digits));
}

/** Scientific with `digits` digits after the point, e.g. 4.4647e−10. */
export function sci(value: number, digits: number, quantity = 'value'): string {
  if (!Number.isFinite(value)) throw new InternalError(`non-finite ${quantity}: ${value}`, quantity);
  return typographic(value.toExponential(digits));
}

/** Signed fixed: +1.234 / −1.234 (a value that rounds to zero prints without a sign). */
export function signed(value: number, digits: number, quantity = 'value'): string {
  const s = fixed(value, digits, quantity);
  return s.startsWith(MINUS_SIGN) || /^0(\.0+)?$/.test(s) ? s : `+${s}`;
}

/**
 * Text for people with one minus sign: an ASCII hyphen-minus that starts a number (after a space,
 * bracket, sign of equality, slash or the start of a line) or an exponent becomes U+2212.
 * Dates (2027-01-04), identifiers (TSR-1) and options (--from) are left alone.
 */
export function typographicMinus(text: string): string {
  return text.replace(/(^|[\s([{=:/,;|~<>])-(?=\.?\d)/gm, `$1${MINUS_SIGN}`).replace(/(\d[eE])-(?=\d)/g, `$1${MINUS_SIGN}`);
}

/** Right-aligned text table with a header row. */
export function textTable(columns: string[], rows: string[][], rightAlign: boolean[] = columns.map(() => true)): string {
  const widths = columns.map((c, i) => Math.max(c.length, ...rows.map((r) => r[i].length)));
  const line = (cells: string[]): string => cells.map((c, i) => (rightAlign[i] ? c.padStart(widths[i]) : c.padEnd(widths[i]))).join('  ').trimEnd();
  return [line(columns), line(widths.map((w) => '-'.repeat(w))), ...rows.map(line)].join('\n');
}
