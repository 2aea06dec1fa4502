/** Use case `compare` over a scenario: every satellite (sub-orbital flights over their part in the window) and station. */
import { NumericalTrajectory } from '../orbit/numerical.ts';
import type { GravityModel } from '../orbit/gravity.ts';
import type { OrbitResolver } from '../orbit/source.ts';
import type { SatelliteSpec, ScenarioSpec } from '../model/scenario.ts';
import type { TimeSystem } from '../time/timeSystem.ts';
import { compareClocks, type CompareResult, type CompareSatellite, type CompareSubset } from './compare.ts';
import { flightInWindow } from './scenarioRuns.ts';

/** An orbit integrated from a state (Earth-centred Keplerian or state vector) may be a sub-orbital flight. */
function mayBeFlight(sat: SatelliteSpec): boolean {
  const o = sat.orbit;
  return (o.kind === 'keplerian' && o.body !== 'moon') || (o.kind === 'state' && o.frame !== 'LCRS');
}

/**
 * Compare all clocks of `scenario` over [from, to] (s since J2000.0 TT). With `against` (a satellite
 * or station id) the pairs are formed against that clock; the caller filters them. With `subset`,
 * just those clocks and the pairs among them are computed (./compare.ts); the other satellites are
 * resolved only when they may be a flight, so that a flight with no part in the window is refused
 * by every shard of a run alike.
 */
export function compareScenario(scenario: ScenarioSpec, ts: TimeSystem, gravity: GravityModel, fromTtJ2000S: number, toTtJ2000S: number, resolveOrbit: OrbitResolver, against?: string, subset?: CompareSubset): CompareResult {
  const only = subset?.clocks;
  const resolved = only === undefined ? scenario.satellites : scenario.satellites.filter((sat) => only.has(sat.id) || mayBeFlight(sat));
  const sats: CompareSatellite[] = resolved.map((sat) => {
    const { trajectory } = resolveOrbit(sat, scenario, ts, gravity, { fromTtJ2000S, toTtJ2000S });
    flightInWindow(trajectory, fromTtJ2000S, toTtJ2000S, ts, `${scenario.fileName} ${sat.path}`);
    const flightEnd = trajectory instanceof NumericalTrajectory ? trajectory.flightEndTtJ2000S : null;
    return { id: sat.id, trajectory, flight: flightEnd === null ? null : { startTtJ2000S: trajectory.validFromTtJ2000S, endTtJ2000S: flightEnd } };
  });
  return compareClocks(sats, scenario.stations, gravity, fromTtJ2000S, toTtJ2000S, against, subset);
}
