/**
 * The TAI − UTC table. The core never reads files: the edge builds a {@link LeapSecondTable}
 * from `data/leap-seconds.json` (or a user file) and passes it in.
 */
import { TimeError } from '../errors.ts';
import { daysFromCivil } from './calendar.ts';

/** One step of the table: from UTC day `startDay` (days since 1970-01-01) on, TAI − UTC = `taiMinusUtcS`. */
export interface LeapRow {
  startDay: number;
  taiMinusUtcS: number;
}

/** Raw table as stored in `data/leap-seconds.json`. */
export interface LeapTableData {
  source: string;
  expiresUtc: string;
  rows: [string, number][];
}

/** TAI − UTC lookups, with the table's expiry. */
export class LeapSecondTable {
  readonly rows: readonly LeapRow[];
  /** First UTC day (days since 1970-01-01) the table no longer vouches for. */
  readonly expiryDay: number;
  readonly expiresUtc: string;
  readonly source: string;
  /** Set when any conversion used an instant at or past the expiry day; the CLI warns. */
  usedPastExpiry = false;

  constructor(data: LeapTableData) {
    const rows = data.rows.map(([date, value]) => ({ startDay: parseDay(date), taiMinusUtcS: value }));
    for (let i = 1; i < rows.length; i++) {
      if (rows[i].startDay <= rows[i - 1].startDay) throw new TimeError(`leap-second rows out of order at ${data.rows[i][0]}`, 'leap-second table', 'sort the rows by date');
    }
    if (rows.length === 0) throw new TimeError('empty leap-second table', 'leap-second table', 'give at least the 1972-01-01 row');
    this.rows = rows;
    this.expiryDay = parseDay(data.expiresUtc);
    this.expiresUtc = data.expiresUtc;
    this.source = data.source;
  }

  /** First UTC day of the table (1972-01-01). Earlier instants are refused. */
  get firstDay(): number {
    return this.rows[0].startDay;
  }

  /** TAI − UTC [s] in force during UTC day `utcDay` (days since 1970-01-01), leap second included. */
  taiMinusUtcForUtcDay(utcDay: number, where = 'time'): number {
    if (utcDay < this.firstDay) throw new TimeError('instant before 1972-01-01, when UTC got integer leap seconds', where, 'use a time from 1972 on');
    if (utcDay >= this.expiryDay) this.usedPastExpiry = true;
    let value = this.rows[0].taiMinusUtcS;
    for (const row of this.rows) {
      if (row.startDay <= utcDay) value = row.taiMinusUtcS;
      else break;
    }
    return value;
  }

  /**
   * For a TAI label second count (seconds since 1970-01-01T00:00:00 TAI), the UTC split:
   * `utcS` label seconds since 1970-01-01 UTC and whether the instant falls in an inserted leap second.
   */
  taiToUtcLabel(taiWholeS: number, where = 'time'): { utcWholeS: number; inLeapSecond: boolean; taiMinusUtcS: number } {
    const rows = this.rows;
    let idx = -1;
    for (let i = 0; i < rows.length; i++) {
      if (rows[i].startDay * 86400 + rows[i].taiMinusUtcS <= taiWholeS) idx = i;
      else break;
    }
    if (idx < 0) {
      const first = rows[0];
      // The second just before a row starts may be that row's inserted leap second; otherwise too early.
      throw new TimeError('instant before 1972-01-01, when UTC got integer leap seconds', where, `use a time from 1972 on (table starts ${first.startDay})`);
    }
    const next = rows[idx + 1];
    if (next !== undefined) {
      const nextStartTai = next.startDay * 86400 + next.taiMinusUtcS;
      const step = next.taiMinusUtcS - rows[idx].taiMinusUtcS;
      if (step > 0 && taiWholeS >= nextStartTai - step) {
        // Inside the inserted second(s): label is the last second(s) of the previous day, 23:59:60.
        if (next.startDay >= this.expiryDay) this.usedPastExpiry = true;
        return { utcWholeS: taiWholeS - rows[idx].taiMinusUtcS, inLeapSecond: true, taiMinusUtcS: rows[idx].taiMinusUtcS };
      }
    }
    const value = rows[idx].taiMinusUtcS;
    const utcWholeS = taiWholeS - value;
    if (Math.floor(utcWholeS / 86400) >= this.expiryDay) this.usedPastExpiry = true;
    return { utcWholeS, inLeapSecond: false, taiMinusUtcS: value };
  }

  /** True when `utcDay` ends with an inserted leap second (its last minute has 61 s). */
  hasLeapSecondAtEndOf(utcDay: number): boolean {
    for (let i = 1; i < this.rows.length; i++) {
      if (this.rows[i].startDay === utcDay + 1) return this.rows[i].taiMinusUtcS > this.rows[i - 1].taiMinusUtcS;
    }
    return false;
  }
}

function parseDay(date: string): number {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(date);
  if (m === null) throw new TimeError(`bad date ${JSON.stringify(date)} in leap-second table`, 'leap-second table', 'write dates as YYYY-MM-DD');
  return daysFromCivil(Number(m[1]), Number(m[2]), Number(m[3]));
}
