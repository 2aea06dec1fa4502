/**
 * Two-line and three-line element set files (TLE / 3LE), read strictly.
 *
 * Format: NORAD two-line element sets as documented with Spacetrack Report #3 and in
 * Vallado, Crawford, Hujsak & Kelso (2006), AIAA 2006-6753, appendix. Each element line is
 * exactly 69 characters; column 69 is a modulo-10 checksum of columns 1–68 where digits count
 * their value, '-' counts 1 and everything else 0. An optional name line (up to 24 characters,
 * possibly prefixed with "0 ") may precede line 1.
 *
 * Every fault throws {@link OrbitFileError} with the 1-based line and column, so the CLI can print
 * `tauplan: <what> (<file>:<line>:<col>) — <fix>`. Nothing here is guessed: a record that does not
 * read cleanly is refused, not repaired.
 */
import { OrbitFileError } from '../errors.ts';
import { civilFromDays, daysFromCivil } from '../time/calendar.ts';
import type { CivilTime } from '../time/timeSystem.ts';
import type { TleRecord } from '../model/elementSet.ts';
import { linesOf, type TextLine } from './textSource.ts';

export type { TleRecord };


/** Length of an element line [characters]. */
export const TLE_LINE_LENGTH = 69;

/** Modulo-10 checksum of the first 68 characters: digits count their value, '-' counts 1. */
export function tleChecksum(line: string): number {
  let sum = 0;
  const n = Math.min(68, line.length);
  for (let i = 0; i < n; i++) {
    const c = line.charCodeAt(i);
    if (c >= 48 && c <= 57) sum += c - 48;
    else if (c === 45) sum += 1;
  }
  return sum % 10;
}

/** Append the checksum digit to a 68-character line body. Used by scripts that build invented TLEs. */
export function formatTleLine(body68: string): string {
  if (body68.length !== 68) {
    throw new OrbitFileError(`element line body is ${body68.length} characters, expected 68`, 'formatTleLine', 1, null, 'pass columns 1–68; the checksum becomes column 69');
  }
  return body68 + String(tleChecksum(body68));
}

/** Decode a five-character catalogue number, digits or Alpha-5 (letter A–Z without I and O, then 4 digits). */
export function catalogNumberValue(field: string): number | null {
  if (/^[ 0-9]{4}[0-9]$/.test(field) && /^ *[0-9]+$/.test(field)) return Number(field.trim());
  const m = /^([A-HJ-NP-Z])([0-9]{4})$/.exec(field);
  if (m === null) return null;
  let letter = m[1].charCodeAt(0) - 65 + 10; // A = 10
  if (m[1] > 'I') letter -= 1;
  if (m[1] > 'O') letter -= 1;
  return letter * 10000 + Number(m[2]);
}

/** UTC civil time from a year and a 1-based fractional day of year (days of 86400 s). */
export function civilFromYearDay(year: number, dayOfYear: number): CivilTime {
  const whole = Math.floor(dayOfYear);
  let secOfDay = (dayOfYear - whole) * 86400;
  // Keep the integer part exact and only the sub-second part rounded.
  const days = daysFromCivil(year, 1, 1) + whole - 1;
  const { year: y, month, day } = civilFromDays(days);
  const hour = Math.floor(secOfDay / 3600);
  secOfDay -= hour * 3600;
  const minute = Math.floor(secOfDay / 60);
  const second = secOfDay - minute * 60;
  return { year: y, month, day, hour, minute, second };
}

/** A numeric field of an element line, by 1-based columns (inclusive). */
interface FieldSpec {
  name: string;
  from: number;
  to: number;
  pattern: RegExp;
  example: string;
}

const L1_FIELDS: FieldSpec[] = [
  { name: 'epoch year', from: 19, to: 20, pattern: /^\d\d$/, example: '"24"' },
  { name: 'epoch day of year', from: 21, to: 32, pattern: /^[ \d]{2}\d\.\d{8}$/, example: '"179.78495062"' },
  { name: 'first derivative of mean motion', from: 34, to: 43, pattern: /^[ +-]\.\d{8}$/, example: '" .00000023"' },
  { name: 'second derivative of mean motion', from: 45, to: 52, pattern: /^[ +-]\d{5}[+-]\d$/, example: '" 00000-0"' },
  { name: 'B* drag term', from: 54, to: 61, pattern: /^[ +-]\d{5}[+-]\d$/, example: '" 28098-4"' },
  { name: 'ephemeris type', from: 63, to: 63, pattern: /^[ \d]$/, example: '"0"' },
  { name: 'element set number', from: 65, to: 68, pattern: /^ *\d*$/, example: '" 475"' },
];

const L2_FIELDS: FieldSpec[] = [
  { name: 'inclination', from: 9, to: 16, pattern: /^ *\d{1,3}\.\d{4}$/, example: '" 34.2682"' },
  { name: 'right ascension of the ascending node', from: 18, to: 25, pattern: /^ *\d{1,3}\.\d{4}$/, example: '"348.7242"' },
  { name: 'eccentricity', from: 27, to: 33, pattern: /^\d{7}$/, example: '"1859667" (decimal point assumed)' },
  { name: 'argument of perigee', from: 35, to: 42, pattern: /^ *\d{1,3}\.\d{4}$/, example: '"331.7664"' },
  { name: 'mean anomaly', from: 44, to: 51, pattern: /^ *\d{1,3}\.\d{4}$/, example: '" 19.3264"' },
  { name: 'mean motion', from: 53, to: 63, pattern: /^ *\d{1,2}\.\d{8}$/, example: '"10.82419157"' },
  { name: 'revolution number at epoch', from: 64, to: 68, pattern: /^ *\d*$/, example: '"41366"' },
];

/** Columns that must hold a space (1-based). */
const L1_BLANKS = [2, 9, 18, 33, 44, 53, 62, 64];
const L2_BLANKS = [2, 8, 17, 26, 34, 43, 52];

/**
 * Read every element set in a TLE or 3LE file. Blank lines between records are allowed.
 * @param text     the whole file
 * @param fileName used in messages only
 * @throws OrbitFileError at the first fault, with line and column
 */
export function parseTleFile(text: string, fileName: string): TleRecord[] {
  return parseTleLines(linesOf(text), fileName);
}

/**
 * The same, from lines as they stream (textSource.ts): only the records and the pending name or
 * line 1 are kept, never the file.
 */
export function parseTleLines(source: Iterable<TextLine>, fileName: string): TleRecord[] {
  const records: TleRecord[] = [];
  let pendingName: { text: string; line: number } | null = null;
  let line1: { text: string; line: number } | null = null;
  for (const l of source) {
    const line = cleanLine(l, fileName);
    const lineNo = l.line;
    if (line1 !== null) {
      // Element line 2 of the set started on the line before.
      if (line.length === 0) throw new OrbitFileError('line 1 without its line 2', fileName, line1.line, null, 'add line 2 directly after line 1, or remove the incomplete element set');
      if (line.startsWith('1 ')) throw new OrbitFileError('line 1 without its line 2 (the next line is another line 1)', fileName, line1.line, null, 'add line 2 directly after line 1, or remove the incomplete element set');
      checkElementLine(line, 2, fileName, lineNo);
      const cat1 = line1.text.slice(2, 7);
      const cat2 = line.slice(2, 7);
      if (cat1 !== cat2) {
        throw new OrbitFileError(`catalogue number "${cat2}" on line 2 differs from "${cat1}" on line 1`, fileName, lineNo, 3, 'both lines of an element set must carry the same catalogue number in columns 3–7');
      }
      records.push(buildRecord(line1.text, line, fileName, line1.line, pendingName));
      pendingName = null;
      line1 = null;
      continue;
    }
    if (line.length === 0) {
      if (pendingName !== null) {
        throw new OrbitFileError(`name line "${pendingName.text}" is followed by a blank line`, fileName, pendingName.line, null, 'put line 1 of the element set directly after its name line');
      }
      continue;
    }
    if (line.startsWith('2 ')) {
      throw new OrbitFileError('line 2 without a line 1 before it', fileName, lineNo, 1, 'put line 1 of the element set directly before its line 2');
    }
    const looksLikeElementLine = line.startsWith('1 ') || (line.length === TLE_LINE_LENGTH && /^\S [ 0-9A-Z]{5}/.test(line) && !line.startsWith('0 '));
    if (!looksLikeElementLine) {
      if (pendingName !== null) {
        throw new OrbitFileError(`expected line 1 after the name line "${pendingName.text}", found another text line`, fileName, lineNo, 1, 'each name line must be followed by line 1 and line 2 of its element set');
      }
      const name = line.startsWith('0 ') ? line.slice(2).trim() : line.trim();
      pendingName = { text: name, line: lineNo };
      continue;
    }
    checkElementLine(line, 1, fileName, lineNo);
    line1 = { text: line, line: lineNo };
  }
  if (line1 !== null) throw new OrbitFileError('line 1 without its line 2', fileName, line1.line, null, 'add line 2 directly after line 1, or remove the incomplete element set');
  if (pendingName !== null) {
    throw new OrbitFileError(`name line "${pendingName.text}" has no element set after it`, fileName, pendingName.line, null, 'add line 1 and line 2 after the name line, or remove it');
  }
  if (records.length === 0) {
    throw new OrbitFileError('no element set in the file', fileName, 1, null, 'give a file with at least one pair of TLE lines (optionally with a name line before each)');
  }
  return records;
}

/** A line without trailing blanks; tabs and control characters refused (they would be echoed into a one-line message). */
function cleanLine(l: TextLine, fileName: string): string {
  const tab = l.text.indexOf('\t');
  if (tab >= 0) throw new OrbitFileError('tab character in an element set file', fileName, l.line, tab + 1, 'replace tabs by spaces; TLE fields are fixed columns');
  const kept = l.text.trimEnd(); // same as replace(/\s+$/, ''), without its quadratic backtracking
  const ctrl = kept.search(/[\u0000-\u001f\u007f]/);
  if (ctrl >= 0) {
    const code = kept.charCodeAt(ctrl).toString(16).toUpperCase().padStart(4, '0');
    throw new OrbitFileError(`control character U+${code} in an element set file`, fileName, l.line, ctrl + 1, 'remove it; element set files are plain text lines ending in LF or CR LF');
  }
  return kept;
}

function checkElementLine(line: string, which: 1 | 2, fileName: string, lineNo: number): void {
  if (line.length !== TLE_LINE_LENGTH) {
    const what = line.length < TLE_LINE_LENGTH ? 'truncated' : 'too long';
    throw new OrbitFileError(`line ${which} is ${what}: ${line.length} characters, expected ${TLE_LINE_LENGTH}`, fileName, lineNo, Math.min(line.length, TLE_LINE_LENGTH) + 1, 'each element line has exactly 69 columns; check for lost or extra characters');
  }
  if (line[0] !== String(which)) {
    throw new OrbitFileError(`line number "${line[0]}" in column 1, expected "${which}"`, fileName, lineNo, 1, `line ${which} of an element set starts with "${which} "`);
  }
  const catField = line.slice(2, 7);
  if (catalogNumberValue(catField) === null) {
    throw new OrbitFileError(`catalogue number "${catField}" is not 5 digits or Alpha-5`, fileName, lineNo, 3, 'write the catalogue number in columns 3–7, e.g. "00005" or "A0001"');
  }
  for (const col of which === 1 ? L1_BLANKS : L2_BLANKS) {
    if (line[col - 1] !== ' ') {
      throw new OrbitFileError(`column ${col} of line ${which} holds "${line[col - 1]}", expected a space`, fileName, lineNo, col, 'fields are in fixed columns; a shifted field usually means a lost or extra character before it');
    }
  }
  for (const f of which === 1 ? L1_FIELDS : L2_FIELDS) {
    const value = line.slice(f.from - 1, f.to);
    if (!f.pattern.test(value)) {
      throw new OrbitFileError(`${f.name} "${value}" in columns ${f.from}–${f.to} of line ${which} is not a valid number`, fileName, lineNo, f.from, `write it in the fixed format, e.g. ${f.example}`);
    }
  }
  const found = line[68];
  const expected = tleChecksum(line);
  if (!/^\d$/.test(found) || Number(found) !== expected) {
    throw new OrbitFileError(`checksum of line ${which} is "${found}", expected ${expected}`, fileName, lineNo, 69, 'the line was altered or mistyped; get the element set again from its source (or fix column 69 if you edited the line on purpose)');
  }
}

/** "-12345-6" style assumed-decimal exponent field → number. */
function decimalExponent(field: string): number {
  const sign = field[0] === '-' ? -1 : 1;
  const mantissa = Number(`0.${field.slice(1, 6)}`);
  const exponent = Number(field.slice(6, 8));
  return sign * mantissa * 10 ** exponent;
}

function buildRecord(line1: string, line2: string, fileName: string, lineNo: number, name: { text: string; line: number } | null): TleRecord {
  const yy = Number(line1.slice(18, 20));
  const epochYear = yy < 57 ? 2000 + yy : 1900 + yy;
  const epochDayOfYear = Number(line1.slice(20, 32));
  const daysInYear = daysFromCivil(epochYear + 1, 1, 1) - daysFromCivil(epochYear, 1, 1);
  if (!(epochDayOfYear >= 1 && epochDayOfYear < daysInYear + 1)) {
    throw new OrbitFileError(`epoch day of year ${epochDayOfYear} outside 1–${daysInYear + 1} for ${epochYear}`, fileName, lineNo, 21, 'day of year runs from 1.0 (1 January 00:00 UTC)');
  }
  const get = (l: string, from: number, to: number): number => Number(l.slice(from - 1, to));
  const inclinationDeg = get(line2, 9, 16);
  const raanDeg = get(line2, 18, 25);
  const argOfPerigeeDeg = get(line2, 35, 42);
  const meanAnomalyDeg = get(line2, 44, 51);
  const meanMotionRevPerDay = get(line2, 53, 63);
  const angleChecks: [string, number, number, number][] = [
    ['inclination', inclinationDeg, 180, 9],
    ['right ascension of the ascending node', raanDeg, 360, 18],
    ['argument of perigee', argOfPerigeeDeg, 360, 35],
    ['mean anomaly', meanAnomalyDeg, 360, 44],
  ];
  for (const [what, value, max, col] of angleChecks) {
    if (value > max) throw new OrbitFileError(`${what} ${value}° is above ${max}°`, fileName, lineNo + 1, col, `give an angle in 0–${max}°`);
  }
  if (!(meanMotionRevPerDay > 0)) {
    throw new OrbitFileError(`mean motion ${meanMotionRevPerDay} rev/day is not positive`, fileName, lineNo + 1, 53, 'give the mean motion in revolutions per day, e.g. 15.5 for a low orbit');
  }
  const catalogNumber = line1.slice(2, 7);
  return {
    kind: 'tle',
    name: name === null ? null : name.text,
    catalogNumber,
    catalogNumberValue: catalogNumberValue(catalogNumber) as number,
    classification: line1[7],
    internationalDesignator: line1.slice(9, 17).trim(),
    epochYear,
    epochDayOfYear,
    epochUtc: civilFromYearDay(epochYear, epochDayOfYear),
    meanMotionRevPerDay,
    eccentricity: Number(`0.${line2.slice(26, 33)}`),
    inclinationDeg,
    raanDeg,
    argOfPerigeeDeg,
    meanAnomalyDeg,
    bstarPerEarthRadius: decimalExponent(line1.slice(53, 61)),
    line1,
    line2,
    lineNumberInFile: lineNo,
    nameLineNumberInFile: name === null ? null : name.line,
    fileName,
  };
}
