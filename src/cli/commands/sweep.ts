/** `tauplan sweep [--from-km --to-km --points --e --i-deg --gravity --epoch]`. */
import type { Argv } from 'yargs';
import { runSweep as sweepAltitudes, type SweepRun } from '../../api/sweep.ts';
import type { GravityModelName } from '../../model/scenario.ts';
import { sweepToCsv, sweepToJson, sweepToText } from '../../report/analysisReports.ts';
import { page, sweepSection } from '../../report/htmlReport.ts';
import type { TimeSystem } from '../../time/timeSystem.ts';
import type { Rendered } from '../emit.ts';

export function sweepOptions<T>(y: Argv<T>) {
  return y
    .option('from-km', { type: 'number', requiresArg: true, default: 300, describe: 'lowest altitude [km]' })
    .option('to-km', { type: 'number', requiresArg: true, default: 40000, describe: 'highest altitude [km]' })
    .option('points', { type: 'number', requiresArg: true, default: 200, describe: 'number of altitudes' })
    .option('e', { type: 'number', requiresArg: true, default: 0, describe: 'eccentricity' })
    .option('i-deg', { type: 'number', requiresArg: true, default: 0, describe: 'inclination [deg]' })
    .option('gravity', { type: 'string', requiresArg: true, default: 'zonal', describe: 'point | j2 | zonal' })
    .option('epoch', { type: 'string', requiresArg: true, default: '2027-01-01T00:00:00Z', describe: 'epoch of the orbits' });
}

export interface SweepArgs {
  fromKm: number;
  toKm: number;
  points: number;
  e: number;
  iDeg: number;
  gravity: string;
  epoch: string;
}

/** The sweep of the flags (also a part of `report`). */
export function computeSweep(a: SweepArgs, ts: TimeSystem): SweepRun {
  return sweepAltitudes({ timeSystem: ts, fromKm: a.fromKm, toKm: a.toKm, points: a.points, e: a.e, iDeg: a.iDeg, gravity: a.gravity as GravityModelName, epoch: a.epoch });
}

export function runSweep(a: SweepArgs, ts: TimeSystem): Rendered {
  const { result, meta } = computeSweep(a, ts);
  return {
    json: () => sweepToJson(result, meta),
    csv: () => sweepToCsv(result),
    text: () => sweepToText(result, meta),
    html: () => page('tauplan — clock rate against altitude', `gravity ${meta.gravity}, e = ${meta.e}, i = ${meta.iDeg}°`, [], [sweepSection(result, meta.gravity)]),
  };
}
