/**
 * Noise levels from a stability table (src/clock/noiseFit.ts) on simulated clocks with known
 * white-FM and random-walk-FM levels (derived check: the Allan variance of these processes is
 * a²/τ + c²·τ/1 d, NIST SP 1065 Table 3 / IEEE 1139). Seeded. Tolerances: white FM 25 %, random-walk
 * FM 40 % (it rests on the few longest averaging times, EDF 5–20, so one realization scatters by
 * ~30 %), or 3σ of the reported uncertainty if larger (octave points are correlated, so the stated
 * 1σ is optimistic, as the module says).
 */
import { describe, expect, it } from 'vitest';
import { estimateNoiseModel } from '../src/clock/noiseFit.ts';
import { stabilityTable } from '../src/clock/stabilityTable.ts';
import { gaussian, mulberry32 } from './helpers/powerLawNoise.ts';

function simulate(aAdev1s: number, cAdev1d: number, tau0S: number, n: number, seed: number): Float64Array {
  const g = gaussian(mulberry32(seed));
  const q1 = aAdev1s * aAdev1s;
  const q2 = (3 * cAdev1d * cAdev1d) / 86400;
  const x = new Float64Array(n);
  let rw = 0;
  for (let k = 1; k < n; k++) {
    rw += Math.sqrt(q2 * tau0S) * g();
    const y = Math.sqrt(q1 / tau0S) * g() + rw;
    x[k] = x[k - 1] + y * tau0S;
  }
  return x;
}

describe('noise model estimated from the stability table', () => {
  for (const [a, c, seed] of [
    [3e-12, 2e-14, 1],
    [1e-12, 5e-14, 2],
  ] as const) {
    it(`white FM ${a} at 1 s and random-walk FM ${c} at 1 d are recovered`, () => {
      const n = 40000;
      const tau0S = 60;
      const table = stabilityTable({ xS: simulate(a, c, tau0S, n, seed), tau0S });
      const { estimate, reason } = estimateNoiseModel(table.rows, n * tau0S);
      expect(estimate, String(reason)).not.toBeNull();
      const e = estimate!;
      const tolA = Math.max(0.25 * a, 3 * (e.whiteFmAdev1sSigma ?? 0));
      const tolC = Math.max(0.4 * c, 3 * (e.randomWalkFmAdev1dSigma ?? 0));
      expect(Math.abs(e.whiteFmAdev1s - a), `white FM: wanted ${a}, got ${e.whiteFmAdev1s} ± ${e.whiteFmAdev1sSigma}`).toBeLessThan(tolA);
      expect(Math.abs(e.randomWalkFmAdev1d - c), `RW FM: wanted ${c}, got ${e.randomWalkFmAdev1d} ± ${e.randomWalkFmAdev1dSigma}`).toBeLessThan(tolC);
      // No flicker was simulated: the floor stays small against the white-FM level at the longest τ used.
      const tauMax = Math.max(...e.tausUsedS);
      expect(e.flickerFmFloor).toBeLessThan(a / Math.sqrt(tauMax) + c * Math.sqrt(tauMax / 86400));
    });
  }

  it('phase-noise-only data give no estimate, with the reason', () => {
    const g = gaussian(mulberry32(5));
    const x = Float64Array.from({ length: 4000 }, () => 1e-9 * g());
    const table = stabilityTable({ xS: x, tau0S: 1 });
    const r = estimateNoiseModel(table.rows, 4000);
    expect(r.estimate).toBeNull();
    expect(r.reason).toMatch(/frequency-type noise/);
  });
});

describe('fit → noise model → scenario → band (the chain resets uses)', () => {
  it('a fit of a simulated white-FM + random-walk-FM clock writes noise levels that load back and widen the band', async () => {
    const { defaultTimeSystem } = await import('../src/io/tables.ts');
    const { fitClock } = await import('../src/plan/fit.ts');
    const { updateScenarioClock } = await import('../src/io/updateScenario.ts');
    const { loadScenario } = await import('../src/io/loadScenario.ts');
    const { predictionSigmaNs } = await import('../src/clock/noise.ts');
    const { mkdtempSync, copyFileSync, rmSync } = await import('node:fs');
    const { join } = await import('node:path');
    const { tmpdir } = await import('node:os');
    const ts = defaultTimeSystem();
    const t0 = ts.parse('2027-01-04T00:00:00Z', 'test').ttJ2000S;
    const tau0S = 300;
    const x = simulate(2e-12, 3e-14, tau0S, 6000, 11);
    const rows = Array.from(x, (v, i) => ({ line: i + 2, ttJ2000S: t0 + i * tau0S, offsetNs: v * 1e9, sigmaNs: null }));
    const r = fitClock(rows, { degree: 2, timeSystem: ts, clipSigma: 0 });
    expect(r.noiseModel, String(r.noiseModelNote)).not.toBeNull();
    const dir = mkdtempSync(join(tmpdir(), 'tauplan-noise-'));
    try {
      const file = join(dir, 'tessera.yaml');
      copyFileSync('data/demo/tessera.yaml', file);
      const nm = r.noiseModel!;
      updateScenarioClock(file, 'TSR-1', { epoch: r.epoch, offsetNs: r.offsetNs, hardwareFractionalOffset: -4.4647e-10, noise: { whiteFmAdev1s: nm.whiteFmAdev1s, flickerFmFloor: nm.flickerFmFloor, randomWalkFmAdev1d: nm.randomWalkFmAdev1d } }, ts);
      const sc = loadScenario(file, ts);
      const noise = sc.satellites.find((s) => s.id === 'TSR-1')!.clock!.noise!;
      expect(noise.whiteFmAdev1s).toBeCloseTo(nm.whiteFmAdev1s, 20);
      expect(noise.randomWalkFmAdev1d).toBeCloseTo(nm.randomWalkFmAdev1d, 22);
      // The band resets draws from these levels: 10 days of coasting, within 40 % of the true model's.
      const truth = predictionSigmaNs({ whiteFmAdev1s: 2e-12, randomWalkFmAdev1d: 3e-14 }, 10 * 86400);
      const got = predictionSigmaNs(noise, 10 * 86400);
      expect(Math.abs(got - truth) / truth, `10-day band: wanted ${truth.toFixed(2)} ns, got ${got.toFixed(2)} ns`).toBeLessThan(0.4);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  }, 120_000);
});
