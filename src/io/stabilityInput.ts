/**
 * A bare phase or frequency record for `tauplan stability`: one numeric column, `#` comments and
 * blank lines skipped, CRLF, BOM and trailing blanks accepted. Pure text → numbers; the CLI
 * reads the file (and unpacks gzip).
 */
import { InputError } from '../errors.ts';

/** One column of samples. */
export interface SingleColumn {
  /** Values in file order; NaN where the file says NaN (a missing sample). */
  values: Float64Array;
  /** Number of NaN samples (kept as missing points). */
  nanCount: number;
  /** 1-based line of each value. */
  lines: Int32Array;
}

const NAN_TOKEN = /^[+-]?nan$/i;

/**
 * Parse one numeric column.
 * @param text   file text
 * @param source file name for error locations
 * @throws InputError on a line that is not one number (with its line), on ±Infinity, or when the file has no values
 */
export function parseSingleColumn(text: string, source: string): SingleColumn {
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const lines = body.split(/\r?\n/);
  const values: number[] = [];
  const lineNos: number[] = [];
  let nanCount = 0;
  for (let i = 0; i < lines.length; i++) {
    const t = lines[i].trim();
    if (t === '' || t.startsWith('#')) continue;
    const where = `${source}:${i + 1}`;
    const tokens = t.split(/[\s,;]+/);
    if (tokens.length !== 1) {
      throw new InputError(`${tokens.length} columns where one number was expected`, where, 'give one value per line (phase in s or fractional frequency), or a CSV with a time,offsetNs header');
    }
    if (NAN_TOKEN.test(t)) {
      values.push(Number.NaN);
      lineNos.push(i + 1);
      nanCount++;
      continue;
    }
    const v = Number(t);
    if (t === '' || Number.isNaN(v)) throw new InputError(`${JSON.stringify(t.slice(0, 40))} is not a number`, where, 'give one number per line; comments start with #, a missing sample is NaN');
    if (!Number.isFinite(v)) throw new InputError(`${t} is not finite`, where, 'give a finite number, or NaN for a missing sample');
    values.push(v);
    lineNos.push(i + 1);
  }
  if (values.length === 0) throw new InputError('no values', source, 'give one number per line');
  return { values: Float64Array.from(values), nanCount, lines: Int32Array.from(lineNos) };
}

/** True when the text looks like a measurement CSV (`time,offsetNs` header) rather than one column. */
export function looksLikeMeasurementCsv(text: string): boolean {
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  for (const line of body.split(/\r?\n/, 200)) {
    const t = line.trim();
    if (t === '' || t.startsWith('#')) continue;
    return /^"?time"?\s*,/i.test(t);
  }
  return false;
}
