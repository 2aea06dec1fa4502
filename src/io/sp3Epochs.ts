/**
 * The epoch part of an SP3-c/SP3-d file (layout and sources: sp3.ts): `*` epoch lines, `P` and
 * `V` records, `EP`/`EV` correlations (skipped) and `EOF`, fed one line at a time after the header
 * (sp3Header.ts), so a file streams and only the records are kept.
 */
import type { Sp3Epoch, Sp3File, Sp3Record } from '../model/sp3.ts';
import { daysFromCivil } from '../time/calendar.ts';
import { civilAt, cols, fmtCivil, normaliseId, optionalInt, SAT_ID, shiftCivil, SP3_TIME_SYSTEMS, sp3Fields, type LineAt, type Sp3Fields, type Sp3Header } from './sp3Header.ts';

/** Reads the data section of one file, line by line. */
export class Sp3EpochReader {
  private readonly f: Sp3Fields;
  private readonly tsys: { scale: string; offsetS: number };
  private readonly epochs: Sp3Epoch[] = [];
  private current: { epoch: Sp3Epoch; records: Map<string, Sp3Record> } | null = null;
  private last: Sp3Record | null = null;
  /** 0-based index of the EOF line, or −1. */
  private eofLine = -1;
  /** First blank line not yet followed by text (a blank tail is a truncated file, blank lines inside are refused). */
  private firstBlank = -1;
  /** First non-blank line after EOF, reported after the epoch count. */
  private afterEof = -1;
  private lastIdx = -1;

  constructor(private readonly h: Sp3Header) {
    this.f = sp3Fields(h.fileName);
    this.tsys = SP3_TIME_SYSTEMS[h.timeSystemCode];
  }

  /** One data line; `i` is its 0-based index in the file. */
  push(line: string, i: number): void {
    const h = this.h;
    const fail = this.f.fail;
    this.lastIdx = i;
    if (this.eofLine >= 0) {
      if (this.afterEof < 0 && line.trim() !== '') this.afterEof = i;
      return;
    }
    if (line.trim() === '') {
      if (this.firstBlank < 0) this.firstBlank = i;
      return;
    }
    if (this.firstBlank >= 0) fail('blank line in the data section', this.firstBlank, 1, 'remove blank lines before "EOF"');
    if (line.startsWith('EOF')) {
      this.eofLine = i;
      return;
    }
    const at: LineAt = { text: line };
    if (line.startsWith('*')) {
      const civil = civilAt(this.f, line, i, 4, line[1] === ' ' ? null : 2);
      if (civil.second >= 60 && this.tsys.scale !== 'UTC') fail(`second ${civil.second} in a uniform time scale`, i, 21, 'seconds run 0–59.99999999');
      const day = daysFromCivil(civil.year, civil.month, civil.day);
      const whole = Math.floor(civil.second);
      const labelWholeS = day * 86400 + civil.hour * 3600 + civil.minute * 60 + whole;
      const labelFracS = civil.second - whole;
      const prev = this.epochs[this.epochs.length - 1];
      if (prev === undefined) {
        if (fmtCivil(civil) !== fmtCivil(h.startCivil)) fail(`first epoch ${fmtCivil(civil)} differs from the start ${fmtCivil(h.startCivil)} in line 1`, i, 4, 'make the first epoch record equal the start epoch of line 1');
      } else {
        const stepS = labelWholeS - prev.labelWholeS + (labelFracS - prev.labelFracS);
        const k = Math.round(stepS / h.intervalS);
        if (!(stepS > 0) || k < 1 || Math.abs(stepS - k * h.intervalS) > 1e-3) {
          fail(`epoch ${fmtCivil(civil)} is ${stepS} s after the previous one (line ${prev.line}), not a multiple of the interval ${h.intervalS} s`, i, 4, 'epochs must increase in steps of the header interval (missing epochs may be left out)');
        }
      }
      const records = new Map<string, Sp3Record>();
      const shifted = this.tsys.offsetS === 0 ? civil : shiftCivil(civil, -this.tsys.offsetS);
      const epoch: Sp3Epoch = { line: i + 1, civil, scaleCivil: shifted, labelWholeS, labelFracS, records };
      this.epochs.push(epoch);
      this.current = { epoch, records };
      this.last = null;
      return;
    }
    if (this.current === null) fail(`data record ${JSON.stringify(line.slice(0, 4))} before the first epoch line`, i, 1, 'each block of records starts with a "*  YYYY MM DD HH MM SS" line');
    const cur = this.current as { epoch: Sp3Epoch; records: Map<string, Sp3Record> };
    if (line.startsWith('EP') || line.startsWith('EV')) {
      if (this.last === null) fail(`correlation record ${line.slice(0, 2)} without a preceding P record`, i, 1, 'EP/EV lines follow the P/V record they belong to');
      return;
    }
    const kind = line[0];
    if (kind === 'P' || kind === 'V') {
      if (line.length < 60) fail(`${kind} record is ${line.length} characters long; at least 60 are needed`, i, line.length + 1, 'give the id and four F14.6 fields (columns 2–60)');
      const id = normaliseId(cols(line, 2, 4));
      if (!SAT_ID.test(id)) fail(`satellite id ${JSON.stringify(cols(line, 2, 4))} is not a letter and two digits`, i, 2, 'write the id as in the "+" list, e.g. G05');
      if (!h.satelliteIds.includes(id)) fail(`satellite ${id} is not in the header's "+" list`, i, 2, `use one of ${h.satelliteIds.join(', ')}, or add ${id} to the "+" lines`);
      const x = this.f.float(at, i, 5, 18, `${kind} x`);
      const y = this.f.float(at, i, 19, 32, `${kind} y`);
      const z = this.f.float(at, i, 33, 46, `${kind} z`);
      const clk = this.f.float(at, i, 47, 60, kind === 'P' ? 'clock' : 'clock rate');
      const vec: readonly [number, number, number] | null = x === 0 && y === 0 && z === 0 ? null : [x, y, z];
      const clkOk = clk >= 999999 ? null : clk;
      if (kind === 'P') {
        if (cur.records.has(id)) fail(`second P record for ${id} in the epoch of line ${cur.epoch.line}`, i, 2, 'give one P record per satellite and epoch');
        const sdev = [
          optionalInt(line, 62, 63, i, fail),
          optionalInt(line, 65, 66, i, fail),
          optionalInt(line, 68, 69, i, fail),
          optionalInt(line, 71, 73, i, fail),
        ] as const;
        const flag = (c: number, letter: string, meaning: string): boolean => {
          const ch = line[c - 1] ?? ' ';
          if (ch !== ' ' && ch !== letter) fail(`flag ${JSON.stringify(ch)} in column ${c} is not blank or '${letter}' (${meaning})`, i, c, `write '${letter}' or leave column ${c} blank`);
          return ch === letter;
        };
        const rec: Sp3Record = {
          satelliteId: id,
          line: i + 1,
          positionKm: vec,
          clockUs: clkOk,
          sdevExponents: sdev,
          clockEvent: flag(75, 'E', 'clock event'),
          clockPredicted: flag(76, 'P', 'clock prediction'),
          maneuver: flag(79, 'M', 'maneuver'),
          orbitPredicted: flag(80, 'P', 'orbit prediction'),
          velocity: null,
        };
        cur.records.set(id, rec);
        this.last = rec;
      } else {
        if (!h.hasVelocities) fail(`V record for ${id} but line 1 column 3 says P (positions only)`, i, 1, 'set column 3 of line 1 to V, or remove the V records');
        const last = this.last;
        if (last === null || last.satelliteId !== id || last.velocity !== null) fail(`V record for ${id} does not follow that satellite's P record`, i, 1, 'put each V record right after the P record of the same satellite');
        const withV: Sp3Record = { ...(last as Sp3Record), velocity: { line: i + 1, velocityDmPerS: vec, clockRate1e4UsPerS: clkOk } };
        cur.records.set(id, withV);
        this.last = withV;
      }
      return;
    }
    fail(`unknown record ${JSON.stringify(line.slice(0, 3))} in the data section`, i, 1, 'data lines start with "*", "P", "V", "EP", "EV" or "EOF"');
  }

  /** The whole file, after the checks that need the end (epoch count, EOF, text after it). */
  finish(): Sp3File {
    const h = this.h;
    const fail = this.f.fail;
    if (this.epochs.length !== h.epochCount) {
      fail(`line 1 declares ${h.epochCount} epochs but the file has ${this.epochs.length} epoch records${this.eofLine < 0 ? ' and no EOF line (truncated?)' : ''}`, 0, 33, 'fix the count in columns 33–39 of line 1, or restore the missing epochs');
    }
    if (this.eofLine < 0) fail('no "EOF" line at the end of the file (truncated?)', Math.max(this.lastIdx, 0), 1, 'end the file with "EOF"');
    if (this.afterEof >= 0) fail('text after "EOF"', this.afterEof, 1, 'remove everything after the EOF line');
    return { ...h, epochs: this.epochs };
  }
}
