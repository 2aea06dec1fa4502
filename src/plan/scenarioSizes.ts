/**
 * Use case: the sizing of every prepared satellite of a scenario run (part of the whole-job
 * report), each over one day from the window start on the trajectory already built for it, or over
 * the part of that day its orbit source covers.
 */
import { GNSS_NOMINAL_HZ } from '../constants.ts';
import type { ScenarioContext } from './scenarioRuns.ts';
import { sizeClock, type SizeResult } from './size.ts';

/** Sizing span per satellite [s]: one day from the window start. */
export const SCENARIO_SIZE_SPAN_S = 86400;

/** Nothing is sized below this span [s] (a flight that has barely started). */
export const MIN_SCENARIO_SIZE_SPAN_S = 60;

/** The sizings of a run's satellites (in run order, titled by satellite id) and the notes about the ones shortened or left out. */
export function sizeScenarioRuns(ctx: ScenarioContext, nominalHz: number = GNSS_NOMINAL_HZ): { sizes: { result: SizeResult; title: string }[]; notes: string[] } {
  const sizes: { result: SizeResult; title: string }[] = [];
  const notes: string[] = [];
  for (const run of ctx.runs) {
    const from = Math.max(ctx.fromTtJ2000S, run.startTtJ2000S ?? ctx.fromTtJ2000S);
    const spanS = Math.min(SCENARIO_SIZE_SPAN_S, run.endTtJ2000S - from);
    if (!(spanS >= MIN_SCENARIO_SIZE_SPAN_S)) {
      notes.push(`${run.id}: not sized (less than ${MIN_SCENARIO_SIZE_SPAN_S} s of orbit in the window)`);
      continue;
    }
    if (spanS < SCENARIO_SIZE_SPAN_S) notes.push(`${run.id}: sized over ${(spanS / 3600).toFixed(2)} h, the part of the first day its orbit source covers`);
    sizes.push({ result: sizeClock({ trajectory: run.trajectory, gravity: ctx.gravity, fromTtJ2000S: from, spanS, nominalHz }), title: run.id });
  }
  return { sizes, notes };
}
