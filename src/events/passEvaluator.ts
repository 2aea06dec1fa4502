/**
 * What the pass search (./passes.ts, ./passScan.ts) knows of one trajectory: its earth-fixed states
 * (counted, the Earth's rotation from the grid where it can), and bounds on its earth-fixed speed and
 * acceleration for a free-falling satellite that stays above ground — the bounds that let the scan
 * skip stations the satellite cannot reach and maxima that cannot reach the mask.
 */
import { WGS84_GM_M3_PER_S2, WGS84_OMEGA_RAD_PER_S } from '../constants.ts';
import { stateInto, type Trajectory } from '../orbit/trajectory.ts';
import type { GmstRadAt } from './passes.ts';
import { earthRotationAtGridTime } from './siderealGrid.ts';

/** Radius [m] the satellite is taken never to go below: inside the Earth (polar radius 6 356 752 m). */
const REACH_FLOOR_RADIUS_M = 6.3e6;
/** Factor on point-mass gravity in the acceleration bound (free fall: perturbations ≪ 1). */
const REACH_GRAVITY_MARGIN = 2;

/**
 * Bound [m/s] on the earth-fixed speed at any instant within `halfGapS` of a grid sample, from the
 * samples' largest speed and their radii, for a free-falling satellite (./passScan.ts):
 * |a| ≤ 2·GM/r² + 2ωV + ω²r with r ≥ {@link REACH_FLOOR_RADIUS_M}. Infinity when the gap is too
 * long for the rotating-frame terms.
 */
export function earthFixedSpeedBoundMPerS(vMaxMPerS: number, rMinM: number, rMaxM: number, halfGapS: number): number {
  const w = WGS84_OMEGA_RAD_PER_S;
  const d = halfGapS;
  // First with gravity at the floor radius: V ≤ vMax + d·(g_floor + 2ωV + ω²(r_max + V·d)).
  const gFloor = (REACH_GRAVITY_MARGIN * WGS84_GM_M3_PER_S2) / (REACH_FLOOR_RADIUS_M * REACH_FLOOR_RADIUS_M);
  const denom = 1 - 2 * w * d - w * w * d * d;
  if (!(denom > 0.5)) return Infinity;
  const vCrude = (vMaxMPerS + d * (gFloor + w * w * rMaxM)) / denom;
  // Then with gravity at the lowest radius the span allows.
  return vMaxMPerS + earthFixedAccelBoundMPerS2(vCrude, rMinM, rMaxM, d) * d;
}

/**
 * Bound [m/s²] on the earth-fixed acceleration within `halfGapS` of the samples, for speeds ≤
 * vBoundMPerS: 2·GM/r² at the lowest radius reachable (not below {@link REACH_FLOOR_RADIUS_M}: the
 * satellite does not go underground), plus the Coriolis and centrifugal terms.
 */
export function earthFixedAccelBoundMPerS2(vBoundMPerS: number, rMinM: number, rMaxM: number, halfGapS: number): number {
  const w = WGS84_OMEGA_RAD_PER_S;
  const rLow = Math.max(REACH_FLOOR_RADIUS_M, rMinM - vBoundMPerS * halfGapS);
  return (REACH_GRAVITY_MARGIN * WGS84_GM_M3_PER_S2) / (rLow * rLow) + 2 * w * vBoundMPerS + w * w * (rMaxM + vBoundMPerS * halfGapS);
}

/** Earth-fixed states of one trajectory, counted. */
export class EcefEvaluator {
  statesEvaluated = 0;
  /** Last evaluated earth-fixed state: position [m] then velocity [m/s]. */
  readonly state = new Float64Array(6);
  /** Earth-fixed states at the previous and the current grid sample (set by the grid loop). */
  prevSample = new Float64Array(6);
  sample = new Float64Array(6);
  /** Grid step [s] (set by the grid loop). */
  gridStepS = 0;
  /** Bound [m/s] on the earth-fixed speed over the current chunk of the grid, and the chunk's last sample time. */
  chunkSpeedBoundMPerS = Infinity;
  chunkEndTtJ2000S = -Infinity;
  constructor(
    readonly traj: Trajectory,
    readonly gmstRadAt: GmstRadAt,
  ) {}
  // The current chunk's grid rotation (./siderealGrid.ts), for instants inside it.
  private gridT0 = 0;
  private gridStepS2 = 1;
  private gridN = 0;
  private cosG: Float64Array = new Float64Array(0);
  private sinG: Float64Array = new Float64Array(0);
  private rateG: Float64Array = new Float64Array(0);
  private readonly rot = new Float64Array(2);
  /** Use the rotation the grid loop computed for its current chunk (samples t0 + k·stepS, k < n). */
  useGridRotation(t0: number, stepS: number, n: number, cosG: Float64Array, sinG: Float64Array, rateG: Float64Array): void {
    this.gridT0 = t0;
    this.gridStepS2 = stepS;
    this.gridN = n;
    this.cosG = cosG;
    this.sinG = sinG;
    this.rateG = rateG;
  }
  /** Earth-fixed state at t into {@link state} (temeToEcef of src/orbit/frames.ts, in place). */
  at(t: number): Float64Array {
    const out = this.state;
    stateInto(this.traj, t, out);
    this.statesEvaluated++;
    let c: number;
    let s: number;
    if (earthRotationAtGridTime(t, this.gridT0, this.gridStepS2, this.gridN, this.cosG, this.sinG, this.rateG, this.rot)) {
      c = this.rot[0];
      s = this.rot[1];
    } else {
      const g = this.gmstRadAt(t);
      c = Math.cos(g);
      s = Math.sin(g);
    }
    const x = c * out[0] + s * out[1];
    const y = -s * out[0] + c * out[1];
    const vx = c * out[3] + s * out[4];
    const vy = -s * out[3] + c * out[4];
    const w = WGS84_OMEGA_RAD_PER_S;
    out[0] = x;
    out[1] = y;
    out[3] = vx + w * y;
    out[4] = vy - w * x;
    return out;
  }
  /** The grid loop moves on: the current sample becomes the previous one. */
  advance(): void {
    const t = this.prevSample;
    this.prevSample = this.sample;
    this.sample = t;
  }
}
