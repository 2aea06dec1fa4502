/**
 * Browser check of the HTML report toolkit (src/report/html.ts, src/report/svg.ts).
 * Source: W3C Content Security Policy Level 3 (default-src, style-src 'unsafe-inline') and the
 * HTML Living Standard (§ 4.2.5 meta http-equiv) — the report must render as one file with no
 * requests, no script execution and no dialogs. Expectations here are common practice for
 * self-contained reports, not numeric reference values.
 * Needs Debian's Chromium at /usr/bin/chromium (`apt-get install chromium`); it fails, not skips, without it.
 */
import { describe, it, expect } from 'vitest';
import { readFileSync, rmSync } from 'node:fs';
import { htmlPage } from '../src/report/html.ts';
import { linePlot, logLogPlot, timeline, type XInterval, type TimelineBar } from '../src/report/svg.ts';
import { renderInChromium, requireChromium } from './helpers/browser.ts';

const HOSTILE = '<script>alert(1)</script> "Sat" & \'B\' "><img src=x onerror=alert(1)>';
const T0_MS = Date.UTC(2027, 0, 1); // 2027-01-01T00:00:00Z
const DAY_MS = 86_400_000;

/** Sample page built with the toolkit: synthetic offsets (drift + once-per-orbit term), passes, stability, timeline. */
function samplePage(): { html: string; seriesCount: number } {
  const n = 2 * 1440 + 1; // 2 days at 60 s: above the 2000-point decimation limit
  const tMs = Array.from({ length: n }, (_, k) => T0_MS + k * 60_000);
  const orbitS = 43_080; // roughly a 12 h orbit
  const sat = (driftNsPerDay: number, ampNs: number) => tMs.map((t) => {
    const s = (t - T0_MS) / 1000;
    return (driftNsPerDay * s) / 86_400 + ampNs * Math.sin((2 * Math.PI * s) / orbitS);
  });
  const passes: XInterval[] = [];
  for (let k = 0; k < 8; k++) passes.push({ from: T0_MS + k * 0.25 * DAY_MS + 3_600_000, to: T0_MS + k * 0.25 * DAY_MS + 3_600_000 + 40 * 60_000, label: 'passes over ground stations' });
  const offsetPlot = linePlot({
    title: `Clock offset vs time — ${HOSTILE}`,
    xKind: 'time',
    yAxis: { label: 'Clock offset', unit: 'ns' },
    series: [
      { label: HOSTILE, x: tMs, y: sat(38.5, 22) },
      { label: 'SAT-2', x: tMs, y: sat(-12, 15) },
    ],
    shaded: passes,
    hLines: [{ y: 100, label: '+keep-in 100 ns' }, { y: -100, label: '−keep-in 100 ns' }],
  });
  const altKm = Array.from({ length: 200 }, (_, k) => 300 + (k * (40_000 - 300)) / 199);
  // Circular-orbit rate minus a geoid clock's rate, in 1e-10 (textbook form −3GM/(2c²a) + GM/(c²R)).
  const GM = 3.986004418e14, C2 = 299792458 ** 2, R = 6378137;
  const rate = altKm.map((h) => ((-3 * GM) / (2 * C2 * (R + h * 1000)) + GM / (C2 * R)) * 1e10);
  const breakEvenKm = (R * 3) / 2 / 1000 - R / 1000;
  const altPlot = linePlot({
    title: 'Mean fractional offset vs altitude',
    xAxis: { label: 'Altitude', unit: 'km' },
    yAxis: { label: 'Fractional offset', unit: '1e-10' },
    series: [{ label: 'circular orbit, point mass', x: altKm, y: rate }],
    points: [{ x: breakEvenKm, y: 0, label: `break-even ≈ ${breakEvenKm.toFixed(0)} km` }],
  });
  const tau = [1, 2, 4, 8, 16, 32, 64, 128, 256, 512, 1024];
  const adev = tau.map((t) => 3e-12 / Math.sqrt(t) + 1e-14);
  const stab = logLogPlot({
    title: 'Stability',
    xAxis: { label: 'Averaging time τ', unit: 's' },
    yAxis: { label: 'Overlapping Allan deviation', unit: '' },
    series: [{ label: HOSTILE, x: tau, y: adev, yLow: adev.map((v) => v * 0.8), yHigh: adev.map((v) => v * 1.25) }],
  });
  const bars: TimelineBar[] = [];
  ['Station A', HOSTILE, 'Station C'].forEach((row, r) => {
    for (let k = 0; k < 6; k++) {
      const from = T0_MS + k * 0.33 * DAY_MS + r * 2 * 3_600_000;
      bars.push({ row, fromMs: from, toMs: from + (30 + 10 * r) * 60_000, label: k % 2 === 0 ? 'SAT-1' : 'SAT-2', group: k % 2 === 0 ? 'SAT-1' : 'SAT-2' });
    }
  });
  const tl = timeline({ title: 'Passes per station', bars, fromMs: T0_MS, toMs: T0_MS + 2 * DAY_MS });
  const html = htmlPage({
    title: HOSTILE,
    subtitle: 'Synthetic sample for the browser check',
    caution: 'Planning aid only: predictions rest on models and inputs that may be wrong. Check against measurements before acting.',
    meta: [{ label: 'Window', value: '2027-01-01T00:00:00.000Z – 2027-01-03T00:00:00.000Z' }],
    sections: [
      { heading: 'Clock offset', intro: `Free-running prediction for ${HOSTILE}.`, figures: [offsetPlot, { svg: altPlot, caption: 'Break-even marked.' }] },
      { heading: 'Stability', figures: [stab] },
      {
        heading: 'Passes',
        figures: [tl],
        tables: [{ caption: HOSTILE, columns: ['Station', { label: 'Max elevation', unit: 'deg' }, { label: 'Offset at AOS', unit: 'ns' }], rows: [[HOSTILE, 45.2, -12.345678], ['Station A', 12, null]] }],
      },
    ],
    footer: 'tauplan test page',
  });
  return { html, seriesCount: 2 + 1 + 1 };
}

describe('HTML report in headless Chromium', () => {
  it('has Debian Chromium available (apt-get install chromium)', () => {
    expect(() => requireChromium()).not.toThrow();
  });

  it('renders plots with no requests, no errors, no script, no dialog', async () => {
    const { html, seriesCount } = samplePage();
    const r = await renderInChromium(html);
    // Set TAUPLAN_KEEP_SCREENSHOT=1 to keep the page and its PNG for a look.
    if (process.env.TAUPLAN_KEEP_SCREENSHOT) console.log(`report screenshot: ${r.screenshotPath}`);
    expect(r.consoleErrors).toEqual([]);
    expect(r.pageErrors).toEqual([]);
    expect(r.networkRequests).toEqual([]);
    expect(r.dialogs).toEqual([]);
    expect(r.forbiddenElementCount).toEqual({ script: 0, img: 0, iframe: 0, object: 0, embed: 0 });
    // The hostile title was parsed as text, character for character.
    expect(r.documentTitle).toBe(HOSTILE);
    expect(r.svgCount).toBe(4);
    // At least one path per series (line plots and the stability curve) plus error bars.
    expect(r.svgPathCount).toBeGreaterThanOrEqual(seriesCount);
    expect(r.bodyText).toContain('CAUTION');
    const png = readFileSync(r.screenshotPath);
    expect(png.subarray(1, 4).toString('latin1')).toBe('PNG');
    expect(r.screenshotBytes).toBeGreaterThan(20_000); // a blank page of this size compresses far below this
    if (!process.env.TAUPLAN_KEEP_SCREENSHOT) rmSync(r.outDir, { recursive: true, force: true });
  });

  it('reports a request when a page does load something (the check can fail)', async () => {
    const r = await renderInChromium('<!DOCTYPE html><title>x</title><link rel="stylesheet" href="http://192.0.2.1/x.css"><p>x</p>');
    expect(r.networkRequests.length).toBeGreaterThan(0);
    rmSync(r.outDir, { recursive: true, force: true });
  });

  it('reports a dialog when a page opens one (the check can fail)', async () => {
    const r = await renderInChromium('<!DOCTYPE html><title>x</title><script>alert("hi")</script>');
    expect(r.dialogs).toEqual(['alert: hi']);
    rmSync(r.outDir, { recursive: true, force: true });
  });
});
