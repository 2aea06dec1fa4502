/** Read and validate a scenario file. */
import type { TimeSystem } from '../time/timeSystem.ts';
import { readTextFile } from './orbitSources.ts';
import { parseScenarioText, type SatelliteSpec, type ScenarioSpec } from './scenario.ts';
import { InputError } from '../errors.ts';

export function loadScenario(path: string, ts: TimeSystem, flag = 'scenario'): ScenarioSpec {
  return parseScenarioText(readTextFile(path, flag, 'scenario'), path, ts);
}

/** A satellite of the scenario by id or name. */
export function scenarioSatellite(s: ScenarioSpec, sat: string | undefined, flag = '--sat'): SatelliteSpec {
  if (sat === undefined) {
    if (s.satellites.length === 1) return s.satellites[0];
    throw new InputError(`${s.fileName} has ${s.satellites.length} satellites`, flag, `name one with --sat (${s.satellites.map((x) => x.id).slice(0, 6).join(', ')})`);
  }
  const found = s.satellites.find((x) => x.id === sat) ?? s.satellites.find((x) => x.name === sat);
  if (found === undefined) throw new InputError(`no satellite ${JSON.stringify(sat)} in ${s.fileName}`, flag, `use one of ${s.satellites.map((x) => x.id).slice(0, 8).join(', ')}`);
  return found;
}
