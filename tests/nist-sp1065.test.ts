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
