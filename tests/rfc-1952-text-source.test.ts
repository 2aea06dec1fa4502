/**
 * The shared text source (src/io/textSource.ts) against RFC 1952 "GZIP file format specification
 * version 4.3" (§2.3.1: members start with ID1 = 31, ID2 = 139, whatever the file is called) and
 * the Unicode encoding forms (UTF-8 BOM EF BB BF accepted and stripped; UTF-16 BOMs FF FE / FE FF
 * refused). Line endings LF and CR LF are both accepted (common practice for text products).
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { InputError } from '../src/errors.ts';
import { readLinesSync, readTextLines, readTextWhole } from '../src/io/textSource.ts';
import { runCli, ONE_LINE_ERROR } from './helpers/cli.ts';

const dir = mkdtempSync(join(tmpdir(), 'tauplan-text-'));
const TEXT = 'first line\r\nsecond line\nthird, no newline';

/** The lines of a file, read by the streaming reader and by the synchronous one, which must agree. */
async function linesOf(path: string): Promise<string[]> {
  const out: string[] = [];
  for await (const l of readTextLines(path, 'measurements', 'measurements')) out.push(`${l.line}:${l.text}`);
  const sync = [...readLinesSync(path, 'measurements', 'measurements')].map((l) => `${l.line}:${l.text}`);
  expect(sync).toEqual(out);
  return out;
}

async function errorOf(f: () => Promise<unknown>): Promise<InputError> {
  try {
    await f();
  } catch (e) {
    if (e instanceof InputError) return e;
    throw e;
  }
  throw new Error('no InputError');
}

const WANT = ['1:first line', '2:second line', '3:third, no newline'];

describe('plain and gzip', () => {
  it('reads plain text with CRLF and LF, and a last line without a newline', async () => {
    const p = join(dir, 'plain.txt');
    writeFileSync(p, TEXT);
    expect(await linesOf(p)).toEqual(WANT);
    expect(readTextWhole(p, 'orbit', '--orbit')).toBe(TEXT);
  });
  it('recognises gzip by its magic bytes even without a .gz name, streaming and whole', async () => {
    const p = join(dir, 'packed.txt');
    writeFileSync(p, gzipSync(Buffer.from(TEXT)));
    expect(await linesOf(p)).toEqual(WANT);
    expect(readTextWhole(p, 'orbit', '--orbit')).toBe(TEXT);
  });
  it('streams a large gzip member across many chunks without losing or splitting lines', async () => {
    const n = 200_000;
    const body = Array.from({ length: n }, (_, i) => `line ${i}`).join('\n');
    const p = join(dir, 'big.gz');
    writeFileSync(p, gzipSync(Buffer.from(body)));
    let count = 0;
    let last = '';
    for await (const l of readTextLines(p, 'measurements', 'x')) {
      count++;
      last = l.text;
    }
    expect(count).toBe(n);
    expect(last).toBe(`line ${n - 1}`);
  });
  it('refuses a damaged gzip stream with a one-line error naming the file', async () => {
    const gz = gzipSync(Buffer.from(TEXT.repeat(1000)));
    const p = join(dir, 'damaged.gz');
    writeFileSync(p, Buffer.concat([gz.subarray(0, 40), Buffer.alloc(30, 0x55), gz.subarray(70)]));
    const e = await errorOf(() => linesOf(p));
    expect(e.what).toMatch(/damaged gzip/);
    const truncated = join(dir, 'truncated.gz');
    writeFileSync(truncated, gz.subarray(0, gz.length - 20));
    expect((await errorOf(() => linesOf(truncated))).what).toMatch(/damaged gzip/);
    expect(() => readTextWhole(truncated, 'orbit', '--orbit')).toThrow(/damaged gzip/);
  });
});

describe('encodings', () => {
  it('strips a UTF-8 BOM', async () => {
    const p = join(dir, 'bom.txt');
    writeFileSync(p, Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(TEXT)]));
    expect(await linesOf(p)).toEqual(WANT);
    expect(readTextWhole(p, 'orbit', '--orbit')).toBe(TEXT);
  });
  it('refuses UTF-16 (with or without a BOM) and says to save as UTF-8', async () => {
    const p = join(dir, 'utf16.txt');
    writeFileSync(p, Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(TEXT, 'utf16le')]));
    const e = await errorOf(() => linesOf(p));
    expect(e.what).toMatch(/UTF-16/);
    expect(e.fix).toBe('save the file as UTF-8');
    const q = join(dir, 'utf16-nobom.txt');
    writeFileSync(q, Buffer.from(TEXT, 'utf16le'));
    expect(() => readTextWhole(q, 'orbit', '--orbit')).toThrow(/UTF-16/);
  });
  it('refuses a folder and a missing file', async () => {
    expect((await errorOf(() => linesOf(dir))).what).toMatch(/folder/);
    expect((await errorOf(() => linesOf(join(dir, 'none')))).what).toMatch(/not found/);
  });
});

describe('through the CLI', () => {
  it('a gzip CSV named without .gz is fitted; a damaged one is a one-line error, exit 2, nothing written', () => {
    const csv = 'time,offsetNs\n2027-01-01T00:00:00Z,1\n2027-01-01T00:01:00Z,2\n2027-01-01T00:02:00Z,3\n';
    const p = join(dir, 'offsets.csv');
    writeFileSync(p, gzipSync(Buffer.from(csv)));
    const ok = runCli(['fit', p, '--degree', '1', '--format', 'json']);
    expect(ok.code, ok.stderr).toBe(0);
    // 1 ns per 60 s = 1.6667e-11 (by construction).
    expect(Math.abs((JSON.parse(ok.stdout) as { fractionalFrequency: number }).fractionalFrequency - 1 / 60e9)).toBeLessThan(1e-20);
    const bad = join(dir, 'bad.csv');
    const gz = gzipSync(Buffer.from(csv));
    writeFileSync(bad, gz.subarray(0, gz.length - 6));
    const out = join(dir, 'never.json');
    const r = runCli(['fit', bad, '--out', out]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(ONE_LINE_ERROR);
  });
});
