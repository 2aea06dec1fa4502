/**
 * Measurement CSV reader (src/io/measurements.ts) against the file format of the tauplan public
 * interface, `/work/shared/contract.md` § `tauplan fit` (header `time,offsetNs[,sigmaNs]`), and its
 * error convention (§ Conventions: `<what> (<file>:<line>) — <fix>`). No external reference values.
 */
import { describe, expect, it } from 'vitest';
import { InputError } from '../src/errors.ts';
import { defaultTimeSystem } from '../src/io/tables.ts';
import { parseMeasurementsCsv } from '../src/io/measurements.ts';

const ts = defaultTimeSystem();
const FILE = 'clock.csv';

/** Parse and return the InputError's `where`, failing when nothing (or something else) is thrown. */
function whereOf(text: string): string {
  try {
    parseMeasurementsCsv(text, FILE, ts);
  } catch (e) {
    expect(e).toBeInstanceOf(InputError);
    return (e as InputError).where;
  }
  throw new Error(`no error for ${JSON.stringify(text)}`);
}

describe('good files', () => {
  it('reads rows with line numbers, times in any scale, BOM and spaces tolerated', () => {
    const text = '\ufeff time , offsetNs \n2027-01-01T00:00:00Z,1.5\n\n2027-01-01T00:01:00 GPS, -2e1\n';
    const { rows, hasSigma } = parseMeasurementsCsv(text, FILE, ts);
    expect(hasSigma).toBe(false);
    expect(rows.map((r) => r.line)).toEqual([2, 4]);
    expect(rows[1].offsetNs).toBe(-20);
    expect(rows[0].sigmaNs).toBeNull();
    // GPS = UTC + 18 s in 2027 (leap-second table): the GPS time is 42 s after the UTC one.
    expect(Math.abs(rows[1].ttJ2000S - rows[0].ttJ2000S - 42)).toBeLessThan(1e-6);
    expect(rows[1].timeText).toBe('2027-01-01T00:01:00 GPS');
  });

  it('reads the sigma column', () => {
    const { rows, hasSigma } = parseMeasurementsCsv('time,offsetNs,sigmaNs\r\n2027-01-01T00:00:00Z,1,0.5\r\n', FILE, ts);
    expect(hasSigma).toBe(true);
    expect(rows[0].sigmaNs).toBe(0.5);
  });
});

describe('bad input: InputError naming file:line', () => {
  const H = 'time,offsetNs\n';
  const cases: [string, string, string][] = [
    ['empty file', '', `${FILE}:1`],
    ['wrong header', 'date,offset\n2027-01-01T00:00:00Z,1\n', `${FILE}:1`],
    ['header in the wrong case', 'time,offsetns\n2027-01-01T00:00:00Z,1\n', `${FILE}:1`],
    ['header only', H, `${FILE}:2`],
    ['non-numeric offset', `${H}2027-01-01T00:00:00Z,1\n2027-01-01T00:01:00Z,abc\n`, `${FILE}:3`],
    ['empty offset', `${H}2027-01-01T00:00:00Z,\n`, `${FILE}:2`],
    ['hex offset', `${H}2027-01-01T00:00:00Z,0x10\n`, `${FILE}:2`],
    ['infinite offset', `${H}2027-01-01T00:00:00Z,Infinity\n`, `${FILE}:2`],
    ['bad time', `${H}2027-01-01T00:00:00Z,1\n2027-13-01T00:00:00Z,2\n`, `${FILE}:3`],
    ['time without a scale', `${H}2027-01-01T00:00:00,1\n`, `${FILE}:2`],
    ['zero sigma', 'time,offsetNs,sigmaNs\n2027-01-01T00:00:00Z,1,0\n', `${FILE}:2`],
    ['negative sigma', 'time,offsetNs,sigmaNs\n2027-01-01T00:00:00Z,1,0.5\n2027-01-01T00:01:00Z,1,-1\n', `${FILE}:3`],
    ['non-numeric sigma', 'time,offsetNs,sigmaNs\n2027-01-01T00:00:00Z,1,x\n', `${FILE}:2`],
    ['missing sigma field', 'time,offsetNs,sigmaNs\n2027-01-01T00:00:00Z,1\n', `${FILE}:2`],
    ['extra field', `${H}2027-01-01T00:00:00Z,1,2\n`, `${FILE}:2`],
    ['unsorted times', `${H}2027-01-01T00:01:00Z,1\n2027-01-01T00:00:00Z,2\n`, `${FILE}:3`],
    ['duplicate times', `${H}2027-01-01T00:00:00Z,1\n2027-01-01T00:00:00Z,2\n`, `${FILE}:3`],
    ['unclosed quote', `${H}"2027-01-01T00:00:00Z,1\n`, `${FILE}:2`],
  ];
  for (const [name, text, where] of cases) {
    it(name, () => expect(whereOf(text)).toBe(where));
  }

  it('unsorted and duplicate messages name both lines', () => {
    for (const text of [`${H}2027-01-01T00:01:00Z,1\n2027-01-01T00:00:00Z,2\n`, `${H}2027-01-01T00:00:00Z,1\n2027-01-01 00:00:00Z,2\n`]) {
      try {
        parseMeasurementsCsv(text, FILE, ts);
        throw new Error('no error');
      } catch (e) {
        expect(e).toBeInstanceOf(InputError);
        expect((e as InputError).where).toBe(`${FILE}:3`);
        expect((e as InputError).what).toMatch(/line 2/);
      }
    }
  });

  it('the wrong-header message shows the expected header', () => {
    try {
      parseMeasurementsCsv('t,x\n', FILE, ts);
      throw new Error('no error');
    } catch (e) {
      expect(e).toBeInstanceOf(InputError);
      expect((e as InputError).fix).toContain('time,offsetNs');
    }
  });
});
