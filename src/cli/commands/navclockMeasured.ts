/**
 * `tauplan navclock --measurements FILE --orbit FILE [--sat ID]`: the operator's workflow — estimate
 * the clock from measured offsets (the `fit` estimator, with −2 r·v/c² along the orbit removed), then
 * predict it forward from the last measurement and generate the parameter sets.
 * The orbit file is a TLE/3LE, a CCSDS OMM or an SP3 file (gzip accepted for SP3). The files are
 * read here; the library (src/api/navclock.ts) fits, predicts and makes the sets.
 */
import { runNavClockFromMeasurements, sp3Trajectory, type NavClockRun } from '../../api/navclock.ts';
import { InputError } from '../../errors.ts';
import { parseMeasurementsCsv } from '../../io/measurements.ts';
import { labelOf, pickElementSet, readElementSets, readTextFile, sgp4Trajectory } from '../../io/orbitSources.ts';
import { readSp3File } from '../../io/sp3.ts';
import { readHeadLines } from '../../io/textSource.ts';
import type { TimeSystem } from '../../time/timeSystem.ts';
import { navClockSetOptions, type NavclockArgs } from './navclock.ts';

/** The orbit of --orbit: SP3 (by its `#c`/`#d` start), OMM (by its keywords or markup), else TLE. */
function orbitFromFile(path: string, sat: string | undefined, ts: TimeSystem, fromTt: number, toTt: number) {
  const text = readHeadLines(path, 'orbit', '--orbit', 60).join('\n');
  if (/^#[cd]/.test(text)) {
    const file = readSp3File(path, '--orbit');
    const id = sat ?? (file.satelliteIds.length === 1 ? file.satelliteIds[0] : undefined);
    if (id === undefined) throw new InputError(`${path} holds ${file.satelliteIds.length} satellites`, '--sat', `name one with --sat, e.g. ${file.satelliteIds.slice(0, 4).join(', ')}`);
    if (!file.satelliteIds.includes(id)) throw new InputError(`satellite ${JSON.stringify(id)} is not in ${path}`, '--sat', `use one of ${file.satelliteIds.slice(0, 8).join(', ')}`);
    return { trajectory: sp3Trajectory(file, id, { timeSystem: ts }), id };
  }
  const kind = /CCSDS_OMM|^\s*[{<[]/.test(text) ? 'omm' : 'tle';
  const rec = pickElementSet(readElementSets(path, kind, '--orbit'), sat, path);
  return { trajectory: sgp4Trajectory(rec, ts, { fromTtJ2000S: fromTt, toTtJ2000S: toTt }, sat), id: sat ?? labelOf(rec) };
}

/** Fit the measured clock, predict it forward, and make the sets. */
export function computeNavclockMeasured(a: NavclockArgs & { measurements: string; orbit?: string }, ts: TimeSystem): NavClockRun {
  if (a.orbit === undefined) throw new InputError('--measurements without --orbit', '--orbit', 'give the orbit of the measured satellite (TLE, OMM or SP3) for the −2 r·v/c² term');
  const data = parseMeasurementsCsv(readTextFile(a.measurements, '--measurements', 'measurements'), a.measurements, ts);
  const first = data.rows[0].ttJ2000S;
  const last = data.rows[data.rows.length - 1].ttJ2000S;
  const { trajectory, id } = orbitFromFile(a.orbit, a.sat, ts, first, last);
  return runNavClockFromMeasurements({ rows: data.rows, measurementsName: a.measurements, trajectory, orbitName: a.orbit, satellite: id }, navClockSetOptions(a, ts));
}
