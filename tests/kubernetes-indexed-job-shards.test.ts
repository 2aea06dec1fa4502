/**
 * `--shard auto --shard-count N` under a Kubernetes Indexed Job, and `tauplan merge` (issue 21).
 * Reference: Kubernetes documentation, "Jobs — Completion mode": with completionMode: Indexed each
 * pod gets its index 0..completions−1 in JOB_COMPLETION_INDEX — confirmed from the documentation.
 * The pods run at once; the merge must be byte-identical to one unsharded run.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { startCli } from './helpers/cli.ts';

const DEMO = 'data/demo/tessera.yaml';
const dir = mkdtempSync(join(tmpdir(), 'tauplan-k8s-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('Kubernetes Indexed Job: --shard auto --shard-count', () => {
  it('two indexed pods of resets, merged, equal one run byte for byte (CSV)', async () => {
    const args = (out: string, extra: string[] = []): string[] => ['resets', DEMO, '--horizon', '7d', '--format', 'csv', '--jobs', '1', '--quiet', '--out', join(dir, out), ...extra];
    const runs = await Promise.all([
      startCli(args('one.csv'), {}),
      ...[0, 1].map((i) => startCli(args(`pod${i}.csv`, ['--shard', 'auto', '--shard-count', '2']), { JOB_COMPLETION_INDEX: String(i) })),
    ]);
    for (const r of runs) expect(r.code, r.stderr).toBe(0);
    const merged = await startCli(['merge', join(dir, 'pod1.csv'), join(dir, 'pod0.csv'), '--out', join(dir, 'merged.csv'), '--quiet'], {});
    expect(merged.code, merged.stderr).toBe(0);
    expect(readFileSync(join(dir, 'merged.csv'), 'utf8')).toBe(readFileSync(join(dir, 'one.csv'), 'utf8'));
  }, 240_000); // shard processes start at once: slow on a loaded machine

  it('two indexed pods of navclock, merged, equal one run byte for byte (JSON)', async () => {
    const args = (out: string, extra: string[] = []): string[] => ['navclock', DEMO, '--to', '2027-01-04T12:00:00Z', '--format', 'json', '--quiet', '--out', join(dir, out), ...extra];
    const runs = await Promise.all([startCli(args('nav-one.json'), {}), ...[0, 1].map((i) => startCli(args(`nav-pod${i}.json`, ['--shard', 'auto', '--shard-count', '2']), { JOB_COMPLETION_INDEX: String(i) }))]);
    for (const r of runs) expect(r.code, r.stderr).toBe(0);
    const merged = await startCli(['merge', join(dir, 'nav-pod0.json'), join(dir, 'nav-pod1.json'), '--out', join(dir, 'nav-merged.json'), '--quiet'], {});
    expect(merged.code, merged.stderr).toBe(0);
    expect(readFileSync(join(dir, 'nav-merged.json'), 'utf8')).toBe(readFileSync(join(dir, 'nav-one.json'), 'utf8'));
  }, 240_000); // shard processes start at once: slow on a loaded machine

  it('four indexed pods of compare with every pair, on a scenario with a ballistic flight and a clock on the Moon, merged, equal one run byte for byte (CSV)', async () => {
    // The demo constellation (invented) plus an invented vertical hop inside the window and an invented
    // lunar station: a flight shortens its pairs' interval, and the lunar clock is integrated.
    const scenario = join(dir, 'hop.yaml');
    const demo = readFileSync(DEMO, 'utf8').replace(/^ {4}measurements: .*\n/m, '');
    const hop = '  - id: HOP\n    orbit:\n      state: { frame: GCRF, epoch: 2027-01-04T03:00:00Z, positionKm: [6378.5, 0, 0], velocityKmPerS: [3, 0.2, 0] }\n';
    const moon = '  - { id: MOONBASE, body: moon, latDeg: 0, lonDeg: 0, heightM: 0, maskDeg: 5, minPassS: 300 }\n';
    writeFileSync(scenario, demo.replace('  - id: TSR-2\n', `${hop}  - id: TSR-2\n`).replace(/^stations:\n/m, `stations:\n${moon}`));
    const args = (out: string, extra: string[] = []): string[] => ['compare', scenario, '--format', 'csv', '--out', join(dir, out), ...extra];
    const runs = await Promise.all([startCli(args('cmp-one.csv'), {}), ...[0, 1, 2, 3].map((i) => startCli(args(`cmp-pod${i}.csv`, ['--shard', 'auto', '--shard-count', '4']), { JOB_COMPLETION_INDEX: String(i) }))]);
    for (const r of runs) expect(r.code, r.stderr).toBe(0);
    const one = readFileSync(join(dir, 'cmp-one.csv'), 'utf8');
    expect(one).toMatch(/^HOP,satellite,.*,2027-01-04T03:11:\d\d\.\d{3}Z,/m); // the hop is a flight
    const merged = await startCli(['merge', ...[3, 1, 0, 2].map((i) => join(dir, `cmp-pod${i}.csv`)), '--out', join(dir, 'cmp-merged.csv'), '--quiet'], {});
    expect(merged.code, merged.stderr).toBe(0);
    expect(readFileSync(join(dir, 'cmp-merged.csv'), 'utf8')).toBe(one);
  }, 240_000); // shard processes start at once: slow on a loaded machine

  it('an index without --shard-count, or outside it, is a one-line input error (exit 2)', async () => {
    const base = ['resets', DEMO, '--format', 'json', '--shard', 'auto'];
    const [noCount, outside, notNumber] = await Promise.all([
      startCli(base, { JOB_COMPLETION_INDEX: '0' }),
      startCli([...base, '--shard-count', '2'], { JOB_COMPLETION_INDEX: '2' }),
      startCli([...base, '--shard-count', '2'], { JOB_COMPLETION_INDEX: 'one' }),
    ]);
    for (const r of [noCount, outside, notNumber]) expect(r.code, r.stderr).toBe(2);
    expect(noCount.stderr).toMatch(/^tauplan: JOB_COMPLETION_INDEX needs --shard-count \(--shard-count\) — .+\n$/);
    expect(outside.stderr).toMatch(/^tauplan: JOB_COMPLETION_INDEX 2 is outside 0–1 \(JOB_COMPLETION_INDEX\) — .+\n$/);
    expect(notNumber.stderr).toMatch(/^tauplan: JOB_COMPLETION_INDEX "one" is not a whole number .+\n$/);
  }, 240_000); // shard processes start at once: slow on a loaded machine
});
