/**
 * Writers for `tauplan navclock` parameter sets ({@link NavClockResult} from src/plan/navclock.ts):
 * JSON, CSV and text. Pure string building; nothing physical is computed here.
 */
import type { NavClockResult } from '../plan/navclock.ts';
import { Instant } from '../time/instant.ts';
import type { TimeSystem } from '../time/timeSystem.ts';
import { PLANNING_CAUTION } from './caution.ts';
import { toCsv } from './csv.ts';
import { fixed, sci, textTable } from './format.ts';

/** What the output says about how the sets were made (shared by every format). */
export interface NavClockMeta {
  /** Where the prediction came from: a scenario, or a fit to measurements. */
  source: string;
  /** The prediction-band rule used for the expected error. */
  bandRule: string;
  notes: string[];
}

export const NAVCLOCK_CONVENTION =
  'toc at the centre of the fit interval (IS-GPS-200 §20.3.4.4); the periodic relativistic term −2 r·v/c² is removed before the fit and left to the receiver (Δt_r = F·e·√A·sin E, IS-GPS-200 §20.3.3.3.3.1); coefficients are the quantised values the message carries';
export const NAVCLOCK_AGE_RULE =
  'expected error at an age of data = largest fit residual + largest quantisation error over the fit interval + the 95 % prediction band at that age';

const utc = (ts: TimeSystem, t: number): string => ts.format(Instant.fromTtJ2000S(t));

/** JSON of the sets: the contract fields, plus the range error in metres and the error against age. */
export function navClockToJson(r: NavClockResult, meta: NavClockMeta, ts: TimeSystem) {
  return {
    system: r.system,
    message: r.message,
    degree: r.degree,
    intervalS: r.intervalS,
    fitIntervalS: r.fitIntervalS,
    predictionSpacingS: r.spacingS,
    periodicTermRemoved: true,
    convention: NAVCLOCK_CONVENTION,
    ageRule: NAVCLOCK_AGE_RULE,
    bandRule: meta.bandRule,
    source: meta.source,
    notes: meta.notes,
    caution: PLANNING_CAUTION,
    satellites: r.satellites.map((s) => ({
      satellite: s.satellite,
      sets: s.sets.map((x) => ({
        toc: utc(ts, x.tocTtJ2000S),
        tocGpsWeek: x.tocGpsWeek,
        tocGpsSecondsOfWeek: x.tocGpsSecondsOfWeek,
        af0S: x.af0S,
        af1: x.af1,
        af2PerS: x.af2PerS,
        fitIntervalS: x.fitIntervalS,
        fitResidualMaxNs: x.fitResidualMaxNs,
        quantisationErrorMaxNs: x.quantisationErrorMaxNs,
        expectedErrorNs: x.expectedErrorNs,
        expectedErrorM: x.expectedErrorM,
      })),
      errorAgainstAge: s.errorAgainstAge,
    })),
  };
}

export const NAVCLOCK_CSV_COLUMNS = [
  'satellite', 'toc', 'tocGpsWeek', 'tocGpsSecondsOfWeek', 'af0S', 'af1', 'af2PerS', 'fitIntervalS', 'fitResidualMaxNs', 'quantisationErrorMaxNs',
  'errorAge0Ns', 'errorAgeIntervalNs', 'errorAgeFitIntervalNs', 'errorAge24hNs', 'errorAge0M', 'errorAgeIntervalM', 'errorAgeFitIntervalM', 'errorAge24hM',
] as const;

/** CSV: one row per set. */
export function navClockToCsv(r: NavClockResult, ts: TimeSystem): string {
  return toCsv(
    NAVCLOCK_CSV_COLUMNS,
    r.satellites.flatMap((s) =>
      s.sets.map((x) => [
        s.satellite, utc(ts, x.tocTtJ2000S), x.tocGpsWeek, x.tocGpsSecondsOfWeek, x.af0S, x.af1, x.af2PerS, x.fitIntervalS, x.fitResidualMaxNs, x.quantisationErrorMaxNs,
        x.expectedErrorNs.age0, x.expectedErrorNs.ageInterval, x.expectedErrorNs.ageFitInterval, x.expectedErrorNs.age24h,
        x.expectedErrorM.age0, x.expectedErrorM.ageInterval, x.expectedErrorM.ageFitInterval, x.expectedErrorM.age24h,
      ]),
    ),
  );
}

/** Plain-text worksheet: one table per satellite, then the error against age. */
export function navClockToText(r: NavClockResult, meta: NavClockMeta, ts: TimeSystem): string {
  const h = (s: number): string => `${fixed(s / 3600, s % 3600 === 0 ? 0 : 2)}h`;
  const out: string[] = [
    `Navigation-message clock parameters — ${r.message}`,
    `source: ${meta.source}`,
    `degree ${r.degree}, a set every ${h(r.intervalS)}, fit interval ${h(r.fitIntervalS)}, prediction sampled every ${r.spacingS} s`,
    `convention: ${NAVCLOCK_CONVENTION}`,
    `expected error: ${NAVCLOCK_AGE_RULE}`,
    `band: ${meta.bandRule}`,
    ...meta.notes.map((n) => `note: ${n}`),
    '',
  ];
  const ageCols = [`err@0 ns`, `err@${h(r.intervalS)} ns`, `err@${h(r.fitIntervalS)} ns`, 'err@24h ns', 'err@24h m'];
  for (const s of r.satellites) {
    out.push(`${s.satellite}: ${s.sets.length} sets`);
    if (s.sets.length > 0) {
      out.push(
        textTable(
          ['toc (UTC)', 'week', 'sow', 'af0 s', 'af1', 'af2 s⁻¹', 'fit max ns', 'quant max ns', ...ageCols],
          s.sets.map((x) => [
            utc(ts, x.tocTtJ2000S), String(x.tocGpsWeek), String(x.tocGpsSecondsOfWeek), sci(x.af0S, 10), sci(x.af1, 10), sci(x.af2PerS, 6),
            fixed(x.fitResidualMaxNs, 3), fixed(x.quantisationErrorMaxNs, 3), fixed(x.expectedErrorNs.age0, 3), fixed(x.expectedErrorNs.ageInterval, 3),
            fixed(x.expectedErrorNs.ageFitInterval, 3), fixed(x.expectedErrorNs.age24h, 3), fixed(x.expectedErrorM.age24h, 3),
          ]),
        ),
      );
    }
    out.push('');
  }
  out.push('Expected clock error against age of data (worst set of each satellite), ns');
  const ages = r.satellites[0]?.errorAgainstAge.filter((_, i) => i % 3 === 0).map((p) => p.ageS) ?? [];
  out.push(textTable(['satellite', ...ages.map(h)], r.satellites.map((s) => [s.satellite, ...ages.map((a) => fixed(s.errorAgainstAge.find((p) => p.ageS === a)?.errorNs ?? 0, 2))])));
  out.push('', PLANNING_CAUTION, '');
  return out.join('\n');
}
