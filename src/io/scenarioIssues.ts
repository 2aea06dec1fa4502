/**
 * Turning a zod issue into one ScenarioError with a JSON path, the file line and a fix; and the
 * context (file, line map, time system) that later checks use to raise errors the same way.
 */
import { z } from 'zod';
import { ScenarioError, TimeError } from '../errors.ts';
import type { Instant } from '../time/instant.ts';
import { parseDurationS } from '../time/duration.ts';
import type { TimeSystem } from '../time/timeSystem.ts';
import type { LineOf } from './scenarioDocument.ts';
import { FIELD_HINTS, formatPath, ScenarioSchema, type PathSeg } from './scenarioSchema.ts';
import { nearest } from './suggest.ts';

type Issue = z.core.$ZodIssue;

/** Where errors are raised from: file name, line map and time system. */
export class Context {
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
export function pickIssue(issues: readonly Issue[]): Issue {
  return issues.find((i) => i.code === 'unrecognized_keys') ?? issues[0];
}

/** One ScenarioError for a zod issue, at its JSON path and file line. */
export function issueError(issue: Issue, data: unknown, ctx: Context): ScenarioError {
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
