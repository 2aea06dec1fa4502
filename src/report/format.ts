/** Number formatting helpers shared by the text and CSV writers. */
import { InternalError } from '../errors.ts';

/** Fixed decimals, refusing non-finite values. */
export function fixed(value: number, digits: number, quantity = 'value'): string {
  if (!Number.isFinite(value)) throw new InternalError(`non-finite ${quantity}: ${value}`, quantity);
  return value.toFixed(digits);
}

/** Scientific with `digits` significant digits after the point, e.g. 4.4647e-10. */
export function sci(value: number, digits: number, quantity = 'value'): string {
  if (!Number.isFinite(value)) throw new InternalError(`non-finite ${quantity}: ${value}`, quantity);
  return value.toExponential(digits);
}

/** Signed fixed: +1.234 / −1.234 (ASCII minus, so spreadsheets parse it). */
export function signed(value: number, digits: number, quantity = 'value'): string {
  const s = fixed(value, digits, quantity);
  return value >= 0 ? `+${s}` : s;
}

/** Right-aligned text table with a header row. */
export function textTable(columns: string[], rows: string[][], rightAlign: boolean[] = columns.map(() => true)): string {
  const widths = columns.map((c, i) => Math.max(c.length, ...rows.map((r) => r[i].length)));
  const line = (cells: string[]): string => cells.map((c, i) => (rightAlign[i] ? c.padStart(widths[i]) : c.padEnd(widths[i]))).join('  ').trimEnd();
  return [line(columns), line(widths.map((w) => '-'.repeat(w))), ...rows.map(line)].join('\n');
}
