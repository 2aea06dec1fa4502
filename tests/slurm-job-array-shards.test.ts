/**
 * `--shard auto` under a Slurm job array, and `tauplan merge` of the shard outputs (issue 21).
 * Reference: Slurm documentation, "Job Array Support" (sbatch --array): each task sees
 * SLURM_ARRAY_TASK_ID, SLURM_ARRAY_TASK_COUNT, SLURM_ARRAY_TASK_MIN (and _MAX, _STEP) — confirmed
 * from the documented variable list. The tasks run at once, as an array does; the merge must be
 * byte-identical to one unsharded run (the contract of merge: exactly what one run writes).
 */
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { startCli } from './helpers/cli.ts';

const DEMO = 'data/demo/tessera.yaml';
const dir = mkdtempSync(join(tmpdir(), 'tauplan-slurm-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('Slurm job array: --shard auto', () => {
  it('three array tasks (--array=4-6) of passes, merged, equal one run byte for byte (JSON)', async () => {
    const args = (out: string, extra: string[] = []): string[] => ['passes', DEMO, '--to', '2027-01-05T00:00:00Z', '--format', 'json', '--jobs', '1', '--quiet', '--out', join(dir, out), ...extra];
    const runs = await Promise.all([
      startCli(args('one.json'), {}),
      ...[4, 5, 6].map((id) => startCli(args(`task${id}.json`, ['--shard', 'auto']), { SLURM_ARRAY_TASK_ID: String(id), SLURM_ARRAY_TASK_COUNT: '3', SLURM_ARRAY_TASK_MIN: '4', SLURM_ARRAY_TASK_MAX: '6' })),
    ]);
    for (const r of runs) expect(r.code, r.stderr).toBe(0);
    // Each task kept only its satellites (round-robin over the scenario order).
    const task5 = JSON.parse(readFileSync(join(dir, 'task5.json'), 'utf8')) as { shard: { index: number; count: number }; passes: { satellite: string }[] };
    expect(task5.shard).toMatchObject({ index: 2, count: 3 });
    expect(new Set(task5.passes.map((p) => p.satellite))).toEqual(new Set(['TSR-2', 'TSR-E1']));
    const merged = await startCli(['merge', join(dir, 'task6.json'), join(dir, 'task4.json'), join(dir, 'task5.json'), '--out', join(dir, 'merged.json'), '--quiet'], {});
    expect(merged.code, merged.stderr).toBe(0);
    expect(readFileSync(join(dir, 'merged.json'), 'utf8')).toBe(readFileSync(join(dir, 'one.json'), 'utf8'));
  }, 240_000); // shard processes start at once: slow on a loaded machine

  it('three array tasks of compare --against, merged, equal one run byte for byte (JSON); each task keeps its satellites and their pairs', async () => {
    const slurm = (id: number): Record<string, string> => ({ SLURM_ARRAY_TASK_ID: String(id), SLURM_ARRAY_TASK_COUNT: '3', SLURM_ARRAY_TASK_MIN: '0' });
    const args = (out: string, extra: string[] = []): string[] => ['compare', DEMO, '--against', 'TSR-3', '--format', 'json', '--out', join(dir, out), ...extra];
    const runs = await Promise.all([startCli(args('cmp-one.json'), {}), ...[0, 1, 2].map((id) => startCli(args(`cmp-task${id}.json`, ['--shard', 'auto']), slurm(id)))]);
    for (const r of runs) expect(r.code, r.stderr).toBe(0);
    // Task 1 (shard 2/3) has TSR-2 and TSR-E1; the pairs with the reference go with their other clock.
    const task1 = JSON.parse(readFileSync(join(dir, 'cmp-task1.json'), 'utf8')) as { clocks: { id: string }[]; pairs: { a: string; b: string }[] };
    expect(task1.clocks.map((c) => c.id)).toEqual(['TSR-2', 'TSR-E1']);
    expect(task1.pairs.map((p) => `${p.a}|${p.b}`)).toEqual(['TSR-2|TSR-3', 'TSR-3|TSR-E1']);
    const merged = await startCli(['merge', join(dir, 'cmp-task2.json'), join(dir, 'cmp-task0.json'), join(dir, 'cmp-task1.json'), '--out', join(dir, 'cmp-merged.json'), '--quiet'], {});
    expect(merged.code, merged.stderr).toBe(0);
    expect(readFileSync(join(dir, 'cmp-merged.json'), 'utf8')).toBe(readFileSync(join(dir, 'cmp-one.json'), 'utf8'));
  }, 240_000); // shard processes start at once: slow on a loaded machine

  it('three array tasks of report, merged folder by folder, equal the data files of one report byte for byte', async () => {
    const slurm = (id: number): Record<string, string> => ({ SLURM_ARRAY_TASK_ID: String(id), SLURM_ARRAY_TASK_COUNT: '3', SLURM_ARRAY_TASK_MIN: '1' });
    const args = (out: string, extra: string[] = []): string[] => ['report', DEMO, '--quiet', '--out', join(dir, out), ...extra];
    const runs = await Promise.all([startCli(args('rep-one'), {}), ...[1, 2, 3].map((id) => startCli(args(`rep-task${id}`, ['--shard', 'auto']), slurm(id)))]);
    for (const r of runs) expect(r.code, r.stderr).toBe(0);
    expect(existsSync(join(dir, 'rep-task1', 'report.html'))).toBe(false);
    const merged = await startCli(['merge', ...[2, 3, 1].map((id) => join(dir, `rep-task${id}`)), '--out', join(dir, 'rep-merged'), '--quiet'], {});
    expect(merged.code, merged.stderr).toBe(0);
    // Every data file of the one run (text and HTML need one process), and only those.
    const wanted = readdirSync(join(dir, 'rep-one')).filter((f) => /\.(csv|json)$/.test(f)).sort();
    expect(readdirSync(join(dir, 'rep-merged')).filter((f) => !f.startsWith('.')).sort()).toEqual(wanted);
    expect(wanted).toEqual(expect.arrayContaining(['passes.json', 'resets.csv', 'size.json', 'fit.json', 'compare.csv', 'sweep.csv']));
    for (const f of wanted) expect(readFileSync(join(dir, 'rep-merged', f), 'utf8'), f).toBe(readFileSync(join(dir, 'rep-one', f), 'utf8'));
  }, 240_000); // shard processes start at once: slow on a loaded machine

  it('bad or missing array variables are one-line input errors (exit 2), and a missing task stops the merge', async () => {
    const base = ['passes', DEMO, '--to', '2027-01-05T00:00:00Z', '--format', 'csv', '--shard', 'auto'];
    const [noCount, outside] = await Promise.all([
      startCli(base, { SLURM_ARRAY_TASK_ID: '1', SLURM_ARRAY_TASK_MIN: '0' }),
      startCli(base, { SLURM_ARRAY_TASK_ID: '9', SLURM_ARRAY_TASK_COUNT: '3', SLURM_ARRAY_TASK_MIN: '0' }),
    ]);
    expect(noCount.code).toBe(2);
    expect(noCount.stderr).toMatch(/^tauplan: SLURM_ARRAY_TASK_COUNT is not set \(SLURM_ARRAY_TASK_COUNT\) — .+\n$/);
    expect(outside.code).toBe(2);
    expect(outside.stderr).toMatch(/^tauplan: SLURM_ARRAY_TASK_ID 9 is not one of the 3 tasks .+\n$/);
    const partial = await startCli(['merge', join(dir, 'task4.json'), join(dir, 'task6.json')], {});
    expect(partial.code).toBe(2);
    expect(partial.stderr).toMatch(/^tauplan: shard 2\/3 is missing \(merge\) — .+\n$/);
  }, 240_000); // shard processes start at once: slow on a loaded machine
});
