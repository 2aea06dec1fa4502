/**
 * W. J. Riley, *Handbook of Frequency Stability Analysis*, NIST Special Publication 1065 (2008):
 * §5.2 (ADEV, overlapping ADEV, modified ADEV), §5.3 (confidence intervals) and the test data of
 * §12.1 ("NBS" 9-point set and the 1000-point generator set).
 *
 * Reference values are those of physics.md §8, marked there **confirmed** (via four independent
 * code copies of SP 1065's values). They are compared at the 7 significant digits published.
 */
import { describe, expect, it } from 'vitest';
import {
  adev,
  chiSquareInterval,
  chiSquareQuantile,
  evenSpacingS,
  isEvenlySpaced,
  modifiedAdev,
  octaveFactors,
  oadevEdf,
  overlappingAdev,
  phaseFromFrequency,
} from '../src/clock/stability.ts';

/** Agreement to the 7 significant digits the handbook prints: within half a unit of the 7th digit. */
function expectSig7(got: number | null, wanted: number, label: string): void {
  expect(got, label).not.toBeNull();
  const halfUnit = 0.5 * 10 ** (Math.floor(Math.log10(Math.abs(wanted))) - 6);
  const diff = Math.abs((got as number) - wanted);
  expect(diff, `${label}: wanted ${wanted}, got ${got}, difference ${diff.toExponential(2)} (limit ${halfUnit.toExponential(1)})`).toBeLessThanOrEqual(
    halfUnit * (1 + 1e-9),
  );
}

describe('NBS 9-point frequency data (SP 1065 §12.1; values confirmed)', () => {
  // Fractional frequency samples, τ0 = 1 s (confirmed).
  const y = [892, 809, 823, 798, 671, 644, 883, 903, 677];
  const x = phaseFromFrequency(y, 1);

  it('frequency → phase gives N + 1 points starting at 0', () => {
    expect(x.length).toBe(10);
    expect(x[0]).toBe(0);
    expect(x[9]).toBe(y.reduce((a, b) => a + b, 0));
  });

  it('ADEV(τ = 1 s) = 91.22945', () => expectSig7(adev(x, 1, 1).deviation, 91.22945, 'ADEV(1)'));
  it('overlapping ADEV(τ = 2 s) = 85.95287', () => expectSig7(overlappingAdev(x, 1, 2).deviation, 85.95287, 'OADEV(2)'));
  it('modified ADEV(τ = 2 s) = 74.78849', () => expectSig7(modifiedAdev(x, 1, 2).deviation, 74.78849, 'MDEV(2)'));

  it('ADEV and OADEV coincide at m = 1 and count N − 2m terms', () => {
    const a = adev(x, 1, 1);
    const o = overlappingAdev(x, 1, 1);
    expect(o.deviation).toBeCloseTo(a.deviation as number, 10);
    expect(o.count).toBe(10 - 2);
  });

  it('too short for m: deviation null, not NaN', () => {
    expect(overlappingAdev(x, 1, 5).deviation).toBeNull();
    expect(modifiedAdev(x, 1, 4).deviation).toBeNull();
  });
});

describe('1000-point generator data (SP 1065 §12.1; values confirmed)', () => {
  // n0 = 1234567890, n_{k+1} = 16807·n_k mod 2147483647, y_k = n_k / 2147483647 for k = 0..999,
  // so the seed itself is the first sample (confirmed). 16807·n < 2^53: plain doubles are exact.
  const y: number[] = [];
  let n = 1234567890;
  for (let k = 0; k < 1000; k++) {
    y.push(n / 2147483647);
    n = (16807 * n) % 2147483647;
  }
  const x = phaseFromFrequency(y, 1);

  it('overlapping ADEV at τ = 1, 10, 100 s', () => {
    expectSig7(overlappingAdev(x, 1, 1).deviation, 2.922319e-1, 'OADEV(1)');
    expectSig7(overlappingAdev(x, 1, 10).deviation, 9.159953e-2, 'OADEV(10)');
    expectSig7(overlappingAdev(x, 1, 100).deviation, 3.241343e-2, 'OADEV(100)');
  });

  it('modified ADEV at τ = 10 s', () => expectSig7(modifiedAdev(x, 1, 10).deviation, 6.172376e-2, 'MDEV(10)'));

  it('scales with τ0: the same phase at τ0 = 10 s gives the deviations at τ = 10·m s, values /10', () => {
    // σ_y(τ) has 1/τ in front of the phase second difference (derived from the definition).
    const a = overlappingAdev(x, 10, 10).deviation as number;
    const b = overlappingAdev(x, 1, 10).deviation as number;
    expect(Math.abs(a * 10 - b) / b).toBeLessThan(1e-14);
  });
});

describe('octave list and spacing helpers', () => {
  it('octave factors stop where MDEV runs out of terms (N − 3m + 1 ≥ 1)', () => {
    expect(octaveFactors(10)).toEqual([1, 2]);
    expect(octaveFactors(12)).toEqual([1, 2, 4]);
    expect(octaveFactors(2)).toEqual([]);
  });

  it('even spacing within a relative tolerance', () => {
    const t = [0, 60, 120, 180.00001, 240];
    expect(evenSpacingS(t, 1e-3)).toBe(60);
    expect(isEvenlySpaced([0, 60, 130, 180], 1e-3)).toBe(false);
    expect(isEvenlySpaced([5], 1e-3)).toBe(false);
  });
});

describe('confidence intervals (SP 1065 §5.3)', () => {
  it('chi-square quantiles: dof = 2 closed form, −2 ln(1 − p) (derived)', () => {
    for (const p of [0.025, 0.1587, 0.5, 0.8413, 0.975]) {
      const want = -2 * Math.log(1 - p);
      expect(Math.abs(chiSquareQuantile(p, 2) - want)).toBeLessThan(1e-9 * want);
    }
  });

  it('chi-square quantiles against the printed table (from memory: χ²(0.025;10) = 3.247, χ²(0.975;10) = 20.483, χ²(0.95;1) = 3.841)', () => {
    // Table values carry 4–5 significant digits, hence the 1e-3 absolute tolerance.
    expect(Math.abs(chiSquareQuantile(0.025, 10) - 3.247)).toBeLessThan(1e-3);
    expect(Math.abs(chiSquareQuantile(0.975, 10) - 20.483)).toBeLessThan(1e-3);
    expect(Math.abs(chiSquareQuantile(0.95, 1) - 3.841)).toBeLessThan(1e-3);
  });

  it('white FM EDF (from memory) and the ±1σ interval bracket the estimate and narrow with more data', () => {
    const small = oadevEdf(100, 4, 'white FM');
    const large = oadevEdf(10000, 4, 'white FM');
    expect(large).toBeGreaterThan(small);
    const ciSmall = chiSquareInterval(1e-12, small);
    const ciLarge = chiSquareInterval(1e-12, large);
    expect(ciSmall.low).toBeLessThan(1e-12);
    expect(ciSmall.high).toBeGreaterThan(1e-12);
    expect(ciLarge.high - ciLarge.low).toBeLessThan(ciSmall.high - ciSmall.low);
    // White PM formula (from memory) at m = 1: (N+1)(N−2)/(2(N−1)), ≈ N/2 for large N.
    expect(Math.abs(oadevEdf(1001, 1, 'white PM') - (1002 * 999) / (2 * 1000))).toBeLessThan(1e-12);
  });
});

// ---- Gap-tolerant estimators, Table 30/31 worked values, Table 5 EDF, chi-squared intervals ----
// Tables 30 (NBS 9-point set) and 31 (1000-point set) of SP 1065 §12 list ADEV, OADEV, MDEV, TDEV
// and (overlapping) HDEV; the values below are confirmed by two independent copies of the tables.

import { mdevGrid, oadevGrid, ohdevGrid, phaseGridFromFrequency, tdevGrid, type PhaseGrid } from '../src/clock/deviations.ts';
import { LEVEL_68, LEVEL_95, chiSquaredInterval, mdevEdf, oadevEdfExact, oadevEdfTable5, ohdevEdf } from '../src/clock/edf.ts';
import { gammaP, gammaPInverse, normalQuantile } from '../src/clock/gamma.ts';
import { regularGrid } from '../src/clock/grid.ts';
import { stabilityTable } from '../src/clock/stabilityTable.ts';

function nist1000(): number[] {
  const y: number[] = [];
  let n = 1234567890;
  for (let k = 0; k < 1000; k++) {
    y.push(n / 2147483647);
    n = (16807 * n) % 2147483647;
  }
  return y;
}

describe('SP 1065 Table 30 (NBS 9-point set, τ0 = 1 s; confirmed)', () => {
  const g = phaseGridFromFrequency([892, 809, 823, 798, 671, 644, 883, 903, 677], 1);
  it('OADEV(1, 2) = 91.22945, 85.95287', () => {
    expectSig7(oadevGrid(g, 1).value, 91.22945, 'OADEV(1)');
    expectSig7(oadevGrid(g, 2).value, 85.95287, 'OADEV(2)');
  });
  it('MDEV(1, 2) = 91.22945, 74.78849', () => {
    expectSig7(mdevGrid(g, 1).value, 91.22945, 'MDEV(1)');
    expectSig7(mdevGrid(g, 2).value, 74.78849, 'MDEV(2)');
  });
  it('TDEV(1, 2) = 52.67135, 86.35831', () => {
    expectSig7(tdevGrid(g, 1).value, 52.67135, 'TDEV(1)');
    expectSig7(tdevGrid(g, 2).value, 86.35831, 'TDEV(2)');
  });
  it('overlapping HDEV(1, 2) = 70.80607, 85.61487', () => {
    expectSig7(ohdevGrid(g, 1).value, 70.80607, 'HDEV(1)');
    expectSig7(ohdevGrid(g, 2).value, 85.61487, 'HDEV(2)');
  });
});

describe('SP 1065 Table 31 (1000-point set, τ0 = 1 s; confirmed)', () => {
  const g = phaseGridFromFrequency(nist1000(), 1);
  const want = {
    mdev: [2.922319e-1, 6.172376e-2, 2.170921e-2],
    tdev: [1.687202e-1, 3.563623e-1, 1.253382],
    hdev: [2.943883e-1, 9.581083e-2, 3.237638e-2],
  };
  [1, 10, 100].forEach((m, k) => {
    it(`τ = ${m} s: MDEV ${want.mdev[k]}, TDEV ${want.tdev[k]}, overlapping HDEV ${want.hdev[k]}`, () => {
      expectSig7(mdevGrid(g, m).value, want.mdev[k], `MDEV(${m})`);
      expectSig7(tdevGrid(g, m).value, want.tdev[k], `TDEV(${m})`);
      expectSig7(ohdevGrid(g, m).value, want.hdev[k], `HDEV(${m})`);
    });
  });
  it('term counts: OADEV N−2m, MDEV N−3m+1, HDEV N−3m (N = 1001 phase points)', () => {
    expect(oadevGrid(g, 10).terms).toBe(981);
    expect(mdevGrid(g, 10).terms).toBe(972);
    expect(ohdevGrid(g, 10).terms).toBe(971);
  });
});

describe('gaps (SP 1065 §5.15: terms that touch a missing point are left out)', () => {
  const y = nist1000();
  const full = phaseGridFromFrequency(y, 1);
  it('a missing phase point removes exactly the terms that read it, and the rest average as a direct sum says (derived)', () => {
    const x = Float64Array.from(full.xS);
    x[500] = Number.NaN;
    const g: PhaseGrid = { xS: x, tau0S: 1 };
    for (const m of [1, 4, 16]) {
      let sum = 0;
      let n = 0;
      for (let i = 0; i + 2 * m < x.length; i++) {
        const d = x[i + 2 * m] - 2 * x[i + m] + x[i];
        if (Number.isNaN(d)) continue;
        sum += d * d;
        n++;
      }
      const o = oadevGrid(g, m);
      expect(o.terms).toBe(1001 - 2 * m - 3);
      const want = Math.sqrt(sum / (2 * m * m * n));
      expect(Math.abs((o.value as number) - want) / want, `m=${m}: wanted ${want}, got ${o.value}`).toBeLessThan(1e-12);
      // MDEV windows span 3m points: all windows containing point 500 are dropped.
      expect(mdevGrid(g, m).terms).toBe(1001 - 3 * m + 1 - 3 * m);
    }
  });
  it('a missing frequency sample leaves the phase continuous but no term spans it', () => {
    const yy = y.slice();
    yy[300] = Number.NaN;
    const g = phaseGridFromFrequency(yy, 1);
    expect(oadevGrid(g, 1).terms).toBe(1001 - 2 - 2); // the two second differences over increment 300
  });
  it('uneven times go on the grid at the median step with missing points counted; off-grid times are refused', () => {
    const t = [0, 10, 20, 40, 50, 60, 90];
    const grid = regularGrid(t, t.map((v) => v * 1e-9), 1e-3, 'f');
    expect(grid.tau0S).toBe(10);
    expect(grid.missing).toBe(3);
    expect(Number.isNaN(grid.values[3])).toBe(true);
    expect(() => regularGrid([0, 10, 20, 33, 40], [0, 0, 0, 0, 0], 1e-3, 'f', [2, 3, 4, 5, 6])).toThrow(/f:5/);
    expect(() => regularGrid([0, 10, 5], [0, 0, 0], 1e-3, 'f', [2, 3, 4])).toThrow(/does not increase.*f:4/);
  });
  it('all values equal: every deviation 0 (not NaN) with a [0, 0] interval', () => {
    const tab = stabilityTable({ xS: new Float64Array(100).fill(2.5e-7), tau0S: 1 });
    for (const r of tab.rows) {
      expect(r.oadev?.value).toBe(0);
      expect(r.oadev?.ci95).toEqual([0, 0]);
    }
  });
  it('fewer than 3 phase points: refused, naming the statistics and how many they need', () => {
    expect(() => stabilityTable({ xS: Float64Array.from([1, 2]), tau0S: 1 }, { source: 'x.txt' })).toThrow(/OADEV needs at least 3/);
  });
});

describe('Table 5 EDF of the overlapping Allan variance (SP 1065 §5.3; formulas confirmed)', () => {
  // The exact Gaussian EDF (edf.ts, derived) uses the noise models' covariances; Table 5 are
  // approximations fitted to such results. Tolerances: the approximations' own accuracy as seen
  // in the table's use (a few % for white/random-walk noise, up to ~20 % for flicker PM).
  const N = 1025;
  const tol: Record<number, number> = { 2: 0.05, 1: 0.2, 0: 0.02, [-1]: 0.1, [-2]: 0.1 };
  for (const alpha of [2, 1, 0, -1, -2] as const) {
    it(`α = ${alpha}: Table 5 within ${tol[alpha] * 100} % of the exact EDF at m = 1 … 64`, () => {
      for (const m of [1, 2, 4, 8, 16, 32, 64]) {
        const table = oadevEdfTable5(N, m, alpha);
        const exact = oadevEdfExact(N - 2 * m, m, alpha);
        const rel = Math.abs(table - exact) / exact;
        expect(rel, `m=${m}: Table 5 ${table.toFixed(2)}, exact ${exact.toFixed(2)}, difference ${(rel * 100).toFixed(1)} %`).toBeLessThan(tol[alpha]);
      }
    });
  }
  it('white FM at m = 1 equals the Table 5 closed form 3(N−1)/2 − 2(N−2)/N times 4/9 (hand-evaluated for N = 1025)', () => {
    const want = (3 * 1024 / 2 - (2 * 1023) / 1025) * (4 / 9);
    expect(Math.abs(oadevEdfTable5(1025, 1, 0) - want)).toBeLessThan(1e-9);
  });
  it('MDEV and HDEV EDF fall as τ grows and stay below the number of terms (derived)', () => {
    for (const alpha of [2, 0, -2] as const) {
      let prev = Infinity;
      for (const m of [1, 4, 16, 64, 256]) {
        const e = mdevEdf(1025 - 3 * m + 1, m, alpha);
        const h = ohdevEdf(1025 - 3 * m, m, alpha);
        expect(e).toBeLessThan(prev);
        expect(e).toBeLessThanOrEqual(1025 - 3 * m + 1);
        expect(h).toBeLessThanOrEqual(1025 - 3 * m);
        prev = e;
      }
    }
  });
  it('Monte Carlo: the spread of OADEV over 400 white-FM series matches the Table 5 EDF within sampling error', () => {
    // EDF = 2·E[V]²/Var[V] for V the variance estimate (definition of EDF, SP 1065 §5.3).
    let seed = 12345;
    const rand = (): number => {
      seed = (16807 * seed) % 2147483647;
      return seed / 2147483647;
    };
    const gauss = (): number => Math.sqrt(-2 * Math.log(rand())) * Math.cos(2 * Math.PI * rand());
    const m = 8;
    const n = 257;
    const v: number[] = [];
    for (let k = 0; k < 400; k++) {
      const y = Array.from({ length: n - 1 }, gauss);
      const o = oadevGrid(phaseGridFromFrequency(y, 1), m).value as number;
      v.push(o * o);
    }
    const mean = v.reduce((a, b) => a + b, 0) / v.length;
    const variance = v.reduce((a, b) => a + (b - mean) ** 2, 0) / (v.length - 1);
    const edfMc = (2 * mean * mean) / variance;
    const want = oadevEdfTable5(n, m, 0);
    // The sample EDF from 400 trials has ~10 % relative scatter (√(2/400) on the variance, ×√2 for heavier tails).
    expect(Math.abs(edfMc - want) / want, `Table 5 ${want.toFixed(1)}, Monte Carlo ${edfMc.toFixed(1)}`).toBeLessThan(0.2);
  });
});

describe('chi-squared quantiles and intervals (SP 1065 §5.3.2)', () => {
  it('χ²(p; 1) = z((1+p)/2)² with the normal quantile (derived), to 1e-8 relative', () => {
    for (const p of [0.1, 0.5, 0.6827, 0.95, 0.99]) {
      const z = normalQuantile((1 + p) / 2);
      const want = z * z;
      const got = chiSquareQuantile(p, 1);
      expect(Math.abs(got - want) / want, `p=${p}: wanted ${want}, got ${got}`).toBeLessThan(1e-8);
    }
  });
  it('the inverse regularized gamma inverts P over a wide range of a and p (round trip)', () => {
    // ln Γ(a) ~ a·ln a carries ~a·ln(a)·1e-16 absolute error, which is P's relative error: 1e-11 up to
    // a = 50, 1e-8 for the large a (EDF up to 4e5) the stability table meets.
    for (const a of [0.05, 0.5, 1, 3.7, 50, 5000, 2e5]) {
      for (const p of [1e-10, 0.001, 0.1587, 0.5, 0.8413, 0.999]) {
        const x = gammaPInverse(a, p);
        const back = gammaP(a, x);
        expect(Math.abs(back - p) / p, `a=${a} p=${p}: x=${x}, P(a,x)=${back}`).toBeLessThan(a <= 50 ? 1e-11 : 1e-8);
      }
    }
  });
  it('the interval of a deviation (worked by hand): σ = 1e-12, edf = 10 → 95 % [0.6987e-12, 1.7549e-12]', () => {
    // σ·√(10/20.483), σ·√(10/3.247) from the printed χ² table (from memory, 4 digits).
    const [lo, hi] = chiSquaredInterval(1e-12, 10, LEVEL_95);
    expect(Math.abs(lo - 0.69873e-12)).toBeLessThan(1e-16);
    expect(Math.abs(hi - 1.75494e-12)).toBeLessThan(1e-16);
    const [lo68, hi68] = chiSquaredInterval(1e-12, 10, LEVEL_68);
    expect(lo68).toBeGreaterThan(lo);
    expect(hi68).toBeLessThan(hi);
  });
});
