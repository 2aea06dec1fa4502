/**
 * Use case `resets` over a prepared scenario: the satellites with a keep-in limit, their passes at
 * uplink stations as contacts (passes shorter than the station's `minPassS` left out), the scenario's
 * policy (margin, lead time, target, spacing, blackouts) and hardware steps, and one plan per
 * satellite.
 */
import { InputError } from '../errors.ts';
import { requireUplinkStation } from './contacts.ts';
import { uplinkContacts } from './passes.ts';
import { planResets, type SatelliteResetPlan } from './resets.ts';
import { clockStepsOf, resetPolicyFrom } from './resetsInputs.ts';
import type { ScenarioContext } from './scenarioRuns.ts';

/** One keep-in plan per satellite that has a limit, in scenario order. `path` names the scenario in messages. */
export function planScenarioResets(ctx: ScenarioContext, path: string): SatelliteResetPlan[] {
  const withLimit = ctx.runs.filter((r) => r.keepInNs !== null);
  if (withLimit.length === 0) throw new InputError('no satellite has a keep-in limit', `${path} satellites[].clock.keepInNs`, 'give clock.keepInNs for the satellites to plan');
  const chosen = ctx.scenario.stations.filter((s) => ctx.stations.some((c) => c.id === s.id));
  requireUplinkStation(chosen, `${path} stations[].uplink`);
  const contacts = uplinkContacts(withLimit, chosen, ctx.gmstRadAt, ctx.fromTtJ2000S, ctx.toTtJ2000S);
  const policy = resetPolicyFrom(ctx.scenario.policy);
  return withLimit.map((run, k) => {
    const spec = ctx.scenario.satellites.find((s) => s.id === run.id);
    const { steps, nominalHz } = clockStepsOf(spec?.clock ?? null, `${path} ${spec?.path ?? run.id}`);
    return planResets({
      satellite: run.id,
      clock: run.clock,
      limitNs: run.keepInNs as number,
      noise: run.clock.params?.noise ?? null,
      policy,
      fromTtJ2000S: Math.max(ctx.fromTtJ2000S, run.startTtJ2000S ?? ctx.fromTtJ2000S),
      toTtJ2000S: Math.min(ctx.toTtJ2000S, run.endTtJ2000S),
      periodS: Number.isFinite(run.orbit.periodS) ? run.orbit.periodS : 86400,
      contacts: contacts[k].map((p) => ({ station: p.stationId, aosTtJ2000S: p.aosTtJ2000S, tcaTtJ2000S: p.tcaTtJ2000S, losTtJ2000S: p.losTtJ2000S, uplink: true })),
      steps,
      nominalHz,
    });
  });
}

/** Notes of satellites whose orbit source failed inside the window or was extrapolated. */
export function runNotes(ctx: Pick<ScenarioContext, 'runs'>): string[] {
  return ctx.runs.flatMap((r) => (r.note === null ? [] : [r.note]));
}
