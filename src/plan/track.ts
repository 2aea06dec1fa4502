/**
 * Use case `track`: sampled states and the clock along them for one satellite, in GCRF, TEME or
 * ECEF, for analysts' own tools (contract `tauplan track`).
 */
import { conventionalPeriodicS } from '../clock/rate.ts';
import { isLunarOrbiter } from '../orbit/lunarOrbit.ts';
import { periodicTermAtS } from './lunarPasses.ts';
import { applyMatrix, equationOfEquinoxesRadAtTt, temeToEcef, todToTeme, transpose, type Matrix3 } from '../orbit/frames.ts';
import { gcrfToTemeInto } from '../orbit/temeOfDate.ts';

const scratch = new Float64Array(9);
/** GCRF → TEME of date at TT seconds since J2000.0 (interpolated IAU 2006/2000A chain, < 20 µas). */
function matrixAt(ttJ2000S: number): Matrix3 {
  const m = gcrfToTemeInto(ttJ2000S, scratch);
  return [
    [m[0], m[1], m[2]],
    [m[3], m[4], m[5]],
    [m[6], m[7], m[8]],
  ];
}
import { allocStateBlock } from '../orbit/trajectory.ts';
import { vec3, type Vec3 } from '../orbit/vec.ts';
import { InputError } from '../errors.ts';
import type { SatelliteClockRun } from './satelliteClock.ts';

export type TrackFrame = 'GCRF' | 'TEME' | 'ECEF';
export const TRACK_FRAMES: readonly TrackFrame[] = ['GCRF', 'TEME', 'ECEF'];

export interface TrackRow {
  ttJ2000S: number;
  xKm: number;
  yKm: number;
  zKm: number;
  vxKmPerS: number;
  vyKmPerS: number;
  vzKmPerS: number;
  /** y_rel at this instant (dimensionless). */
  fractionalOffset: number;
  /** Clock offset [ns]: oscillator model plus relativity, or relativity alone. */
  offsetNs: number;
  /** −2 r·v/c² [ns]. */
  periodicNs: number;
}

/** Earth orientation needed for frame changes, supplied by the edge. */
export interface EarthOrientation {
  gmstRadAt: (ttJ2000S: number) => number;
  jdUtcAt: (ttJ2000S: number) => number;
}

/** Most rows one track may hold (memory bound); the fix is a larger --step or a shorter span. */
export const MAX_TRACK_ROWS = 2_000_000;

export function trackSatellite(run: SatelliteClockRun, fromTtJ2000S: number, toTtJ2000S: number, stepS: number, frame: TrackFrame, earth: EarthOrientation): TrackRow[] {
  if (!(stepS > 0)) throw new InputError(`step ${stepS} s is not positive`, '--step', 'give e.g. 60s');
  const n = Math.floor((toTtJ2000S - fromTtJ2000S) / stepS + 1e-9) + 1;
  if (n > MAX_TRACK_ROWS) throw new InputError(`${n} rows exceed the limit of ${MAX_TRACK_ROWS}`, '--step', 'use a larger --step or a shorter --from/--to span');
  const t = new Float64Array(n);
  for (let i = 0; i < n; i++) t[i] = fromTtJ2000S + i * stepS;
  const block = allocStateBlock(n);
  run.trajectory.sampleInto(t, block);
  const src = run.trajectory.frame;
  const lunar = isLunarOrbiter(run.trajectory);
  const rows: TrackRow[] = [];
  for (let i = 0; i < n; i++) {
    const p = block.positionM;
    const v = block.velocityMPerS;
    const r0 = [p[3 * i], p[3 * i + 1], p[3 * i + 2]];
    const v0 = [v[3 * i], v[3 * i + 1], v[3 * i + 2]];
    // About the Moon the periodic pair is −2ρ·u/c² − v_M·ρ/c² (lunarPasses.ts), else −2r·v/c².
    const periodicNs = (lunar ? periodicTermAtS(run.trajectory, t[i]) : conventionalPeriodicS(r0[0], r0[1], r0[2], v0[0], v0[1], v0[2])) * 1e9;
    // Bring the state to TEME of date first (the hub here), then to the wanted frame.
    let rTeme: Vec3<'TEME'>;
    let vTeme: Vec3<'TEME'>;
    if (src === 'TEME') {
      rTeme = vec3<'TEME'>(r0[0], r0[1], r0[2]);
      vTeme = vec3<'TEME'>(v0[0], v0[1], v0[2]);
    } else {
      // GCRF or TOD: through the IAU 2006/2000A chain at this instant (TT).
      const gcrf = src === 'GCRF';
      const toTeme = matrixAt(t[i]);
      const ee = gcrf ? 0 : equationOfEquinoxesRadAtTt(t[i]);
      rTeme = gcrf ? applyMatrix<'GCRF', 'TEME'>(toTeme, vec3<'GCRF'>(r0[0], r0[1], r0[2])) : todToTeme(vec3<'TOD'>(r0[0], r0[1], r0[2]), ee);
      vTeme = gcrf ? applyMatrix<'GCRF', 'TEME'>(toTeme, vec3<'GCRF'>(v0[0], v0[1], v0[2])) : todToTeme(vec3<'TOD'>(v0[0], v0[1], v0[2]), ee);
    }
    let rOut: readonly number[];
    let vOut: readonly number[];
    if (frame === 'TEME') {
      rOut = rTeme;
      vOut = vTeme;
    } else if (frame === 'ECEF') {
      const e = temeToEcef(rTeme, vTeme, earth.gmstRadAt(t[i]));
      rOut = e.r;
      vOut = e.v;
    } else {
      const back = transpose(matrixAt(t[i]));
      rOut = applyMatrix<'TEME', 'GCRF'>(back, rTeme);
      vOut = applyMatrix<'TEME', 'GCRF'>(back, vTeme);
    }
    rows.push({
      ttJ2000S: t[i],
      xKm: rOut[0] / 1000,
      yKm: rOut[1] / 1000,
      zKm: rOut[2] / 1000,
      vxKmPerS: vOut[0] / 1000,
      vyKmPerS: vOut[1] / 1000,
      vzKmPerS: vOut[2] / 1000,
      fractionalOffset: run.clock.relativistic.valueAt(t[i]),
      offsetNs: run.clock.offsetNs(t[i]),
      periodicNs,
    });
  }
  return rows;
}

