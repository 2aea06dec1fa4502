/**
 * The clock column of SP3-c/SP3-d files as a measurement series ("The Extended Standard Product 3
 * Orbit Format (SP3-d)", S. Hilla, IGS, 2016; same columns in SP3-c). The file streams through
 * {@link Sp3Reader}, and the parsed file serves as the orbit too.
 *
 * Per satellite: the `P` record's clock (µs, columns 47–60) becomes offsetNs = µs × 1000;
 * `999999.999999` means no value and is skipped and counted, never read as a number; a clock-event
 * flag `E` (column 75) starts a new segment (the fit gives each segment its own offset); a
 * clock-prediction flag `P` (column 76) is kept and counted. Precise products exclude the periodic
 * relativistic term (IGS convention).
 */
import type { MeasurementSeries } from '../model/measurements.ts';
import { noteSkipped } from '../model/measurements.ts';
import { appendSample, seriesFor, type ClockFile, type ClockReadOptions, type LineReader } from './clockReader.ts';
import { Sp3Reader, type Sp3File } from './sp3.ts';
import type { TextLine } from './textSource.ts';

/** A clock file read from SP3, with the parsed SP3 kept for use as the orbit. */
export interface Sp3ClockFile extends ClockFile {
  sp3: Sp3File;
}

/** Series of the satellites in `wanted` (all when null) from a parsed SP3 file. */
export function sp3ClockSeries(sp3: Sp3File, o: ClockReadOptions): Sp3ClockFile {
  const series = new Map<string, MeasurementSeries>();
  const ts = o.timeSystem;
  for (const id of sp3.satelliteIds) {
    if (o.wanted === null || o.wanted.has(id)) seriesFor(series, id, 'satellite', 'sp3', sp3.timeScale, 'excluded', false);
  }
  for (const ep of sp3.epochs) {
    const where = `${sp3.fileName}:${ep.line}`;
    let tt: number | null = null;
    for (const [id, rec] of ep.records) {
      const s = series.get(id);
      if (s === undefined) continue;
      if (rec.clockUs === null) {
        noteSkipped(s, rec.line);
        continue;
      }
      tt ??= sp3.timeScale === 'UTC' ? ts.fromUtc(ep.scaleCivil, where).ttJ2000S : ts.fromScale(sp3.timeScale, ep.scaleCivil, where).ttJ2000S;
      const n = s.segment.length;
      const segment = n === 0 ? 0 : s.segment[n - 1] + (rec.clockEvent ? 1 : 0);
      appendSample(s, tt, rec.clockUs * 1000, null, rec.line, sp3.fileName, segment);
      if (rec.clockPredicted) s.predicted++;
    }
  }
  const notes = [`SP3-${sp3.version} ${sp3.agency} ${sp3.orbitType}, ${sp3.coordinateSystem}, time system ${sp3.timeSystemCode}, clock column in µs`];
  return { format: 'sp3', fileName: sp3.fileName, clocks: [...sp3.satelliteIds], series, notes, sp3 };
}

/** Line-by-line front for the format dispatcher: the SP3 reader streams, the series are taken at the end. */
export class Sp3ClockReader implements LineReader {
  private readonly sp3: Sp3Reader;
  constructor(private readonly o: ClockReadOptions) {
    this.sp3 = new Sp3Reader(o.fileName);
  }
  push(l: TextLine): void {
    this.sp3.push(l);
  }
  finish(): Sp3ClockFile {
    return sp3ClockSeries(this.sp3.finish(), this.o);
  }
}
