/**
 * Loading a scenario for the library: the one library function that reads files. It reads the
 * scenario (unless given its text) and every SP3 file it names, so the use cases that follow read
 * nothing.
 */
import { loadScenario as loadScenarioFile } from '../io/loadScenario.ts';
import { preloadScenarioFiles, trajectoryForSatellite } from '../io/orbitSources.ts';
import { parseScenarioText } from '../io/scenario.ts';
import type { ScenarioSpec } from '../model/scenario.ts';
import type { OrbitResolver } from '../orbit/source.ts';
import { prepareScenario, type ScenarioContext, type ScenarioSelection } from '../plan/scenarioRuns.ts';
import { timeSystemOf, type CommonOptions } from './common.ts';

/** Options of {@link loadScenario}. */
export interface LoadScenarioOptions extends CommonOptions {
  /**
   * When the first argument is the scenario's text: the name used in messages and to resolve
   * relative SP3 paths (against its folder). Default `scenario.yaml` in the working folder.
   */
  fileName?: string;
}

/** A text rather than a path: it has a line break or starts with `{`. */
function isScenarioText(pathOrText: string): boolean {
  return /[\r\n]/.test(pathOrText) || pathOrText.trimStart().startsWith('{');
}

/**
 * Read and check a scenario (JSON or YAML) from a file path, or from its text (a string with a line
 * break or starting with `{`). Times are parsed, defaults applied, and every SP3 file it names is
 * read now. Throws the same typed {@link InputError}s the CLI prints (ScenarioError with the JSON
 * path or file:line).
 */
export function loadScenario(pathOrText: string, options?: LoadScenarioOptions): ScenarioSpec {
  const ts = timeSystemOf(options);
  const scenario = isScenarioText(pathOrText) ? parseScenarioText(pathOrText, options?.fileName ?? 'scenario.yaml', ts) : loadScenarioFile(pathOrText, ts);
  preloadScenarioFiles(scenario);
  return scenario;
}

/** The orbit resolver the use cases get: scenario orbits to trajectories (SP3 files from the cache). */
export const resolveOrbit: OrbitResolver = trajectoryForSatellite;

/** A comma-separated list of names (`--station A,B`); refuses one that names nothing (`--station ,`). */
export { nameList } from '../plan/scenarioRuns.ts';

/** Which part of a scenario a run uses: the scenario commands' flags in camelCase. */
export type { ScenarioSelection, ScenarioContext } from '../plan/scenarioRuns.ts';

/**
 * A scenario made ready for the use cases: the window and selection checked, each selected
 * satellite's trajectory and clock prepared, the stations picked. `path` names the scenario in
 * messages (default its file name).
 */
export function prepareScenarioRun(scenario: ScenarioSpec, selection: ScenarioSelection, options?: CommonOptions, path: string = scenario.fileName): ScenarioContext {
  return prepareScenario(scenario, timeSystemOf(options), selection, resolveOrbit, path);
}

/** The satellites a selection names (`sat`: comma-separated ids, names or catalogue numbers; all by default), in scenario order. */
export { selectSatellites } from '../plan/scenarioRuns.ts';
