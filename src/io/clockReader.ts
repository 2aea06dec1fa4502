/**
 * What every clock-measurement reader shares: the line-by-line interface the format dispatcher
 * feeds, the result shape, and helpers for time systems and per-clock ordering checks.
 */
import { InputError } from '../errors.ts';
import { emptySeries, type MeasurementFormat, type MeasurementSeries, type PeriodicTerm } from '../model/measurements.ts';
import type { TimeScale } from '../time/instant.ts';
import type { CivilTime, TimeSystem } from '../time/timeSystem.ts';
import type { TextLine } from './textSource.ts';

/** The clocks of one file. */
export interface ClockFile {
  format: MeasurementFormat;
  fileName: string;
  /** Every clock the file holds, in order of first appearance (including those not kept). */
  clocks: string[];
  /** Series of the clocks asked for (all of them when no selection was given). */
  series: Map<string, MeasurementSeries>;
  /** Facts about the file worth a line in the report (version, agency, time system). */
  notes: string[];
}

/** A reader fed one line at a time. */
export interface LineReader {
  push(l: TextLine): void;
  /** End of input; `lastLine` is the number of the last line read (0 for an empty file). */
  finish(lastLine: number): ClockFile;
}

/** Options common to the readers. */
export interface ClockReadOptions {
  fileName: string;
  timeSystem: TimeSystem;
  /** Clocks to keep (null: all). */
  wanted: ReadonlySet<string> | null;
}

/** A time-system code of a product (RINEX `TIME SYSTEM ID`, SP3 `%c`, TDM `TIME_SYSTEM`) as a tauplan scale. */
export interface ProductTimeSystem {
  scale: TimeScale;
  /** Label offset to add to reach `scale` (GLONASS time is UTC + 3 h: −10800 s). */
  offsetS: number;
}

/**
 * Product time-system codes (RINEX 3.04 §4 "TIME SYSTEM ID", SP3-d `%c`, CCSDS 503.0-B-2 §3.3.2.4;
 * from memory). QZSS and IRNSS system times are steered to GPS time; GLONASS time is UTC(SU) + 3 h.
 */
export const PRODUCT_TIME_SYSTEMS: Readonly<Record<string, ProductTimeSystem>> = {
  GPS: { scale: 'GPS', offsetS: 0 },
  QZS: { scale: 'GPS', offsetS: 0 },
  IRN: { scale: 'GPS', offsetS: 0 },
  GAL: { scale: 'GST', offsetS: 0 },
  GST: { scale: 'GST', offsetS: 0 },
  BDT: { scale: 'BDT', offsetS: 0 },
  TAI: { scale: 'TAI', offsetS: 0 },
  TT: { scale: 'TT', offsetS: 0 },
  UTC: { scale: 'UTC', offsetS: 0 },
  GLO: { scale: 'UTC', offsetS: -10800 },
};

/** Seconds since J2000.0 TT of a civil label in a product time system. */
export function productTimeTt(ts: TimeSystem, sys: ProductTimeSystem, c: CivilTime, where: string): number {
  const inst = sys.scale === 'UTC' ? ts.fromUtc(c, where) : ts.fromScale(sys.scale, c, where);
  return inst.ttJ2000S + sys.offsetS;
}

/**
 * Add a sample to a series, refusing a time that repeats or goes back (for that clock): a file out
 * of order usually means two files were joined, and the line numbers must point at the file as written.
 */
export function appendSample(s: MeasurementSeries, tt: number, offsetNs: number, sigmaNs: number | null, line: number, fileName: string, segment = 0): void {
  const n = s.ttJ2000S.length;
  if (n > 0 && !(tt > s.ttJ2000S[n - 1])) {
    const what = tt === s.ttJ2000S[n - 1] ? `clock ${s.clock}: time repeats the one on line ${s.line[n - 1]}` : `clock ${s.clock}: time goes back from line ${s.line[n - 1]}`;
    throw new InputError(what, `${fileName}:${line}`, 'keep each clock in time order, one value per instant (two files joined?)');
  }
  s.ttJ2000S.push(tt);
  s.offsetNs.push(offsetNs);
  if (s.sigmaNs !== null) s.sigmaNs.push(sigmaNs ?? Number.NaN);
  s.line.push(line);
  s.segment.push(segment);
}

/** The series of `clock`, created on first use. */
export function seriesFor(
  map: Map<string, MeasurementSeries>,
  clock: string,
  kind: MeasurementSeries['kind'],
  format: MeasurementFormat,
  scale: TimeScale,
  periodic: PeriodicTerm,
  withSigma: boolean,
): MeasurementSeries {
  let s = map.get(clock);
  if (s === undefined) {
    s = emptySeries(clock, kind, format, scale, periodic, withSigma);
    map.set(clock, s);
  }
  return s;
}

/** A plain decimal or exponent number (Fortran `D` exponents allowed); NaN otherwise. */
export function fortranNumber(text: string): number {
  const t = text.trim().replace(/[dD]/, 'E');
  return /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/.test(t) ? Number(t) : Number.NaN;
}

/** Feed every line of `lines` to a reader and finish it. */
export function feedAll(r: LineReader, lines: Iterable<TextLine>): ClockFile {
  let last = 0;
  for (const l of lines) {
    r.push(l);
    last = l.line;
  }
  return r.finish(last);
}
