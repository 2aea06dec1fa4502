/**
 * `tauplan navclock --nav FILE --precise FILE --orbit FILE [--system gps|galileo]`: broadcast clock
 * error of a RINEX 3 navigation file against precise clocks (the SP3 clock column), with the periodic
 * term on both sides (broadcast Δt_r from its elements, precise −2 r·v/c² from the orbit file).
 */
import type { NavSystem } from '../../clock/navMessage.ts';
import { conventionalPeriodicS } from '../../clock/rate.ts';
import { InputError } from '../../errors.ts';
import { readRinexNav } from '../../io/rinexNav.ts';
import { readSp3File as readSp3, type Sp3File } from '../../io/sp3.ts';
import { readHeadLines } from '../../io/textSource.ts';
import { Sp3Trajectory } from '../../orbit/sp3.ts';
import { evaluateBroadcastClocks, type BroadcastEvalResult, type PreciseClockSeries } from '../../plan/navclockBroadcast.ts';
import { broadcastEvalToCsv, broadcastEvalToJson, broadcastEvalToText, type BroadcastEvalMeta } from '../../report/navclockEvalReport.ts';
import { instantFromLabel } from '../../time/instant.ts';
import type { TimeSystem } from '../../time/timeSystem.ts';
import type { Rendered } from '../emit.ts';
import { broadcastEvalToHtml } from '../../report/navclockHtml.ts';

export interface NavEvalArgs {
  nav: string;
  precise?: string;
  orbit?: string;
  system?: string;
}

function readSp3File(path: string, flag: string): Sp3File {
  const text = readHeadLines(path, 'orbit', flag, 1).join('');
  if (!/^#[cd]/.test(text)) throw new InputError(`${path} is not an SP3-c or SP3-d file`, flag, 'give an SP3 file of precise orbits and clocks (RINEX clock files are not read yet)');
  return readSp3(path, flag);
}

/** Precise clock series (SP3 clock column, µs → s) of the satellites of the wanted systems. */
function preciseFromSp3(file: Sp3File, systems: readonly NavSystem[]): PreciseClockSeries[] {
  if (file.timeScale === 'UTC') throw new InputError(`SP3 time system ${file.timeSystemCode}`, file.fileName, 'give an SP3 file in GPS or Galileo time');
  const letters: string[] = systems.map((s) => (s === 'gps' ? 'G' : 'E'));
  const ids = file.satelliteIds.filter((id) => letters.includes(id[0]));
  const scale = file.timeScale;
  const series = new Map<string, { t: number[]; c: number[] }>(ids.map((id) => [id, { t: [], c: [] }]));
  for (const ep of file.epochs) {
    const t = instantFromLabel(scale, ep.labelWholeS, ep.labelFracS).ttJ2000S;
    for (const [id, rec] of ep.records) {
      const s = series.get(id);
      if (s === undefined || rec.clockUs === null || rec.clockEvent) continue;
      s.t.push(t);
      s.c.push(rec.clockUs * 1e-6);
    }
  }
  return [...series.entries()].map(([satellite, s]) => ({ satellite, ttJ2000S: s.t, clockS: s.c }));
}

export function computeNavEval(a: NavEvalArgs, ts: TimeSystem): { result: BroadcastEvalResult; meta: BroadcastEvalMeta } {
  if (a.precise === undefined) throw new InputError('--nav without --precise', '--precise', 'give the precise clocks (SP3) of the same day');
  if (a.orbit === undefined) throw new InputError('--nav without --orbit', '--orbit', 'give the precise orbit (SP3) for the −2 r·v/c² term; it may be the same file as --precise');
  const systems: NavSystem[] = a.system === undefined ? ['gps', 'galileo'] : [a.system as NavSystem];
  const nav = readRinexNav(a.nav, '--nav', ts);
  const preciseFile = readSp3File(a.precise, '--precise');
  const orbitFile = a.orbit === a.precise ? preciseFile : readSp3File(a.orbit, '--orbit');
  const trajectories = new Map<string, Sp3Trajectory | null>();
  const periodicS = (sat: string, t: number): number | null => {
    let tr = trajectories.get(sat);
    if (tr === undefined) {
      tr = orbitFile.satelliteIds.includes(sat) ? new Sp3Trajectory(orbitFile, sat, ts) : null;
      trajectories.set(sat, tr);
    }
    if (tr === null || t < tr.validFromTtJ2000S || t > tr.validToTtJ2000S) return null;
    try {
      const s = tr.stateAt(t);
      return conventionalPeriodicS(s.positionM[0], s.positionM[1], s.positionM[2], s.velocityMPerS[0], s.velocityMPerS[1], s.velocityMPerS[2]);
    } catch (e) {
      if (e instanceof InputError) return null; // a gap or manoeuvre in the orbit: that epoch is left out
      throw e;
    }
  };
  const result = evaluateBroadcastClocks({ records: nav.records, precise: preciseFromSp3(preciseFile, systems), periodicS, systems, navFile: a.nav, preciseFile: a.precise });
  const skipped = Object.entries(nav.skippedOtherSystems).map(([s, n]) => `${n} ${s}`).join(', ');
  const notes = [
    `${a.nav}: RINEX ${nav.version.toFixed(2)}, ${nav.records.length} GPS and Galileo records read${skipped.length > 0 ? `; records of other systems skipped: ${skipped}` : ''}${nav.skippedIncomplete > 0 ? `; ${nav.skippedIncomplete} GPS/Galileo records with a missing field skipped (first at line ${nav.firstIncompleteLine})` : ''}`,
    `${result.unmatched} satellite-epochs without a usable broadcast record or orbit state; ${result.droppedLoneEpochs} dropped (alone in their system at that epoch); ${result.unhealthyRecords} unhealthy records not used`,
  ];
  return {
    result,
    meta: { navFile: a.nav, preciseFile: a.precise, orbitFile: a.orbit, preciseAgency: preciseFile.agency, systems, notes },
  };
}

export function runNavEval(a: NavEvalArgs, ts: TimeSystem): Rendered {
  const { result, meta } = computeNavEval(a, ts);
  return { html: () => broadcastEvalToHtml(result, meta), json: () => broadcastEvalToJson(result, meta), csv: () => broadcastEvalToCsv(result), text: () => broadcastEvalToText(result, meta) };
}
