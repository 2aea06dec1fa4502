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
import { InputError } from '../errors.ts';
import { band95Ns, band95Of } from './band.ts';
import { blackoutOf, blackoutsCover, type Blackout, type Contact } from './contacts.ts';
import { crossingAndMargin, signOf, type Crossing } from './crossing.ts';
import { crossingProbability, freeGrid, scanStepOf } from './freeRun.ts';
import { offsetBend, type OffsetBend } from './offsetBend.ts';
import { passAfter, passBefore } from './passChoice.ts';
import { PlannedClock, type Step } from './plannedClock.ts';
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

interface StrategyPlan {
  adjustments: Adjustment[];
  unplannable: SatelliteResetPlan['unplannable'];
  minMarginNs: number;
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
