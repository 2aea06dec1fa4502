/**
 * `tauplan stability` through the real CLI: the JSON of the contract's "Version 2 additions"
 * (`{ tau0S, points, missing, rows: [{ tauS, m, alpha, oadev, mdev, tdevS, ohdev }] }`, each
 * statistic `{ value, edf, ci68, ci95 }` or null), and good real-world input (gzip, CRLF, BOM,
 * NaN samples skipped and counted, all values equal). Inputs are invented here; the reference
 * values are the NIST SP 1065 Table 30 figures (confirmed) for the NBS 9-point set.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from './helpers/cli.ts';

const dir = mkdtempSync(join(tmpdir(), 'tauplan-stability-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const NBS9 = [892, 809, 823, 798, 671, 644, 883, 903, 677];

function json(args: string[]) {
  const r = runCli([...args, '--format', 'json']);
  expect(r.code, r.stderr).toBe(0);
  return JSON.parse(r.stdout);
}

describe('tauplan stability', () => {
  it('frequency data, gzip + CRLF + BOM + comments: the contract JSON with SP 1065 Table 30 values', () => {
    const text = '\ufeff# NBS 9-point set (SP 1065 §12.1)\r\n' + NBS9.join('\r\n') + '\r\n';
    const file = join(dir, 'nbs.txt.gz');
    writeFileSync(file, gzipSync(text));
    const j = json(['stability', file, '--tau0', '1s', '--data', 'frequency']);
    expect(j.tau0S).toBe(1);
    expect(j.points).toBe(9);
    expect(j.missing).toBe(0);
    expect(j.rows.map((r: { m: number }) => r.m)).toEqual([1, 2, 4]);
    const r2 = j.rows[1];
    expect(Object.keys(r2)).toEqual(expect.arrayContaining(['tauS', 'm', 'alpha', 'oadev', 'mdev', 'tdevS', 'ohdev']));
    for (const [k, want] of [
      ['oadev', 85.95287],
      ['mdev', 74.78849],
      ['tdevS', 86.35831],
      ['ohdev', 85.61487],
    ] as const) {
      const s = r2[k];
      expect(Math.abs(s.value - want), `${k}(2): wanted ${want}, got ${s.value}`).toBeLessThan(5e-5);
      expect(s.edf).toBeGreaterThan(0);
      expect(s.ci95[0]).toBeLessThan(s.ci68[0]);
      expect(s.ci68[1]).toBeLessThan(s.ci95[1]);
    }
    // 9 samples: too few for a noise type at any τ (fewer than 30 points) — null, not a guess.
    expect(r2.alpha).toBeNull();
    // τ = 4 s: OADEV has 2 terms; MDEV/OHDEV need 3m + 1 = 13 phase points: null.
    expect(j.rows[2].mdev).toBeNull();
    expect(j.rows[2].ohdev).toBeNull();
  });

  it('NaN samples are skipped and counted as missing; the terms around them are left out', () => {
    const lines = Array.from({ length: 200 }, (_, i) => (i === 50 || i === 120 ? 'NaN' : String(1e-9 * Math.sin(i * 0.7))));
    const file = join(dir, 'gaps.txt');
    writeFileSync(file, lines.join('\n'));
    const j = json(['stability', file, '--tau0', '10s']);
    expect(j.points).toBe(198);
    expect(j.missing).toBe(2);
    expect(j.tau0S).toBe(10);
    expect(j.notes.join(' ')).toMatch(/2 sample\(s\) missing/);
  });

  it('all values equal: deviations 0, not NaN', () => {
    const file = join(dir, 'flat.txt');
    writeFileSync(file, Array.from({ length: 64 }, () => '2.5e-7').join('\n'));
    const j = json(['stability', file, '--tau0', '1s']);
    for (const r of j.rows) expect(r.oadev.value).toBe(0);
  });

  it('a time,offsetNs CSV with a gap gets a table on its grid, with the gap counted', () => {
    const rows = ['time,offsetNs'];
    for (let k = 0; k < 120; k++) {
      if (k >= 40 && k < 45) continue;
      const mm = String(k % 60).padStart(2, '0');
      const hh = String(Math.floor(k / 60)).padStart(2, '0');
      rows.push(`2027-01-01T${hh}:${mm}:00Z,${(0.3 * k + Math.cos(k)).toFixed(4)}`);
    }
    const file = join(dir, 'offsets.csv');
    writeFileSync(file, rows.join('\n'));
    const j = json(['stability', file]);
    expect(j.tau0S).toBe(60);
    expect(j.missing).toBe(5);
    expect(j.rows[0].oadev.value).toBeGreaterThan(0);
  });

  it('text, CSV and HTML carry the table and the planning caution', () => {
    const file = join(dir, 'nbs-text.txt');
    writeFileSync(file, NBS9.join('\n'));
    const t = runCli(['stability', file, '--tau0', '1s', '--data', 'frequency']);
    expect(t.code).toBe(0);
    expect(t.stdout).toMatch(/OHDEV/);
    expect(t.stdout).toMatch(/Planning aid/);
    const c = runCli(['stability', file, '--tau0', '1s', '--data', 'frequency', '--format', 'csv']);
    expect(c.stdout.split('\n').find((l) => l.startsWith('tauS'))).toMatch(/^tauS,m,alpha,oadev,oadevEdf/);
    const h = runCli(['stability', file, '--tau0', '1s', '--data', 'frequency', '--format', 'html']);
    expect(h.code).toBe(0);
    expect(h.stdout).toMatch(/<svg/);
  });
});
