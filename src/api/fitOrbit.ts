/**
 * The orbit of a measured clock for `fit` (the library reads the orbit file, as loadScenario reads
 * a scenario): `--orbit FILE` (SP3, TLE/3LE, OMM or a scenario; the
 * kind is read from the content), the older `--scenario FILE`, or the SP3 file whose clock column
 * is being fitted. Returns null when there is none.
 */
import { gravityModel, type GravityModel } from '../orbit/gravity.ts';
import { InputError } from '../errors.ts';
import type { ClockFile } from '../io/clockReader.ts';
import { loadScenario, scenarioSatellite } from '../io/loadScenario.ts';
import type { OmmRecord } from '../io/omm.ts';
import { idOf, oemTrajectory, pickElementSet, readElementSets, sgp4Span } from '../io/orbitSources.ts';
import { readSp3File, type Sp3File } from '../io/sp3.ts';
import type { Sp3ClockFile } from '../io/sp3Clock.ts';
import { readHeadLines } from '../io/textSource.ts';
import type { TleRecord } from '../io/tle.ts';
import { trajectoryForSatellite } from '../io/orbitSources.ts';
import { Sgp4Trajectory } from '../orbit/sgp4.ts';
import { Sp3Trajectory } from '../orbit/sp3.ts';
import type { Trajectory } from '../orbit/trajectory.ts';
import type { TimeSystem } from '../time/timeSystem.ts';
import { scenarioGravity } from '../plan/scenarioRuns.ts';

/** An orbit for the fit, with the gravity model to integrate the clock rate in. */
export interface FitOrbit {
  trajectory: Trajectory;
  gravity: GravityModel;
  /** What the orbit came from, for the report. */
  label: string;
  /** Where to point an error about the orbit (file, or scenario file and satellite path). */
  where: string;
}

/** Kind of an orbit file, from its first line. */
export function orbitFileKind(text: string): 'sp3' | 'oem' | 'omm' | 'tle' | 'scenario' {
  const first = text.split('\n', 1)[0].trim();
  if (/^#[cd][PV]/.test(first)) return 'sp3';
  if (/^CCSDS_OEM_VERS/.test(first)) return 'oem';
  if (/^CCSDS_OMM_VERS/.test(first) || /^<\?xml/.test(first) || /"(OBJECT_NAME|MEAN_MOTION)"/.test(text.slice(0, 2000))) return 'omm';
  const lines = text.split('\n').map((l) => l.trim()).filter((l) => l !== '');
  if (lines.some((l, i) => l.startsWith('1 ') && (lines[i + 1] ?? '').startsWith('2 '))) return 'tle';
  return 'scenario';
}

/** A parsed SP3 file (gzip or not), read once per process. */
export function readSp3Orbit(path: string, flag: string): Sp3File {
  return readSp3File(path, flag);
}

/** Orbit flags of `fit`. */
export interface FitOrbitFlags {
  orbit?: string;
  scenario?: string;
  gravity?: string;
}

/**
 * The orbit of clock `clock` (a satellite id; for a CSV the `--sat` of the orbit file), over
 * [from, to], or null when no orbit is given and the file is not an SP3.
 */
export function fitOrbit(a: FitOrbitFlags, clock: string | undefined, file: ClockFile | null, ts: TimeSystem, fromTt: number, toTt: number): FitOrbit | null {
  const gravityName = a.gravity ?? 'zonal';
  const span = { fromTtJ2000S: fromTt, toTtJ2000S: Math.max(toTt, fromTt + 60) };
  if (a.orbit !== undefined && a.scenario !== undefined) throw new InputError('both --orbit and --scenario given', '--orbit/--scenario', 'give one orbit source');
  const path = a.orbit ?? a.scenario;
  if (path === undefined) {
    if (file !== null && file.format === 'sp3' && clock !== undefined) {
      const sp3 = (file as Sp3ClockFile).sp3;
      try {
        return { trajectory: new Sp3Trajectory(sp3, clock, ts), gravity: gravityModel(gravityName), label: `the SP3 file itself (${sp3.fileName})`, where: sp3.fileName };
      } catch (e) {
        // The clock column is still worth fitting when the orbit is too short to interpolate.
        if (e instanceof InputError) return null;
        throw e;
      }
    }
    return null;
  }
  const flag = a.orbit !== undefined ? '--orbit' : '--scenario';
  const kind = a.scenario !== undefined ? 'scenario' : orbitFileKind(readHeadLines(path, 'orbit', flag, 60).join('\n').slice(0, 4000));
  switch (kind) {
    case 'sp3': {
      const sp3 = readSp3Orbit(path, flag);
      if (clock === undefined || !sp3.satelliteIds.includes(clock)) {
        throw new InputError(`satellite ${JSON.stringify(clock ?? '')} is not in the SP3 orbit ${path}`, '--sat', `use one of ${sp3.satelliteIds.slice(0, 30).join(', ')}`);
      }
      return { trajectory: new Sp3Trajectory(sp3, clock, ts), gravity: gravityModel(gravityName), label: `SP3 ${path}`, where: path };
    }
    case 'oem':
      return { trajectory: oemTrajectory(path, clock, ts, flag), gravity: gravityModel(gravityName), label: `OEM ${path}`, where: path };
    case 'tle':
    case 'omm': {
      const recs: (TleRecord | OmmRecord)[] = readElementSets(path, kind, flag);
      const rec = pickElementSet(recs, clock, path);
      const trajectory = new Sgp4Trajectory(rec, ts, { id: idOf(rec), spanFor: (epoch) => sgp4Span(epoch, span) });
      return { trajectory, gravity: gravityModel(gravityName), label: `${kind.toUpperCase()} ${path}`, where: path };
    }
    default: {
      const scenario = loadScenario(path, ts, flag);
      const gravity = scenarioGravity(scenario, ts, path);
      const sat = scenarioSatellite(scenario, clock);
      const resolved = trajectoryForSatellite(sat, scenario, ts, gravity, span);
      return { trajectory: resolved.trajectory, gravity, label: `scenario ${path} (${sat.id})`, where: `${path} ${sat.path}` };
    }
  }
}
