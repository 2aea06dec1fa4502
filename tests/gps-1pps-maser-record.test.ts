/**
 * Real data: a GPS receiver's 1PPS against a hydrogen maser's 1PPS, time-interval counter, phase
 * in seconds at 1 s, 241 218 points (March 2016; public, from the allantools test folder; see
 * ../shared/realdata/README.md). The file is read where it lies and never copied here; without
 * ../shared the test skips with a message.
 *
 * Check: every statistic of the stability table against an independent computation written
 * here, the plain slow direct sum of each definition (NIST SP 1065 §5.2.4, 5.2.5, 5.2.6, 5.2.9),
 * to 1e-9 relative (both are double sums of ~1e5 squares; rounding differs at ~1e-13).
 * MDEV/TDEV's direct sum costs N·m, so it is checked up to m = 1024.
 */
import { existsSync, readFileSync } from 'node:fs';
import { gunzipSync } from 'node:zlib';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { stabilityTable } from '../src/clock/stabilityTable.ts';

const FILE = resolve(process.cwd(), '../shared/realdata/stability-gps-1pps/gps_1pps_phase_data.txt.gz');
const present = existsSync(FILE);
if (!present) console.warn(`SKIPPED gps-1pps-maser-record: ${FILE} is absent (no ../shared/realdata here)`);

function readPhase(): Float64Array {
  const text = gunzipSync(readFileSync(FILE)).toString('utf8');
  const out: number[] = [];
  for (const line of text.split('\n')) {
    const t = line.trim();
    if (t === '' || t.startsWith('#')) continue;
    out.push(Number(t));
  }
  return Float64Array.from(out);
}

/** Direct sums of the definitions, no running sums, no shared code. */
function directOadev(x: Float64Array, m: number): number {
  let s = 0;
  const n = x.length - 2 * m;
  for (let i = 0; i < n; i++) s += (x[i + 2 * m] - 2 * x[i + m] + x[i]) ** 2;
  return Math.sqrt(s / (2 * m * m * n));
}
function directOhdev(x: Float64Array, m: number): number {
  let s = 0;
  const n = x.length - 3 * m;
  for (let i = 0; i < n; i++) s += (x[i + 3 * m] - 3 * x[i + 2 * m] + 3 * x[i + m] - x[i]) ** 2;
  return Math.sqrt(s / (6 * m * m * n));
}
function directMdev(x: Float64Array, m: number): number {
  let s = 0;
  const n = x.length - 3 * m + 1;
  for (let j = 0; j < n; j++) {
    let inner = 0;
    for (let i = j; i < j + m; i++) inner += x[i + 2 * m] - 2 * x[i + m] + x[i];
    s += inner * inner;
  }
  return Math.sqrt(s / (2 * m * m * m * m * n));
}

const REL = 1e-9;
function close(got: number | undefined, want: number, label: string): void {
  expect(got, label).toBeDefined();
  const rel = Math.abs((got as number) - want) / want;
  expect(rel, `${label}: wanted ${want}, got ${got}, relative difference ${rel.toExponential(2)}`).toBeLessThan(REL);
}

describe.skipIf(!present)('GPS 1PPS against a hydrogen maser (real record)', () => {
  const x = present ? readPhase() : new Float64Array(0);
  const t0 = Date.now();
  const table = present ? stabilityTable({ xS: x, tau0S: 1 }, { source: 'gps_1pps_phase_data.txt.gz' }) : null;
  const elapsedMs = Date.now() - t0;

  it('reads 241 218 points and gives OADEV, MDEV, TDEV, HDEV with 68 % and 95 % intervals at every octave τ', () => {
    expect(x.length).toBe(241218);
    const t = table!;
    expect(t.missing).toBe(0);
    console.log(`1PPS record: ${t.points} points, table in ${elapsedMs} ms`);
    console.log(' tau[s]  alpha  OADEV       MDEV        TDEV[s]     OHDEV');
    for (const r of t.rows) {
      console.log(`${String(r.tauS).padStart(7)}  ${String(r.alpha).padStart(5)}  ${r.oadev?.value.toExponential(3)}  ${r.mdev?.value.toExponential(3) ?? '—'}  ${r.tdevS?.value.toExponential(3) ?? '—'}  ${r.ohdev?.value.toExponential(3) ?? '—'}`);
      for (const s of [r.oadev, r.mdev, r.tdevS, r.ohdev]) {
        if (s === null) continue;
        expect(s.ci95[0]).toBeLessThanOrEqual(s.ci68[0]);
        expect(s.ci68[0]).toBeLessThanOrEqual(s.value);
        expect(s.value).toBeLessThanOrEqual(s.ci68[1]);
        expect(s.ci68[1]).toBeLessThanOrEqual(s.ci95[1]);
      }
    }
    expect(t.rows.map((r) => r.m)).toEqual(Array.from({ length: 17 }, (_, k) => 2 ** k));
    // A noise type wherever the decimated record has ≥ 30 points (m ≤ 8192).
    for (const r of t.rows) if (r.m <= 8192) expect(r.alpha, `m=${r.m}`).not.toBeNull();
  });

  it('OADEV and overlapping HDEV equal the direct sums at every octave τ (1e-9 relative)', () => {
    for (const r of table!.rows) {
      close(r.oadev?.value, directOadev(x, r.m), `OADEV(${r.tauS} s)`);
      if (r.ohdev !== null) close(r.ohdev.value, directOhdev(x, r.m), `OHDEV(${r.tauS} s)`);
    }
  });

  it('MDEV and TDEV equal the direct nested sums up to m = 1024 (1e-9 relative)', () => {
    for (const r of table!.rows) {
      if (r.m > 1024) continue;
      const mdev = directMdev(x, r.m);
      close(r.mdev?.value, mdev, `MDEV(${r.tauS} s)`);
      close(r.tdevS?.value, (r.tauS / Math.sqrt(3)) * mdev, `TDEV(${r.tauS} s)`);
    }
  }, 120_000);
});
