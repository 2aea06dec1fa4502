/**
 * Smoke test of scripts/bench.ts (`npm run bench`), in its tiny mode: it runs end to end and writes
 * bench-results.json with the six keys of the "Speed and scale" issue the stability issue's stabilityPointsPerSecond and fitAllClocksPerSecond (issue 14), and the
 * scenario-command figures of issue 21 (resetsVsFloor, passesVsFloor, coldStartVsNode, resetsRssGrowth6x,
 * shardsVsOne), each a plain finite number.
 * Reference: the list of figures (common practice for a benchmark harness check). The goals
 * themselves are not asserted here: timings on a shared CI machine are not a correctness property.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const ROOT = fileURLToPath(new URL('..', import.meta.url));
const KEYS = ['pipelineVsBulk', 'pipelineVsNaive', 'passSearchStateFraction', 'twoWorkersVsOne', 'rssGrowth10x', 'statesPerSatelliteDay', 'stabilityPointsPerSecond', 'fitAllClocksPerSecond', 'resetsVsFloor', 'passesVsFloor', 'coldStartVsNode', 'resetsRssGrowth6x', 'shardsVsOne'];

describe('bench (tiny mode)', () => {
  it('writes exactly the thirteen keys as finite positive numbers', () => {
    const dir = mkdtempSync(join(tmpdir(), 'tauplan-bench-smoke-'));
    try {
      const results = join(dir, 'bench-results.json');
      const r = spawnSync(process.execPath, ['--import', 'tsx', 'scripts/bench.ts', '--tiny', '--results', results, '--work-dir', dir], { cwd: ROOT, encoding: 'utf8' });
      expect(r.status, r.stderr).toBe(0);
      const json = JSON.parse(readFileSync(results, 'utf8')) as Record<string, unknown>;
      expect(Object.keys(json).sort()).toEqual([...KEYS].sort());
      for (const k of KEYS) {
        expect(typeof json[k], k).toBe('number');
        expect(Number.isFinite(json[k]) && (json[k] as number) > 0, `${k} = ${String(json[k])}`).toBe(true);
      }
      // The printed table names every figure.
      for (const k of KEYS) expect(r.stdout).toContain(k);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  }, 180_000);
});
