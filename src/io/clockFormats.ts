/**
 * Clock-measurement files of any supported format: the format is recognised from the first line
 * (or forced with `--input-format`), and the file is streamed line by line into that format's
 * reader. Formats: our CSV (`time,offsetNs[,sigmaNs]`), RINEX clock, SP3 (clock column), CCSDS
 * TDM (KVN). Any of them may be gzip-compressed (see textSource.ts).
 */
import { InputError } from '../errors.ts';
import type { MeasurementFormat, MeasurementSeries } from '../model/measurements.ts';
import type { TimeScale } from '../time/instant.ts';
import type { TimeSystem } from '../time/timeSystem.ts';
import type { ClockFile, ClockReadOptions, LineReader } from './clockReader.ts';
import { MeasurementCsvReader } from './measurements.ts';
import { RinexClockReader } from './rinexClock.ts';
import { Sp3ClockReader } from './sp3Clock.ts';
import { TdmReader } from './tdm.ts';
import { linesOf, readTextLines, sourceName, type TextLine } from './textSource.ts';

/** Names `--input-format` takes. */
export const MEASUREMENT_FORMATS: readonly MeasurementFormat[] = ['csv', 'rinex-clock', 'sp3', 'tdm'];

/** Options of {@link readClockFile}. */
export interface ClockFileOptions {
  timeSystem: TimeSystem;
  /** Clocks to keep (null: all). */
  wanted: ReadonlySet<string> | null;
  /** Forced format (`--input-format`); detected from the content when absent. */
  format?: MeasurementFormat;
  /** Scale of CSV times written without one (`--time-scale`). */
  defaultScale?: TimeScale;
  /** Most CSV rows kept (default: no limit); a longer file is refused naming the limit and `maxRowsFix`. */
  maxRows?: number;
  /** The way out named when `maxRows` is passed. */
  maxRowsFix?: string;
}

/** The format a first line announces, or null. */
export function detectFormat(firstLine: string): MeasurementFormat | null {
  const t = firstLine.replace(/^\ufeff/, '');
  if (/^#[cd][PV]/.test(t)) return 'sp3';
  if (/RINEX VERSION \/ TYPE/.test(t)) return 'rinex-clock';
  if (/^\s*CCSDS_TDM_VERS\s*=/.test(t)) return 'tdm';
  // Any comma-separated first line goes to the CSV reader, whose header check says what is expected.
  if (/^\s*time\s*,\s*offsetNs\s*(,\s*sigmaNs\s*)?$/.test(t) || t.includes(',')) return 'csv';
  return null;
}

/** Our CSV, streamed row by row into one clock named `clock`. */
class CsvReader implements LineReader {
  private readonly csv: MeasurementCsvReader;
  constructor(
    private readonly o: ClockReadOptions,
    opts: ClockFileOptions,
  ) {
    this.csv = new MeasurementCsvReader(o.fileName, o.timeSystem, opts.defaultScale, opts.maxRows, opts.maxRowsFix);
  }
  push(l: TextLine): void {
    this.csv.push(l);
  }
  finish(lastLine: number): ClockFile {
    const s = this.csv.finish(lastLine);
    return { format: 'csv', fileName: this.o.fileName, clocks: ['clock'], series: new Map([['clock', s]]), notes: [] };
  }
}

function readerFor(format: MeasurementFormat, o: ClockReadOptions, opts: ClockFileOptions): LineReader {
  switch (format) {
    case 'rinex-clock':
      return new RinexClockReader(o);
    case 'sp3':
      return new Sp3ClockReader(o);
    case 'tdm':
      return new TdmReader(o);
    default:
      return new CsvReader(o, opts);
  }
}

function unknownFormat(name: string, first: string, line: number): InputError {
  const hint = /^\s*<\?xml/.test(first) ? ' (XML is not read: give the KVN form)' : '';
  return new InputError(`cannot tell the format of ${name} from its first line${hint}`, `${name}:${line}`, `give a CSV (time,offsetNs), RINEX clock, SP3 or CCSDS TDM (KVN) file, or name the format with --input-format ${MEASUREMENT_FORMATS.join('|')}`);
}

/** Feed lines, detecting the format on the first non-blank one. */
class Dispatcher {
  private reader: LineReader | null = null;
  private last = 0;
  format: MeasurementFormat | null;
  constructor(
    private readonly o: ClockReadOptions,
    private readonly opts: ClockFileOptions,
  ) {
    this.format = opts.format ?? null;
    if (this.format !== null) this.reader = readerFor(this.format, o, opts);
  }
  push(l: TextLine): void {
    this.last = l.line;
    if (this.reader === null) {
      if (l.text.trim() === '') return;
      const f = detectFormat(l.text);
      if (f === null) throw unknownFormat(this.o.fileName, l.text, l.line);
      this.format = f;
      this.reader = readerFor(f, this.o, this.opts);
    }
    this.reader.push(l);
  }
  finish(): ClockFile {
    if (this.reader === null) throw new InputError(`${this.o.fileName} is empty`, this.o.fileName, 'give a clock measurement file');
    return this.reader.finish(this.last);
  }
}

/** Read the clocks of a file (path or `-`), streaming. */
export async function readClockFile(path: string, opts: ClockFileOptions): Promise<ClockFile> {
  const o: ClockReadOptions = { fileName: sourceName(path), timeSystem: opts.timeSystem, wanted: opts.wanted };
  const d = new Dispatcher(o, opts);
  for await (const l of readTextLines(path, 'measurements', 'measurements')) d.push(l);
  return d.finish();
}

/** The same from a string (tests, library callers with text in memory). */
export function readClockText(text: string, fileName: string, opts: ClockFileOptions): ClockFile {
  const o: ClockReadOptions = { fileName, timeSystem: opts.timeSystem, wanted: opts.wanted };
  const d = new Dispatcher(o, opts);
  for (const l of linesOf(text)) d.push(l);
  return d.finish();
}

/**
 * The one series a fit uses: `sat` when given (refused, listing the file's clocks, when absent),
 * else the file's only clock. A clock with no usable value is refused too.
 */
export function pickSeries(file: ClockFile, sat: string | undefined): MeasurementSeries {
  const list = file.clocks.length > 30 ? `${file.clocks.slice(0, 30).join(', ')}, … (${file.clocks.length} in all)` : file.clocks.join(', ');
  let s: MeasurementSeries | undefined;
  if (sat === undefined || file.format === 'csv') {
    if (file.clocks.length !== 1) throw new InputError(`${file.fileName} holds ${file.clocks.length} clocks`, '--sat', `choose one with --sat: ${list}; or survey them all with --all`);
    s = file.series.get(file.clocks[0]);
  } else {
    s = file.series.get(sat);
    if (s === undefined || !file.clocks.includes(sat)) throw new InputError(`clock ${JSON.stringify(sat)} is not in ${file.fileName}`, '--sat', `use one of ${list}`);
  }
  if (s === undefined || s.ttJ2000S.length === 0) {
    throw new InputError(`clock ${s?.clock ?? sat ?? ''} has no usable value in ${file.fileName}${s !== undefined && s.skipped > 0 ? ` (${s.skipped} absent or bad)` : ''}`, '--sat', 'choose another clock');
  }
  return s;
}
