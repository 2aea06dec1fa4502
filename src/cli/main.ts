/**
 * The command line. Every command: `--format text|json|csv|html`, `--out PATH` (atomic).
 * Input faults print `tauplan: <what> (<where>) — <fix>` on one line and exit 2; internal faults exit 1.
 */
import { statSync } from 'node:fs';
import yargs, { type Argv } from 'yargs';
import { InputError, InternalError } from '../errors.ts';
import { defaultTimeSystem, LEAP_SECONDS_ENV } from '../io/tables.ts';
import { checkOutputTarget, noteInputFile, removePendingTemps, setOutputDefaults, writeFault } from '../io/output.ts';
import { checkNumberOptions, refuseCatalogueOptionsWithoutAll, refuseRepeatedOptions } from './options.ts';
import { oneLineText } from '../report/safeText.ts';
import { withCliNow } from './now.ts';
import { emit, OUTPUT_FORMATS, type OutputFormat } from './emit.ts';

/**
 * The command modules, loaded only for the command being run (start-up: the orbit, clock and report
 * modules and their dependencies — satellite.js and its WASM, zod, astronomy-engine, ml-matrix,
 * d3-scale — cost more than a second to load, and `tauplan time` needs none of them).
 */
interface CommandModules {
  time?: typeof import('./commands/time.ts');
  size?: typeof import('./commands/size.ts');
  merge?: typeof import('./commands/merge.ts');
  passes?: typeof import('./commands/passes.ts');
  resets?: typeof import('./commands/resets.ts');
  shard?: typeof import('./shard.ts');
  fit?: typeof import('./commands/fit.ts');
  stability?: typeof import('./commands/stability.ts');
  compare?: typeof import('./commands/compare.ts');
  compareShard?: typeof import('./compareShard.ts');
  sweep?: typeof import('./commands/sweep.ts');
  track?: typeof import('./commands/track.ts');
  report?: typeof import('./commands/report.ts');
  navclock?: typeof import('./commands/navclock.ts');
}

/** Commands that may propagate an element set (SGP4): the WASM engine is loaded before them. */
const SGP4_COMMANDS: ReadonlySet<string> = new Set(['size', 'passes', 'resets', 'fit', 'compare', 'track', 'report', 'demo', 'navclock']);

/** The command named on the command line: the first argument that is a command name. */
function commandOf(args: readonly string[]): string | undefined {
  const names = new Set(['time', 'size', 'merge', 'passes', 'resets', 'fit', 'stability', 'compare', 'sweep', 'track', 'report', 'navclock', 'demo']);
  return args.find((a) => names.has(a));
}

/** Load the modules of one command (and the SGP4 engine when it may need it). */
async function loadCommand(name: string | undefined): Promise<CommandModules> {
  if (name !== undefined && SGP4_COMMANDS.has(name)) await (await import('../api/engine.ts')).enableSgp4Engine();
  switch (name) {
    case 'time':
      return { time: await import('./commands/time.ts') };
    case 'size':
      return { size: await import('./commands/size.ts') };
    case 'merge':
      return { merge: await import('./commands/merge.ts') };
    case 'passes':
      return { passes: await import('./commands/passes.ts'), shard: await import('./shard.ts') };
    case 'resets':
      return { resets: await import('./commands/resets.ts'), shard: await import('./shard.ts') };
    case 'fit':
      return { fit: await import('./commands/fit.ts') };
    case 'stability':
      return { stability: await import('./commands/stability.ts') };
    case 'compare':
      return { compare: await import('./commands/compare.ts'), compareShard: await import('./compareShard.ts') };
    case 'sweep':
      return { sweep: await import('./commands/sweep.ts') };
    case 'track':
      return { track: await import('./commands/track.ts') };
    case 'report':
    case 'demo':
      return { report: await import('./commands/report.ts'), shard: await import('./shard.ts') };
    case 'navclock':
      return { navclock: await import('./commands/navclock.ts'), shard: await import('./shard.ts') };
    default:
      return {};
  }
}

/** A module that must have been loaded for the command yargs matched. */
function need<T>(m: T | undefined, name: string): T {
  if (m === undefined) throw new InternalError(`command module ${name} was not loaded`, 'command line');
  return m;
}

export const EXIT_OK = 0;
export const EXIT_INTERNAL = 1;
export const EXIT_BAD_INPUT = 2;

/** Options every command takes. */
function common<T>(y: Argv<T>) {
  return y
    .option('format', { type: 'string', requiresArg: true, choices: OUTPUT_FORMATS as OutputFormat[], default: 'text' as OutputFormat, describe: 'output format' })
    .option('out', { type: 'string', requiresArg: true, describe: 'write to this file (atomically) instead of stdout' })
    .option('force', { type: 'boolean', default: false, describe: 'replace a read-only --out file' })
    .option('quiet', { type: 'boolean', default: false, describe: 'no progress or warnings on stderr' });
}

function parser(args: string[], m: CommandModules) {
  const ts = withCliNow(defaultTimeSystem());
  return skipHelpCache(yargs(args))
    .scriptName('tauplan')
    .usage('tauplan — onboard clock planning for timing engineers (planning aid; verify before uplink)\n\nUsage: tauplan <command> [options]')
    .command(
      'time <iso>',
      'Show one instant in UTC, TAI, TT, GPS (week/seconds), GST, BDT and MJD',
      (y) => common(y).positional('iso', { type: 'string', demandOption: true, describe: 'ISO 8601 time, e.g. 2027-01-01T00:00:00Z' }),
      (a) => emit(need(m.time, 'time').runTime(String(a.iso), ts), a.format, a.out, 'time', ts),
    )
    .command(
      'size',
      'Size the factory frequency offset for an orbit',
      (y) => need(m.size, 'size').sizeOptions(common(y)),
      async (a) => {
        refuseCatalogueOptionsWithoutAll(a);
        if (a.all === true) await (await import('./commands/sizeAll.ts')).runSizeAll(a, ts);
        else if ((a.format as string) === 'jsonl') throw new InputError('jsonl output is for catalogue runs', '--format', 'add --all (with --tle or --omm), or use text, json or csv');
        else emit(await need(m.size, 'size').runSize(a, ts), a.format, a.out, 'size', ts);
      },
    )
    .command(
      'merge <files..>',
      'Join shard outputs (size --all CSV or JSON Lines; passes, resets, navclock, compare JSON or CSV; report --shard folders) into what one run writes',
      (y) => need(m.merge, 'merge').mergeOptions(y),
      (a) => need(m.merge, 'merge').runMerge(a.files as string[], a.out, a.quiet),
    )
    .command(
      'passes <scenario>',
      'Passes over the stations with each onboard clock offset at AOS and LOS',
      (y) => need(m.passes, 'passes').passesOptions(common(y)).options(need(m.shard, 'shard').SHARD_OPTIONS),
      async (a) => emit(await need(m.shard, 'shard').sharded(a, 'passes', ts, (b, scenario) => need(m.passes, 'passes').runPasses(b, ts, scenario)), a.format, a.out, 'passes', ts),
    )
    .command(
      'resets <scenario>',
      'When each clock leaves its keep-in limit, and the pass to adjust it in',
      (y) => need(m.resets, 'resets').resetsOptions(common(y)).options(need(m.shard, 'shard').SHARD_OPTIONS),
      async (a) => emit(await need(m.shard, 'shard').sharded(a, 'resets', ts, (b, scenario) => need(m.resets, 'resets').runResets(b, ts, scenario), (s) => s.clock !== null && s.clock.keepInNs !== null), a.format, a.out, 'resets', ts),
    )
    .command(
      'fit <measurements>',
      'Fit offset, rate and drift to measured clock offsets, with stability',
      (y) => need(m.fit, 'fit').fitOptions(common(y)),
      async (a) => {
        if (a.all === true) await (await import('./commands/fitAll.ts')).runFitAll(a, ts);
        else emit(await need(m.fit, 'fit').runFit(a, ts), a.format as OutputFormat, a.out, 'fit', ts);
      },
    )
    .command(
      'stability <file>',
      'Allan, modified Allan, time and Hadamard deviations with intervals and noise types',
      (y) => need(m.stability, 'stability').stabilityOptions(common(y)),
      (a) => emit(need(m.stability, 'stability').runStability(a, ts), a.format, a.out, 'stability', ts),
    )
    .command(
      'compare <scenario>',
      'Compare satellite and station clocks over one window',
      (y) => need(m.compare, 'compare').compareOptions(common(y)).options(need(m.compareShard, 'compare').COMPARE_SHARD_OPTIONS),
      (a) => emit(need(m.compareShard, 'compare').shardedCompare(a, ts, (b, share) => need(m.compare, 'compare').runCompare(b, ts, share)), a.format, a.out, 'compare', ts),
    )
    .command(
      'sweep',
      'Mean clock rate and its split against altitude, with the break-even altitude',
      (y) => need(m.sweep, 'sweep').sweepOptions(common(y)),
      (a) => emit(need(m.sweep, 'sweep').runSweep(a, ts), a.format, a.out, 'sweep', ts),
    )
    .command(
      'track [scenario]',
      'Sampled states and the clock along them for one satellite',
      (y) => need(m.track, 'track').trackOptions(common(y)),
      (a) => emit(need(m.track, 'track').runTrack(a, ts), a.format, a.out, 'track', ts),
    )
    .command(
      'report <scenario>',
      'Run the whole job on a scenario and write report.html plus text, CSV and JSON files into a folder (--shard: data files of some satellites, for merge)',
      (y) => need(m.report, 'report').reportOptions(y).options(need(m.shard, 'shard').REPORT_SHARD_OPTIONS),
      (a) => need(m.report, 'report').runReport(a, ts),
    )
    .command(
      'navclock [scenario]',
      'Navigation-message clock parameter sets (af0, af1, af2) with their expected error',
      (y) => need(m.navclock, 'navclock').navclockOptions(common(y)).options(need(m.shard, 'shard').SHARD_OPTIONS),
      async (a) => emit(await need(m.shard, 'shard').sharded(a, 'navclock', ts, (b, scenario) => need(m.navclock, 'navclock').runNavclock(b, ts, scenario)), a.format, a.out, 'navclock'),
    )
    .command(
      'demo',
      'The report of the embedded invented scenario (tauplan report on data/demo/tessera.yaml)',
      (y) => need(m.report, 'demo').demoOptions(y),
      (a) => need(m.report, 'demo').runDemo(a, ts),
    )
    .option('leap-seconds', { type: 'string', requiresArg: true, global: true, describe: 'leap-second table to use instead of the packaged one (IERS Leap_Second.dat)' })
    .example('tauplan report my-scenario.yaml --out out/', 'the whole job on your scenario: report.html plus data files')
    .example('tauplan demo --out ./tauplan-demo', 'the whole job on the invented demo scenario')
    .example('tauplan time 2027-01-01T00:00:00Z', 'one instant in every scale')
    .example('tauplan size --a-km 26561.75 --i-deg 55 --gravity point --format json', 'GPS-like sizing')
    .example('tauplan size --tle cat.tle --all --format csv --out all.csv', 'every satellite of a catalogue')
    .example('tauplan merge s1.csv s2.csv --out all.csv', 'join --shard outputs in file order')
    .example('tauplan merge rep-1 rep-2 --out report/', 'join report --shard folders into one report\'s data files')
    .example('tauplan passes data/demo/tessera.yaml --station BRINDLEMOOR', 'pass schedule with clock offsets')
    .example('tauplan resets data/demo/tessera.yaml --horizon 28d', 'keep-in adjustment plan')
    .example('tauplan fit offsets.csv --degree 2', 'clock parameters and stability from measurements')
    .example('tauplan stability phase.txt.gz --tau0 1s', 'stability table of a phase record')
    .example('tauplan compare data/demo/tessera.yaml', 'satellite and station clocks side by side')
    .example('tauplan sweep --from-km 300 --to-km 40000', 'rate against altitude, break-even')
    .example('tauplan navclock data/demo/tessera.yaml --sat TSR-1', 'quantised af0/af1/af2 sets every 2 h')
    .example('tauplan track data/demo/tessera.yaml --sat TSR-1 --frame ECEF', 'states and clock for other tools')
    .demandCommand(1, 'give a command: time, size, passes, resets, fit, stability, compare, sweep, track, navclock, report, demo')
    .recommendCommands()
    .strict()
    .exitProcess(false)
    .wrap(Math.min(110, process.stdout.columns ?? 100))
    .middleware((argv) => {
      // yargs turns a non-numeric value of a number option into NaN, and 1e309 into Infinity, silently.
      checkNumberOptions(argv, args);
    })
    .middleware((argv) => {
      // Refuse an unusable --out before any work (the report's and demo's --out is a folder they create). Every
      // file named on the command line is an input that --out must not replace.
      setOutputDefaults({ force: argv.force === true });
      for (const [key, value] of Object.entries(argv)) {
        if (key === 'out' || key === 'update-scenario' || key === '$0' || /[A-Z]/.test(key)) continue;
        for (const v of Array.isArray(value) ? value : [value]) if (typeof v === 'string' && v !== '') noteInputFile(v);
      }
      // merge of report shard folders writes a folder (checked like report's when it writes).
      const folderMerge = argv._[0] === 'merge' && Array.isArray(argv.files) && argv.files.some((f) => typeof f === 'string' && statSync(f, { throwIfNoEntry: false })?.isDirectory() === true);
      if (typeof argv.out === 'string' && argv._[0] !== 'demo' && argv._[0] !== 'report' && !folderMerge) checkOutputTarget(argv.out);
    })
    .fail((msg, err) => {
      // yargs' own validation faults (YError) are usage errors like the messages it passes alone.
      if (err !== undefined && err !== null && err.name !== 'YError') throw err;
      throw usageError(msg ?? err?.message ?? 'bad command line', args);
    })
    .help()
    .version('0.1.0');
}

/**
 * yargs renders the matched command's whole help text as it starts the handler, to have it ready
 * for a later showHelp(). This CLI never asks for it (a failure is one line, and `--help` is answered
 * before any handler runs), and the rendering cost every run 17–33 ms (profiled: `time`, `resets`).
 * Through yargs' internal methods; if they change, nothing is skipped and nothing breaks.
 */
function skipHelpCache<T>(y: Argv<T>): Argv<T> {
  type Internal = { getInternalMethods?: () => { getUsageInstance?: () => { cacheHelpMessage?: () => void } | undefined } };
  const usage = (y as unknown as Internal).getInternalMethods?.().getUsageInstance?.();
  if (usage !== undefined && typeof usage.cacheHelpMessage === 'function') usage.cacheHelpMessage = () => undefined;
  return y;
}

/** Usage line per command with a required positional, for "missing argument" messages. */
const POSITIONAL_USAGE: Record<string, string> = {
  time: 'tauplan time 2027-01-01T00:00:00Z',
  passes: 'tauplan passes scenario.yaml',
  resets: 'tauplan resets scenario.yaml',
  fit: 'tauplan fit offsets.csv',
  stability: 'tauplan stability phase.txt --tau0 1s',
  compare: 'tauplan compare scenario.yaml',
  report: 'tauplan report scenario.yaml --out out/',
  merge: 'tauplan merge s1.csv s2.csv --out all.csv',
};

/** A yargs validation message as a one-line input error; a missing positional names the usage. */
function usageError(msg: string, args: string[]): InputError {
  const text = msg.replace(/\s+/g, ' ').trim();
  const command = args.find((x) => !x.startsWith('-'));
  if (/^Not enough non-option arguments/.test(text) && command !== undefined && command in POSITIONAL_USAGE) {
    return new InputError(`tauplan ${command} needs its ${command === 'time' ? 'time' : command === 'fit' ? 'measurement file' : command === 'stability' ? 'data file' : command === 'merge' ? 'files' : 'scenario file'}`, 'command line', `e.g. ${POSITIONAL_USAGE[command]}`);
  }
  return new InputError(text, 'command line', 'see tauplan --help');
}

/**
 * `--span -1d` would otherwise read as the short flags -1 and -d: a value that starts with a minus
 * and a digit is joined to its option (`--span=-1d`), so the option's own check reports it.
 */
export function joinNegativeValues(args: string[]): string[] {
  const out: string[] = [];
  for (let i = 0; i < args.length; i++) {
    const a = args[i];
    const next = args[i + 1];
    if (/^--[a-z][a-z0-9-]*$/.test(a) && next !== undefined && /^-\.?\d/.test(next)) {
      out.push(`${a}=${next}`);
      i++;
    } else out.push(a);
  }
  return out;
}

/**
 * Standard output faults: a reader that stops early (`| head`, EPIPE) ends the run quietly with exit
 * 0, as other streaming tools do; any other (`> /dev/full`) is one line and exit 2.
 */
function hookStdout(): void {
  process.stdout.on('error', (e: NodeJS.ErrnoException) => {
    removePendingTemps();
    if (e.code === 'EPIPE') process.exit(EXIT_OK);
    const f = writeFault(e, 'standard output', 'stdout');
    process.stderr.write(`tauplan: ${oneLineText(f.what.replace('; nothing was written', ''))} (standard output) — ${oneLineText(f.fix)}\n`);
    process.exit(EXIT_BAD_INPUT);
  });
}

let processHooked = false;

/** Run the CLI; returns the exit code. */
export async function main(args: string[]): Promise<number> {
  if (!processHooked) {
    processHooked = true;
    hookStdout();
  }
  try {
    refuseRepeatedOptions(args);
    // The leap-second table is needed before the commands are parsed: take --leap-seconds first.
    const leapIdx = args.findIndex((x) => x === '--leap-seconds' || x.startsWith('--leap-seconds='));
    if (leapIdx >= 0) {
      const value = args[leapIdx].includes('=') ? args[leapIdx].slice(args[leapIdx].indexOf('=') + 1) : args[leapIdx + 1];
      if (value === undefined || value === '') throw new InputError('--leap-seconds needs a file', '--leap-seconds', 'give the path of an IERS Leap_Second.dat');
      process.env[LEAP_SECONDS_ENV] = value;
      noteInputFile(value);
    }
    const joined = joinNegativeValues(args);
    await parser(joined, await loadCommand(commandOf(joined))).parseAsync();
    const leap = defaultTimeSystem().leap;
    if (leap.usedPastExpiry && !args.includes('--quiet')) {
      process.stderr.write(
        `tauplan: warning: times past the leap-second table's expiry (${leap.expiresUtc}) assume no new leap second (${leap.source.startsWith('user file') ? leap.source.slice(10) : 'data/leap-seconds.json'}) — give a newer IERS Leap_Second.dat with --leap-seconds FILE\n`,
      );
    }
    return EXIT_OK;
  } catch (e) {
    removePendingTemps();
    if (e instanceof InputError) {
      process.stderr.write(`tauplan: ${oneLineText(e.what)} (${oneLineText(e.where)}) — ${oneLineText(e.fix)}\n`);
      return EXIT_BAD_INPUT;
    }
    const detail = e instanceof InternalError ? e.message : e instanceof Error ? `${e.name}: ${e.message}` : String(e);
    process.stderr.write(`tauplan: internal fault: ${detail.replace(/\s+/g, ' ')} — please report it with the command line\n`);
    if (process.env.TAUPLAN_DEBUG === '1' && e instanceof Error) process.stderr.write(`${e.stack}\n`);
    return EXIT_INTERNAL;
  }
}
