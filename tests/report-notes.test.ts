/**
 * Notes and warnings reach every output format, not only the terminal (contract.md, Version 2
 * "Notes": JSON `notes: [string]`, CSV `#` lines before the header; text and HTML as the report
 * issue asks). Source: common practice for machine-readable outputs (a CSV reader skips `#` lines
 * with a comment option, e.g. csv-parse `comment: '#'`); no numeric reference values here.
 * Fixture: tests/fixtures/report/flight-and-orbit.yaml (invented; see its README).
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parse } from 'csv-parse/sync';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from './helpers/cli.ts';

const SCENARIO = 'tests/fixtures/report/flight-and-orbit.yaml';
const FLIGHT_NOTE = /HOP-1: sub-orbital flight from 2027-01-04T01:00:00\.000Z to 2027-01-04T01:07:16\.\d{3}Z; reported over its flight only/;
const GEOID_NOTE = /station NORTHFIELD has no geoidHeightM: .* up to about 1\.1e[-−]14/;
const dir = mkdtempSync(join(tmpdir(), 'tauplan-notes-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('notes in every format (passes of a scenario with a sub-orbital flight)', () => {
  it('text: NOTE lines', () => {
    const r = runCli(['passes', SCENARIO, '--quiet']);
    expect(r.code, r.stderr).toBe(0);
    expect(r.stdout).toMatch(new RegExp(`NOTE: ${FLIGHT_NOTE.source}`));
  });

  it('JSON: notes array', () => {
    const r = runCli(['passes', SCENARIO, '--format', 'json', '--quiet']);
    expect(r.code, r.stderr).toBe(0);
    const j = JSON.parse(r.stdout) as { notes: string[] };
    expect(j.notes.some((n) => FLIGHT_NOTE.test(n)), JSON.stringify(j.notes)).toBe(true);
  });

  it('CSV: # lines before the header, skipped by a CSV reader with a comment option', () => {
    const r = runCli(['passes', SCENARIO, '--format', 'csv', '--quiet']);
    expect(r.code, r.stderr).toBe(0);
    const lines = r.stdout.split('\n');
    const header = lines.findIndex((l) => l.startsWith('satellite,'));
    expect(header).toBeGreaterThan(0);
    expect(lines.slice(0, header).every((l) => l.startsWith('# NOTE: '))).toBe(true);
    expect(lines.slice(0, header).some((l) => FLIGHT_NOTE.test(l))).toBe(true);
    const rows = parse(r.stdout, { comment: '#', columns: true }) as Record<string, string>[];
    expect(rows.length).toBeGreaterThan(0);
    expect(rows[0].satellite).toBe('TSR-1');
  });

  it('HTML: a notes box at the top, before the first section', () => {
    const r = runCli(['passes', SCENARIO, '--format', 'html', '--quiet']);
    expect(r.code, r.stderr).toBe(0);
    const box = r.stdout.indexOf('<div class="notes"');
    expect(box).toBeGreaterThan(0);
    expect(box).toBeLessThan(r.stdout.indexOf('<section>'));
    expect(r.stdout.slice(box)).toMatch(FLIGHT_NOTE);
  });

  it('compare: the missing geoid undulation as a note in text, JSON, CSV and HTML', () => {
    const text = runCli(['compare', SCENARIO, '--quiet']);
    expect(text.stdout).toMatch(GEOID_NOTE);
    const json = JSON.parse(runCli(['compare', SCENARIO, '--format', 'json', '--quiet']).stdout) as { notes: string[] };
    expect(json.notes.some((n) => GEOID_NOTE.test(n))).toBe(true);
    const csv = runCli(['compare', SCENARIO, '--format', 'csv', '--quiet']).stdout;
    expect(csv.split('\n')[0]).toMatch(GEOID_NOTE);
    expect(csv).toMatch(/^TSR-1 - HOP-1,pair,/m);
    expect(runCli(['compare', SCENARIO, '--format', 'html', '--quiet']).stdout).toMatch(GEOID_NOTE);
  });

  it('report: every file carries the notes, the leap-second expiry note included', () => {
    const out = join(dir, 'report');
    const r = runCli(['report', SCENARIO, '--out', out]);
    expect(r.code, r.stderr).toBe(0);
    // The 180-day keep-in horizon runs past the packaged table's expiry (2027-06-28): one stderr line, and notes.
    expect(r.stderr.match(/warning/g)?.length).toBe(1);
    for (const f of ['report.html', 'passes.txt', 'passes.csv', 'passes.json', 'resets.txt', 'resets.csv', 'resets.json', 'size.txt', 'size.csv', 'size.json', 'compare.txt', 'compare.csv', 'compare.json']) {
      const body = readFileSync(join(out, f), 'utf8');
      expect(body, f).toMatch(FLIGHT_NOTE);
      expect(body, f).toMatch(GEOID_NOTE);
      expect(body, f).toMatch(/leap-second table expires/);
    }
    expect(readFileSync(join(out, 'report.html'), 'utf8')).toContain('README.md');
  });
});
