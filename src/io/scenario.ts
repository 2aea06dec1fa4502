/**
 * Scenario files (JSON or YAML; contract "Scenario files"). Reads the text, checks it against
 * strict zod schemas (an unknown key is an error with a "did you mean" hint, never ignored),
 * applies the documented defaults and parses times and durations. Every fault is one
 * {@link ScenarioError} whose `path` is a JSON path such as `satellites[2].clock.agingPerDay`
 * (or `file:line` for a syntax error).
 *
 * Orbits are checked only for shape and gross sense here (perigee above the ground, position
 * outside the Earth, TLE line numbers); TLE, OMM and SP3 contents are read by their own parsers.
 */
import { dirname, resolve } from 'node:path';
import { isMap, isScalar, isSeq, LineCounter, parseDocument, type Document } from 'yaml';
import { z } from 'zod';
import { WGS84_A_M, WGS84_INV_F } from '../constants.ts';
import { ScenarioError, TimeError } from '../errors.ts';
import type { Station } from '../events/station.ts';
import type { Instant } from '../time/instant.ts';
import { parseDurationS } from '../time/duration.ts';
import type { TimeSystem } from '../time/timeSystem.ts';
import { nearest } from './suggest.ts';

// ---------------------------------------------------------------------------------------------
// Output types

/** Gravity model used for orbits and clock rates (physics.md §2). */
export type GravityModel = 'point' | 'j2' | 'zonal';
/** Time scale that `offsetNs` is measured against. All three tick at the geoid rate. */
export type ReferenceScale = 'GPS' | 'TAI' | 'TT';
/** Kind of clock adjustment the resets planner prefers. */
export type AdjustmentKind = 'phase' | 'frequency';

/** A TLE, split but not parsed. Lines are kept as written (trailing spaces removed). */
export interface TleOrbitSpec {
  kind: 'tle';
  /** The name line (line 0) as written, or null for a two-line set. */
  nameLine: string | null;
  line1: string;
  line2: string;
  /** The set rejoined with `\n` (name line first when present), for a TLE text parser. */
  text: string;
}

/** A CCSDS OMM given inline, as JSON-OMM keys (e.g. `EPOCH`, `MEAN_MOTION`); parsed elsewhere. */
export interface OmmOrbitSpec {
  kind: 'omm';
  /** The keys and values exactly as given. */
  fields: Record<string, string | number>;
}

/** Osculating Keplerian elements at `epoch`, about the WGS-84 GM. */
export interface KeplerianOrbitSpec {
  kind: 'keplerian';
  epoch: Instant;
  /** Semi-major axis from the Earth's centre [km]. Perigee aKm·(1−e) is above 6378.137 km. */
  aKm: number;
  /** Eccentricity, 0 ≤ e < 1. */
  e: number;
  /** Inclination [deg], 0 … 180. */
  iDeg: number;
  /** Right ascension of the ascending node [deg]. */
  raanDeg: number;
  /** Argument of perigee [deg]. */
  argpDeg: number;
  /** Mean anomaly at epoch [deg]. */
  meanAnomalyDeg: number;
}

/** A Cartesian state at `epoch` in an inertial frame. May be sub-orbital (contract `compare`). */
export interface StateOrbitSpec {
  kind: 'state';
  epoch: Instant;
  frame: 'GCRF' | 'TEME';
  /** Position [km] in `frame`; |r| is at least the WGS-84 polar radius. */
  positionKm: [number, number, number];
  /** Velocity [km/s] in `frame`. */
  velocityKmPerS: [number, number, number];
}

/** A satellite taken from an SP3 precise-orbit file. */
export interface Sp3OrbitSpec {
  kind: 'sp3';
  /** The path as written in the scenario. */
  file: string;
  /** `file` resolved against the scenario file's folder (absolute). */
  resolvedFile: string;
  /** Satellite id inside the SP3 file, e.g. `L51`. */
  id: string;
}

/** Exactly one orbit source per satellite. */
export type OrbitSpec = TleOrbitSpec | OmmOrbitSpec | KeplerianOrbitSpec | StateOrbitSpec | Sp3OrbitSpec;

/** The orbit kinds a scenario may name, in the order the contract lists them. */
export const ORBIT_KINDS = ['tle', 'omm', 'keplerian', 'state', 'sp3'] as const;

/** Allan-deviation noise levels (physics.md §6). A level left out is 0 (no contribution). */
export interface ClockNoiseSpec {
  /** White FM: σ_y(τ) = whiteFmAdev1s/√(τ/1 s) [1]. */
  whiteFmAdev1s: number;
  /** Flicker FM floor, constant σ_y [1]. */
  flickerFmFloor: number;
  /** Random-walk FM: σ_y(τ) = randomWalkFmAdev1d·√(τ/1 d) [1]. */
  randomWalkFmAdev1d: number;
}

/**
 * Onboard oscillator model: dx/dt = hardwareFractionalOffset + y_rel(t) + agingPerDay·(t − epoch)/1 d,
 * x(epoch) = offsetNs, x measured against the scenario's `reference` scale.
 */
export interface ClockSpec {
  /** Epoch of offsetNs and of the aging term. Default: window.start. */
  epoch: Instant;
  /** Clock reading minus reference at epoch [ns]. Default 0. */
  offsetNs: number;
  /** Factory detuning as a fractional frequency [1]. Default 0. */
  hardwareFractionalOffset: number;
  /** Change of fractional frequency per day [1/d]. Default 0. */
  agingPerDay: number;
  noise: ClockNoiseSpec;
  /** |offsetNs| must stay below this [ns]; null: no keep-in limit. */
  keepInNs: number | null;
}

/** One satellite. */
export interface SatelliteSpec {
  id: string;
  /**
   * Display name: as given; else the TLE name line (a leading `0 ` removed) or the OMM
   * OBJECT_NAME; else null (callers then show `id`).
   */
  name: string | null;
  orbit: OrbitSpec;
  /** Null: no oscillator model, offsets are relativistic only. */
  clock: ClockSpec | null;
  /** JSON path of this entry (`satellites[2]`), for messages from later stages. */
  path: string;
}

/**
 * An earth-fixed ground station as checked here (ranges: latitude −90 … 90°, longitude −180 ≤ lon < 360°
 * as given, height −500 … 10 000 m, geoid undulation −150 … 150 m, mask −5 ≤ mask < 90°, minPassS ≥ 0;
 * defaults geoidHeightM 0, maskDeg 10, minPassS 300).
 */
export interface StationSpec extends Station {
  /** JSON path of this entry (`stations[0]`), for messages from later stages. */
  path: string;
}

/** Policy for keep-in adjustments (contract `resets`, physics.md §7). */
export interface ResetPolicySpec {
  /** Adjust no later than the predicted crossing minus this [ns of offset], ≥ 0, below every keepInNs. Default 0. */
  marginNs: number;
  /** `policy.leadTime` in seconds, ≥ 0; null when not given (the planner decides). */
  leadTimeS: number | null;
  /** Preferred adjustment kind. Default phase. */
  prefer: AdjustmentKind;
  /** Extra key `policy.horizon`: how far ahead `resets` looks [s]. Default 180 d; `--horizon` overrides. */
  horizonS: number;
}

/** A checked scenario, times parsed, defaults applied. */
export interface ScenarioSpec {
  /** Scenario name; default the file name without its extension. */
  name: string;
  /** The file name given to the parser (used in messages). */
  fileName: string;
  /** Absolute folder of the scenario file; relative file paths inside resolve against it. */
  folder: string;
  /** Planning window; end is after start. */
  window: { start: Instant; end: Instant };
  /** Default zonal (EGM2008 J2..J6). */
  gravity: GravityModel;
  /** Extra key `tides`: add the solar and lunar tidal potential to clock rates. Default false. */
  tides: boolean;
  /** Default GPS. */
  reference: ReferenceScale;
  /** At least one; ids unique across satellites and stations. */
  satellites: SatelliteSpec[];
  /** Possibly empty. */
  stations: StationSpec[];
  /** Always present; defaults when the file has no `policy`. */
  policy: ResetPolicySpec;
}

// ---------------------------------------------------------------------------------------------
// Schemas (shape and ranges; cross-field checks come after)

/** Station height limits [m]: Dead Sea shore ≈ −410 m and Everest ≈ 8820 m ellipsoidal, with margin. */
const STATION_MIN_HEIGHT_M = -500;
const STATION_MAX_HEIGHT_M = 10_000;
/** |N| stays below ≈ 110 m on Earth; a larger value is probably a height, not an undulation. */
const GEOID_HEIGHT_LIMIT_M = 150;
/** WGS-84 polar radius [km], derived from a and 1/f: 6356.752 km. */
const WGS84_POLAR_RADIUS_KM = (WGS84_A_M * (1 - 1 / WGS84_INV_F)) / 1000;
const WGS84_A_KM = WGS84_A_M / 1000;
const DEFAULT_HORIZON = '180d';

const text = z.string().min(1);
const vec3 = z.tuple([z.number(), z.number(), z.number()]);
const TLE_SHAPE = 'a TLE must be a text of 2 or 3 lines, or a list [line1, line2] or [name, line1, line2]';

const KeplerianSchema = z.strictObject({
  epoch: text,
  aKm: z.number().positive(),
  e: z.number().min(0).lt(1),
  iDeg: z.number().min(0).max(180),
  raanDeg: z.number(),
  argpDeg: z.number(),
  meanAnomalyDeg: z.number(),
});

const OrbitSchema = z.strictObject({
  tle: z.union([z.string(), z.array(z.string()).min(2).max(3)], { error: TLE_SHAPE }).optional(),
  omm: z.record(z.string(), z.union([z.string(), z.number()], { error: 'an OMM value must be a string or a number' })).optional(),
  keplerian: KeplerianSchema.optional(),
  state: z.strictObject({ epoch: text, frame: z.enum(['GCRF', 'TEME']), positionKm: vec3, velocityKmPerS: vec3 }).optional(),
  sp3: z.strictObject({ file: text, id: text }).optional(),
});

const ClockSchema = z.strictObject({
  epoch: text.optional(),
  offsetNs: z.number().optional(),
  hardwareFractionalOffset: z.number().optional(),
  agingPerDay: z.number().optional(),
  noise: z
    .strictObject({
      whiteFmAdev1s: z.number().min(0).optional(),
      flickerFmFloor: z.number().min(0).optional(),
      randomWalkFmAdev1d: z.number().min(0).optional(),
    })
    .optional(),
  keepInNs: z.number().positive().optional(),
});

const SatelliteSchema = z.strictObject({
  id: text,
  name: z.string().optional(),
  orbit: OrbitSchema,
  clock: ClockSchema.optional(),
});

const StationSchema = z.strictObject({
  id: text,
  latDeg: z.number().min(-90).max(90),
  lonDeg: z.number().min(-180).lt(360),
  heightM: z.number().min(STATION_MIN_HEIGHT_M).max(STATION_MAX_HEIGHT_M),
  geoidHeightM: z.number().min(-GEOID_HEIGHT_LIMIT_M).max(GEOID_HEIGHT_LIMIT_M).optional(),
  maskDeg: z.number().min(-5).lt(90).optional(),
  minPassS: z.number().min(0).optional(),
});

const PolicySchema = z.strictObject({
  marginNs: z.number().min(0).optional(),
  leadTime: text.optional(),
  prefer: z.enum(['phase', 'frequency']).optional(),
  horizon: text.optional(),
});

const ScenarioSchema = z.strictObject({
  name: z.string().optional(),
  window: z.strictObject({ start: text, end: text }),
  gravity: z.enum(['point', 'j2', 'zonal']).optional(),
  tides: z.boolean().optional(),
  reference: z.enum(['GPS', 'TAI', 'TT']).optional(),
  satellites: z.array(SatelliteSchema).min(1),
  stations: z.array(StationSchema).optional(),
  policy: PolicySchema.optional(),
});

type RawScenario = z.infer<typeof ScenarioSchema>;
type PathSeg = string | number;

/** What each key means and its range, shown as the fix when its value is wrong. */
const FIELD_HINTS: Record<string, string> = {
  latDeg: 'give the geodetic latitude in degrees, −90 … 90, north positive',
  lonDeg: 'give the longitude in degrees east, −180 ≤ lon < 360',
  heightM: `give the height above the WGS-84 ellipsoid in metres, ${STATION_MIN_HEIGHT_M} … ${STATION_MAX_HEIGHT_M}`,
  geoidHeightM: `give the geoid undulation N in metres (−${GEOID_HEIGHT_LIMIT_M} … ${GEOID_HEIGHT_LIMIT_M}), not a height above the geoid`,
  maskDeg: 'give the elevation mask in degrees, −5 ≤ maskDeg < 90',
  minPassS: 'give the shortest useful pass in seconds, 0 or more',
  keepInNs: 'give the keep-in limit on |offsetNs| in ns, greater than 0',
  marginNs: 'give the margin in ns, 0 or more (and below every keepInNs)',
  aKm: "give the semi-major axis in km from the Earth's centre (not the altitude)",
  e: 'give the eccentricity, 0 ≤ e < 1 (a closed orbit)',
  iDeg: 'give the inclination in degrees, 0 … 180',
  whiteFmAdev1s: 'noise levels are Allan deviations, 0 or more',
  flickerFmFloor: 'noise levels are Allan deviations, 0 or more',
  randomWalkFmAdev1d: 'noise levels are Allan deviations, 0 or more',
  positionKm: 'give exactly three numbers [x, y, z] in km',
  velocityKmPerS: 'give exactly three numbers [vx, vy, vz] in km/s',
  satellites: 'list at least one satellite under satellites:',
  tle: 'write the TLE as a block text (tle: |) or as a list [line1, line2]',
  omm: 'give CCSDS OMM keys with text or number values, e.g. OBJECT_NAME, EPOCH, MEAN_MOTION',
  id: 'give a non-empty text id; in YAML quote an id that looks like a number, e.g. id: "43873"',
};

// ---------------------------------------------------------------------------------------------
// Entry point

/**
 * Parse and check a scenario file's text. JSON or YAML by the extension of `fileName`
 * (.json / .yaml / .yml), else by content (`{` first means JSON). `fileName` is used in
 * messages and to resolve relative paths (SP3 files) against its folder. Times are read with
 * `timeSystem` (UTC with `Z`, or a scale name); a time error is reported at its JSON path.
 * @throws ScenarioError for any fault, with the JSON path (or file:line for syntax errors).
 */
export function parseScenarioText(text: string, fileName: string, timeSystem: TimeSystem): ScenarioSpec {
  const body = text.startsWith('\uFEFF') ? text.slice(1) : text;
  const { data, lineOf } = readDocument(body, fileName);
  const ctx = new Context(fileName, lineOf, timeSystem);
  const parsed = ScenarioSchema.safeParse(data);
  if (!parsed.success) throw issueError(pickIssue(parsed.error.issues), data, ctx);
  return buildSpec(parsed.data, ctx);
}

/** Format a path as `satellites[2].clock.agingPerDay` (empty path: ''). */
export function formatPath(path: readonly PathSeg[]): string {
  let out = '';
  for (const seg of path) {
    if (typeof seg === 'number') out += `[${seg}]`;
    else if (/^[A-Za-z_$][\w$]*$/.test(seg)) out += out === '' ? seg : `.${seg}`;
    else out += `[${JSON.stringify(seg)}]`;
  }
  return out;
}

// ---------------------------------------------------------------------------------------------
// Reading text

type LineOf = (path: readonly PathSeg[]) => number | null;

function readDocument(body: string, fileName: string): { data: unknown; lineOf: LineOf } {
  const lower = fileName.toLowerCase();
  const isJson = lower.endsWith('.json') || (!lower.endsWith('.yaml') && !lower.endsWith('.yml') && body.trimStart().startsWith('{'));
  if (isJson) {
    let data: unknown;
    try {
      data = JSON.parse(body);
    } catch (err) {
      throw jsonSyntaxError(body, fileName, err as Error);
    }
    // JSON is YAML 1.2 flow style, so the YAML parser can point at lines for later errors.
    let cached: LineOf | undefined;
    return {
      data,
      lineOf: (path) => {
        cached ??= yamlLineOf(body);
        return cached(path);
      },
    };
  }
  const lineCounter = new LineCounter();
  const doc = parseDocument(body, { lineCounter, prettyErrors: true, uniqueKeys: true });
  const first = doc.errors[0];
  if (first !== undefined) {
    const line = first.linePos?.[0].line ?? 1;
    const col = first.linePos?.[0].col;
    const message = first.message.split('\n')[0].replace(/ at line \d+, column \d+:?$/, '');
    throw new ScenarioError(
      `YAML syntax error: ${message}${col === undefined ? '' : ` (column ${col})`}`,
      `${fileName}:${line}`,
      first.code === 'DUPLICATE_KEY' ? 'give each key once in its mapping' : 'check indentation, colons, quotes and brackets on that line or the one before',
    );
  }
  let data: unknown;
  try {
    data = doc.toJS({ maxAliasCount: 1000 });
  } catch (err) {
    // The yaml library throws a ReferenceError for an alias with no anchor before it and for an
    // alias bomb (more than maxAliasCount expansions); both are faults of the file.
    const message = (err as Error).message.split('\n')[0];
    throw new ScenarioError(`YAML aliases cannot be expanded: ${message}`, fileName, 'define each anchor (&name) before its alias (*name), and do not nest aliases many levels deep');
  }
  return { data, lineOf: lineOfDocument(doc, lineCounter) };
}

function yamlLineOf(body: string): LineOf {
  const lineCounter = new LineCounter();
  const doc = parseDocument(body, { lineCounter });
  if (doc.errors.length > 0) return () => null;
  return lineOfDocument(doc, lineCounter);
}

/** The line of the deepest node along `path` that exists in the document (1-based). */
function lineOfDocument(doc: Document, lineCounter: LineCounter): LineOf {
  return (path) => {
    let node: unknown = doc.contents;
    let line: number | null = null;
    const lineAt = (n: unknown): number | null => {
      const range = (n as { range?: [number, number, number] } | null)?.range;
      return range === undefined ? null : lineCounter.linePos(range[0]).line;
    };
    line = lineAt(node);
    for (const seg of path) {
      if (isMap(node)) {
        const pair = node.items.find((p) => isScalar(p.key) && String(p.key.value) === String(seg));
        if (pair === undefined) break;
        line = lineAt(pair.key) ?? line;
        node = pair.value;
      } else if (isSeq(node) && typeof seg === 'number') {
        node = node.items[seg];
        if (node === undefined) break;
        line = lineAt(node) ?? line;
      } else break;
    }
    return line;
  };
}

/** A JSON syntax error at file:line. V8's messages do not always carry a position, so find it. */
function jsonSyntaxError(body: string, fileName: string, err: Error): ScenarioError {
  const found = firstJsonError(body);
  if (found === null) {
    return new ScenarioError(`JSON syntax error: ${err.message.split('\n')[0]}`, `${fileName}:1`, 'check the file is valid JSON');
  }
  const before = body.slice(0, found.offset);
  const line = before.split('\n').length;
  const col = found.offset - before.lastIndexOf('\n');
  const at = found.offset >= body.length ? 'the end of the file' : JSON.stringify(body[found.offset]);
  return new ScenarioError(
    `JSON syntax error: expected ${found.expected} but found ${at} (column ${col})`,
    `${fileName}:${line}`,
    'check commas, quotes and brackets there (JSON allows no trailing commas or comments)',
  );
}

/** Offset of the first JSON syntax error and what was expected there; null if the text is valid. */
function firstJsonError(s: string): { offset: number; expected: string } | null {
  let i = 0;
  class Stop {
    constructor(readonly expected: string) {}
  }
  const ws = (): void => {
    while (i < s.length && (s[i] === ' ' || s[i] === '\t' || s[i] === '\n' || s[i] === '\r')) i++;
  };
  const str = (): void => {
    i++; // opening quote
    for (;;) {
      if (i >= s.length) throw new Stop('a closing "');
      const c = s[i];
      if (c === '"') {
        i++;
        return;
      }
      if (c === '\\') {
        const e = s[i + 1];
        if (e === 'u') {
          if (!/^[0-9a-fA-F]{4}$/.test(s.slice(i + 2, i + 6))) {
            i += 2;
            throw new Stop('four hex digits after \\u');
          }
          i += 6;
        } else if (e !== undefined && '"\\/bfnrt'.includes(e)) i += 2;
        else {
          i++;
          throw new Stop('a valid escape (\\" \\\\ \\/ \\b \\f \\n \\r \\t \\uXXXX)');
        }
      } else if (c.charCodeAt(0) < 0x20) throw new Stop('no raw control character inside a string (write \\n)');
      else i++;
    }
  };
  const num = /-?(?:0|[1-9]\d*)(?:\.\d+)?(?:[eE][+-]?\d+)?/y;
  const value = (depth: number): void => {
    if (depth > 500) throw new Stop('less nesting');
    ws();
    const c = s[i];
    if (c === '{' || c === '[') {
      const close = c === '{' ? '}' : ']';
      i++;
      ws();
      if (s[i] === close) {
        i++;
        return;
      }
      for (;;) {
        if (c === '{') {
          ws();
          if (s[i] !== '"') throw new Stop('a double-quoted key');
          str();
          ws();
          if (s[i] !== ':') throw new Stop('":"');
          i++;
        }
        value(depth + 1);
        ws();
        if (s[i] === ',') {
          i++;
          continue;
        }
        if (s[i] === close) {
          i++;
          return;
        }
        throw new Stop(`"," or "${close}"`);
      }
    }
    if (c === '"') return str();
    for (const lit of ['true', 'false', 'null']) {
      if (s.startsWith(lit, i)) {
        i += lit.length;
        return;
      }
    }
    num.lastIndex = i;
    const m = num.exec(s);
    if (m !== null) {
      i += m[0].length;
      return;
    }
    throw new Stop('a value');
  };
  try {
    value(0);
    ws();
    if (i < s.length) throw new Stop('the end of the file');
    return null;
  } catch (e) {
    if (e instanceof Stop) return { offset: i, expected: e.expected };
    throw e;
  }
}

// ---------------------------------------------------------------------------------------------
// zod issues → one ScenarioError

type Issue = z.core.$ZodIssue;

class Context {
  constructor(
    readonly fileName: string,
    readonly lineOf: LineOf,
    readonly timeSystem: TimeSystem,
  ) {}

  /** A ScenarioError at `path`, with the file line appended to `what` when it is known. */
  error(path: readonly PathSeg[], what: string, fix: string): ScenarioError {
    const line = this.lineOf(path);
    const where = formatPath(path);
    return new ScenarioError(line === null ? what : `${what}, at ${this.fileName}:${line}`, where === '' ? this.fileName : where, fix);
  }

  time(textValue: string, path: readonly PathSeg[]): Instant {
    try {
      return this.timeSystem.parse(textValue, formatPath(path));
    } catch (e) {
      if (e instanceof TimeError) throw this.error(path, e.what, e.fix);
      throw e;
    }
  }

  durationS(textValue: string, path: readonly PathSeg[]): number {
    let v: number;
    try {
      v = parseDurationS(textValue, formatPath(path));
    } catch (e) {
      if (e instanceof TimeError) throw this.error(path, e.what, e.fix);
      throw e;
    }
    if (!(v >= 0)) throw this.error(path, `duration ${JSON.stringify(textValue)} is negative`, 'give a span of 0 or more, e.g. 2h');
    return v;
  }
}

/** An unknown key explains itself best (a typo also makes its real key look missing), so it goes first. */
function pickIssue(issues: readonly Issue[]): Issue {
  return issues.find((i) => i.code === 'unrecognized_keys') ?? issues[0];
}

function issueError(issue: Issue, data: unknown, ctx: Context): ScenarioError {
  const path = issue.path.filter((s): s is PathSeg => typeof s !== 'symbol');
  const last = path.length > 0 ? String(path[path.length - 1]) : '';
  const lastKey = [...path].reverse().find((s): s is string => typeof s === 'string') ?? '';
  const value = valueAt(data, path);
  const hint = FIELD_HINTS[lastKey];
  switch (issue.code) {
    case 'unrecognized_keys': {
      const key = issue.keys[0];
      const known = knownKeysAt(ScenarioSchema, path);
      const near = nearest(key, known);
      return ctx.error(
        [...path, key],
        `unknown key ${JSON.stringify(key)}`,
        near !== null ? `did you mean "${near}"?` : `remove it; the keys allowed here are ${known.join(', ')}`,
      );
    }
    case 'invalid_type': {
      const expected = describeExpected(issue.expected);
      if (path.length === 0 && (value === null || value === undefined)) {
        return ctx.error(path, 'the file holds no scenario (it is empty)', 'write at least window and satellites');
      }
      if (value === undefined && isPlainObject(valueAt(data, path.slice(0, -1)))) {
        return ctx.error(path, `missing key "${last}" (${expected})`, hint === undefined ? `add ${last}: <${expected}>` : `add ${last}; ${hint}`);
      }
      const fix = lastKey === 'id' && hint !== undefined ? hint : typeFix(issue.expected, value);
      return ctx.error(path, `found ${describeValue(value)}, expected ${expected}`, fix);
    }
    case 'too_small':
    case 'too_big': {
      const small = issue.code === 'too_small';
      const bound = Number(small ? (issue as { minimum: number | bigint }).minimum : (issue as { maximum: number | bigint }).maximum);
      const inclusive = (issue as { inclusive?: boolean }).inclusive !== false;
      if (issue.origin === 'array') {
        const n = Array.isArray(value) ? value.length : 0;
        const need = small ? `at least ${bound}` : `at most ${bound}`;
        return ctx.error(path, n === 0 ? 'the list is empty' : `the list has ${n} items, needs ${need}`, hint ?? `give ${need} items`);
      }
      if (issue.origin === 'string') return ctx.error(path, 'the text is empty', hint ?? 'give a non-empty text');
      const op = small ? (inclusive ? '≥' : '>') : inclusive ? '≤' : '<';
      return ctx.error(path, `found ${describeValue(value)}, must be ${op} ${bound}`, hint ?? `use a value ${op} ${bound}`);
    }
    case 'invalid_value': {
      const options = issue.values.map((v) => String(v));
      const near = typeof value === 'string' ? nearest(value, options) : null;
      return ctx.error(
        path,
        `found ${describeValue(value)}, expected one of ${options.join(' | ')}`,
        near !== null ? `did you mean "${near}"?` : `use one of ${options.join(', ')}`,
      );
    }
    case 'invalid_union':
      return ctx.error(path, `found ${describeValue(value)}; ${issue.message}`, hint ?? issue.message);
    default:
      return ctx.error(path, `${issue.message}; found ${describeValue(value)}`, hint ?? 'see the scenario format in the documentation');
  }
}

function isPlainObject(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

function valueAt(data: unknown, path: readonly PathSeg[]): unknown {
  let v = data;
  for (const seg of path) {
    if (Array.isArray(v) && typeof seg === 'number') v = v[seg];
    else if (isPlainObject(v) && Object.hasOwn(v, String(seg))) v = v[String(seg)];
    else return undefined;
  }
  return v;
}

/** Keys of the object schema found at `path` (through optionals, arrays, tuples, records). */
function knownKeysAt(schema: z.ZodType, path: readonly PathSeg[]): string[] {
  let s: z.ZodType | undefined = schema;
  const unwrap = (x: z.ZodType): z.ZodType => {
    let cur = x;
    while (cur instanceof z.ZodOptional || cur instanceof z.ZodNullable || cur instanceof z.ZodDefault) cur = cur.unwrap() as z.ZodType;
    return cur;
  };
  for (const seg of path) {
    if (s === undefined) return [];
    const u = unwrap(s);
    if (u instanceof z.ZodObject) s = (u.shape as Record<string, z.ZodType>)[String(seg)];
    else if (u instanceof z.ZodArray) s = u.element as z.ZodType;
    else if (u instanceof z.ZodTuple) s = (u.def.items as z.ZodType[])[Number(seg)];
    else if (u instanceof z.ZodRecord) s = u.valueType as z.ZodType;
    else return [];
  }
  if (s === undefined) return [];
  const u = unwrap(s);
  return u instanceof z.ZodObject ? Object.keys(u.shape as Record<string, unknown>) : [];
}

function describeExpected(expected: string): string {
  switch (expected) {
    case 'number':
      return 'a number';
    case 'string':
      return 'a text';
    case 'object':
      return 'a mapping of keys';
    case 'array':
    case 'tuple':
      return 'a list';
    default:
      return `a ${expected}`;
  }
}

function describeValue(v: unknown): string {
  if (v === undefined) return 'nothing';
  if (v === null) return 'an empty value (null)';
  if (typeof v === 'string') {
    const shown = v.length > 40 ? `${v.slice(0, 37)}...` : v;
    return `${JSON.stringify(shown)} (a text)`;
  }
  if (typeof v === 'number') return Number.isFinite(v) ? String(v) : `${v} (not finite)`;
  if (typeof v === 'boolean') return `${v} (a boolean)`;
  if (Array.isArray(v)) return `a list of ${v.length} item${v.length === 1 ? '' : 's'}`;
  if (isPlainObject(v)) return 'a mapping';
  return typeof v;
}

function typeFix(expected: string, value: unknown): string {
  if (expected === 'number' && typeof value === 'string') {
    return /^\s*[-+]?[\d.]/.test(value)
      ? 'write the bare number without quotes or unit; the unit is the one in the key name'
      : 'write a plain number, e.g. 0 or -4.4647e-10';
  }
  if (expected === 'number') return 'write a plain, finite number';
  if (expected === 'string' && typeof value === 'number') return `quote it: "${value}"`;
  if (expected === 'object') return 'give a mapping (indented keys in YAML, { ... } in JSON)';
  if (expected === 'array' || expected === 'tuple') return 'give a list ([a, b] or "- item" lines)';
  return `give ${describeExpected(expected)}`;
}

// ---------------------------------------------------------------------------------------------
// Cross-field checks and the typed spec

function buildSpec(raw: RawScenario, ctx: Context): ScenarioSpec {
  const start = ctx.time(raw.window.start, ['window', 'start']);
  const end = ctx.time(raw.window.end, ['window', 'end']);
  if (!(end.minusS(start) > 0)) {
    throw ctx.error(
      ['window', 'end'],
      `window end ${JSON.stringify(raw.window.end)} is not after its start ${JSON.stringify(raw.window.start)}`,
      'make window.end later than window.start',
    );
  }

  const seenIds = new Map<string, string>();
  const claimId = (id: string, path: PathSeg[]): void => {
    const previous = seenIds.get(id);
    if (previous !== undefined) {
      throw ctx.error(path, `id ${JSON.stringify(id)} is already used by ${previous}`, 'give every satellite and station its own id (ids name clocks in compare and resets)');
    }
    seenIds.set(id, formatPath(path.slice(0, -1)));
  };

  const satellites = raw.satellites.map((sat, i): SatelliteSpec => {
    const base: PathSeg[] = ['satellites', i];
    claimId(sat.id, [...base, 'id']);
    const orbit = buildOrbit(sat.orbit, [...base, 'orbit'], ctx);
    let name: string | null = sat.name ?? null;
    if (name === null && orbit.kind === 'tle' && orbit.nameLine !== null) name = orbit.nameLine.replace(/^0 /, '').trim() || null;
    if (name === null && orbit.kind === 'omm' && typeof orbit.fields.OBJECT_NAME === 'string') name = orbit.fields.OBJECT_NAME.trim() || null;
    const c = sat.clock;
    const clock: ClockSpec | null =
      c === undefined
        ? null
        : {
            epoch: c.epoch === undefined ? start : ctx.time(c.epoch, [...base, 'clock', 'epoch']),
            offsetNs: c.offsetNs ?? 0,
            hardwareFractionalOffset: c.hardwareFractionalOffset ?? 0,
            agingPerDay: c.agingPerDay ?? 0,
            noise: {
              whiteFmAdev1s: c.noise?.whiteFmAdev1s ?? 0,
              flickerFmFloor: c.noise?.flickerFmFloor ?? 0,
              randomWalkFmAdev1d: c.noise?.randomWalkFmAdev1d ?? 0,
            },
            keepInNs: c.keepInNs ?? null,
          };
    return { id: sat.id, name, orbit, clock, path: formatPath(base) };
  });

  const stations = (raw.stations ?? []).map((st, i): StationSpec => {
    const base: PathSeg[] = ['stations', i];
    claimId(st.id, [...base, 'id']);
    return {
      id: st.id,
      latDeg: st.latDeg,
      lonDeg: st.lonDeg,
      heightM: st.heightM,
      geoidHeightM: st.geoidHeightM ?? 0,
      maskDeg: st.maskDeg ?? 10,
      minPassS: st.minPassS ?? 300,
      path: formatPath(base),
    };
  });

  const p = raw.policy;
  const policy: ResetPolicySpec = {
    marginNs: p?.marginNs ?? 0,
    leadTimeS: p?.leadTime === undefined ? null : ctx.durationS(p.leadTime, ['policy', 'leadTime']),
    prefer: p?.prefer ?? 'phase',
    horizonS: ctx.durationS(p?.horizon ?? DEFAULT_HORIZON, ['policy', 'horizon']),
  };
  if (!(policy.horizonS > 0)) throw ctx.error(['policy', 'horizon'], 'the horizon is zero', 'give a span greater than zero, e.g. 180d');
  for (const sat of satellites) {
    const limit = sat.clock?.keepInNs ?? null;
    if (limit !== null && !(policy.marginNs < limit)) {
      throw ctx.error(
        ['policy', 'marginNs'],
        `margin ${policy.marginNs} ns is not below the keep-in limit ${limit} ns of ${sat.path}.clock.keepInNs`,
        'make policy.marginNs smaller than every satellite keepInNs',
      );
    }
  }

  return {
    name: raw.name ?? baseName(ctx.fileName),
    fileName: ctx.fileName,
    folder: dirname(resolve(ctx.fileName)),
    window: { start, end },
    gravity: raw.gravity ?? 'zonal',
    tides: raw.tides ?? false,
    reference: raw.reference ?? 'GPS',
    satellites,
    stations,
    policy,
  };
}

function buildOrbit(o: RawScenario['satellites'][number]['orbit'], path: PathSeg[], ctx: Context): OrbitSpec {
  const given = ORBIT_KINDS.filter((k) => o[k] !== undefined);
  if (given.length !== 1) {
    throw ctx.error(
      path,
      given.length === 0 ? 'no orbit given' : `${given.length} orbit kinds given (${given.join(', ')})`,
      `give exactly one of ${ORBIT_KINDS.join(', ')}`,
    );
  }
  if (o.tle !== undefined) return buildTle(o.tle, [...path, 'tle'], ctx);
  if (o.omm !== undefined) return { kind: 'omm', fields: { ...o.omm } };
  if (o.keplerian !== undefined) {
    const k = o.keplerian;
    const perigeeKm = k.aKm * (1 - k.e);
    if (!(perigeeKm > WGS84_A_KM)) {
      throw ctx.error(
        [...path, 'keplerian', 'aKm'],
        `perigee radius aKm·(1 − e) = ${perigeeKm.toFixed(3)} km is not above the Earth's equatorial radius ${WGS84_A_KM} km`,
        "aKm is measured from the Earth's centre (altitude + 6378.137 km); raise aKm or lower e",
      );
    }
    return { kind: 'keplerian', ...k, epoch: ctx.time(k.epoch, [...path, 'keplerian', 'epoch']) };
  }
  if (o.state !== undefined) {
    const s = o.state;
    const rKm = Math.hypot(...s.positionKm);
    if (!(rKm >= WGS84_POLAR_RADIUS_KM)) {
      throw ctx.error(
        [...path, 'state', 'positionKm'],
        `position is ${rKm.toFixed(3)} km from the Earth's centre, inside the Earth (polar radius ${WGS84_POLAR_RADIUS_KM.toFixed(3)} km)`,
        'give the geocentric position in km, not metres or an altitude',
      );
    }
    return {
      kind: 'state',
      epoch: ctx.time(s.epoch, [...path, 'state', 'epoch']),
      frame: s.frame,
      positionKm: [...s.positionKm],
      velocityKmPerS: [...s.velocityKmPerS],
    };
  }
  const sp3 = o.sp3!;
  return { kind: 'sp3', file: sp3.file, resolvedFile: resolve(dirname(resolve(ctx.fileName)), sp3.file), id: sp3.id };
}

function buildTle(tle: string | string[], path: PathSeg[], ctx: Context): TleOrbitSpec {
  const lines = (typeof tle === 'string' ? tle.split(/\r?\n/) : tle).map((l) => l.trimEnd()).filter((l) => l.trim() !== '');
  if (lines.length !== 2 && lines.length !== 3) {
    throw ctx.error(path, `the TLE has ${lines.length} non-empty line${lines.length === 1 ? '' : 's'}, expected 2 (or 3 with a name line)`, FIELD_HINTS.tle);
  }
  const [line1, line2] = lines.slice(-2);
  for (const [n, line] of [
    [1, line1],
    [2, line2],
  ] as const) {
    if (!line.startsWith(`${n} `)) {
      const shown = line.length > 20 ? `${line.slice(0, 20)}...` : line;
      throw ctx.error(path, `TLE line ${n} should start with "${n} ", found ${JSON.stringify(shown)}`, 'give the element lines in order: optional name, then line 1, then line 2');
    }
  }
  const nameLine = lines.length === 3 ? lines[0] : null;
  return { kind: 'tle', nameLine, line1, line2, text: lines.join('\n') };
}

function baseName(fileName: string): string {
  const base = fileName.split(/[\\/]/).pop() ?? fileName;
  return base.replace(/\.(json|ya?ml)$/i, '') || fileName;
}
