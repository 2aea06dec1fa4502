/**
 * CCSDS TDM reader (src/io/tdm.ts) against CCSDS 503.0-B-2 "Tracking Data Message" (2020), KVN:
 * CLOCK_BIAS in s and CLOCK_DRIFT in s/s as data lines `KEYWORD = time value`, TIME_SYSTEM and
 * PARTICIPANT_n in the metadata, times in CCSDS ASCII time code A (calendar) or B (day of year).
 * The fixture is ours (tests/fixtures/tdm, invented spacecraft and station); expected values are
 * those written in it (confirmed by construction).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { InputError } from '../src/errors.ts';
import { pickSeries, readClockText } from '../src/io/clockFormats.ts';
import { defaultTimeSystem } from '../src/io/tables.ts';
import { fitSeries } from '../src/plan/clockFit.ts';

const ts = defaultTimeSystem();
const opts = { timeSystem: ts, wanted: null };
const TEXT = readFileSync('tests/fixtures/tdm/clock-bias.kvn', 'utf8');

function near(got: number, wanted: number, tol: number, what: string): void {
  const diff = got - wanted;
  expect(Math.abs(diff), `${what}: wanted ${wanted}, got ${got}, difference ${diff} (tolerance ${tol})`).toBeLessThanOrEqual(tol);
}

function errorOf(text: string): InputError {
  try {
    readClockText(text, 'x.kvn', opts);
  } catch (e) {
    if (e instanceof InputError) return e;
    throw e;
  }
  throw new Error('no InputError');
}

describe('KVN clock data', () => {
  const f = readClockText(TEXT, 'clock-bias.kvn', opts);
  const s = pickSeries(f, undefined);

  it('names the clock after PARTICIPANT_1, reads CLOCK_BIAS in s, includes the periodic term by convention', () => {
    expect(f.format).toBe('tdm');
    expect(s.clock).toBe('TSR-9');
    expect(s.periodicTerm).toBe('included');
    near(s.offsetNs[0], 1000, 1e-9, 'first bias [ns] (1e-6 s)');
    expect(s.timeScale).toBe('GPS');
  });
  it('reads the day-of-year time form: 2020-177 is 2020-06-25', () => {
    near(s.ttJ2000S[2] - s.ttJ2000S[0], 1200, 1e-6, 'third sample after the first [s]');
  });
  it('skips and counts a bias that is not a number; leaves RANGE out with a note', () => {
    expect(s.skipped).toBe(1);
    expect(s.offsetNs.length).toBe(4);
    expect(f.notes.join(' ')).toMatch(/RANGE ×1/);
  });
  it('reports CLOCK_DRIFT beside the fitted rate, which it matches here (1.2 ns per 600 s = 2e-12)', () => {
    near(s.statedDrift ?? Number.NaN, 2e-12, 1e-24, 'stated drift');
    const r = fitSeries(s, { degree: 1, timeSystem: ts, clipSigma: 0, trajectory: null });
    near(r.fractionalFrequency ?? Number.NaN, 2e-12, 1e-20, 'fitted y');
    expect(r.source?.statedDrift).toBe(s.statedDrift);
  });
});

describe('refusals', () => {
  it('a file that ends inside a data section', () => {
    const e = errorOf(TEXT.replace('DATA_STOP\n', ''));
    expect(e.what).toMatch(/ends inside a data section/);
  });
  it('a time system we do not read', () => {
    const e = errorOf(TEXT.replace('TIME_SYSTEM = GPS', 'TIME_SYSTEM = TCB'));
    expect(e.what).toMatch(/TIME_SYSTEM "TCB"/);
    expect(e.where).toMatch(/^x\.kvn:\d+$/);
  });
  it('times that go back', () => {
    const e = errorOf(TEXT.replace('2020-06-25T00:40:00', '2020-06-25T00:05:00'));
    expect(e.what).toMatch(/time goes back/);
  });
  it('an unknown version', () => {
    expect(errorOf(TEXT.replace('CCSDS_TDM_VERS = 2.0', 'CCSDS_TDM_VERS = 3.0')).what).toMatch(/version "3\.0"/);
  });
});
