/**
 * CCSDS ASCII time codes (CCSDS 301.0-B-4 §3.5, as used by the TDM and OEM): code A
 * `YYYY-MM-DDThh:mm:ss[.d…][Z]` and code B (day of year) `YYYY-DDDThh:mm:ss[.d…][Z]`.
 */
import { civilFromDays, daysFromCivil, daysInMonth } from '../time/calendar.ts';
import type { CivilTime } from '../time/timeSystem.ts';

const TIME_YMD = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2}):(\d{2}(?:\.\d*)?)Z?$/;
const TIME_DOY = /^(\d{4})-(\d{3})T(\d{2}):(\d{2}):(\d{2}(?:\.\d*)?)Z?$/;

/** The civil label of a CCSDS time, or a reason it is not one. */
export function ccsdsCivil(text: string): CivilTime | string {
  const ymd = TIME_YMD.exec(text);
  let c: CivilTime | null = null;
  if (ymd !== null) {
    c = { year: +ymd[1], month: +ymd[2], day: +ymd[3], hour: +ymd[4], minute: +ymd[5], second: +ymd[6] };
    if (c.month < 1 || c.month > 12 || c.day < 1 || c.day > daysInMonth(c.year, c.month)) return `date ${text.slice(0, 10)} does not exist`;
  }
  const doy = TIME_DOY.exec(text);
  if (doy !== null) {
    const year = +doy[1];
    const day = +doy[2];
    const leap = (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
    if (day < 1 || day > (leap ? 366 : 365)) return `day of year ${day} does not exist in ${year}`;
    c = { ...civilFromDays(daysFromCivil(year, 1, 1) + day - 1), hour: +doy[3], minute: +doy[4], second: +doy[5] };
  }
  if (c === null) return `time ${JSON.stringify(text)} is not YYYY-MM-DDThh:mm:ss or YYYY-DDDThh:mm:ss`;
  if (c.hour > 23 || c.minute > 59 || c.second >= 61) return `time of day in ${JSON.stringify(text)} is out of range`;
  return c;
}
