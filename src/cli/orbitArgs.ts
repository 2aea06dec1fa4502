/** Orbit given on the command line: Keplerian flags, a TLE or OMM file, or a scenario satellite. */
import type { Argv } from 'yargs';
import type { GravityModel } from '../clock/gravity.ts';
import { InputError } from '../errors.ts';
import { elementsFromDegKm, KeplerianTrajectory, type KeplerianElements } from '../orbit/keplerian.ts';
import type { Trajectory } from '../orbit/trajectory.ts';
import type { TimeSystem } from '../time/timeSystem.ts';

export function orbitOptions<T>(y: Argv<T>) {
  return y
    .option('a-km', { type: 'number', describe: 'semi-major axis [km] (osculating)' })
    .option('altitude-km', { type: 'number', describe: 'altitude above 6378.137 km [km]; a = 6378.137 + altitude' })
    .option('e', { type: 'number', default: 0, describe: 'eccentricity' })
    .option('i-deg', { type: 'number', default: 0, describe: 'inclination [deg]' })
    .option('raan-deg', { type: 'number', default: 0, describe: 'right ascension of the ascending node [deg]' })
    .option('argp-deg', { type: 'number', default: 0, describe: 'argument of perigee [deg]' })
    .option('m-deg', { type: 'number', default: 0, describe: 'mean anomaly [deg]' })
    .option('epoch', { type: 'string', default: '2027-01-01T00:00:00Z', describe: 'epoch of the elements' })
    .option('tle', { type: 'string', describe: 'TLE/3LE file' })
    .option('omm', { type: 'string', describe: 'CCSDS OMM file (JSON, KVN or XML)' })
    .option('scenario', { type: 'string', describe: 'scenario file (JSON or YAML)' })
    .option('sat', { type: 'string', describe: 'satellite: catalogue number, TLE name or scenario id' });
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
  scenario?: string;
  sat?: string;
}

export interface ResolvedOrbit {
  trajectory: Trajectory;
  rebuildWithDeltaAKm?: (deltaAKm: number) => Trajectory;
}

/** Span wanted by the caller, given the orbit's epoch (seconds since J2000.0 TT). */
export type SpanFor = (epochTtJ2000S: number) => { fromTtJ2000S: number; toTtJ2000S: number };

export function orbitFromFlags(a: OrbitFlags, ts: TimeSystem, gravity: GravityModel, spanFor: SpanFor): ResolvedOrbit {
  const fileSources = [a.tle, a.omm, a.scenario].filter((x) => x !== undefined).length;
  const hasElements = a.aKm !== undefined || a.altitudeKm !== undefined;
  if (a.aKm !== undefined && a.altitudeKm !== undefined) {
    throw new InputError('both --a-km and --altitude-km given', '--a-km/--altitude-km', 'give one of them');
  }
  if (fileSources > 1 || (fileSources === 1 && hasElements)) {
    throw new InputError('more than one orbit given', '--a-km/--altitude-km/--tle/--omm/--scenario', 'give exactly one orbit source');
  }
  if (fileSources === 0 && !hasElements) {
    throw new InputError('no orbit given', 'command line', 'give --a-km or --altitude-km (with --e, --i-deg ...), or --tle, --omm or --scenario with --sat');
  }
  if (!hasElements) throw new InputError('orbit files are not wired in yet', '--tle/--omm/--scenario', 'use --a-km');
  const aKm = a.aKm ?? 6378.137 + (a.altitudeKm as number);
  const epoch = ts.parse(a.epoch, '--epoch').ttJ2000S;
  const build = (deltaAKm: number): Trajectory => {
    const el = elementsFromDegKm(
      { epochTtJ2000S: epoch, aKm: aKm + deltaAKm, e: a.e, iDeg: a.iDeg, raanDeg: a.raanDeg, argpDeg: a.argpDeg, meanAnomalyDeg: a.mDeg },
      { a: a.aKm !== undefined ? '--a-km' : '--altitude-km', e: '--e' },
    );
    return keplerianTrajectory('flags', el, gravity, spanFor(epoch));
  };
  return { trajectory: build(0), rebuildWithDeltaAKm: build };
}

/** Point-mass: exact two-body; otherwise numerical propagation from the osculating state. */
export function keplerianTrajectory(id: string, el: KeplerianElements, gravity: GravityModel, span: { fromTtJ2000S: number; toTtJ2000S: number }): Trajectory {
  void span;
  return new KeplerianTrajectory(id, el, gravity.gmM3PerS2);
}
