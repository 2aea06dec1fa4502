/**
 * `--shard auto --shard-count N` under a Kubernetes Indexed Job, and `tauplan merge` (issue 21).
 * Reference: Kubernetes documentation, "Jobs — Completion mode": with completionMode: Indexed each
 * pod gets its index 0..completions−1 in JOB_COMPLETION_INDEX — confirmed from the documentation.
 * The pods run at once; the merge must be byte-identical to one unsharded run.
 */
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { ONE_LINE_ERROR, startCli } from './helpers/cli.ts';
import { benchScenarioYaml } from '../scripts/bench/constellation.ts';

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

  it('four indexed pods of report on a scenario full of notes, merged folder by folder, equal the data files of one report byte for byte', async () => {
    // The invented benchmark constellation (8 satellites) made to raise every kind of note a report
    // gathers: element sets extrapolated past SGP4's span, stations without a geoid height, the
    // leap-second table's expiry inside the window, a blackout over the whole horizon of two satellites
    // (notes of their plans after the orbits' notes); two satellites (both in shard 2) without a
    // keep-in limit, two with measurements (fit-<id> files).
    let yaml = benchScenarioYaml({ sats: 8 }).replace(/^window: .*$/m, 'window: { start: 2027-06-27T00:00:00Z, end: 2027-06-29T00:00:00Z }');
    for (const id of ['LTC-02', 'LTC-06']) yaml = yaml.replace(new RegExp(`(id: ${id}\\n[\\s\\S]*?)keepInNs: [\\d.]+, `), '$1');
    for (const id of ['LTC-03', 'LTC-04']) yaml = yaml.replace(new RegExp(`(id: ${id}\\n[\\s\\S]*?)(    clock:)`), '$1    measurements: offsets.csv\n$2');
    yaml = yaml.replace(/^policy:\n/m, 'policy:\n  blackouts:\n    - { start: 2027-06-20T00:00:00Z, end: 2027-08-01T00:00:00Z, satellites: [LTC-01, LTC-04] }\n');
    let stripped = 0;
    yaml = yaml.replace(/geoidHeightM: -?[\d.]+, /g, (m) => (stripped++ < 3 ? '' : m));
    const scenario = join(dir, 'notes.yaml');
    writeFileSync(scenario, yaml);
    writeFileSync(join(dir, 'offsets.csv'), readFileSync('data/demo/tsr1-offsets.csv'));
    const args = (out: string, extra: string[] = []): string[] => ['report', scenario, '--horizon', '10d', '--quiet', '--out', join(dir, out), ...extra];
    const runs = await Promise.all([startCli(args('rep-one'), {}), ...[0, 1, 2, 3].map((i) => startCli(args(`rep-pod${i}`, ['--shard', 'auto', '--shard-count', '4']), { JOB_COMPLETION_INDEX: String(i) }))]);
    for (const r of runs) expect(r.code, r.stderr).toBe(0);
    const one = (f: string): string => readFileSync(join(dir, 'rep-one', f), 'utf8');
    // The notes this scenario is built to raise are there (else the test would prove little).
    const notes = (JSON.parse(one('passes.json')) as { notes: string[] }).notes;
    for (const pattern of [/^LTC-05: the window reaches \d+ days from its element-set epoch/, /^station \S+ has no geoidHeightM/, /leap-second table expires/]) expect(notes.some((n) => pattern.test(n)), String(pattern)).toBe(true);
    const merged = await startCli(['merge', ...[3, 0, 2, 1].map((i) => join(dir, `rep-pod${i}`)), '--out', join(dir, 'rep-merged'), '--quiet'], {});
    expect(merged.code, merged.stderr).toBe(0);
    const wanted = readdirSync(join(dir, 'rep-one')).filter((f) => /\.(csv|json)$/.test(f)).sort();
    expect(wanted).toEqual(expect.arrayContaining(['fit-LTC-03.json', 'fit-LTC-04.csv', 'resets.json']));
    expect(readdirSync(join(dir, 'rep-merged')).filter((f) => !f.startsWith('.')).sort()).toEqual(wanted);
    for (const f of wanted) expect(readFileSync(join(dir, 'rep-merged', f), 'utf8'), f).toBe(one(f));
    expect(one('resets.json')).toMatch(/blackouts cover the whole horizon for LTC-04/);

    // The same scenario's keep-in plan as a resets shard run (CSV: orbits' notes, then the plans').
    const resets = (out: string, extra: string[] = []): string[] => ['resets', scenario, '--horizon', '10d', '--format', 'csv', '--jobs', '1', '--quiet', '--out', join(dir, out), ...extra];
    const plans = await Promise.all([startCli(resets('notes-one.csv'), {}), ...[0, 1, 2].map((i) => startCli(resets(`notes-pod${i}.csv`, ['--shard', 'auto', '--shard-count', '3']), { JOB_COMPLETION_INDEX: String(i) }))]);
    for (const r of plans) expect(r.code, r.stderr).toBe(0);
    const joined = await startCli(['merge', ...[2, 0, 1].map((i) => join(dir, `notes-pod${i}.csv`)), '--out', join(dir, 'notes-merged.csv'), '--quiet'], {});
    expect(joined.code, joined.stderr).toBe(0);
    expect(readFileSync(join(dir, 'notes-merged.csv'), 'utf8')).toBe(readFileSync(join(dir, 'notes-one.csv'), 'utf8'));
  }, 300_000); // shard processes start at once: slow on a loaded machine

  it('report shard folders: a missing shard, a shard given twice, a shard of another run, a file among the folders, a folder that is no shard folder are one-line input errors (exit 2), and no merged folder is made', async () => {
    // The folders of the test above, and one shard of a report on another scenario.
    const pod = (i: number): string => join(dir, `rep-pod${i}`);
    const other = await startCli(['report', DEMO, '--shard', '2/4', '--quiet', '--out', join(dir, 'rep-other')], {});
    expect(other.code, other.stderr).toBe(0);
    const [missing, notShard, mixed, twice, foreign] = await Promise.all([
      startCli(['merge', pod(0), pod(1), pod(3), '--out', join(dir, 'bad-1')], {}),
      startCli(['merge', pod(0), pod(1), pod(2), join(dir, 'rep-one'), '--out', join(dir, 'bad-2')], {}),
      startCli(['merge', pod(0), pod(1), pod(2), pod(3), join(dir, 'nav-pod0.json'), '--out', join(dir, 'bad-3')], {}),
      startCli(['merge', pod(0), pod(1), pod(2), pod(2), '--out', join(dir, 'bad-4')], {}),
      startCli(['merge', pod(0), join(dir, 'rep-other'), pod(2), pod(3), '--out', join(dir, 'bad-5')], {}),
    ]);
    for (const r of [missing, notShard, mixed, twice, foreign]) expect(r.stderr).toMatch(ONE_LINE_ERROR);
    for (const r of [missing, notShard, mixed, twice, foreign]) expect(r.code, r.stderr).toBe(2);
    expect(foreign.stderr).toMatch(/rep-other comes from another report run than .*rep-pod0/);
    expect(missing.stderr).toMatch(/^tauplan: shard 3\/4 of the report is missing/);
    expect(notShard.stderr).toMatch(/rep-one is not a report shard folder \(no shard\.json\)/);
    expect(twice.stderr).toMatch(/^tauplan: shard 3\/4 appears twice/);
    for (const k of [1, 2, 3, 4, 5]) expect(existsSync(join(dir, `bad-${k}`, 'passes.json'))).toBe(false);
  }, 240_000);

  it('a report shard does not replace another shard\'s folder (one --out for every task would keep only the last); the same shard run again does', async () => {
    const out = join(dir, 'rep-shared');
    const first = await startCli(['report', DEMO, '--shard', 'auto', '--shard-count', '2', '--quiet', '--out', out], { JOB_COMPLETION_INDEX: '0' });
    expect(first.code, first.stderr).toBe(0);
    const second = await startCli(['report', DEMO, '--shard', 'auto', '--shard-count', '2', '--quiet', '--out', out], { JOB_COMPLETION_INDEX: '1' });
    expect(second.code, second.stderr).toBe(2);
    expect(second.stderr).toMatch(ONE_LINE_ERROR);
    expect(second.stderr).toMatch(/rep-shared holds shard 1\/2 of a report, and this run is shard 2\/2 \(--out\) — give each shard its own folder, e\.g\. --out .*rep-shared-2\n$/);
    expect(JSON.parse(readFileSync(join(out, 'shard.json'), 'utf8')).shard.index, 'the first shard\'s files are kept').toBe(1);
    const retried = await startCli(['report', DEMO, '--shard', 'auto', '--shard-count', '2', '--quiet', '--out', out], { JOB_COMPLETION_INDEX: '0' });
    expect(retried.code, retried.stderr).toBe(0);
  }, 240_000);

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
