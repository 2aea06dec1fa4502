/**
 * Loading a scenario file and preparing it for a use case (window, selection, trajectories and
 * clocks: src/api/scenario.ts, over src/plan/scenarioRuns.ts). Kept for scripts and tests that
 * start from a path.
 */
import { prepareScenarioRun, type ScenarioContext, type ScenarioSelection } from '../api/scenario.ts';
import { loadScenario } from '../io/loadScenario.ts';
import type { ScenarioSpec } from '../model/scenario.ts';
import type { TimeSystem } from '../time/timeSystem.ts';

export type { ScenarioContext, ScenarioSelection };

/** Load a scenario (or use the one already parsed) and prepare the selected satellites' clocks. */
export function loadScenarioContext(path: string, ts: TimeSystem, sel: ScenarioSelection, parsed?: ScenarioSpec): ScenarioContext {
  return prepareScenarioRun(parsed ?? loadScenario(path, ts), sel, { timeSystem: ts }, path);
}
