/**
 * RINEX clock reader (src/io/rinexClock.ts) against the RINEX clock format descriptions ("RINEX
 * Extensions to Handle Clock Information", IGS: 2.00; the 3.04 and 3.05 documents): header labels
 * in columns 61–80 up to 3.02 and 66–85 from 3.04, 4- or 9-character names, AR/AS records with
 * continuation lines, TIME SYSTEM ID with GPS as the default. Fixtures are our own files in
 * tests/fixtures/rinex-clock (see its README); the expected values below are the ones written in
 * them (confirmed by construction). Real files from ../shared/realdata are read where present.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { InputError } from '../src/errors.ts';
import { pickSeries, readClockFile, readClockText } from '../src/io/clockFormats.ts';
import { defaultTimeSystem } from '../src/io/tables.ts';
import { realDescribe, real } from './helpers/realdata.ts';

const ts = defaultTimeSystem();
const FIX = 'tests/fixtures/rinex-clock';
const opts = { timeSystem: ts, wanted: null };

function read(name: string, text = readFileSync(`${FIX}/${name}`, 'utf8')) {
  return readClockText(text, name, opts);
}

function errorOf(f: () => unknown): InputError {
  try {
    f();
  } catch (e) {
    if (e instanceof InputError) return e;
    throw e;
  }
  throw new Error('no InputError thrown');
}

/** Wanted, got and difference in one message. */
function near(got: number, wanted: number, tol: number, what: string): void {
  const diff = got - wanted;
  expect(Math.abs(diff), `${what}: wanted ${wanted}, got ${got}, difference ${diff} (tolerance ${tol})`).toBeLessThanOrEqual(tol);
}

const VERSIONS = [
  { file: 'v200.clk', station: 'STA1', scale: 'GPS' },
  { file: 'v300.clk', station: 'STA1', scale: 'GPS' },
  { file: 'v302.clk', station: 'STA1', scale: 'GST' },
  { file: 'v304.clk', station: 'STA100XXX', scale: 'GPS' },
  { file: 'v305.clk', station: 'STA100XXX', scale: 'UTC' },
] as const;

describe('one fixture per version, same values', () => {
  for (const v of VERSIONS) {
    it(`${v.file}: clocks, values, continuation lines and time system`, () => {
      const f = read(v.file);
      expect(f.format).toBe('rinex-clock');
      expect(f.clocks).toEqual([v.station, 'G01', 'E14']);
      const sta = pickSeries(f, v.station);
      expect(sta.kind).toBe('receiver');
      const g01 = pickSeries(f, 'G01');
      expect(g01.kind).toBe('satellite');
      expect(g01.periodicTerm).toBe('excluded');
      // Values as written (s → ns); tolerance 1e-9 ns: decimal parsing only.
      const wantG01 = [100000, 100000.015, 100000.03];
      g01.offsetNs.forEach((x, i) => near(x, wantG01[i], 1e-9, `G01 sample ${i}`));
      const e14 = pickSeries(f, 'E14');
      const wantE14 = [-1061352.898, -1061352.9, -1061352.902];
      e14.offsetNs.forEach((x, i) => near(x, wantE14[i], 1e-9, `E14 sample ${i}`));
      near(e14.sigmaNs?.[0] ?? Number.NaN, 0.034, 1e-12, 'E14 sigma');
      // Epochs: 2020-06-25 00:00:00 in the file's time system (GST and GPS share TAI − 19 s; from memory).
      const scale = v.scale === 'UTC' ? 'Z' : v.scale === 'GST' ? ' GST' : ' GPS';
      const t0 = ts.parse(`2020-06-25T00:00:00${scale}`).ttJ2000S;
      near(g01.ttJ2000S[0], t0, 1e-6, 'first epoch [s]');
      near(g01.ttJ2000S[2] - g01.ttJ2000S[0], 60, 1e-9, 'spacing [s]');
      expect(g01.timeScale).toBe(v.scale);
    });
  }
});

describe('refusals: one-line errors with file and line', () => {
  const base = readFileSync(`${FIX}/v304.clk`, 'utf8');
  const lines = base.split('\n');
  const header = lines.findIndex((l) => l.includes('END OF HEADER'));

  it('an unknown version', () => {
    const e = errorOf(() => read('x.clk', base.replace(/^3\.04/, '3.03')));
    expect(e.what).toMatch(/version "3\.03" is not read/);
    expect(e.where).toBe('x.clk:1');
  });
  it('a header without END OF HEADER', () => {
    const e = errorOf(() => read('x.clk', lines.slice(0, header).join('\n')));
    expect(e.what).toMatch(/no END OF HEADER/);
  });
  it('a record type that is not read (CR)', () => {
    const text = [...lines.slice(0, header + 1), 'CR STA100XXX 2020 06 25 00 00  0.000000  2   0.1E+00   0.1E-01', ...lines.slice(header + 1)].join('\n');
    const e = errorOf(() => read('x.clk', text));
    expect(e.what).toMatch(/record type CR/);
    expect(e.where).toBe(`x.clk:${header + 2}`);
  });
  it('a truncated record (the continuation line lost)', () => {
    const cont = lines.findIndex((l, i) => i > header && /^\s+\d/.test(l));
    const text = [...lines.slice(0, cont), ...lines.slice(cont + 1)].join('\n');
    const e = errorOf(() => read('x.clk', text));
    expect(e.what).toMatch(/announces 4 values but has 2/);
    expect(e.where).toBe(`x.clk:${cont}`);
  });
  it('times that go back or repeat, per clock', () => {
    const g = lines.filter((l) => l.startsWith('AS G01'));
    const back = [...lines.slice(0, header + 1), g[1], g[0]].join('\n');
    expect(errorOf(() => read('x.clk', back)).what).toMatch(/G01: time goes back/);
    const repeat = [...lines.slice(0, header + 1), g[0], g[0]].join('\n');
    expect(errorOf(() => read('x.clk', repeat)).what).toMatch(/G01: time repeats/);
  });
  it('a clock that is not in the file, listing those that are', () => {
    const e = errorOf(() => pickSeries(read('v304.clk'), 'E99'));
    expect(e.what).toMatch(/E99/);
    expect(e.fix).toMatch(/STA100XXX, G01, E14/);
  });
  it('a bad value inside a good file is skipped and counted, not fatal', () => {
    const g = lines.findIndex((l) => l.startsWith('AS G01'));
    const bad = lines.map((l, i) => (i === g ? l.replace('0.100000000000E-03', '0.1000000000XXE-03') : l)).join('\n');
    const s = pickSeries(read('x.clk', bad), 'G01');
    expect(s.skipped).toBe(1);
    expect(s.skippedLines).toEqual([g + 1]);
    expect(s.offsetNs.length).toBe(2);
  });
});

realDescribe('real RINEX clock files', ['format-samples/COD20352.CLK', 'format-samples/rinex_clock_304_igs_2017-03-11_excerpt.txt', 'igs-2020-06-25/GRG0MGXFIN_20201770000_01D_30S_CLK_extract9.clk.gz'], () => {
  it('2.00 (CODE): AR and AS clocks at 30 s', async () => {
    const f = await readClockFile(real('format-samples/COD20352.CLK'), opts);
    const kinds = new Set([...f.series.values()].map((s) => s.kind));
    expect(kinds).toEqual(new Set(['receiver', 'satellite']));
    const sat = [...f.series.values()].find((s) => s.kind === 'satellite' && s.ttJ2000S.length > 2);
    expect(sat).toBeDefined();
    near((sat?.ttJ2000S[1] ?? 0) - (sat?.ttJ2000S[0] ?? 0), 30, 1e-6, 'spacing [s] (README: 30 s)');
  });
  it('3.04 (IGS combination): 9-character station names, labels in column 66', async () => {
    const f = await readClockFile(real('format-samples/rinex_clock_304_igs_2017-03-11_excerpt.txt'), opts);
    expect(f.clocks.some((c) => c.length === 9)).toBe(true);
    expect(f.notes[0]).toMatch(/RINEX clock 3\.04/);
  });
  it('3.00 gzip extract: the nine satellites the README lists, a day at 30 s', async () => {
    const f = await readClockFile(real('igs-2020-06-25/GRG0MGXFIN_20201770000_01D_30S_CLK_extract9.clk.gz'), opts);
    const withData = [...f.series.values()].filter((s) => s.ttJ2000S.length > 0).map((s) => s.clock);
    expect(withData.sort()).toEqual(['E01', 'E02', 'E11', 'E14', 'E18', 'G01', 'G02', 'G05', 'R01']);
    expect(pickSeries(f, 'E14').ttJ2000S.length).toBe(2880);
  });
});
