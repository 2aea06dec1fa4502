/**
 * Passes that involve the Moon (../events/lunarPasses.ts) with the clock along them: the same rows
 * as `passes` gives for Earth orbits. The periodic term at TCA is the lunar pair −2ρ·u/c² − v_M·ρ/c²
 * for a satellite about the Moon (the conventional −2r·v/c² otherwise).
 */
import { conventionalPeriodicS } from '../clock/rate.ts';
import { lunarPeriodicTermsS } from '../clock/lunarRate.ts';
import { earthLinkStation, findLunarPasses, lunarLinkStation, lunarOneWayTerms } from '../events/lunarPasses.ts';
import type { GmstRadAt } from '../events/passes.ts';
import { moonStateGcrfInto } from '../orbit/lunarEphemeris.ts';
import { isLunarOrbiter } from '../orbit/lunarOrbit.ts';
import { gcrfToTemeInto } from '../orbit/temeOfDate.ts';
import type { Trajectory } from '../orbit/trajectory.ts';
import type { BodyStation } from './lunarScenario.ts';
import { passClockRow, type PassClockRow } from './passes.ts';
import type { SatelliteClockRun } from './satelliteClock.ts';

/** The periodic relativistic term [s] at an instant for a trajectory (lunar pair, or −2r·v/c²). */
export function periodicTermAtS(traj: Trajectory, ttJ2000S: number): number {
  const s = traj.stateAt(ttJ2000S);
  const r = s.positionM;
  const v = s.velocityMPerS;
  if (!isLunarOrbiter(traj)) return conventionalPeriodicS(r[0], r[1], r[2], v[0], v[1], v[2]);
  const g = moonStateGcrfInto(ttJ2000S, new Float64Array(6), 0);
  const q = gcrfToTemeInto(ttJ2000S, new Float64Array(9));
  const m = [0, 1, 2].map((k) => q[3 * k] * g[0] + q[3 * k + 1] * g[1] + q[3 * k + 2] * g[2]);
  const vm = [0, 1, 2].map((k) => q[3 * k] * g[3] + q[3 * k + 1] * g[4] + q[3 * k + 2] * g[5]);
  const rho = [r[0] - m[0], r[1] - m[1], r[2] - m[2]];
  const u = [v[0] - vm[0], v[1] - vm[1], v[2] - vm[2]];
  const p = lunarPeriodicTermsS(rho, u, vm);
  return p.moonField + p.crossTerm;
}

/** Pass rows of one satellite over stations that need the lunar finder. */
export function lunarPassRows(run: SatelliteClockRun, stations: readonly BodyStation[], gmstRadAt: GmstRadAt, fromTtJ2000S: number, toTtJ2000S: number): { rows: PassClockRow[]; statesEvaluated: number } {
  const rows: PassClockRow[] = [];
  let statesEvaluated = 0;
  for (const st of stations) {
    const link = st.body === 'moon' ? lunarLinkStation(st, fromTtJ2000S, toTtJ2000S) : earthLinkStation(st, gmstRadAt);
    const found = findLunarPasses(run.trajectory, link, fromTtJ2000S, toTtJ2000S);
    statesEvaluated += found.statesEvaluated;
    for (const p of found.passes) {
      const oneWay = lunarOneWayTerms(run.trajectory, link, gmstRadAt, p.tcaTtJ2000S);
      rows.push({
        ...passClockRow(p, run, periodicTermAtS(run.trajectory, p.tcaTtJ2000S), oneWay),
        satelliteBody: isLunarOrbiter(run.trajectory) ? 'moon' : 'earth',
        stationBody: st.body === 'moon' ? 'moon' : 'earth',
      });
    }
  }
  return { rows, statesEvaluated };
}
