/**
 * The keep-in planner's scans take shortcuts (src/plan/crossing.ts, offsetBend.ts, strategy.ts):
 * they pass over stretches where a bound on the offset's bending and the band's growth shows no
 * level can be met, and stop once only the crossing side's far edge can still change the answer.
 * Reference (common practice for any such shortcut): the plain point-by-point scan over the same
 * instants must give the same instants to the last bit, so the plans do not change. Each property
 * runs the shortcut against the plain scan on random clocks (real relativistic tracks of eccentric
 * orbits, oscillator offsets, drifts and noise) and compares with Object.is: no tolerance.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { gravityModel } from '../src/orbit/gravity.ts';
import { clockStepS, integrateAlong } from '../src/clock/integrate.ts';
import { OnboardClock } from '../src/clock/oscillator.ts';
import { fractionalOffset } from '../src/clock/rate.ts';
import { elementsFromDegKm, KeplerianTrajectory } from '../src/orbit/keplerian.ts';
import { band95Of } from '../src/plan/band.ts';
import { crossingAndMargin, firstLevelTimes, type Level } from '../src/plan/crossing.ts';
import { offsetBend } from '../src/plan/offsetBend.ts';
import { exitWithBandS } from '../src/plan/strategy.ts';

const T0 = 852_292_869; // an instant in January 2027, s since J2000.0 TT
const DAY = 86_400;
const G = gravityModel('point');
const NOISES = [null, { whiteFmAdev1s: 2e-12, flickerFmFloor: 5e-15, randomWalkFmAdev1d: 1e-15 }, { randomWalkFmAdev1d: 2e-14 }];

/** An invented satellite clock: relativity integrated along a Keplerian orbit plus an oscillator. */
function clockOf(aKm: number, e: number, days: number, yFrac: number, agingPerDay: number, x0Ns: number): { clock: OnboardClock; periodS: number } {
  const el = elementsFromDegKm({ epochTtJ2000S: T0, aKm, e, iDeg: 55, raanDeg: 10, argpDeg: 30, meanAnomalyDeg: 5 }, { a: 'a', e: 'e' });
  const periodS = 2 * Math.PI * Math.sqrt((aKm * 1e3) ** 3 / G.gmM3PerS2);
  const traj = new KeplerianTrajectory('x', el, G.gmM3PerS2);
  const [track] = integrateAlong(traj, T0, T0 + days * DAY, clockStepS(periodS, e), [(x, y, z, vx, vy, vz, t) => fractionalOffset(G, x, y, z, vx, vy, vz, t)]);
  // The relativistic mean rate taken out, so the offsets stay in the range a keep-in limit sees.
  const mean = track.integralAt(T0 + days * DAY) / (days * DAY);
  return { clock: new OnboardClock(track, { epochTtJ2000S: T0, offsetNs: x0Ns, hardwareFractionalOffset: -mean + yFrac, agingPerDay }), periodS };
}

/** The answer the scan gave before the shortcuts: six levels by the plain scan, then the margin. */
function plainCrossing(offsetNs: (t: number) => number, bandNs: (t: number) => number, limitNs: number, marginLevelNs: number | null, from: number, to: number, stepS: number) {
  const levels: Level[] = [];
  for (const sign of [1, -1] as const) for (const bandSign of [0, 1, -1] as const) levels.push({ sign, bandSign, levelNs: limitNs });
  const [upAt, upEarly, upLate, loAt, loEarly, loLate] = firstLevelTimes(offsetNs, bandNs, levels, from, to, stepS);
  if (upAt === null && loAt === null) return { crossing: null, marginAt: null };
  const upperFirst = loAt === null || (upAt !== null && upAt <= loAt);
  const [at, early, late, otherEarly] = upperFirst ? [upAt as number, upEarly, upLate, loEarly] : [loAt as number, loEarly, loLate, upEarly];
  const earliest = Math.min(early ?? at, at);
  const crossing = {
    atTtJ2000S: at,
    side: upperFirst ? 'upper' : 'lower',
    earliestTtJ2000S: earliest,
    latestTtJ2000S: late === null ? null : Math.max(late, at),
    otherSide: otherEarly !== null && otherEarly < earliest ? { side: upperFirst ? 'lower' : 'upper', earliestTtJ2000S: otherEarly } : null,
  };
  if (marginLevelNs === null) return { crossing, marginAt: null };
  const [m] = firstLevelTimes(offsetNs, bandNs, [{ sign: upperFirst ? 1 : -1, bandSign: 1, levelNs: marginLevelNs }], from, to, stepS, true);
  // The planner uses min(marginAt, earliest): a later margin instant is the same as none.
  return { crossing, marginAt: m !== null && m <= earliest ? m : null };
}

describe('crossing scan with shortcuts = the plain scan', () => {
  it('same crossing, edges, other side and margin instant on random clocks, limits and plan steps', () => {
    fc.assert(
      fc.property(
        fc.record({
          orbit: fc.constantFrom([26_561.75, 0.01], [29_600, 0.2], [7_000, 0.001], [42_164, 0.05], [26_561.75, 0]),
          days: fc.integer({ min: 3, max: 40 }),
          yFrac: fc.double({ min: -4e-12, max: 4e-12, noNaN: true }),
          agingPerDay: fc.double({ min: -6e-14, max: 6e-14, noNaN: true }),
          x0Ns: fc.double({ min: -30, max: 30, noNaN: true }),
          noise: fc.constantFrom(...NOISES),
          limitNs: fc.constantFrom(20, 50, 100, 300),
          marginNs: fc.constantFrom(0, 5, 20),
          sinceShare: fc.double({ min: 0, max: 0.6, noNaN: true }),
          stepPhaseNs: fc.double({ min: -60, max: 60, noNaN: true }),
          stepFractional: fc.double({ min: -5e-12, max: 5e-12, noNaN: true }),
        }),
        (p) => {
          const { clock, periodS } = clockOf(p.orbit[0], p.orbit[1], p.days, p.yFrac, p.agingPerDay, p.x0Ns);
          const from = T0 + 100;
          const to = T0 + p.days * DAY - 50;
          const since = from + p.sinceShare * (to - from);
          // A plan's step at `since` (a phase and frequency step, as the planner applies them).
          const offset = (t: number): number => clock.offsetNs(t) + p.stepPhaseNs + 1e9 * (p.stepFractional * t - p.stepFractional * since);
          const band95 = band95Of(p.noise);
          const band = (t: number): number => band95(t - since);
          const stepS = Math.max(10, Math.min(600, periodS / 8));
          const margin = p.marginNs > 0 ? p.limitNs - p.marginNs : null;
          const bend = offsetBend(clock, from, to);
          expect(bend, 'a span inside the clock track has bend bounds').not.toBeNull();
          const extra = Math.abs(p.stepPhaseNs) + 1e9 * (Math.abs(p.stepFractional) * to + Math.abs(p.stepFractional * since));
          const fast = crossingAndMargin(offset, band, p.limitNs, margin, since, to, stepS, { bend: bend!, extraMagnitudeNs: extra });
          const plain = plainCrossing(offset, band, p.limitNs, margin, since, to, stepS);
          expect(fast, `wanted ${JSON.stringify(plain)}, got ${JSON.stringify(fast)}`).toStrictEqual(plain);
        },
      ),
      { numRuns: 60, seed: 20270104 },
    );
  });
});

describe('frequency sizing exit time with shortcuts = the plain scan', () => {
  /** exitWithBandS as it was: every one of the 1500 instants, band computed at each. */
  function plainExit(x0: number, r: number, d: number, usable: number, band95Ns: (tauS: number) => number, horizonS: number): number {
    const v = (tau: number): number => Math.abs(x0 + r * tau + 0.5 * d * tau * tau) + band95Ns(tau) - usable;
    const dt = horizonS / 1500;
    let inside = v(0) < 0;
    let prev = 0;
    for (let k = 1; k <= 1500; k++) {
      const tau = k * dt;
      const vt = v(tau);
      if (!inside) {
        inside = vt < 0;
        prev = tau;
        continue;
      }
      if (vt >= 0) {
        let lo = prev;
        let hi = tau;
        for (let i = 0; i < 40; i++) {
          const mid = 0.5 * (lo + hi);
          if (v(mid) >= 0) hi = mid;
          else lo = mid;
        }
        return hi;
      }
      prev = tau;
    }
    return inside ? horizonS : 0;
  }

  it('same exit instant to the last bit (inside, never inside, staying inside)', () => {
    fc.assert(
      fc.property(
        fc.record({
          horizonS: fc.double({ min: 1800, max: 270 * DAY, noNaN: true }),
          usableNs: fc.double({ min: 5, max: 300, noNaN: true }),
          x0Share: fc.double({ min: -1.3, max: 1.3, noNaN: true }),
          rateShare: fc.double({ min: -8, max: 8, noNaN: true }),
          d: fc.constantFrom(0, 1e-13, -1e-13, 3e-11, -3e-11, 1e-9, -1e-9),
          noise: fc.constantFrom(...NOISES),
        }),
        (p) => {
          const x0 = p.x0Share * p.usableNs;
          const r = (p.rateShare * p.usableNs) / p.horizonS;
          const band = band95Of(p.noise);
          const want = plainExit(x0, r, p.d, p.usableNs, band, p.horizonS);
          const got = exitWithBandS(x0, r, p.d, p.usableNs, band, p.horizonS);
          expect(Object.is(got, want), `wanted ${want} s, got ${got} s, difference ${got - want} s`).toBe(true);
        },
      ),
      { numRuns: 3000, seed: 20270104 },
    );
  });
});
