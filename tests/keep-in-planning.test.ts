/**
 * Keep-in crossings and adjustments (physics.md §6–7). No published reference exists for the
 * planner; the checks are closed forms (common practice: roots of a quadratic, the maximal exit
 * time of a parabola inside a band) and the band rule σx(τ) ≈ τ·σy(τ), 95 % = ±1.96σx
 * (physics.md §6, common practice), each computed here independently of the planner's code path.
 */
import { describe, expect, it } from 'vitest';
import { gravityModel } from '../src/orbit/gravity.ts';
import { integrateAlong } from '../src/clock/integrate.ts';
import { OnboardClock, type OscillatorParams } from '../src/clock/oscillator.ts';
import { predictionSigmaNs } from '../src/clock/noise.ts';
import { elementsFromDegKm, KeplerianTrajectory } from '../src/orbit/keplerian.ts';
import { bestPhaseNs } from '../src/plan/adjust.ts';
import { offsetWithAdjustmentsNs, planResets, type Contact } from '../src/plan/resets.ts';
import { fractionalOffset } from '../src/clock/rate.ts';

const T0 = 852_292_869; // an instant in January 2027, s since J2000.0 TT
const DAY = 86_400;
const G = gravityModel('point');

/** A clock with no relativistic term at all: the oscillator model alone (a pure quadratic). */
function quadraticClock(params: OscillatorParams, spanS: number): OnboardClock {
  const el = elementsFromDegKm({ epochTtJ2000S: T0, aKm: 26561.75, e: 0, iDeg: 55, raanDeg: 0, argpDeg: 0, meanAnomalyDeg: 0 }, { a: 'a', e: 'e' });
  const traj = new KeplerianTrajectory('q', el, G.gmM3PerS2);
  const [zero] = integrateAlong(traj, T0, T0 + spanS, 3600, [() => 0]);
  return new OnboardClock(zero, params);
}

/** Daily 10-minute contacts at 06:00 after T0. */
function dailyContacts(days: number): Contact[] {
  return Array.from({ length: days }, (_, d) => ({ station: 'ST', aosTtJ2000S: T0 + d * DAY + 21600, tcaTtJ2000S: T0 + d * DAY + 21900, losTtJ2000S: T0 + d * DAY + 22200 }));
}

describe('crossing of a pure quadratic clock', () => {
  it('matches the closed-form root within 1 s', () => {
    const y = 3e-13; // fractional frequency
    const agingPerDay = 2e-14;
    const x0Ns = 10;
    const limitNs = 400;
    const clock = quadraticClock({ epochTtJ2000S: T0, offsetNs: x0Ns, hardwareFractionalOffset: y, agingPerDay }, 60 * DAY);
    const plan = planResets({ satellite: 'q', clock, limitNs, noise: null, policy: { marginNs: 0, leadTimeS: 0, prefer: 'phase' }, fromTtJ2000S: T0, toTtJ2000S: T0 + 60 * DAY, periodS: 43082, contacts: [] });
    // x(t) = x0 + y·t·1e9 + (D/86400)·t²/2·1e9 = L  →  a t² + b t + c = 0
    const a = ((agingPerDay / DAY) * 1e9) / 2;
    const b = y * 1e9;
    const c = x0Ns - limitNs;
    const tClosed = (-b + Math.sqrt(b * b - 4 * a * c)) / (2 * a);
    const got = plan.firstCrossing!.atTtJ2000S - T0;
    expect(Math.abs(got - tClosed), `closed form ${tClosed.toFixed(3)} s, planner ${got.toFixed(3)} s`).toBeLessThan(1);
    expect(plan.firstCrossing!.side).toBe('upper');
  });

  it('the 95 % band edges solve ±x ± 1.96·τ·σy(τ) = L on the crossing side; a far edge beyond the horizon is null', () => {
    const noise = { randomWalkFmAdev1d: 2e-14 };
    const limitNs = 300;
    const horizonS = 120 * DAY;
    const leads = [] as number[];
    for (const y of [4e-13, 1e-13]) {
      const clock = quadraticClock({ epochTtJ2000S: T0, offsetNs: 0, hardwareFractionalOffset: y, agingPerDay: 0, noise }, horizonS);
      const plan = planResets({ satellite: 'q', clock, limitNs, noise, policy: { marginNs: 0, leadTimeS: 0, prefer: 'phase' }, fromTtJ2000S: T0, toTtJ2000S: T0 + horizonS, periodS: 43082, contacts: [], compare: false });
      const c = plan.firstCrossing!;
      expect(c.side).toBe('upper');
      // Independent bisection on the rule as physics.md states it.
      const sigmaNs = (tau: number) => tau * noise.randomWalkFmAdev1d * Math.sqrt(tau / DAY) * 1e9;
      const reaches = (sign: number, tau: number) => y * tau * 1e9 + sign * 1.96 * sigmaNs(tau) >= limitNs;
      const solve = (sign: number): number | null => {
        // First rise by a 100-s scan (the far edge can rise and fall again), then bisection.
        let hi = 100;
        while (hi <= horizonS && !reaches(sign, hi)) hi += 100;
        if (hi > horizonS) return null;
        let lo = hi - 100;
        for (let k = 0; k < 100; k++) {
          const mid = (lo + hi) / 2;
          if (reaches(sign, mid)) hi = mid;
          else lo = mid;
        }
        return hi;
      };
      const early = solve(+1)!;
      const late = solve(-1);
      expect(Math.abs(c.earliestTtJ2000S - T0 - early), `earliest: wanted ${early} s, got ${c.earliestTtJ2000S - T0} s`).toBeLessThan(1);
      if (late === null) expect(c.latestTtJ2000S, 'the far edge never reaches the limit within the horizon').toBeNull();
      else expect(Math.abs(c.latestTtJ2000S! - T0 - late), `latest: wanted ${late} s, got ${c.latestTtJ2000S! - T0} s`).toBeLessThan(1);
      expect(predictionSigmaNs(noise, 10 * DAY)).toBeCloseTo(sigmaNs(10 * DAY), 9);
      leads.push(c.atTtJ2000S - c.earliestTtJ2000S);
    }
    // The slower clock crosses later, so its band is wider when it does (σx grows as τ^1.5 here).
    expect(leads[1]).toBeGreaterThan(leads[0]);
  });
});

describe('phase adjustment that maximises the time to the next crossing', () => {
  /** Brute force: simulate x0 + r τ + d τ²/2 forward in small steps until it leaves [−B, B]. */
  function exitTime(x0: number, r: number, d: number, b: number): number {
    const dt = 60;
    for (let tau = dt; tau < 400 * DAY; tau += dt) {
      const x = x0 + r * tau + 0.5 * d * tau * tau;
      if (Math.abs(x) >= b) return tau;
    }
    return Infinity;
  }
  const cases: [string, number, number][] = [
    ['drift only, moving up', 2e-4, 0],
    ['drift only, moving down', -3e-4, 0],
    ['aging pushes the same way', 1e-4, 2e-10],
    ['aging turns it around, excursion fits', 1e-4, -5e-10],
    ['aging turns it around, excursion too big', 8e-4, -1e-10],
  ];
  for (const [label, r, d] of cases) {
    it(`${label}: closed form matches a brute-force search over the band`, () => {
      const b = 100;
      const chosen = bestPhaseNs(r, d, b);
      const best = exitTime(chosen, r, d, b);
      let bruteBest = 0;
      for (let k = 0; k <= 200; k++) bruteBest = Math.max(bruteBest, exitTime(-b + (2 * b * k) / 200, r, d, b));
      // The brute force scans x0 in 1 ns steps: its best can beat the exact optimum only by
      // discretisation, and the closed form must be at least as good (to one 60-s step).
      expect(best, `closed form x0 = ${chosen.toFixed(2)} ns`).toBeGreaterThanOrEqual(bruteBest - 120);
    });
  }
});

describe('the plan', () => {
  it('places every adjustment inside a contact, before the crossing, and keeps the clock inside', () => {
    const params = { epochTtJ2000S: T0, offsetNs: 0, hardwareFractionalOffset: 2e-13, agingPerDay: 1e-15 };
    const clock = quadraticClock(params, 90 * DAY);
    const contacts = dailyContacts(90);
    const plan = planResets({ satellite: 'q', clock, limitNs: 200, noise: null, policy: { marginNs: 20, leadTimeS: 3600, prefer: 'phase' }, fromTtJ2000S: T0, toTtJ2000S: T0 + 90 * DAY, periodS: 43082, contacts });
    expect(plan.adjustments.length).toBeGreaterThan(2);
    expect(plan.unplannable).toBeNull();
    for (const a of plan.adjustments) {
      expect(a.atTtJ2000S).toBeGreaterThanOrEqual(a.passAosTtJ2000S);
      expect(a.atTtJ2000S).toBeLessThanOrEqual(a.passLosTtJ2000S);
      expect(a.passLosTtJ2000S).toBeLessThanOrEqual(a.crossing.atTtJ2000S - 3600);
      expect(Math.abs(a.offsetAfterNs)).toBeLessThanOrEqual(180 + 1e-6);
    }
  });

  it('a clock that starts outside its limit gets an immediate adjustment in the first contact', () => {
    const clock = quadraticClock({ epochTtJ2000S: T0, offsetNs: 250, hardwareFractionalOffset: 0, agingPerDay: 0 }, 10 * DAY);
    const plan = planResets({ satellite: 'q', clock, limitNs: 200, noise: null, policy: { marginNs: 0, leadTimeS: 0, prefer: 'phase' }, fromTtJ2000S: T0, toTtJ2000S: T0 + 10 * DAY, periodS: 43082, contacts: dailyContacts(10) });
    expect(plan.startsOutside).toBe(true);
    expect(plan.adjustments[0].immediate).toBe(true);
    expect(plan.adjustments[0].atTtJ2000S).toBe(T0 + 21900);
    expect(Math.abs(plan.adjustments[0].offsetAfterNs)).toBeLessThan(200);
  });

  it('with no contact before the crossing, the crossing is reported as a finding', () => {
    const clock = quadraticClock({ epochTtJ2000S: T0, offsetNs: 0, hardwareFractionalOffset: 1e-12, agingPerDay: 0 }, 10 * DAY);
    const plan = planResets({ satellite: 'q', clock, limitNs: 100, noise: null, policy: { marginNs: 0, leadTimeS: 0, prefer: 'phase' }, fromTtJ2000S: T0, toTtJ2000S: T0 + 10 * DAY, periodS: 43082, contacts: [] });
    expect(plan.adjustments).toHaveLength(0);
    expect(plan.unplannable?.reason).toMatch(/no uplink pass/);
  });
});

/** A clock on a circular point-mass orbit (constant relativistic rate), tuned to cancel it, with aging [ns/day²]. */
function circularAgingClock(agingNsPerDay2: number, spanS: number): OnboardClock {
  const el = elementsFromDegKm({ epochTtJ2000S: T0, aKm: 26561.75, e: 0, iDeg: 55, raanDeg: 0, argpDeg: 0, meanAnomalyDeg: 0 }, { a: 'a', e: 'e' });
  const traj = new KeplerianTrajectory('c', el, G.gmM3PerS2);
  const [track] = integrateAlong(traj, T0, T0 + spanS, 3600, [(x, y, z, vx, vy, vz, t) => fractionalOffset(G, x, y, z, vx, vy, vz, t)]);
  // Setup only: the relativistic rate over one day, cancelled by the factory detuning.
  const rel = new OnboardClock(track, null);
  const yRel = (rel.offsetNs(T0 + DAY) - rel.offsetNs(T0)) / (DAY * 1e9);
  return new OnboardClock(track, { epochTtJ2000S: T0, offsetNs: 0, hardwareFractionalOffset: -yRel, agingPerDay: agingNsPerDay2 / (DAY * 1e9) });
}

/** Contacts every `everyS` seconds, 10 minutes long. */
function frequentContacts(spanS: number, everyS: number, station = 'ST'): Contact[] {
  return Array.from({ length: Math.floor(spanS / everyS) }, (_, k) => ({ station, aosTtJ2000S: T0 + k * everyS + 60, tcaTtJ2000S: T0 + k * everyS + 360, losTtJ2000S: T0 + k * everyS + 660 }));
}

describe('combined strategy against the closed form T = 4·√(L/|A|) (derived: the parabola x = L − (A/2)·τ·(T − τ)·… touching both limits)', () => {
  // Derived: with x'' = A constant, start on +L with rate −A·T/2; the vertex at T/2 is at
  // L − A·(T/2)²/2 = −L, so T = 4·√(L/A), and no start (offset, rate) keeps |x| ≤ L longer.
  // L = limit − margin − periodic allowance (0.5 ns; the circular point-mass orbit has no periodic
  // term). Pass availability: a contact every 3 h with lead time 0, so each interval may lose up
  // to 3 h + 10 min against T, about 0.6 % of the 20-day T below: well inside the 5 % the issue allows.
  for (const agingNsPerDay2 of [4, -4, 1]) {
    it(`aging ${agingNsPerDay2} ns/day²: intervals within 5 % of 4·√(L/|A|) and never longer`, () => {
      const spanS = 120 * DAY;
      const clock = circularAgingClock(agingNsPerDay2, spanS);
      const limitNs = 120;
      const marginNs = 20;
      const plan = planResets({ satellite: 'c', clock, limitNs, noise: null, policy: { marginNs, leadTimeS: 0, prefer: 'combined' }, fromTtJ2000S: T0, toTtJ2000S: T0 + spanS, periodS: 43082, contacts: frequentContacts(spanS, 3 * 3600), compare: false });
      const lNs = limitNs - marginNs - 0.5;
      const wantS = 4 * Math.sqrt(lNs / Math.abs(agingNsPerDay2)) * DAY;
      const ats = plan.adjustments.map((a) => a.atTtJ2000S);
      expect(plan.unplannable).toBeNull();
      // Intervals between adjustments (the first adjustment's time depends on the start state).
      const intervals = ats.slice(1).map((t, i) => t - ats[i]);
      expect(intervals.length).toBeGreaterThanOrEqual(agingNsPerDay2 === 1 ? 1 : 3);
      for (const got of intervals) {
        expect(Math.abs(got - wantS) / wantS, `wanted ${(wantS / DAY).toFixed(3)} d, got ${(got / DAY).toFixed(3)} d, difference ${((got - wantS) / 3600).toFixed(2)} h`).toBeLessThan(0.05);
        expect(got, 'no plan beats the closed form (10 min of crossing-search slack)').toBeLessThanOrEqual(wantS + 600);
      }
      for (let k = 0; k <= 2000; k++) {
        const t = T0 + (spanS * k) / 2000;
        expect(Math.abs(offsetWithAdjustmentsNs(clock, plan.adjustments, t))).toBeLessThan(limitNs - marginNs + 1);
      }
    });
  }

  it('the frequency strategy on the same clock steers back and reaches at least 90 % of T (no parking at the limit)', () => {
    const spanS = 120 * DAY;
    const clock = circularAgingClock(4, spanS);
    const plan = planResets({ satellite: 'c', clock, limitNs: 120, noise: null, policy: { marginNs: 20, leadTimeS: 0, prefer: 'frequency' }, fromTtJ2000S: T0, toTtJ2000S: T0 + spanS, periodS: 43082, contacts: frequentContacts(spanS, 3 * 3600), compare: false });
    const wantS = 4 * Math.sqrt(99.5 / 4) * DAY;
    const ats = plan.adjustments.map((a) => a.atTtJ2000S);
    expect(plan.adjustments.every((a) => a.kind === 'frequency' && a.phaseStepNs === 0)).toBe(true);
    for (let i = 1; i < ats.length - 1; i++) expect(ats[i + 1] - ats[i], `interval ${i}: wanted ≥ ${(0.9 * wantS / DAY).toFixed(2)} d`).toBeGreaterThan(0.9 * wantS);
  });

  it('the frequency strategy on a clock without aging returns to the target by the horizon end instead of parking', () => {
    const spanS = 60 * DAY;
    const clock = quadraticClock({ epochTtJ2000S: T0, offsetNs: 0, hardwareFractionalOffset: 3e-13, agingPerDay: 0 }, spanS);
    const targetNs = 10;
    const plan = planResets({ satellite: 'q', clock, limitNs: 150, noise: null, policy: { marginNs: 10, leadTimeS: 0, prefer: 'frequency', targetNs }, fromTtJ2000S: T0, toTtJ2000S: T0 + spanS, periodS: 43082, contacts: dailyContacts(60), compare: false });
    expect(plan.adjustments).toHaveLength(1);
    const a = plan.adjustments[0];
    expect(a.offsetAfterNs).toBe(a.offsetBeforeNs);
    // The trend heads for the target: after the step the clock moves away from the limit.
    const end = offsetWithAdjustmentsNs(clock, plan.adjustments, T0 + spanS);
    expect(Math.abs(end - targetNs), `offset at the horizon end: wanted ${targetNs} ns, got ${end.toFixed(2)} ns`).toBeLessThan(3);
    const dayAfter = offsetWithAdjustmentsNs(clock, plan.adjustments, a.atTtJ2000S + DAY);
    expect(dayAfter).toBeLessThan(a.offsetBeforeNs);
  });
});

describe('phase-only intervals shrink as the rate grows (closed form of a quadratic, derived)', () => {
  it('each interval matches τ = (−r + √(r² + 4·A·B))/A from the far edge, r the rate at that adjustment', () => {
    // Derived: with rate r and aging A pushing the same way, the best phase is −B and the clock
    // reaches +B when −B + r·τ + A·τ²/2 = B. Phase steps never change r, which grows by A·τ.
    const agingNsPerDay2 = 2;
    const y0 = 1e-13;
    const spanS = 90 * DAY;
    const clock = quadraticClock({ epochTtJ2000S: T0, offsetNs: 0, hardwareFractionalOffset: y0, agingPerDay: agingNsPerDay2 / (DAY * 1e9) }, spanS);
    const everyS = 3 * 3600;
    const plan = planResets({ satellite: 'q', clock, limitNs: 150, noise: null, policy: { marginNs: 20, leadTimeS: 0, prefer: 'phase' }, fromTtJ2000S: T0, toTtJ2000S: T0 + spanS, periodS: 43082, contacts: frequentContacts(spanS, everyS), compare: false });
    const b = 150 - 20 - 0.5;
    const a = agingNsPerDay2 / (DAY * DAY);
    const ats = plan.adjustments.map((x) => x.atTtJ2000S);
    expect(ats.length).toBeGreaterThan(5);
    let prev = Infinity;
    for (let i = 0; i + 1 < ats.length; i++) {
      const r = y0 * 1e9 + a * (ats[i] - T0);
      const want = (-r + Math.sqrt(r * r + 4 * a * b)) / a;
      const got = ats[i + 1] - ats[i];
      // The planner acts in the last 3-hourly pass before the deadline: up to 3 h 10 min early.
      expect(want - got, `interval ${i}: wanted ${(want / DAY).toFixed(3)} d, got ${(got / DAY).toFixed(3)} d`).toBeGreaterThanOrEqual(-600);
      expect(want - got, `interval ${i}: wanted ${(want / DAY).toFixed(3)} d, got ${(got / DAY).toFixed(3)} d`).toBeLessThan(everyS + 1200);
      expect(got).toBeLessThan(prev + everyS);
      prev = got;
    }
    expect(ats[ats.length - 1] - ats[ats.length - 2]).toBeLessThan(0.6 * (ats[1] - ats[0]));
  });
});

describe('a clock that dips toward the lower limit and then crosses the upper one', () => {
  // x(t) = −240 + (A/2)·(t − 15 d)², A = 2.7 ns/day²: the central prediction turns at −240 ns on day 15
  // and crosses +300 ns on day 35. Random-walk FM of 8e-15 at 1 d gives a band of about ±80 ns at
  // 15 d, so the band touches −300 ns first, around day 13 (values derived from the band rule).
  const agingNsPerDay2 = 2.7;
  const tVertexS = 15 * DAY;
  const noise = { randomWalkFmAdev1d: 8e-15 };
  const y0 = (-agingNsPerDay2 / (DAY * DAY)) * tVertexS * 1e-9;
  const x0 = -240 + (agingNsPerDay2 / 2) * 15 * 15;
  const spanS = 60 * DAY;
  const clock = quadraticClock({ epochTtJ2000S: T0, offsetNs: x0, hardwareFractionalOffset: y0, agingPerDay: agingNsPerDay2 / (DAY * 1e9), noise }, spanS);
  const x = (tau: number) => x0 + y0 * 1e9 * tau + 0.5 * (agingNsPerDay2 / (DAY * DAY)) * tau * tau;
  const band = (tau: number) => 1.96 * tau * noise.randomWalkFmAdev1d * Math.sqrt(tau / DAY) * 1e9;
  const firstTime = (cond: (tau: number) => boolean): number => {
    let hi = 100;
    while (!cond(hi)) hi += 100;
    let lo = hi - 100;
    for (let k = 0; k < 60; k++) {
      const mid = (lo + hi) / 2;
      if (cond(mid)) hi = mid;
      else lo = mid;
    }
    return hi;
  };

  it('reports side upper with the upper band edge, and the lower touch as otherSide', () => {
    const plan = planResets({ satellite: 'q', clock, limitNs: 300, noise, policy: { marginNs: 0, leadTimeS: 0, prefer: 'combined' }, fromTtJ2000S: T0, toTtJ2000S: T0 + spanS, periodS: 43082, contacts: [], compare: false });
    const c = plan.firstCrossing!;
    const wantAt = firstTime((tau) => x(tau) >= 300);
    const wantEarliest = firstTime((tau) => x(tau) + band(tau) >= 300);
    const wantLower = firstTime((tau) => -x(tau) + band(tau) >= 300);
    expect(c.side).toBe('upper');
    expect(Math.abs(c.atTtJ2000S - T0 - wantAt), `at: wanted ${(wantAt / DAY).toFixed(4)} d`).toBeLessThan(1);
    expect(Math.abs(c.earliestTtJ2000S - T0 - wantEarliest), `earliest (upper edge): wanted ${(wantEarliest / DAY).toFixed(4)} d, got ${((c.earliestTtJ2000S - T0) / DAY).toFixed(4)} d`).toBeLessThan(1);
    expect(wantLower).toBeLessThan(wantEarliest);
    expect(c.otherSide?.side).toBe('lower');
    expect(Math.abs(c.otherSide!.earliestTtJ2000S - T0 - wantLower), `otherSide: wanted ${(wantLower / DAY).toFixed(4)} d`).toBeLessThan(1);
  });

  it('the plan acts for the upper crossing, not 20 days early for the lower touch', () => {
    const plan = planResets({ satellite: 'q', clock, limitNs: 300, noise, policy: { marginNs: 10, leadTimeS: 0, prefer: 'combined' }, fromTtJ2000S: T0, toTtJ2000S: T0 + spanS, periodS: 43082, contacts: dailyContacts(60), compare: false });
    const a = plan.adjustments[0];
    expect(a.crossing.side).toBe('upper');
    const lowerTouch = firstTime((tau) => -x(tau) + band(tau) >= 300);
    const upperMarginEdge = firstTime((tau) => x(tau) + band(tau) >= 290);
    expect(a.atTtJ2000S - T0).toBeGreaterThan(lowerTouch);
    // Daily contacts: the last one before the upper edge reaches limit − margin.
    expect(upperMarginEdge - (a.atTtJ2000S - T0)).toBeLessThan(DAY + 600);
    expect(upperMarginEdge - (a.atTtJ2000S - T0)).toBeGreaterThan(0);
  });
});

describe('hardware steps (contract: nominal 10.23 MHz; fractional ↔ Hz ↔ ns/day by definition)', () => {
  // The ideal combined step on the 4 ns/day² clock below is |A|·T ≈ 9.3e-13, inside the largest step.
  const steps = { phaseResolutionNs: 0.25, frequencyResolution: 1e-15, maxFrequencyStep: 2e-12 };
  const spanS = 120 * DAY;

  it('phase steps are whole multiples of the resolution and the rounding is reported', () => {
    const clock = quadraticClock({ epochTtJ2000S: T0, offsetNs: 0, hardwareFractionalOffset: 1.3e-13, agingPerDay: 0 }, spanS);
    const plan = planResets({ satellite: 'q', clock, limitNs: 100, noise: null, policy: { marginNs: 10, leadTimeS: 0, prefer: 'phase' }, fromTtJ2000S: T0, toTtJ2000S: T0 + spanS, periodS: 43082, contacts: dailyContacts(120), steps, compare: false });
    expect(plan.adjustments.length).toBeGreaterThan(2);
    for (const a of plan.adjustments) {
      const n = a.phaseStepNs / steps.phaseResolutionNs;
      expect(Math.abs(n - Math.round(n)), `${a.phaseStepNs} ns is not a multiple of 0.25 ns`).toBeLessThan(1e-9);
      const err = a.phaseStepNs - a.unquantised.phaseStepNs;
      expect(Math.abs(err)).toBeLessThanOrEqual(steps.phaseResolutionNs / 2 + 1e-12);
      expect(a.quantisationErrorNs).toBeCloseTo(err, 12);
      expect(Math.abs(a.offsetAfterNs - a.offsetBeforeNs - a.phaseStepNs)).toBeLessThan(1e-9);
    }
    expect(plan.adjustments.some((a) => Math.abs(a.quantisationErrorNs) > 1e-6)).toBe(true);
  });

  it('frequency steps are multiples of the resolution, within the largest step, in Hz and ns/day too', () => {
    const clock = circularAgingClock(4, spanS);
    const plan = planResets({ satellite: 'c', clock, limitNs: 120, noise: null, policy: { marginNs: 20, leadTimeS: 0, prefer: 'combined' }, fromTtJ2000S: T0, toTtJ2000S: T0 + spanS, periodS: 43082, contacts: frequentContacts(spanS, 3 * 3600), steps, compare: false });
    expect(plan.adjustments.length).toBeGreaterThan(3);
    plan.adjustments.forEach((a, i) => {
      const n = a.frequencyStep / steps.frequencyResolution;
      expect(Math.abs(n - Math.round(n)), `${a.frequencyStep} is not a multiple of 1e-15`).toBeLessThan(1e-6);
      expect(Math.abs(a.frequencyStep)).toBeLessThanOrEqual(steps.maxFrequencyStep * (1 + 1e-12));
      expect(Math.abs(a.frequencyStep - a.unquantised.frequencyStep)).toBeLessThanOrEqual(steps.frequencyResolution);
      expect(a.frequencyStepHz).toBeCloseTo(a.frequencyStep * 10.23e6, 15);
      expect(a.frequencyStepNsPerDay).toBeCloseTo(a.frequencyStep * 86400e9, 9);
      // The offset error the rounding makes by the next adjustment, evaluated on the clock itself.
      const next = plan.adjustments[i + 1]?.atTtJ2000S ?? T0 + spanS;
      const exactEffect = a.unquantised.phaseStepNs + a.unquantised.frequencyStep * 1e9 * (next - a.atTtJ2000S);
      const appliedEffect = a.phaseStepNs + a.frequencyStep * 1e9 * (next - a.atTtJ2000S);
      expect(a.quantisationErrorNs).toBeCloseTo(appliedEffect - exactEffect, 6);
    });
    // Rounding costs little: every interval still within 5 % of the closed form (4 ns/day², L = 99.5 ns).
    const wantS = 4 * Math.sqrt(99.5 / 4) * DAY;
    const ats = plan.adjustments.map((a) => a.atTtJ2000S);
    for (let i = 1; i < ats.length; i++) expect(Math.abs(ats[i] - ats[i - 1] - wantS) / wantS).toBeLessThan(0.05);
  });

  it('a largest step smaller than the ideal one is respected (the plan needs more adjustments)', () => {
    const clock = circularAgingClock(4, spanS);
    const small = { ...steps, maxFrequencyStep: 5e-14 };
    const plan = planResets({ satellite: 'c', clock, limitNs: 120, noise: null, policy: { marginNs: 20, leadTimeS: 0, prefer: 'combined' }, fromTtJ2000S: T0, toTtJ2000S: T0 + spanS, periodS: 43082, contacts: frequentContacts(spanS, 3 * 3600), steps: small, compare: false });
    for (const a of plan.adjustments) expect(Math.abs(a.frequencyStep)).toBeLessThanOrEqual(5e-14 * (1 + 1e-12));
    expect(plan.unplannable).toBeNull();
    const ideal = planResets({ satellite: 'c', clock, limitNs: 120, noise: null, policy: { marginNs: 20, leadTimeS: 0, prefer: 'combined' }, fromTtJ2000S: T0, toTtJ2000S: T0 + spanS, periodS: 43082, contacts: frequentContacts(spanS, 3 * 3600), steps, compare: false });
    expect(plan.adjustments.length).toBeGreaterThan(ideal.adjustments.length);
    // Inside the limit throughout (the margin is a deadline buffer: after the last adjustment the clock
    // may enter it when the crossing itself lies beyond the horizon).
    for (let k = 0; k <= 1000; k++) expect(Math.abs(offsetWithAdjustmentsNs(clock, plan.adjustments, T0 + (spanS * k) / 1000))).toBeLessThan(120);
  });
});

describe('operations constraints: uplink stations, blackouts, minimum spacing', () => {
  const spanS = 40 * DAY;
  const clock = quadraticClock({ epochTtJ2000S: T0, offsetNs: 0, hardwareFractionalOffset: 2e-13, agingPerDay: 0 }, spanS);
  const base = { satellite: 'q', clock, limitNs: 100, noise: null, fromTtJ2000S: T0, toTtJ2000S: T0 + spanS, periodS: 43082, compare: false } as const;

  it('adjustments go only to uplink stations', () => {
    const contacts = [...dailyContacts(40), ...dailyContacts(40).map((c) => ({ ...c, station: 'RX', aosTtJ2000S: c.aosTtJ2000S + 7200, tcaTtJ2000S: c.tcaTtJ2000S + 7200, losTtJ2000S: c.losTtJ2000S + 7200, uplink: false }))];
    const plan = planResets({ ...base, policy: { marginNs: 10, leadTimeS: 0, prefer: 'phase' }, contacts });
    expect(plan.adjustments.length).toBeGreaterThan(0);
    for (const a of plan.adjustments) expect(a.station).toBe('ST');
  });

  it('a pass in a blackout is skipped for an earlier one, and the plan says which and why', () => {
    const free = planResets({ ...base, policy: { marginNs: 10, leadTimeS: 0, prefer: 'phase' }, contacts: dailyContacts(40) });
    const best = free.adjustments[0];
    const blackout = { startTtJ2000S: best.passAosTtJ2000S - 600, endTtJ2000S: best.passLosTtJ2000S + 600, satellites: null };
    const plan = planResets({ ...base, policy: { marginNs: 10, leadTimeS: 0, prefer: 'phase', blackouts: [blackout] }, contacts: dailyContacts(40) });
    const a = plan.adjustments[0];
    expect(a.atTtJ2000S).toBeLessThan(best.atTtJ2000S);
    expect(a.moved?.because).toBe('blackout');
    expect(a.moved?.tcaTtJ2000S).toBe(best.atTtJ2000S);
    for (const x of plan.adjustments) expect(x.passLosTtJ2000S <= blackout.startTtJ2000S || x.passAosTtJ2000S >= blackout.endTtJ2000S).toBe(true);
  });

  it('a blackout for another satellite changes nothing', () => {
    const free = planResets({ ...base, policy: { marginNs: 10, leadTimeS: 0, prefer: 'phase' }, contacts: dailyContacts(40) });
    const plan = planResets({ ...base, policy: { marginNs: 10, leadTimeS: 0, prefer: 'phase', blackouts: [{ startTtJ2000S: T0, endTtJ2000S: T0 + spanS, satellites: ['other'] }] }, contacts: dailyContacts(40) });
    expect(plan.adjustments.map((a) => a.atTtJ2000S)).toEqual(free.adjustments.map((a) => a.atTtJ2000S));
  });

  it('blackouts over the whole horizon are a finding, not a crash', () => {
    const plan = planResets({ ...base, policy: { marginNs: 10, leadTimeS: 0, prefer: 'phase', blackouts: [{ startTtJ2000S: T0 - DAY, endTtJ2000S: T0 + spanS + DAY, satellites: null }] }, contacts: dailyContacts(40) });
    expect(plan.adjustments).toHaveLength(0);
    expect(plan.unplannable?.reason).toMatch(/blackout/);
    expect(plan.notes.join(' ')).toMatch(/blackouts cover the whole horizon/);
  });

  it('adjustments keep the minimum spacing', () => {
    const fast = quadraticClock({ epochTtJ2000S: T0, offsetNs: 0, hardwareFractionalOffset: 0, agingPerDay: 4 / (DAY * 1e9) }, spanS);
    const minSpacingS = 3 * DAY;
    const plan = planResets({ ...base, clock: fast, policy: { marginNs: 10, leadTimeS: 0, prefer: 'phase', minSpacingS }, contacts: frequentContacts(spanS, 6 * 3600) });
    const ats = plan.adjustments.map((a) => a.atTtJ2000S);
    for (let i = 1; i < ats.length; i++) expect(ats[i] - ats[i - 1]).toBeGreaterThanOrEqual(minSpacingS);
  });
});
