/**
 * IERS Bulletin C 68 (July 2024) and the IERS leap-second table: TAI − UTC = 37 s since
 * 2017-01-01, after the leap second 2016-12-31T23:59:60 UTC (confirmed, physics.md §5).
 * IS-GPS-200 §3.3.4: GPS time epoch 1980-01-06T00:00:00 UTC, GPS = TAI − 19 s (confirmed).
 * TT = TAI + 32.184 s (IAU 1991, confirmed). BDT = GPS − 14 s (confirmed via code, physics.md §5).
 */
import { describe, expect, it } from 'vitest';
import { TimeError } from '../src/errors.ts';
import { defaultTimeSystem } from '../src/io/tables.ts';
import { parseDurationS } from '../src/time/duration.ts';
import { Instant } from '../src/time/instant.ts';

const ts = defaultTimeSystem();
const NS = 1e-9;

describe('leap-second table', () => {
  it('TAI − UTC = 37 s from 2017-01-01, 36 s just before', () => {
    expect(ts.utcCivil(ts.parse('2017-01-01T00:00:00Z')).taiMinusUtcS).toBe(37);
    expect(ts.utcCivil(ts.parse('2016-12-31T23:59:59Z')).taiMinusUtcS).toBe(36);
    expect(ts.parse('2017-01-01T00:00:00Z').minusS(ts.parse('2016-12-31T23:59:59Z'))).toBe(2); // 23:59:60 in between
  });

  it('2016-12-31T23:59:60Z exists, prints as such and is 2017-01-01T00:00:36 TAI', () => {
    const t = ts.parse('2016-12-31T23:59:60.250Z');
    expect(ts.format(t)).toBe('2016-12-31T23:59:60.250Z');
    expect(ts.format(t, 'TAI')).toBe('2017-01-01T00:00:36.250 TAI');
    expect(() => ts.parse('2017-12-31T23:59:60Z')).toThrow(TimeError); // no leap second then
  });

  it('refuses instants before 1972', () => {
    expect(() => ts.parse('1971-12-31T23:59:59Z')).toThrow(/1972/);
  });

  it('GPS epoch and week numbers', () => {
    const t = ts.parse('1980-01-06T00:00:00Z');
    expect(ts.gpsWeek(t)).toEqual({ week: 0, secondsOfWeek: 0 });
    expect(ts.format(t, 'GPS')).toBe('1980-01-06T00:00:00.000 GPS');
    // 2027-01-01T00:00:00Z: GPS − UTC = 18 s; the week count is derived from the calendar (derived).
    const u = ts.parse('2027-01-01T00:00:00Z');
    const { week, secondsOfWeek } = ts.gpsWeek(u);
    expect(ts.fromGpsWeek(week, secondsOfWeek).minusS(u)).toBe(0);
    expect(ts.format(u, 'GPS')).toBe('2027-01-01T00:00:18.000 GPS');
    expect(ts.parse(`GPSW ${week} ${secondsOfWeek}`).minusS(u)).toBe(0);
  });

  it('an instant before the GPS epoch has no GPS week (IS-GPS-200: GPS time starts 1980-01-06; confirmed)', () => {
    expect(() => ts.gpsWeek(ts.parse('1979-06-01T00:00:00Z'))).toThrow(/before GPS time began/);
    expect(() => ts.gpsWeek(ts.parse('1980-01-05T23:59:59.999Z'))).toThrow(TimeError);
  });

  it('printed times are rounded to the millisecond, carrying into the next second, minute, day and out of a leap second (derived)', () => {
    expect(ts.format(ts.parse('2016-12-31T23:59:60.9996Z'))).toBe('2017-01-01T00:00:00.000Z');
    expect(ts.format(ts.parse('2016-12-31T23:59:59.9996Z'))).toBe('2016-12-31T23:59:60.000Z');
    expect(ts.format(ts.parse('2026-12-31T23:59:59.9996Z'))).toBe('2027-01-01T00:00:00.000Z');
    expect(ts.format(ts.parse('2026-03-01T10:59:59.9997Z'))).toBe('2026-03-01T11:00:00.000Z');
    expect(ts.format(ts.parse('2026-03-01T10:00:00.0004Z'))).toBe('2026-03-01T10:00:00.000Z');
    expect(ts.format(ts.parse('2026-03-01T10:00:00.0006Z'))).toBe('2026-03-01T10:00:00.001Z');
    // Other scales round on their own label: TT = TAI + 32.184 s (IERS; confirmed).
    expect(ts.format(ts.parse('2026-12-31T23:58:50.8156 TT'), 'TT')).toBe('2026-12-31T23:58:50.816 TT');
    expect(ts.format(ts.parse('2026-12-31T23:59:59.9999 TT'), 'TT')).toBe('2027-01-01T00:00:00.000 TT');
  });

  it('round trips UTC → TAI → TT → GPS → UTC within 1 ns', () => {
    for (const text of ['1972-01-01T00:00:00Z', '1999-12-31T23:59:59.999999Z', '2016-12-31T23:59:60.5Z', '2027-03-01T12:34:56.789012Z', '2040-06-30T00:00:00.000001Z']) {
      const t0 = ts.parse(text);
      const tai = ts.parse(ts.format(t0, 'TAI', 9));
      const tt = ts.parse(ts.format(tai, 'TT', 9));
      const gps = ts.parse(ts.format(tt, 'GPS', 9));
      const back = ts.parse(ts.format(gps, 'UTC', 9));
      expect(Math.abs(back.minusS(t0)), text).toBeLessThan(NS);
    }
  });

  it('TT − TAI = 32.184 s, BDT = GPS − 14 s', () => {
    const t = ts.parse('2027-01-01T00:00:00 TAI');
    expect(ts.format(t, 'TT')).toBe('2027-01-01T00:00:32.184 TT');
    expect(ts.format(t, 'BDT')).toBe('2026-12-31T23:59:27.000 BDT');
  });

  it('MJD: 2017-01-01T00:00:00Z is MJD 57754 (derived from the calendar)', () => {
    expect(ts.mjdUtc(ts.parse('2017-01-01T00:00:00Z'))).toBe(57754);
    expect(Math.abs(ts.parse('MJD 57754.5').minusS(ts.parse('2017-01-01T12:00:00Z')))).toBeLessThan(1e-6);
  });

  it('an instant keeps sub-microsecond precision over decades', () => {
    const t = ts.parse('2055-06-01T00:00:00.0000001Z');
    const u = ts.parse('1975-06-01T00:00:00Z');
    const wholeSpanS = Math.round(t.minusS(u)); // 80 years of whole seconds
    expect(Math.abs(t.minusS(u.plusS(wholeSpanS)) - 1e-7)).toBeLessThan(1e-12);
    expect(Math.abs(t.plusS(1e-7).minusS(t) - 1e-7)).toBeLessThan(1e-12);
    expect(Math.abs(Instant.fromTtJ2000S(t.ttJ2000S).minusS(t))).toBeLessThan(2e-7); // double ttJ2000S: 0.12 µs ulp at 1.7e9 s
  });

  it('refuses a time without a scale, bad dates, and bad durations', () => {
    expect(() => ts.parse('2027-01-01T00:00:00')).toThrow(/no scale/);
    expect(() => ts.parse('2027-02-30T00:00:00Z')).toThrow(TimeError);
    expect(() => ts.parse('yesterday')).toThrow(TimeError);
    expect(() => parseDurationS('7')).toThrow(TimeError);
    expect(parseDurationS('P7DT12H')).toBe(7.5 * 86400);
    expect(parseDurationS('90min')).toBe(5400);
    expect(parseDurationS('36h')).toBe(129600);
  });
});

describe('J2000.0', () => {
  it('2000-01-01T12:00:00 TT is ttJ2000S = 0, and 11:58:55.816 UTC (TAI − UTC = 32 s then; derived)', () => {
    expect(Math.abs(ts.parse('2000-01-01T12:00:00 TT').ttJ2000S)).toBeLessThan(1e-12); // binary noise of 0.184
    expect(Math.abs(ts.parse('2000-01-01T11:58:55.816Z').ttJ2000S)).toBeLessThan(1e-9);
  });
});
