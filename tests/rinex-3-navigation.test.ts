/**
 * RINEX 3 navigation files (RINEX: The Receiver Independent Exchange Format, version 3.05, IGS/RTCM
 * 2020; §5.3 and Tables A6 "GPS navigation message", A8 "Galileo navigation message"): a record is
 * a first line (satellite, toc `yyyy mm dd hh mm ss`, af0, af1, af2) and seven broadcast-orbit
 * lines of four D19.12 fields. Field order (confirmed from the format's own record example and
 * table): line 1 IODE Crs Δn M0; line 2 Cuc e Cus √A; line 3 toe Cic Ω0 Cis; line 4 i0 Crc ω Ω̇;
 * line 5 IDOT, L2 codes (GPS) or data sources (Galileo), week, spare; line 6 accuracy, health, TGD,
 * IODC (GPS) or BGDs (Galileo); line 7 transmission time, fit interval (GPS, hours).
 * Fixtures: tests/fixtures/rinex-nav (invented). Real file: ../shared/realdata (skipped when absent).
 */
import { existsSync, readFileSync } from 'node:fs';
import { gunzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { OrbitFileError } from '../src/errors.ts';
import { parseRinexNav } from '../src/io/rinexNav.ts';
import { defaultTimeSystem } from '../src/io/tables.ts';
import { Instant } from '../src/time/instant.ts';

const ts = defaultTimeSystem();
const FIX = 'tests/fixtures/rinex-nav';
const read = (name: string): string => readFileSync(`${FIX}/${name}`, 'utf8');
const REAL = '../shared/realdata/igs-2020-06-25/MOJN00DNK_R_20201770000_01D_MN.rnx.gz';

describe('RINEX 3.05 navigation records (invented fixture)', () => {
  const f = parseRinexNav(read('invented-mixed-305.rnx'), 'invented-mixed-305.rnx', ts);

  it('reads the GPS and Galileo records, skips and counts GLONASS and the record with a blank field', () => {
    expect(f.version).toBe(3.05);
    expect(f.records.map((r) => r.satellite)).toEqual(['G31', 'E35']);
    expect(f.skippedOtherSystems).toEqual({ R: 1 });
    expect(f.skippedIncomplete).toBe(1);
    expect(f.firstIncompleteLine).toBe(27); // G30's first line: after 5 header, 8 GPS, 5 GLONASS and 8 Galileo lines
  });

  it('places each field as Table A6 lists it (GPS)', () => {
    const g = f.records[0];
    expect(ts.format(Instant.fromTtJ2000S(g.tocTtJ2000S), 'GPS')).toBe('2027-01-04T02:00:00.000 GPS');
    expect([g.af0S, g.af1, g.af2PerS]).toEqual([1.234567890123e-5, -2.5e-12, 0]);
    expect([g.deltaNRadPerS, g.m0Rad, g.e, g.sqrtAM]).toEqual([4.5e-9, 0.75, 0.0125, 5153.65]);
    // toe 93 600 s of week 2452 is the same instant as toc (Monday 02:00 GPST).
    expect(g.toeTtJ2000S).toBe(g.tocTtJ2000S);
    expect(g.transmissionTtJ2000S - g.tocTtJ2000S).toBe(86_400 - 93_600);
    expect(g.fitIntervalS).toBe(4 * 3600);
    expect(g.health).toBe(0);
  });

  it('places each field as Table A8 lists it (Galileo: GST toc, data sources, no fit interval)', () => {
    const e = f.records[1];
    expect(ts.format(Instant.fromTtJ2000S(e.tocTtJ2000S), 'GST')).toBe('2027-01-04T02:10:00.000 GST');
    expect(e.af0S).toBe(-6.5e-4);
    expect(e.dataSources).toBe(258);
    expect(e.fitIntervalS).toBeNull();
    expect(e.toeTtJ2000S - e.tocTtJ2000S).toBe(0);
  });

  it('accepts D exponents, LF line ends and version 3.02', () => {
    const text = read('invented-v302.rnx').replace('-6.500000000000e-04', '-6.500000000000D-04');
    const g = parseRinexNav(text, 'v302', ts);
    expect(g.version).toBe(3.02);
    expect(g.records[0].af0S).toBe(-6.5e-4);
  });

  it('refuses versions 2.11 and 4.00 at line 1', () => {
    for (const name of ['invented-v211.rnx', 'invented-v400.rnx']) {
      expect(() => parseRinexNav(read(name), name, ts)).toThrow(OrbitFileError);
      expect(() => parseRinexNav(read(name), name, ts)).toThrow(/version .* is not supported/);
    }
  });

  it('refuses an observation file (type O) and a file with no END OF HEADER', () => {
    const obs = read('invented-v302.rnx').replace('N: GNSS NAV DATA', 'O: OBSERVATION   ');
    expect(() => parseRinexNav(obs, 'obs', ts)).toThrow(/not N/);
    const cut = read('invented-v302.rnx').split('\n').slice(0, 3).join('\n');
    expect(() => parseRinexNav(cut, 'cut', ts)).toThrow(/END OF HEADER/);
  });
});

describe('RINEX 3.05 navigation: a real mixed file (MOJN, 2020-06-25)', () => {
  const present = existsSync(REAL);
  if (!present) console.warn(`SKIPPED: ${REAL} is absent (real data lives outside the repository)`);
  it.skipIf(!present)('reads every GPS and Galileo record and counts the other systems', () => {
    const text = gunzipSync(readFileSync(REAL)).toString('utf8');
    const f = parseRinexNav(text, REAL, ts);
    // Counted independently: first lines starting with the system letter after END OF HEADER.
    const body = text.slice(text.indexOf('END OF HEADER')).split('\n').slice(1);
    const count = (c: string): number => body.filter((l) => new RegExp(`^${c}\\d\\d `).test(l)).length;
    expect(f.records.filter((r) => r.system === 'gps').length).toBe(count('G'));
    expect(f.records.filter((r) => r.system === 'galileo').length).toBe(count('E'));
    expect(f.skippedOtherSystems).toEqual({ C: count('C'), J: count('J'), R: count('R'), S: count('S') });
    expect(f.skippedIncomplete).toBe(0);
  });
});
