/**
 * Use case `resets` over a prepared scenario: the satellites with a keep-in limit, their passes as
 * contacts (passes shorter than the station's `minPassS` left out), and one plan per satellite.
 */
import { InputError } from '../errors.ts';
import { planPasses } from './passes.ts';
import { planResets, type SatelliteResetPlan } from './resets.ts';
import type { ScenarioContext } from './scenarioRuns.ts';

/** One keep-in plan per satellite that has a limit, in scenario order. `path` names the scenario in messages. */
export function planScenarioResets(ctx: ScenarioContext, path: string): SatelliteResetPlan[] {
  const policy = ctx.scenario.policy;
  const withLimit = ctx.runs.filter((r) => r.keepInNs !== null);
  if (withLimit.length === 0) throw new InputError('no satellite has a keep-in limit', `${path} satellites[].clock.keepInNs`, 'give clock.keepInNs for the satellites to plan');
  const passes = planPasses(withLimit, ctx.stations, ctx.gmstRadAt, ctx.fromTtJ2000S, ctx.toTtJ2000S);
  const minPass = new Map(ctx.stations.map((s) => [s.id, s.minPassS]));
  return withLimit.map((run) =>
    planResets({
      satellite: run.id,
      clock: run.clock,
      limitNs: run.keepInNs as number,
      noise: run.clock.params?.noise ?? null,
      policy: { marginNs: policy.marginNs, leadTimeS: policy.leadTimeS ?? 0, prefer: policy.prefer },
      fromTtJ2000S: Math.max(ctx.fromTtJ2000S, run.startTtJ2000S ?? ctx.fromTtJ2000S),
      toTtJ2000S: Math.min(ctx.toTtJ2000S, run.endTtJ2000S),
      periodS: Number.isFinite(run.orbit.periodS) ? run.orbit.periodS : 86400,
      contacts: passes.rows
        .filter((p) => p.satelliteId === run.id && p.durationS >= (minPass.get(p.stationId) ?? 0))
        .map((p) => ({ station: p.stationId, aosTtJ2000S: p.aosTtJ2000S, tcaTtJ2000S: p.tcaTtJ2000S, losTtJ2000S: p.losTtJ2000S })),
    }),
  );
}

/** Notes of satellites whose orbit source failed inside the window or was extrapolated. */
export function runNotes(ctx: Pick<ScenarioContext, 'runs'>): string[] {
  return ctx.runs.flatMap((r) => (r.note === null ? [] : [r.note]));
}
