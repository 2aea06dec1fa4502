/**
 * Command-line option checks shared by every command, so that a flag is refused the same way
 * wherever it appears:
 * - an option given twice (`--format json --format csv`, `--out a --out b`) is refused, never a
 *   silent choice of one;
 * - a number option must be a finite number (`--a-km 1e309` reads as Infinity) within the range the
 *   same quantity has as a scenario key (`--i-deg` 0 … 180, `--e` 0 ≤ e < 1);
 * - a comma-separated list must name something (`--station ,`);
 * - catalogue-only options of `size` (`--jobs`, `--shard`, `--strict`) need `--all`.
 */
import { InputError } from '../errors.ts';

/** Range of a number option; bounds inclusive unless marked. */
interface Range {
  min?: number;
  max?: number;
  /** The minimum itself is refused. */
  minExclusive?: boolean;
  /** The maximum itself is refused. */
  maxExclusive?: boolean;
  integer?: boolean;
  /** Shown in the message, e.g. "an inclination in degrees". */
  what: string;
  example: string;
}

/** Largest nominal oscillator frequency accepted [Hz]: above optical clocks (~4.3e14 Hz, Sr lattice), common practice. */
const MAX_NOMINAL_HZ = 1e16;
/** Largest semi-major axis or altitude accepted from flags [km]: about 27 times the Moon's distance, far past any Earth-bound orbit. */
const MAX_ORBIT_KM = 1e7;
/** Largest angle accepted for RAAN, argument of perigee and mean anomaly [deg]: a few turns, beyond that a typo. */
const MAX_ANGLE_DEG = 3600;
/** Largest sweep altitude [km]: the same bound as MAX_ORBIT_KM. */
const MAX_SWEEP_KM = MAX_ORBIT_KM;
/** Most points of a sweep: beyond this the output is no longer a table anyone reads. */
const MAX_SWEEP_POINTS = 5000;
/** Highest polynomial degree of a clock fit: offset, rate, drift. */
const MAX_FIT_DEGREE = 2;
/** Largest sigma-clipping threshold [standard deviations]: past 1e3 nothing is ever clipped. */
const MAX_CLIP_SIGMA = 1e3;

/**
 * Ranges of the number options, by yargs key. Scenario keys with the same meaning have the same
 * bounds (src/io/scenario.ts: aKm > 0, 0 ≤ e < 1, 0 ≤ iDeg ≤ 180).
 */
export const NUMBER_OPTION_RANGES: Readonly<Record<string, Range>> = {
  'a-km': { min: 0, minExclusive: true, max: MAX_ORBIT_KM, what: "a semi-major axis in km from the centre of the Earth (or of the Moon with --body moon)", example: '26561.75' },
  'altitude-km': { min: -6378.137, minExclusive: true, max: MAX_ORBIT_KM, what: 'an altitude in km above 6378.137 km', example: '550' },
  e: { min: 0, max: 1, maxExclusive: true, what: 'an eccentricity, 0 ≤ e < 1', example: '0.01' },
  'i-deg': { min: 0, max: 180, what: 'an inclination in degrees, 0 … 180', example: '55' },
  'raan-deg': { min: -MAX_ANGLE_DEG, max: MAX_ANGLE_DEG, what: 'an angle in degrees', example: '120' },
  'argp-deg': { min: -MAX_ANGLE_DEG, max: MAX_ANGLE_DEG, what: 'an angle in degrees', example: '0' },
  'm-deg': { min: -MAX_ANGLE_DEG, max: MAX_ANGLE_DEG, what: 'an angle in degrees', example: '0' },
  'nominal-hz': { min: 0, minExclusive: true, max: MAX_NOMINAL_HZ, what: 'a frequency in Hz', example: '10.23e6' },
  'from-km': { min: 0, max: MAX_SWEEP_KM, what: 'an altitude in km', example: '300' },
  'to-km': { min: 0, minExclusive: true, max: MAX_SWEEP_KM, what: 'an altitude in km', example: '40000' },
  points: { min: 2, max: MAX_SWEEP_POINTS, integer: true, what: 'a whole number of points', example: '200' },
  degree: { min: 0, max: MAX_FIT_DEGREE, integer: true, what: 'a polynomial degree 0, 1 or 2', example: '2' },
  clip: { min: 0, max: MAX_CLIP_SIGMA, what: 'a clipping threshold in standard deviations (0 disables)', example: '4' },
};

/** The text given after `--key` (or in `--key=...`) on the command line. */
export function rawFlagValue(args: readonly string[], key: string): string | undefined {
  for (let i = 0; i < args.length; i++) {
    if (args[i] === `--${key}`) return args[i + 1];
    if (args[i].startsWith(`--${key}=`)) return args[i].slice(key.length + 3);
  }
  return undefined;
}

/** `--foo` / `--foo=x` / `--no-foo` as the option's name, or null for anything else. */
function optionName(arg: string): string | null {
  const m = /^--([a-zA-Z][a-zA-Z0-9-]*)(=.*)?$/.test(arg) ? /^--(?:no-)?([a-zA-Z][a-zA-Z0-9-]*)/.exec(arg) : null;
  return m === null ? null : m[1];
}

/**
 * Refuse an option given more than once (before yargs, which would make an array of it and
 * silently pick a different behaviour). Everything after `--` is left alone.
 */
export function refuseRepeatedOptions(args: readonly string[]): void {
  const seen = new Set<string>();
  for (const arg of args) {
    if (arg === '--') break;
    const name = optionName(arg);
    if (name === null) continue;
    if (seen.has(name)) throw new InputError(`--${name} is given more than once`, `--${name}`, `give --${name} once (one value)`);
    seen.add(name);
  }
}

/** Check one number option against its range; `raw` is the text given, for the message. */
export function checkNumberOption(key: string, value: number, raw: string | undefined): void {
  const flag = `--${key}`;
  const shown = raw === undefined ? String(value) : JSON.stringify(raw);
  if (Number.isNaN(value)) {
    throw new InputError(`${flag} ${raw === undefined ? 'has no value' : `${shown} is not a number`}`, flag, 'give a plain number, e.g. 550 or -4.5e-10');
  }
  const r = NUMBER_OPTION_RANGES[key];
  if (!Number.isFinite(value)) throw new InputError(`${flag} ${shown} is not a finite number`, flag, `give ${r?.what ?? 'a plain number'}, e.g. ${r?.example ?? '550'}`);
  if (r === undefined) return;
  const low = r.min !== undefined && (r.minExclusive === true ? value <= r.min : value < r.min);
  const high = r.max !== undefined && (r.maxExclusive === true ? value >= r.max : value > r.max);
  if (low || high || (r.integer === true && !Number.isInteger(value))) {
    const bounds = [r.min === undefined ? null : `${r.minExclusive === true ? '>' : '≥'} ${r.min}`, r.max === undefined ? null : `${r.maxExclusive === true ? '<' : '≤'} ${r.max}`].filter((x) => x !== null).join(' and ');
    const kind = r.integer === true ? 'a whole number ' : '';
    throw new InputError(`${flag} ${shown} is out of range (${kind}${bounds})`, flag, `give ${r.what}, e.g. ${r.example}`);
  }
}

/** Check every number option of a parsed command line (yargs argv, kebab-case keys). */
export function checkNumberOptions(argv: Record<string, unknown>, args: readonly string[]): void {
  for (const [key, value] of Object.entries(argv)) {
    if (typeof value !== 'number' || /[A-Z]/.test(key)) continue;
    checkNumberOption(key, value, rawFlagValue(args, key));
  }
}


/** `size` options that only mean something for a catalogue run refuse to be given without `--all`. */
export function refuseCatalogueOptionsWithoutAll(argv: { all?: unknown; jobs?: unknown; shard?: unknown; strict?: unknown }): void {
  if (argv.all === true) return;
  for (const key of ['jobs', 'shard', 'strict'] as const) {
    if (argv[key] !== undefined && argv[key] !== false) {
      throw new InputError(`--${key} is for catalogue runs`, `--${key}`, `add --all (with --tle or --omm), or drop --${key}`);
    }
  }
}


/** `--body`: earth (default) or moon; anything else is a one-line usage error. */
export function bodyFlag(value: string | undefined): 'earth' | 'moon' {
  const v = (value ?? 'earth').toLowerCase();
  if (v !== 'earth' && v !== 'moon') throw new InputError(`unknown body ${JSON.stringify(value)}`, '--body', 'give earth or moon');
  return v;
}
