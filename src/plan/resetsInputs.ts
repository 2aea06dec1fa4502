/**
 * From a checked scenario to the planner's inputs: the policy with instants as seconds since
 * J2000.0 TT, the hardware steps, and each satellite's passes marked uplink or receive-only.
 */
import type { ClockSpec, ResetPolicySpec, StationSpec } from '../model/scenario.ts';
import type { Contact } from './contacts.ts';
import { requireUplinkStation } from './contacts.ts';
import { checkClockSteps, type ClockSteps } from './quantise.ts';
import type { ResetPolicy } from './resets.ts';

/** The planner's policy from the scenario's (lead time null → 0). */
export function resetPolicyFrom(spec: ResetPolicySpec): ResetPolicy {
  return {
    marginNs: spec.marginNs,
    leadTimeS: spec.leadTimeS ?? 0,
    prefer: spec.prefer,
    targetNs: spec.targetNs,
    minSpacingS: spec.minSpacingS,
    blackouts: spec.blackouts.map((b) => ({ startTtJ2000S: b.start.ttJ2000S, endTtJ2000S: b.end.ttJ2000S, satellites: b.satellites })),
  };
}

/** The hardware steps of a satellite's clock (continuous without a clock block), checked. */
export function clockStepsOf(clock: ClockSpec | null, where: string): { steps: ClockSteps; nominalHz: number | undefined } {
  if (clock === null) return { steps: { phaseResolutionNs: null, frequencyResolution: null, maxFrequencyStep: null }, nominalHz: undefined };
  checkClockSteps(clock.steps, `${where}.clock.steps`);
  return { steps: clock.steps, nominalHz: clock.nominalHz };
}

/** A pass as the passes use case gives it. */
export interface PassLike {
  satelliteId: string;
  stationId: string;
  aosTtJ2000S: number;
  tcaTtJ2000S: number;
  losTtJ2000S: number;
  durationS: number;
}

/**
 * The passes of one satellite long enough for their station, marked uplink or not. Refuses a
 * station list with no uplink station (an input error naming the stations).
 */
export function contactsFor(passes: readonly PassLike[], stations: readonly Pick<StationSpec, 'id' | 'minPassS' | 'uplink'>[], satelliteId: string, where: string): Contact[] {
  requireUplinkStation(stations, where);
  const byId = new Map(stations.map((s) => [s.id, s]));
  return passes
    .filter((p) => p.satelliteId === satelliteId && p.durationS >= (byId.get(p.stationId)?.minPassS ?? 0))
    .map((p) => ({ station: p.stationId, aosTtJ2000S: p.aosTtJ2000S, tcaTtJ2000S: p.tcaTtJ2000S, losTtJ2000S: p.losTtJ2000S, uplink: byId.get(p.stationId)?.uplink ?? true }));
}
