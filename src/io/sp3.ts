/**
 * SP3-c and SP3-d precise ephemeris files, read strictly.
 *
 * Format: "The Extended Standard Product 3 Orbit Format (SP3-c)", S. Hilla, NGS, 2002 (rev. 2010),
 * and "The Extended Standard Product 3 Orbit Format (SP3-d)", S. Hilla, IGS, 2016 (column layout
 * from those documents, checked from memory). SP3-d differs from SP3-c in the header only: more
 * than 85 satellites (as many `+`/`++` lines as needed, count in columns 4–6) and comment lines
 * of any number.
 *
 * Layout read here (1-based columns):
 * - line 1 `#cP2024  5  1  0  0  0.00000000      97 ORBIT IGS20 FIT  IGS`: version 2, P/V flag 3,
 *   start 4–31, number of epochs 33–39, data used 41–45, coordinate system 47–51, orbit type 53–55,
 *   agency 57–60;
 * - line 2 `## 2312 259200.00000000   900.00000000 60431 0.0000000000000`: GPS week 4–7, seconds of
 *   week 9–23, epoch interval 25–38, MJD 40–44, fraction of day 46–60;
 * - `+ ` satellite list (count in 4–6, ids of 3 characters from column 10, 17 per line), `++`
 *   accuracy exponents (17 × I3 from column 10), two `%c` (file type 4–5, time system 10–12), two
 *   `%f`, two `%i`, any `/*` comments;
 * - `*  YYYY MM DD HH MM SS.ssssssss` epochs, `P` records (id 2–4, x y z km and clock µs in
 *   four F14.6 fields from column 5, standard-deviation exponents 62–73, clock event flag `E`
 *   in 75, clock prediction `P` in 76, maneuver `M` in 79, orbit prediction `P` in 80),
 *   optional `V` records (dm/s and 10⁻⁴ µs/s), optional `EP`/`EV` correlation records (skipped),
 *   and `EOF`.
 *
 * Bad or absent values (spec): a position of 0.000000 in all three components, or a velocity
 * likewise, marks that record missing; a clock of 999999.999999 marks the clock missing. A bad
 * clock leaves the position usable: orbits need only positions.
 *
 * Not read: comment-line counts are not enforced; `EP`/`EV` correlations are skipped. Epoch times
 * stay civil labels in the file's time system; `src/orbit/sp3.ts` turns them into instants.
 * Every fault throws {@link OrbitFileError} with the 1-based line and column.
 */
import { OrbitFileError } from '../errors.ts';
import { civilFromDays, daysFromCivil, daysInMonth, MJD_OF_UNIX_EPOCH } from '../time/calendar.ts';
import type { TimeScale } from '../time/instant.ts';
import type { CivilTime } from '../time/timeSystem.ts';
import type { Sp3Epoch, Sp3File, Sp3Record, Sp3VelocityRecord } from '../model/sp3.ts';

export type { Sp3Epoch, Sp3File, Sp3Record, Sp3VelocityRecord };

const TIME_SYSTEMS: Record<string, { scale: TimeScale; offsetS: number; note: string }> = {
  GPS: { scale: 'GPS', offsetS: 0, note: 'GPS time' },
  QZS: { scale: 'GPS', offsetS: 0, note: 'QZSS time, aligned with GPS time' },
  IRN: { scale: 'GPS', offsetS: 0, note: 'IRNSS time, taken as GPS time (nominally aligned; from memory)' },
  GAL: { scale: 'GST', offsetS: 0, note: 'Galileo system time' },
  BDT: { scale: 'BDT', offsetS: 0, note: 'BeiDou time' },
  TAI: { scale: 'TAI', offsetS: 0, note: 'TAI' },
  UTC: { scale: 'UTC', offsetS: 0, note: 'UTC' },
  GLO: { scale: 'UTC', offsetS: 10800, note: 'GLONASS time, UTC(SU) + 3 h' },
};

const INT = /^[-+]?\d+$/;
const FLOAT = /^[-+]?(\d+\.?\d*|\.\d+)$/;
const SAT_ID = /^[A-Z][0-9]{2}$/;

/** Characters `a..b` (1-based, inclusive) of a line; short lines give what is there. */
function cols(line: string, a: number, b: number): string {
  return line.slice(a - 1, b);
}

/**
 * Parse the text of an SP3-c or SP3-d file. `fileName` is used in messages only.
 * Throws {@link OrbitFileError} on any fault; see the module comment for what is checked.
 */
export function parseSp3(text: string, fileName: string): Sp3File {
  const lines = text.split(/\r?\n/);
  const fail = (what: string, lineIdx: number, column: number | null, fix: string): never => {
    throw new OrbitFileError(what, fileName, lineIdx + 1, column, fix);
  };
  const intAt = (lineIdx: number, a: number, b: number, field: string): number => {
    const raw = cols(lines[lineIdx] ?? '', a, b).trim();
    if (!INT.test(raw)) fail(`${field} ${JSON.stringify(raw)} is not a whole number`, lineIdx, a, `write the ${field} as digits in columns ${a}–${b}`);
    return Number(raw);
  };
  const floatAt = (lineIdx: number, a: number, b: number, field: string): number => {
    const raw = cols(lines[lineIdx] ?? '', a, b).trim();
    if (!FLOAT.test(raw)) fail(`${field} ${JSON.stringify(raw)} is not a number`, lineIdx, a, `write the ${field} as a decimal number in columns ${a}–${b}`);
    return Number(raw);
  };

  // ---- Line 1.
  const l1 = lines[0] ?? '';
  if (l1[0] !== '#') fail(`first line does not start with '#'`, 0, 1, 'an SP3 file begins with "#c" or "#d"; check that this is an SP3 file');
  const versionChar = l1[1] ?? '';
  if (versionChar !== 'c' && versionChar !== 'd') {
    const old = versionChar === 'a' || versionChar === 'b';
    fail(`SP3 version character ${JSON.stringify(versionChar)} is not 'c' or 'd'`, 0, 2, old ? 'SP3-a/b is not read; convert the file to SP3-c or SP3-d' : 'line 1 must start with "#c" or "#d"');
  }
  const version = versionChar as 'c' | 'd';
  const pv = l1[2] ?? '';
  if (pv !== 'P' && pv !== 'V') fail(`position/velocity flag ${JSON.stringify(pv)} is not 'P' or 'V'`, 0, 3, 'column 3 of line 1 is P (positions) or V (positions and velocities)');
  const startCivil = civilAt(lines, 0, 4, fail, intAt, floatAt);
  const epochCount = intAt(0, 33, 39, 'number of epochs');
  if (epochCount < 1) fail(`number of epochs ${epochCount} is not positive`, 0, 33, 'give the count of epoch records in columns 33–39');
  const dataUsed = cols(l1, 41, 45).trim();
  const coordinateSystem = cols(l1, 47, 51).trim();
  const orbitType = cols(l1, 53, 55).trim();
  const agency = cols(l1, 57, 60).trim();

  // ---- Line 2.
  const l2 = lines[1] ?? '';
  if (!l2.startsWith('##')) fail('second line does not start with "##"', 1, 1, 'line 2 holds "##", GPS week, seconds of week, interval, MJD and fraction of day');
  const gpsWeek = intAt(1, 4, 7, 'GPS week');
  const secondsOfWeek = floatAt(1, 9, 23, 'seconds of week');
  const intervalS = floatAt(1, 25, 38, 'epoch interval');
  if (!(intervalS > 0)) fail(`epoch interval ${intervalS} s is not positive`, 1, 25, 'give the spacing of the epochs in seconds, e.g. 900.00000000');
  const mjdStart = intAt(1, 40, 44, 'modified Julian day');
  const fractionalDay = floatAt(1, 46, 60, 'fraction of day');
  const startDay = daysFromCivil(startCivil.year, startCivil.month, startCivil.day);
  const startSecOfDay = startCivil.hour * 3600 + startCivil.minute * 60 + startCivil.second;
  if (mjdStart !== startDay + MJD_OF_UNIX_EPOCH || Math.abs(fractionalDay * 86400 - startSecOfDay) > 1e-3) {
    fail(`MJD ${mjdStart} + ${fractionalDay} does not match the start ${fmtCivil(startCivil)} of line 1`, 1, 40, 'make line 2 agree with the start epoch of line 1');
  }
  const weekStartS = (gpsWeek * 7 + daysFromCivil(1980, 1, 6)) * 86400 + secondsOfWeek;
  if (Math.abs(weekStartS - (startDay * 86400 + startSecOfDay)) > 1e-3) {
    fail(`GPS week ${gpsWeek} and seconds of week ${secondsOfWeek} do not match the start ${fmtCivil(startCivil)} of line 1`, 1, 4, 'make line 2 agree with the start epoch of line 1');
  }

  // ---- Satellite list.
  let i = 2;
  const plusStart = i;
  while ((lines[i] ?? '').startsWith('+ ')) i++;
  const plusCount = i - plusStart;
  if (plusCount === 0) fail('no "+ " satellite-list line after line 2', i, 1, 'list the satellites on "+ " lines after the "##" line');
  const satCount = intAt(plusStart, 3, 6, 'number of satellites');
  if (satCount < 1) fail(`number of satellites ${satCount} is not positive`, plusStart, 3, 'give the count of satellites in columns 4–6');
  const linesNeeded = Math.max(5, Math.ceil(satCount / 17));
  if (version === 'c' && (satCount > 85 || plusCount !== 5)) {
    fail(`SP3-c allows 85 satellites on exactly 5 "+" lines; found ${satCount} satellites on ${plusCount} lines`, plusStart, 1, 'write the file as SP3-d ("#d"), which allows more satellites and lines');
  }
  if (plusCount < linesNeeded) fail(`${satCount} satellites need ${linesNeeded} "+" lines; found ${plusCount}`, plusStart + plusCount, 1, 'add "+" lines (17 ids each, padded with "  0")');
  const satelliteIds: string[] = [];
  for (let k = 0; k < plusCount * 17 && satelliteIds.length < satCount; k++) {
    const li = plusStart + Math.floor(k / 17);
    const c = 10 + 3 * (k % 17);
    const id = normaliseId(cols(lines[li], c, c + 2));
    if (!SAT_ID.test(id)) fail(`satellite id ${JSON.stringify(cols(lines[li], c, c + 2))} is not a letter and two digits`, li, c, 'write ids such as G05 or L51, three characters each from column 10');
    if (satelliteIds.includes(id)) fail(`satellite ${id} is listed twice`, li, c, 'list each satellite once');
    satelliteIds.push(id);
  }
  if (satelliteIds.length < satCount) fail(`"+" lines hold ${satelliteIds.length} ids but the count says ${satCount}`, plusStart, 4, 'make the count in columns 4–6 match the ids listed');
  // Slots past the count must be padding ("  0"): an id there means the count is short of the list.
  for (let k = satCount; k < plusCount * 17; k++) {
    const li = plusStart + Math.floor(k / 17);
    const c = 10 + 3 * (k % 17);
    const slot = cols(lines[li], c, c + 2).trim();
    if (slot !== '' && !/^0+$/.test(slot)) fail(`the count says ${satCount} satellites but the "+" lines list more (${slot} is number ${k + 1})`, plusStart, 4, 'make the count in columns 4–6 match the ids listed');
  }

  // ---- Accuracy exponents.
  const accStart = i;
  while ((lines[i] ?? '').startsWith('++')) i++;
  if (i - accStart !== plusCount) fail(`${i - accStart} "++" accuracy lines for ${plusCount} "+" lines`, i, 1, 'give one "++" line per "+" line');
  const accuracyExponents = new Map<string, number>();
  satelliteIds.forEach((id, k) => {
    const li = accStart + Math.floor(k / 17);
    const c = 10 + 3 * (k % 17);
    const raw = cols(lines[li], c, c + 2).trim();
    if (raw === '') accuracyExponents.set(id, 0);
    else accuracyExponents.set(id, intAt(li, c, c + 2, `accuracy exponent of ${id}`));
  });

  // ---- %c, %f, %i.
  const expectPair = (tag: string, what: string): number => {
    for (let k = 0; k < 2; k++) {
      if (!(lines[i + k] ?? '').startsWith(tag)) {
        fail(`missing "${tag}" line (${what}); found ${JSON.stringify((lines[i + k] ?? '').slice(0, 12))}`, i + k, 1, `the header has two "${tag}" lines after the "++" lines; restore them`);
      }
    }
    i += 2;
    return i - 2;
  };
  const cLine = expectPair('%c', 'file type and time system');
  const fileType = cols(lines[cLine], 4, 5).trim();
  const timeSystemCode = cols(lines[cLine], 10, 12);
  const ts = TIME_SYSTEMS[timeSystemCode];
  if (ts === undefined) {
    fail(`time system ${JSON.stringify(timeSystemCode)} is not one of ${Object.keys(TIME_SYSTEMS).join(', ')}`, cLine, 10, 'write the time system of the epochs in columns 10–12 of the first "%c" line');
  }
  const fLine = expectPair('%f', 'floating-point bases');
  const basePosVel = optionalFloat(lines[fLine], 4, 13, fLine, fail);
  const baseClock = optionalFloat(lines[fLine], 15, 26, fLine, fail);
  expectPair('%i', 'integer header fields');
  const comments: string[] = [];
  while ((lines[i] ?? '').startsWith('/*')) {
    comments.push(lines[i].slice(2).trim());
    i++;
  }

  // ---- Data section.
  const epochs: Sp3Epoch[] = [];
  let current: { epoch: Sp3Epoch; records: Map<string, Sp3Record> } | null = null;
  let last: Sp3Record | null = null;
  let eofLine = -1;
  for (; i < lines.length; i++) {
    const line = lines[i];
    if (line.startsWith('EOF')) {
      eofLine = i;
      break;
    }
    if (line.trim() === '') {
      // Only blank lines left: the file ends without EOF (truncated), reported below.
      if (lines.slice(i).every((l) => l.trim() === '')) break;
      fail('blank line in the data section', i, 1, 'remove blank lines before "EOF"');
    }
    if (line.startsWith('*')) {
      const civil = civilAt(lines, i, 4, fail, intAt, floatAt, line[1] === ' ' ? null : 2);
      if (civil.second >= 60 && ts.scale !== 'UTC') fail(`second ${civil.second} in a uniform time scale`, i, 21, 'seconds run 0–59.99999999');
      const day = daysFromCivil(civil.year, civil.month, civil.day);
      const whole = Math.floor(civil.second);
      const labelWholeS = day * 86400 + civil.hour * 3600 + civil.minute * 60 + whole;
      const labelFracS = civil.second - whole;
      const prev = epochs[epochs.length - 1];
      if (prev === undefined) {
        if (fmtCivil(civil) !== fmtCivil(startCivil)) fail(`first epoch ${fmtCivil(civil)} differs from the start ${fmtCivil(startCivil)} in line 1`, i, 4, 'make the first epoch record equal the start epoch of line 1');
      } else {
        const stepS = labelWholeS - prev.labelWholeS + (labelFracS - prev.labelFracS);
        const k = Math.round(stepS / intervalS);
        if (!(stepS > 0) || k < 1 || Math.abs(stepS - k * intervalS) > 1e-3) {
          fail(`epoch ${fmtCivil(civil)} is ${stepS} s after the previous one (line ${prev.line}), not a multiple of the interval ${intervalS} s`, i, 4, 'epochs must increase in steps of the header interval (missing epochs may be left out)');
        }
      }
      const records = new Map<string, Sp3Record>();
      const shifted = ts.offsetS === 0 ? civil : shiftCivil(civil, -ts.offsetS);
      const epoch: Sp3Epoch = { line: i + 1, civil, scaleCivil: shifted, labelWholeS, labelFracS, records };
      epochs.push(epoch);
      current = { epoch, records };
      last = null;
      continue;
    }
    if (current === null) fail(`data record ${JSON.stringify(line.slice(0, 4))} before the first epoch line`, i, 1, 'each block of records starts with a "*  YYYY MM DD HH MM SS" line');
    const cur = current as { epoch: Sp3Epoch; records: Map<string, Sp3Record> };
    if (line.startsWith('EP') || line.startsWith('EV')) {
      if (last === null) fail(`correlation record ${line.slice(0, 2)} without a preceding P record`, i, 1, 'EP/EV lines follow the P/V record they belong to');
      continue;
    }
    const kind = line[0];
    if (kind === 'P' || kind === 'V') {
      if (line.length < 60) fail(`${kind} record is ${line.length} characters long; at least 60 are needed`, i, line.length + 1, 'give the id and four F14.6 fields (columns 2–60)');
      const id = normaliseId(cols(line, 2, 4));
      if (!SAT_ID.test(id)) fail(`satellite id ${JSON.stringify(cols(line, 2, 4))} is not a letter and two digits`, i, 2, 'write the id as in the "+" list, e.g. G05');
      if (!satelliteIds.includes(id)) fail(`satellite ${id} is not in the header's "+" list`, i, 2, `use one of ${satelliteIds.join(', ')}, or add ${id} to the "+" lines`);
      const x = floatAt(i, 5, 18, `${kind} x`);
      const y = floatAt(i, 19, 32, `${kind} y`);
      const z = floatAt(i, 33, 46, `${kind} z`);
      const clk = floatAt(i, 47, 60, kind === 'P' ? 'clock' : 'clock rate');
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
        last = rec;
      } else {
        if (pv !== 'V') fail(`V record for ${id} but line 1 column 3 says P (positions only)`, i, 1, 'set column 3 of line 1 to V, or remove the V records');
        if (last === null || last.satelliteId !== id || last.velocity !== null) fail(`V record for ${id} does not follow that satellite's P record`, i, 1, 'put each V record right after the P record of the same satellite');
        const withV: Sp3Record = { ...(last as Sp3Record), velocity: { line: i + 1, velocityDmPerS: vec, clockRate1e4UsPerS: clkOk } };
        cur.records.set(id, withV);
        last = withV;
      }
      continue;
    }
    fail(`unknown record ${JSON.stringify(line.slice(0, 3))} in the data section`, i, 1, 'data lines start with "*", "P", "V", "EP", "EV" or "EOF"');
  }
  if (epochs.length !== epochCount) {
    fail(`line 1 declares ${epochCount} epochs but the file has ${epochs.length} epoch records${eofLine < 0 ? ' and no EOF line (truncated?)' : ''}`, 0, 33, 'fix the count in columns 33–39 of line 1, or restore the missing epochs');
  }
  if (eofLine < 0) fail('no "EOF" line at the end of the file (truncated?)', lines.length - 1, 1, 'end the file with "EOF"');
  for (let k = eofLine + 1; k < lines.length; k++) {
    if (lines[k].trim() !== '') fail('text after "EOF"', k, 1, 'remove everything after the EOF line');
  }
  return {
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
    timeScale: ts.scale,
    basePosVel,
    baseClock,
    comments,
    epochs,
  };
}

type Fail = (what: string, lineIdx: number, column: number | null, fix: string) => never;

/** Civil time in the fixed columns shared by line 1 and epoch lines (year at column `c0`). */
function civilAt(
  lines: string[],
  li: number,
  c0: number,
  fail: Fail,
  intAt: (li: number, a: number, b: number, f: string) => number,
  floatAt: (li: number, a: number, b: number, f: string) => number,
  badSeparatorColumn: number | null = null,
): CivilTime {
  if (badSeparatorColumn !== null) fail('epoch line does not start with "*  "', li, badSeparatorColumn, 'write epoch lines as "*  YYYY MM DD HH MM SS.ssssssss"');
  const year = intAt(li, c0, c0 + 3, 'year');
  const month = intAt(li, c0 + 5, c0 + 6, 'month');
  const day = intAt(li, c0 + 8, c0 + 9, 'day');
  const hour = intAt(li, c0 + 11, c0 + 12, 'hour');
  const minute = intAt(li, c0 + 14, c0 + 15, 'minute');
  const second = floatAt(li, c0 + 17, c0 + 27, 'second');
  if (month < 1 || month > 12) fail(`month ${month} is not 1–12`, li, c0 + 5, 'check the date');
  if (day < 1 || day > daysInMonth(year, month)) fail(`day ${day} does not exist in ${year}-${month}`, li, c0 + 8, 'check the date');
  if (hour > 23) fail(`hour ${hour} is not 0–23`, li, c0 + 11, 'check the time');
  if (minute > 59) fail(`minute ${minute} is not 0–59`, li, c0 + 14, 'check the time');
  if (second < 0 || second >= 61) fail(`second ${second} is not 0–60.99999999`, li, c0 + 17, 'check the time');
  return { year, month, day, hour, minute, second };
}

function optionalInt(line: string, a: number, b: number, li: number, fail: Fail): number | null {
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
function normaliseId(raw: string): string {
  if (raw.length !== 3) return raw;
  const letter = raw[0] === ' ' ? 'G' : raw[0];
  const tens = raw[1] === ' ' ? '0' : raw[1];
  return letter + tens + raw[2];
}

function shiftCivil(c: CivilTime, deltaS: number): CivilTime {
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

function fmtCivil(c: CivilTime): string {
  const p = (n: number): string => String(n).padStart(2, '0');
  return `${c.year}-${p(c.month)}-${p(c.day)} ${p(c.hour)}:${p(c.minute)}:${c.second.toFixed(8).padStart(11, '0')}`;
}
