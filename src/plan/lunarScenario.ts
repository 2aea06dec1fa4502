/**
 * Scenarios with clocks near the Moon: which objects are lunar, and the clock figures `compare`
 * needs for them (the lunar periodic terms removed before the trend, the clocks of lunar stations).
 */
import type { IntegratedTrack } from '../clock/integrate.ts';
import { integrateAlong } from '../clock/integrate.ts';
import { fractionalOffset } from '../clock/rate.ts';
import { LunarExternalField, lunarPeriodicTermsS, withLunarField } from '../clock/lunarRate.ts';
import type { CentralBody, ScenarioSpec } from '../model/scenario.ts';
import type { Station } from '../model/station.ts';
import type { GravityModel } from '../orbit/gravity.ts';
import { isLunarOrbiter } from '../orbit/lunarOrbit.ts';
import { LunarSurfaceTrajectory } from '../orbit/lunarSurface.ts';
import { allocStateBlock, type Trajectory } from '../orbit/trajectory.ts';
import { halfRangeAboutLine, lineFit } from './size.ts';

/** True when the scenario has an orbit about the Moon or a station on it. */
export function scenarioHasLunarClocks(scenario: ScenarioSpec): boolean {
  const sat = scenario.satellites.some((s) => (s.orbit.kind === 'keplerian' && s.orbit.body === 'moon') || (s.orbit.kind === 'state' && s.orbit.frame === 'LCRS'));
  return sat || scenario.stations.some((s) => s.body === 'moon');
}

/**
 * The field for a scenario's clocks: with lunar clocks in it, the Earth's model plus the Moon's
 * potential taken exactly and the Sun's tide (../clock/lunarRate.ts), for every clock (for Earth
 * orbits that is the tidal option, below 1e-15 up to GNSS altitude).
 */
export function lunarAwareGravity(scenario: ScenarioSpec, gravity: GravityModel): GravityModel {
  return scenarioHasLunarClocks(scenario) ? withLunarField(gravity) : gravity;
}

/** The lunar field a gravity model carries, or a new one. */
export function lunarFieldOf(gravity: GravityModel): LunarExternalField {
  return gravity.tides instanceof LunarExternalField ? gravity.tides : new LunarExternalField();
}

/** The body a trajectory is about. */
export function bodyOf(traj: Trajectory): CentralBody {
  return isLunarOrbiter(traj) || traj instanceof LunarSurfaceTrajectory ? 'moon' : 'earth';
}

/** A station with its body (scenario stations carry it; plain stations are on the Earth). */
export type BodyStation = Station & { body?: CentralBody };

/** The clock of a station on the Moon, integrated over [from, to] (hour steps: it has no period of its own). */
export function lunarStationTrack(st: BodyStation, gravity: GravityModel, fromTtJ2000S: number, toTtJ2000S: number): { trajectory: LunarSurfaceTrajectory; track: IntegratedTrack } {
  const trajectory = new LunarSurfaceTrajectory(st.id, { latDeg: st.latDeg, lonDeg: st.lonDeg, heightM: st.heightM }, fromTtJ2000S, toTtJ2000S);
  const g = gravity.tides instanceof LunarExternalField ? gravity : withLunarField(gravity);
  const [track] = integrateAlong(trajectory, fromTtJ2000S, toTtJ2000S, 3600, [(x, y, z, vx, vy, vz, t) => fractionalOffset(g, x, y, z, vx, vy, vz, t)]);
  return { trajectory, track };
}

/**
 * Trend and swing of a lunar clock's offset over [from, to]: the slope of the line through the
 * offset with −2ρ·u/c² and −v_M·ρ/c² removed (orbiters; the `size --body moon` mean), and half the
 * peak-to-peak about that trend [ns].
 */
export function lunarTrackFigures(traj: Trajectory, track: IntegratedTrack, field: LunarExternalField, from: number, to: number, orbiting: boolean): { slope: number; periodicNs: number } {
  const m = Math.max(64, Math.min(20001, Math.ceil((to - from) / 60) + 1));
  const t = new Float64Array(m);
  for (let i = 0; i < m; i++) t[i] = from + ((to - from) * i) / (m - 1);
  const x = new Float64Array(m);
  const xc = new Float64Array(m);
  const block = allocStateBlock(orbiting ? m : 0);
  if (orbiting) traj.sampleInto(t, block);
  const rho = new Float64Array(3);
  const u = new Float64Array(3);
  for (let i = 0; i < m; i++) {
    x[i] = track.integralAt(t[i]);
    let p = 0;
    if (orbiting) {
      const mt = field.moonTemeAt(t[i]);
      for (let c = 0; c < 3; c++) {
        rho[c] = block.positionM[3 * i + c] - mt[c];
        u[c] = block.velocityMPerS[3 * i + c] - mt[3 + c];
      }
      const terms = lunarPeriodicTermsS(rho, u, mt.subarray(3, 6));
      p = terms.moonField + terms.crossTerm;
    }
    xc[i] = x[i] - p;
  }
  const line = lineFit(t, xc);
  return { slope: line.slope, periodicNs: halfRangeAboutLine(t, x, line) * 1e9 };
}
