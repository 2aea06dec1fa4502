/**
 * Reader for clock-offset measurement files (`tauplan fit MEASUREMENTS.csv`).
 *
 * Format (contract, `tauplan fit`): a header that is exactly `time,offsetNs` or
 * `time,offsetNs,sigmaNs` (spaces around names and a UTF-8 BOM are tolerated), then one row
 * per measurement. `time` is any time string {@link TimeSystem.parse} accepts (ISO 8601 with
 * `Z` or a scale name, `GPSW week sow`, `MJD ...`); `offsetNs` is the clock reading minus the
 * reference scale in ns; `sigmaNs` (optional) is its 1-σ uncertainty in ns, > 0.
 */
import { lazyPackage } from '../lazyPackage.ts';
import { InputError } from '../errors.ts';
import type { TimeSystem } from '../time/timeSystem.ts';
import type { TimeScale } from '../time/instant.ts';
import type { Instant } from '../time/instant.ts';
import { emptySeries, type MeasurementSeries } from '../model/measurements.ts';
import type { TextLine } from './textSource.ts';

const csvParse = lazyPackage<typeof import('csv-parse/sync')>('csv-parse/sync');

/** One measurement row, as read. */
export interface MeasurementRow {
  /** 1-based line number in the file (the record's last line if a quoted field spans lines). */
  line: number;
  /** Time of the measurement, seconds since J2000.0 TT. */
  ttJ2000S: number;
  /** The time exactly as written in the file (trimmed), for messages. */
  timeText: string;
  /** Clock offset: onboard clock reading minus the reference time scale, ns. */
  offsetNs: number;
  /** 1-σ uncertainty of `offsetNs` in ns, or null when the file has no `sigmaNs` column. */
  sigmaNs: number | null;
}

/** Parsed measurement file: rows in file order (which is strictly increasing time order). */
export interface Measurements {
  rows: MeasurementRow[];
  /** True when the file has a `sigmaNs` column (then every row has a sigma). */
  hasSigma: boolean;
}

const HEADER_2 = 'time,offsetNs';
const HEADER_3 = 'time,offsetNs,sigmaNs';
/** A plain decimal or exponent number; refuses `''`, `0x10`, `Infinity` that `Number()` would take. */
const NUMBER_RE = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/; // no `\d+\.?\d*`: quadratic on long digit runs

interface CsvRecord {
  record: string[];
  info: { lines: number };
}

/**
 * Parse the text of a measurement CSV.
 *
 * Times must be strictly increasing. Unsorted or repeated times are refused, naming both lines,
 * rather than silently sorted or merged: a file out of order usually means two files were
 * concatenated or a column was mis-edited, and the fit's rejected-row line numbers must point at
 * the file as written.
 *
 * @param text      whole file content (UTF-8, BOM allowed)
 * @param fileName  name used in messages (`file:line`)
 * @param timeSystem leap-second-aware parser for the `time` column
 * @param defaultScale scale of times written without `Z` or a scale name (`--time-scale`); without
 *   it such a time is refused
 * @throws InputError (or its TimeError subclass) with `file:line` for every fault
 */
export function parseMeasurementsCsv(text: string, fileName: string, timeSystem: TimeSystem, defaultScale?: TimeScale): Measurements {
  let records: CsvRecord[];
  try {
    records = csvParse().parse(text, {
      bom: true,
      trim: true,
      skip_empty_lines: true,
      relax_column_count: true,
      info: true,
    }) as unknown as CsvRecord[];
  } catch (e) {
    const line = typeof (e as { lines?: unknown }).lines === 'number' ? (e as { lines: number }).lines : 1;
    const msg = e instanceof Error ? e.message : String(e);
    throw new InputError(`cannot read CSV: ${msg}`, `${fileName}:${line}`, 'check quotes and commas; the file must be plain comma-separated text');
  }

  const first = records[0];
  if (first === undefined) {
    throw new InputError('empty measurement file', `${fileName}:1`, `start with the header ${HEADER_2} or ${HEADER_3}, then one row per measurement`);
  }
  const header = first.record.join(',');
  if (header !== HEADER_2 && header !== HEADER_3) {
    throw new InputError(
      `header is ${JSON.stringify(header)}`,
      `${fileName}:${first.info.lines}`,
      `the first line must be exactly ${HEADER_2} or ${HEADER_3}`,
    );
  }
  const hasSigma = header === HEADER_3;
  const columns = hasSigma ? 3 : 2;

  const rows: MeasurementRow[] = [];
  for (let k = 1; k < records.length; k++) {
    const { record, info } = records[k];
    const line = info.lines;
    const where = `${fileName}:${line}`;
    if (record.length !== columns) {
      throw new InputError(`row has ${record.length} fields, the header has ${columns}`, where, `write ${hasSigma ? HEADER_3 : HEADER_2} values on every row`);
    }
    const timeText = record[0];
    const ttJ2000S = parseTime(timeSystem, timeText, where, defaultScale).ttJ2000S;
    const offsetNs = readNumber(record[1], 'offsetNs', where);
    let sigmaNs: number | null = null;
    if (hasSigma) {
      sigmaNs = readNumber(record[2], 'sigmaNs', where);
      if (!(sigmaNs > 0)) throw new InputError(`sigmaNs ${record[2]} is not positive`, where, 'give each 1-σ uncertainty in ns as a number > 0, or drop the sigmaNs column');
    }
    const prev = rows[rows.length - 1];
    if (prev !== undefined && !(ttJ2000S > prev.ttJ2000S)) {
      const what = ttJ2000S === prev.ttJ2000S ? `time ${JSON.stringify(timeText)} repeats the time of line ${prev.line}` : `time ${JSON.stringify(timeText)} is earlier than ${JSON.stringify(prev.timeText)} on line ${prev.line}`;
      throw new InputError(what, where, 'sort the rows by time and keep one measurement per instant');
    }
    rows.push({ line, ttJ2000S, timeText, offsetNs, sigmaNs });
  }
  if (rows.length === 0) {
    throw new InputError('no measurement rows after the header', `${fileName}:${first.info.lines + 1}`, 'add rows like 2027-01-01T00:00:00Z,12.5');
  }
  return { rows, hasSigma };
}

/** A time with its own scale, or in `defaultScale` when it names none. */
function parseTime(ts: TimeSystem, text: string, where: string, defaultScale: TimeScale | undefined): Instant {
  const bare = /^\d{4}-\d{2}-\d{2}T[\d:.]+$/.test(text);
  if (bare && defaultScale !== undefined) return ts.parse(defaultScale === 'UTC' ? `${text}Z` : `${text} ${defaultScale}`, where);
  return ts.parse(text, where);
}

/** Scale a CSV time is written in: `Z` is UTC, else the trailing scale name, else the default. */
export function scaleOfTimeText(text: string, defaultScale: TimeScale = 'UTC'): TimeScale {
  if (text.endsWith('Z')) return 'UTC';
  const last = text.split(/\s+/).pop()?.toUpperCase() ?? '';
  const known: readonly string[] = ['UTC', 'TAI', 'TT', 'GPS', 'GST', 'BDT'];
  if (known.includes(last)) return last as TimeScale;
  return text.startsWith('GPSW') ? 'GPS' : defaultScale;
}

function readNumber(text: string, column: string, where: string): number {
  const value = NUMBER_RE.test(text) ? Number(text) : Number.NaN;
  if (!Number.isFinite(value)) {
    throw new InputError(`${column} ${JSON.stringify(text)} is not a number`, where, `write ${column} as a decimal number such as 12.5 or -3.2e2`);
  }
  return value;
}

/** A header row's fields as written (a BOM is already gone), trimmed. */
const HEADER_FIELDS_2 = HEADER_2.split(',');

/**
 * The same CSV fed one line at a time (textSource.ts streams it), kept as a measurement series of
 * plain number arrays: nothing per row but its numbers, so a 5-million-row file (58 days at 1 Hz)
 * costs about 120 MB rather than an object and a string per row. Same checks and messages as
 * {@link parseMeasurementsCsv}; a quoted field must close on its own line.
 */
export class MeasurementCsvReader {
  private columns = 0;
  private headerLine = 0;
  private prevTimeText = '';
  private readonly series: MeasurementSeries;
  private scaleSet = false;

  constructor(
    private readonly fileName: string,
    private readonly timeSystem: TimeSystem,
    private readonly defaultScale: TimeScale | undefined,
    /** Most rows kept; more is refused with this limit's name and the way out. */
    private readonly maxRows: number = Number.POSITIVE_INFINITY,
    private readonly maxRowsFix = 'split the file, or thin it to a coarser interval',
  ) {
    this.series = emptySeries('clock', 'unknown', 'csv', defaultScale ?? 'UTC', 'included', false);
  }

  push(l: TextLine): void {
    const where = `${this.fileName}:${l.line}`;
    const record = splitCsvLine(l.text, where);
    if (record === null) return; // blank line
    if (this.columns === 0) {
      const header = record.join(',');
      if (header !== HEADER_2 && header !== HEADER_3) {
        throw new InputError(`header is ${JSON.stringify(header)}`, where, `the first line must be exactly ${HEADER_2} or ${HEADER_3}`);
      }
      this.columns = header === HEADER_3 ? 3 : HEADER_FIELDS_2.length;
      this.headerLine = l.line;
      if (this.columns === 3) this.series.sigmaNs = [];
      return;
    }
    const s = this.series;
    const hasSigma = this.columns === 3;
    if (record.length !== this.columns) {
      throw new InputError(`row has ${record.length} fields, the header has ${this.columns}`, where, `write ${hasSigma ? HEADER_3 : HEADER_2} values on every row`);
    }
    const n = s.ttJ2000S.length;
    if (n >= this.maxRows) {
      throw new InputError(`more than ${this.maxRows} measurement rows in ${this.fileName}`, where, this.maxRowsFix);
    }
    const timeText = record[0];
    const tt = parseTime(this.timeSystem, timeText, where, this.defaultScale).ttJ2000S;
    const offsetNs = readNumber(record[1], 'offsetNs', where);
    let sigmaNs = Number.NaN;
    if (hasSigma) {
      sigmaNs = readNumber(record[2], 'sigmaNs', where);
      if (!(sigmaNs > 0)) throw new InputError(`sigmaNs ${record[2]} is not positive`, where, 'give each 1-σ uncertainty in ns as a number > 0, or drop the sigmaNs column');
    }
    if (n > 0 && !(tt > s.ttJ2000S[n - 1])) {
      const prevLine = s.line[n - 1];
      const what = tt === s.ttJ2000S[n - 1] ? `time ${JSON.stringify(timeText)} repeats the time of line ${prevLine}` : `time ${JSON.stringify(timeText)} is earlier than ${JSON.stringify(this.prevTimeText)} on line ${prevLine}`;
      throw new InputError(what, where, 'sort the rows by time and keep one measurement per instant');
    }
    if (!this.scaleSet) {
      s.timeScale = scaleOfTimeText(timeText, this.defaultScale);
      this.scaleSet = true;
    }
    this.prevTimeText = timeText;
    s.ttJ2000S.push(tt);
    s.offsetNs.push(offsetNs);
    if (hasSigma) s.sigmaNs?.push(sigmaNs);
    s.line.push(l.line);
    s.segment.push(0);
  }

  /** The series; `lastLine` is the number of the last line read. */
  finish(lastLine: number): MeasurementSeries {
    if (this.columns === 0) {
      throw new InputError('empty measurement file', `${this.fileName}:1`, `start with the header ${HEADER_2} or ${HEADER_3}, then one row per measurement`);
    }
    if (this.series.ttJ2000S.length === 0) {
      throw new InputError('no measurement rows after the header', `${this.fileName}:${Math.max(lastLine, this.headerLine) + 1}`, 'add rows like 2027-01-01T00:00:00Z,12.5');
    }
    return this.series;
  }
}

/** The fields of one CSV line, trimmed (RFC 4180 quotes within the line), or null for a blank line. */
function splitCsvLine(text: string, where: string): string[] | null {
  if (text.trim() === '') return null;
  if (!text.includes('"')) return text.split(',').map((f) => f.trim());
  const out: string[] = [];
  let i = 0;
  for (let guard = 0; guard <= text.length; guard++) {
    while (text[i] === ' ' || text[i] === '\t') i++;
    let field = '';
    if (text[i] === '"') {
      i++;
      for (;;) {
        const q = text.indexOf('"', i);
        if (q < 0) throw new InputError('cannot read CSV: a quoted field is not closed on its line', where, 'check quotes and commas; the file must be plain comma-separated text');
        field += text.slice(i, q);
        if (text[q + 1] === '"') {
          field += '"';
          i = q + 2;
          continue;
        }
        i = q + 1;
        break;
      }
      const comma = text.indexOf(',', i);
      const rest = (comma < 0 ? text.slice(i) : text.slice(i, comma)).trim();
      if (rest !== '') throw new InputError(`cannot read CSV: text after a closing quote (${JSON.stringify(rest.slice(0, 20))})`, where, 'check quotes and commas; the file must be plain comma-separated text');
      out.push(field);
      if (comma < 0) return out;
      i = comma + 1;
    } else {
      const comma = text.indexOf(',', i);
      field = comma < 0 ? text.slice(i) : text.slice(i, comma);
      if (field.includes('"')) throw new InputError('cannot read CSV: a quote inside an unquoted field', where, 'check quotes and commas; the file must be plain comma-separated text');
      out.push(field.trim());
      if (comma < 0) return out;
      i = comma + 1;
    }
  }
  return out;
}
