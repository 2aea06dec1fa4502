/**
 * Conversions that need the leap-second table: UTC in and out, ISO 8601 text, GPS week,
 * MJD, and the UT1≈UTC Julian date used for Earth rotation. Built once at the edge.
 */
import { parseDurationS } from './duration.ts';
import { TimeError } from '../errors.ts';
import { civilFromDays, daysFromCivil, daysInMonth, MJD_OF_UNIX_EPOCH } from './calendar.ts';
import { Instant, instantFromLabel, TIME_SCALES, type TimeScale } from './instant.ts';
import { LeapSecondTable } from './leapSeconds.ts';

/** Broken-down civil time in some scale. `second` may reach 60.x during a UTC leap second. */
export interface CivilTime {
  year: number;
  month: number;
  day: number;
  hour: number;
  minute: number;
  second: number;
}

/** Seconds in a GPS week. IS-GPS-200. */
export const GPS_WEEK_S = 604_800;
const GPS_EPOCH_DAY = daysFromCivil(1980, 1, 6);
/** Last year read: ISO 8601 four-digit years, which also keeps Instant's whole seconds exact (< 2^53 s). */
const MAX_YEAR = 9999;
/** Last GPS week that starts before MAX_YEAR ends. */
const MAX_GPS_WEEK = Math.floor((daysFromCivil(MAX_YEAR + 1, 1, 1) - GPS_EPOCH_DAY) / 7) - 1;

export class TimeSystem {
  private nowCache: Instant | null = null;

  /**
   * @param leap the leap-second table
   * @param nowSource what the time word `now` means: an instant, or a function called once on the
   *   first use of `now` (so a run that never says `now` reads no clock); null (the default) refuses
   *   `now`. The core never reads a clock: only the command line supplies one (see withNow).
   */
  constructor(
    readonly leap: LeapSecondTable,
    private readonly nowSource: Instant | (() => Instant) | null = null,
  ) {}

  /** The same time system, reading the time word `now` from `nowSource`. */
  withNow(nowSource: Instant | (() => Instant)): TimeSystem {
    return new TimeSystem(this.leap, nowSource);
  }

  /** The instant `now` stands for (fixed at its first use), or null when this time system has none. */
  get nowInstant(): Instant | null {
    if (this.nowCache === null && this.nowSource !== null) this.nowCache = typeof this.nowSource === 'function' ? this.nowSource() : this.nowSource;
    return this.nowCache;
  }

  /** `now` if it has been used in this run, else null (reads nothing). */
  get nowIfUsed(): Instant | null {
    return this.nowCache;
  }

  /** Instant of a POSIX time [ms since 1970-01-01 UTC, leap seconds not counted] (e.g. a system clock reading). */
  fromPosixMs(ms: number, where = 'system clock'): Instant {
    const d = new Date(ms);
    if (Number.isNaN(d.getTime())) throw new TimeError(`time ${ms} ms is not a date`, where, 'check the system clock');
    return this.fromUtc({ year: d.getUTCFullYear(), month: d.getUTCMonth() + 1, day: d.getUTCDate(), hour: d.getUTCHours(), minute: d.getUTCMinutes(), second: d.getUTCSeconds() + d.getUTCMilliseconds() / 1000 }, where);
  }

  /** Instant from a UTC civil label, 23:59:60 allowed on days that end with a leap second. */
  fromUtc(c: CivilTime, where = 'time'): Instant {
    checkCivil(c, where, true);
    const day = daysFromCivil(c.year, c.month, c.day);
    if (c.second >= 60 && !(c.hour === 23 && c.minute === 59 && this.leap.hasLeapSecondAtEndOf(day))) {
      throw new TimeError(`second ${c.second} on a day with no leap second`, where, 'seconds run 0–59 except at 23:59:60 on a leap-second day');
    }
    const delta = this.leap.taiMinusUtcForUtcDay(day, where);
    const secWhole = Math.floor(c.second);
    return new Instant(day * 86400 + c.hour * 3600 + c.minute * 60 + secWhole + delta, c.second - secWhole, 'UTC');
  }

  /** Instant from a civil label in a uniform scale (TAI, TT, GPS, GST, BDT). */
  fromScale(scale: Exclude<TimeScale, 'UTC'>, c: CivilTime, where = 'time'): Instant {
    checkCivil(c, where, false);
    const day = daysFromCivil(c.year, c.month, c.day);
    const secWhole = Math.floor(c.second);
    const t = instantFromLabel(scale, day * 86400 + c.hour * 3600 + c.minute * 60 + secWhole, c.second - secWhole);
    this.leap.taiToUtcLabel(t.taiWholeS, where); // refuses pre-1972, marks expiry
    return t;
  }

  /** UTC civil label of an instant; second is 60.x inside a leap second. */
  utcCivil(t: Instant): CivilTime & { taiMinusUtcS: number } {
    const { utcWholeS, inLeapSecond, taiMinusUtcS } = this.leap.taiToUtcLabel(t.taiWholeS);
    const label = inLeapSecond ? utcWholeS - 1 : utcWholeS;
    const c = civilFromSeconds(label, t.taiFracS);
    // Fields named, not spread: every printed time passes here, and a spread builds a slower object.
    return { year: c.year, month: c.month, day: c.day, hour: c.hour, minute: c.minute, second: inLeapSecond ? c.second + 1 : c.second, taiMinusUtcS };
  }

  /** Civil label in any scale. */
  civil(t: Instant, scale: TimeScale): CivilTime {
    if (scale === 'UTC') return this.utcCivil(t);
    const { wholeS, fracS } = t.labelS(scale);
    return civilFromSeconds(wholeS, fracS);
  }

  /** ISO 8601 with milliseconds. UTC ends in `Z`; other scales end in a space and the scale name. */
  format(t: Instant, scale: TimeScale = 'UTC', fractionDigits = 3): string {
    // Round to the printed precision first (on the label, so TT's .184 s offset rounds right),
    // then break down: a leap second or a minute boundary is never skipped by rounding.
    const unit = 10 ** fractionDigits;
    let c: CivilTime;
    if (scale === 'UTC') {
      const rounded = Math.round(t.taiFracS * unit) / unit;
      c = this.utcCivil(new Instant(t.taiWholeS, rounded, 'UTC'));
    } else {
      const { wholeS, fracS } = t.labelS(scale);
      const rounded = Math.round(fracS * unit) / unit;
      // A fraction that rounds up to a whole second carries into the label (these scales have no 23:59:60).
      c = rounded >= 1 ? civilFromSeconds(wholeS + 1, rounded - 1) : civilFromSeconds(wholeS, rounded);
    }
    const text = formatCivil(c, fractionDigits);
    return scale === 'UTC' ? `${text}Z` : `${text} ${scale}`;
  }

  /**
   * GPS week number (not rolled over) and seconds of week. An instant before the GPS epoch
   * (1980-01-06T00:00:00 GPS, IS-GPS-200) has no week: TimeError, never a negative week.
   */
  gpsWeek(t: Instant, where = 'time'): { week: number; secondsOfWeek: number } {
    const { wholeS, fracS } = t.labelS('GPS');
    const sinceEpoch = wholeS - GPS_EPOCH_DAY * 86400;
    if (sinceEpoch < 0) throw new TimeError('instant is before GPS time began (1980-01-06T00:00:00 GPS), so it has no GPS week', where, 'use a time from 1980-01-06 on, or give it in UTC, TAI or TT');
    const week = Math.floor(sinceEpoch / GPS_WEEK_S);
    return { week, secondsOfWeek: sinceEpoch - week * GPS_WEEK_S + fracS };
  }

  /** Instant from GPS week and seconds of week. */
  fromGpsWeek(week: number, secondsOfWeek: number, where = 'time'): Instant {
    if (!Number.isInteger(week) || week < 0) throw new TimeError(`GPS week ${week} is not a whole number ≥ 0`, where, 'give the full week count since 1980-01-06, e.g. 2451');
    if (week > MAX_GPS_WEEK) throw new TimeError(`GPS week ${week} is after the year ${MAX_YEAR}`, where, `give a week up to ${MAX_GPS_WEEK} (the full week count since 1980-01-06, e.g. 2451)`);
    if (!(secondsOfWeek >= 0 && secondsOfWeek < GPS_WEEK_S)) throw new TimeError(`seconds of week ${secondsOfWeek} out of range`, where, 'use 0 ≤ seconds < 604800');
    const whole = Math.floor(secondsOfWeek);
    const t = instantFromLabel('GPS', GPS_EPOCH_DAY * 86400 + week * GPS_WEEK_S + whole, secondsOfWeek - whole);
    this.leap.taiToUtcLabel(t.taiWholeS, where);
    return t;
  }

  /** Modified Julian Date in UTC; a leap-second day is 86401 s long. */
  mjdUtc(t: Instant): number {
    const c = this.utcCivil(t);
    const day = daysFromCivil(c.year, c.month, c.day);
    const dayLengthS = this.leap.hasLeapSecondAtEndOf(day) ? 86401 : 86400;
    return day + MJD_OF_UNIX_EPOCH + (c.hour * 3600 + c.minute * 60 + c.second) / dayLengthS;
  }

  /** Instant from an MJD in a scale (UTC by default). */
  fromMjd(mjd: number, scale: TimeScale, where = 'time'): Instant {
    if (!Number.isFinite(mjd)) throw new TimeError(`MJD ${mjd} is not a number`, where, 'write e.g. "MJD 61406.5"');
    const day = Math.floor(mjd) - MJD_OF_UNIX_EPOCH;
    const secOfDay = (mjd - Math.floor(mjd)) * 86400;
    const { year, month, day: d } = civilFromDays(day);
    const hour = Math.floor(secOfDay / 3600);
    const minute = Math.floor((secOfDay - hour * 3600) / 60);
    const second = secOfDay - hour * 3600 - minute * 60;
    const c = { year, month, day: d, hour, minute, second };
    return scale === 'UTC' ? this.fromUtc(c, where) : this.fromScale(scale, c, where);
  }

  /** Julian date of UTC (as a stand-in for UT1; |UT1 − UTC| < 0.9 s) for Earth rotation angles. */
  jdUtcFromTtJ2000S(ttJ2000S: number): number {
    const t = Instant.fromTtJ2000S(ttJ2000S);
    const { utcWholeS } = this.leap.taiToUtcLabel(t.taiWholeS);
    return 2440587.5 + (utcWholeS + t.taiFracS) / 86400;
  }

  /**
   * Parse a time string:
   * - ISO 8601 `2027-03-01T00:00:00Z` (UTC) or `2027-03-01T00:00:00 GPS|TAI|TT|GST|BDT|UTC`;
   * - `GPSW 2451 345600.5` (GPS week and seconds of week);
   * - `MJD 61406.25` (UTC) or `MJD 61406.25 TT`.
   * - the time words `now`, `now+DURATION`, `now-DURATION` (`now+14d`, `now - 36h`), read against
   *   `nowInstant` (by default the one this time system was given; refused when there is none).
   * A time with neither `Z` nor a scale name is refused rather than guessed. Parts are separated by
   * spaces or tabs only: a time is one line, and a line break inside one is a mistake (and would
   * break the one-line messages that quote it).
   */
  parse(text: string, where = 'time', nowInstant?: Instant | null): Instant {
    const s = text.trim();
    if (/^now/i.test(s)) return parseTimeWord(s, text, where, nowInstant === undefined ? this.nowInstant : nowInstant);
    let m = /^GPSW[ \t]+(\d+)[ \t]+(\d+(?:\.\d+)?)$/i.exec(s);
    if (m !== null) return this.fromGpsWeek(Number(m[1]), Number(m[2]), where);
    m = /^MJD[ \t]+(-?\d+(?:\.\d+)?)(?:[ \t]+([A-Za-z]+))?$/i.exec(s);
    if (m !== null) return this.fromMjd(Number(m[1]), scaleOf(m[2] ?? 'UTC', where), where);
    m = /^(\d{4})-(\d{2})-(\d{2})(?:[T ](\d{2}):(\d{2})(?::(\d{2}(?:\.\d{1,12})?))?)?(Z|[ \t]+[A-Za-z]+)?$/.exec(s);
    if (m === null) {
      throw new TimeError(`cannot read time ${JSON.stringify(text)}`, where, 'write ISO 8601 like 2027-03-01T00:00:00Z, or "2027-03-01T00:00:00 GPS", "GPSW 2451 345600", "MJD 61406.5"');
    }
    const zone = m[7];
    if (zone === undefined) {
      throw new TimeError(`time ${JSON.stringify(text)} has no scale`, where, 'end it with Z for UTC or a space and GPS, TAI, TT, GST or BDT');
    }
    const scale: TimeScale = zone === 'Z' ? 'UTC' : scaleOf(zone.trim(), where);
    const c: CivilTime = {
      year: Number(m[1]),
      month: Number(m[2]),
      day: Number(m[3]),
      hour: m[4] === undefined ? 0 : Number(m[4]),
      minute: m[5] === undefined ? 0 : Number(m[5]),
      second: m[6] === undefined ? 0 : Number(m[6]),
    };
    return scale === 'UTC' ? this.fromUtc(c, where) : this.fromScale(scale, c, where);
  }
}

/** `now`, `now+DURATION`, `now-DURATION`, against `nowInstant`. */
function parseTimeWord(s: string, text: string, where: string, nowInstant: Instant | null): Instant {
  const m = /^now(?:[ \t]*([+-])[ \t]*(\S.*))?$/i.exec(s);
  const fix = 'write now, now+DURATION or now-DURATION, e.g. now+14d, now-36h, now+P1DT12H';
  if (m === null) throw new TimeError(`cannot read time word ${JSON.stringify(text)}`, where, fix);
  if (nowInstant === null) throw new TimeError(`the time word ${JSON.stringify(text)} needs the current time, which is not available here`, where, 'give an ISO 8601 time such as 2027-03-01T00:00:00Z');
  if (m[1] === undefined) return nowInstant.inScale('UTC');
  if (/^[+-]/.test(m[2])) throw new TimeError(`time word ${JSON.stringify(text)} has two signs`, where, fix);
  let spanS: number;
  try {
    spanS = parseDurationS(m[2], where);
  } catch {
    throw new TimeError(`cannot read the duration in ${JSON.stringify(text)}`, where, fix);
  }
  return nowInstant.plusS(m[1] === '-' ? -spanS : spanS).inScale('UTC');
}

function scaleOf(name: string, where: string): TimeScale {
  const upper = name.toUpperCase();
  const found = TIME_SCALES.find((s) => s === upper);
  if (found === undefined) throw new TimeError(`unknown time scale ${JSON.stringify(name)}`, where, `use one of ${TIME_SCALES.join(', ')}`);
  return found;
}

function checkCivil(c: CivilTime, where: string, allowLeap: boolean): void {
  // An MJD can name any year; one past 9999 has no ISO 8601 form and no exact Instant.
  if (c.year > MAX_YEAR) throw new TimeError(`year ${c.year} is after ${MAX_YEAR}`, where, `give a time before ${MAX_YEAR + 1}-01-01`);
  const ok =
    Number.isInteger(c.year) &&
    c.month >= 1 &&
    c.month <= 12 &&
    c.day >= 1 &&
    c.day <= daysInMonth(c.year, c.month) &&
    c.hour >= 0 &&
    c.hour <= 23 &&
    c.minute >= 0 &&
    c.minute <= 59 &&
    c.second >= 0 &&
    c.second < (allowLeap ? 61 : 60);
  if (!ok) {
    throw new TimeError(`no such date or time ${formatCivil(c, 3)}`, where, 'check month 1–12, the day of the month, hour 0–23, minute and second 0–59');
  }
}

function civilFromSeconds(wholeS: number, fracS: number): CivilTime {
  const day = Math.floor(wholeS / 86400);
  let rest = wholeS - day * 86400;
  const hour = Math.floor(rest / 3600);
  rest -= hour * 3600;
  const minute = Math.floor(rest / 60);
  const second = rest - minute * 60 + fracS;
  const d = civilFromDays(day);
  return { year: d.year, month: d.month, day: d.day, hour, minute, second };
}

/** `YYYY-MM-DDTHH:MM:SS.fff`; the fraction is clamped so it never carries into the next second. */
export function formatCivil(c: CivilTime, fractionDigits: number): string {
  const pad = (n: number, w = 2): string => String(n).padStart(w, '0');
  const whole = Math.floor(c.second);
  let frac = '';
  if (fractionDigits > 0) {
    // Callers round the instant first; rounding here only removes binary noise (42.184 → 42.18399…).
    const scaled = Math.round((c.second - whole) * 10 ** fractionDigits);
    frac = `.${String(Math.min(scaled, 10 ** fractionDigits - 1)).padStart(fractionDigits, '0')}`;
  }
  return `${pad(c.year, 4)}-${pad(c.month)}-${pad(c.day)}T${pad(c.hour)}:${pad(c.minute)}:${pad(whole)}${frac}`;
}
