/**
 * Axis ticks and decimation of the SVG plot toolkit (src/report/svg.ts).
 * Sources: d3-scale 4 documentation, "continuous.nice / continuous.ticks" (ticks are 1, 2 or 5 × 10^k,
 * domain extended to them) — confirmed from the library docs; UTC tick alignment follows ISO 8601
 * (a UTC day starts at 00:00:00, POSIX time counts 86400 s per day) — common practice.
 * Peak preservation of min/max decimation: derived (each bucket keeps its extremes by construction).
 */
import { describe, it, expect } from 'vitest';
import { decimateMinMax, formatTick, linePlot, timeTicks, utcMsFromMjdUtc } from '../src/report/svg.ts';

const HOUR_MS = 3_600_000;
const DAY_MS = 86_400_000;

describe('decimateMinMax', () => {
  it('keeps at most the limit and every bucket extreme, so a one-sample spike survives', () => {
    const len = 100_000;
    const x = Array.from({ length: len }, (_, i) => i);
    const y = x.map((i) => Math.sin(i / 500));
    y[31_337] = 50; // spike
    y[77_001] = -40; // dip
    const d = decimateMinMax(x, y, 2000);
    expect(d.x.length).toBeLessThanOrEqual(2000);
    expect(Math.max(...d.y)).toBe(50);
    expect(Math.min(...d.y)).toBe(-40);
    expect(d.x).toContain(31_337);
    expect(d.x[0]).toBe(0);
    expect(d.x[d.x.length - 1]).toBe(len - 1);
    // Still ordered in x, so the path does not scribble backwards.
    for (let i = 1; i < d.x.length; i++) expect(d.x[i]).toBeGreaterThan(d.x[i - 1]);
  });

  it('passes short series through unchanged', () => {
    expect(decimateMinMax([1, 2, 3], [4, 5, 6], 2000)).toEqual({ x: [1, 2, 3], y: [4, 5, 6] });
  });

  it('caps the points a line plot draws', () => {
    const len = 50_000;
    const x = Array.from({ length: len }, (_, i) => i * 1000);
    const svg = linePlot({ title: 't', xAxis: { label: 'x', unit: 's' }, yAxis: { label: 'y', unit: 'ns' }, series: [{ label: 's', x, y: x.map((v) => Math.cos(v / 1e6)) }] });
    const d = /<path d="(M[^"]*)" fill="none"/.exec(svg)?.[1] ?? '';
    const vertices = (d.match(/[ML]/g) ?? []).length;
    expect(vertices).toBeGreaterThan(100);
    expect(vertices).toBeLessThanOrEqual(2000);
  });
});

describe('time axis ticks', () => {
  it('fall on whole UTC hours for a two-day span and label the date where the day changes', () => {
    const from = Date.UTC(2027, 0, 1, 0, 17);
    const ticks = timeTicks(from, from + 2 * DAY_MS, 10);
    expect(ticks.length).toBeGreaterThan(2);
    expect(ticks.length).toBeLessThanOrEqual(10);
    for (const t of ticks) {
      expect(t.ms % HOUR_MS).toBe(0);
      expect(t.ms).toBeGreaterThanOrEqual(from);
    }
    const step = ticks[1].ms - ticks[0].ms;
    expect(DAY_MS % step).toBe(0); // hour steps divide the day, so midnight is a tick
    const midnight = ticks.find((t) => t.line1 === '00:00');
    expect(midnight?.line2).toBe('2027-01-02');
    expect(ticks[0].line2).toBe('2027-01-01');
  });

  it('switch to whole days for long spans', () => {
    const from = Date.UTC(2027, 0, 1);
    const ticks = timeTicks(from, from + 60 * DAY_MS, 8);
    expect(ticks.length).toBeLessThanOrEqual(8);
    for (const t of ticks) expect(t.ms % DAY_MS).toBe(0);
    // Day-step labels are plain dates, one line.
    expect(ticks[0].line1).toMatch(/^2027-01-\d\d$/);
    expect(ticks[0].line2).toBe('');
  });

  it('fall on the first of months for half-year spans', () => {
    const from = Date.UTC(2027, 0, 1);
    const ticks = timeTicks(from, Date.UTC(2027, 5, 30), 8);
    expect(ticks.map((t) => t.line1)).toEqual(['2027-01-01', '2027-02-01', '2027-03-01', '2027-04-01', '2027-05-01', '2027-06-01']);
  });

  it('converts MJD (UTC) to UTC ms', () => {
    // MJD 61406 is 2027-01-01 (MJD 51544 = 2000-01-01, plus 9862 days) — derived.
    expect(utcMsFromMjdUtc(61406.5)).toBe(Date.UTC(2027, 0, 1, 12));
  });
});

describe('tick labels', () => {
  it('use fixed decimals matched to the step', () => {
    expect(formatTick(0.5, 0.5, 2)).toBe('0.5');
    expect(formatTick(-20, 10, 50)).toBe('\u221220');
    expect(formatTick(2.25, 0.25, 3)).toBe('2.25');
    expect(formatTick(3, 1, 3)).toBe('3');
    expect(formatTick(0.002, 0.001, 0.01)).toBe('0.002');
  });
  it('use exponent form for fractional frequencies, with enough digits to differ', () => {
    const a = formatTick(4.4645e-10, 5e-14, 4.4660e-10);
    const b = formatTick(4.4650e-10, 5e-14, 4.4660e-10);
    expect(a).toMatch(/e\u221210$/);
    expect(a).not.toBe(b);
  });
});
