/**
 * CSV writing with csv-stringify. Text cells that a spreadsheet would run as a formula
 * (starting with =, +, −, @, tab or CR) get a leading apostrophe; control and bidirectional
 * characters in them are shown as `\uXXXX` (safeText.ts). Numbers are written as numbers.
 */
import { lazyPackage } from '../lazyPackage.ts';
import { InternalError } from '../errors.ts';
import { escapeUnsafeText } from './safeText.ts';

const csvStringify = lazyPackage<typeof import('csv-stringify/sync')>('csv-stringify/sync');

export type CsvCell = string | number | boolean | null;

/** Neutralise a text cell that a spreadsheet would evaluate, and escape unsafe characters in it. */
export function safeCsvText(s: string): string {
  return /^[=+\-@\t\r]/.test(s) ? `'${escapeUnsafeText(s)}` : escapeUnsafeText(s);
}

/** A plain decimal or scientific number, as the writers print them (not a formula). */
const NUMBER_CELL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/**
 * A cell read back from a CSV file (all cells are text then): numbers stay as they are, any other
 * text is neutralised like {@link safeCsvText}. For `merge`, whose inputs may have been edited.
 */
export function safeCsvCell(s: string): string {
  return NUMBER_CELL.test(s) ? s : safeCsvText(s);
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
  return csvStringify().stringify([columns as string[], ...body]);
}
