/**
 * CSV writing with csv-stringify. Text cells that a spreadsheet would run as a formula
 * (starting with =, +, −, @, tab or CR) get a leading apostrophe. Numbers are written as numbers.
 */
import { stringify } from 'csv-stringify/sync';
import { InternalError } from '../errors.ts';

export type CsvCell = string | number | boolean | null;

/** Neutralise a text cell that a spreadsheet would evaluate. */
export function safeCsvText(s: string): string {
  return /^[=+\-@\t\r]/.test(s) ? `'${s}` : s;
}

/** One CSV document: header plus rows. Throws InternalError on a non-finite number. */
export function toCsv(columns: readonly string[], rows: readonly CsvCell[][]): string {
  const body = rows.map((r) =>
    r.map((c, i) => {
      if (typeof c === 'number') {
        if (!Number.isFinite(c)) throw new InternalError(`non-finite ${columns[i]} in CSV output: ${c}`, columns[i]);
        return String(c);
      }
      if (typeof c === 'string') return safeCsvText(c);
      if (c === null) return '';
      return String(c);
    }),
  );
  return stringify([columns as string[], ...body]);
}
