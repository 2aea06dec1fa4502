/**
 * What an orbit source resolves to, and the function type that resolves a scenario satellite.
 * The resolver lives at the edge (`src/io/orbitSources.ts`, which may read SP3 files); the use
 * cases in `src/plan` receive it as a parameter so that the core itself reads nothing.
 */
import type { GravityModel } from './gravity.ts';
import type { Trajectory } from './trajectory.ts';
import type { SatelliteSpec, ScenarioSpec } from '../model/scenario.ts';
import type { TimeSystem } from '../time/timeSystem.ts';

/** A span of interest, seconds since J2000.0 TT. */
export interface Span {
  fromTtJ2000S: number;
  toTtJ2000S: number;
}

/** A trajectory, and for element-based sources a way to rebuild it with a changed semi-major axis. */
export interface ResolvedOrbit {
  trajectory: Trajectory;
  /** Display name (TLE name line, OMM OBJECT_NAME, scenario name), or the id. */
  name: string;
  /** The same orbit with the semi-major axis changed by `deltaAKm` [km] (for the sensitivity). */
  rebuildWithDeltaAKm?: (deltaAKm: number) => Trajectory;
}

/** Turns a scenario satellite into a trajectory whose validity covers `span`. */
export type OrbitResolver = (sat: SatelliteSpec, scenario: ScenarioSpec, ts: TimeSystem, gravity: GravityModel, span: Span) => ResolvedOrbit;
