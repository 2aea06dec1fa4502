/**
 * The fit guard and the step detector (src/plan/fitGuard.ts, src/plan/steps.ts) on invented,
 * seeded clocks whose truth is known (derived checks; thresholds are ours, common practice):
 * - the failure that motivated it: an inclined 24-hour orbit's offsets with an unremoved periodic
 *   term of ±20 ns and sigmas of 0.5 ns, where 4σ clipping used to keep 4 of 181 rows;
 * - a phase jump and a frequency step at known lines; a trend left by too low a degree;
 * - no false alarm on plain white-FM noise (the 6σ/8σ thresholds).
 */
import { describe, expect, it } from 'vitest';
import { defaultTimeSystem } from '../src/io/tables.ts';
import { fitClock, type FitInputRow } from '../src/plan/fit.ts';
import { detectSteps } from '../src/plan/steps.ts';
import { fitToCsv, fitToJson, fitToText } from '../src/report/fitReport.ts';
import { gaussian, mulberry32, powerLawPhase } from './helpers/powerLawNoise.ts';

const ts = defaultTimeSystem();
const T0 = ts.parse('2027-03-01T00:00:00Z', 'test').ttJ2000S;

function rows(n: number, stepS: number, offset: (tS: number, i: number) => number, sigmaNs: number | null): FitInputRow[] {
  return Array.from({ length: n }, (_, i) => ({ line: i + 2, ttJ2000S: T0 + i * stepS, offsetNs: offset(i * stepS, i), sigmaNs }));
}

describe('clipping never removes more than 10 % silently', () => {
  const g = gaussian(mulberry32(7));
  const periodS = 86164; // an inclined geosynchronous (24-hour) orbit
  const data = rows(181, 480, (t) => 30 + 2e-12 * t * 1e9 + 20 * Math.sin((2 * Math.PI * t) / periodS) + 0.5 * g(), 0.5);

  it('stops, keeps every row, warns, and names the periodic term at the orbital period', () => {
    const r = fitClock(data, { degree: 2, timeSystem: ts, clipSigma: 4, orbitalPeriodS: periodS });
    expect(r.clipStopped).toBe(true);
    expect(r.used).toBe(181);
    expect(r.rejected.length).toBe(0);
    expect(r.rejectedFraction).toBe(0);
    expect(r.warnings.length).toBe(1);
    expect(r.warnings[0]).toMatch(/orbital period 23\.93 h/);
    expect(r.warnings[0]).toMatch(/--scenario and --sat/);
    // The warning is in every format.
    expect(JSON.stringify(fitToJson(r))).toMatch(/would reject/);
    expect(fitToCsv(r)).toMatch(/^# WARNING: clipping/);
    expect(fitToText(r, ts)).toMatch(/^WARNING: clipping/);
  });

  it('without an orbit, the period scan still finds ~24 h', () => {
    const r = fitClock(data, { degree: 2, timeSystem: ts, clipSigma: 4 });
    const m = /a period of ([\d.]+) h/.exec(r.warnings[0]);
    expect(m, r.warnings[0]).not.toBeNull();
    const hours = Number(m![1]);
    expect(Math.abs(hours - periodS / 3600), `wanted ${periodS / 3600} h, got ${hours} h`).toBeLessThan(1.5);
  });

  it('--clip 0 turns clipping off; a few true outliers are still clipped under the limit', () => {
    expect(fitClock(data, { degree: 2, timeSystem: ts, clipSigma: 0 }).clipSigma).toBeNull();
    const clean = rows(200, 60, (t, i) => 5 + 0.3 * g() + (i === 50 || i === 120 ? 40 : 0), 0.3);
    const r = fitClock(clean, { degree: 1, timeSystem: ts, clipSigma: 4 });
    expect(r.clipStopped).toBe(false);
    expect(r.rejected.map((x) => x.line)).toEqual([52, 122]);
    expect(r.rejectedFraction).toBeCloseTo(2 / 200, 12);
  });

  it('a trend names the degree', () => {
    const quad = rows(150, 600, (t) => 1e-8 * t * t + 0.2 * g(), 0.2);
    const r = fitClock(quad, { degree: 1, timeSystem: ts, clipSigma: 4 });
    expect(r.clipStopped).toBe(true);
    expect(r.warnings[0]).toMatch(/trend.*--degree 2/);
  });
});

describe('phase jumps and frequency steps (windowed test on sample-to-sample frequency)', () => {
  const lines = Array.from({ length: 2000 }, (_, i) => i + 2);
  const times = Array.from({ length: 2000 }, (_, i) => i * 30);

  it('no false alarm on white-FM noise (10 seeds × 2000 samples)', () => {
    for (let seed = 1; seed <= 10; seed++) {
      const x = Array.from(powerLawPhase(0, 2000, seed)).map((v) => v * 0.1);
      expect(detectSteps(times, x, lines), `seed ${seed}`).toEqual([]);
    }
  });

  it('a 3 ns phase jump (30σ of the 0.1 ns steps) at line 802 is found there, with its size', () => {
    const x = Array.from(powerLawPhase(0, 2000, 3)).map((v, i) => v * 0.1 + (i >= 800 ? 3 : 0));
    const s = detectSteps(times, x, lines);
    expect(s.length).toBe(1);
    expect(s[0].kind).toBe('phase jump');
    expect(s[0].line).toBe(802);
    expect(Math.abs((s[0].sizeNs as number) - 3)).toBeLessThan(0.5);
  });

  it('a frequency step of 1e-11 (15σ of a 50-sample window mean) at line 1202 is found within a window of it', () => {
    const x = Array.from(powerLawPhase(0, 2000, 4)).map((v, i) => v * 0.1 + (i >= 1200 ? (i - 1200) * 30 * 1e-11 * 1e9 : 0));
    const s = detectSteps(times, x, lines).filter((e) => e.kind === 'frequency step');
    expect(s.length).toBe(1);
    expect(Math.abs(s[0].line - 1202), `wanted line 1202, got ${s[0].line}`).toBeLessThanOrEqual(10);
    expect(Math.abs((s[0].fractionalStep as number) - 1e-11) / 1e-11).toBeLessThan(0.3);
  });

  it('a lone outlier is not a jump', () => {
    const x = Array.from(powerLawPhase(0, 2000, 5)).map((v, i) => v * 0.1 + (i === 500 ? 5 : 0));
    expect(detectSteps(times, x, lines)).toEqual([]);
  });

  it('the fit reports a jump in its residuals, with the line, and the guard names it', () => {
    const g = gaussian(mulberry32(9));
    const data = rows(300, 60, (_t, i) => 0.2 * g() + (i >= 180 ? 25 : 0), 0.2);
    const r = fitClock(data, { degree: 1, timeSystem: ts, clipSigma: 4 });
    expect(r.steps.some((s) => s.kind === 'phase jump' && s.line === 182)).toBe(true);
    expect(r.clipStopped).toBe(true);
    expect(r.warnings[0]).toMatch(/phase jump .* at line 182/);
  });

  it('--segments auto fits the jump jointly with the clock and removes it: size within 3σ of the 25 ns put in, rms back to the noise', () => {
    const g = gaussian(mulberry32(9));
    const data = rows(300, 60, (t, i) => 3 + 1e-11 * t * 1e9 + 0.2 * g() + (i >= 180 ? 25 : 0), 0.2);
    const r = fitClock(data, { degree: 1, timeSystem: ts, clipSigma: 4, segments: 'auto' });
    expect(r.segmentJumps.length).toBe(1);
    const j = r.segmentJumps[0];
    expect(j.line).toBe(182);
    expect(Math.abs(j.sizeNs - 25), `wanted 25 ns, got ${j.sizeNs} ± ${j.sizeSigmaNs}`).toBeLessThan(3 * j.sizeSigmaNs);
    expect(r.clipStopped).toBe(false);
    expect(r.rmsNs).toBeLessThan(0.3);
    expect(Math.abs((r.fractionalFrequency as number) - 1e-11)).toBeLessThan(5 * (r.fractionalFrequencySigma as number));
  });
});
