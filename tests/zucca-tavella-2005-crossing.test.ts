/**
 * The keep-in crossing probability against a seeded Monte-Carlo of the clock noise model.
 *
 * Source: C. Zucca & P. Tavella, "The clock model and its relationship with the Allan
 * and related variances", IEEE Trans. UFFC 52(2):289–296, 2005. The two-state clock model driven by
 * white FM (diffusion q1 [s]) and random-walk FM (q2 [1/s]) has, from a known state, time error
 * variance σx²(t) = q1·t + q2·t³/3 and Allan variance σy²(τ) = q1/τ + q2·τ/3 (from memory; the q3
 * drift-noise terms are left out). With q1 = a² and q2 = 3·c²/1 d for white-FM level a at 1 s and
 * random-walk-FM level c at 1 d, the planner's band rule σx = τ·σy(τ) gives exactly that σx (derived).
 *
 * The simulation integrates the model exactly on its grid (the increment of ∫W over a step is drawn
 * jointly with the step of W: variances q2·Δ and q2·Δ³/3, correlation √3/2; derived), seeded, so
 * the check is reproducible. `crossingProbabilityWithinHorizon` is the largest single-instant
 * probability of being outside the limit (a lower bound on crossing at some time); for a trend and a
 * band that both grow, that instant is the horizon end. Tolerance: 4 standard errors of the
 * Monte-Carlo fraction (a false failure about once in 16 000 runs; the seed makes it fixed anyway).
 */
import { describe, expect, it } from 'vitest';
import { gravityModel } from '../src/orbit/gravity.ts';
import { integrateAlong } from '../src/clock/integrate.ts';
import { OnboardClock, type NoiseLevels } from '../src/clock/oscillator.ts';
import { elementsFromDegKm, KeplerianTrajectory } from '../src/orbit/keplerian.ts';
import { planResets } from '../src/plan/resets.ts';

const T0 = 852_292_869; // an instant in January 2027, s since J2000.0 TT
const DAY = 86_400;

/** mulberry32: a small seeded generator (common practice), uniform in (0, 1). */
function uniform(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return (((t ^ (t >>> 14)) >>> 0) + 0.5) / 4294967296;
  };
}

/** Standard normal pairs by Box–Muller. */
function normals(seed: number): () => number {
  const u = uniform(seed);
  let spare: number | null = null;
  return () => {
    if (spare !== null) {
      const s = spare;
      spare = null;
      return s;
    }
    const r = Math.sqrt(-2 * Math.log(u()));
    const th = 2 * Math.PI * u();
    spare = r * Math.sin(th);
    return r * Math.cos(th);
  };
}

function quadraticClock(y0: number, noise: NoiseLevels, spanS: number): OnboardClock {
  const g = gravityModel('point');
  const el = elementsFromDegKm({ epochTtJ2000S: T0, aKm: 26561.75, e: 0, iDeg: 55, raanDeg: 0, argpDeg: 0, meanAnomalyDeg: 0 }, { a: 'a', e: 'e' });
  const [zero] = integrateAlong(new KeplerianTrajectory('q', el, g.gmM3PerS2), T0, T0 + spanS, 3600, [() => 0]);
  return new OnboardClock(zero, { epochTtJ2000S: T0, offsetNs: 0, hardwareFractionalOffset: y0, agingPerDay: 0, noise });
}

/** Fractions of simulated paths outside ±L at the horizon end and at any grid instant. */
function simulate(y0: number, a: number, c: number, limitNs: number, horizonS: number, paths: number, steps: number, seed: number): { atEnd: number; anyTime: number } {
  const q1 = a * a;
  const q2 = (3 * c * c) / DAY;
  const dt = horizonS / steps;
  const sdW = Math.sqrt(q2 * dt);
  const sdI = Math.sqrt((q2 * dt * dt * dt) / 3);
  const rho = Math.sqrt(3) / 2;
  const sdWhite = Math.sqrt(q1 * dt);
  const g = normals(seed);
  let atEnd = 0;
  let anyTime = 0;
  for (let p = 0; p < paths; p++) {
    let xw = 0;
    let xr = 0;
    let y = 0;
    let crossed = false;
    let outside = false;
    for (let k = 1; k <= steps; k++) {
      const g2 = g();
      const g3 = g();
      xw += sdWhite * g();
      xr += y * dt + sdI * (rho * g2 + Math.sqrt(1 - rho * rho) * g3);
      y += sdW * g2;
      const xNs = y0 * 1e9 * k * dt + 1e9 * (xw + xr);
      outside = Math.abs(xNs) >= limitNs;
      if (outside) crossed = true;
    }
    if (outside) atEnd++;
    if (crossed) anyTime++;
  }
  return { atEnd: atEnd / paths, anyTime: anyTime / paths };
}

describe('crossing probability within the horizon against a Monte-Carlo of the noise model (Zucca & Tavella 2005)', () => {
  const cases: [string, number, number, number][] = [
    ['random-walk FM only', 5e-14, 0, 1e-15],
    ['white FM and random-walk FM', 4.5e-14, 1e-11, 1e-15],
  ];
  for (const [label, y0, a, c] of cases) {
    it(`${label}: planner and simulation agree within 4 standard errors`, () => {
      const horizonS = 60 * DAY;
      const limitNs = 300;
      const noise = { whiteFmAdev1s: a, randomWalkFmAdev1d: c };
      const plan = planResets({ satellite: 'q', clock: quadraticClock(y0, noise, horizonS), limitNs, noise, policy: { marginNs: 0, leadTimeS: 0, prefer: 'combined' }, fromTtJ2000S: T0, toTtJ2000S: T0 + horizonS, periodS: 43082, contacts: [], compare: false });
      const got = plan.crossingProbabilityWithinHorizon;
      const paths = 20_000;
      const mc = simulate(y0, a, c, limitNs, horizonS, paths, 120, 20270104);
      const se = Math.sqrt((mc.atEnd * (1 - mc.atEnd)) / paths);
      expect(mc.atEnd, 'the case must be neither sure nor impossible').toBeGreaterThan(0.05);
      expect(Math.abs(got - mc.atEnd), `planner ${got.toFixed(4)}, Monte-Carlo ${mc.atEnd.toFixed(4)} ± ${se.toFixed(4)}, difference ${(got - mc.atEnd).toFixed(4)}`).toBeLessThan(4 * se);
      // A crossing at some instant is at least as likely as being outside at the end.
      expect(mc.anyTime + 4 * se).toBeGreaterThanOrEqual(got);
    });
  }
});
