/**
 * One worker pool and one `--jobs` check for every command that takes it (size --all, passes,
 * resets, fit --all). Reference: the project's issues on hardening (item 3: "--jobs is capped by
 * the work and by the cores, with the same validation in every command") and on the library
 * (item 4: "cap at the work and the cores, and say so"); Node.js `os.availableParallelism()`.
 *
 * Values checked are derived, not published: the threads started must not exceed the cores or the
 * pieces of work, and the output must be byte-identical to the in-process run (the same code on the
 * same input, scheduled differently).
 */
import { availableParallelism, tmpdir } from 'node:os';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { main } from '../src/cli/main.ts';
import { checkJobs, jobsFor, workersStarted } from '../src/cli/workers.ts';

const DEMO = 'data/demo/tessera.yaml';
/** The demo scenario's satellites (invented). */
const DEMO_SATELLITES = 6;
const CATALOGUE = 'tests/fixtures/vallado-2006/sgp4-ver-subset.tle';
/** Element sets in that file. */
const CATALOGUE_SETS = 3;

let dir: string;
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'tauplan-pool-'));
});
afterAll(() => {
  rmSync(dir, { recursive: true, force: true });
});

/** Run the CLI in-process; the exit code and what it wrote to stderr. */
async function run(args: string[]): Promise<{ code: number; stderr: string }> {
  let stderr = '';
  const spy = vi.spyOn(process.stderr, 'write').mockImplementation((chunk: string | Uint8Array) => {
    stderr += typeof chunk === 'string' ? chunk : Buffer.from(chunk).toString('utf8');
    return true;
  });
  try {
    return { code: await main(args), stderr };
  } finally {
    spy.mockRestore();
  }
}

describe('--jobs: one check', () => {
  it('refuses what is not a whole number ≥ 1, with the same message in every command', async () => {
    const commands: string[][] = [
      ['size', '--tle', CATALOGUE, '--all', '--format', 'csv'],
      ['passes', DEMO],
      ['resets', DEMO],
      ['fit', 'tests/fixtures/rinex-clock/v304.clk', '--all'],
    ];
    for (const bad of ['0', '-2', '1.5']) {
      for (const c of commands) {
        const r = await run([...c, `--jobs=${bad}`, '--out', join(dir, 'never.txt')]);
        const wanted = `tauplan: --jobs ${Number(bad)} is not a whole number ≥ 1 (--jobs) — give e.g. --jobs 4, or --jobs 1 to run without worker threads\n`;
        expect(r.code, `${c[0]} --jobs ${bad}: wanted exit 2, got ${r.code}`).toBe(2);
        expect(r.stderr, `${c[0]} --jobs ${bad}`).toBe(wanted);
      }
    }
  });

  it('caps by the cores and by the work (pure function)', () => {
    const cores = availableParallelism();
    expect(() => checkJobs(3)).not.toThrow();
    expect(jobsFor(1000, 3, ['satellite', 'satellites'], true), 'wanted at most the 3 pieces and the cores').toBe(Math.min(3, cores));
    expect(jobsFor(1000, 1000, ['satellite', 'satellites'], true), `wanted the ${cores} cores`).toBe(cores);
    expect(jobsFor(undefined, 1, ['satellite', 'satellites'], true)).toBe(1);
    expect(jobsFor(1, 50, ['satellite', 'satellites'], true)).toBe(1);
  });
});

describe('--jobs 1000 does not start 1000 workers', () => {
  it('passes: capped on stderr, threads ≤ cores and satellites, output as with --jobs 1', async () => {
    const cap = Math.min(availableParallelism(), DEMO_SATELLITES);
    const args = ['passes', DEMO, '--to', '2027-01-04T12:00:00Z', '--format', 'json'];
    const one = await run([...args, '--jobs', '1', '--out', join(dir, 'p1.json')]);
    expect(one.code, one.stderr).toBe(0);
    const before = workersStarted();
    const many = await run([...args, '--jobs', '1000', '--out', join(dir, 'p1000.json')]);
    const started = workersStarted() - before;
    expect(many.code, many.stderr).toBe(0);
    expect(started, `worker threads started: wanted ≤ ${cap}, got ${started}`).toBeLessThanOrEqual(cap);
    expect(many.stderr).toBe(`tauplan: --jobs 1000 capped at ${cap} (${availableParallelism()} core${availableParallelism() === 1 ? '' : 's'}, ${DEMO_SATELLITES} satellites)\n`);
    expect(readFileSync(join(dir, 'p1000.json'), 'utf8')).toBe(readFileSync(join(dir, 'p1.json'), 'utf8'));
  });

  it('size --all: capped by the element sets, rows as with --jobs 1; --quiet keeps stderr quiet', async () => {
    const cap = Math.min(availableParallelism(), CATALOGUE_SETS);
    const args = ['size', '--tle', CATALOGUE, '--all', '--span', '1h', '--format', 'csv'];
    expect((await run([...args, '--jobs', '1', '--quiet', '--out', join(dir, 's1.csv')])).code).toBe(0);
    const before = workersStarted();
    const many = await run([...args, '--jobs', '1000', '--quiet', '--out', join(dir, 's1000.csv')]);
    const started = workersStarted() - before;
    expect(many.code, many.stderr).toBe(0);
    expect(started, `worker threads started: wanted ≤ ${cap}, got ${started}`).toBeLessThanOrEqual(cap);
    expect(many.stderr).toBe('');
    expect(readFileSync(join(dir, 's1000.csv'), 'utf8')).toBe(readFileSync(join(dir, 's1.csv'), 'utf8'));
  });
});
