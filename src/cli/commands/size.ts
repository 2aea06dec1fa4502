/** `tauplan size`: frequency-offset sizing for one orbit (or every satellite of a TLE file with --all). */
import type { Argv } from 'yargs';
import { runSize as sizeOne, type SizeOptions } from '../../api/size.ts';
import { GNSS_NOMINAL_HZ } from '../../constants.ts';
import type { GravityModelName } from '../../model/scenario.ts';
import { sizeToCsv, sizeToJson, sizeToText } from '../../report/sizeReport.ts';
import type { TimeSystem } from '../../time/timeSystem.ts';
import type { Rendered } from '../emit.ts';
import { runLunarSize, type LunarForceModelName, type LunarKeep, type LunarSizeOptions, type LunarSizeResult } from '../../api/lunarSize.ts';
import { InputError } from '../../errors.ts';
import { lunarSizeNotes, lunarSizeToCsv, lunarSizeToJson, lunarSizeToText } from '../../report/lunarSizeReport.ts';
import { bodyFlag } from '../options.ts';
import { Instant } from '../../time/instant.ts';
import { page, sizeSection } from '../../report/htmlReport.ts';
import { orbitFromFlags, orbitOptions, type OrbitFlags } from '../orbitArgs.ts';

export function sizeOptions<T>(y: Argv<T>) {
  return orbitOptions(y)
    .option('gravity', { type: 'string', requiresArg: true, default: 'zonal', describe: 'point | j2 | zonal' })
    .option('tides', { type: 'boolean', default: false, describe: 'add the solar and lunar tidal potential (below 1e-15 up to GNSS altitude)' })
    .option('from', { type: 'string', requiresArg: true, describe: 'start of the span (default: the orbit epoch)' })
    .option('span', { type: 'string', requiresArg: true, describe: 'length of the span, e.g. 1d, 36h, P2D (default 1d; one anomalistic month, 27.55 d, with --body moon)' })
    // Clocks about the Moon (src/api/lunarSize.ts).
    .option('body', { type: 'string', requiresArg: true, default: 'earth', describe: 'earth | moon: elements about the Moon (aKm from its centre, altitude above 1737.4 km, angles to the lunar equator)' })
    .option('keep', { type: 'string', requiresArg: true, default: 'TT', describe: 'with --body moon: the rate the recommended frequency keeps, TT | lunar-surface' })
    .option('reference-lat-deg', { type: 'number', requiresArg: true, default: 0, describe: 'with --body moon: selenographic latitude of the lunar surface reference clock [deg]' })
    .option('reference-lon-deg', { type: 'number', requiresArg: true, default: 0, describe: 'with --body moon: selenographic longitude of the reference clock [deg] (0, 0: mean sub-Earth point)' })
    .option('reference-height-m', { type: 'number', requiresArg: true, default: 0, describe: 'with --body moon: height of the reference clock above the 1737.4 km sphere [m]' })
    .option('lunar-forces', { type: 'string', requiresArg: true, default: 'full', describe: 'with --body moon: full (Moon J2, C22, Earth, Sun) | point (two-body about the Moon)' })
    .option('nominal-hz', { type: 'number', requiresArg: true, default: GNSS_NOMINAL_HZ, describe: 'nominal oscillator frequency [Hz]' })
    // Catalogue runs (src/cli/commands/sizeAll.ts).
    .option('all', { type: 'boolean', describe: 'size every satellite of the --tle/--omm file, one row each (csv, jsonl, json, text)' })
    .option('jobs', { type: 'number', requiresArg: true, describe: 'with --all: worker threads (default: available cores; 1 = no worker)' })
    .option('shard', { type: 'string', requiresArg: true, describe: 'with --all: K/N sizes element sets whose 0-based index i has i mod N = K-1' })
    .option('strict', { type: 'boolean', describe: 'with --all: any satellite that cannot be sized fails the run (exit 2)' })
    .option('format', { choices: ['jsonl'] });
}

export interface SizeArgs extends OrbitFlags {
  gravity: string;
  tides?: boolean;
  from?: string;
  span?: string;
  nominalHz: number;
  body?: string;
  keep?: string;
  referenceLatDeg?: number;
  referenceLonDeg?: number;
  referenceHeightM?: number;
  lunarForces?: string;
}

export async function runSize(a: SizeArgs, ts: TimeSystem): Promise<Rendered> {
  const body = bodyFlag(a.body);
  if (body === 'moon' || a.keep !== 'TT') return renderLunar(sizeLunarFromFlags(a, ts, body), ts);
  const options: SizeOptions = { timeSystem: ts, gravity: a.gravity as GravityModelName, tides: a.tides === true, from: a.from, span: a.span ?? '1d', nominalHz: a.nominalHz };
  // The orbit's files are read once the options are checked.
  const result = sizeOne(() => orbitFromFlags(a, ts), options);
  // A scenario satellite or an OEM about the Moon sizes as a lunar clock whatever --body says.
  if ('body' in result && result.body === 'moon') return renderLunar(result as LunarSizeResult, ts);
  return {
    json: () => sizeToJson(result, ts),
    text: () => sizeToText(result, ts),
    csv: () => sizeToCsv([result], ts),
    html: () => page('tauplan — frequency-offset sizing', result.satellite, [{ label: 'span', value: `${result.spanS} s from ${ts.format(Instant.fromTtJ2000S(result.fromTtJ2000S))}` }], [sizeSection(result)]),
  };
}

/** `size --body moon`: elements about the Moon from the flags, or a lunar scenario satellite / Moon-centred OEM. */
function sizeLunarFromFlags(a: SizeArgs, ts: TimeSystem, body: 'earth' | 'moon'): LunarSizeResult {
  if (body !== 'moon') throw new InputError(`--keep ${a.keep} needs a clock about the Moon`, '--keep', 'add --body moon, or leave --keep at TT');
  if (a.tle !== undefined || a.omm !== undefined) throw new InputError('TLE and OMM element sets are Earth orbits (SGP4)', '--body', 'give elements about the Moon (--a-km …), a Moon-centred OEM, or a lunar scenario satellite');
  const options: LunarSizeOptions = {
    timeSystem: ts,
    gravity: a.gravity as GravityModelName,
    lunarForces: a.lunarForces as LunarForceModelName,
    from: a.from,
    span: a.span,
    nominalHz: a.nominalHz,
    keep: a.keep as LunarKeep,
    reference: { latDeg: a.referenceLatDeg ?? 0, lonDeg: a.referenceLonDeg ?? 0, heightM: a.referenceHeightM ?? 0 },
  };
  if (a.oem !== undefined || a.scenario !== undefined) {
    // A file orbit must itself be about the Moon.
    const r = sizeOne(() => orbitFromFlags(a, ts), { timeSystem: ts, gravity: options.gravity, from: a.from, span: a.span ?? '27.55455d', nominalHz: a.nominalHz });
    if (!('body' in r) || r.body !== 'moon') throw new InputError(`${r.satellite} is an Earth orbit, not one about the Moon`, '--body', 'leave --body at earth for it, or give a Moon-centred orbit (keplerian body: moon, state frame LCRS, OEM CENTER_NAME = MOON)');
    return r as LunarSizeResult;
  }
  if (a.aKm === undefined && a.altitudeKm === undefined) throw new InputError('no orbit about the Moon given', 'command line', 'give --a-km (from the Moon\'s centre) or --altitude-km (above 1737.4 km), with --e, --i-deg …');
  return runLunarSize({ aKm: a.aKm, altitudeKm: a.altitudeKm, e: a.e, iDeg: a.iDeg, raanDeg: a.raanDeg, argpDeg: a.argpDeg, mDeg: a.mDeg, epoch: a.epoch }, options);
}

function renderLunar(result: LunarSizeResult, ts: TimeSystem): Rendered {
  return {
    json: () => lunarSizeToJson(result, ts),
    text: () => lunarSizeToText(result, ts),
    csv: () => lunarSizeToCsv(result, ts),
    html: () => page('tauplan — frequency-offset sizing (lunar clock)', result.satellite, [{ label: 'span', value: `${result.spanS} s from ${ts.format(Instant.fromTtJ2000S(result.fromTtJ2000S))}` }], [{ heading: 'Lunar clock worksheet', intro: lunarSizeToText(result, ts) }], lunarSizeNotes(result)),
    notes: lunarSizeNotes(result),
  };
}
