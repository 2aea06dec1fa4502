/**
 * W. J. Riley and C. A. Greenhall, "Power law noise identification using the lag 1
 * autocorrelation", Proc. 18th European Frequency and Time Forum, 2004 (also NIST SP 1065 §5.6).
 *
 * Checked on our own seeded power-law noise of each type (tests/helpers/powerLawNoise.ts,
 * Kasdin–Walter fractional differencing). The procedure's constants (δ < 0.25 stop, dmax = 2,
 * ≥ 30 decimated points) are from memory. Measured here: the rounded α is right at ≥ 95 % of
 * the averaging times whose decimated series has ≥ 1024 points; with fewer points the flicker
 * types drift toward their neighbours (sample-ACF bias of long-memory noise), which the report
 * states, so "enough points" is ≥ 1024 for this check.
 */
import { describe, expect, it } from 'vitest';
import { identifyNoise, lag1Autocorrelation, NOISE_ID_MIN_POINTS } from '../src/clock/noiseId.ts';
import { powerLawPhase } from './helpers/powerLawNoise.ts';

const N = 8192;
const ENOUGH = 1024;
const ALPHAS = [2, 1, 0, -1, -2] as const;

describe('lag-1 autocorrelation noise identification (Riley & Greenhall 2004)', () => {
  it('identifies α at ≥ 95 % of τ with ≥ 1024 decimated points, every type, 4 seeds', () => {
    let right = 0;
    let total = 0;
    const misses: string[] = [];
    for (const alpha of ALPHAS) {
      for (const seed of [11, 23, 37, 41]) {
        const x = powerLawPhase(alpha, N, seed * 7 + alpha);
        for (let m = 1; Math.floor((N - 1) / m) + 1 >= ENOUGH; m *= 2) {
          const id = identifyNoise(x, m);
          total++;
          if (id.alpha === alpha) right++;
          else misses.push(`α=${alpha} seed ${seed} m=${m}: got ${id.alpha} (estimate ${id.alphaEstimate?.toFixed(2)})`);
        }
      }
    }
    const rate = right / total;
    expect(rate, `wanted ≥ 0.95, got ${rate.toFixed(3)} (${right}/${total}); misses: ${misses.join('; ')}`).toBeGreaterThanOrEqual(0.95);
  });

  it('the unrounded estimate of white FM and random-walk FM lies within ±0.5 of α (rounding picks the type)', () => {
    for (const alpha of [0, -2] as const) {
      const id = identifyNoise(powerLawPhase(alpha, N, 5), 4);
      expect(Math.abs((id.alphaEstimate as number) - alpha), `α=${alpha}: estimate ${id.alphaEstimate}`).toBeLessThan(0.5);
    }
  });

  it(`below ${NOISE_ID_MIN_POINTS} decimated points the type is unknown (null), not guessed`, () => {
    const x = powerLawPhase(0, 100, 3);
    expect(identifyNoise(x, 4).alpha).toBeNull(); // 25 points
    expect(identifyNoise(x, 3).alpha).not.toBeNull(); // 34 points
  });

  it('lag-1 autocorrelation of a known sequence (derived by hand): alternating ±1 gives −(n−1)/n', () => {
    const z = [1, -1, 1, -1, 1, -1];
    const want = -5 / 6;
    const got = lag1Autocorrelation(z);
    expect(Math.abs(got - want), `wanted ${want}, got ${got}`).toBeLessThan(1e-15);
  });

  it('a constant series has no noise type (null), not NaN', () => {
    expect(identifyNoise(new Float64Array(200).fill(3e-7), 1).alpha).toBeNull();
  });
});
