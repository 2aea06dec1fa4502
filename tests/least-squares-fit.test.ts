/**
 * Weighted least-squares clock fit (src/plan/fit.ts) against:
 * - the straight-line closed forms of P. R. Bevington & D. K. Robinson, *Data Reduction and Error
 *   Analysis for the Physical Sciences*, ch. 6 (fitting a straight line): Δ = S·Sxx − Sx², intercept
 *   a = (Sxx·Sy − Sx·Sxy)/Δ, slope b = (S·Sxy − Sx·Sy)/Δ, σa² = Sxx/Δ, σb² = S/Δ, with S = Σ1/σ²,
 *   Sx = Σx/σ², ... — **from memory** (common practice, the textbook formulas);
 * - simulated data with known parameters (scripts/make-demo-measurements.ts, seeded), checking that
 *   the reported 1σ is honest: the truth falls outside ±3σ about 0.27 % of the time for Gaussian
 *   errors (**derived**: 2·(1 − Φ(3)) = 0.0027) and inside ±1σ about 68.3 % (2Φ(1) − 1).
 */
import { describe, expect, it } from 'vitest';
import { InputError } from '../src/errors.ts';
import { defaultTimeSystem } from '../src/io/tables.ts';
import { parseMeasurementsCsv } from '../src/io/measurements.ts';
import { fitClock, type FitInputRow } from '../src/plan/fit.ts';
import { fitToCsv, fitToJson, fitToText } from '../src/report/fitReport.ts';
import { simulateMeasurements, type SimulationOptions } from '../scripts/make-demo-measurements.ts';

const ts = defaultTimeSystem();
const START_TT = ts.parse('2027-03-01T00:00:00Z', 'test').ttJ2000S;

function simulated(o: Partial<SimulationOptions> & { seed: number }) {
  const options: SimulationOptions = {
    startTtJ2000S: START_TT,
    stepS: 600,
    count: 60,
    offsetNs: 50,
    fractionalFrequency: 3e-12,
    driftPerDay: 2e-13,
    whiteNoiseNs: 1,
    ...o,
  };
  return parseMeasurementsCsv(simulateMeasurements(options, ts), 'sim.csv', ts).rows;
}

describe('recovery of known parameters from simulated data (derived coverage rates)', () => {
  const TRIALS = 400;
  // Clipping off: it would cut the Gaussian tails these rates are about. Noise 2.5 ns, not 1 ns, so
  // that leaving out the reduced-χ² scaling (unit weights) would show.
  function coverage(withSigma: boolean): { miss3: number; in1: number; checks: number } {
    let miss3 = 0;
    let in1 = 0;
    let checks = 0;
    for (let trial = 0; trial < TRIALS; trial++) {
      const rows = simulated({ seed: 1000 + trial + (withSigma ? 100_000 : 0), withSigma, whiteNoiseNs: 2.5 });
      const r = fitClock(rows, { degree: 2, timeSystem: ts, clipSigma: 0 });
      const pairs: [number | null, number | null, number][] = [
        [r.offsetNs, r.offsetSigmaNs, 50],
        [r.fractionalFrequency, r.fractionalFrequencySigma, 3e-12],
        [r.driftPerDay, r.driftPerDaySigma, 2e-13],
      ];
      for (const [est, sigma, truth] of pairs) {
        expect(est).not.toBeNull();
        expect(sigma).not.toBeNull();
        const z = Math.abs((est as number) - truth) / (sigma as number);
        if (z > 3) miss3++;
        if (z <= 1) in1++;
        checks++;
      }
    }
    return { miss3, in1, checks };
  }

  for (const withSigma of [false, true]) {
    it(`${withSigma ? 'given sigmas' : 'sigmas scaled by reduced χ²'}: misses beyond 3σ ≈ 0.3 %, inside 1σ ≈ 68 %`, () => {
      const { miss3, in1, checks } = coverage(withSigma);
      // Expected 0.27 % (Gaussian) to 0.4 % (Student t, 57 dof, when the scale is estimated); 1.5 %
      // would mean sigmas underestimated by ~25 %.
      expect(miss3 / checks, `3σ misses ${miss3}/${checks}`).toBeLessThan(0.015);
      // 68.3 % expected; over 400 trials of 3 correlated parameters the rate spreads by ~2 points,
      // so allow [62 %, 76 %]. Outside that the sigmas are off by ~20 % or more (2Φ(1.2) − 1 = 77 %);
      // an inflated sigma would pass the 3σ test alone.
      const rate = in1 / checks;
      expect(rate, `inside 1σ: ${in1}/${checks}`).toBeGreaterThan(0.62);
      expect(rate, `inside 1σ: ${in1}/${checks}`).toBeLessThan(0.76);
    });
  }

  it('with given sigmas that match the noise, the reduced χ² is near 1', () => {
    const r = fitClock(simulated({ seed: 7, withSigma: true, count: 2000, stepS: 30 }), { degree: 2, timeSystem: ts, clipSigma: 0 });
    expect(r.sigmaSource).toBe('given');
    // Its spread is √(2/dof) ≈ 0.03 for 1997 dof; 0.15 is 5 of those.
    expect(Math.abs((r.reducedChiSquare as number) - 1)).toBeLessThan(0.15);
  });
});

describe('straight line against the closed form (Bevington & Robinson ch. 6, from memory)', () => {
  // Irregular times and unequal sigmas, so weighting and the epoch both matter.
  const tS = [0, 40, 95, 180, 260, 400, 555, 610, 800, 1000];
  const sigmaNs = [1, 2, 0.5, 1.5, 1, 3, 0.8, 1, 2.5, 1.2];
  const noise = [0.3, -1.1, 0.2, 0.9, -0.4, 2.2, -0.5, 0.1, -1.9, 0.6];
  const slopeNsPerS = 0.0042;
  const rows: FitInputRow[] = tS.map((t, i) => ({
    line: i + 2,
    ttJ2000S: START_TT + t,
    offsetNs: 12.5 + slopeNsPerS * t + noise[i],
    sigmaNs: sigmaNs[i],
  }));

  function sums(weights: number[]) {
    let S = 0, Sx = 0, Sy = 0, Sxx = 0, Sxy = 0; // prettier-ignore
    rows.forEach((r, i) => {
      const w = weights[i];
      const x = r.ttJ2000S - START_TT;
      S += w;
      Sx += w * x;
      Sy += w * r.offsetNs;
      Sxx += w * x * x;
      Sxy += w * x * r.offsetNs;
    });
    const delta = S * Sxx - Sx * Sx;
    return { S, Sxx, delta, a: (Sxx * Sy - Sx * Sxy) / delta, b: (S * Sxy - Sx * Sy) / delta };
  }

  it('given sigmas: intercept, slope and their sigmas', () => {
    const { S, Sxx, delta, a, b } = sums(sigmaNs.map((s) => 1 / (s * s)));
    const r = fitClock(rows, { degree: 1, timeSystem: ts, clipSigma: 0 });
    // Tolerances: rounding only; 1e-9 ns is far below any clock's resolution.
    expect(Math.abs(r.offsetNs - a)).toBeLessThan(1e-9);
    expect(Math.abs((r.offsetSigmaNs as number) - Math.sqrt(Sxx / delta))).toBeLessThan(1e-9);
    // Fractional frequency: 1e-18 (1e-9 ns/s) absolute, rounding only.
    expect(Math.abs((r.fractionalFrequency as number) - b * 1e-9)).toBeLessThan(1e-18);
    expect(Math.abs((r.fractionalFrequencySigma as number) - Math.sqrt(S / delta) * 1e-9)).toBeLessThan(1e-18);
    expect(r.driftPerDay).toBeNull();
    expect(r.driftPerDaySigma).toBeNull();
    expect(r.sigmaSource).toBe('given');
  });

  it('unit weights: sigmas scaled by s² = Σr²/(N − 2), which is the reduced χ²', () => {
    const plain = rows.map((r) => ({ ...r, sigmaNs: null }));
    const { S, Sxx, delta, a, b } = sums(rows.map(() => 1));
    let chi2 = 0;
    for (const r of plain) chi2 += (r.offsetNs - a - b * (r.ttJ2000S - START_TT)) ** 2;
    const s2 = chi2 / (rows.length - 2);
    const r = fitClock(plain, { degree: 1, timeSystem: ts, clipSigma: 0 });
    expect(r.sigmaSource).toBe('scaled by reduced chi-square');
    expect(Math.abs((r.reducedChiSquare as number) - s2)).toBeLessThan(1e-9);
    expect(Math.abs(r.offsetNs - a)).toBeLessThan(1e-9);
    expect(Math.abs((r.offsetSigmaNs as number) - Math.sqrt((s2 * Sxx) / delta))).toBeLessThan(1e-9);
    expect(Math.abs((r.fractionalFrequencySigma as number) - Math.sqrt((s2 * S) / delta) * 1e-9)).toBeLessThan(1e-18);
    expect(Math.abs(r.rmsNs - Math.sqrt(chi2 / rows.length))).toBeLessThan(1e-9);
  });

  it('degree 0 with given sigmas is the weighted mean, σ = 1/√Σw (same chapter)', () => {
    const w = sigmaNs.map((s) => 1 / (s * s));
    const sw = w.reduce((p, q) => p + q, 0);
    const mean = rows.reduce((p, r, i) => p + w[i] * r.offsetNs, 0) / sw;
    const r = fitClock(rows, { degree: 0, timeSystem: ts, clipSigma: 0 });
    expect(Math.abs(r.offsetNs - mean)).toBeLessThan(1e-9);
    expect(Math.abs((r.offsetSigmaNs as number) - 1 / Math.sqrt(sw))).toBeLessThan(1e-12);
    expect(r.fractionalFrequency).toBeNull();
  });
});

describe('model and options', () => {
  it('parameters refer to the epoch given: value and derivatives of the quadratic there (derived)', () => {
    const x0 = -20, y = 5e-12, dPerDay = 3e-13; // prettier-ignore
    const dPerS = dPerDay / 86400;
    const truth = (t: number): number => x0 + (y * t + (dPerS * t * t) / 2) * 1e9;
    const rows: FitInputRow[] = Array.from({ length: 50 }, (_, k) => ({ line: k + 2, ttJ2000S: START_TT + k * 3600, offsetNs: truth(k * 3600), sigmaNs: null }));
    const epochT = 30 * 3600 + 1234.5;
    const r = fitClock(rows, { degree: 2, timeSystem: ts, epochTtJ2000S: START_TT + epochT });
    // Noise-free data: only rounding; 1e-6 ns over offsets of ~1000 ns.
    expect(Math.abs(r.offsetNs - truth(epochT))).toBeLessThan(1e-6);
    expect(Math.abs((r.fractionalFrequency as number) - (y + dPerS * epochT))).toBeLessThan(1e-19);
    expect(Math.abs((r.driftPerDay as number) - dPerDay)).toBeLessThan(1e-20);
    expect(r.epoch).toBe(ts.format(ts.parse('2027-03-02T06:20:34.500Z', 'test')));
  });

  it('a periodic term supplied by the caller is removed first and flagged', () => {
    const periodicNs = (tt: number): number => 23 * Math.sin((2 * Math.PI * (tt - START_TT)) / 43080);
    const clean = simulated({ seed: 99, whiteNoiseNs: 0.2 });
    const rows = clean.map((r) => ({ ...r, offsetNs: r.offsetNs + periodicNs(r.ttJ2000S) }));
    const without = fitClock(rows, { degree: 2, timeSystem: ts });
    const withTerm = fitClock(rows, { degree: 2, timeSystem: ts, periodicNs });
    expect(without.periodicRemoved).toBe(false);
    expect(withTerm.periodicRemoved).toBe(true);
    expect(without.rmsNs).toBeGreaterThan(5);
    // White noise 0.2 ns: the rms after removal is about that (0.3 ns leaves room for sampling spread).
    expect(withTerm.rmsNs).toBeLessThan(0.3);
    expect(Math.abs((withTerm.fractionalFrequency as number) - 3e-12)).toBeLessThan(4 * (withTerm.fractionalFrequencySigma as number));
  });

  it('fewer rows than parameters is an input error', () => {
    const rows = simulated({ seed: 1, count: 2 });
    expect(() => fitClock(rows, { degree: 2, timeSystem: ts })).toThrow(InputError);
    expect(() => fitClock(rows, { degree: 1, timeSystem: ts })).not.toThrow();
    expect(() => fitClock(rows, { degree: 1, timeSystem: ts, clipSigma: -1 })).toThrow(InputError);
  });

  it('as many rows as parameters without sigmas: exact fit, sigmas and reduced χ² unknown (null)', () => {
    const r = fitClock(simulated({ seed: 3, count: 3 }), { degree: 2, timeSystem: ts });
    expect(r.offsetSigmaNs).toBeNull();
    expect(r.reducedChiSquare).toBeNull();
    expect(r.rmsNs).toBeLessThan(1e-6);
    expect(JSON.stringify(fitToJson(r))).not.toMatch(/NaN|Infinity/);
  });
});

describe('sigma clipping', () => {
  it('removes an injected 20 ns outlier and lists its line', () => {
    // Row 25 (0-based) is line 27: the header is line 1.
    const rows = simulated({ seed: 42, outlierRows: [25], outlierNs: 20 });
    const r = fitClock(rows, { degree: 2, timeSystem: ts });
    expect(r.rejected.map((x) => x.line)).toEqual([27]);
    expect(r.used).toBe(59);
    // Residual is the outlier plus 1 ns noise: within 5 ns of 20 ns.
    expect(Math.abs(r.rejected[0].residualNs - 20)).toBeLessThan(5);
    expect(r.rejected[0].time).toBe(ts.format(ts.parse('2027-03-01T04:10:00Z', 'test')));
    // The outlier no longer pulls the fit: rms back near the 1 ns noise.
    expect(r.rmsNs).toBeLessThan(1.3);
    // The gap it leaves stays missing in the stability table (NIST SP 1065 §5.15), and the note says so.
    expect(r.stability.length).toBeGreaterThan(0);
    expect(r.stabilityNote).toMatch(/1 grid point\(s\) without a used sample/);
    const kept = fitClock(rows, { degree: 2, timeSystem: ts, clipSigma: 0 });
    expect(kept.rejected).toEqual([]);
    expect(kept.rmsNs).toBeGreaterThan(r.rmsNs + 0.5);
    expect(kept.clipSigma).toBeNull();
  });

  it('clips against the given sigmas when the file has them', () => {
    const rows = simulated({ seed: 43, withSigma: true, outlierRows: [10], outlierNs: -12 });
    const r = fitClock(rows, { degree: 2, timeSystem: ts });
    expect(r.rejected.map((x) => x.line)).toEqual([12]);
  });
});

describe('stability of the residuals', () => {
  it('white phase noise: OADEV(τ0) ≈ √3·σx/τ0 (derived from the definition) and MDEV(τ0) = OADEV(τ0)', () => {
    const r = fitClock(simulated({ seed: 5, count: 2000, stepS: 1, whiteNoiseNs: 1 }), { degree: 2, timeSystem: ts, clipSigma: 0 });
    expect(r.stabilityNote).toBeNull();
    const first = r.stability[0];
    expect(first.tauS).toBe(1);
    expect(first.count).toBe(2000 - 2);
    // ~2000 terms: statistical spread a few %, allow 10 %.
    expect(Math.abs(first.oadev / (Math.sqrt(3) * 1e-9) - 1)).toBeLessThan(0.1);
    expect(Math.abs(first.mdev - first.oadev)).toBeLessThan(1e-12 * first.oadev);
    expect(r.stability.map((s) => s.tauS)).toEqual([1, 2, 4, 8, 16, 32, 64, 128, 256, 512]);
  });

  it('a missing row: the table is computed on the grid with the gap left missing (SP 1065 §5.15)', () => {
    const rows = simulated({ seed: 6 });
    rows.splice(10, 1);
    const r = fitClock(rows, { degree: 1, timeSystem: ts });
    expect(r.stability.length).toBeGreaterThan(0);
    expect(r.stabilityNote).toMatch(/1 grid point\(s\) without a used sample/);
  });

  it('times on no common grid: no table, with the reason', () => {
    const rows = simulated({ seed: 6 });
    rows[10] = { ...rows[10], ttJ2000S: rows[10].ttJ2000S + 17 };
    const r = fitClock(rows, { degree: 1, timeSystem: ts });
    expect(r.stability).toEqual([]);
    expect(r.stabilityNote).toMatch(/off the 600 s grid/);
  });
});

describe('writers', () => {
  it('JSON has the contract fields; CSV has one header and one row; text shows ± and the sigma source', () => {
    const r = fitClock(simulated({ seed: 8, outlierRows: [5], outlierNs: 30 }), { degree: 2, timeSystem: ts });
    const j = fitToJson(r);
    for (const k of ['epoch', 'offsetNs', 'offsetSigmaNs', 'fractionalFrequency', 'fractionalFrequencySigma', 'driftPerDay', 'driftPerDaySigma', 'rmsNs', 'used', 'rejected', 'stability']) {
      expect(j, k).toHaveProperty(k);
    }
    const csv = fitToCsv(r).trimEnd().split('\n');
    expect(csv.length).toBe(2);
    expect(csv[0].split(',').length).toBe(csv[1].split(',').length);
    const text = fitToText(r, ts);
    expect(text).toContain('±');
    expect(text).toContain('reduced χ²');
    expect(text).toMatch(/^\s+7\s/m); // the rejected row's line number in the table
  });
});
