/**
 * Broadcast clock error on real data (`tauplan navclock --nav --precise --orbit`), pure: no I/O.
 *
 * At every precise-clock epoch t and satellite, the record a receiver would be using is taken: the
 * most recently transmitted healthy record whose toc is within its validity (GPS: half its fit
 * interval; Galileo: 4 h, common practice), preferring for Galileo the records whose clock refers
 * to the E1/E5a pair (RINEX data-source bit 8) when the satellite has any, since precise products
 * use that pair. Both sides carry the periodic relativistic term: the broadcast side adds
 * Δt_r = F·e·√A·sin E from its own Keplerian elements, the precise side −2 r·v/c² from the orbit.
 * Then, per epoch and system, the mean over satellites is removed (the precise clocks refer to
 * their own ensemble, the broadcast ones to GPST or GST); epochs with fewer than two satellites of
 * a system are dropped, as the mean would take all of the error.
 */
import { broadcastPolynomialS, broadcastRelativisticS, type BroadcastClockRecord } from '../clock/broadcast.ts';
import type { NavSystem } from '../clock/navMessage.ts';
import { InputError } from '../errors.ts';

export type { NavSystem } from '../clock/navMessage.ts';

/** Precise clock of one satellite: s since J2000.0 TT and clock offset [s] without the periodic term. */
export interface PreciseClockSeries {
  satellite: string;
  ttJ2000S: readonly number[];
  clockS: readonly number[];
}

export interface BroadcastEvalInput {
  records: readonly BroadcastClockRecord[];
  precise: readonly PreciseClockSeries[];
  /** −2 r·v/c² [s] of a satellite at a time from the orbit, or null where the orbit has no state. */
  periodicS(satellite: string, ttJ2000S: number): number | null;
  systems: readonly NavSystem[];
  /** Names for messages. */
  navFile: string;
  preciseFile: string;
}

export interface SatelliteBroadcastError {
  satellite: string;
  system: NavSystem;
  epochs: number;
  rmsNs: number;
  maxAbsNs: number;
  meanNs: number;
}

export interface AgeBin {
  system: NavSystem;
  /** Age of data t − toc [s], bin start (inclusive) and end (exclusive). */
  ageFromS: number;
  ageToS: number;
  epochs: number;
  rmsNs: number;
}

export interface BroadcastEvalResult {
  satellites: SatelliteBroadcastError[];
  commonOffsetRemoved: true;
  errorAgainstAge: AgeBin[];
  /** Satellite-epochs without a usable record, or without an orbit state. */
  unmatched: number;
  /** Satellite-epochs dropped because fewer than two satellites of their system shared the epoch. */
  droppedLoneEpochs: number;
  /** Records skipped for a non-zero health word. */
  unhealthyRecords: number;
}

/** Galileo record validity about toc [s] (common practice; the message has no fit-interval field). */
export const GALILEO_VALIDITY_S = 4 * 3600;
/** Width of the age-of-data bins [s]. */
export const AGE_BIN_S = 1800;
/** RINEX 3.05 Galileo data-source bit: af0–af2 refer to the E5a/E1 pair. */
const GAL_E1_E5A_BIT = 1 << 8;

interface Sample {
  satellite: string;
  system: NavSystem;
  ageS: number;
  diffNs: number;
}

/** Broadcast minus precise clock per satellite, common offset per epoch removed. */
export function evaluateBroadcastClocks(input: BroadcastEvalInput): BroadcastEvalResult {
  let unhealthy = 0;
  const bySat = new Map<string, BroadcastClockRecord[]>();
  for (const r of input.records) {
    if (!input.systems.includes(r.system)) continue;
    if (r.health !== 0) {
      unhealthy++;
      continue;
    }
    const list = bySat.get(r.satellite) ?? [];
    list.push(r);
    bySat.set(r.satellite, list);
  }
  for (const [sat, list] of bySat) {
    const e1e5a = list.filter((r) => r.dataSources !== null && (r.dataSources & GAL_E1_E5A_BIT) !== 0);
    const chosen = e1e5a.length > 0 ? e1e5a : list;
    bySat.set(sat, chosen.sort((a, b) => a.transmissionTtJ2000S - b.transmissionTtJ2000S));
  }

  const byEpoch = new Map<number, Sample[]>();
  let unmatched = 0;
  let anyOverlap = false;
  for (const series of input.precise) {
    const recs = bySat.get(series.satellite);
    if (recs === undefined) continue;
    for (let k = 0; k < series.ttJ2000S.length; k++) {
      const t = series.ttJ2000S[k];
      const rec = recordInUse(recs, t);
      if (rec === null) {
        unmatched++;
        continue;
      }
      anyOverlap = true;
      const periodic = input.periodicS(series.satellite, t);
      if (periodic === null) {
        unmatched++;
        continue;
      }
      const broadcastS = broadcastPolynomialS(rec, t) + broadcastRelativisticS(rec, t);
      const preciseS = series.clockS[k] + periodic;
      const key = Math.round(t * 1000);
      const list = byEpoch.get(key) ?? [];
      list.push({ satellite: series.satellite, system: rec.system, ageS: t - rec.tocTtJ2000S, diffNs: (broadcastS - preciseS) * 1e9 });
      byEpoch.set(key, list);
    }
  }
  if (!anyOverlap) {
    throw new InputError(
      `the precise clocks cover none of the broadcast records' epochs for ${input.systems.join(' and ')}`,
      `${input.preciseFile} and ${input.navFile}`,
      'give a precise clock file (SP3) of the same day and satellites as the navigation file',
    );
  }

  const kept: Sample[] = [];
  let dropped = 0;
  for (const samples of byEpoch.values()) {
    for (const system of input.systems) {
      const group = samples.filter((s) => s.system === system);
      if (group.length < 2) {
        dropped += group.length;
        continue;
      }
      const mean = group.reduce((a, s) => a + s.diffNs, 0) / group.length;
      for (const s of group) kept.push({ ...s, diffNs: s.diffNs - mean });
    }
  }
  return {
    satellites: perSatellite(kept),
    commonOffsetRemoved: true,
    errorAgainstAge: ageBins(kept),
    unmatched,
    droppedLoneEpochs: dropped,
    unhealthyRecords: unhealthy,
  };
}

/** The latest-transmitted record already broadcast at t whose toc is within its validity, or null. */
function recordInUse(recs: readonly BroadcastClockRecord[], t: number): BroadcastClockRecord | null {
  for (let i = recs.length - 1; i >= 0; i--) {
    const r = recs[i];
    if (r.transmissionTtJ2000S > t) continue;
    const half = r.fitIntervalS === null ? GALILEO_VALIDITY_S : r.fitIntervalS / 2;
    if (Math.abs(t - r.tocTtJ2000S) <= half) return r;
  }
  return null;
}

function perSatellite(samples: readonly Sample[]): SatelliteBroadcastError[] {
  const groups = new Map<string, Sample[]>();
  for (const s of samples) {
    const list = groups.get(s.satellite);
    if (list === undefined) groups.set(s.satellite, [s]);
    else list.push(s);
  }
  return [...groups.entries()]
    .sort(([a], [b]) => a.localeCompare(b))
    .map(([satellite, list]) => {
      let sum = 0;
      let sq = 0;
      let max = 0;
      for (const s of list) {
        sum += s.diffNs;
        sq += s.diffNs * s.diffNs;
        max = Math.max(max, Math.abs(s.diffNs));
      }
      return { satellite, system: list[0].system, epochs: list.length, rmsNs: Math.sqrt(sq / list.length), maxAbsNs: max, meanNs: sum / list.length };
    });
}

function ageBins(samples: readonly Sample[]): AgeBin[] {
  const bins = new Map<string, { system: NavSystem; from: number; n: number; sq: number }>();
  for (const s of samples) {
    const from = Math.floor(s.ageS / AGE_BIN_S) * AGE_BIN_S;
    const key = `${s.system} ${from}`;
    const b = bins.get(key) ?? { system: s.system, from, n: 0, sq: 0 };
    b.n++;
    b.sq += s.diffNs * s.diffNs;
    bins.set(key, b);
  }
  return [...bins.values()]
    .sort((a, b) => (a.system === b.system ? a.from - b.from : a.system.localeCompare(b.system)))
    .map((b) => ({ system: b.system, ageFromS: b.from, ageToS: b.from + AGE_BIN_S, epochs: b.n, rmsNs: Math.sqrt(b.sq / b.n) }));
}
