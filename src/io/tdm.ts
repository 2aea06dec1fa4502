/**
 * CCSDS Tracking Data Messages in KVN (CCSDS 503.0-B-2, "Tracking Data Message", Blue Book, 2020;
 * layout from that document): clock measurements only.
 *
 * Read: the header (`CCSDS_TDM_VERS` 1.0 or 2.0 first, then `CREATION_DATE`, `ORIGINATOR`, ...),
 * one or more segments of `META_START` … `META_STOP` (`TIME_SYSTEM`, `PARTICIPANT_n`) and
 * `DATA_START` … `DATA_STOP`, with `COMMENT` lines anywhere. Data lines are `KEYWORD = time value`.
 * `CLOCK_BIAS` (s) is the measurement; `CLOCK_DRIFT` (s/s) is kept and reported beside the fitted
 * rate. Other tracking keywords (RANGE, DOPPLER_*, ANGLE_*, ...) are counted and left out. A clock
 * is named after its segment's `PARTICIPANT_1`. Times are `YYYY-MM-DDThh:mm:ss[.f]` or the
 * day-of-year form `YYYY-DDDThh:mm:ss[.f]`, in the segment's `TIME_SYSTEM` (UTC, TAI, TT, GPS, GST, BDT).
 *
 * Measurements between a station and a spacecraft's own clock include the periodic relativistic
 * term (it is part of what the onboard clock does), so the series is marked `included`.
 */
import { InputError } from '../errors.ts';
import type { MeasurementSeries } from '../model/measurements.ts';
import { noteSkipped } from '../model/measurements.ts';
import { ccsdsCivil } from './ccsdsTime.ts';
import type { CivilTime } from '../time/timeSystem.ts';
import { appendSample, feedAll, fortranNumber, PRODUCT_TIME_SYSTEMS, productTimeTt, seriesFor, type ClockFile, type ClockReadOptions, type LineReader, type ProductTimeSystem } from './clockReader.ts';
import { linesOf, type TextLine } from './textSource.ts';

const TDM_VERSIONS = ['1.0', '2.0'];
const TDM_TIME_SYSTEMS = ['UTC', 'TAI', 'TT', 'GPS', 'GST', 'BDT'];
const KV = /^([A-Z0-9_]+)\s*=\s*(.*)$/;

type State = 'start' | 'header' | 'meta' | 'between' | 'data';

/** Line-by-line reader of a KVN TDM's clock data. */
export class TdmReader implements LineReader {
  private state: State = 'start';
  private version = '';
  private meta = new Map<string, string>();
  private metaLine = 0;
  private sys: ProductTimeSystem | null = null;
  private sysCode = '';
  private participant = '';
  private readonly clocks: string[] = [];
  private readonly series = new Map<string, MeasurementSeries>();
  private readonly drift = new Map<string, { sum: number; n: number }>();
  private otherKeywords = new Map<string, number>();
  private segments = 0;

  constructor(private readonly o: ClockReadOptions) {}

  private fail(what: string, line: number, fix: string): never {
    throw new InputError(what, `${this.o.fileName}:${line}`, fix);
  }

  push(l: TextLine): void {
    const t = l.text.trim();
    if (t === '' || t.startsWith('COMMENT')) return;
    if (this.state === 'start') {
      const m = KV.exec(t);
      if (m === null || m[1] !== 'CCSDS_TDM_VERS') this.fail('first line is not CCSDS_TDM_VERS = …', l.line, 'a KVN TDM starts with CCSDS_TDM_VERS = 2.0');
      const v = (m as RegExpExecArray)[2].trim();
      if (!TDM_VERSIONS.includes(v)) this.fail(`TDM version ${JSON.stringify(v)} is not read`, l.line, `tauplan reads TDM versions ${TDM_VERSIONS.join(', ')}`);
      this.version = v;
      this.state = 'header';
      return;
    }
    if (t === 'META_START') {
      if (this.state !== 'header' && this.state !== 'between') this.fail('META_START inside a segment', l.line, 'close the data section with DATA_STOP first');
      this.state = 'meta';
      this.meta = new Map();
      this.metaLine = l.line;
      return;
    }
    if (t === 'META_STOP') {
      if (this.state !== 'meta') this.fail('META_STOP without META_START', l.line, 'open the metadata with META_START');
      this.endMeta(l.line);
      this.state = 'between';
      return;
    }
    if (t === 'DATA_START') {
      if (this.state !== 'between' || this.sys === null) this.fail('DATA_START without metadata before it', l.line, 'put a META_START … META_STOP block before each DATA_START');
      this.state = 'data';
      this.segments++;
      return;
    }
    if (t === 'DATA_STOP') {
      if (this.state !== 'data') this.fail('DATA_STOP without DATA_START', l.line, 'open the data section with DATA_START');
      this.state = 'header';
      return;
    }
    const m = KV.exec(t);
    if (m === null) this.fail(`line is not KEYWORD = value: ${JSON.stringify(t.slice(0, 40))}`, l.line, 'write KVN lines as KEYWORD = value');
    const [, key, value] = m as RegExpExecArray;
    if (this.state === 'meta') {
      this.meta.set(key, value.trim());
      return;
    }
    if (this.state === 'data') {
      this.dataLine(key, value.trim(), l.line);
      return;
    }
    // Header keywords (CREATION_DATE, ORIGINATOR, MESSAGE_ID) are not needed.
  }

  private endMeta(line: number): void {
    const code = this.meta.get('TIME_SYSTEM');
    if (code === undefined) this.fail('metadata without TIME_SYSTEM', line, 'add TIME_SYSTEM = UTC (or TAI, TT, GPS) to the metadata');
    if (!TDM_TIME_SYSTEMS.includes(code as string)) this.fail(`TIME_SYSTEM ${JSON.stringify(code)} is not read`, this.metaLine, `use one of ${TDM_TIME_SYSTEMS.join(', ')}`);
    const p = this.meta.get('PARTICIPANT_1');
    if (p === undefined || p === '') this.fail('metadata without PARTICIPANT_1', line, 'name the participant whose clock is measured in PARTICIPANT_1');
    this.sysCode = code as string;
    this.sys = PRODUCT_TIME_SYSTEMS[code as string];
    this.participant = p as string;
    if (!this.clocks.includes(this.participant)) this.clocks.push(this.participant);
  }

  private dataLine(key: string, value: string, line: number): void {
    if (key !== 'CLOCK_BIAS' && key !== 'CLOCK_DRIFT') {
      this.otherKeywords.set(key, (this.otherKeywords.get(key) ?? 0) + 1);
      return;
    }
    const name = this.participant;
    if (this.o.wanted !== null && !this.o.wanted.has(name)) return;
    const parts = value.split(/\s+/);
    if (parts.length !== 2) this.fail(`${key} has ${parts.length} fields, 2 are needed (time and value)`, line, `write ${key} = 2020-06-25T00:00:00 1.5e-6`);
    const tt = this.time(parts[0], line);
    const x = fortranNumber(parts[1]);
    const s = seriesFor(this.series, name, 'satellite', 'tdm', (this.sys as ProductTimeSystem).scale, 'included', false);
    if (key === 'CLOCK_DRIFT') {
      if (Number.isFinite(x)) {
        const d = this.drift.get(name) ?? { sum: 0, n: 0 };
        d.sum += x;
        d.n++;
        this.drift.set(name, d);
      }
      return;
    }
    if (!Number.isFinite(x)) {
      noteSkipped(s, line);
      return;
    }
    appendSample(s, tt, x * 1e9, null, line, this.o.fileName);
  }

  private time(text: string, line: number): number {
    const c = ccsdsCivil(text);
    if (typeof c === 'string') this.fail(c, line, 'write CCSDS ASCII time code A (2020-06-25T00:00:00) or B (2020-177T00:00:00)');
    return productTimeTt(this.o.timeSystem, this.sys as ProductTimeSystem, c as CivilTime, `${this.o.fileName}:${line}`);
  }

  finish(lastLine: number): ClockFile {
    if (lastLine === 0) this.fail('empty file', 1, 'give a KVN TDM');
    if (this.state === 'meta') this.fail('the file ends inside the metadata (no META_STOP)', lastLine, 'the file may be truncated; close the metadata with META_STOP');
    if (this.state === 'data') this.fail('the file ends inside a data section (no DATA_STOP)', lastLine, 'the file may be truncated; close the data with DATA_STOP');
    if (this.segments === 0) this.fail('no data section', lastLine, 'add META_START … META_STOP and DATA_START … DATA_STOP blocks');
    for (const [name, d] of this.drift) {
      const s = this.series.get(name);
      if (s !== undefined) s.statedDrift = d.sum / d.n;
    }
    const notes = [`CCSDS TDM ${this.version} (KVN), ${this.segments} segment(s), time system ${this.sysCode}`];
    if (this.otherKeywords.size > 0) notes.push(`tracking data other than clock left out: ${[...this.otherKeywords].map(([k, n]) => `${k} ×${n}`).join(', ')}`);
    return { format: 'tdm', fileName: this.o.fileName, clocks: this.clocks, series: this.series, notes };
  }
}

/** Parse a whole KVN TDM text (tests, small files). */
export function parseTdm(text: string, o: ClockReadOptions): ClockFile {
  return feedAll(new TdmReader(o), linesOf(text));
}
