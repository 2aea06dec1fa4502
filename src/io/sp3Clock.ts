/**
 * The clock column of SP3-c/SP3-d files as a measurement series ("The Extended Standard Product 3
 * Orbit Format (SP3-d)", S. Hilla, IGS, 2016; same columns in SP3-c). The whole file is parsed
 * by {@link parseSp3} (an SP3 day is a few MB), so the same parse serves as the orbit.
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
import { parseSp3, type Sp3File } from './sp3.ts';
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

/** Line-by-line front for the format dispatcher: collects the text, then parses it whole. */
export class Sp3ClockReader implements LineReader {
  private readonly lines: string[] = [];
  constructor(private readonly o: ClockReadOptions) {}
  push(l: TextLine): void {
    this.lines.push(l.text);
  }
  finish(): Sp3ClockFile {
    const sp3 = parseSp3(this.lines.join('\n'), this.o.fileName);
    this.lines.length = 0;
    return sp3ClockSeries(sp3, this.o);
  }
}
