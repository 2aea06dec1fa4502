/**
 * Loading a scenario for the planning commands. The use-case logic (window, selection, trajectories
 * and clocks) is in src/plan/scenarioRuns.ts; this edge reads the file and supplies the orbit
 * resolver that may read SP3 files.
 */
import { loadScenario } from '../io/loadScenario.ts';
import { trajectoryForSatellite } from '../io/orbitSources.ts';
import type { ScenarioSpec } from '../model/scenario.ts';
import { prepareScenario, type ScenarioContext, type ScenarioSelection } from '../plan/scenarioRuns.ts';
import type { TimeSystem } from '../time/timeSystem.ts';

export { checkWindowInSpan, MAX_WINDOW_DAYS, oscillatorParams, resolveWindow, scenarioGravity, selectSatellites, spanWithClockEpoch, type ScenarioContext, type ScenarioSelection } from '../plan/scenarioRuns.ts';

/** Load a scenario (or use the one already parsed) and prepare the selected satellites' clocks. */
export function loadScenarioContext(path: string, ts: TimeSystem, sel: ScenarioSelection, parsed?: ScenarioSpec): ScenarioContext {
  return prepareScenario(parsed ?? loadScenario(path, ts), ts, sel, trajectoryForSatellite, path);
}
