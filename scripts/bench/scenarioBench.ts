/**
 * The scenario-command figures of `npm run bench` (issue 21), on the INVENTED "Lattice"
 * constellation (scripts/bench/constellation.ts: 24 satellites, 18 MEO + 6 LEO, 8 stations):
 *
 *   resetsVsFloor      wall time of `resets --horizon 180d --jobs 1` ÷ (orbit states it evaluated ×
 *                      the per-state time of satellite.js's WASM bulk SGP4 on the same satellites,
 *                      measured in this run). Goal ≤ 1.5.
 *   passesVsFloor      the same for `passes` over 7 days with 8 stations (--jobs 1). Goal ≤ 1.5.
 *   coldStartVsNode    wall time of `tauplan time 2027-01-01T00:00:00Z` ÷ `node -e 0` (best of 5
 *                      each, whole processes). Goal ≤ 4.
 *   resetsRssGrowth6x  peak RSS of the 180-day resets run ÷ a 30-day run. Goal ≤ 1.3.
 *   shardsVsOne        wall time of 2 concurrent `--shard K/2` processes (resets 180 d, --jobs 1
 *                      each) ÷ the one process. Goal ≤ 0.6. Their merge must equal the one run's bytes.
 *                      Printed beside it: its bound, the one run's CPU time over two cores ÷ its
 *                      wall time (what shards with no start-up or compilation of their own reach).
 *
 * Wall times are whole child processes (node start-up, module loading and the output written), as
 * a user waits for them, each the fastest of three takes (the floor is the best of its repeats too).
 * The state count comes from the CLI's own counter (src/orbit/stateCount.ts),
 * read by scripts/bench/child.mjs after the run: nothing is hard-coded.
 */
import { spawn } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { BulkPropagator, createSingleThreadRuntime, EciBaseCalculator, twoline2satrec } from 'satellite.js';
import { benchScenarioYaml } from './constellation.ts';

const CHILD = fileURLToPath(new URL('./child.mjs', import.meta.url));
const BIN = fileURLToPath(new URL('../../bin/tauplan.mjs', import.meta.url));

/** One child run's report. */
export interface ChildRun {
  code: number;
  /** Wall time of the whole process [ms] (spawn to exit, measured by the parent). */
  processMs: number;
  /** The command's own time [ms]: from the CLI's main() to its return (no Node start-up, no entry module). */
  mainMs: number;
  /** CPU time of the process, every thread, user + system [ms]. */
  cpuMs: number;
  /** Peak RSS [kB]. */
  maxRssKb: number;
  states: number;
  propagations: number;
  stderr: string;
}

/** Run `node scripts/bench/child.mjs ARGS` (asynchronously, so several can run at once). */
export function childRun(args: string[]): Promise<ChildRun> {
  return new Promise((resolve, reject) => {
    const t0 = performance.now();
    const p = spawn(process.execPath, [CHILD, ...args], { stdio: ['ignore', 'pipe', 'pipe'] });
    let out = '';
    let err = '';
    p.stdout.on('data', (d: Buffer) => (out += d.toString()));
    p.stderr.on('data', (d: Buffer) => (err += d.toString()));
    p.on('error', reject);
    p.on('close', (status) => {
      const processMs = performance.now() - t0;
      const line = out.split('\n').find((l) => l.startsWith('BENCH-CHILD '));
      if (line === undefined) return reject(new Error(`child run failed (status ${status}): ${err}`));
      const r = JSON.parse(line.slice('BENCH-CHILD '.length)) as { code: number; mainMs: number; cpuMs: number; maxRssKb: number; states: number; propagations: number };
      if (r.code !== 0) return reject(new Error(`tauplan ${args.join(' ')} exited ${r.code}: ${err}`));
      resolve({ ...r, processMs, stderr: err });
    });
  });
}

/** Wall time [ms] of one whole process `node ARGS` (stdout discarded). */
function processMs(args: string[]): Promise<number> {
  return new Promise((resolve, reject) => {
    const t0 = performance.now();
    const p = spawn(process.execPath, args, { stdio: ['ignore', 'ignore', 'pipe'] });
    let err = '';
    p.stderr.on('data', (d: Buffer) => (err += d.toString()));
    p.on('error', reject);
    p.on('close', (status) => (status === 0 ? resolve(performance.now() - t0) : reject(new Error(`node ${args.join(' ')} exited ${status}: ${err}`))));
  });
}

/** The fastest of `n` runs, with the largest peak RSS among them. */
async function bestRun(n: number, f: () => Promise<ChildRun>): Promise<ChildRun> {
  const runs: ChildRun[] = [];
  for (let i = 0; i < n; i++) runs.push(await f());
  const fastest = runs.reduce((a, b) => (b.processMs < a.processMs ? b : a));
  return { ...fastest, maxRssKb: Math.max(...runs.map((r) => r.maxRssKb)) };
}

async function bestOf(n: number, f: () => Promise<number>): Promise<number> {
  let m = Infinity;
  for (let i = 0; i < n; i++) m = Math.min(m, await f());
  return m;
}

/**
 * Per-state time [ns] of satellite.js's WASM BulkPropagator on the scenario's element sets: each
 * satellite propagated to `perSat` instants spread over `spanDays` (Dates built beforehand, untimed),
 * the best of `repeats`; set-up of the records and the copy to metres included, as in the
 * catalogue figure.
 */
async function bulkNsPerState(yaml: string, perSat: number, spanDays: number, repeats: number): Promise<number> {
  const lines = yaml.split('\n').map((l) => l.trim());
  const recs: [string, string][] = [];
  for (let i = 0; i < lines.length - 1; i++) if (lines[i].startsWith('1 ') && lines[i + 1].startsWith('2 ')) recs.push([lines[i], lines[i + 1]]);
  const runtime = await createSingleThreadRuntime();
  const bulk = new BulkPropagator({ runtime, calculators: [new EciBaseCalculator()] as const, satRecsCount: 1, datesCount: 1 });
  const out = new Float64Array(3 * perSat);
  const dates = recs.map(([l1, l2]) => {
    const s = twoline2satrec(l1, l2);
    const ep = (s.jdsatepoch - 2440587.5) * 86_400_000;
    return Array.from({ length: perSat }, (_, i) => new Date(Math.round(ep + (i * spanDays * 86_400_000) / perSat)));
  });
  let best = Infinity;
  for (let r = 0; r <= repeats; r++) {
    const t0 = performance.now();
    recs.forEach(([l1, l2], k) => {
      bulk.setSatRecs([twoline2satrec(l1, l2)]);
      bulk.setDates(dates[k]);
      bulk.run();
      const raw = bulk.getRawOutput().eci;
      for (let i = 0; i < 3 * perSat; i++) out[i] = raw.position[i] * 1000 + raw.velocity[i] * 1000;
    });
    if (r > 0) best = Math.min(best, performance.now() - t0); // the first run warms up
  }
  bulk.dispose();
  return (best * 1e6) / (recs.length * perSat);
}

/** The five figures and the absolute numbers printed beside them. */
export interface ScenarioFigures {
  resetsVsFloor: number;
  passesVsFloor: number;
  coldStartVsNode: number;
  resetsRssGrowth6x: number;
  shardsVsOne: number;
  /**
   * Printed beside the figures, not goals of their own: the same floor ratios over the command's
   * own time (start-up excluded: coldStartVsNode covers it). A whole `passes` process cannot reach
   * 1.5 × its floor when Node's and tauplan's start-up alone exceed it; these show what the command
   * itself costs per state.
   */
  resetsInProcessVsFloor: number;
  passesInProcessVsFloor: number;
  rows: [string, string, string, string][];
}

/** Run the scenario figures in `workDir` (tiny: 4 satellites and short horizons, for the smoke test). */
export async function scenarioFigures(workDir: string, tiny: boolean, log: (s: string) => void): Promise<ScenarioFigures> {
  const sats = tiny ? 4 : 24;
  const longDays = tiny ? 6 : 180;
  const shortDays = tiny ? 1 : 30;
  const passDays = tiny ? 1 : 7;
  const yaml = benchScenarioYaml({ sats, windowDays: passDays });
  const file = join(workDir, 'lattice-invented.yaml');
  writeFileSync(file, yaml);
  const resetsArgs = (days: number, out: string, extra: string[] = []): string[] => ['resets', file, '--horizon', `${days}d`, '--jobs', '1', '--format', 'json', '--out', join(workDir, out), ...extra];

  log(`scenario runs: invented ${sats}-satellite constellation; resets ${longDays} d and ${shortDays} d, passes ${passDays} d × 8 stations (--jobs 1)`);
  const nsPerState = await bulkNsPerState(yaml, tiny ? 2000 : 20000, longDays, tiny ? 1 : 3);
  // Each timed command runs `takes` times, and the fastest take counts (as the floor above is the
  // best of its repeats): this VM's speed drifts by ±25 % between runs of one fixed loop, and the
  // fastest take is the one least slowed by others. Peak RSS is the largest over the takes.
  const takes = tiny ? 1 : 3;
  const resetsLong = await bestRun(takes, () => childRun(resetsArgs(longDays, 'resets-long.json')));
  const resetsShort = await bestRun(takes, () => childRun(resetsArgs(shortDays, 'resets-short.json')));
  const passes = await bestRun(takes, () => childRun(['passes', file, '--jobs', '1', '--format', 'json', '--out', join(workDir, 'passes.json')]));

  // Two shard processes at once (--shard 1/2 and 2/2), then a check that merge gives the one run's bytes.
  let shardsMs = Infinity;
  let shardRuns: ChildRun[] = [];
  for (let take = 0; take < takes; take++) {
    const t0 = performance.now();
    const runs = await Promise.all([1, 2].map((k) => childRun(resetsArgs(longDays, `resets-shard${k}.json`, ['--shard', `${k}/2`]))));
    const ms = performance.now() - t0;
    if (ms < shardsMs) [shardsMs, shardRuns] = [ms, runs];
  }
  await childRun(['merge', join(workDir, 'resets-shard1.json'), join(workDir, 'resets-shard2.json'), '--out', join(workDir, 'resets-merged.json'), '--quiet']);
  if (readFileSync(join(workDir, 'resets-merged.json'), 'utf8') !== readFileSync(join(workDir, 'resets-long.json'), 'utf8')) throw new Error('merged shards differ from the one-process run');

  const best = tiny ? 2 : 5;
  const nodeMs = await bestOf(best, () => processMs(['-e', '0']));
  const timeMs = await bestOf(best, () => processMs([BIN, 'time', '2027-01-01T00:00:00Z']));
  // Start-up of two more commands (issue 21 item 2): no work beyond parsing, and one small sizing.
  const versionMs = await bestOf(best, () => processMs([BIN, '--version']));
  const sizeMs = await bestOf(best, () => processMs([BIN, 'size', '--a-km', '26560', '--e', '0.01', '--i-deg', '55']));

  const floorMs = (states: number): number => (states * nsPerState) / 1e6;
  const cores = Math.min(2, availableParallelism());
  const fig: ScenarioFigures = {
    resetsVsFloor: resetsLong.processMs / floorMs(resetsLong.states),
    passesVsFloor: passes.processMs / floorMs(passes.states),
    coldStartVsNode: timeMs / nodeMs,
    resetsRssGrowth6x: resetsLong.maxRssKb / resetsShort.maxRssKb,
    shardsVsOne: shardsMs / resetsLong.processMs,
    resetsInProcessVsFloor: resetsLong.mainMs / floorMs(resetsLong.states),
    passesInProcessVsFloor: passes.mainMs / floorMs(passes.states),
    rows: [],
  };
  const f = (x: number, d = 2): string => x.toFixed(d);
  const s = (ms: number): string => `${f(ms / 1000)} s`;
  const per = (r: ChildRun): string => `${(r.states / 1e6).toFixed(2)} M states (${f(r.propagations / Math.max(1, r.states))} SGP4 calls each)`;
  const cpuOf = (rs: ChildRun[]): number => rs.reduce((a, r) => a + r.cpuMs, 0);
  fig.rows = [
    ['resetsVsFloor', f(fig.resetsVsFloor, 3), '≤ 1.5', `resets ${longDays} d: ${s(resetsLong.processMs)}; floor ${s(floorMs(resetsLong.states))} = ${per(resetsLong)} × ${f(nsPerState, 0)} ns (WASM bulk SGP4)`],
    ['  (in process)', f(fig.resetsInProcessVsFloor, 3), '—', `the command's own ${s(resetsLong.mainMs)} ÷ the same floor (start-up excluded)`],
    ['passesVsFloor', f(fig.passesVsFloor, 3), '≤ 1.5', `passes ${passDays} d × 8 stations: ${s(passes.processMs)}; floor ${s(floorMs(passes.states))} = ${per(passes)} × ${f(nsPerState, 0)} ns`],
    ['  (in process)', f(fig.passesInProcessVsFloor, 3), '—', `the command's own ${s(passes.mainMs)} ÷ the same floor; start-up (${f(timeMs, 0)} ms for \`time\`) alone is ${f(timeMs / floorMs(passes.states), 1)}× this floor`],
    ['coldStartVsNode', f(fig.coldStartVsNode, 3), '≤ 4', `tauplan time: ${f(timeMs, 0)} ms; node -e 0: ${f(nodeMs, 0)} ms; --version ${f(versionMs, 0)} ms; a Keplerian size ${f(sizeMs, 0)} ms (best of ${best})`],
    ['resetsRssGrowth6x', f(fig.resetsRssGrowth6x, 3), '≤ 1.3', `peak RSS ${f(resetsLong.maxRssKb / 1024, 0)} MB (${longDays} d) vs ${f(resetsShort.maxRssKb / 1024, 0)} MB (${shortDays} d); ${shortDays}-d run ${s(resetsShort.processMs)}`],
    ['shardsVsOne', f(fig.shardsVsOne, 3), '≤ 0.6', `2 shard processes at once ${s(shardsMs)} vs one process ${s(resetsLong.processMs)}; CPU (all threads) ${s(cpuOf(shardRuns))} vs ${s(resetsLong.cpuMs)}`],
    // Two processes on this machine's cores cannot finish before the one run's CPU time, spread over
    // them, even with no start-up or compilation of their own: the one run already uses the second
    // core for V8's background work. Printed so that the figure can be read against it.
    ['  (bound)', f(resetsLong.cpuMs / (cores * resetsLong.processMs), 3), '—', `shards with no cost of their own: the one run's CPU ${s(resetsLong.cpuMs)} over ${cores} cores ÷ its wall time`],
  ];
  return fig;
}
