/**
 * Command-line options are refused the same way wherever they appear (src/cli/options.ts), and text
 * from inputs is shown safely (src/report/safeText.ts, src/report/csv.ts). Checked against the error
 * contract of the tauplan public interface (`/work/shared/contract.md` § Conventions: exit 2, one
 * line naming the option), the ranges the scenario schema gives the same quantities (0 ≤ e < 1,
 * 0 ≤ i ≤ 180°), IEEE 754 (1e309 overflows to Infinity), Unicode TR 9 (the bidirectional controls
 * U+202A–U+202E and U+2066–U+2069) and the OWASP advice on CSV injection (cells starting with = + − @
 * are formulas). Every expectation is common practice for these interfaces, not a reference value.
 */
import { describe, expect, it } from 'vitest';
import { mergeShardTexts } from '../src/cli/commands/merge.ts';
import { checkNumberOption, refuseCatalogueOptionsWithoutAll, refuseRepeatedOptions } from '../src/cli/options.ts';
import { checkEpochNearData } from '../src/api/fitFile.ts';
import { nameList } from '../src/api/scenario.ts';
import { InputError } from '../src/errors.ts';
import { safeCsvCell, toCsv } from '../src/report/csv.ts';
import { escapeUnsafeText } from '../src/report/safeText.ts';
import { ONE_LINE_ERROR, runCli } from './helpers/cli.ts';

function inputErrorOf(f: () => unknown): InputError {
  try {
    f();
  } catch (e) {
    if (e instanceof InputError) return e;
    throw e;
  }
  throw new Error('expected an InputError, got none');
}

describe('an option given twice is refused, for every option', () => {
  it.each([
    [['time', 'x', '--format', 'json', '--format', 'json']],
    [['size', '--out', 'a', '--out', 'b']],
    [['size', '--out=a', '--out', 'b']],
    [['passes', 's.yaml', '--quiet', '--quiet']],
    [['passes', 's.yaml', '--quiet', '--no-quiet']],
  ])('%j', (args) => {
    const e = inputErrorOf(() => refuseRepeatedOptions(args));
    expect(e.what).toMatch(/^--\S+ is given more than once$/);
  });

  it('options given once, and values after --, are fine', () => {
    expect(() => refuseRepeatedOptions(['size', '--a-km', '7000', '--e', '0.01', '--', '--e'])).not.toThrow();
  });

  it('through the CLI: exit 2, one line, no silent switch to text', () => {
    const r = runCli(['time', '2027-01-01T00:00:00Z', '--format', 'json', '--format', 'csv']);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(ONE_LINE_ERROR);
    expect(r.stdout).toBe('');
  });
});

describe('number options: finite and in range', () => {
  it.each([
    ['a-km', Infinity, '1e309', 'not a finite number'],
    ['nominal-hz', Infinity, 'Infinity', 'not a finite number'],
    ['a-km', NaN, 'abc', 'is not a number'],
    ['i-deg', 720, '720', 'out of range'],
    ['i-deg', -1, '-1', 'out of range'],
    ['e', 1, '1', 'out of range'],
    ['a-km', 0, '0', 'out of range'],
    ['nominal-hz', -10.23e6, '-10.23e6', 'out of range'],
    ['points', 2.5, '2.5', 'whole number'],
    ['degree', 3, '3', 'out of range'],
  ])('--%s %s is refused, naming the option', (key, value, raw, what) => {
    const e = inputErrorOf(() => checkNumberOption(key, value, raw));
    expect(e.what).toContain(what);
    expect(e.where).toBe(`--${key}`);
  });

  it.each([
    ['i-deg', 180],
    ['i-deg', 0],
    ['e', 0.999],
    ['a-km', 26561.75],
    ['altitude-km', -100],
    ['raan-deg', -45],
    ['nominal-hz', 10.23e6],
  ])('--%s %s is accepted', (key, value) => {
    expect(() => checkNumberOption(key, value, String(value))).not.toThrow();
  });

  it('through the CLI: --a-km 1e309 says "not a finite number", --i-deg 720 is refused', () => {
    for (const [args, what] of [
      [['size', '--a-km', '1e309'], 'not a finite number'],
      [['size', '--a-km', '7000', '--i-deg', '720'], 'out of range'],
    ] as const) {
      const r = runCli([...args, '--quiet']);
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(ONE_LINE_ERROR);
      expect(r.stderr).toContain(what);
      expect(r.stderr).not.toContain('internal fault');
    }
  });
});

describe('lists and catalogue-only options', () => {
  it('--station "," and "A,,B" name nothing or an empty id; "A, B" is two ids', () => {
    expect(inputErrorOf(() => nameList(',', '--station', 'station')).what).toContain('names no station');
    expect(inputErrorOf(() => nameList('A,,B', '--station', 'station')).what).toContain('empty name');
    expect(nameList('A, B', '--station', 'station')).toEqual(['A', 'B']);
  });

  it('--shard, --strict and --jobs without --all are refused; with --all they pass', () => {
    for (const extra of [{ shard: '1/2' }, { strict: true }, { jobs: 2 }]) {
      expect(inputErrorOf(() => refuseCatalogueOptionsWithoutAll(extra)).fix).toContain('--all');
      expect(() => refuseCatalogueOptionsWithoutAll({ ...extra, all: true })).not.toThrow();
    }
  });
});

describe('fit --epoch near the data', () => {
  const day = 86_400;
  const iso = (t: number): string => `t=${t}`;
  it('inside the span, or within the span length (at least a day) of it, is fine; further out is refused', () => {
    expect(() => checkEpochNearData(0.5 * day, 0, day, iso)).not.toThrow();
    expect(() => checkEpochNearData(1.9 * day, 0, day, iso)).not.toThrow();
    expect(() => checkEpochNearData(-0.9 * day, 0, 0.1 * day, iso)).not.toThrow();
    const e = inputErrorOf(() => checkEpochNearData(30 * day, 0, 10 * day, iso));
    expect(e.what).toContain('20.0 days outside the data');
    expect(e.where).toBe('--epoch');
  });
});

describe('text from inputs is shown safely', () => {
  const RLO = '\u202E';
  const LRI = '\u2066';
  it('bidirectional controls and terminal escapes are shown as \\uXXXX in text; tab and newline stay', () => {
    expect(escapeUnsafeText(`SAT${RLO}1-PSG\tok\n`)).toBe('SAT\\u202e1-PSG\tok\n');
    expect(escapeUnsafeText(`${LRI}x\u2069 \u001b[31mred`)).toBe('\\u2066x\\u2069 \\u001b[31mred');
  });

  it('in CSV too, and formula cells get an apostrophe while numbers stay numbers', () => {
    const csv = toCsv(['name', 'value'], [[`=HYPERLINK("x")${RLO}`, -4.4647e-10]]);
    expect(csv).toContain(`'=HYPERLINK(""x"")\\u202e`);
    expect(csv).toContain('-4.4647e-10');
    expect(safeCsvCell('-4.4647e-10')).toBe('-4.4647e-10');
    expect(safeCsvCell('+12')).toBe('+12');
    expect(safeCsvCell('-cmd|calc')).toBe("'-cmd|calc");
    expect(safeCsvCell('@SUM(A1)')).toBe("'@SUM(A1)");
  });

  it('merge neutralises a formula cell edited into a shard, and keeps negative numbers', () => {
    const head = 'satellite,meanFractionalOffset,index,name\n';
    const merged = mergeShardTexts([
      { name: 'a.csv', text: `${head}1,-4.4647e-10,0,=1+1\n` },
      { name: 'b.csv', text: `${head}2,3.5e-11,1,${RLO}B\n` },
    ]);
    expect(merged.split('\n')).toEqual([head.trimEnd(), "1,-4.4647e-10,0,'=1+1", '2,3.5e-11,1,\\u202eB', '']);
  });
});
