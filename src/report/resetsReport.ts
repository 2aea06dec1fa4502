/** Writers for `tauplan resets`: JSON (contract fields), CSV (one row per adjustment, notes as `#` lines), text plan. */
import { BAND_RULE_TEXT } from '../plan/band.ts';
import type { Adjustment, Crossing, MovedFrom, SatelliteResetPlan, StrategySummary } from '../plan/resets.ts';
import { Instant } from '../time/instant.ts';
import type { TimeSystem } from '../time/timeSystem.ts';
import { PLANNING_CAUTION } from './caution.ts';
import { toCsv } from './csv.ts';
import { sci, signed } from './format.ts';

export interface ResetsMeta {
  scenario: string;
  /** Findings about the inputs (SGP4 extrapolation, orbit sources failing inside the horizon). */
  notes: string[];
  fromTtJ2000S: number;
  toTtJ2000S: number;
  reference: string;
  marginNs: number;
  leadTimeS: number;
  prefer: string;
  /** Optional policy details for the header (defaults: target 0 ns, no spacing, no blackouts). */
  targetNs?: number;
  minSpacingS?: number;
  blackouts?: number;
}

function utc(ts: TimeSystem, t: number): string {
  return ts.format(Instant.fromTtJ2000S(t));
}

/** Every note of a run: the inputs' findings, each plan's own, and the band rule. */
export function resetsNotes(plans: readonly SatelliteResetPlan[], meta: ResetsMeta): string[] {
  return [...meta.notes, ...plans.flatMap((p) => p.notes), `95 % band rule: ${BAND_RULE_TEXT}`];
}

function crossingJson(c: Crossing | null, ts: TimeSystem): Record<string, unknown> | null {
  if (c === null) return null;
  return {
    at: utc(ts, c.atTtJ2000S),
    side: c.side,
    earliest: utc(ts, c.earliestTtJ2000S),
    latest: c.latestTtJ2000S === null ? null : utc(ts, c.latestTtJ2000S),
    otherSide: c.otherSide === null ? null : { side: c.otherSide.side, earliest: utc(ts, c.otherSide.earliestTtJ2000S) },
  };
}

/** Why an adjustment is not in the best pass, in words. */
export function movedText(m: MovedFrom | null, ts: TimeSystem): string | null {
  if (m === null) return null;
  const pass = `the ${m.station} pass at ${utc(ts, m.tcaTtJ2000S)}`;
  if (m.because === 'blackout' && m.blackout !== null) return `moved earlier: ${pass} falls in the blackout ${utc(ts, m.blackout.startTtJ2000S)} – ${utc(ts, m.blackout.endTtJ2000S)}`;
  return `moved: ${pass} is within the minimum spacing of ${(m.minSpacingS / 3600).toFixed(1)} h after the previous adjustment`;
}

function movedJson(m: MovedFrom | null, ts: TimeSystem): Record<string, unknown> | null {
  if (m === null) return null;
  return {
    station: m.station,
    tca: utc(ts, m.tcaTtJ2000S),
    because: m.because,
    blackout: m.blackout === null ? null : { start: utc(ts, m.blackout.startTtJ2000S), end: utc(ts, m.blackout.endTtJ2000S) },
    reason: movedText(m, ts),
  };
}

function strategyJson(s: StrategySummary): Record<string, unknown> {
  return { prefer: s.prefer, adjustments: s.adjustments, minMarginNs: s.minMarginNs, maxPhaseStepNs: s.maxPhaseStepNs, maxFrequencyStep: s.maxFrequencyStep, unplannable: s.unplannable };
}

function adjustmentJson(a: Adjustment, ts: TimeSystem): Record<string, unknown> {
  return {
    at: utc(ts, a.atTtJ2000S),
    station: a.station,
    passAos: utc(ts, a.passAosTtJ2000S),
    passLos: utc(ts, a.passLosTtJ2000S),
    kind: a.kind,
    phaseStepNs: a.phaseStepNs,
    frequencyStep: a.frequencyStep,
    frequencyStepHz: a.frequencyStepHz,
    frequencyStepNsPerDay: a.frequencyStepNsPerDay,
    quantisationErrorNs: a.quantisationErrorNs,
    unquantised: a.unquantised,
    offsetBeforeNs: a.offsetBeforeNs,
    offsetAfterNs: a.offsetAfterNs,
    crossing: crossingJson(a.crossing, ts),
    immediate: a.immediate,
    moved: movedJson(a.moved, ts),
  };
}

export function resetsToJson(plans: SatelliteResetPlan[], meta: ResetsMeta, ts: TimeSystem): Record<string, unknown> {
  return {
    scenario: meta.scenario,
    from: utc(ts, meta.fromTtJ2000S),
    to: utc(ts, meta.toTtJ2000S),
    reference: meta.reference,
    policy: { marginNs: meta.marginNs, leadTimeS: meta.leadTimeS, prefer: meta.prefer, targetNs: meta.targetNs ?? 0, minSpacingS: meta.minSpacingS ?? 0 },
    predictionRule: BAND_RULE_TEXT,
    notes: resetsNotes(plans, meta),
    caution: PLANNING_CAUTION,
    satellites: plans.map((p) => ({
      satellite: p.satellite,
      limitNs: p.limitNs,
      prefer: p.prefer,
      targetNs: p.targetNs,
      nominalHz: p.nominalHz,
      firstCrossing: crossingJson(p.firstCrossing, ts),
      otherSide: p.firstCrossing?.otherSide == null ? null : { side: p.firstCrossing.otherSide.side, earliest: utc(ts, p.firstCrossing.otherSide.earliestTtJ2000S) },
      crossingProbabilityWithinHorizon: p.crossingProbabilityWithinHorizon,
      startsOutsideLimit: p.startsOutside,
      adjustments: p.adjustments.map((a) => adjustmentJson(a, ts)),
      unplannedCrossing: p.unplannable === null ? null : { ...crossingJson(p.unplannable.crossing, ts), reason: p.unplannable.reason },
      strategies: p.strategies.map(strategyJson),
      notes: p.notes,
    })),
  };
}

/** The JSON object `tauplan resets --format json` prints (plain data; times are UTC ISO strings). */
export type ResetsJson = ReturnType<typeof resetsToJson>;

const COLUMNS = [
  'satellite', 'limitNs', 'crossingSide', 'crossingAt', 'crossingEarliest', 'crossingLatest', 'at', 'station', 'passAos', 'passLos', 'kind',
  'phaseStepNs', 'frequencyStep', 'frequencyStepHz', 'frequencyStepNsPerDay', 'quantisationErrorNs', 'offsetBeforeNs', 'offsetAfterNs', 'note',
];

/** CSV: the notes as `#` comment lines, then the header and one row per adjustment. */
export function resetsToCsv(plans: SatelliteResetPlan[], ts: TimeSystem, meta?: ResetsMeta): string {
  const rows: (string | number | null)[][] = [];
  const crossingCells = (c: Crossing): (string | null)[] => [c.side, utc(ts, c.atTtJ2000S), utc(ts, c.earliestTtJ2000S), c.latestTtJ2000S === null ? null : utc(ts, c.latestTtJ2000S)];
  for (const p of plans) {
    for (const a of p.adjustments) {
      const note = [a.immediate ? 'clock started outside its limit' : null, movedText(a.moved, ts)].filter((x) => x !== null).join('; ');
      rows.push([p.satellite, p.limitNs, ...crossingCells(a.crossing), utc(ts, a.atTtJ2000S), a.station, utc(ts, a.passAosTtJ2000S), utc(ts, a.passLosTtJ2000S), a.kind, a.phaseStepNs, a.frequencyStep, a.frequencyStepHz, a.frequencyStepNsPerDay, a.quantisationErrorNs, a.offsetBeforeNs, a.offsetAfterNs, note === '' ? null : note]);
    }
    const blank = (n: number): null[] => Array.from({ length: n }, () => null);
    if (p.unplannable !== null) rows.push([p.satellite, p.limitNs, ...crossingCells(p.unplannable.crossing), ...blank(12), `FINDING: ${p.unplannable.reason}`]);
    if (p.adjustments.length === 0 && p.unplannable === null) rows.push([p.satellite, p.limitNs, ...blank(16), 'no crossing within the horizon']);
  }
  const comments = (meta === undefined ? [`95 % band rule: ${BAND_RULE_TEXT}`] : resetsNotes(plans, meta)).map((n) => `# ${n.replace(/[\r\n]+/g, ' ')}\n`);
  return `# ${PLANNING_CAUTION}\n${comments.join('')}${toCsv(COLUMNS, rows)}`;
}

function hours(s: number): string {
  return s >= 86400 ? `${(s / 86400).toFixed(1)} d` : `${(s / 3600).toFixed(1)} h`;
}

function crossingWords(c: Crossing, ts: TimeSystem): string {
  const limit = c.side === 'upper' ? 'upper (+)' : 'lower (−)';
  const late = c.latestTtJ2000S === null ? 'not within the horizon' : utc(ts, c.latestTtJ2000S);
  return `reaches the ${limit} limit at ${utc(ts, c.atTtJ2000S)} (95 % band on that side: earliest ${utc(ts, c.earliestTtJ2000S)}, latest ${late})`;
}

export function resetsToText(plans: SatelliteResetPlan[], meta: ResetsMeta, ts: TimeSystem): string {
  const out: string[] = [];
  out.push(`Keep-in adjustment plan — ${meta.scenario}`);
  out.push(`Horizon ${utc(ts, meta.fromTtJ2000S)} to ${utc(ts, meta.toTtJ2000S)}; offsets against ${meta.reference} [ns].`);
  out.push(
    `Policy: strategy ${meta.prefer}, target ${signed(meta.targetNs ?? 0, 1)} ns; adjust in the last uplink pass ending before the 95 % band reaches the limit − ${meta.marginNs} ns, ${hours(meta.leadTimeS)} ahead` +
      `${(meta.minSpacingS ?? 0) > 0 ? `, at least ${hours(meta.minSpacingS ?? 0)} apart` : ''}${(meta.blackouts ?? 0) > 0 ? `, outside ${meta.blackouts} blackout(s)` : ''}.`,
  );
  for (const n of resetsNotes(plans, meta)) out.push(`NOTE: ${n}`);
  out.push('');
  for (const p of plans) {
    out.push(`${p.satellite} — keep-in ±${p.limitNs} ns`);
    if (p.startsOutside) out.push('  ! The clock is already outside its limit at the start: the first adjustment is immediate.');
    if (p.firstCrossing === null) out.push('  Free running, it stays inside its limit over the horizon.');
    else {
      out.push(`  Free running, it ${crossingWords(p.firstCrossing, ts)}.`);
      const o = p.firstCrossing.otherSide;
      if (o !== null) out.push(`  The band touches the ${o.side} limit first, at ${utc(ts, o.earliestTtJ2000S)} (a risk on the other side, not the predicted crossing).`);
    }
    out.push(`  Probability of being outside the limit at some instant of the horizon, free running: ${(100 * p.crossingProbabilityWithinHorizon).toFixed(1)} % (largest single-instant value from the band).`);
    p.adjustments.forEach((a, i) => {
      out.push(`  ${i + 1}. ${utc(ts, a.atTtJ2000S)}  station ${a.station}, pass ${utc(ts, a.passAosTtJ2000S).slice(0, 19)} → ${utc(ts, a.passLosTtJ2000S).slice(11, 19)}`);
      const parts: string[] = [];
      if (a.kind !== 'frequency') parts.push(`phase step ${signed(a.phaseStepNs, 2)} ns`);
      if (a.kind !== 'phase') parts.push(`frequency step ${sci(a.frequencyStep, 4)} (${sci(a.frequencyStepHz, 3)} Hz at ${sci(p.nominalHz, 4)} Hz, ${signed(a.frequencyStepNsPerDay, 3)} ns/day)`);
      const rounding = Math.abs(a.quantisationErrorNs) >= 0.005 ? `; rounding to the hardware steps moves it ${signed(a.quantisationErrorNs, 2)} ns by the next adjustment` : '';
      out.push(`     ${parts.join(' and ')}; offset ${signed(a.offsetBeforeNs, 2)} → ${signed(a.offsetAfterNs, 2)} ns${rounding}`);
      out.push(`     pre-empts the ${a.crossing.side} crossing predicted at ${utc(ts, a.crossing.atTtJ2000S)}${a.immediate ? ' (clock outside its limit: first allowed pass)' : ''}`);
      const why = movedText(a.moved, ts);
      if (why !== null) out.push(`     ${why}`);
    });
    if (p.unplannable !== null) {
      out.push(`  FINDING: the ${p.unplannable.crossing.side} crossing at ${utc(ts, p.unplannable.crossing.atTtJ2000S)} cannot be pre-empted: ${p.unplannable.reason}. Planning stops here for ${p.satellite}.`);
    }
    if (p.strategies.length > 1) {
      out.push('  Strategies on this horizon:');
      for (const s of p.strategies) {
        const mark = s.prefer === p.prefer ? '*' : ' ';
        out.push(`   ${mark} ${s.prefer.padEnd(9)} ${String(s.adjustments).padStart(3)} adjustments, smallest margin ${signed(s.minMarginNs, 1)} ns, largest phase step ${s.maxPhaseStepNs.toFixed(1)} ns, largest frequency step ${sci(s.maxFrequencyStep, 2)}${s.unplannable ? ' (meets a crossing it cannot pre-empt)' : ''}`);
      }
    }
    out.push('');
  }
  out.push(PLANNING_CAUTION, '');
  return out.join('\n');
}
