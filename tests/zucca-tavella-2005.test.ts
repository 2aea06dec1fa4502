/**
 * C. Zucca and P. Tavella, "The clock model and its relationship with the Allan and related
 * variances", IEEE Trans. UFFC 52(2):289–296, 2005 (clock model of Galleani et al., Metrologia 40
 * (2003) S257). Checked by simulation, independent of the closed form: the three-state model
 * x' = y + √q1 ξ1, y' = d + √q2 ξ2, d' = √q3 ξ3 integrated by plain Euler–Maruyama steps from a
 * known state, 4000 seeded paths. The derived σ_x²(t) = q1·t + q2·t³/3 + q3·t⁵/20
 * (src/clock/predictionBand.ts; from memory, derived from integrated Wiener processes) must
 * (a) match the sample variance within its Monte-Carlo uncertainty (3·√(2/N) ≈ 6.7 % for N = 4000,
 * plus ≤ 1.5 % Euler bias at 200+ steps), and (b) cover the simulated errors at the stated
 * probability: 68.27 % inside ±1σ and 95 % inside ±1.96σ, each within 3 binomial standard errors
 * (±2.2 % and ±1.0 %).
 */
import { describe, expect, it } from 'vitest';
import { diffusionFromNoise, predictionBandAt } from '../src/clock/predictionBand.ts';
import { predictionSigmaNs, ruleOfThumbSigmaNs } from '../src/clock/noise.ts';
import { gaussian, mulberry32 } from './helpers/powerLawNoise.ts';

const DAY_S = 86400;

describe('prediction band of the three-state clock model (Zucca & Tavella 2005)', () => {
  // Levels chosen so that the three terms are of the same order at 10 d.
  const noise = { whiteFmAdev1s: 1e-12, randomWalkFmAdev1d: 1e-14 };
  const q = diffusionFromNoise(noise, 3.1e-44);
  const PATHS = 4000;
  const STEPS = 2000;
  const T = 10 * DAY_S;
  const h = T / STEPS;
  const checkpoints = [200, 600, 2000]; // 1 d, 3 d, 10 d
  const samples = checkpoints.map(() => new Float64Array(PATHS));
  const g = gaussian(mulberry32(20050289));
  const s1 = Math.sqrt(q.q1S * h);
  const s2 = Math.sqrt(q.q2PerS * h);
  const s3 = Math.sqrt(q.q3PerS3 * h);
  for (let p = 0; p < PATHS; p++) {
    let x = 0;
    let y = 0;
    let d = 0;
    let c = 0;
    for (let k = 1; k <= STEPS; k++) {
      // Drift terms first (from the previous state), then the noise increments.
      x += y * h + s1 * g();
      y += d * h + s2 * g();
      d += s3 * g();
      if (k === checkpoints[c]) samples[c++][p] = x;
    }
  }

  checkpoints.forEach((k, c) => {
    const t = k * h;
    it(`t = ${t / DAY_S} d: variance and coverage match σx(t)`, () => {
      const sigmaS = predictionBandAt(noise, t, undefined, q.q3PerS3).sigmaNs * 1e-9;
      const xs = samples[c];
      let ss = 0;
      let in1 = 0;
      let in196 = 0;
      for (const v of xs) {
        ss += v * v;
        if (Math.abs(v) <= sigmaS) in1++;
        if (Math.abs(v) <= 1.96 * sigmaS) in196++;
      }
      const ratio = ss / PATHS / (sigmaS * sigmaS);
      expect(Math.abs(ratio - 1), `variance ratio simulated/derived: wanted 1, got ${ratio.toFixed(4)}`).toBeLessThan(0.067 + 0.015);
      const f1 = in1 / PATHS;
      const f95 = in196 / PATHS;
      expect(Math.abs(f1 - 0.6827), `±1σ coverage: wanted 0.6827, got ${f1}`).toBeLessThan(3 * Math.sqrt((0.6827 * 0.3173) / PATHS) + 0.005);
      expect(Math.abs(f95 - 0.95), `±1.96σ coverage: wanted 0.95, got ${f95}`).toBeLessThan(3 * Math.sqrt((0.95 * 0.05) / PATHS) + 0.003);
    });
  });

  it('with white and random-walk FM only, the derived band equals the old τ·σy(τ) rule (derived identity)', () => {
    for (const tS of [60, 3600, DAY_S, 30 * DAY_S]) {
      const a = predictionSigmaNs(noise, tS);
      const b = ruleOfThumbSigmaNs(noise, tS);
      expect(Math.abs(a - b) / b, `t=${tS} s: band ${a} ns, rule ${b} ns`).toBeLessThan(1e-12);
    }
  });

  it('the fitted state covariance adds gᵀΣg: a 1 ns offset sigma alone gives 1 ns at t = 0, and a rate sigma grows as t', () => {
    const fit = { sigmas: [1, 1e-13], correlation: [[1, 0], [0, 1]] };
    expect(predictionBandAt({}, 0, fit).sigmaNs).toBeCloseTo(1, 12);
    const at1d = predictionBandAt({}, DAY_S, fit).sigmaNs;
    const want = Math.hypot(1, 1e-13 * DAY_S * 1e9);
    expect(Math.abs(at1d - want), `wanted ${want} ns, got ${at1d} ns`).toBeLessThan(1e-9);
  });
});
