/**
 * `tauplan navclock --measurements FILE --orbit FILE [--sat ID]`: the operator's workflow — estimate
 * the clock from measured offsets (the `fit` estimator, with −2 r·v/c² along the orbit removed), then
 * predict it forward from the last measurement and generate the parameter sets.
 * The orbit file is a TLE/3LE, a CCSDS OMM or an SP3 file (gzip accepted for SP3).
 */
import { conventionalPeriodicS } from '../../clock/rate.ts';
import { InputError } from '../../errors.ts';
import { parseMeasurementsCsv } from '../../io/measurements.ts';
import { labelOf, pickElementSet, readElementSets, readTextFile, sgp4Trajectory } from '../../io/orbitSources.ts';
import { readSp3File } from '../../io/sp3.ts';
import { readHeadLines } from '../../io/textSource.ts';
import { Sp3Trajectory } from '../../orbit/sp3.ts';
import type { Trajectory } from '../../orbit/trajectory.ts';
import { fitClock } from '../../plan/fit.ts';
import { navigationClockSets, type NavClockResult } from '../../plan/navclock.ts';
import { predictedFromFit } from '../../plan/navclockSources.ts';
import type { NavClockMeta } from '../../report/navclockReport.ts';
import type { TimeSystem } from '../../time/timeSystem.ts';
import { navClockOptionsFrom, type NavclockArgs } from './navclock.ts';

const DAY_S = 86_400;

/** The orbit of --orbit: SP3 (by its `#c`/`#d` start), OMM (by its keywords or markup), else TLE. */
function orbitFromFile(path: string, sat: string | undefined, ts: TimeSystem, fromTt: number, toTt: number): { trajectory: Trajectory; id: string } {
  const text = readHeadLines(path, 'orbit', '--orbit', 60).join('\n');
  if (/^#[cd]/.test(text)) {
    const file = readSp3File(path, '--orbit');
    const id = sat ?? (file.satelliteIds.length === 1 ? file.satelliteIds[0] : undefined);
    if (id === undefined) throw new InputError(`${path} holds ${file.satelliteIds.length} satellites`, '--sat', `name one with --sat, e.g. ${file.satelliteIds.slice(0, 4).join(', ')}`);
    if (!file.satelliteIds.includes(id)) throw new InputError(`satellite ${JSON.stringify(id)} is not in ${path}`, '--sat', `use one of ${file.satelliteIds.slice(0, 8).join(', ')}`);
    return { trajectory: new Sp3Trajectory(file, id, ts), id };
  }
  const kind = /CCSDS_OMM|^\s*[{<[]/.test(text) ? 'omm' : 'tle';
  const rec = pickElementSet(readElementSets(path, kind, '--orbit'), sat, path);
  return { trajectory: sgp4Trajectory(rec, ts, { fromTtJ2000S: fromTt, toTtJ2000S: toTt }, sat), id: sat ?? labelOf(rec) };
}

/** Fit the measured clock, predict it forward, and make the sets. */
export function computeNavclockMeasured(a: NavclockArgs & { measurements: string; orbit?: string }, ts: TimeSystem): { result: NavClockResult; meta: NavClockMeta } {
  if (a.orbit === undefined) throw new InputError('--measurements without --orbit', '--orbit', 'give the orbit of the measured satellite (TLE, OMM or SP3) for the −2 r·v/c² term');
  const data = parseMeasurementsCsv(readTextFile(a.measurements, '--measurements', 'measurements'), a.measurements, ts);
  const first = data.rows[0].ttJ2000S;
  const last = data.rows[data.rows.length - 1].ttJ2000S;
  const { trajectory, id } = orbitFromFile(a.orbit, a.sat, ts, first, last);
  if (first < trajectory.validFromTtJ2000S || last > trajectory.validToTtJ2000S) {
    throw new InputError(`the measurements (${data.rows.length} rows) reach outside the orbit's span`, '--orbit', `give an orbit that covers ${a.measurements}`);
  }
  const periodicNs = (t: number): number => {
    const s = trajectory.stateAt(t);
    return conventionalPeriodicS(s.positionM[0], s.positionM[1], s.positionM[2], s.velocityMPerS[0], s.velocityMPerS[1], s.velocityMPerS[2]) * 1e9;
  };
  const fit = fitClock(data.rows, { degree: data.rows.length > 3 ? 2 : 1, timeSystem: ts, epochTtJ2000S: last, periodicNs, sourceName: a.measurements });
  const from = a.from === undefined ? last : ts.parse(a.from, '--from').ttJ2000S;
  const to = a.to === undefined ? from + DAY_S : ts.parse(a.to, '--to').ttJ2000S;
  if (!(to > from)) throw new InputError('the window ends before it starts', '--to', 'give an end after the start');
  const options = navClockOptionsFrom(a, ts, from, to);
  const result = navigationClockSets([predictedFromFit(id, fit, to)], options);
  return {
    result,
    meta: {
      source: `clock fit to ${a.measurements} (${fit.used} of ${data.rows.length} rows, degree ${fit.degree}, RMS ${fit.rmsNs.toFixed(3)} ns, −2 r·v/c² from ${a.orbit} removed), predicted from ${fit.epoch}`,
      bandRule: '±1.96 σ of the fitted polynomial extrapolated to that age (parameter covariance), combined with the fit residual RMS; no noise model',
      notes: fit.rejected.length > 0 ? [`${fit.rejected.length} measurement rows rejected by the fit's clipping`] : [],
    },
  };
}
