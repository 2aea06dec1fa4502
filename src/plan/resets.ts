/**
 * Use case `resets`: when does each onboard clock leave its keep-in limit, on which side, and in
 * which real pass should each adjustment go (physics.md §6–7; contract `tauplan resets`).
 *
 * Method:
 * 1. Predict the offset x(t) with every adjustment planned so far (phase and frequency steps at
 *    their instants) on top of the free-running model.
 * 2. Find the next crossing of each limit separately (crossing.ts); the 95 % band (band.ts) counts
 *    from the last adjustment (a fresh measurement is assumed there) or from the plan start.
 * 3. Deadline: the first instant the band's edge on that side reaches limit − margin, minus the lead
 *    time. The adjustment goes at the TCA of the last pass that ends before it at an uplink station,
 *    outside every blackout and at least `minSpacing` after the previous adjustment; when a better
 *    pass had to be skipped, the plan says why.
 * 4. Size it with the chosen strategy (strategy.ts), quantised to the hardware's steps (quantise.ts).
 * 5. Repeat to the horizon (every loop capped). The other two strategies are planned the same way
 *    for the comparison.
 */
import { SECONDS_PER_DAY } from '../constants.ts';
import type { NoiseLevels, OnboardClock } from '../clock/oscillator.ts';
import { InputError, InternalError } from '../errors.ts';
import { band95Ns, band95Of, bandSigmaOf, outsideProbability } from './band.ts';
import { blackoutOf, blackoutsCover, type Blackout, type Contact } from './contacts.ts';
import { crossingAndMargin, signOf, type Crossing } from './crossing.ts';
import { offsetBend, type OffsetBend } from './offsetBend.ts';
import { CONTINUOUS_STEPS, type ClockSteps } from './quantise.ts';
import { sizeAdjustment, type Strategy } from './strategy.ts';

export type { Contact, Blackout } from './contacts.ts';
export type { Crossing, Side } from './crossing.ts';
export { firstRoot } from './crossing.ts';
export type { Strategy } from './strategy.ts';

/** Nominal oscillator frequency [Hz] when the clock block gives none (contract, `size --nominal-hz`). */
export const DEFAULT_NOMINAL_HZ = 10.23e6;

export interface ResetPolicy {
  /** Act before the band reaches limit − margin [ns]. */
  marginNs: number;
  /** Act at least this long before that [s]. */
  leadTimeS: number;
  prefer: Strategy;
  /** Offset to steer toward [ns]; default 0. */
  targetNs?: number;
  /** Shortest time between two adjustments of one satellite [s]; default 0. */
  minSpacingS?: number;
  blackouts?: Blackout[];
}

/** A pass skipped for an adjustment: in a blackout, or too soon after the previous adjustment. */
export interface MovedFrom {
  station: string;
  tcaTtJ2000S: number;
  because: 'blackout' | 'minSpacing';
  /** The blackout it fell in (for `blackout`). */
  blackout: Blackout | null;
  minSpacingS: number;
}

export type AdjustmentKind = 'phase' | 'frequency' | 'combined';

export interface Adjustment {
  atTtJ2000S: number;
  station: string;
  passAosTtJ2000S: number;
  passLosTtJ2000S: number;
  kind: AdjustmentKind;
  /** Applied (quantised) phase step [ns]. */
  phaseStepNs: number;
  /** Applied (quantised) fractional frequency step. */
  frequencyStep: number;
  /** The frequency step in Hz at the nominal frequency. */
  frequencyStepHz: number;
  /** The frequency step as offset drift [ns/day]. */
  frequencyStepNsPerDay: number;
  /** Offset difference [ns] the rounding to hardware steps makes by the next adjustment (or the horizon end). */
  quantisationErrorNs: number;
  /** The steps before rounding to the hardware's resolution. */
  unquantised: { phaseStepNs: number; frequencyStep: number };
  offsetBeforeNs: number;
  offsetAfterNs: number;
  /** The crossing this adjustment pre-empts (predicted with the plan so far). */
  crossing: Crossing;
  /** True when the offset was already outside the limit. */
  immediate: boolean;
  /** The better pass this adjustment could not use, and why; null when it is in the best pass. */
  moved: MovedFrom | null;
}

/** One strategy planned over the same horizon. */
export interface StrategySummary {
  prefer: Strategy;
  adjustments: number;
  /** Smallest limit − |offset| over the horizon with that plan [ns] (negative: it leaves the limit). */
  minMarginNs: number;
  maxPhaseStepNs: number;
  maxFrequencyStep: number;
  /** True when that plan meets a crossing it cannot pre-empt. */
  unplannable: boolean;
}

export interface SatelliteResetPlan {
  satellite: string;
  limitNs: number;
  prefer: Strategy;
  targetNs: number;
  nominalHz: number;
  firstCrossing: Crossing | null;
  /** Largest probability over the horizon that the free-running offset is outside the limit at an instant (from the band). */
  crossingProbabilityWithinHorizon: number;
  adjustments: Adjustment[];
  /** A crossing with no allowed pass before it: a finding, not an error. Planning stops there. */
  unplannable: { crossing: Crossing; reason: string } | null;
  startsOutside: boolean;
  /** The three strategies on the same horizon (the preferred one included). */
  strategies: StrategySummary[];
  /** Findings worth reading (blackouts covering the horizon, …). */
  notes: string[];
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
  /** Passes over all stations (uplink or not), any order. */
  contacts: Contact[];
  steps?: ClockSteps;
  nominalHz?: number;
  /** Plan the other strategies too for `strategies` (default true). */
  compare?: boolean;
}

/** Cap on adjustments per satellite over a horizon (a clock needing more is a design problem). */
export const MAX_ADJUSTMENTS = 500;
/** Headroom on the periodic swing when sizing a step (its amplitude varies a little from orbit to orbit). */
const PERIODIC_ALLOWANCE = 1.1;
const PERIODIC_ALLOWANCE_NS = 0.5;
const STRATEGIES: readonly Strategy[] = ['phase', 'frequency', 'combined'];

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
  return clock.offsetNs(t) + stepsEffectNs(adjustments.map((a) => ({ atTtJ2000S: a.atTtJ2000S, phaseNs: a.phaseStepNs, fractional: a.frequencyStep })), t);
}

/**
 * The clock with the plan's steps applied. Steps are appended in time order; prefix sums make the
 * steps' effect at t one binary search instead of a loop over every step.
 */
class PlannedClock {
  private readonly at: number[] = [];
  private readonly cumPhaseNs: number[] = [];
  private readonly cumFractional: number[] = [];
  private readonly cumFractionalAtS: number[] = [];
  constructor(private readonly clock: OnboardClock) {}
  push(s: Step): void {
    const n = this.at.length;
    if (n > 0 && s.atTtJ2000S < this.at[n - 1]) throw new InternalError('adjustments out of time order', 'adjustments');
    this.at.push(s.atTtJ2000S);
    this.cumPhaseNs.push((n > 0 ? this.cumPhaseNs[n - 1] : 0) + s.phaseNs);
    this.cumFractional.push((n > 0 ? this.cumFractional[n - 1] : 0) + s.fractional);
    this.cumFractionalAtS.push((n > 0 ? this.cumFractionalAtS[n - 1] : 0) + s.fractional * s.atTtJ2000S);
  }
  offsetNs(t: number): number {
    return this.withStepsNs(this.clock.offsetNs(t), t);
  }
  /** The planned offset [ns] at t from the free-running offset x [ns] there. */
  withStepsNs(x: number, t: number): number {
    // Last step at or before t (the scans ask mostly after the last one).
    const count = this.at.length;
    let lo = count > 0 && this.at[count - 1] <= t ? count : 0;
    let hi = count;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (this.at[mid] <= t) lo = mid + 1;
      else hi = mid;
    }
    if (lo === 0) return x;
    const i = lo - 1;
    return x + this.cumPhaseNs[i] + 1e9 * (this.cumFractional[i] * t - this.cumFractionalAtS[i]);
  }
  /**
   * Smallest limitNs − |planned offset| [ns] over the scan instants min(to, from + k·step) whose
   * free-running offsets are `freeGridNs` (as offsetNs there; the steps found by walking forward).
   */
  minMarginNs(limitNs: number, freeGridNs: Float64Array, from: number, to: number, stepS: number): number {
    let minMarginNs = Infinity;
    let lo = 0;
    for (let k = 0; k < freeGridNs.length; k++) {
      const t = Math.min(to, from + k * stepS);
      while (lo < this.at.length && this.at[lo] <= t) lo++;
      const x = freeGridNs[k];
      const i = lo - 1;
      const planned = lo === 0 ? x : x + this.cumPhaseNs[i] + 1e9 * (this.cumFractional[i] * t - this.cumFractionalAtS[i]);
      minMarginNs = Math.min(minMarginNs, limitNs - Math.abs(planned));
    }
    return minMarginNs;
  }
  /** Size [ns] of the terms the steps add to the offset at instants up to |t| ≤ tMaxS (for rounding allowances). */
  stepsMagnitudeNs(tMaxS: number): number {
    const i = this.at.length - 1;
    if (i < 0) return 0;
    return Math.abs(this.cumPhaseNs[i]) + 1e9 * (Math.abs(this.cumFractional[i]) * Math.abs(tMaxS) + Math.abs(this.cumFractionalAtS[i]));
  }
  /** Window of one orbit centred on t, kept inside [from, to]. */
  private window(t: number, periodS: number, from: number, to: number): [number, number] {
    let a = Math.max(from, t - periodS / 2);
    const b = Math.min(to, a + periodS);
    a = Math.max(from, b - periodS);
    return b - a < 1 ? [Math.max(from, t - 60), Math.min(to, t + 60)] : [a, b];
  }
  /** Offset averaged over one orbit centred on t (Simpson, 64 intervals): the trend without the periodic swing. */
  meanOffsetNs(t: number, periodS: number, from: number, to: number): number {
    const [a, b] = this.window(t, periodS, from, to);
    const n = 64;
    let sum = 0;
    for (let k = 0; k <= n; k++) sum += (k === 0 || k === n ? 1 : k % 2 === 1 ? 4 : 2) * this.offsetNs(a + ((b - a) * k) / n);
    return sum / (3 * n);
  }
  /** Mean rate [ns/s] over one orbit centred on t (removes the orbit's periodic term). */
  meanRateNsPerS(t: number, periodS: number, from: number, to: number): number {
    const [a, b] = this.window(t, periodS, from, to);
    return (this.offsetNs(b) - this.offsetNs(a)) / (b - a);
  }
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

const scanStepOf = (periodS: number): number => Math.max(10, Math.min(600, periodS / 8));

interface StrategyPlan {
  adjustments: Adjustment[];
  unplannable: SatelliteResetPlan['unplannable'];
  minMarginNs: number;
}

/** Index of the first contact (sorted by AOS) whose AOS is after t. */
function firstAosAfter(contacts: readonly Contact[], t: number): number {
  let lo = 0;
  let hi = contacts.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (contacts[mid].aosTtJ2000S > t) hi = mid;
    else lo = mid + 1;
  }
  return lo;
}

const usableAfter = (c: Contact, since: number): boolean => c.uplink !== false && c.aosTtJ2000S > since && c.tcaTtJ2000S > since;

/**
 * The first uplink pass after `since` (ideal) and the first one allowed (`why` null), contacts
 * sorted by AOS (`ordered`: all times are numbers, so the sort holds and a search can skip the past).
 */
function passAfter(contacts: readonly Contact[], since: number, why: (c: Contact) => MovedFrom | null, ordered: boolean): { chosen: Contact | undefined; ideal: Contact | undefined } {
  let ideal: Contact | undefined;
  for (let i = ordered ? firstAosAfter(contacts, since) : 0; i < contacts.length; i++) {
    const c = contacts[i];
    if (!usableAfter(c, since)) continue;
    ideal ??= c;
    if (why(c) === null) return { chosen: c, ideal };
  }
  return { chosen: undefined, ideal };
}

/**
 * The last uplink pass after `since` that ends by `deadline` (ideal) and the last such one allowed,
 * contacts sorted by AOS. `ordered` (no pass ends before it begins): passes beginning after the
 * deadline are not looked at.
 */
function passBefore(contacts: readonly Contact[], since: number, deadline: number, why: (c: Contact) => MovedFrom | null, ordered: boolean): { chosen: Contact | undefined; ideal: Contact | undefined } {
  let ideal: Contact | undefined;
  const first = ordered ? firstAosAfter(contacts, since) : 0;
  const end = ordered ? firstAosAfter(contacts, deadline) : contacts.length;
  for (let i = end - 1; i >= first; i--) {
    const c = contacts[i];
    if (!usableAfter(c, since) || !(c.losTtJ2000S <= deadline)) continue;
    ideal ??= c;
    if (why(c) === null) return { chosen: c, ideal };
  }
  return { chosen: undefined, ideal };
}

/** Plan one strategy to the horizon. */
function planStrategy(req: ResetRequest, strategy: Strategy, periodicNs: number, bend: OffsetBend | null, freeGridNs: Float64Array): StrategyPlan {
  const { limitNs: L, policy, fromTtJ2000S: from, toTtJ2000S: to } = req;
  const steps = req.steps ?? CONTINUOUS_STEPS;
  const nominalHz = req.nominalHz ?? DEFAULT_NOMINAL_HZ;
  const targetNs = policy.targetNs ?? 0;
  const minSpacingS = policy.minSpacingS ?? 0;
  const blackouts = policy.blackouts ?? [];
  const planned = new PlannedClock(req.clock);
  const contacts = [...req.contacts].sort((a, b) => a.aosTtJ2000S - b.aosTtJ2000S);
  // Every pass ends no earlier than it begins (and no time is NaN): a pass ending by a deadline begins by it too.
  const ordered = contacts.every((c) => c.losTtJ2000S >= c.aosTtJ2000S);
  const scanStepS = scanStepOf(req.periodS);
  const agingNsPerS2 = req.clock.params === null ? 0 : (req.clock.params.agingPerDay / SECONDS_PER_DAY) * 1e9;
  const usableNs = L - policy.marginNs - PERIODIC_ALLOWANCE * periodicNs - PERIODIC_ALLOWANCE_NS;
  const offset = (t: number): number => planned.offsetNs(t);
  const band95 = band95Of(req.noise);
  const adjustments: Adjustment[] = [];
  const exact: { phaseNs: number; fractional: number }[] = [];
  let unplannable: StrategyPlan['unplannable'] = null;
  let since = from;

  for (let guard = 0; guard <= MAX_ADJUSTMENTS; guard++) {
    if (guard === MAX_ADJUSTMENTS) {
      // A legitimate request (a long horizon, a tight limit, a fast drift), not a fault: say what to change.
      throw new InputError(
        `more than ${MAX_ADJUSTMENTS} adjustments would be needed for ${req.satellite} within the horizon`,
        'horizon',
        'plan a shorter horizon (in pieces), widen clock.keepInNs, or correct the oscillator\'s frequency and drift first',
      );
    }
    const bandSince = since;
    const band = (t: number): number => band95(t - bandSince);
    const skip = bend === null ? null : { bend, extraMagnitudeNs: planned.stepsMagnitudeNs(Math.max(Math.abs(since), Math.abs(to))) };
    const { crossing, marginAt } = crossingAndMargin(offset, band, L, policy.marginNs > 0 ? L - policy.marginNs : null, since, to, scanStepS, skip);
    if (crossing === null) break;
    const s = signOf(crossing.side);
    const outsideNow = s * offset(since) >= L;
    const deadline = Math.min(marginAt ?? Infinity, crossing.earliestTtJ2000S) - policy.leadTimeS;
    const last = adjustments.at(-1);
    const spacingFloor = last === undefined ? -Infinity : last.atTtJ2000S + minSpacingS;
    const why = (c: Contact): MovedFrom | null => {
      const b = blackoutOf(c, req.satellite, blackouts);
      if (b !== null) return { station: c.station, tcaTtJ2000S: c.tcaTtJ2000S, because: 'blackout', blackout: b, minSpacingS };
      if (c.tcaTtJ2000S < spacingFloor) return { station: c.station, tcaTtJ2000S: c.tcaTtJ2000S, because: 'minSpacing', blackout: null, minSpacingS };
      return null;
    };
    const { chosen, ideal } = outsideNow ? passAfter(contacts, since, why, ordered) : passBefore(contacts, since, deadline, why, ordered);
    if (chosen === undefined) {
      let reason: string;
      if (outsideNow) reason = ideal === undefined ? 'the clock is outside its limit and no uplink pass follows within the horizon' : 'the clock is outside its limit and every later uplink pass is in a blackout or within the minimum spacing';
      else reason = ideal === undefined ? 'no uplink pass ends before the crossing minus the margin and lead time' : 'every uplink pass before the crossing minus the margin and lead time is in a blackout or within the minimum spacing';
      unplannable = { crossing, reason };
      break;
    }
    const moved = chosen === ideal || ideal === undefined ? null : why(ideal);
    const t = chosen.tcaTtJ2000S;
    const beforeNs = offset(t);
    const sizing = sizeAdjustment({
      strategy,
      trendNs: planned.meanOffsetNs(t, req.periodS, from, to),
      rateNsPerS: planned.meanRateNsPerS(t, req.periodS, from, to),
      agingNsPerS2,
      usableNs,
      targetNs,
      remainingS: to - t,
      band95Ns: band95,
      steps,
    });
    planned.push({ atTtJ2000S: t, phaseNs: sizing.phaseStepNs, fractional: sizing.frequencyStep });
    exact.push({ phaseNs: sizing.exactPhaseStepNs, fractional: sizing.exactFrequencyStep });
    const kind: AdjustmentKind = strategy !== 'combined' ? strategy : sizing.frequencyStep === 0 ? 'phase' : sizing.phaseStepNs === 0 ? 'frequency' : 'combined';
    adjustments.push({
      atTtJ2000S: t,
      station: chosen.station,
      passAosTtJ2000S: chosen.aosTtJ2000S,
      passLosTtJ2000S: chosen.losTtJ2000S,
      kind,
      phaseStepNs: sizing.phaseStepNs,
      frequencyStep: sizing.frequencyStep,
      frequencyStepHz: sizing.frequencyStep * nominalHz,
      frequencyStepNsPerDay: sizing.frequencyStep * SECONDS_PER_DAY * 1e9,
      quantisationErrorNs: 0,
      unquantised: { phaseStepNs: sizing.exactPhaseStepNs, frequencyStep: sizing.exactFrequencyStep },
      offsetBeforeNs: beforeNs,
      offsetAfterNs: beforeNs + sizing.phaseStepNs,
      crossing,
      immediate: outsideNow,
      moved,
    });
    since = t;
  }
  // What the rounding changed, by the next adjustment (or the horizon end).
  adjustments.forEach((a, i) => {
    const next = adjustments[i + 1]?.atTtJ2000S ?? to;
    a.quantisationErrorNs = a.phaseStepNs - exact[i].phaseNs + (a.frequencyStep - exact[i].fractional) * 1e9 * (next - a.atTtJ2000S);
  });
  return { adjustments, unplannable, minMarginNs: planned.minMarginNs(L, freeGridNs, from, to, scanStepS) };
}

/** The free-running offset [ns] at the scan instants from the plan start: min(to, from + k·step), k = 0…n. */
function freeGrid(req: ResetRequest): Float64Array {
  const { fromTtJ2000S: from, toTtJ2000S: to } = req;
  const step = scanStepOf(req.periodS);
  const n = Math.ceil((to - from) / step);
  const grid = new Float64Array(Math.max(0, n + 1));
  for (let k = 0; k <= n; k++) grid[k] = req.clock.offsetNs(Math.min(to, from + k * step));
  return grid;
}

/**
 * The band's 1-σ [ns] at the scan instants from the plan start (NaN: not worked out yet), kept for
 * the next satellite with the same noise and span: a scenario's satellites mostly share both. A
 * cache of a pure function of its key, so the plans do not depend on the order they are made in.
 */
let sigmaGridMemo: { key: readonly (number | boolean)[]; sigmaNs: Float64Array } | null = null;

function sigmaGridFor(noise: NoiseLevels | null, from: number, to: number, stepS: number, count: number): Float64Array {
  const key = [noise === null, noise?.whiteFmAdev1s ?? 0, noise?.flickerFmFloor ?? 0, noise?.randomWalkFmAdev1d ?? 0, from, to, stepS, count];
  if (sigmaGridMemo === null || sigmaGridMemo.key.length !== key.length || sigmaGridMemo.key.some((v, i) => !Object.is(v, key[i]))) {
    sigmaGridMemo = { key, sigmaNs: new Float64Array(count).fill(NaN) };
  }
  return sigmaGridMemo.sigmaNs;
}

/** Scan points per block of crossingProbability. */
const PROBABILITY_BLOCK = 64;
/** Allowance [probability] for the normal tail's approximation (≤ 1.5e-7 per limit) and rounding. */
const PROBABILITY_SLACK = 1e-6;

/**
 * Largest probability over [from, to] that the free-running offset is outside ±L at one instant
 * (the largest over the scan points). Blocks of points are taken from the end, where the band is
 * widest: inside the limit the probability grows with |x| and with the band, so a block whose
 * largest |x| with its widest band stays below the largest so far cannot raise it and is passed.
 */
function crossingProbability(req: ResetRequest, freeGridNs: Float64Array): number {
  const { fromTtJ2000S: from, toTtJ2000S: to, limitNs: L } = req;
  const step = scanStepOf(req.periodS);
  const sigma = bandSigmaOf(req.noise);
  const known = sigmaGridFor(req.noise, from, to, step, freeGridNs.length);
  const sigmaAt = (k: number): number => {
    let v = known[k];
    if (v !== v) known[k] = v = sigma(Math.min(to, from + k * step) - from);
    return v;
  };
  let p = 0;
  for (let end = freeGridNs.length; end > 0; end -= PROBABILITY_BLOCK) {
    const start = Math.max(0, end - PROBABILITY_BLOCK);
    let xMaxNs = 0;
    for (let k = start; k < end; k++) xMaxNs = Math.max(xMaxNs, Math.abs(freeGridNs[k]));
    if (xMaxNs < L && outsideProbability(xMaxNs, sigmaAt(end - 1) * (1 + 1e-12), L) + PROBABILITY_SLACK < p) continue;
    for (let k = start; k < end; k++) p = Math.max(p, outsideProbability(freeGridNs[k], sigmaAt(k), L));
  }
  return p;
}

/** Plan the adjustments for one satellite with the preferred strategy, and compare all three. */
export function planResets(req: ResetRequest): SatelliteResetPlan {
  const { limitNs: L, fromTtJ2000S: from, toTtJ2000S: to } = req;
  const periodicNs = periodicAmplitudeNs(req.clock, from, Math.min(to, from + req.periodS));
  const band95 = band95Of(req.noise);
  const freeBand = (t: number): number => band95(t - from);
  const bend = offsetBend(req.clock, from, to);
  const skip = bend === null ? null : { bend, extraMagnitudeNs: 0 };
  const firstCrossing = crossingAndMargin((t) => req.clock.offsetNs(t), freeBand, L, null, from, to, scanStepOf(req.periodS), skip).crossing;
  const prefer = req.policy.prefer;
  const grid = freeGrid(req);
  const main = planStrategy(req, prefer, periodicNs, bend, grid);
  const summary = (s: Strategy, p: StrategyPlan): StrategySummary => ({
    prefer: s,
    adjustments: p.adjustments.length,
    minMarginNs: p.minMarginNs,
    maxPhaseStepNs: p.adjustments.reduce((m, a) => Math.max(m, Math.abs(a.phaseStepNs)), 0),
    maxFrequencyStep: p.adjustments.reduce((m, a) => Math.max(m, Math.abs(a.frequencyStep)), 0),
    unplannable: p.unplannable !== null,
  });
  const strategies = (req.compare ?? true) ? STRATEGIES.map((s) => summary(s, s === prefer ? main : planStrategy(req, s, periodicNs, bend, grid))) : [summary(prefer, main)];
  const notes: string[] = [];
  if (blackoutsCover(req.satellite, req.policy.blackouts ?? [], from, to)) notes.push(`blackouts cover the whole horizon for ${req.satellite}: no adjustment can be planned`);
  return {
    satellite: req.satellite,
    limitNs: L,
    prefer,
    targetNs: req.policy.targetNs ?? 0,
    nominalHz: req.nominalHz ?? DEFAULT_NOMINAL_HZ,
    firstCrossing,
    crossingProbabilityWithinHorizon: crossingProbability(req, grid),
    adjustments: main.adjustments,
    unplannable: main.unplannable,
    startsOutside: Math.abs(req.clock.offsetNs(from)) >= L,
    strategies,
    notes,
  };
}

/** Sampled curves for a keep-in plot: offsets and 95 % half-widths [ns] at times [s since J2000.0 TT]. */
export interface KeepInSeries {
  tTtJ2000S: number[];
  freeNs: number[];
  freeBandNs: number[];
  plannedNs: number[];
  plannedBandNs: number[];
}

/** The free-running and planned offsets with their 95 % bands, n + 1 samples over [from, to]. */
export function keepInSeries(clock: OnboardClock, noise: NoiseLevels | null, plan: SatelliteResetPlan, from: number, to: number, n: number): KeepInSeries {
  const out: KeepInSeries = { tTtJ2000S: [], freeNs: [], freeBandNs: [], plannedNs: [], plannedBandNs: [] };
  for (let k = 0; k <= n; k++) {
    const t = from + ((to - from) * k) / n;
    let since = from;
    for (const a of plan.adjustments) if (a.atTtJ2000S <= t) since = a.atTtJ2000S;
    out.tTtJ2000S.push(t);
    out.freeNs.push(clock.offsetNs(t));
    out.freeBandNs.push(band95Ns(noise, t - from));
    out.plannedNs.push(offsetWithAdjustmentsNs(clock, plan.adjustments, t));
    out.plannedBandNs.push(band95Ns(noise, t - since));
  }
  return out;
}
