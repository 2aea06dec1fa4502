/** Writers for `tauplan resets`: JSON (contract fields), CSV (one row per adjustment), text plan. */
import { PREDICTION_RULE_TEXT } from '../clock/noise.ts';
import type { Crossing, SatelliteResetPlan } from '../plan/resets.ts';
import { Instant } from '../time/instant.ts';
import type { TimeSystem } from '../time/timeSystem.ts';
import { PLANNING_CAUTION } from './caution.ts';
import { toCsv } from './csv.ts';
import { sci, signed } from './format.ts';

export interface ResetsMeta {
  scenario: string;
  /** Satellites whose orbit source failed inside the horizon (reported up to the failure). */
  notes: string[];
  fromTtJ2000S: number;
  toTtJ2000S: number;
  reference: string;
  marginNs: number;
  leadTimeS: number;
  prefer: string;
}

function utc(ts: TimeSystem, t: number): string {
  return ts.format(Instant.fromTtJ2000S(t));
}

function crossingJson(c: Crossing | null, ts: TimeSystem): Record<string, unknown> | null {
  if (c === null) return null;
  return { at: utc(ts, c.atTtJ2000S), earliest: utc(ts, c.earliestTtJ2000S), latest: utc(ts, c.latestTtJ2000S), side: c.side > 0 ? 'upper' : 'lower' };
}

export function resetsToJson(plans: SatelliteResetPlan[], meta: ResetsMeta, ts: TimeSystem): Record<string, unknown> {
  return {
    scenario: meta.scenario,
    from: utc(ts, meta.fromTtJ2000S),
    to: utc(ts, meta.toTtJ2000S),
    reference: meta.reference,
    policy: { marginNs: meta.marginNs, leadTimeS: meta.leadTimeS, prefer: meta.prefer },
    predictionRule: PREDICTION_RULE_TEXT,
    notes: meta.notes,
    caution: PLANNING_CAUTION,
    satellites: plans.map((p) => ({
      satellite: p.satellite,
      limitNs: p.limitNs,
      firstCrossing: crossingJson(p.firstCrossing, ts),
      startsOutsideLimit: p.startsOutside,
      adjustments: p.adjustments.map((a) => ({
        at: utc(ts, a.atTtJ2000S),
        station: a.station,
        passAos: utc(ts, a.passAosTtJ2000S),
        passLos: utc(ts, a.passLosTtJ2000S),
        kind: a.kind,
        phaseStepNs: a.phaseStepNs,
        frequencyStep: a.frequencyStep,
        offsetBeforeNs: a.offsetBeforeNs,
        offsetAfterNs: a.offsetAfterNs,
        crossing: crossingJson(a.crossing, ts),
        immediate: a.immediate,
      })),
      unplannedCrossing: p.unplannable === null ? null : { ...crossingJson(p.unplannable.crossing, ts), reason: p.unplannable.reason },
    })),
  };
}

const COLUMNS = ['satellite', 'limitNs', 'crossingAt', 'crossingEarliest', 'crossingLatest', 'at', 'station', 'passAos', 'passLos', 'kind', 'phaseStepNs', 'frequencyStep', 'offsetBeforeNs', 'offsetAfterNs', 'note'];

export function resetsToCsv(plans: SatelliteResetPlan[], ts: TimeSystem): string {
  const rows: (string | number | null)[][] = [];
  for (const p of plans) {
    for (const a of p.adjustments) {
      rows.push([p.satellite, p.limitNs, utc(ts, a.crossing.atTtJ2000S), utc(ts, a.crossing.earliestTtJ2000S), utc(ts, a.crossing.latestTtJ2000S), utc(ts, a.atTtJ2000S), a.station, utc(ts, a.passAosTtJ2000S), utc(ts, a.passLosTtJ2000S), a.kind, a.phaseStepNs, a.frequencyStep, a.offsetBeforeNs, a.offsetAfterNs, a.immediate ? 'clock started outside its limit' : null]);
    }
    if (p.unplannable !== null) {
      const c = p.unplannable.crossing;
      rows.push([p.satellite, p.limitNs, utc(ts, c.atTtJ2000S), utc(ts, c.earliestTtJ2000S), utc(ts, c.latestTtJ2000S), null, null, null, null, null, null, null, null, null, p.unplannable.reason]);
    }
    if (p.adjustments.length === 0 && p.unplannable === null) rows.push([p.satellite, p.limitNs, null, null, null, null, null, null, null, null, null, null, null, null, 'no crossing within the horizon']);
  }
  return toCsv(COLUMNS, rows);
}

export function resetsToText(plans: SatelliteResetPlan[], meta: ResetsMeta, ts: TimeSystem): string {
  const out: string[] = [];
  out.push(`Keep-in adjustment plan — ${meta.scenario}`);
  out.push(`Horizon ${utc(ts, meta.fromTtJ2000S)} to ${utc(ts, meta.toTtJ2000S)}; offsets against ${meta.reference} [ns].`);
  out.push(`Policy: adjust in the last pass ending ${meta.marginNs} ns before the limit (earliest edge of the 95 % band) and ${(meta.leadTimeS / 3600).toFixed(1)} h ahead; preferred action: ${meta.prefer}.`);
  out.push(`Band rule: ${PREDICTION_RULE_TEXT}.`);
  for (const n of meta.notes) out.push(`NOTE: ${n}`);
  out.push('');
  for (const p of plans) {
    out.push(`${p.satellite} — keep-in ±${p.limitNs} ns`);
    if (p.startsOutside) out.push('  ! The clock is already outside its limit at the start: the first adjustment is immediate.');
    if (p.firstCrossing === null) out.push('  Free-running clock stays inside its limit over the horizon. No action.');
    else {
      const c = p.firstCrossing;
      out.push(`  Free running, it reaches the ${c.side > 0 ? 'upper' : 'lower'} limit at ${utc(ts, c.atTtJ2000S)} (95 %: ${utc(ts, c.earliestTtJ2000S)} … ${utc(ts, c.latestTtJ2000S)}).`);
    }
    p.adjustments.forEach((a, i) => {
      out.push(`  ${i + 1}. ${utc(ts, a.atTtJ2000S)}  station ${a.station}, pass ${utc(ts, a.passAosTtJ2000S).slice(0, 19)} → ${utc(ts, a.passLosTtJ2000S).slice(11, 19)}`);
      const action = a.kind === 'phase' ? `phase step ${signed(a.phaseStepNs, 2)} ns` : `frequency step ${sci(a.frequencyStep, 4)}`;
      const alt = a.kind === 'phase' ? `(frequency alternative ${sci(a.frequencyStep, 4)})` : `(phase alternative ${signed(a.phaseStepNs, 2)} ns)`;
      out.push(`     ${action} ${alt}; offset ${signed(a.offsetBeforeNs, 2)} → ${signed(a.offsetAfterNs, 2)} ns; pre-empts the crossing at ${utc(ts, a.crossing.atTtJ2000S)}`);
    });
    if (p.unplannable !== null) {
      out.push(`  FINDING: crossing at ${utc(ts, p.unplannable.crossing.atTtJ2000S)} cannot be pre-empted: ${p.unplannable.reason}. Planning stops here for ${p.satellite}.`);
    }
    out.push('');
  }
  out.push(PLANNING_CAUTION, '');
  return out.join('\n');
}
