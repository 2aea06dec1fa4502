/**
 * Hardware step sizes (scenario `clock.steps`): phase steps are whole multiples of
 * `phaseResolutionNs`, frequency steps whole multiples of `frequencyResolution` (fractional) and
 * at most `maxFrequencyStep` in size. The planner applies the quantised values and reports the
 * difference they make.
 */
import { InputError } from '../errors.ts';

/** What the clock's steering hardware can do; a null field is unlimited (continuous). */
export interface ClockSteps {
  /** Smallest phase step [ns], > 0. */
  phaseResolutionNs: number | null;
  /** Smallest fractional frequency step (dimensionless), > 0. */
  frequencyResolution: number | null;
  /** Largest fractional frequency step in size (dimensionless), ≥ frequencyResolution. */
  maxFrequencyStep: number | null;
}

export const CONTINUOUS_STEPS: ClockSteps = { phaseResolutionNs: null, frequencyResolution: null, maxFrequencyStep: null };

/** Refuse step sizes the hardware cannot have; `where` names the scenario field. */
export function checkClockSteps(s: ClockSteps, where: string): void {
  const pos = (v: number | null, name: string): void => {
    if (v !== null && !(v > 0 && Number.isFinite(v))) throw new InputError(`${name} is ${v}, not a positive number`, `${where}.${name}`, `give the hardware's smallest step, greater than 0`);
  };
  pos(s.phaseResolutionNs, 'phaseResolutionNs');
  pos(s.frequencyResolution, 'frequencyResolution');
  pos(s.maxFrequencyStep, 'maxFrequencyStep');
  if (s.maxFrequencyStep !== null && s.frequencyResolution !== null && s.maxFrequencyStep < s.frequencyResolution) {
    throw new InputError(`maxFrequencyStep ${s.maxFrequencyStep} is smaller than frequencyResolution ${s.frequencyResolution}`, `${where}.maxFrequencyStep`, 'the largest step must be at least one resolution step');
  }
}

/** k whole steps of q, without the binary noise of the product (−57.800000000001 → −57.8). */
function multiple(k: number, q: number): number {
  return Number((k * q).toPrecision(12));
}

/** Nearest multiple of the phase resolution [ns]. */
export function quantisePhaseNs(stepNs: number, s: ClockSteps): number {
  const q = s.phaseResolutionNs;
  return q === null ? stepNs : multiple(Math.round(stepNs / q), q);
}

/** Largest allowed frequency step in size: maxFrequencyStep rounded down to whole resolution steps. */
function maxStep(s: ClockSteps): number {
  if (s.maxFrequencyStep === null) return Infinity;
  const q = s.frequencyResolution;
  return q === null ? s.maxFrequencyStep : multiple(Math.floor(s.maxFrequencyStep / q + 1e-9), q);
}

/** Clamp a fractional frequency step to the hardware's largest step. */
export function clampFrequency(step: number, s: ClockSteps): number {
  const m = maxStep(s);
  return Math.max(-m, Math.min(m, step));
}

/**
 * The realisable frequency steps around an exact one (clamped, then the nearest multiple first and
 * the other neighbouring multiple second); one value when the hardware is continuous.
 */
export function frequencyCandidates(step: number, s: ClockSteps): number[] {
  const c = clampFrequency(step, s);
  const q = s.frequencyResolution;
  if (q === null) return [c];
  const lo = multiple(Math.floor(c / q), q);
  const hi = multiple(Math.ceil(c / q), q);
  const m = maxStep(s);
  const inRange = [lo, hi].filter((v) => Math.abs(v) <= m * (1 + 1e-12));
  const sorted = [...new Set(inRange)].sort((a, b) => Math.abs(a - c) - Math.abs(b - c));
  return sorted.length > 0 ? sorted : [0];
}

/** Nearest realisable frequency step. */
export function quantiseFrequency(step: number, s: ClockSteps): number {
  return frequencyCandidates(step, s)[0];
}
