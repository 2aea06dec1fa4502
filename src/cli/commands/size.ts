/** `tauplan size`: frequency-offset sizing for one orbit (or every satellite of a TLE file with --all). */
import type { Argv } from 'yargs';
import { runSize as sizeOne, type SizeOptions } from '../../api/size.ts';
import { GNSS_NOMINAL_HZ } from '../../constants.ts';
import type { GravityModelName } from '../../model/scenario.ts';
import { sizeToCsv, sizeToJson, sizeToText } from '../../report/sizeReport.ts';
import type { TimeSystem } from '../../time/timeSystem.ts';
import type { Rendered } from '../emit.ts';
import { Instant } from '../../time/instant.ts';
import { page, sizeSection } from '../../report/htmlReport.ts';
import { orbitFromFlags, orbitOptions, type OrbitFlags } from '../orbitArgs.ts';

export function sizeOptions<T>(y: Argv<T>) {
  return orbitOptions(y)
    .option('gravity', { type: 'string', requiresArg: true, default: 'zonal', describe: 'point | j2 | zonal' })
    .option('tides', { type: 'boolean', default: false, describe: 'add the solar and lunar tidal potential (below 1e-15 up to GNSS altitude)' })
    .option('from', { type: 'string', requiresArg: true, describe: 'start of the span (default: the orbit epoch)' })
    .option('span', { type: 'string', requiresArg: true, default: '1d', describe: 'length of the span, e.g. 1d, 36h, P2D' })
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
  span: string;
  nominalHz: number;
}

export async function runSize(a: SizeArgs, ts: TimeSystem): Promise<Rendered> {
  const options: SizeOptions = { timeSystem: ts, gravity: a.gravity as GravityModelName, tides: a.tides === true, from: a.from, span: a.span, nominalHz: a.nominalHz };
  // The orbit's files are read once the options are checked.
  const result = sizeOne(() => orbitFromFlags(a, ts), options);
  return {
    json: () => sizeToJson(result, ts),
    text: () => sizeToText(result, ts),
    csv: () => sizeToCsv([result], ts),
    html: () => page('tauplan — frequency-offset sizing', result.satellite, [{ label: 'span', value: `${result.spanS} s from ${ts.format(Instant.fromTtJ2000S(result.fromTtJ2000S))}` }], [sizeSection(result)]),
  };
}
