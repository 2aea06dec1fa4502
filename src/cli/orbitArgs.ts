/**
 * Orbit given on the command line: Keplerian flags, a TLE, OMM or OEM file, or a scenario
 * satellite. The files are read here (src/io); the library (src/api) builds the trajectory.
 */
import type { Argv } from 'yargs';
import type { OrbitInput } from '../api/size.ts';
import { InputError } from '../errors.ts';
import { loadScenario, scenarioSatellite } from '../io/loadScenario.ts';
import { oemTrajectory, pickElementSet, readElementSets } from '../io/orbitSources.ts';
import type { TimeSystem } from '../time/timeSystem.ts';

export function orbitOptions<T>(y: Argv<T>) {
  return y
    .option('a-km', { type: 'number', requiresArg: true, describe: 'semi-major axis [km] (osculating)' })
    .option('altitude-km', { type: 'number', requiresArg: true, describe: 'altitude above 6378.137 km [km]; a = 6378.137 + altitude' })
    .option('e', { type: 'number', requiresArg: true, default: 0, describe: 'eccentricity' })
    .option('i-deg', { type: 'number', requiresArg: true, default: 0, describe: 'inclination [deg]' })
    .option('raan-deg', { type: 'number', requiresArg: true, default: 0, describe: 'right ascension of the ascending node [deg]' })
    .option('argp-deg', { type: 'number', requiresArg: true, default: 0, describe: 'argument of perigee [deg]' })
    .option('m-deg', { type: 'number', requiresArg: true, default: 0, describe: 'mean anomaly [deg]' })
    .option('epoch', { type: 'string', requiresArg: true, default: '2027-01-01T00:00:00Z', describe: 'epoch of the elements' })
    .option('tle', { type: 'string', requiresArg: true, describe: 'TLE/3LE file' })
    .option('omm', { type: 'string', requiresArg: true, describe: 'CCSDS OMM file (JSON, KVN or XML)' })
    .option('oem', { type: 'string', requiresArg: true, describe: 'CCSDS OEM file (KVN; --sat names the object when it holds several)' })
    .option('scenario', { type: 'string', requiresArg: true, describe: 'scenario file (JSON or YAML)' })
    .option('sat', { type: 'string', requiresArg: true, describe: 'satellite: catalogue number, TLE name or scenario id' });
}

export interface OrbitFlags {
  aKm?: number;
  altitudeKm?: number;
  e: number;
  iDeg: number;
  raanDeg: number;
  argpDeg: number;
  mDeg: number;
  epoch: string;
  tle?: string;
  omm?: string;
  oem?: string;
  scenario?: string;
  sat?: string;
}

/** The one orbit the flags give, its files read; faults name the flags. */
export function orbitFromFlags(a: OrbitFlags, ts: TimeSystem): OrbitInput {
  const fileSources = [a.tle, a.omm, a.oem, a.scenario].filter((x) => x !== undefined).length;
  const hasElements = a.aKm !== undefined || a.altitudeKm !== undefined;
  if (a.aKm !== undefined && a.altitudeKm !== undefined) {
    throw new InputError('both --a-km and --altitude-km given', '--a-km/--altitude-km', 'give one of them');
  }
  if (fileSources > 1 || (fileSources === 1 && hasElements)) {
    throw new InputError('more than one orbit given', '--a-km/--altitude-km/--tle/--omm/--oem/--scenario', 'give exactly one orbit source');
  }
  if (fileSources === 0 && !hasElements) {
    throw new InputError('no orbit given', 'command line', 'give --a-km or --altitude-km (with --e, --i-deg ...), or --tle, --omm, --oem or --scenario with --sat');
  }
  if (a.tle !== undefined || a.omm !== undefined) {
    const kind = a.tle !== undefined ? 'tle' : 'omm';
    const file = (a.tle ?? a.omm) as string;
    return pickElementSet(readElementSets(file, kind, `--${kind}`), a.sat, file);
  }
  if (a.oem !== undefined) {
    const trajectory = oemTrajectory(a.oem, a.sat, ts, '--oem');
    return { trajectory, name: trajectory.id };
  }
  if (a.scenario !== undefined) {
    const scenario = loadScenario(a.scenario, ts, '--scenario');
    return { satellite: scenarioSatellite(scenario, a.sat), scenario };
  }
  const elements = { e: a.e, iDeg: a.iDeg, raanDeg: a.raanDeg, argpDeg: a.argpDeg, mDeg: a.mDeg, epoch: a.epoch };
  return a.aKm !== undefined ? { aKm: a.aKm, ...elements } : { altitudeKm: a.altitudeKm as number, ...elements };
}
