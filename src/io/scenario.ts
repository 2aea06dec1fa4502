/**
 * Scenario files (JSON or YAML; contract "Scenario files"). Reads the text, checks it against
 * strict zod schemas (an unknown key is an error with a "did you mean" hint, never ignored),
 * applies the documented defaults and parses times and durations. Every fault is one
 * {@link ScenarioError} whose `path` is a JSON path such as `satellites[2].clock.agingPerDay`
 * (or `file:line` for a syntax error).
 *
 * Orbits are checked only for shape and gross sense here (perigee above the ground, position
 * outside the Earth, TLE line numbers); TLE, OMM and SP3 contents are read by their own parsers.
 */
import type { ScenarioSpec } from '../model/scenario.ts';
import type { TimeSystem } from '../time/timeSystem.ts';
import { buildSpec } from './scenarioBuild.ts';
import { readDocument } from './scenarioDocument.ts';
import { Context, issueError, pickIssue } from './scenarioIssues.ts';
import { ScenarioSchema } from './scenarioSchema.ts';

export * from '../model/scenario.ts';
export { formatPath } from './scenarioSchema.ts';

/**
 * Parse and check a scenario file's text. JSON or YAML by the extension of `fileName`
 * (.json / .yaml / .yml), else by content (`{` first means JSON). `fileName` is used in
 * messages and to resolve relative paths (SP3 files) against its folder. Times are read with
 * `timeSystem` (UTC with `Z`, or a scale name); a time error is reported at its JSON path.
 * @throws ScenarioError for any fault, with the JSON path (or file:line for syntax errors).
 */
export function parseScenarioText(text: string, fileName: string, timeSystem: TimeSystem): ScenarioSpec {
  const body = text.startsWith('\uFEFF') ? text.slice(1) : text;
  const { data, lineOf } = readDocument(body, fileName);
  const ctx = new Context(fileName, lineOf, timeSystem);
  const parsed = ScenarioSchema.safeParse(data);
  if (!parsed.success) throw issueError(pickIssue(parsed.error.issues), data, ctx);
  return buildSpec(parsed.data, ctx);
}
