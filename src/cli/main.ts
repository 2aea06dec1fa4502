/**
 * The command line. Every command: `--format text|json|csv|html`, `--out PATH` (atomic).
 * Input faults print `tauplan: <what> (<where>) — <fix>` on one line and exit 2; internal faults exit 1.
 */
import yargs, { type Argv } from 'yargs';
import { InputError, InternalError } from '../errors.ts';
import { defaultTimeSystem } from '../io/tables.ts';
import { removePendingTemps } from '../io/output.ts';
import { emit, OUTPUT_FORMATS, type OutputFormat } from './emit.ts';
import { runTime } from './commands/time.ts';
import { runSize, sizeOptions } from './commands/size.ts';

export const EXIT_OK = 0;
export const EXIT_INTERNAL = 1;
export const EXIT_BAD_INPUT = 2;

/** Options every command takes. */
function common<T>(y: Argv<T>) {
  return y
    .option('format', { type: 'string', choices: OUTPUT_FORMATS as OutputFormat[], default: 'text' as OutputFormat, describe: 'output format' })
    .option('out', { type: 'string', describe: 'write to this file (atomically) instead of stdout' })
    .option('quiet', { type: 'boolean', default: false, describe: 'no progress or warnings on stderr' });
}

function parser(args: string[]) {
  const ts = defaultTimeSystem();
  return yargs(args)
    .scriptName('tauplan')
    .usage('tauplan — onboard clock planning for timing engineers (planning aid; verify before uplink)\n\nUsage: tauplan <command> [options]')
    .command(
      'time <iso>',
      'Show one instant in UTC, TAI, TT, GPS (week/seconds), GST, BDT and MJD',
      (y) => common(y).positional('iso', { type: 'string', demandOption: true, describe: 'ISO 8601 time, e.g. 2027-01-01T00:00:00Z' }),
      (a) => emit(runTime(String(a.iso), ts), a.format, a.out, 'time'),
    )
    .command(
      'size',
      'Size the factory frequency offset for an orbit',
      (y) => sizeOptions(common(y)),
      async (a) => emit(await runSize(a, ts), a.format, a.out, 'size'),
    )
    .example('tauplan time 2027-01-01T00:00:00Z', 'one instant in every scale')
    .example('tauplan size --a-km 26561.75 --i-deg 55 --gravity point --format json', 'GPS-like sizing')
    .demandCommand(1, 'give a command: time, size, passes, resets, fit, compare, sweep, track, demo')
    .recommendCommands()
    .strict()
    .exitProcess(false)
    .wrap(Math.min(110, process.stdout.columns ?? 100))
    .fail((msg, err) => {
      if (err !== undefined && err !== null) throw err;
      throw new InputError(msg.replace(/\s+/g, ' ').trim(), 'command line', 'see tauplan --help');
    })
    .help()
    .version('0.1.0');
}

/** Run the CLI; returns the exit code. */
export async function main(args: string[]): Promise<number> {
  try {
    await parser(args).parseAsync();
    const leap = defaultTimeSystem().leap;
    if (leap.usedPastExpiry && !args.includes('--quiet')) {
      process.stderr.write(
        `tauplan: warning: times past the leap-second table's expiry (${leap.expiresUtc}) assume no new leap second (data/leap-seconds.json) — update it from the latest IERS Bulletin C\n`,
      );
    }
    return EXIT_OK;
  } catch (e) {
    removePendingTemps();
    if (e instanceof InputError) {
      process.stderr.write(`tauplan: ${e.what} (${e.where}) — ${e.fix}\n`);
      return EXIT_BAD_INPUT;
    }
    const detail = e instanceof InternalError ? e.message : e instanceof Error ? `${e.name}: ${e.message}` : String(e);
    process.stderr.write(`tauplan: internal fault: ${detail.replace(/\s+/g, ' ')} — please report it with the command line\n`);
    if (process.env.TAUPLAN_DEBUG === '1' && e instanceof Error) process.stderr.write(`${e.stack}\n`);
    return EXIT_INTERNAL;
  }
}
