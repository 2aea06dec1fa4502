/**
 * Time words `now`, `now+DURATION`, `now-DURATION` (contract, Version 2 "Times"). No published
 * source defines them; the checks are round trips against the ISO 8601 reader (the duration forms
 * `14d`, `36h` and ISO 8601 `P1DT12H` are the contract's), exact to the nanosecond, and the rule
 * that only the caller supplies the current time (the core reads no clock).
 */
import { describe, expect, it } from 'vitest';
import { TimeError } from '../src/errors.ts';
import { defaultTimeSystem } from '../src/io/tables.ts';

const base = defaultTimeSystem();
const now = base.parse('2027-03-01T12:00:00.250Z');
const ts = base.withNow(now);

describe('time words', () => {
  const cases: [string, number][] = [
    ['now', 0],
    ['NOW', 0],
    ['now+14d', 14 * 86400],
    ['now-36h', -36 * 3600],
    ['now + 90min', 5400],
    ['now+P1DT12H', 129600],
    ['now-0.5s', -0.5],
  ];
  for (const [text, offsetS] of cases) {
    it(`${text} is the given instant ${offsetS >= 0 ? '+' : ''}${offsetS} s`, () => {
      const got = ts.parse(text, '--from');
      const d = got.minusS(now) - offsetS;
      expect(Math.abs(d), `wanted now ${offsetS >= 0 ? '+' : ''}${offsetS} s, got now ${got.minusS(now)} s, difference ${d} s`).toBeLessThan(1e-9);
    });
  }

  it('crosses a leap second like any other instant (TAI arithmetic: 2016-12-31 had 86401 s)', () => {
    const before = base.withNow(base.parse('2016-12-31T12:00:00Z'));
    expect(before.format(before.parse('now+1d'))).toBe('2017-01-01T11:59:59.000Z');
  });

  it('an explicit nowInstant argument wins over the time system’s', () => {
    const other = base.parse('2030-01-01T00:00:00Z');
    expect(ts.parse('now+1d', 'x', other).minusS(other)).toBe(86400);
  });

  const bad: [string, string][] = [
    ['now+3x', 'cannot read the duration'],
    ['now+', 'cannot read time word'],
    ['now++2d', 'two signs'],
    ['now+-2d', 'two signs'],
    ['nowadays', 'cannot read time word'],
    ['now+5', 'cannot read the duration'],
  ];
  for (const [text, words] of bad) {
    it(`refuses ${JSON.stringify(text)} with the field and a fix`, () => {
      expect(() => ts.parse(text, '--to')).toThrow(TimeError);
      try {
        ts.parse(text, '--to');
      } catch (e) {
        expect((e as TimeError).message).toContain(words);
        expect((e as TimeError).where).toBe('--to');
        expect((e as TimeError).fix).toMatch(/now\+14d/);
      }
    });
  }

  it('without a current time (the core, a library caller that gave none) `now` is refused, never guessed', () => {
    expect(() => base.parse('now', 'window.start')).toThrow(/not available here/);
  });

  it('the current time is read once, at the first use of `now`, and then fixed', () => {
    let reads = 0;
    const lazy = base.withNow(() => {
      reads++;
      return now.plusS(reads);
    });
    expect(reads).toBe(0);
    lazy.parse('2027-01-01T00:00:00Z');
    expect(reads).toBe(0);
    const a = lazy.parse('now');
    const b = lazy.parse('now+1s');
    expect(reads).toBe(1);
    expect(b.minusS(a)).toBe(1);
  });
});
