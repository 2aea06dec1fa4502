/**
 * The orbit factory: turns a scenario satellite, or command-line flags, into a Trajectory.
 * This is the edge: it reads TLE, OMM and SP3 files. Everything after it sees only Trajectory.
 */
import type { GravityModel } from '../orbit/gravity.ts';
import { InputError } from '../errors.ts';
import { elementsFromDegKm, type KeplerianElements } from '../orbit/keplerian.ts';
import { Sgp4Trajectory } from '../orbit/sgp4.ts';
import { gmstRadAtTt, Sp3Trajectory } from '../orbit/sp3.ts';
import { OemTrajectory, oemSegmentsOf } from '../orbit/oem.ts';
import type { OemFile } from '../model/oem.ts';
import { Instant } from '../time/instant.ts';
import { parseOemLines } from './oem.ts';
import { trajectoryFromKeplerian, trajectoryFromStateVector } from '../orbit/stateVector.ts';
import { lunarForces, lunarOrbitFromElements, lunarOrbitFromState } from '../orbit/lunarOrbitInput.ts';
import type { Trajectory } from '../orbit/trajectory.ts';
import type { TimeSystem } from '../time/timeSystem.ts';
import { readLinesSync, readTextWhole, type InputKind } from './textSource.ts';
import { parseOmmFile, ommFromObject, type OmmRecord } from './omm.ts';
import type { SatelliteSpec, ScenarioSpec } from './scenario.ts';
import { readSp3File, type Sp3File } from './sp3.ts';
import { parseTleFile, parseTleLines, type TleRecord } from './tle.ts';

/** A span of interest, seconds since J2000.0 TT. */
export interface Span {
  fromTtJ2000S: number;
  toTtJ2000S: number;
}

/** A trajectory, and for element-based sources a way to rebuild it with a changed semi-major axis. */
export interface ResolvedOrbit {
  trajectory: Trajectory;
  /** Display name (TLE name line, OMM OBJECT_NAME, scenario name), or the id. */
  name: string;
  rebuildWithDeltaAKm?: (deltaAKm: number) => Trajectory;
}

/** The whole text of a file ({@link readTextWhole} with the arguments in the older order). */
export function readTextFile(path: string, where: string, kind: InputKind = 'text'): string {
  return readTextWhole(path, kind, where);
}

/** SGP4 span: the wanted span, widened to hold the element-set epoch, so sizing from the epoch works. */
export function sgp4Span(epochTt: number, span: Span): Span {
  return { fromTtJ2000S: Math.min(span.fromTtJ2000S, epochTt), toTtJ2000S: Math.max(span.toTtJ2000S, epochTt) };
}

/** SGP4 trajectory from a parsed element set, its span covering `span`. */
export function sgp4Trajectory(rec: TleRecord | OmmRecord, ts: TimeSystem, span: Span | null, id?: string): Sgp4Trajectory {
  const idOption = id === undefined ? {} : { id };
  if (span === null) return new Sgp4Trajectory(rec, ts, idOption);
  return new Sgp4Trajectory(rec, ts, { ...idOption, spanFor: (epoch) => sgp4Span(epoch, span) });
}

/** Find one record in an element-set file by catalogue number, name or OMM id. */
export function pickElementSet<T extends TleRecord | OmmRecord>(records: T[], sat: string | undefined, file: string): T {
  if (sat === undefined) {
    if (records.length === 1) return records[0];
    throw new InputError(`${file} holds ${records.length} satellites`, '--sat', 'name one with --sat (catalogue number or name), or use --all');
  }
  const wanted = sat.trim();
  const all = records.filter((r) => matchesElementSet(r, wanted));
  if (all.length > 1) {
    // Two element sets of one satellite (or one name): which to use is the user's choice, not ours.
    const listed = all.slice(0, 4).map((r) => `${labelOf(r)} epoch ${civilIso(r.epochUtc)}`).join('; ');
    throw new InputError(`${all.length} element sets in ${file} match ${JSON.stringify(sat)} (${listed}${all.length > 4 ? '; …' : ''})`, '--sat', 'keep one element set per satellite in the file (usually the newest), or give a catalogue number that is unique');
  }
  const found = all[0];
  if (found === undefined) {
    const some = records.slice(0, 5).map(labelOf).join(', ');
    throw new InputError(`no satellite ${JSON.stringify(sat)} in ${file}`, '--sat', `use a catalogue number or name from the file (e.g. ${some})`);
  }
  return found;
}

/** A UTC civil time as ISO 8601 to the second. */
function civilIso(c: { year: number; month: number; day: number; hour: number; minute: number; second: number }): string {
  const p = (n: number, w = 2): string => String(n).padStart(w, '0');
  return `${p(c.year, 4)}-${p(c.month)}-${p(c.day)}T${p(c.hour)}:${p(c.minute)}:${p(Math.floor(c.second))}Z`;
}

function matchesElementSet(r: TleRecord | OmmRecord, wanted: string): boolean {
  if (r.kind === 'tle') return r.catalogNumber.trim() === wanted || String(r.catalogNumberValue) === wanted.replace(/^0+/, '') || (r.name ?? '').trim() === wanted;
  return String(r.noradCatId ?? '') === wanted.replace(/^0+/, '') || (r.objectName ?? '') === wanted || (r.objectId ?? '') === wanted;
}

/** Display label of an element set. */
export function labelOf(r: TleRecord | OmmRecord): string {
  if (r.kind === 'tle') return r.name ?? r.catalogNumber.trim();
  return r.objectName ?? r.objectId ?? String(r.noradCatId ?? '?');
}

/** Stable id of an element set (catalogue number when there is one). */
export function idOf(r: TleRecord | OmmRecord): string {
  if (r.kind === 'tle') return String(r.catalogNumberValue);
  return r.noradCatId !== null && r.noradCatId !== undefined ? String(r.noradCatId) : (r.objectId ?? r.objectName ?? 'omm');
}

/** All element sets of a TLE or OMM file. */
export function readElementSets(path: string, kind: 'tle' | 'omm', flag: string): (TleRecord | OmmRecord)[] {
  // TLE streams line by line; OMM (XML, JSON, KVN) is one document for its parser.
  if (kind === 'tle') return parseTleLines(readLinesSync(path, 'elements', flag), path);
  return parseOmmFile(readTextWhole(path, 'elements', flag), path);
}

/** Padding of computed trajectories beyond the requested span [s]. */
export const SPAN_PAD_S = 120;

function readSp3(path: string, where: string): Sp3File {
  return readSp3File(path, where);
}

/** Read and parse every SP3 file a scenario names now, so that resolving its orbits reads nothing. */
export function preloadScenarioFiles(scenario: ScenarioSpec): void {
  for (const sat of scenario.satellites) {
    if (sat.orbit.kind === 'sp3') readSp3(sat.orbit.resolvedFile, `${scenario.fileName} ${sat.path}.orbit.sp3.file`);
  }
}

const oemCache = new Map<string, OemFile>();

/** A CCSDS OEM (KVN, gzip or not), parsed once per process. */
export function readOem(path: string, where: string, ts: TimeSystem): OemFile {
  let f = oemCache.get(path);
  if (f === undefined) {
    f = parseOemLines(readLinesSync(path, 'orbit', where), path, ts);
    oemCache.set(path, f);
  }
  return f;
}

/** One object of an OEM as a trajectory (object: OBJECT_NAME or OBJECT_ID; undefined for the only one). */
export function oemTrajectory(path: string, object: string | undefined, ts: TimeSystem, where: string, id?: string): OemTrajectory {
  const file = readOem(path, where, ts);
  const segments = oemSegmentsOf(file, object, where);
  return new OemTrajectory(file, id ?? segments[0].objectName, segments, {
    jdUtcAt: (t) => ts.jdUtcFromTtJ2000S(t),
    gmstRadAt: (t) => gmstRadAtTt(ts, t),
    format: (t) => ts.format(Instant.fromTtJ2000S(t)),
  });
}

/** Keplerian elements of a scenario satellite. */
function scenarioElements(sat: SatelliteSpec, deltaAKm: number): KeplerianElements {
  const o = sat.orbit;
  if (o.kind !== 'keplerian') throw new InputError('not a Keplerian orbit', sat.path, 'internal');
  return elementsFromDegKm(
    { epochTtJ2000S: o.epoch.ttJ2000S, aKm: o.aKm + deltaAKm, e: o.e, iDeg: o.iDeg, raanDeg: o.raanDeg, argpDeg: o.argpDeg, meanAnomalyDeg: o.meanAnomalyDeg },
    { a: `${sat.path}.orbit.keplerian.aKm`, e: `${sat.path}.orbit.keplerian.e` },
  );
}

/** The trajectory of one scenario satellite over `span` (its validity covers at least the span). */
export function trajectoryForSatellite(sat: SatelliteSpec, scenario: ScenarioSpec, ts: TimeSystem, gravity: GravityModel, wanted: Span): ResolvedOrbit {
  const o = sat.orbit;
  // A little room either side: light time at a pass at the window edge looks ~0.1 s back.
  const span = { fromTtJ2000S: wanted.fromTtJ2000S - SPAN_PAD_S, toTtJ2000S: wanted.toTtJ2000S + SPAN_PAD_S };
  const name = sat.name ?? sat.id;
  switch (o.kind) {
    case 'tle': {
      const [rec] = parseTleFile(o.text, `${scenario.fileName} ${sat.path}.orbit.tle`);
      return { trajectory: sgp4Trajectory(rec, ts, span, sat.id), name };
    }
    case 'omm': {
      const rec = ommFromObject(o.fields, `${scenario.fileName} ${sat.path}.orbit.omm`);
      return { trajectory: sgp4Trajectory(rec, ts, span, sat.id), name };
    }
    case 'keplerian': {
      const epoch = o.epoch.ttJ2000S;
      const full = { fromTtJ2000S: Math.min(span.fromTtJ2000S, epoch), toTtJ2000S: Math.max(span.toTtJ2000S, epoch) };
      if (o.body === 'moon') {
        const el = { epochTtJ2000S: epoch, aKm: o.aKm, e: o.e, iDeg: o.iDeg, raanDeg: o.raanDeg, argpDeg: o.argpDeg, meanAnomalyDeg: o.meanAnomalyDeg };
        const where = { a: `${scenario.fileName} ${sat.path}.orbit.keplerian.aKm`, e: `${scenario.fileName} ${sat.path}.orbit.keplerian.e` };
        const built = lunarOrbitFromElements(sat.id, el, lunarForces('full'), full, where);
        return { trajectory: built.trajectory, name, rebuildWithDeltaAKm: built.rebuildWithDeltaAKm };
      }
      const build = (d: number): Trajectory => trajectoryFromKeplerian(scenarioElements(sat, d), gravity, full, sat.id);
      return { trajectory: build(0), name, rebuildWithDeltaAKm: build };
    }
    case 'state': {
      const epoch = o.epoch.ttJ2000S;
      if (o.frame === 'LCRS') {
        const km = (v: readonly number[]): [number, number, number] => [v[0] * 1000, v[1] * 1000, v[2] * 1000];
        const full = { fromTtJ2000S: Math.min(span.fromTtJ2000S, epoch), toTtJ2000S: Math.max(span.toTtJ2000S, epoch) };
        return { trajectory: lunarOrbitFromState(sat.id, epoch, { positionM: km(o.positionKm), velocityMPerS: km(o.velocityKmPerS) }, lunarForces('full'), full), name };
      }
      const trajectory = trajectoryFromStateVector({
        id: sat.id,
        epochTtJ2000S: epoch,
        frame: o.frame,
        positionKm: o.positionKm,
        velocityKmPerS: o.velocityKmPerS,
        gravity,
        fromTtJ2000S: Math.min(span.fromTtJ2000S, epoch),
        toTtJ2000S: Math.max(span.toTtJ2000S, epoch),
        jdUtcAtEpoch: ts.jdUtcFromTtJ2000S(epoch),
        where: `${scenario.fileName} ${sat.path}.orbit.state`,
      });
      return { trajectory, name };
    }
    case 'oem':
      return { trajectory: oemTrajectory(o.resolvedFile, o.object ?? undefined, ts, `${scenario.fileName} ${sat.path}.orbit.oem`, sat.id), name };
    case 'sp3': {
      const file = readSp3(o.resolvedFile, `${scenario.fileName} ${sat.path}.orbit.sp3.file`);
      if (!file.satelliteIds.includes(o.id)) {
        const ids = file.satelliteIds.slice(0, 12).join(', ');
        throw new InputError(`satellite ${JSON.stringify(o.id)} is not in ${o.file}`, `${scenario.fileName} ${sat.path}.orbit.sp3.id`, `use an id from the file's "+" list: ${ids}`);
      }
      return { trajectory: new Sp3Trajectory(file, o.id, ts), name };
    }
  }
}
