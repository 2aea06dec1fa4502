/**
 * Use case `resets`: when does each onboard clock leave its keep-in limit, and in which real pass
 * should the adjustment go (physics.md §6–7; contract `tauplan resets`).
 *
 * Method:
 * 1. Predict the offset x(t) with every adjustment planned so far (piecewise: phase steps and
 *    frequency steps applied at their instants) on top of the free-running model.
 * 2. Find the first crossing of |x| = L by a coarse scan (step ≤ 10 min and ≤ P/8, so the orbit's
 *    periodic term cannot hide a crossing) and a capped bisection to 0.1 s. The 95 % band shifts
 *    |x| by ±1.96 σx(τ), τ counted from the last adjustment (a fresh measurement is assumed there)
 *    or from the plan start.
 * 3. The adjustment goes in the last qualifying pass (any station, ending before the earliest edge
 *    of the crossing of |x| = L − margin, minus the lead time), at that pass's TCA.
 * 4. Phase: step to the value that maximises the time to the next crossing (adjust.ts), inside the
 *    band narrowed by the margin and the orbit's periodic swing. Frequency:
 *    cancel the mean rate over one orbit. `prefer` chooses which is applied; both sizes are reported.
 * 5. Repeat to the horizon. Every loop is capped.
 */
import { predictionSigmaNs, Z95 } from '../clock/noise.ts';
import type { OnboardClock, NoiseLevels } from '../clock/oscillator.ts';
import { InternalError } from '../errors.ts';
import { bestPhaseNs } from './adjust.ts';

/** A contact usable for an adjustment (already filtered by mask and minimum length). */
export interface Contact {
  station: string;
  aosTtJ2000S: number;
  tcaTtJ2000S: number;
  losTtJ2000S: number;
}

export interface ResetPolicy {
  marginNs: number;
  leadTimeS: number;
  prefer: 'phase' | 'frequency';
}

export interface Crossing {
  atTtJ2000S: number;
  earliestTtJ2000S: number;
  latestTtJ2000S: number;
  /** Sign of the offset at the crossing: +1 upper limit, −1 lower. */
  side: 1 | -1;
}

export interface Adjustment {
  atTtJ2000S: number;
  station: string;
  passAosTtJ2000S: number;
  passLosTtJ2000S: number;
  kind: 'phase' | 'frequency';
  phaseStepNs: number;
  frequencyStep: number;
  offsetBeforeNs: number;
  offsetAfterNs: number;
  /** The crossing this adjustment pre-empts (predicted with the plan so far). */
  crossing: Crossing;
  /** True when the offset was already outside the limit at the start. */
  immediate: boolean;
}

export interface SatelliteResetPlan {
  satellite: string;
  limitNs: number;
  firstCrossing: Crossing | null;
  adjustments: Adjustment[];
  /** A crossing with no qualifying pass before it: a finding, not an error. Planning stops there. */
  unplannable: { crossing: Crossing; reason: string } | null;
  /** True when the clock starts outside its limit. */
  startsOutside: boolean;
}

export interface ResetRequest {
  satellite: string;
  clock: OnboardClock;
  limitNs: number;
  noise: NoiseLevels | null;
  policy: ResetPolicy;
  fromTtJ2000S: number;
  toTtJ2000S: number;
  /** Orbital period [s], to size the scan step and the rate average. */
  periodS: number;
  /** Qualifying contacts over all stations, any order. */
  contacts: Contact[];
}

/** Cap on adjustments per satellite over a horizon (a clock needing more is a design problem). */
export const MAX_ADJUSTMENTS = 500;
const MAX_BISECTIONS = 80;
/** Headroom on the periodic swing when placing a phase step (its amplitude varies a little from orbit to orbit). */
const PERIODIC_ALLOWANCE = 1.1;
const PERIODIC_ALLOWANCE_NS = 0.5;
const CROSSING_RESOLUTION_S = 0.1;

interface Step {
  atTtJ2000S: number;
  phaseNs: number;
  fractional: number;
}

/** Effect [ns] at t of phase and frequency steps applied at their instants. */
function stepsEffectNs(steps: readonly Step[], t: number): number {
  let x = 0;
  for (const s of steps) if (t >= s.atTtJ2000S) x += s.phaseNs + 1e9 * s.fractional * (t - s.atTtJ2000S);
  return x;
}

/** The offset [ns] of `clock` at t with a plan's adjustments applied (for plots and checks). */
export function offsetWithAdjustmentsNs(clock: OnboardClock, adjustments: readonly Adjustment[], t: number): number {
  const steps = adjustments.map((a) => ({ atTtJ2000S: a.atTtJ2000S, phaseNs: a.kind === 'phase' ? a.phaseStepNs : 0, fractional: a.kind === 'frequency' ? a.frequencyStep : 0 }));
  return clock.offsetNs(t) + stepsEffectNs(steps, t);
}

/** The clock with the plan's steps applied. */
class PlannedClock {
  readonly steps: Step[] = [];
  constructor(private readonly clock: OnboardClock) {}
  offsetNs(t: number): number {
    return this.clock.offsetNs(t) + stepsEffectNs(this.steps, t);
  }
  /** Offset averaged over one orbit centred on t (Simpson, 64 intervals): the trend without the periodic swing. */
  meanOffsetNs(t: number, periodS: number, from: number, to: number): number {
    let a = Math.max(from, t - periodS / 2);
    const b = Math.min(to, a + periodS);
    a = Math.max(from, b - periodS);
    const n = 64;
    let sum = 0;
    for (let k = 0; k <= n; k++) sum += (k === 0 || k === n ? 1 : k % 2 === 1 ? 4 : 2) * this.offsetNs(a + ((b - a) * k) / n);
    return sum / (3 * n);
  }
  /** Mean fractional rate over [t − P/2, t + P/2] (removes the orbit's periodic term). */
  meanRate(t: number, periodS: number, from: number, to: number): number {
    let a = Math.max(from, t - periodS / 2);
    let b = Math.min(to, a + periodS);
    a = Math.max(from, b - periodS);
    if (b - a < 1) {
      a = Math.max(from, t - 60);
      b = Math.min(to, t + 60);
    }
    // Evaluate the steps' effect consistently: rate = Δx / Δt over the window.
    return ((this.offsetNs(b) - this.offsetNs(a)) * 1e-9) / (b - a);
  }
}

/**
 * First time in [from, to] at which g(t) ≥ 0, with g continuous. Coarse scan of `stepS`, then
 * bisection to 0.1 s. Returns null if g stays negative.
 */
export function firstRoot(g: (t: number) => number, from: number, to: number, stepS: number, enteringOnly = false): number | null {
  // enteringOnly: a start at or beyond the level does not count; wait until g < 0, then find the next rise.
  let inside = g(from) < 0;
  if (!inside && !enteringOnly) return from;
  const n = Math.ceil((to - from) / stepS);
  let prev = from;
  for (let k = 1; k <= n; k++) {
    const t = Math.min(to, from + k * stepS);
    const gt = g(t);
    if (!inside) {
      inside = gt < 0;
      prev = t;
      continue;
    }
    if (gt >= 0) {
      let lo = prev;
      let hi = t;
      for (let it = 0; it < MAX_BISECTIONS && hi - lo > CROSSING_RESOLUTION_S; it++) {
        const mid = 0.5 * (lo + hi);
        if (g(mid) >= 0) hi = mid;
        else lo = mid;
      }
      if (hi - lo > CROSSING_RESOLUTION_S) throw new InternalError('crossing bisection did not converge', 'crossing time');
      return hi;
    }
    prev = t;
  }
  return null;
}

/**
 * Half peak-to-peak [ns] of the offset about its straight trend over one orbit (the periodic
 * relativistic swing, mostly eccentricity), sampled 200 times.
 */
export function periodicAmplitudeNs(clock: OnboardClock, from: number, to: number): number {
  if (!(to > from)) return 0;
  const x0 = clock.offsetNs(from);
  const x1 = clock.offsetNs(to);
  let lo = Infinity;
  let hi = -Infinity;
  for (let k = 0; k <= 200; k++) {
    const t = from + ((to - from) * k) / 200;
    const d = clock.offsetNs(t) - (x0 + ((x1 - x0) * k) / 200);
    lo = Math.min(lo, d);
    hi = Math.max(hi, d);
  }
  return (hi - lo) / 2;
}

/** Plan the adjustments for one satellite. */
export function planResets(req: ResetRequest): SatelliteResetPlan {
  const { limitNs: L, policy, fromTtJ2000S: from, toTtJ2000S: to } = req;
  const planned = new PlannedClock(req.clock);
  const contacts = [...req.contacts].sort((a, b) => a.aosTtJ2000S - b.aosTtJ2000S);
  const scanStepS = Math.max(10, Math.min(600, req.periodS / 8));
  const bandNs = (t: number, since: number): number => (req.noise === null ? 0 : Z95 * predictionSigmaNs(req.noise, t - since));

  // The limit itself counts from the start (a clock may begin outside it); the margin level only
  // when the offset comes back to it from inside, since a phase step lands exactly on it.
  const crossingAfter = (since: number, level: number, enteringOnly = false): Crossing | null => {
    const at = firstRoot((t) => Math.abs(planned.offsetNs(t)) - level, since, to, scanStepS, enteringOnly);
    if (at === null) return null;
    const earliest = firstRoot((t) => Math.abs(planned.offsetNs(t)) + bandNs(t, since) - level, since, to, scanStepS, enteringOnly) ?? at;
    const latest = firstRoot((t) => Math.abs(planned.offsetNs(t)) - bandNs(t, since) - level, since, to, scanStepS, enteringOnly) ?? to;
    return { atTtJ2000S: at, earliestTtJ2000S: Math.min(earliest, at), latestTtJ2000S: Math.max(latest, at), side: planned.offsetNs(at) >= 0 ? 1 : -1 };
  };

  const periodicNs = periodicAmplitudeNs(req.clock, from, Math.min(to, from + req.periodS));
  const startsOutside = Math.abs(planned.offsetNs(from)) >= L;
  const firstCrossing = crossingAfter(from, L);
  const adjustments: Adjustment[] = [];
  let unplannable: SatelliteResetPlan['unplannable'] = null;
  let since = from;
  let contactIndexFloor = 0;

  for (let guard = 0; guard < MAX_ADJUSTMENTS; guard++) {
    const crossing = crossingAfter(since, L);
    if (crossing === null) break;
    const outsideNow = Math.abs(planned.offsetNs(since)) >= L;
    // Deadline: the band's earliest edge at the margin level, minus the lead time.
    const marginCrossing = policy.marginNs > 0 ? crossingAfter(since, L - policy.marginNs, true) : null;
    const deadline = Math.min(marginCrossing?.earliestTtJ2000S ?? Infinity, crossing.earliestTtJ2000S) - policy.leadTimeS;
    let chosen: Contact | undefined;
    let chosenIndex = -1;
    if (outsideNow) {
      // Already outside: the first usable pass from now on.
      for (let i = contactIndexFloor; i < contacts.length; i++) {
        if (contacts[i].tcaTtJ2000S > since) {
          chosen = contacts[i];
          chosenIndex = i;
          break;
        }
      }
    } else {
      for (let i = contactIndexFloor; i < contacts.length; i++) {
        const c = contacts[i];
        if (c.aosTtJ2000S <= since) continue;
        if (c.losTtJ2000S > deadline) break;
        chosen = c;
        chosenIndex = i;
      }
    }
    if (chosen === undefined) {
      unplannable = {
        crossing,
        reason: outsideNow
          ? 'the clock is outside its limit and no pass follows within the horizon'
          : 'no qualifying pass ends before the crossing minus the margin and lead time',
      };
      break;
    }
    const t = chosen.tcaTtJ2000S;
    const before = planned.offsetNs(t);
    const rate = planned.meanRate(t, req.periodS, from, to);
    const agingPerS2 = req.clock.params === null ? 0 : req.clock.params.agingPerDay / 86400;
    // Leave room for the orbit's periodic swing, so the step does not land the clock on the limit.
    const band = Math.max(0, L - policy.marginNs - PERIODIC_ALLOWANCE * periodicNs - PERIODIC_ALLOWANCE_NS);
    // The step moves the trend (the offset averaged over one orbit) to the chosen value; the
    // periodic swing then stays inside the band around it.
    const trend = planned.meanOffsetNs(t, req.periodS, from, to);
    const target = bestPhaseNs(rate * 1e9, agingPerS2 * 1e9, band);
    const phaseStepNs = target - trend;
    const frequencyStep = -rate;
    const kind = policy.prefer;
    const step: Step = kind === 'phase' ? { atTtJ2000S: t, phaseNs: phaseStepNs, fractional: 0 } : { atTtJ2000S: t, phaseNs: 0, fractional: frequencyStep };
    planned.steps.push(step);
    adjustments.push({
      atTtJ2000S: t,
      station: chosen.station,
      passAosTtJ2000S: chosen.aosTtJ2000S,
      passLosTtJ2000S: chosen.losTtJ2000S,
      kind,
      phaseStepNs,
      frequencyStep,
      offsetBeforeNs: before,
      offsetAfterNs: kind === 'phase' ? before + phaseStepNs : before,
      crossing,
      immediate: outsideNow,
    });
    since = t;
    contactIndexFloor = chosenIndex + 1;
  }
  if (adjustments.length >= MAX_ADJUSTMENTS) {
    throw new InternalError(`more than ${MAX_ADJUSTMENTS} adjustments planned for ${req.satellite}`, 'adjustments');
  }
  return { satellite: req.satellite, limitNs: L, firstCrossing, adjustments, unplannable, startsOutside };
}
