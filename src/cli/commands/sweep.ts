/** `tauplan sweep [--from-km --to-km --points --e --i-deg --gravity --epoch]`. */
import type { Argv } from 'yargs';
import { runSweep as sweepAltitudes, type SweepRun } from '../../api/sweep.ts';
import type { GravityModelName } from '../../model/scenario.ts';
import { sweepToCsv, sweepToJson, sweepToText } from '../../report/analysisReports.ts';
import { page, sweepSection } from '../../report/htmlReport.ts';
import type { TimeSystem } from '../../time/timeSystem.ts';
import type { Rendered } from '../emit.ts';
import { runLunarSweep } from '../../api/lunarSweep.ts';
import type { LunarForceModelName } from '../../api/lunarSize.ts';
import { lunarSweepToCsv, lunarSweepToJson, lunarSweepToText } from '../../report/lunarSweepReport.ts';
import { bodyFlag } from '../options.ts';

export function sweepOptions<T>(y: Argv<T>) {
  return y
    .option('from-km', { type: 'number', requiresArg: true, describe: 'lowest altitude [km] (default 300; 50 with --body moon)' })
    .option('to-km', { type: 'number', requiresArg: true, describe: 'highest altitude [km] (default 40000; 10000 with --body moon)' })
    .option('points', { type: 'number', requiresArg: true, describe: 'number of altitudes (default 200; 40 with --body moon)' })
    .option('body', { type: 'string', requiresArg: true, default: 'earth', describe: 'earth | moon: orbits about the Moon, altitude above the 1737.4 km sphere' })
    .option('lunar-forces', { type: 'string', requiresArg: true, default: 'point', describe: 'with --body moon: point (two-body) | full (J2, C22, Earth, Sun)' })
    .option('e', { type: 'number', requiresArg: true, default: 0, describe: 'eccentricity' })
    .option('i-deg', { type: 'number', requiresArg: true, default: 0, describe: 'inclination [deg]' })
    .option('gravity', { type: 'string', requiresArg: true, default: 'zonal', describe: 'point | j2 | zonal' })
    .option('epoch', { type: 'string', requiresArg: true, default: '2027-01-01T00:00:00Z', describe: 'epoch of the orbits' });
}

export interface SweepArgs {
  fromKm?: number;
  toKm?: number;
  points?: number;
  body?: string;
  lunarForces?: string;
  e: number;
  iDeg: number;
  gravity: string;
  epoch: string;
}

/** The sweep of the flags (also a part of `report`). */
export function computeSweep(a: SweepArgs, ts: TimeSystem): SweepRun {
  return sweepAltitudes({ timeSystem: ts, fromKm: a.fromKm ?? 300, toKm: a.toKm ?? 40000, points: a.points ?? 200, e: a.e, iDeg: a.iDeg, gravity: a.gravity as GravityModelName, epoch: a.epoch });
}

export function runSweep(a: SweepArgs, ts: TimeSystem): Rendered {
  const body = bodyFlag(a.body);
  if (body === 'moon') {
    const lunar = runLunarSweep({ timeSystem: ts, fromKm: a.fromKm, toKm: a.toKm, points: a.points, e: a.e, iDeg: a.iDeg, gravity: a.gravity as GravityModelName, lunarForces: a.lunarForces as LunarForceModelName, epoch: a.epoch });
    return {
      json: () => lunarSweepToJson(lunar.result, lunar.meta),
      csv: () => lunarSweepToCsv(lunar.result),
      text: () => lunarSweepToText(lunar.result),
      html: () => page('tauplan — clock rate against altitude above the Moon', `e = ${lunar.meta.e}, i = ${lunar.meta.iDeg}°`, [], [{ heading: 'Rate against altitude above the Moon', intro: lunarSweepToText(lunar.result) }]),
    };
  }
  const { result, meta } = computeSweep(a, ts);
  return {
    json: () => sweepToJson(result, meta),
    csv: () => sweepToCsv(result),
    text: () => sweepToText(result, meta),
    html: () => page('tauplan — clock rate against altitude', `gravity ${meta.gravity}, e = ${meta.e}, i = ${meta.iDeg}°`, [], [sweepSection(result, meta.gravity)]),
  };
}
