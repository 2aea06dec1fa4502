/**
 * The demo as a user runs it (`tauplan demo`, which `npm start` calls), and its HTML report in
 * headless Chromium: plots drawn, no console errors, no network requests, no scripts. A second
 * scenario with hostile satellite and station names checks that nothing in the report runs and
 * that CSV cells cannot start a spreadsheet formula (common practice: OWASP CSV injection advice).
 */
import { existsSync, mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { renderInChromium } from './helpers/browser.ts';
import { runCli } from './helpers/cli.ts';

const dir = mkdtempSync(join(tmpdir(), 'tauplan-demo-test-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('tauplan demo', () => {
  it('writes the report and the data files and says where', async () => {
    const out = join(dir, 'demo');
    const run = runCli(['demo', '--out', out]);
    expect(run.code, run.stderr).toBe(0);
    expect(run.stdout).toContain(join(out, 'report.html'));
    expect(run.stdout).toMatch(/Planning aid only/);
    for (const f of ['report.html', 'passes.csv', 'passes.json', 'resets.csv', 'resets.json', 'size.csv', 'fit.json', 'compare.json', 'sweep.csv']) {
      expect(existsSync(join(out, f)), f).toBe(true);
    }
    expect(readdirSync(out).some((f) => f.startsWith('.tauplan-tmp-'))).toBe(false);
    const passes = JSON.parse(readFileSync(join(out, 'passes.json'), 'utf8')) as { passes: { aos: string; los: string }[] };
    expect(passes.passes.length).toBeGreaterThan(10);
    const resets = JSON.parse(readFileSync(join(out, 'resets.json'), 'utf8')) as { satellites: { adjustments: unknown[] }[] };
    expect(resets.satellites.some((s) => s.adjustments.length > 0), 'the demo plan is not empty').toBe(true);

    const html = readFileSync(join(out, 'report.html'), 'utf8');
    expect(html).toMatch(/invented/i);
    const r = await renderInChromium(html);
    expect(r.consoleErrors).toEqual([]);
    expect(r.pageErrors).toEqual([]);
    expect(r.networkRequests).toEqual([]);
    expect(r.forbiddenElementCount.script).toBe(0);
    expect(r.svgCount).toBeGreaterThanOrEqual(10);
    expect(r.svgPathCount).toBeGreaterThanOrEqual(15); // at least one drawn curve per plot
    expect(r.bodyText).toMatch(/Planning aid only/);
    expect(r.screenshotBytes).toBeGreaterThan(50_000);
  });
});

describe('hostile names', () => {
  it('are escaped in the HTML report (no script runs) and neutralised in CSV', async () => {
    const scenario = readFileSync(new URL('../data/demo/tessera.yaml', import.meta.url), 'utf8')
      .replace('name: TESSERA 1\n', `name: "<script>alert('x')</script> & \\"quoted\\" =HYPERLINK(1)"\n`)
      .replace('id: BRINDLEMOOR', `id: "=cmd|'/C calc'!A0<img src=x onerror=alert(2)>"`);
    const file = join(dir, 'hostile.yaml');
    writeFileSync(file, scenario);
    const htmlOut = join(dir, 'hostile.html');
    const run = runCli(['passes', file, '--format', 'html', '--out', htmlOut, '--quiet']);
    expect(run.code, run.stderr).toBe(0);
    const html = readFileSync(htmlOut, 'utf8');
    expect(html).not.toContain("<script>alert('x')");
    expect(html).not.toMatch(/<img[^>]*onerror/);
    const r = await renderInChromium(html);
    expect(r.dialogs).toEqual([]);
    expect(r.forbiddenElementCount.script + r.forbiddenElementCount.img).toBe(0);
    expect(r.bodyText).toContain("<script>alert('x')</script>");

    const csv = runCli(['passes', file, '--format', 'csv', '--quiet']);
    expect(csv.code, csv.stderr).toBe(0);
    const cells = csv.stdout.split('\n').flatMap((line) => line.split(','));
    expect(cells.some((c) => /^"?=/.test(c)), 'no cell starts a formula').toBe(false);
    expect(csv.stdout).toContain("'=cmd");
  });
});
