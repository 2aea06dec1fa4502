/**
 * Inputs that are big, odd or of the wrong kind never hang, never crash the heap, and good real-world
 * text (BOM, gzip, a pipe) is accepted. Behaviour checked against POSIX and Linux interfaces
 * (open(2) with O_NONBLOCK on a FIFO returns at once; /dev/zero never ends), the Unicode Standard
 * §23.8 (U+FEFF at the start of UTF-8 is a byte order mark, not text), RFC 1952 §2.3.1 (gzip magic
 * 1f 8b), RFC 8259 §4 (duplicate names), YAML 1.2 §9.2 (a stream of several documents), and ITU-R
 * TF.460-6 §2.1 (a leap second is the last second of a month; TAI − UTC was 10 s on 1972-01-01,
 * confirmed against IERS Leap_Second.dat). Every expectation is common practice for these
 * interfaces, not a reference value.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, truncateSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { afterAll, describe, expect, it } from 'vitest';
import { InputError } from '../src/errors.ts';
import { INPUT_SIZE_CAPS, readInputText, readLinesSync, readTextLines } from '../src/io/textSource.ts';
import { parseScenarioText } from '../src/io/scenario.ts';
import { parseIersLeapSecondDat, readLeapFile } from '../src/io/tables.ts';
import { defaultTimeSystem } from '../src/io/tables.ts';
import { ONE_LINE_ERROR, runCli } from './helpers/cli.ts';

const tmp = mkdtempSync(join(tmpdir(), 'tauplan-input-limits-'));
afterAll(() => rmSync(tmp, { recursive: true, force: true }));
const SCENARIO_TEXT = readFileSync('data/demo/tessera.yaml', 'utf8');

/** The InputError that `f` throws (fails the test when it throws something else, or nothing). */
function inputErrorOf(f: () => unknown): InputError {
  try {
    f();
  } catch (e) {
    if (e instanceof InputError) return e;
    throw e;
  }
  throw new Error('expected an InputError, got none');
}

describe('special files: refused or read without blocking', () => {
  it('/dev/zero is refused at once as a device (never read to the end)', () => {
    const t0 = Date.now();
    const e = inputErrorOf(() => readInputText('/dev/zero', '--tle', 'elements'));
    expect(e.what).toContain('is a device');
    expect(Date.now() - t0).toBeLessThan(2000);
  });

  it('a FIFO with no writer reads as empty at once instead of waiting for one', () => {
    const fifo = join(tmp, 'nowriter');
    if (spawnSync('mkfifo', [fifo]).status !== 0) {
      console.warn('input-limits: mkfifo is not available here; FIFO check skipped');
      return;
    }
    const t0 = Date.now();
    expect(readInputText(fifo, 'scenario', 'scenario')).toBe('');
    expect(Date.now() - t0).toBeLessThan(2000);
  });

  it('the line readers (synchronous and streaming) refuse /dev/zero and end on a writer-less FIFO at once too', async () => {
    const t0 = Date.now();
    expect(inputErrorOf(() => [...readLinesSync('/dev/zero', 'orbit', '--orbit')]).what).toContain('is a device');
    let streamed: unknown = null;
    try {
      for await (const l of readTextLines('/dev/zero', 'measurements', 'measurements')) void l;
    } catch (e) {
      streamed = e;
    }
    expect(streamed).toBeInstanceOf(InputError);
    const fifo = join(tmp, 'nowriter-lines');
    if (spawnSync('mkfifo', [fifo]).status === 0) {
      expect([...readLinesSync(fifo, 'orbit', '--orbit')]).toEqual([]);
      const got: string[] = [];
      for await (const l of readTextLines(fifo, 'measurements', 'measurements')) got.push(l.text);
      expect(got).toEqual([]);
    }
    expect(Date.now() - t0).toBeLessThan(2000);
  });

  it('a FIFO with no writer given to fit is refused as empty within two seconds (one line, exit 2)', () => {
    const fifo = join(tmp, 'nowriter-fit');
    if (spawnSync('mkfifo', [fifo]).status !== 0) return;
    const t0 = Date.now();
    const r = runCli(['fit', fifo]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(ONE_LINE_ERROR);
    expect(r.stderr).toContain('empty');
    // The CLI's own start-up (tsx) is included: generous, yet far below a hang.
    expect(Date.now() - t0).toBeLessThan(15_000);
  });

  it('a folder is named as a folder', () => {
    expect(inputErrorOf(() => readInputText(tmp, 'scenario', 'scenario')).what).toContain('is a folder');
  });
});

describe('size caps per kind of input', () => {
  it('a file past the cap is refused from its size alone, as "file too large"', () => {
    // A sparse file: its size is past the cap, no disk space is used and nothing is read.
    const big = join(tmp, 'huge.yaml');
    writeFileSync(big, '');
    truncateSync(big, INPUT_SIZE_CAPS.scenario + 1);
    const t0 = Date.now();
    const e = inputErrorOf(() => readInputText(big, 'scenario', 'scenario'));
    expect(e.what).toMatch(/^file too large for a scenario file/);
    expect(e.fix).not.toContain('check the path');
    expect(Date.now() - t0).toBeLessThan(2000);
  });

  it('a gzip bomb is stopped at the cap of its kind', () => {
    const bomb = join(tmp, 'bomb.tle.gz');
    writeFileSync(bomb, gzipSync(Buffer.alloc(INPUT_SIZE_CAPS.table + 1024, 0x20)));
    expect(inputErrorOf(() => readInputText(bomb, '--leap-seconds', 'table')).what).toMatch(/^file too large/);
    // Element sets stream line by line, and the cap holds there too.
    const tleBomb = join(tmp, 'bomb2.tle.gz');
    writeFileSync(tleBomb, gzipSync(Buffer.alloc(INPUT_SIZE_CAPS.scenario + 1024, 0x0a)));
    expect(inputErrorOf(() => [...readLinesSync(tleBomb, 'scenario', '--scenario')]).what).toMatch(/^file too large for a scenario file/);
  });

  it('a streamed plain file that grows past its cap while read is stopped at the cap', () => {
    // A FIFO has no size to check first: the cap applies to the bytes as they arrive.
    const fifo = join(tmp, 'endless');
    if (spawnSync('mkfifo', [fifo]).status !== 0) return;
    const r = spawnSync('sh', ['-c', `head -c ${INPUT_SIZE_CAPS.table + 4096} /dev/zero | tr '\\0' 'x' > ${fifo} & node bin/tauplan.mjs time 2027-01-01T00:00:00Z --leap-seconds ${fifo}; wait`], { encoding: 'utf8' });
    expect(r.stderr).toMatch(ONE_LINE_ERROR);
    expect(r.stderr).toContain('file too large');
  });

  it('every cap stays below the longest string V8 holds (2^29 − 24 UTF-16 units, ERR_STRING_TOO_LONG)', () => {
    for (const cap of Object.values(INPUT_SIZE_CAPS)) expect(cap).toBeLessThan(2 ** 29 - 24);
  });
});

describe('encodings', () => {
  it('a UTF-8 BOM is accepted in scenarios, element sets and leap-second tables', () => {
    const bomScenario = join(tmp, 'bom.yaml');
    writeFileSync(bomScenario, `\uFEFF${SCENARIO_TEXT}`);
    expect(readInputText(bomScenario, 'scenario', 'scenario')).toBe(SCENARIO_TEXT);
    const tle = join(tmp, 'bom.tle');
    writeFileSync(tle, '\uFEFFTESSERA 2\n1 90102U 27001B   27004.00000000  .00000000  00000-0  00000-0 0    19\n2 90102  55.0000  20.0000 0105000 200.0000 180.0000  2.00567544    06\n');
    const r = runCli(['size', '--tle', tle, '--span', '1h', '--format', 'json', '--quiet']);
    expect(r.stderr).toBe('');
    expect(JSON.parse(r.stdout).satellite).toBe('90102');
    const leap = join(tmp, 'bom-leap.dat');
    writeFileSync(leap, `\uFEFF${readFileSync('tests/fixtures/iers-leap-seconds/Leap_Second.dat', 'utf8')}`);
    expect(readLeapFile(leap).rows.at(-1)).toEqual(['2017-01-01', 37]);
  });

  it('UTF-16 (with or without its BOM) is refused with "save the file as UTF-8"', () => {
    const le = join(tmp, 'u16le.yaml');
    writeFileSync(le, Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(SCENARIO_TEXT, 'utf16le')]));
    const noBom = join(tmp, 'u16nobom.yaml');
    writeFileSync(noBom, Buffer.from(SCENARIO_TEXT, 'utf16le'));
    for (const f of [le, noBom]) expect(inputErrorOf(() => readInputText(f, 'scenario', 'scenario')).fix).toBe('save the file as UTF-8');
  });

  it('a gzip-compressed input is read as its text', () => {
    const gz = join(tmp, 'scenario.yaml.gz');
    writeFileSync(gz, gzipSync(SCENARIO_TEXT));
    expect(readInputText(gz, 'scenario', 'scenario')).toBe(SCENARIO_TEXT);
  });
});

describe('standard input and pipes', () => {
  it('/dev/stdin is read (once, even when the command reads its scenario twice)', () => {
    const r = runCli(['passes', '/dev/stdin', '--quiet', '--format', 'json'], { input: SCENARIO_TEXT });
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    expect(JSON.parse(r.stdout).passes.length).toBeGreaterThan(0);
  });

  it('a FIFO given a writer is read to its end', () => {
    const fifo = join(tmp, 'withwriter');
    if (spawnSync('mkfifo', [fifo]).status !== 0) return;
    // A writer holds the FIFO open while the CLI reads it (as a shell's process substitution does).
    const writer = spawnSync('sh', ['-c', `cat data/demo/tessera.yaml > ${fifo} & node bin/tauplan.mjs size --scenario ${fifo} --sat TSR-1 --span 1h --format json --quiet; wait`], { encoding: 'utf8' });
    expect(writer.stderr).toBe('');
    expect(JSON.parse(writer.stdout).satellite).toBe('TSR-1');
  });
});

describe('scenario structure', () => {
  const ts = defaultTimeSystem();
  it('a JSON key given twice is refused at its line, like YAML', () => {
    const json = '{\n "name": "a",\n "name": "b",\n "window": { "start": "2027-01-01T00:00:00Z", "end": "2027-01-02T00:00:00Z" }, "satellites": []\n}\n';
    const e = inputErrorOf(() => parseScenarioText(json, 'dup.json', ts));
    expect(e.what).toContain('"name" is given twice');
    expect(e.where).toBe('dup.json:3');
  });

  it('a nested duplicate is found too, and the same key in two different objects is fine', () => {
    const ok = '{"window": {"start": "2027-01-01T00:00:00Z", "end": "2027-01-02T00:00:00Z"}, "satellites": [{"id": "A", "orbit": {"keplerian": {"epoch": "2027-01-01T00:00:00Z", "aKm": 7000, "e": 0, "iDeg": 50, "raanDeg": 0, "argpDeg": 0, "meanAnomalyDeg": 0}}}, {"id": "B", "orbit": {"keplerian": {"epoch": "2027-01-01T00:00:00Z", "aKm": 7100, "e": 0, "iDeg": 50, "raanDeg": 0, "argpDeg": 0, "meanAnomalyDeg": 0, "aKm": 7200}}}]}';
    expect(inputErrorOf(() => parseScenarioText(ok, 'n.json', ts)).what).toContain('"aKm" is given twice');
    expect(parseScenarioText(ok.replace(', "aKm": 7200', ''), 'n.json', ts).satellites).toHaveLength(2);
  });

  it('a YAML file with several documents is named as such', () => {
    const e = inputErrorOf(() => parseScenarioText(`${SCENARIO_TEXT}\n---\n${SCENARIO_TEXT}`, 'two.yaml', ts));
    expect(e.what).toContain('more than one YAML document');
  });
});

describe('leap-second tables (ITU-R TF.460-6)', () => {
  const head = '#  File expires on 28 June 2027\n';
  const row = (mjd: number, d: number, m: number, y: number, v: number): string => `    ${mjd}.0    ${d}  ${m} ${y}       ${v}\n`;
  const good = head + row(41317, 1, 1, 1972, 10) + row(41499, 1, 7, 1972, 11);
  it('the published start (10 s on 1972-01-01, +1 s on 1972-07-01) is accepted', () => {
    expect(parseIersLeapSecondDat(good, 'ok.dat').rows).toEqual([['1972-01-01', 10], ['1972-07-01', 11]]);
  });

  it.each([
    ['a 2 s step', head + row(41317, 1, 1, 1972, 10) + row(41499, 1, 7, 1972, 12), 'steps by 2 s', 'x.dat:3'],
    ['a change on 2 July', head + row(41317, 1, 1, 1972, 10) + row(41500, 2, 7, 1972, 11), 'not the first day of a month', 'x.dat:3'],
    ['a wrong first value', head + row(41317, 1, 1, 1972, 11), 'UTC began at 10 s', 'x.dat:2'],
  ])('%s is refused at its line', (_name, text, what, where) => {
    const e = inputErrorOf(() => parseIersLeapSecondDat(text, 'x.dat'));
    expect(e.what).toContain(what);
    expect(e.where).toBe(where);
  });

  it('through the CLI: one line, exit 2', () => {
    const f = join(tmp, 'bad-leap.dat');
    writeFileSync(f, head + row(41317, 1, 1, 1972, 10) + row(41499, 1, 7, 1972, 15));
    const r = runCli(['time', '2027-01-01T00:00:00Z', '--leap-seconds', f]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(ONE_LINE_ERROR);
  });
});

describe('measurement files past the row limit of fit (TAUPLAN_MAX_ROWS)', () => {
  // 1 Hz rows, offsets along a line: a small file stands in for a 5-million-row one under a lowered limit.
  const rows = 2001;
  const csv = join(tmp, 'rows.csv');
  const body = Array.from({ length: rows }, (_, i) => `${new Date(Date.UTC(2027, 0, 1) + i * 1000).toISOString()},${(12.5 + 1e-4 * i).toFixed(4)}`);
  writeFileSync(csv, `time,offsetNs\n${body.join('\n')}\n`);
  const fit = (limit: string) => spawnSync(process.execPath, ['bin/tauplan.mjs', 'fit', csv, '--format', 'json'], { encoding: 'utf8', env: { ...process.env, TAUPLAN_MAX_ROWS: limit } });

  it('one row over the limit is refused at the first row past it, naming the limit and the way out', () => {
    const r = fit(String(rows - 1));
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(ONE_LINE_ERROR);
    expect(r.stderr).toContain(`more than ${rows - 1} measurement rows`);
    // Header on line 1, so row k is on line k + 1: the refused row is the last, line rows + 1.
    expect(r.stderr).toContain(`rows.csv:${rows + 1}`);
    expect(r.stderr).toContain('TAUPLAN_MAX_ROWS');
    expect(r.stdout).toBe('');
  });

  it('at the limit the file is fitted (1e-4 ns per s = 1e-13, by construction)', () => {
    const r = fit(String(rows));
    expect(r.status, r.stderr).toBe(0);
    const got = (JSON.parse(r.stdout) as { fractionalFrequency: number }).fractionalFrequency;
    // Offsets rounded to 1e-4 ns over 2000 s: a slope error far below 1e-16.
    expect(Math.abs(got - 1e-13), `wanted 1e-13, got ${got}`).toBeLessThan(1e-16);
  });

  it('fit --all keeps the same limit', () => {
    const r = spawnSync(process.execPath, ['bin/tauplan.mjs', 'fit', csv, '--all', '--format', 'json'], { encoding: 'utf8', env: { ...process.env, TAUPLAN_MAX_ROWS: String(rows - 1) } });
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(ONE_LINE_ERROR);
    expect(r.stderr).toContain(`more than ${rows - 1} measurement rows`);
  });

  it('a limit that is not a whole number is refused as an input error', () => {
    const r = fit('lots');
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(ONE_LINE_ERROR);
    expect(r.stderr).toContain('TAUPLAN_MAX_ROWS');
  });
});
