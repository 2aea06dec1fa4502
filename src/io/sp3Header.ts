/**
 * The header part of an SP3-c/SP3-d file (layout and sources: sp3.ts): lines 1 and 2, the `+`
 * satellite list, the `++` accuracy exponents, `%c`, `%f`, `%i` and `/*` comments. The header is
 * a few dozen lines, so it is parsed from an array; the epochs that follow stream (sp3Epochs.ts).
 * Every fault throws {@link OrbitFileError} with the 1-based line and column.
 */
import { OrbitFileError } from '../errors.ts';
import { civilFromDays, daysFromCivil, daysInMonth, MJD_OF_UNIX_EPOCH } from '../time/calendar.ts';
import type { TimeScale } from '../time/instant.ts';
import type { CivilTime } from '../time/timeSystem.ts';
import type { Sp3File } from '../model/sp3.ts';

/** Everything of an SP3 file but its epochs. */
export type Sp3Header = Omit<Sp3File, 'epochs'>;

/** Time systems of `%c` columns 10–12 as tauplan scales (SP3-d §2; GLONASS time is UTC(SU) + 3 h). */
export const SP3_TIME_SYSTEMS: Record<string, { scale: TimeScale; offsetS: number; note: string }> = {
  GPS: { scale: 'GPS', offsetS: 0, note: 'GPS time' },
  QZS: { scale: 'GPS', offsetS: 0, note: 'QZSS time, aligned with GPS time' },
  IRN: { scale: 'GPS', offsetS: 0, note: 'IRNSS time, taken as GPS time (nominally aligned; from memory)' },
  GAL: { scale: 'GST', offsetS: 0, note: 'Galileo system time' },
  BDT: { scale: 'BDT', offsetS: 0, note: 'BeiDou time' },
  TAI: { scale: 'TAI', offsetS: 0, note: 'TAI' },
  UTC: { scale: 'UTC', offsetS: 0, note: 'UTC' },
  GLO: { scale: 'UTC', offsetS: 10800, note: 'GLONASS time, UTC(SU) + 3 h' },
};
const TIME_SYSTEMS = SP3_TIME_SYSTEMS;

const INT = /^[-+]?\d+$/;
const FLOAT = /^[-+]?(\d+\.?\d*|\.\d+)$/;
export const SAT_ID = /^[A-Z][0-9]{2}$/;

/** Characters `a..b` (1-based, inclusive) of a line; short lines give what is there. */
export function cols(line: string, a: number, b: number): string {
  return line.slice(a - 1, b);
}

/** A fault at a 0-based line index (reported 1-based). */
export type Fail = (what: string, lineIdx: number, column: number | null, fix: string) => never;

/** Field readers bound to one file. */
export interface Sp3Fields {
  fail: Fail;
  /** A whole number in columns a–b of line `li` of `lines` (an array, or a one-line holder). */
  int(lines: readonly string[] | LineAt, li: number, a: number, b: number, field: string): number;
  float(lines: readonly string[] | LineAt, li: number, a: number, b: number, field: string): number;
}

/** One line standing in for the file at its index (the streamed data section). */
export interface LineAt {
  readonly text: string;
}

function textOf(lines: readonly string[] | LineAt, li: number): string {
  return Array.isArray(lines) ? ((lines as readonly string[])[li] ?? '') : (lines as LineAt).text;
}

/** Field readers whose faults name `fileName`. */
export function sp3Fields(fileName: string): Sp3Fields {
  const fail: Fail = (what, lineIdx, column, fix) => {
    throw new OrbitFileError(what, fileName, lineIdx + 1, column, fix);
  };
  return {
    fail,
    int(lines, li, a, b, field) {
      const raw = cols(textOf(lines, li), a, b).trim();
      if (!INT.test(raw)) fail(`${field} ${JSON.stringify(raw)} is not a whole number`, li, a, `write the ${field} as digits in columns ${a}–${b}`);
      return Number(raw);
    },
    float(lines, li, a, b, field) {
      const raw = cols(textOf(lines, li), a, b).trim();
      if (!FLOAT.test(raw)) fail(`${field} ${JSON.stringify(raw)} is not a number`, li, a, `write the ${field} as a decimal number in columns ${a}–${b}`);
      return Number(raw);
    },
  };
}

/** True for the lines a header is made of (beyond lines 1 and 2). */
export function isHeaderLine(text: string): boolean {
  return text.startsWith('+') || text.startsWith('%') || text.startsWith('/*');
}

/**
 * Parse the header from its lines (and at least the line after it, for messages).
 * @returns the header, and the index of the first data line in `lines`
 */
export function parseSp3Header(lines: readonly string[], fileName: string): { header: Sp3Header; next: number } {
  const f = sp3Fields(fileName);
  // ---- Line 1.
  const l1 = lines[0] ?? '';
  if (l1[0] !== '#') f.fail(`first line does not start with '#'`, 0, 1, 'an SP3 file begins with "#c" or "#d"; check that this is an SP3 file');
  const versionChar = l1[1] ?? '';
  if (versionChar !== 'c' && versionChar !== 'd') {
    const old = versionChar === 'a' || versionChar === 'b';
    f.fail(`SP3 version character ${JSON.stringify(versionChar)} is not 'c' or 'd'`, 0, 2, old ? 'SP3-a/b is not read; convert the file to SP3-c or SP3-d' : 'line 1 must start with "#c" or "#d"');
  }
  const version = versionChar as 'c' | 'd';
  const pv = l1[2] ?? '';
  if (pv !== 'P' && pv !== 'V') f.fail(`position/velocity flag ${JSON.stringify(pv)} is not 'P' or 'V'`, 0, 3, 'column 3 of line 1 is P (positions) or V (positions and velocities)');
  const startCivil = civilAt(f, lines[0] ?? '', 0, 4);
  const epochCount = f.int(lines, 0, 33, 39, 'number of epochs');
  if (epochCount < 1) f.fail(`number of epochs ${epochCount} is not positive`, 0, 33, 'give the count of epoch records in columns 33–39');
  const dataUsed = cols(l1, 41, 45).trim();
  const coordinateSystem = cols(l1, 47, 51).trim();
  const orbitType = cols(l1, 53, 55).trim();
  const agency = cols(l1, 57, 60).trim();

  // ---- Line 2.
  const l2 = lines[1] ?? '';
  if (!l2.startsWith('##')) f.fail('second line does not start with "##"', 1, 1, 'line 2 holds "##", GPS week, seconds of week, interval, MJD and fraction of day');
  const gpsWeek = f.int(lines, 1, 4, 7, 'GPS week');
  const secondsOfWeek = f.float(lines, 1, 9, 23, 'seconds of week');
  const intervalS = f.float(lines, 1, 25, 38, 'epoch interval');
  if (!(intervalS > 0)) f.fail(`epoch interval ${intervalS} s is not positive`, 1, 25, 'give the spacing of the epochs in seconds, e.g. 900.00000000');
  const mjdStart = f.int(lines, 1, 40, 44, 'modified Julian day');
  const fractionalDay = f.float(lines, 1, 46, 60, 'fraction of day');
  const startDay = daysFromCivil(startCivil.year, startCivil.month, startCivil.day);
  const startSecOfDay = startCivil.hour * 3600 + startCivil.minute * 60 + startCivil.second;
  if (mjdStart !== startDay + MJD_OF_UNIX_EPOCH || Math.abs(fractionalDay * 86400 - startSecOfDay) > 1e-3) {
    f.fail(`MJD ${mjdStart} + ${fractionalDay} does not match the start ${fmtCivil(startCivil)} of line 1`, 1, 40, 'make line 2 agree with the start epoch of line 1');
  }
  const weekStartS = (gpsWeek * 7 + daysFromCivil(1980, 1, 6)) * 86400 + secondsOfWeek;
  if (Math.abs(weekStartS - (startDay * 86400 + startSecOfDay)) > 1e-3) {
    f.fail(`GPS week ${gpsWeek} and seconds of week ${secondsOfWeek} do not match the start ${fmtCivil(startCivil)} of line 1`, 1, 4, 'make line 2 agree with the start epoch of line 1');
  }

  // ---- Satellite list.
  let i = 2;
  const plusStart = i;
  while ((lines[i] ?? '').startsWith('+ ')) i++;
  const plusCount = i - plusStart;
  if (plusCount === 0) f.fail('no "+ " satellite-list line after line 2', i, 1, 'list the satellites on "+ " lines after the "##" line');
  const satCount = f.int(lines, plusStart, 3, 6, 'number of satellites');
  if (satCount < 1) f.fail(`number of satellites ${satCount} is not positive`, plusStart, 3, 'give the count of satellites in columns 4–6');
  const linesNeeded = Math.max(5, Math.ceil(satCount / 17));
  if (version === 'c' && (satCount > 85 || plusCount !== 5)) {
    f.fail(`SP3-c allows 85 satellites on exactly 5 "+" lines; found ${satCount} satellites on ${plusCount} lines`, plusStart, 1, 'write the file as SP3-d ("#d"), which allows more satellites and lines');
  }
  if (plusCount < linesNeeded) f.fail(`${satCount} satellites need ${linesNeeded} "+" lines; found ${plusCount}`, plusStart + plusCount, 1, 'add "+" lines (17 ids each, padded with "  0")');
  const satelliteIds: string[] = [];
  for (let k = 0; k < plusCount * 17 && satelliteIds.length < satCount; k++) {
    const li = plusStart + Math.floor(k / 17);
    const c = 10 + 3 * (k % 17);
    const id = normaliseId(cols(lines[li], c, c + 2));
    if (!SAT_ID.test(id)) f.fail(`satellite id ${JSON.stringify(cols(lines[li], c, c + 2))} is not a letter and two digits`, li, c, 'write ids such as G05 or L51, three characters each from column 10');
    if (satelliteIds.includes(id)) f.fail(`satellite ${id} is listed twice`, li, c, 'list each satellite once');
    satelliteIds.push(id);
  }
  if (satelliteIds.length < satCount) f.fail(`"+" lines hold ${satelliteIds.length} ids but the count says ${satCount}`, plusStart, 4, 'make the count in columns 4–6 match the ids listed');
  // Slots past the count must be padding ("  0"): an id there means the count is short of the list.
  for (let k = satCount; k < plusCount * 17; k++) {
    const li = plusStart + Math.floor(k / 17);
    const c = 10 + 3 * (k % 17);
    const slot = cols(lines[li], c, c + 2).trim();
    if (slot !== '' && !/^0+$/.test(slot)) f.fail(`the count says ${satCount} satellites but the "+" lines list more (${slot} is number ${k + 1})`, plusStart, 4, 'make the count in columns 4–6 match the ids listed');
  }

  // ---- Accuracy exponents.
  const accStart = i;
  while ((lines[i] ?? '').startsWith('++')) i++;
  if (i - accStart !== plusCount) f.fail(`${i - accStart} "++" accuracy lines for ${plusCount} "+" lines`, i, 1, 'give one "++" line per "+" line');
  const accuracyExponents = new Map<string, number>();
  satelliteIds.forEach((id, k) => {
    const li = accStart + Math.floor(k / 17);
    const c = 10 + 3 * (k % 17);
    const raw = cols(lines[li], c, c + 2).trim();
    if (raw === '') accuracyExponents.set(id, 0);
    else accuracyExponents.set(id, f.int(lines, li, c, c + 2, `accuracy exponent of ${id}`));
  });

  // ---- %c, %f, %i.
  const expectPair = (tag: string, what: string): number => {
    for (let k = 0; k < 2; k++) {
      if (!(lines[i + k] ?? '').startsWith(tag)) {
        f.fail(`missing "${tag}" line (${what}); found ${JSON.stringify((lines[i + k] ?? '').slice(0, 12))}`, i + k, 1, `the header has two "${tag}" lines after the "++" lines; restore them`);
      }
    }
    i += 2;
    return i - 2;
  };
  const cLine = expectPair('%c', 'file type and time system');
  const fileType = cols(lines[cLine], 4, 5).trim();
  const timeSystemCode = cols(lines[cLine], 10, 12);
  const tsys = TIME_SYSTEMS[timeSystemCode];
  if (tsys === undefined) {
    f.fail(`time system ${JSON.stringify(timeSystemCode)} is not one of ${Object.keys(TIME_SYSTEMS).join(', ')}`, cLine, 10, 'write the time system of the epochs in columns 10–12 of the first "%c" line');
  }
  const fLine = expectPair('%f', 'floating-point bases');
  const basePosVel = optionalFloat(lines[fLine], 4, 13, fLine, f.fail);
  const baseClock = optionalFloat(lines[fLine], 15, 26, fLine, f.fail);
  expectPair('%i', 'integer header fields');
  const comments: string[] = [];
  while ((lines[i] ?? '').startsWith('/*')) {
    comments.push(lines[i].slice(2).trim());
    i++;
  }

  return {
    next: i,
    header: {
      fileName,
      version,
      hasVelocities: pv === 'V',
      startCivil,
      epochCount,
      dataUsed,
      coordinateSystem,
      orbitType,
      agency,
      gpsWeek,
      secondsOfWeek,
      intervalS,
      mjdStart,
      fractionalDay,
      satelliteIds,
      accuracyExponents,
      fileType,
      timeSystemCode,
      timeScale: (tsys as { scale: TimeScale }).scale,
      basePosVel,
      baseClock,
      comments,
    },
  };
}

/** Civil time in the fixed columns shared by line 1 and epoch lines (year at column `c0`) of `text`, line index `li`. */
export function civilAt(f: Sp3Fields, text: string, li: number, c0: number, badSeparatorColumn: number | null = null): CivilTime {
  const { fail } = f;
  if (badSeparatorColumn !== null) fail('epoch line does not start with "*  "', li, badSeparatorColumn, 'write epoch lines as "*  YYYY MM DD HH MM SS.ssssssss"');
  const at: LineAt = { text };
  const year = f.int(at, li, c0, c0 + 3, 'year');
  const month = f.int(at, li, c0 + 5, c0 + 6, 'month');
  const day = f.int(at, li, c0 + 8, c0 + 9, 'day');
  const hour = f.int(at, li, c0 + 11, c0 + 12, 'hour');
  const minute = f.int(at, li, c0 + 14, c0 + 15, 'minute');
  const second = f.float(at, li, c0 + 17, c0 + 27, 'second');
  if (month < 1 || month > 12) fail(`month ${month} is not 1–12`, li, c0 + 5, 'check the date');
  if (day < 1 || day > daysInMonth(year, month)) fail(`day ${day} does not exist in ${year}-${month}`, li, c0 + 8, 'check the date');
  if (hour > 23) fail(`hour ${hour} is not 0–23`, li, c0 + 11, 'check the time');
  if (minute > 59) fail(`minute ${minute} is not 0–59`, li, c0 + 14, 'check the time');
  if (second < 0 || second >= 61) fail(`second ${second} is not 0–60.99999999`, li, c0 + 17, 'check the time');
  return { year, month, day, hour, minute, second };
}

export function optionalInt(line: string, a: number, b: number, li: number, fail: Fail): number | null {
  const raw = cols(line, a, b).trim();
  if (raw === '') return null;
  if (!INT.test(raw)) fail(`standard-deviation exponent ${JSON.stringify(raw)} is not a whole number`, li, a, `leave columns ${a}–${b} blank or write an integer`);
  return Number(raw);
}

function optionalFloat(line: string, a: number, b: number, li: number, fail: Fail): number | null {
  const raw = cols(line, a, b).trim();
  if (raw === '') return null;
  if (!FLOAT.test(raw)) fail(`base ${JSON.stringify(raw)} is not a number`, li, a, `write a decimal number in columns ${a}–${b}`);
  const v = Number(raw);
  return v === 0 ? null : v;
}

/** SP3-a style ids: a blank system letter means GPS, a blank tens digit means 0. */
export function normaliseId(raw: string): string {
  if (raw.length !== 3) return raw;
  const letter = raw[0] === ' ' ? 'G' : raw[0];
  const tens = raw[1] === ' ' ? '0' : raw[1];
  return letter + tens + raw[2];
}

export function shiftCivil(c: CivilTime, deltaS: number): CivilTime {
  const whole = Math.floor(c.second);
  const frac = c.second - whole;
  const total = daysFromCivil(c.year, c.month, c.day) * 86400 + c.hour * 3600 + c.minute * 60 + whole + deltaS;
  const day = Math.floor(total / 86400);
  let rest = total - day * 86400;
  const hour = Math.floor(rest / 3600);
  rest -= hour * 3600;
  const minute = Math.floor(rest / 60);
  return { ...civilFromDays(day), hour, minute, second: rest - minute * 60 + frac };
}

export function fmtCivil(c: CivilTime): string {
  const p = (n: number): string => String(n).padStart(2, '0');
  return `${c.year}-${p(c.month)}-${p(c.day)} ${p(c.hour)}:${p(c.minute)}:${c.second.toFixed(8).padStart(11, '0')}`;
}
