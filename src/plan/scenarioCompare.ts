/** Use case `compare` over a scenario: every satellite (sub-orbital flights to their end) and station. */
import { NumericalTrajectory } from '../orbit/numerical.ts';
import type { GravityModel } from '../orbit/gravity.ts';
import type { OrbitResolver } from '../orbit/source.ts';
import type { ScenarioSpec } from '../model/scenario.ts';
import type { TimeSystem } from '../time/timeSystem.ts';
import { compareClocks, type CompareResult, type CompareSatellite } from './compare.ts';

/**
 * Compare all clocks of `scenario` over [from, to] (s since J2000.0 TT). With `against` (a satellite
 * or station id) the pairs are formed against that clock; the caller filters them.
 */
export function compareScenario(scenario: ScenarioSpec, ts: TimeSystem, gravity: GravityModel, fromTtJ2000S: number, toTtJ2000S: number, resolveOrbit: OrbitResolver, against?: string): CompareResult {
  const sats: CompareSatellite[] = scenario.satellites.map((sat) => {
    const { trajectory } = resolveOrbit(sat, scenario, ts, gravity, { fromTtJ2000S, toTtJ2000S });
    const flightEnd = trajectory instanceof NumericalTrajectory ? trajectory.flightEndTtJ2000S : null;
    return { id: sat.id, trajectory, flight: flightEnd === null ? null : { startTtJ2000S: trajectory.validFromTtJ2000S, endTtJ2000S: flightEnd } };
  });
  return compareClocks(sats, scenario.stations, gravity, fromTtJ2000S, toTtJ2000S, against);
}
