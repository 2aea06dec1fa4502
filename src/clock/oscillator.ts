/**
 * The onboard clock: oscillator model on top of relativity (contract, "Scenario files"; physics.md §6).
 *   dx/dt = y_hw + y_rel(t) + D·(t − t0),   D = agingPerDay / 86400 s,   x(t0) = x0.
 * Offsets are against the reference scale (GPS, TAI or TT): all tick at the geoid rate, so
 * only the constant differs, and x0 is given against the chosen reference.
 */
import { SECONDS_PER_DAY } from '../constants.ts';
import type { IntegratedTrack } from './integrate.ts';

/** Allan-deviation levels of the oscillator noise (all optional). */
export interface NoiseLevels {
  /** White FM: σ_y(τ) = whiteFmAdev1s / √(τ/1 s). */
  whiteFmAdev1s?: number;
  /** Flicker FM floor: σ_y constant. */
  flickerFmFloor?: number;
  /** Random-walk FM: σ_y(τ) = randomWalkFmAdev1d · √(τ / 1 d). */
  randomWalkFmAdev1d?: number;
}

/** The scenario's `clock` block, with the epoch as seconds since J2000.0 TT. */
export interface OscillatorParams {
  epochTtJ2000S: number;
  offsetNs: number;
  hardwareFractionalOffset: number;
  agingPerDay: number;
  noise?: NoiseLevels;
  keepInNs?: number;
}

/** A free-running onboard clock: relativity (integrated once) plus the oscillator model. */
export class OnboardClock {
  /** ∫ y_rel dt from the track start to the oscillator epoch [s]. */
  private readonly relAtEpochS: number;

  constructor(
    readonly relativistic: IntegratedTrack,
    readonly params: OscillatorParams | null,
  ) {
    this.relAtEpochS = params === null ? 0 : relativistic.integralAt(params.epochTtJ2000S);
  }

  /** Epoch of the model: the oscillator epoch, or the track start without a clock block. */
  get epochTtJ2000S(): number {
    return this.params?.epochTtJ2000S ?? this.relativistic.fromTtJ2000S;
  }

  /** Relativistic part only: ∫_{epoch}^{t} y_rel dt [ns]. */
  relativisticNs(ttJ2000S: number): number {
    return (this.relativistic.integralAt(ttJ2000S) - this.relAtEpochS) * 1e9;
  }

  /** Clock offset x(t) [ns] (reading minus reference), free running. */
  offsetNs(ttJ2000S: number): number {
    const rel = this.relativisticNs(ttJ2000S);
    const p = this.params;
    if (p === null) return rel;
    const dt = ttJ2000S - p.epochTtJ2000S;
    return p.offsetNs + rel + 1e9 * (p.hardwareFractionalOffset * dt + (p.agingPerDay / SECONDS_PER_DAY) * 0.5 * dt * dt);
  }

  /** Total fractional frequency dx/dt (dimensionless). */
  fractionalFrequency(ttJ2000S: number): number {
    const rel = this.relativistic.valueAt(ttJ2000S);
    const p = this.params;
    if (p === null) return rel;
    return rel + p.hardwareFractionalOffset + (p.agingPerDay / SECONDS_PER_DAY) * (ttJ2000S - p.epochTtJ2000S);
  }
}
