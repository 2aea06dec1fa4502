/**
 * The one trajectory interface every command consumes. Each orbit source (SGP4, Keplerian,
 * numerical, SP3) implements it; nothing downstream knows which source it has.
 *
 * Time coordinate: seconds since J2000.0 TT (`ttJ2000S`). Positions in metres, velocities in
 * metres per second, in the source's inertial frame. For the clock rate only the pole matters
 * (zonal gravity) and the speed, so TEME and TOD give the same rate.
 */
import { SpanError } from '../errors.ts';
import type { InertialFrame, StateM } from './vec.ts';

/** Packed states: index i holds x,y,z at [3i..3i+2]. Units m and m/s. */
export interface StateBlock {
  positionM: Float64Array;
  velocityMPerS: Float64Array;
}

export interface Trajectory {
  /** Satellite id (catalogue number, name or scenario id). */
  readonly id: string;
  /** Inertial frame of the states returned. `TEME` and `TOD` share the true pole of date. */
  readonly frame: InertialFrame;
  /** First valid instant, seconds since J2000.0 TT. */
  readonly validFromTtJ2000S: number;
  /** Last valid instant, seconds since J2000.0 TT. */
  readonly validToTtJ2000S: number;
  /** A short description of the source, for reports ("SGP4 (TLE)", "Keplerian, osculating", ...). */
  readonly sourceLabel: string;
  /** Osculating-element epoch or element-set epoch, seconds since J2000.0 TT, when the source has one. */
  readonly epochTtJ2000S: number | null;
  /** State at one instant. Throws SpanError outside the validity span, PropagationError on failure. */
  stateAt(ttJ2000S: number): StateM<InertialFrame>;
  /**
   * States at many instants, written into `out` (allocated by the caller, length 3·n each).
   * Implementations avoid per-state allocation where they can.
   */
  sampleInto(ttJ2000S: Float64Array, out: StateBlock): void;
  /**
   * Position only [m] at one instant into out[0..2], for searches that need no velocity (a source
   * whose velocity costs extra work implements it; others fall back to `stateAt`). Same checks and
   * errors as `stateAt`; the position is the one `stateAt` gives, bit for bit.
   */
  positionInto?(ttJ2000S: number, out: Float64Array): void;
  /** State at one instant into out[0..5] (position m, velocity m/s), as `stateAt` gives it, with no allocation. Optional. */
  stateInto?(ttJ2000S: number, out: Float64Array): void;
}

/** State of `traj` at one instant into out[0..5]: {@link Trajectory.stateInto} when the source has it. */
export function stateInto(traj: Trajectory, ttJ2000S: number, out: Float64Array): void {
  if (traj.stateInto !== undefined) {
    traj.stateInto(ttJ2000S, out);
    return;
  }
  const s = traj.stateAt(ttJ2000S);
  out[0] = s.positionM[0];
  out[1] = s.positionM[1];
  out[2] = s.positionM[2];
  out[3] = s.velocityMPerS[0];
  out[4] = s.velocityMPerS[1];
  out[5] = s.velocityMPerS[2];
}

/** Position [m] of `traj` at one instant into out[0..2]: {@link Trajectory.positionInto} when the source has it. */
export function positionInto(traj: Trajectory, ttJ2000S: number, out: Float64Array): void {
  if (traj.positionInto !== undefined) {
    traj.positionInto(ttJ2000S, out);
    return;
  }
  const p = traj.stateAt(ttJ2000S).positionM;
  out[0] = p[0];
  out[1] = p[1];
  out[2] = p[2];
}

/** Allocate a block for `n` states. */
export function allocStateBlock(n: number): StateBlock {
  return { positionM: new Float64Array(3 * n), velocityMPerS: new Float64Array(3 * n) };
}

/** Default sampling through `stateAt` for sources with no faster bulk path. */
export function sampleByStateAt(traj: Trajectory, ttJ2000S: Float64Array, out: StateBlock): void {
  for (let i = 0; i < ttJ2000S.length; i++) {
    const s = traj.stateAt(ttJ2000S[i]);
    out.positionM[3 * i] = s.positionM[0];
    out.positionM[3 * i + 1] = s.positionM[1];
    out.positionM[3 * i + 2] = s.positionM[2];
    out.velocityMPerS[3 * i] = s.velocityMPerS[0];
    out.velocityMPerS[3 * i + 1] = s.velocityMPerS[1];
    out.velocityMPerS[3 * i + 2] = s.velocityMPerS[2];
  }
}

/**
 * Refuse an instant outside [from, to]. `format` turns ttJ2000S into a readable time for the message.
 * A small slack (1 ms) absorbs rounding at the edges.
 */
export function checkSpan(traj: Trajectory, ttJ2000S: number, format: (t: number) => string = String): void {
  if (ttJ2000S < traj.validFromTtJ2000S - 1e-3 || ttJ2000S > traj.validToTtJ2000S + 1e-3) {
    const from = format(traj.validFromTtJ2000S);
    const to = format(traj.validToTtJ2000S);
    throw new SpanError(`time ${format(ttJ2000S)} is outside the orbit source's span ${from} to ${to}`, traj.id, from, to, 'shorten the window to the source span, or give a source that covers it');
  }
}
