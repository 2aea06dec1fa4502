/**
 * Reading a leap-second table in the layout of IERS Leap_Second.dat (IERS Bulletin C service;
 * layout from memory: "#  File expires on D Month YYYY" and rows "MJD day month year TAI-UTC").
 * The rows are the confirmed values (TAI − UTC = 37 s since 2017-01-01, physics.md §5); the expiry
 * in the fixture is invented for the test.
 */
import { describe, expect, it } from 'vitest';
import { parseIersLeapSecondDat, readLeapFile } from '../src/io/tables.ts';
import { LeapSecondTable } from '../src/time/leapSeconds.ts';
import { TimeSystem } from '../src/time/timeSystem.ts';
import { InputError } from '../src/errors.ts';
import { runCli } from './helpers/cli.ts';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const FIXTURE = 'tests/fixtures/iers-leap-seconds/Leap_Second.dat';

describe('IERS Leap_Second.dat', () => {
  it('reads rows and expiry into the same table as the packaged one', () => {
    const data = readLeapFile(FIXTURE);
    expect(data.expiresUtc).toBe('2027-06-28');
    expect(data.rows[0]).toEqual(['1972-01-01', 10]);
    expect(data.rows.at(-1)).toEqual(['2017-01-01', 37]);
    const ts = new TimeSystem(new LeapSecondTable(data));
    expect(ts.format(ts.parse('2016-12-31T23:59:60.5Z'), 'TAI')).toBe('2017-01-01T00:00:36.500 TAI');
  });

  it('refuses a file without an expiry line or with a broken row, naming the line', () => {
    expect(() => parseIersLeapSecondDat('    41317.0    1  1 1972       10\n', 'x.dat')).toThrow(/expires/);
    try {
      parseIersLeapSecondDat('#  File expires on 28 June 2027\n    41317.0    1  1 1972\n', 'x.dat');
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(InputError);
      expect((e as InputError).where).toBe('x.dat:2');
    }
  });

  it('--leap-seconds moves the expiry warning', () => {
    // The packaged table expires on 2027-06-28 (IERS Bulletin C 72, July 2026; see data/leap-seconds.json).
    const before = runCli(['time', '2027-08-01T00:00:00Z']);
    expect(before.stderr).toMatch(/warning: times past the leap-second table's expiry \(2027-06-28\)/);
    const dir = mkdtempSync(join(tmpdir(), 'tauplan-leap-'));
    const later = join(dir, 'later.json');
    writeFileSync(later, JSON.stringify({ ...readLeapFile(FIXTURE), source: 'test table', expiresUtc: '2028-06-28' }));
    const after = runCli(['time', '2027-08-01T00:00:00Z', '--leap-seconds', later]);
    expect(after.code).toBe(0);
    expect(after.stderr).toBe('');
    const late = runCli(['time', '2028-08-01T00:00:00Z', '--leap-seconds', later]);
    expect(late.stderr).toMatch(/expiry \(2028-06-28\)/);
    rmSync(dir, { recursive: true, force: true });
  });

  it('warns only when a conversion falls past the expiry, once, and carries the warning into the output', () => {
    const inside = runCli(['time', '2027-03-01T00:00:00Z', '--format', 'json']);
    expect(inside.stderr).toBe('');
    expect(JSON.parse(inside.stdout).notes ?? []).toEqual([]);
    const past = runCli(['time', '2027-08-01T00:00:00Z', '--format', 'json']);
    expect(past.stderr.match(/warning/g)?.length).toBe(1);
    expect(JSON.parse(past.stdout).notes.join(' ')).toMatch(/leap-second table expires/);
  });
});
