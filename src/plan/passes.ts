/**
 * Use case `passes` (the main job): every pass of every satellite over every station in the window,
 * with where the onboard clock stands at AOS and LOS, the conventional periodic term and the
 * one-way signal terms at TCA (contract `tauplan passes`; physics.md §4).
 */
import { conventionalPeriodicS } from '../clock/rate.ts';
import { oneWayTerms } from '../events/oneWay.ts';
import { earthPassGridStepS, findPassesMany, type GmstRadAt, type Pass } from '../events/passes.ts';
import { geodeticToEcefM, type Station } from '../events/station.ts';
import type { SatelliteClockRun } from './satelliteClock.ts';
import { earthLinkStation, findLunarPasses, lunarLinkStation, needsLunarPasses } from '../events/lunarPasses.ts';
import { lunarPassRows } from './lunarPasses.ts';
import type { BodyStation } from './lunarScenario.ts';

/** One pass with the clock along it. Times in seconds since J2000.0 TT. */
export interface PassClockRow extends Pass {
  satelliteName: string;
  clockOffsetAtAosNs: number;
  clockOffsetAtLosNs: number;
  driftDuringPassNs: number;
  clockOffsetAtTcaNs: number;
  relativisticPeriodicAtTcaNs: number;
  lightTimeAtTcaNs: number;
  sagnacAtTcaNs: number;
  shapiroAtTcaNs: number;
  /** keepInNs − |offset| at LOS, or null without a keep-in limit. */
  keepInMarginNs: number | null;
  /** Where the satellite orbits and where the station stands (absent: the Earth). */
  satelliteBody?: 'earth' | 'moon';
  stationBody?: 'earth' | 'moon';
}

export interface PassPlan {
  rows: PassClockRow[];
  statesEvaluated: number;
}

/** Passes with the clock along them, sorted by AOS then satellite then station. */
export function planPasses(runs: readonly SatelliteClockRun[], stations: readonly BodyStation[], gmstRadAt: GmstRadAt, fromTtJ2000S: number, toTtJ2000S: number): PassPlan {
  const rows: PassClockRow[] = [];
  let statesEvaluated = 0;
  const stationEcef = new Map(stations.map((s) => [s.id, geodeticToEcefM(s.latDeg, s.lonDeg, s.heightM)]));
  for (const run of runs) {
    const from = Math.max(fromTtJ2000S, run.startTtJ2000S ?? fromTtJ2000S);
    const to = Math.min(toTtJ2000S, run.endTtJ2000S);
    // Stations on the Moon and satellites about it go through the lunar pass finder (light time,
    // the other body blocking the line of sight); the rest through the Earth one, unchanged.
    const lunar = stations.filter((st) => needsLunarPasses(run.trajectory, st));
    const earth = stations.filter((st) => !needsLunarPasses(run.trajectory, st));
    if (lunar.length > 0) {
      const lunarRows = lunarPassRows(run, lunar, gmstRadAt, from, to);
      rows.push(...lunarRows.rows);
      statesEvaluated += lunarRows.statesEvaluated;
    }
    if (earth.length === 0) continue;
    const found = findPassesMany(run.trajectory, earth, gmstRadAt, from, to);
    statesEvaluated += found.statesEvaluated;
    for (const p of found.passes) {
      const s = run.trajectory.stateAt(p.tcaTtJ2000S);
      const r = s.positionM;
      const v = s.velocityMPerS;
      const oneWay = oneWayTerms(run.trajectory, stationEcef.get(p.stationId)!, gmstRadAt, p.tcaTtJ2000S);
      rows.push(passClockRow(p, run, conventionalPeriodicS(r[0], r[1], r[2], v[0], v[1], v[2]), oneWay));
    }
  }
  rows.sort(comparePassRows);
  return { rows, statesEvaluated };
}

/**
 * One pass with the clock along it: the offsets at AOS, TCA and LOS, the periodic term at TCA
 * [s] and the one-way terms at TCA as the pass finder of the station's body gives them.
 */
export function passClockRow(p: Pass, run: SatelliteClockRun, periodicAtTcaS: number, oneWay: { lightTimeNs: number; sagnacNs: number; shapiroNs: number }): PassClockRow {
  const atAos = run.clock.offsetNs(p.aosTtJ2000S);
  const atLos = run.clock.offsetNs(p.losTtJ2000S);
  // Every field named (a spread of the pass builds a slower object of the same content and order).
  return {
    satelliteId: run.id,
    stationId: p.stationId,
    aosTtJ2000S: p.aosTtJ2000S,
    tcaTtJ2000S: p.tcaTtJ2000S,
    losTtJ2000S: p.losTtJ2000S,
    maxElevationDeg: p.maxElevationDeg,
    durationS: p.durationS,
    truncated: p.truncated,
    aosTruncated: p.aosTruncated,
    losTruncated: p.losTruncated,
    satelliteName: run.name,
    clockOffsetAtAosNs: atAos,
    clockOffsetAtLosNs: atLos,
    driftDuringPassNs: atLos - atAos,
    clockOffsetAtTcaNs: run.clock.offsetNs(p.tcaTtJ2000S),
    relativisticPeriodicAtTcaNs: periodicAtTcaS * 1e9,
    lightTimeAtTcaNs: oneWay.lightTimeNs,
    sagnacAtTcaNs: oneWay.sagnacNs,
    shapiroAtTcaNs: oneWay.shapiroNs,
    keepInMarginNs: run.keepInNs === null ? null : run.keepInNs - Math.abs(atLos),
  };
}

/** The report order: AOS, then satellite id, then station id. */
export function comparePassRows(a: PassClockRow, b: PassClockRow): number {
  return a.aosTtJ2000S - b.aosTtJ2000S || a.satelliteId.localeCompare(b.satelliteId) || a.stationId.localeCompare(b.stationId);
}

/**
 * The passes a keep-in plan can use, per run (same order): only at uplink stations and at least the
 * station's `minPassS` long, with no clock rows (a plan needs AOS, TCA and LOS only). The search
 * grid is the one {@link planPasses} uses (it follows the orbit, not the stations), so the passes
 * found are the same.
 */
export function uplinkContacts(runs: readonly SatelliteClockRun[], stations: readonly (Station & { uplink?: boolean })[], gmstRadAt: GmstRadAt, fromTtJ2000S: number, toTtJ2000S: number): Pass[][] {
  const uplink = stations.filter((s) => s.uplink !== false);
  return runs.map((run) => {
    const from = Math.max(fromTtJ2000S, run.startTtJ2000S ?? fromTtJ2000S);
    const to = Math.min(toTtJ2000S, run.endTtJ2000S);
    if (uplink.length === 0 || !(to > from)) return [];
    // Stations on the Moon, and any station for a satellite about the Moon: the lunar pass finder.
    const lunar = uplink.filter((st) => needsLunarPasses(run.trajectory, st as BodyStation));
    const earth = uplink.filter((st) => !needsLunarPasses(run.trajectory, st as BodyStation));
    const lunarPasses = lunar.flatMap((st) => findLunarPasses(run.trajectory, (st as BodyStation).body === 'moon' ? lunarLinkStation(st, from, to) : earthLinkStation(st, gmstRadAt), from, to).passes);
    const minOf = new Map(uplink.map((s) => [s.id, s.minPassS]));
    const keep = (p: Pass): boolean => p.durationS >= (minOf.get(p.stationId) ?? 0);
    if (earth.length === 0) return lunarPasses.filter(keep).sort((a, b) => a.aosTtJ2000S - b.aosTtJ2000S);
    const s0 = run.trajectory.stateAt(from);
    const gridStepS = earthPassGridStepS(s0.positionM, s0.velocityMPerS);
    const found = findPassesMany(run.trajectory, earth, gmstRadAt, from, to, { gridStepS });
    return [...found.passes, ...lunarPasses].filter(keep).sort((a, b) => a.aosTtJ2000S - b.aosTtJ2000S || a.stationId.localeCompare(b.stationId));
  });
}
