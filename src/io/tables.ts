/**
 * Loads the tables the core needs. This is the only place they are read.
 * The leap-second table comes from `data/leap-seconds.json`, or from the file named by
 * `--leap-seconds FILE` (the CLI puts it in TAUPLAN_LEAP_SECONDS so worker threads see it too):
 * either our JSON form or the IERS `Leap_Second.dat` text as published with Bulletin C.
 */
import { readInputText, readTextWhole } from './textSource.ts';
import { fileURLToPath } from 'node:url';
import { InputError } from '../errors.ts';
import { civilFromDays, MJD_OF_UNIX_EPOCH } from '../time/calendar.ts';
import { LeapSecondTable, type LeapTableData } from '../time/leapSeconds.ts';
import { TimeSystem } from '../time/timeSystem.ts';

/** Absolute path of a file in the package's `data/` folder. */
export function dataPath(name: string): string {
  // From src/io/ the package root is two levels up; from the bundle in dist/ it is one.
  const up = /\/dist\/[^/]*$/.test(import.meta.url) ? '../' : '../../';
  return fileURLToPath(new URL(`${up}data/${name}`, import.meta.url));
}

/** Environment variable naming a leap-second file that replaces the packaged one. */
export const LEAP_SECONDS_ENV = 'TAUPLAN_LEAP_SECONDS';

let cached: TimeSystem | undefined;

/** The time system (read once per process). */
export function defaultTimeSystem(): TimeSystem {
  if (cached === undefined) {
    const path = process.env[LEAP_SECONDS_ENV];
    cached = new TimeSystem(new LeapSecondTable(path === undefined || path === '' ? packagedTable() : readLeapFile(path)));
  }
  return cached;
}

function packagedTable(): LeapTableData {
  return JSON.parse(readTextWhole(dataPath('leap-seconds.json'), 'table', 'the packaged leap-second table')) as LeapTableData;
}

const MONTHS = ['january', 'february', 'march', 'april', 'may', 'june', 'july', 'august', 'september', 'october', 'november', 'december'];
const pad2 = (n: number): string => String(n).padStart(2, '0');

/** Read a user leap-second file: our JSON form, or IERS Leap_Second.dat. */
export function readLeapFile(path: string): LeapTableData {
  const text = readInputText(path, '--leap-seconds', 'table');
  if (/^\s*\{/.test(text)) {
    let data: LeapTableData;
    try {
      data = JSON.parse(text) as LeapTableData;
      if (!Array.isArray(data.rows) || typeof data.expiresUtc !== 'string') throw new Error('shape');
      if (!data.rows.every((r) => Array.isArray(r) && typeof r[0] === 'string' && typeof r[1] === 'number')) throw new Error('rows');
    } catch {
      throw new InputError(`${path} is not a tauplan leap-second table`, '--leap-seconds', 'give JSON with "expiresUtc" and "rows" of ["YYYY-MM-DD", seconds], or an IERS Leap_Second.dat');
    }
    checkLeapSteps(data.rows, (i) => `${path} rows[${i}]`);
    return data;
  }
  return parseIersLeapSecondDat(text, path);
}

/** TAI − UTC when UTC began (1972-01-01) [s]: ITU-R TF.460-6, confirmed against IERS Leap_Second.dat. */
const FIRST_TAI_MINUS_UTC_S = 10;

/**
 * A plausible table: TAI − UTC starts at 10 s and changes by exactly ±1 s per row, each change at
 * 0 h UTC on the first day of a month (ITU-R TF.460-6 §2.1: a leap second is the last second of a
 * month, first preference December and June, second March and September). A table that breaks this
 * is a damaged or hand-edited file, and every time converted with it would be wrong.
 */
export function checkLeapSteps(rows: readonly (readonly [string, number])[], where: (i: number) => string): void {
  const fix = 'use the IERS Leap_Second.dat as published (TAI − UTC changes by 1 s, on the first day of a month)';
  rows.forEach(([date, value], i) => {
    const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(date);
    if (m === null || m[3] !== '01' || Number(m[2]) < 1 || Number(m[2]) > 12) throw new InputError(`leap-second change on ${date}, not the first day of a month`, where(i), fix);
    if (!Number.isInteger(value)) throw new InputError(`TAI − UTC ${value} s is not a whole number of seconds`, where(i), fix);
    if (i === 0) {
      if (value !== FIRST_TAI_MINUS_UTC_S) throw new InputError(`first row says TAI − UTC = ${value} s on ${date}; UTC began at 10 s on 1972-01-01`, where(i), fix);
      return;
    }
    const step = value - rows[i - 1][1];
    if (Math.abs(step) !== 1) throw new InputError(`TAI − UTC steps by ${step} s on ${date} (from ${rows[i - 1][1]} s); a leap second is ±1 s`, where(i), fix);
  });
}

/** IERS Leap_Second.dat: `#  File expires on 28 June 2027` and rows `MJD day month year TAI-UTC`. */
export function parseIersLeapSecondDat(text: string, path: string): LeapTableData {
  let expiresUtc: string | null = null;
  const rows: [string, number][] = [];
  const rowLines: number[] = [];
  const lines = text.split(/\r?\n/);
  for (let i = 0; i < lines.length; i++) {
    const line = lines[i].trim();
    if (line === '') continue;
    if (line.startsWith('#')) {
      const m = /expires on\s+(\d{1,2})\s+([A-Za-z]+)\s+(\d{4})/i.exec(line);
      if (m !== null) {
        const month = MONTHS.indexOf(m[2].toLowerCase()) + 1;
        if (month === 0) throw new InputError(`unknown month ${JSON.stringify(m[2])} in the expiry line`, `${path}:${i + 1}`, 'write the month in English, e.g. "28 June 2027"');
        expiresUtc = `${m[3]}-${pad2(month)}-${pad2(Number(m[1]))}`;
      }
      continue;
    }
    const f = line.split(/\s+/);
    const mjd = Number(f[0]);
    const value = Number(f[4]);
    if (f.length < 5 || !Number.isFinite(mjd) || !Number.isInteger(value)) {
      throw new InputError(`cannot read leap-second row ${JSON.stringify(line)}`, `${path}:${i + 1}`, 'rows are "MJD day month year TAI-UTC", as in IERS Leap_Second.dat');
    }
    const { year, month, day } = civilFromDays(Math.round(mjd) - MJD_OF_UNIX_EPOCH);
    rows.push([`${year}-${pad2(month)}-${pad2(day)}`, value]);
    rowLines.push(i + 1);
  }
  if (rows.length === 0) throw new InputError('no leap-second rows found', path, 'give an IERS Leap_Second.dat');
  if (expiresUtc === null) throw new InputError('no "File expires on" line found', path, 'give the IERS Leap_Second.dat as published (it states its expiry)');
  checkLeapSteps(rows, (i) => `${path}:${rowLines[i]}`);
  return { source: `user file ${path}`, expiresUtc, rows };
}
