/**
 * Catalogue runs: `tauplan size --all`, worker threads, `--shard K/N` and `tauplan merge`.
 * Reference: tauplan public interface (shared/contract.md, "Conventions" — atomic --out, exit codes,
 * one-line errors; "tauplan size"), and the "Speed and scale" issue: the same rows in the same
 * order whatever the number of workers or shards.
 *
 * Reference values: none are published numbers. Every comparison is derived — the same computation
 * scheduled differently (in-process, 2 worker threads, 4 shards merged) must give byte-identical
 * rows, because each satellite is sized by the same deterministic code on the same input.
 * The catalogue is invented (scripts/make-catalogue.ts, fixed seed) with one object whose SGP4
 * elements fail within the span.
 */
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parse } from 'csv-parse/sync';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { main } from '../src/cli/main.ts';
import { mergeShardTexts } from '../src/cli/commands/merge.ts';
import { InOrderBuffer, inShard, parseShard } from '../src/plan/catalogue.ts';
import { makeCatalogue } from '../scripts/make-catalogue.ts';

const COUNT = 40;
/** The decaying object: make-catalogue puts K = 1 at index floor(0.5·40) + 1 = 21 (catalogue number 22). */
const DECAYING_INDEX = 21;

let dir: string;
let tle: string;

/** Run the CLI in-process; returns the exit code and what it wrote to stderr. */
async function run(args: string[]): Promise<{ code: number; stderr: string }> {
  let stderr = '';
  const spy = vi.spyOn(process.stderr, 'write').mockImplementation((chunk: string | Uint8Array) => {
    stderr += typeof chunk === 'string' ? chunk : Buffer.from(chunk).toString('utf8');
    return true;
  });
  try {
    const code = await main(args);
    return { code, stderr };
  } finally {
    spy.mockRestore();
  }
}

const sizeAll = (out: string, ...extra: string[]): string[] => ['size', '--tle', tle, '--all', '--span', '6h', '--format', 'csv', '--out', join(dir, out), ...extra];
const read = (name: string): string => readFileSync(join(dir, name), 'utf8');

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'tauplan-catalogue-'));
  tle = join(dir, 'invented-40.tle');
  writeFileSync(tle, makeCatalogue({ count: COUNT, seed: 3, decaying: 1 }));
});

afterAll(() => {
  rmSync(dir, { recursive: true, force: true });
});

describe('size --all', () => {
  it('gives the same rows in file order with --jobs 1 and --jobs 2, a failure row, and exit 0', async () => {
    const one = await run(sizeAll('j1.csv', '--jobs', '1'));
    const two = await run(sizeAll('j2.csv', '--jobs', '2'));
    expect(one.code).toBe(0);
    expect(two.code).toBe(0);
    expect(read('j2.csv')).toBe(read('j1.csv'));
    const lines = read('j1.csv').trimEnd().split('\n');
    const [header, ...rows] = parse(read('j1.csv')) as string[][];
    expect(rows.length).toBe(COUNT);
    const idx = header.indexOf('index');
    const err = header.indexOf('error');
    expect(rows.map((r) => Number(r[idx]))).toEqual(Array.from({ length: COUNT }, (_, i) => i));
    const failed = rows.filter((r) => r[err] !== '');
    expect(failed.length).toBe(1);
    expect(failed[0][0]).toBe(String(DECAYING_INDEX + 1));
    expect(lines[DECAYING_INDEX + 1]).toMatch(/SGP4/);
    expect(one.stderr).toContain(`sized ${COUNT - 1} of ${COUNT}; 1 failed`);
    expect(one.stderr).toMatch(/satellite 22 .*not sized: SGP4/);
  }, 120_000);

  it('4 shards merged give the --jobs 1 output', async () => {
    for (let k = 1; k <= 4; k++) expect((await run(sizeAll(`s${k}.csv`, '--jobs', '1', '--shard', `${k}/4`, '--quiet'))).code).toBe(0);
    const [head, ...shard2] = parse(read('s2.csv')) as string[][];
    expect(shard2.length).toBe(COUNT / 4);
    // Shard 2/4 holds indices 1, 5, 9, ...
    expect(shard2.map((r) => Number(r[head.indexOf('index')]))).toEqual(Array.from({ length: COUNT / 4 }, (_, i) => 4 * i + 1));
    const merged = await run(['merge', ...[3, 1, 4, 2].map((k) => join(dir, `s${k}.csv`)), '--out', join(dir, 'merged.csv'), '--quiet']);
    expect(merged.code).toBe(0);
    expect(read('merged.csv')).toBe(read('j1.csv'));
  }, 120_000);

  it('jsonl and json carry the same results, and jsonl shards merge back', async () => {
    expect((await run(['size', '--tle', tle, '--all', '--span', '6h', '--format', 'jsonl', '--jobs', '2', '--out', join(dir, 'all.jsonl'), '--quiet'])).code).toBe(0);
    expect((await run(['size', '--tle', tle, '--all', '--span', '6h', '--format', 'json', '--jobs', '1', '--out', join(dir, 'all.json'), '--quiet'])).code).toBe(0);
    const lines = read('all.jsonl').trimEnd().split('\n').map((l) => JSON.parse(l) as Record<string, unknown>);
    expect(lines.map((o) => o.index)).toEqual(Array.from({ length: COUNT }, (_, i) => i));
    const doc = JSON.parse(read('all.json')) as { results: Record<string, unknown>[]; failures: Record<string, unknown>[] };
    expect(doc.results.length).toBe(COUNT - 1);
    expect(doc.failures.map((f) => f.index)).toEqual([DECAYING_INDEX]);
    expect(lines.filter((o) => o.error === undefined)).toEqual(doc.results);
    const halves = [0, 1].map((h) => ({ name: `h${h}`, text: lines.filter((o) => (o.index as number) % 2 === h).map((o) => `${JSON.stringify(o)}\n`).join('') }));
    expect(mergeShardTexts(halves)).toBe(read('all.jsonl'));
  }, 120_000);

  it('--strict turns a failure into exit 2 and leaves no output file and no temp file', async () => {
    const r = await run(sizeAll('strict.csv', '--jobs', '2', '--strict'));
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/^tauplan: 1 of 40 satellites could not be sized \(--strict/m);
    expect(existsSync(join(dir, 'strict.csv'))).toBe(false);
    expect(readdirSync(dir).filter((f) => f.startsWith('.tauplan-tmp'))).toEqual([]);
  }, 120_000);

  it('a bad checksum in the file fails the whole run with one line and exit 2', async () => {
    const bad = join(dir, 'bad.tle');
    const lines = readFileSync(tle, 'utf8').split('\n');
    // Line 2 of the third element set: change its checksum digit.
    lines[8] = lines[8].slice(0, 68) + String((Number(lines[8][68]) + 1) % 10);
    writeFileSync(bad, lines.join('\n'));
    const r = await run(['size', '--tle', bad, '--all', '--format', 'csv', '--out', join(dir, 'bad.csv')]);
    expect(r.code).toBe(2);
    expect(r.stderr.trim().split('\n')).toEqual([expect.stringMatching(/^tauplan: checksum of line 2 .*bad\.tle:9:69\) — /)]);
    expect(existsSync(join(dir, 'bad.csv'))).toBe(false);
  });

  it('leaves no temporary files after all the runs above', () => {
    expect(readdirSync(dir).filter((f) => f.startsWith('.tauplan-tmp'))).toEqual([]);
  });

  it('refuses bad --shard, --jobs and --sat with --all (exit 2)', async () => {
    for (const extra of [['--shard', '5/4'], ['--shard', '0/3'], ['--jobs', '0'], ['--sat', '1']]) {
      const r = await run([...sizeAll('never.csv'), ...extra]);
      expect(r.code, extra.join(' ')).toBe(2);
      expect(r.stderr).toMatch(/^tauplan: .* \(.*\) — /);
    }
    expect(existsSync(join(dir, 'never.csv'))).toBe(false);
  });
});

describe('merge', () => {
  const csv = (rows: [number, string][]): string => `satellite,index\n${rows.map(([i, s]) => `${s},${i}`).join('\n')}\n`;
  it('refuses a duplicate or a missing index', () => {
    expect(() => mergeShardTexts([{ name: 'a', text: csv([[0, 'x'], [1, 'y']]) }, { name: 'b', text: csv([[1, 'y']]) }])).toThrow(/index 1 appears twice/);
    expect(() => mergeShardTexts([{ name: 'a', text: csv([[0, 'x'], [2, 'z']]) }])).toThrow(/index 1 is missing/);
  });
});

describe('catalogue helpers', () => {
  it('shards partition the indices', () => {
    const shards = [1, 2, 3].map((k) => parseShard(`${k}/3`, '--shard'));
    for (let i = 0; i < 30; i++) expect(shards.filter((s) => inShard(i, s)).length).toBe(1);
  });
  it('releases only the in-order prefix', () => {
    const b = new InOrderBuffer<string>();
    expect(b.put(1, 'b')).toEqual([]);
    expect(b.put(0, 'a')).toEqual(['a', 'b']);
    expect(b.put(3, 'd')).toEqual([]);
    expect(b.pending).toBe(1);
    expect(b.put(2, 'c')).toEqual(['c', 'd']);
  });
});
