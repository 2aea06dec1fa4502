/**
 * The whole-job report printed on paper loses nothing. Source: W3C CSS Paged Media Module Level 3
 * (`@page { size: A4 landscape }`) and CSS Fragmentation Level 3 (`break-inside: avoid`, table
 * headers repeated through `display: table-header-group`), as Chromium implements them in
 * `page.pdf`. The text of the PDF comes from poppler's pdftotext. Expectations are common practice
 * for printed tables (every column and every row present), not numeric reference values.
 * Needs /usr/bin/chromium and /usr/bin/pdftotext (poppler-utils); it fails, not skips, without them.
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { passTable } from '../src/report/htmlReport.ts';
import { defaultTimeSystem } from '../src/io/tables.ts';
import { pdfText, renderInChromium } from './helpers/browser.ts';
import { runCli } from './helpers/cli.ts';

const dir = mkdtempSync(join(tmpdir(), 'tauplan-print-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Whitespace-collapsed text, so a header that wraps inside its cell still matches. */
const squash = (s: string): string => s.replace(/\s+/g, ' ');

describe('the report printed to PDF', () => {
  it('keeps every pass-table column header and every pass row (satellite, station, AOS)', async () => {
    const out = join(dir, 'demo');
    const run = runCli(['report', 'data/demo/tessera.yaml', '--out', out, '--quiet']);
    expect(run.code, run.stderr).toBe(0);
    const html = readFileSync(join(out, 'report.html'), 'utf8');
    const r = await renderInChromium(html, { pdf: true });
    expect(r.pdfPath).not.toBeNull();
    const { text, pages } = pdfText(r.pdfPath as string);
    if (process.env.TAUPLAN_KEEP_SCREENSHOT) console.log(`printed report: ${r.pdfPath} (${pages} pages)`);
    expect(pages).toBeGreaterThan(3);
    const flat = squash(text);

    // Every column of the pass table, with its unit line.
    const columns = passTable(defaultTimeSystem(), []).columns.map((c) => (typeof c === 'string' ? { label: c } : c));
    for (const c of columns) {
      expect(flat, `column header ${c.label}`).toContain(c.label);
      if (c.unit !== undefined) expect(flat, `unit of ${c.label}`).toContain(c.unit);
    }

    // Every pass: satellite, station, the AOS date (group row) and time of day, in both parts of the table.
    const passes = (JSON.parse(readFileSync(join(out, 'passes.json'), 'utf8')) as { passes: { satellite: string; station: string; aos: string }[] }).passes;
    expect(passes.length).toBeGreaterThan(10);
    const count = (needle: string): number => flat.split(needle).length - 1;
    for (const p of passes) {
      expect(flat, `satellite ${p.satellite}`).toContain(p.satellite);
      expect(flat, `station ${p.station}`).toContain(p.station);
      expect(flat, `AOS date ${p.aos}`).toContain(p.aos.slice(0, 10));
      const hms = p.aos.slice(11, 19);
      const wanted = 2 * passes.filter((q) => q.aos.slice(11, 19) === hms).length;
      expect(count(hms), `AOS ${p.aos} of ${p.satellite} over ${p.station}: wanted at least ${wanted} occurrences (two table parts)`).toBeGreaterThanOrEqual(wanted);
    }
    // The caution and the pointer to the README survive printing.
    expect(flat).toMatch(/Planning aid only/);
    expect(flat).toContain('README.md');
    if (!process.env.TAUPLAN_KEEP_SCREENSHOT) rmSync(r.outDir, { recursive: true, force: true });
  });
});
