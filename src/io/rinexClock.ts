/**
 * RINEX clock files, versions 2.00, 3.00, 3.02, 3.04 and 3.05 ("RINEX Extensions to Handle Clock
 * Information", IGS; version 3.04 and 3.05 format descriptions; layouts from those documents).
 *
 * Header: labels in columns 61–80 up to 3.02, in columns 66–85 from 3.04 (the lines grew by five
 * characters for 9-character station names); the first line holds the version and `C` for clock
 * data. `TIME SYSTEM ID` (columns 4–6) names the time system; without it the file is in GPS time.
 * The header ends with `END OF HEADER`.
 *
 * Data records: type (`AR` receiver, `AS` satellite; columns 1–2), name (4 characters up to 3.02,
 * 9 from 3.04), epoch `yyyy mm dd hh mm ss.ssssss`, the number of values (1–6), then the values:
 * clock bias (s), its sigma (s), rate, its sigma, acceleration, its sigma; two on the record line
 * and up to four on each continuation line. Fields are read as whitespace-separated tokens, which
 * serves both name widths. Only the bias and its sigma are kept.
 *
 * Refused (one-line error with the line): an unknown version, a file type other than clock data,
 * no `END OF HEADER`, a record type other than AR/AS (CR, DR, MS are not read), a truncated record,
 * a clock whose times repeat or go back. A bias that is not a number is skipped and counted.
 * Precise products exclude the periodic relativistic term (IGS convention).
 */
import { InputError } from '../errors.ts';
import type { MeasurementSeries } from '../model/measurements.ts';
import { noteSkipped } from '../model/measurements.ts';
import type { CivilTime } from '../time/timeSystem.ts';
import { appendSample, feedAll, fortranNumber, PRODUCT_TIME_SYSTEMS, productTimeTt, seriesFor, type ClockFile, type ClockReadOptions, type LineReader, type ProductTimeSystem } from './clockReader.ts';
import { linesOf, type TextLine } from './textSource.ts';

/** RINEX clock versions read. */
export const RINEX_CLOCK_VERSIONS = ['2.00', '3.00', '3.02', '3.04', '3.05'] as const;

/** Label columns (0-based start) of the two header layouts. */
const LABEL_OLD = 60;
const LABEL_NEW = 65;
const MAX_VALUES = 6;
const RECORD_KINDS: Record<string, MeasurementSeries['kind']> = { AS: 'satellite', AR: 'receiver' };
const UNREAD_KINDS: Record<string, string> = { CR: 'calibration', DR: 'discontinuity', MS: 'monitor-station' };

interface Pending {
  kind: string;
  name: string;
  line: number;
  tt: number;
  need: number;
  values: string[];
}

/** Line-by-line reader of a RINEX clock file. */
export class RinexClockReader implements LineReader {
  private inHeader = true;
  private labelAt = LABEL_OLD;
  private version = '';
  private timeCode = 'GPS';
  private timeSystem: ProductTimeSystem = PRODUCT_TIME_SYSTEMS.GPS;
  private agency = '';
  private readonly clocks: string[] = [];
  private readonly seen = new Set<string>();
  private readonly series = new Map<string, MeasurementSeries>();
  private pending: Pending | null = null;
  private lastEpochKey = '';
  private lastEpochTt = 0;

  constructor(private readonly o: ClockReadOptions) {}

  private fail(what: string, line: number, fix: string): never {
    throw new InputError(what, `${this.o.fileName}:${line}`, fix);
  }

  push(l: TextLine): void {
    if (this.inHeader) this.header(l);
    else this.data(l);
  }

  private header(l: TextLine): void {
    const t = l.text;
    if (l.line === 1) {
      const newLayout = t.slice(LABEL_NEW, LABEL_NEW + 20).startsWith('RINEX VERSION / TYPE');
      const oldLayout = t.slice(LABEL_OLD, LABEL_OLD + 20).startsWith('RINEX VERSION / TYPE');
      if (!newLayout && !oldLayout) this.fail('first line is not a "RINEX VERSION / TYPE" line', 1, 'a RINEX clock file starts with its version and type, label in column 61 (up to 3.02) or 66 (3.04 on)');
      const version = (t.slice(0, 20).trim().split(/\s+/)[0] ?? '').replace(/^(\d)\.(\d)$/, '$1.$20');
      if (!(RINEX_CLOCK_VERSIONS as readonly string[]).includes(version)) {
        this.fail(`RINEX clock version ${JSON.stringify(version)} is not read`, 1, `tauplan reads versions ${RINEX_CLOCK_VERSIONS.join(', ')}`);
      }
      const type = t.slice(20, 22).trim().charAt(0);
      if (type !== 'C') this.fail(`RINEX file type ${JSON.stringify(type)} is not C (clock data)`, 1, 'give a RINEX clock file (observation and navigation files are not clock products)');
      this.version = version;
      this.labelAt = version >= '3.04' ? LABEL_NEW : LABEL_OLD;
      if (this.labelAt === LABEL_NEW && !newLayout) this.fail(`version ${version} puts header labels in column 66, this file has them in column 61`, 1, 'check the version number on line 1');
      return;
    }
    const label = t.slice(this.labelAt).trim();
    if (label.startsWith('END OF HEADER')) {
      this.inHeader = false;
      return;
    }
    if (label.startsWith('TIME SYSTEM ID')) {
      const code = t.slice(3, 6).trim();
      const sys = PRODUCT_TIME_SYSTEMS[code];
      if (sys === undefined) this.fail(`time system ${JSON.stringify(code)} is not one of ${Object.keys(PRODUCT_TIME_SYSTEMS).join(', ')}`, l.line, 'write the time system in columns 4–6 of TIME SYSTEM ID');
      this.timeCode = code;
      this.timeSystem = sys;
    } else if (label.startsWith('ANALYSIS CENTER')) {
      this.agency = t.slice(0, 3).trim();
    }
    if (/^(AS|AR|CR|DR|MS) \S/.test(t) && label === '') {
      this.fail('data record inside the header', l.line, 'end the header with an END OF HEADER line');
    }
  }

  private data(l: TextLine): void {
    const t = l.text;
    if (t.trim() === '') return;
    const kind = t.slice(0, 2);
    // Continuation lines start with blanks (values right-justified in E19.12 fields), records with the type.
    if (!/^[A-Z]{2}/.test(t)) {
      const p = this.pending;
      if (p === null || p.values.length >= p.need) this.fail('continuation line without a record that needs more values', l.line, 'continuation lines follow a record whose value count is above 2');
      for (const tok of t.trim().split(/\s+/)) (p as Pending).values.push(tok);
      if ((p as Pending).values.length >= (p as Pending).need) this.complete();
      return;
    }
    if (this.pending !== null) this.truncated(this.pending);
    if (RECORD_KINDS[kind] === undefined) {
      const known = UNREAD_KINDS[kind];
      this.fail(known === undefined ? `unknown record type ${JSON.stringify(kind)}` : `record type ${kind} (${known}) is not read`, l.line, 'tauplan reads AS (satellite) and AR (receiver) clock records; remove the others');
    }
    const tok = t.trim().split(/\s+/);
    if (tok.length < 9) this.fail(`${kind} record has ${tok.length} fields, at least 9 are needed (type, name, 6 epoch fields, value count)`, l.line, 'the record may be truncated; restore it');
    const name = tok[1];
    const need = Number(tok[8]);
    if (!Number.isInteger(need) || need < 1 || need > MAX_VALUES) this.fail(`value count ${JSON.stringify(tok[8])} is not 1–${MAX_VALUES}`, l.line, 'give the number of values after the epoch');
    if (!this.seen.has(name)) {
      this.seen.add(name);
      this.clocks.push(name);
    }
    if (this.o.wanted !== null && !this.o.wanted.has(name)) return; // not kept: skip the epoch parse
    const tt = this.epoch(tok, l.line);
    this.pending = { kind, name, line: l.line, tt, need, values: tok.slice(9) };
    if (this.pending.values.length > need) this.fail(`${kind} ${name} has ${this.pending.values.length} values, the count says ${need}`, l.line, 'make the value count match the values');
    if (this.pending.values.length >= Math.min(need, 2)) {
      if (need <= 2) this.complete();
    } else this.truncated(this.pending);
  }

  private epoch(tok: string[], line: number): number {
    const key = tok.slice(2, 8).join(' ');
    if (key === this.lastEpochKey) return this.lastEpochTt;
    const n = tok.slice(2, 8).map(Number);
    if (n.some((x) => !Number.isFinite(x)) || !tok.slice(2, 7).every((x) => /^\d+$/.test(x))) this.fail(`epoch ${JSON.stringify(key)} is not yyyy mm dd hh mm ss`, line, 'write the epoch as 2020 06 25 00 00 0.000000');
    const c: CivilTime = { year: n[0], month: n[1], day: n[2], hour: n[3], minute: n[4], second: n[5] };
    const tt = productTimeTt(this.o.timeSystem, this.timeSystem, c, `${this.o.fileName}:${line}`);
    this.lastEpochKey = key;
    this.lastEpochTt = tt;
    return tt;
  }

  private truncated(p: Pending): never {
    this.fail(`${p.kind} ${p.name} record announces ${p.need} values but has ${p.values.length}`, p.line, 'the record is truncated; restore it or its continuation line');
  }

  private complete(): void {
    const p = this.pending as Pending;
    this.pending = null;
    const s = seriesFor(this.series, p.name, RECORD_KINDS[p.kind], 'rinex-clock', this.timeSystem.scale, 'excluded', true);
    const biasS = fortranNumber(p.values[0]);
    if (!Number.isFinite(biasS)) {
      noteSkipped(s, p.line);
      return;
    }
    const sigmaS = p.need >= 2 ? fortranNumber(p.values[1]) : Number.NaN;
    appendSample(s, p.tt, biasS * 1e9, sigmaS > 0 ? sigmaS * 1e9 : null, p.line, this.o.fileName);
  }

  finish(lastLine: number): ClockFile {
    if (lastLine === 0) this.fail('empty file', 1, 'give a RINEX clock file');
    if (this.inHeader) this.fail('no END OF HEADER line', lastLine, 'the header must end with END OF HEADER; the file may be truncated');
    if (this.pending !== null) this.truncated(this.pending);
    // A clock whose every sigma is missing (1 value per record) has no sigmas at all.
    for (const s of this.series.values()) {
      if (s.sigmaNs !== null && s.sigmaNs.some((x) => !(x > 0))) s.sigmaNs = null;
    }
    const notes = [`RINEX clock ${this.version}${this.agency === '' ? '' : `, analysis centre ${this.agency}`}, time system ${this.timeCode}`];
    return { format: 'rinex-clock', fileName: this.o.fileName, clocks: this.clocks, series: this.series, notes };
  }
}

/** Parse a whole RINEX clock text (tests, small files). */
export function parseRinexClock(text: string, o: ClockReadOptions): ClockFile {
  return feedAll(new RinexClockReader(o), linesOf(text));
}
