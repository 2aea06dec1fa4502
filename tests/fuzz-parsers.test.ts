/**
 * Robustness of every text parser and validator, by property-based fuzzing (fast-check).
 *
 * Document: src/errors.ts and the tauplan public interface (/work/shared/contract.md, § Conventions):
 * every fault caused by input is an InputError whose `what`, `where` and `fix` the CLI prints on
 * one line, `tauplan: <what> (<where>) — <fix>`. So for any input a parser must either return a
 * value or throw an InputError subclass with three non-empty, single-line parts; anything else
 * (TypeError, RangeError, plain Error, InternalError) is a failure. Values returned must hold
 * finite numbers where a non-finite one is nonsense (mean motion, ttJ2000S, durations, ...).
 *
 * Inputs: every valid seed below is invented here (satellite 99901 "TAUPLAN-FUZZ", the station
 * "Fuzz Hill", the measurement rows); none comes from a real catalogue. The SP3 seeds are cut
 * from the invented fixtures of tests/fixtures/sp3/ (see its README). Mutations of those seeds
 * (flip, insert, delete characters; swap, duplicate lines; truncate; change digits; insert tabs,
 * CR, unicode, huge numbers, NaN, Infinity, −0) reach far deeper into the parsers than random text.
 * The TLE mutator re-computes column 69 so that mutated lines pass the checksum and reach the
 * field checks. No reference values: the properties are the error convention (common practice).
 *
 * Every property is seeded and bounded (numRuns) so the file stays fast and repeatable; each call
 * must also finish within PER_CALL_LIMIT_MS, which catches runaway loops and backtracking.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InputError } from '../src/errors.ts';
import { ommFromObject, parseOmmFile, type OmmRecord } from '../src/io/omm.ts';
import { parseMeasurementsCsv, type Measurements } from '../src/io/measurements.ts';
import { parseScenarioText, type ScenarioSpec } from '../src/io/scenario.ts';
import { defaultTimeSystem } from '../src/io/tables.ts';
import { formatTleLine, parseTleFile, tleChecksum, type TleRecord } from '../src/io/tle.ts';
import { parseDurationS } from '../src/time/duration.ts';
import type { Instant } from '../src/time/instant.ts';
import type { CivilTime } from '../src/time/timeSystem.ts';
import { stringify as yamlStringify } from 'yaml';
import { readFileSync } from 'node:fs';
import { parseSp3, type Sp3File } from '../src/io/sp3.ts';

const ts = defaultTimeSystem();

/** Seed of every property; change it to explore, keep it fixed in CI. */
const SEED = Number(process.env.TAUPLAN_FUZZ_SEED ?? 20270301);
/** Runs per property: enough to reach every field a few times, small enough for CI (< 20 s total). */
const RUNS_SCALE = Number(process.env.TAUPLAN_FUZZ_RUNS_SCALE ?? 1);
const RUNS = 300;
/**
 * Wall-clock limit for one parser call [ms]. Inputs are at most a few kB, which every parser reads
 * in well under 10 ms; 3 s leaves room for a cold JIT on a machine whose load reaches 10 (a
 * 1000-deep JSON nesting took 681 ms there), while an uncapped loop or catastrophic regex
 * backtracking runs for minutes.
 */
const PER_CALL_LIMIT_MS = 3000;

// ---------------------------------------------------------------------------------------------
// The property every parser must keep

/** Throws (failing the property) unless `e` is an InputError with three one-line, non-empty parts. */
function checkInputError(e: unknown, label: string): void {
  if (!(e instanceof InputError)) {
    const name = e instanceof Error ? `${e.name}: ${e.message}` : `non-Error ${String(e)}`;
    throw new Error(`${label} threw something other than an InputError — ${name}`);
  }
  for (const part of ['what', 'where', 'fix'] as const) {
    const v: unknown = e[part];
    if (typeof v !== 'string' || v.trim() === '') throw new Error(`${label}: InputError.${part} is empty (${e.name}: ${e.message})`);
    if (/[\r\n]/.test(v)) throw new Error(`${label}: InputError.${part} spans lines: ${JSON.stringify(v)}`);
  }
}

/** Run one parser call: a value (checked by `checkValue`) or an InputError, quickly. */
function returnsOrInputError<T>(label: string, call: () => T, checkValue: (v: T) => void): void {
  const t0 = performance.now();
  let value: T;
  try {
    value = call();
  } catch (e) {
    expectQuick(label, t0);
    checkInputError(e, label);
    return;
  }
  expectQuick(label, t0);
  checkValue(value);
}

function expectQuick(label: string, t0: number): void {
  const ms = performance.now() - t0;
  if (ms > PER_CALL_LIMIT_MS) throw new Error(`${label} took ${ms.toFixed(0)} ms (limit ${PER_CALL_LIMIT_MS} ms)`);
}

function finite(x: unknown, what: string): void {
  if (typeof x !== 'number' || !Number.isFinite(x)) throw new Error(`${what} is ${String(x)}, expected a finite number`);
}

function checkCivil(c: CivilTime, what: string): void {
  for (const [k, v] of Object.entries(c)) finite(v, `${what}.${k}`);
  if (!(c.month >= 1 && c.month <= 12 && c.day >= 1 && c.day <= 31 && c.hour >= 0 && c.hour <= 23 && c.minute >= 0 && c.minute <= 59 && c.second >= 0 && c.second < 61)) {
    throw new Error(`${what} is not a calendar time: ${JSON.stringify(c)}`);
  }
}

function checkInstant(t: Instant, what: string): void {
  finite(t.ttJ2000S, `${what}.ttJ2000S`);
  if (!Number.isInteger(t.taiWholeS) || !(t.taiFracS >= 0 && t.taiFracS < 1)) throw new Error(`${what} is not normalised: ${t.taiWholeS} + ${t.taiFracS}`);
  // Instant keeps whole seconds exact only below 2^53 s (src/time/instant.ts); past that it is garbage.
  if (!Number.isSafeInteger(t.taiWholeS)) throw new Error(`${what} is beyond exact whole seconds: ${t.taiWholeS} s`);
}

/** Seeded, bounded assert. TAUPLAN_FUZZ_SEED and TAUPLAN_FUZZ_RUNS_SCALE explore further by hand. */
const run = <T>(prop: fc.IProperty<T>, numRuns = RUNS): void => fc.assert(prop, { seed: SEED, numRuns: Math.round(numRuns * RUNS_SCALE) });

// ---------------------------------------------------------------------------------------------
// Mutations of valid text

/** Characters a careless edit, an encoding mix-up or a hostile file may bring in. */
const ODD_CHARS = ['0', '1', '5', '9', '-', '+', '.', ',', ' ', '\t', '\r', '\n', 'e', 'E', 'Z', 'T', ':', '"', "'", '#', '[', ']', '{', '}', '<', '>', '&', '*', '!', '|', '\\', '\u0000', '\u00a0', '\u00e9', '\u2028', '\ufeff', '\u{1F6F0}'];
/** Whole tokens worth splicing in, mostly numbers a parser could mistake for valid ones. */
const ODD_TOKENS = ['NaN', 'Infinity', '-Infinity', '-0', '0', '1e999', '-1e308', '9'.repeat(40), '0x10', '1_000', '.5', '5.', '1e-400', 'null', 'true', '~', '&a', '*a', '\r\n', '  ', '\t\t', '60', '99', '366', '23:59:60', '2016-12-31', '1969-12-31', '9999-12-31', 'GPS', 'UTC', 'TT', 'Q', ' '.repeat(2000), '9'.repeat(2000)];

type Op =
  | { kind: 'flip'; at: number; char: string }
  | { kind: 'insert'; at: number; text: string }
  | { kind: 'delete'; at: number; length: number }
  | { kind: 'digit'; at: number; digit: number }
  | { kind: 'token'; at: number; text: string }
  | { kind: 'swapLines'; a: number; b: number }
  | { kind: 'dupLine'; a: number }
  | { kind: 'truncate'; at: number };

const opArb: fc.Arbitrary<Op> = fc.oneof(
  fc.record({ kind: fc.constant('flip' as const), at: fc.nat(), char: fc.constantFrom(...ODD_CHARS) }),
  fc.record({ kind: fc.constant('insert' as const), at: fc.nat(), text: fc.oneof(fc.constantFrom(...ODD_CHARS), fc.string({ maxLength: 4, unit: 'binary' })) }),
  fc.record({ kind: fc.constant('delete' as const), at: fc.nat(), length: fc.integer({ min: 1, max: 6 }) }),
  fc.record({ kind: fc.constant('digit' as const), at: fc.nat(), digit: fc.integer({ min: 0, max: 9 }) }),
  fc.record({ kind: fc.constant('token' as const), at: fc.nat(), text: fc.constantFrom(...ODD_TOKENS) }),
  fc.record({ kind: fc.constant('swapLines' as const), a: fc.nat(), b: fc.nat() }),
  fc.record({ kind: fc.constant('dupLine' as const), a: fc.nat() }),
  fc.record({ kind: fc.constant('truncate' as const), at: fc.nat() }),
);

/** Replace the number (or word) around position `at` by `text`. */
function replaceToken(s: string, at: number, text: string): string {
  const re = /[-+0-9.eE]+|[A-Za-z_]+/g;
  const tokens = [...s.matchAll(re)];
  if (tokens.length === 0) return s + text;
  const t = tokens[at % tokens.length];
  return s.slice(0, t.index) + text + s.slice(t.index + t[0].length);
}

function applyOp(s: string, op: Op): string {
  const n = s.length;
  switch (op.kind) {
    case 'flip':
      return n === 0 ? op.char : s.slice(0, op.at % n) + op.char + s.slice((op.at % n) + 1);
    case 'insert': {
      const at = op.at % (n + 1);
      return s.slice(0, at) + op.text + s.slice(at);
    }
    case 'delete': {
      const at = op.at % (n + 1);
      return s.slice(0, at) + s.slice(at + op.length);
    }
    case 'digit': {
      const digits = [...s.matchAll(/\d/g)];
      if (digits.length === 0) return s;
      const i = digits[op.at % digits.length].index;
      return s.slice(0, i) + String(op.digit) + s.slice(i + 1);
    }
    case 'token':
      return replaceToken(s, op.at, op.text);
    case 'swapLines': {
      const lines = s.split('\n');
      const a = op.a % lines.length;
      const b = op.b % lines.length;
      [lines[a], lines[b]] = [lines[b], lines[a]];
      return lines.join('\n');
    }
    case 'dupLine': {
      const lines = s.split('\n');
      const a = op.a % lines.length;
      lines.splice(a, 0, lines[a]);
      return lines.join('\n');
    }
    case 'truncate':
      return s.slice(0, op.at % (n + 1));
  }
}

/** A valid seed with 1–4 mutations applied. */
function mutationsOf(seeds: readonly string[]): fc.Arbitrary<string> {
  return fc
    .tuple(fc.constantFrom(...seeds), fc.array(opArb, { minLength: 1, maxLength: 4 }))
    .map(([seed, ops]) => ops.reduce(applyOp, seed));
}

/** Random text, including lone surrogates and control characters. */
const randomText = fc.oneof(fc.string({ maxLength: 200, unit: 'binary' }), fc.string({ maxLength: 200, unit: 'grapheme' }), fc.string({ maxLength: 200 }));

// ---------------------------------------------------------------------------------------------
// Invented valid seeds

/** Invented element set for satellite 99901 (not a real object), columns per the TLE format. */
const TLE_L1_BODY = '1 99901U 27001A   27060.50000000  .00000123  00000-0  12345-4 0  999';
const TLE_L2_BODY = '2 99901  55.0000 123.4567 0012345  45.6789 314.1592  2.00561234 1234';
const TLE_L1 = formatTleLine(TLE_L1_BODY);
const TLE_L2 = formatTleLine(TLE_L2_BODY);
/** A second invented set (Alpha-5 catalogue number, leap-year day 366), as a bare two-line set. */
const TLE_B1 = formatTleLine('1 A0001U 24100B   24366.99999999 -.00001000  12345-5 -12345-3 0    1');
const TLE_B2 = formatTleLine('2 A0001  98.7000 359.9999 9999999 359.9999   0.0001 16.00000000    1');
const TLE_SEEDS = [`TAUPLAN-FUZZ 1\n${TLE_L1}\n${TLE_L2}\n`, `0 TAUPLAN-FUZZ 1\r\n${TLE_L1}\r\n${TLE_L2}\r\n\r\n${TLE_B1}\r\n${TLE_B2}`, `${TLE_B1}\n${TLE_B2}\n\nTAUPLAN-FUZZ 1\n${TLE_L1}\n${TLE_L2}`];

/** Invented OMM keywords for satellite 99901 (CCSDS 502.0-B keyword names, made-up values). */
const OMM_KEYWORDS: [string, string][] = [
  ['OBJECT_NAME', 'TAUPLAN-FUZZ 1'],
  ['OBJECT_ID', '2027-001A'],
  ['CENTER_NAME', 'EARTH'],
  ['REF_FRAME', 'TEME'],
  ['TIME_SYSTEM', 'UTC'],
  ['MEAN_ELEMENT_THEORY', 'SGP4'],
  ['EPOCH', '2027-03-01T12:00:00.000000'],
  ['MEAN_MOTION', '15.50000000'],
  ['ECCENTRICITY', '0.0012345'],
  ['INCLINATION', '51.6000'],
  ['RA_OF_ASC_NODE', '123.4567'],
  ['ARG_OF_PERICENTER', '45.6789'],
  ['MEAN_ANOMALY', '314.1592'],
  ['EPHEMERIS_TYPE', '0'],
  ['CLASSIFICATION_TYPE', 'U'],
  ['NORAD_CAT_ID', '99901'],
  ['ELEMENT_SET_NO', '999'],
  ['REV_AT_EPOCH', '12345'],
  ['BSTAR', '0.00012345'],
  ['MEAN_MOTION_DOT', '0.00000123'],
  ['MEAN_MOTION_DDOT', '0'],
];
const OMM_KVN = [
  'CCSDS_OMM_VERS = 2.0',
  'COMMENT invented element set for fuzzing',
  'CREATION_DATE = 2027-03-01T00:00:00',
  'ORIGINATOR = TAUPLAN TESTS',
  ...OMM_KEYWORDS.map(([k, v]) => `${k} = ${v}${k === 'MEAN_MOTION' ? ' [rev/day]' : k === 'INCLINATION' ? ' [deg]' : ''}`),
].join('\n');
const OMM_XML = [
  '<?xml version="1.0" encoding="UTF-8"?>',
  '<ndm><omm id="CCSDS_OMM_VERS" version="2.0">',
  '<header><CREATION_DATE>2027-03-01T00:00:00</CREATION_DATE><ORIGINATOR>TAUPLAN TESTS</ORIGINATOR></header>',
  '<body><segment><metadata>',
  ...OMM_KEYWORDS.slice(0, 6).map(([k, v]) => `<${k}>${v}</${k}>`),
  '</metadata><data><meanElements>',
  ...OMM_KEYWORDS.slice(6, 13).map(([k, v]) => `<${k} units="x">${v}</${k}>`),
  '</meanElements><tleParameters>',
  ...OMM_KEYWORDS.slice(13).map(([k, v]) => `<${k}>${v}</${k}>`),
  '</tleParameters></data></segment></body></omm></ndm>',
].join('\n');
const OMM_OBJECT: Record<string, string | number> = Object.fromEntries(OMM_KEYWORDS.map(([k, v]) => [k, /^[-\d.]+$/.test(v) && k !== 'NORAD_CAT_ID' ? Number(v) : v]));
const OMM_JSON = JSON.stringify([OMM_OBJECT, { ...OMM_OBJECT, NORAD_CAT_ID: '99902' }], null, 1);
/** An XML seed with a DOCTYPE entity, to see that entity handling cannot crash the reader. */
const OMM_XML_DTD = `<!DOCTYPE ndm [<!ENTITY mm "15.5">]>\n${OMM_XML.split('\n').slice(1).join('\n').replace('15.50000000', '&mm;')}`;
const OMM_SEEDS = [OMM_KVN, `${OMM_KVN}\n\n${OMM_KVN.replace('99901', '99902')}`, OMM_XML, OMM_XML_DTD, OMM_JSON, JSON.stringify(OMM_OBJECT)];

/** Invented scenario covering every orbit kind but SP3 (whose file would need to exist). */
const SCENARIO_OBJECT = {
  name: 'Fuzz scenario (invented)',
  window: { start: '2027-03-01T00:00:00Z', end: '2027-03-02T00:00:00 GPS' },
  gravity: 'j2',
  reference: 'GPS',
  satellites: [
    {
      id: 'KEP-1',
      orbit: { keplerian: { epoch: '2027-03-01T00:00:00Z', aKm: 26560, e: 0.01, iDeg: 55, raanDeg: 10, argpDeg: 20, meanAnomalyDeg: 30 } },
      clock: { epoch: '2027-03-01T00:00:00Z', offsetNs: 12.5, hardwareFractionalOffset: -4.4647e-10, agingPerDay: 1e-14, noise: { whiteFmAdev1s: 1e-12, flickerFmFloor: 1e-15 }, keepInNs: 500 },
    },
    { id: 'TLE-1', orbit: { tle: `TAUPLAN-FUZZ 1\n${TLE_L1}\n${TLE_L2}` } },
    { id: 'TLE-2', name: 'Alpha', orbit: { tle: [TLE_B1, TLE_B2] } },
    { id: 'OMM-1', orbit: { omm: OMM_OBJECT } },
    { id: 'ST-1', orbit: { state: { epoch: '2027-03-01T00:00:00 TAI', frame: 'GCRF', positionKm: [7000, 0, 0], velocityKmPerS: [0, 7.5, 0.1] } } },
  ],
  stations: [{ id: 'Fuzz Hill', latDeg: 47.5, lonDeg: -122.25, heightM: 120, geoidHeightM: -20, maskDeg: 5, minPassS: 60 }],
  policy: { marginNs: 50, leadTime: '2h', prefer: 'frequency', horizon: '30d' },
};
const SCENARIO_YAML = `# invented scenario for fuzzing\n${yamlStringify(SCENARIO_OBJECT)}`;
const SCENARIO_JSON = JSON.stringify(SCENARIO_OBJECT, null, 2);

/** Invented measurement rows in every time form the reader accepts, times increasing. */
function measurementSeeds(): string[] {
  const gps = ts.gpsWeek(ts.parse('2027-03-01T02:00:00Z'));
  const mjd = ts.mjdUtc(ts.parse('2027-03-01T03:00:00Z'));
  const rows3 = ['2027-03-01T00:00:00Z,12.5,0.5', '2027-03-01T01:00:00 GPS,13.0,0.5', `GPSW ${gps.week} ${gps.secondsOfWeek},-1.5e1,2`, `MJD ${mjd},14.25,0.6`, '2027-03-01 04:00 TAI,+15,1e-1'];
  return [`time,offsetNs,sigmaNs\n${rows3.join('\n')}\n`, `\ufefftime , offsetNs\r\n${rows3.map((r) => r.split(',').slice(0, 2).join(',')).join('\r\n')}`, `time,offsetNs\n"2027-03-01T00:00:00Z","1"\n\n2027-03-02T00:00:00Z,2`];
}
const CSV_SEEDS = measurementSeeds();

// ---------------------------------------------------------------------------------------------
// Value checks

function checkTleRecords(records: TleRecord[]): void {
  expect(records.length).toBeGreaterThan(0);
  for (const r of records) {
    finite(r.meanMotionRevPerDay, 'meanMotionRevPerDay');
    if (!(r.meanMotionRevPerDay > 0)) throw new Error(`mean motion ${r.meanMotionRevPerDay} is not positive`);
    finite(r.eccentricity, 'eccentricity');
    if (!(r.eccentricity >= 0 && r.eccentricity < 1)) throw new Error(`eccentricity ${r.eccentricity} outside [0, 1)`);
    for (const [k, max] of [['inclinationDeg', 180], ['raanDeg', 360], ['argOfPerigeeDeg', 360], ['meanAnomalyDeg', 360]] as const) {
      finite(r[k], k);
      if (!(r[k] >= 0 && r[k] <= max)) throw new Error(`${k} ${r[k]} outside 0–${max}`);
    }
    finite(r.bstarPerEarthRadius, 'bstarPerEarthRadius');
    finite(r.epochDayOfYear, 'epochDayOfYear');
    if (!Number.isSafeInteger(r.catalogNumberValue)) throw new Error(`catalogue number ${r.catalogNumberValue}`);
    checkCivil(r.epochUtc, 'epochUtc');
    if (r.epochUtc.second >= 60) throw new Error(`TLE epoch second ${r.epochUtc.second} (a TLE cannot express a leap second)`);
    if (tleChecksum(r.line1) !== Number(r.line1[68]) || tleChecksum(r.line2) !== Number(r.line2[68])) throw new Error('returned a line with a wrong checksum');
  }
}

function checkOmmRecord(r: OmmRecord): void {
  finite(r.meanMotionRevPerDay, 'MEAN_MOTION');
  if (!(r.meanMotionRevPerDay > 0)) throw new Error(`MEAN_MOTION ${r.meanMotionRevPerDay} is not positive`);
  if (!(r.eccentricity >= 0 && r.eccentricity < 1)) throw new Error(`ECCENTRICITY ${r.eccentricity} outside [0, 1)`);
  if (!(r.inclinationDeg >= 0 && r.inclinationDeg <= 180)) throw new Error(`INCLINATION ${r.inclinationDeg}`);
  for (const k of ['raanDeg', 'argOfPericenterDeg', 'meanAnomalyDeg', 'bstarPerEarthRadius', 'meanMotionDotRevPerDay2', 'meanMotionDdotRevPerDay3', 'ephemerisType'] as const) finite(r[k], k);
  if (r.elementSetNo !== null) finite(r.elementSetNo, 'elementSetNo');
  if (r.revAtEpoch !== null) finite(r.revAtEpoch, 'revAtEpoch');
  checkCivil(r.epochUtc, 'epochUtc');
  if (r.epochText.trim() === '') throw new Error('empty epochText');
}

function checkScenario(s: ScenarioSpec): void {
  checkInstant(s.window.start, 'window.start');
  checkInstant(s.window.end, 'window.end');
  if (!(s.window.end.minusS(s.window.start) > 0)) throw new Error('window end not after start');
  expect(s.satellites.length).toBeGreaterThan(0);
  for (const sat of s.satellites) {
    const o = sat.orbit;
    if (o.kind === 'keplerian') {
      checkInstant(o.epoch, 'keplerian.epoch');
      for (const v of [o.aKm, o.e, o.iDeg, o.raanDeg, o.argpDeg, o.meanAnomalyDeg]) finite(v, 'keplerian element');
      if (!(o.aKm * (1 - o.e) > 6378)) throw new Error(`perigee below the surface: ${o.aKm}, ${o.e}`);
    } else if (o.kind === 'state') {
      checkInstant(o.epoch, 'state.epoch');
      for (const v of [...o.positionKm, ...o.velocityKmPerS]) finite(v, 'state component');
    } else if (o.kind === 'tle') {
      if (!o.line1.startsWith('1 ') || !o.line2.startsWith('2 ')) throw new Error('TLE lines out of order');
    }
    if (sat.clock !== null) {
      checkInstant(sat.clock.epoch, 'clock.epoch');
      const c = sat.clock;
      for (const v of [c.offsetNs, c.hardwareFractionalOffset, c.agingPerDay, c.noise.whiteFmAdev1s, c.noise.flickerFmFloor, c.noise.randomWalkFmAdev1d]) finite(v, 'clock field');
      if (c.keepInNs !== null && !(c.keepInNs > 0 && Number.isFinite(c.keepInNs))) throw new Error(`keepInNs ${c.keepInNs}`);
    }
  }
  for (const st of s.stations) for (const v of [st.latDeg, st.lonDeg, st.heightM, st.geoidHeightM, st.maskDeg, st.minPassS]) finite(v, 'station field');
  finite(s.policy.horizonS, 'policy.horizonS');
  if (!(s.policy.horizonS > 0)) throw new Error(`horizon ${s.policy.horizonS}`);
  if (s.policy.leadTimeS !== null) finite(s.policy.leadTimeS, 'policy.leadTimeS');
  finite(s.policy.marginNs, 'policy.marginNs');
}

function checkMeasurements(m: Measurements): void {
  expect(m.rows.length).toBeGreaterThan(0);
  let prev = -Infinity;
  for (const r of m.rows) {
    finite(r.ttJ2000S, 'ttJ2000S');
    finite(r.offsetNs, 'offsetNs');
    if (!(r.ttJ2000S > prev)) throw new Error('rows not strictly increasing in time');
    prev = r.ttJ2000S;
    if (m.hasSigma) {
      finite(r.sigmaNs, 'sigmaNs');
      if (!((r.sigmaNs as number) > 0)) throw new Error(`sigmaNs ${r.sigmaNs}`);
    } else if (r.sigmaNs !== null) throw new Error('sigma without a sigma column');
    if (!Number.isInteger(r.line) || r.line < 2) throw new Error(`line ${r.line}`);
  }
}

// ---------------------------------------------------------------------------------------------
// The seeds are valid (so that mutations start from something the parser accepts)

describe('the invented seeds parse', () => {
  it('TLE, OMM, scenario and measurement seeds are accepted and pass the value checks', () => {
    for (const s of TLE_SEEDS) checkTleRecords(parseTleFile(s, 'fuzz.tle'));
    expect(parseTleFile(TLE_SEEDS[1], 'fuzz.tle').map((r) => r.catalogNumberValue)).toEqual([99901, 100001]);
    for (const s of OMM_SEEDS) parseOmmFile(s, 'fuzz.omm').forEach(checkOmmRecord);
    expect(parseOmmFile(OMM_XML_DTD, 'fuzz.xml')[0].meanMotionRevPerDay).toBe(15.5);
    checkScenario(parseScenarioText(SCENARIO_YAML, 'fuzz.yaml', ts));
    checkScenario(parseScenarioText(SCENARIO_JSON, 'fuzz.json', ts));
    for (const s of CSV_SEEDS) checkMeasurements(parseMeasurementsCsv(s, 'fuzz.csv', ts));
    expect(parseMeasurementsCsv(CSV_SEEDS[0], 'fuzz.csv', ts).rows).toHaveLength(5);
  });
});

// ---------------------------------------------------------------------------------------------
// Long runs: a regex that backtracks polynomially shows up only on long inputs

describe('long runs of one character finish quickly in every parser', () => {
  /**
   * Run lengths [characters], shortest first: at 50 000 quadratic backtracking takes seconds while
   * linear code takes ~1 ms; the 1000 pass comes first so that cubic backtracking (which would
   * never finish at 50 000, and a synchronous hang cannot be interrupted) already fails there.
   */
  const RUN_LENGTHS = [1000, 50_000];
  const runs = RUN_LENGTHS.flatMap((n) => [' ', '9', '[', '\t', 'a', '.', '-', '"', '{', '<a>'].map((c) => c.repeat(n / c.length)));
  const wrap = (r: string): string[] => [r, `${r}x`, `A${r}x`, `A = a${r}b`, `A = a${r}[${r}x`, `1 ${r}x`, `${r}\n${r}x`, `MJD 1.${r}x`, `GPSW 1${r}2${r}x`];
  const parsers: [string, (t: string) => unknown][] = [
    ['parseTleFile', (t) => parseTleFile(t, 'fuzz.tle')],
    ['parseOmmFile', (t) => parseOmmFile(t, 'fuzz.omm')],
    ['parseOmmFile XML', (t) => parseOmmFile(`<omm><EPOCH>${t}</EPOCH></omm>`, 'fuzz.xml')],
    ['parseOmmFile JSON', (t) => parseOmmFile(JSON.stringify({ ...OMM_OBJECT, MEAN_MOTION: t }), 'fuzz.json')],
    ['parseScenarioText YAML', (t) => parseScenarioText(`window: ${JSON.stringify(t)}\nx${t}: 1`, 'fuzz.yaml', ts)],
    ['parseScenarioText JSON', (t) => parseScenarioText(JSON.stringify({ ...SCENARIO_OBJECT, name: t, policy: { horizon: t } }), 'fuzz.json', ts)],
    ['parseMeasurementsCsv', (t) => parseMeasurementsCsv(`time,offsetNs\n2027-03-01T00:00:00Z,${t}\n${t},1`, 'fuzz.csv', ts)],
    ['TimeSystem.parse', (t) => ts.parse(t, 'fuzz')],
    ['parseDurationS', (t) => parseDurationS(t, 'fuzz')],
  ];
  for (const [name, parse] of parsers) {
    it(name, () => {
      for (const r of runs) for (const text of wrap(r)) returnsOrInputError(`${name}(${JSON.stringify(text.slice(0, 30))}… ${text.length} chars)`, () => parse(text), () => undefined);
    });
  }
});

// ---------------------------------------------------------------------------------------------
// TLE

/** Re-compute column 69 of every 69-character element line, so mutations get past the checksum. */
function fixChecksums(text: string): string {
  return text
    .split('\n')
    .map((line) => {
      const body = line.replace(/\r$/, '');
      if (body.length !== 69 || !/^[12] /.test(body)) return line;
      return body.slice(0, 68) + String(tleChecksum(body)) + line.slice(69);
    })
    .join('\n');
}

describe('parseTleFile (src/io/tle.ts)', () => {
  const call = (text: string): void => returnsOrInputError(`parseTleFile(${JSON.stringify(text)})`, () => parseTleFile(text, 'fuzz.tle'), checkTleRecords);

  it('random text', () => run(fc.property(randomText, call)));
  it('mutated valid files', () => run(fc.property(mutationsOf(TLE_SEEDS), call)));
  it('mutated valid files with checksums re-computed (reaches the field checks)', () =>
    run(fc.property(mutationsOf(TLE_SEEDS).map(fixChecksums), call), 500));
  it('one field replaced by an odd token, checksum re-computed', () =>
    run(
      fc.property(fc.constantFrom(TLE_L1_BODY, TLE_L2_BODY), fc.integer({ min: 8, max: 67 }), fc.integer({ min: 1, max: 11 }), fc.constantFrom(...ODD_TOKENS, ' 00000-0', '-99999-9', '+.1234567', '00.00000000', '999.9999', '  0.00000000'), (body, from, len, token) => {
        const padded = `${body.slice(0, from)}${token.padStart(len, ' ').slice(-len)}${body.slice(from + len)}`.slice(0, 68).padEnd(68, ' ');
        const line = formatTleLine(padded);
        const text = body === TLE_L1_BODY ? `${line}\n${TLE_L2}` : `${TLE_L1}\n${line}`;
        call(text);
      }),
    ));
});

// ---------------------------------------------------------------------------------------------
// OMM

describe('parseOmmFile and ommFromObject (src/io/omm.ts)', () => {
  const callFile = (text: string, name: string): void =>
    returnsOrInputError(`parseOmmFile(${JSON.stringify(text)})`, () => parseOmmFile(text, name), (list) => {
      expect(list.length).toBeGreaterThan(0);
      list.forEach(checkOmmRecord);
    });
  const callObject = (obj: unknown): void => returnsOrInputError(`ommFromObject(${String(JSON.stringify(obj))})`, () => ommFromObject(obj, 'satellites[0].orbit.omm'), checkOmmRecord);

  it('random text', () => run(fc.property(randomText, (t) => callFile(t, 'fuzz.omm'))));
  it('random text after "<", "{" and "[" (each encoding)', () => run(fc.property(fc.constantFrom('<', '{', '[', '<omm>'), randomText, (p, t) => callFile(p + t, 'fuzz.omm'))));
  it('mutated KVN', () => run(fc.property(mutationsOf(OMM_SEEDS.slice(0, 2)), (t) => callFile(t, 'fuzz.kvn'))));
  it('mutated XML', () => run(fc.property(mutationsOf(OMM_SEEDS.slice(2, 4)), (t) => callFile(t, 'fuzz.xml'))));
  it('mutated JSON', () => run(fc.property(mutationsOf(OMM_SEEDS.slice(4)), (t) => callFile(t, 'fuzz.json'))));

  const oddValue = fc.oneof(
    fc.constantFrom<unknown>(Number.NaN, Infinity, -Infinity, -0, 0, 1e308, -1e308, 5e-324, 2 ** 53 + 1, '', ' ', 'NaN', 'Infinity', '1e999', '0x1F', '1,5', ' 15.5 ', '15.5\n', '2027-02-29T00:00:00', '2028-366T00:00:00Z', '2027-03-01T23:59:60.5', null, undefined, true, [], {}, [15.5]),
    fc.double(),
    fc.integer(),
    fc.string({ maxLength: 30, unit: 'binary' }),
  );
  it('valid object with keywords replaced by odd values, added or removed', () =>
    run(
      fc.property(
        fc.array(fc.tuple(fc.constantFrom(...OMM_KEYWORDS.map(([k]) => k), '__proto__', 'constructor', 'toString', 'omm'), fc.option(oddValue, { nil: undefined }), fc.boolean()), { minLength: 1, maxLength: 4 }),
        (edits) => {
          const obj: Record<string, unknown> = { ...OMM_OBJECT };
          for (const [key, value, remove] of edits) {
            if (remove) delete obj[key];
            else Object.defineProperty(obj, key, { value, enumerable: true, configurable: true, writable: true });
          }
          callObject(obj);
        },
      ),
    ));
  it('arbitrary JSON values', () => run(fc.property(fc.jsonValue({ maxDepth: 3 }), callObject)));
  it('hostile XML: deep nesting, entity expansion, reserved names, unclosed declarations', () => {
    let bomb = '<!DOCTYPE omm [<!ENTITY e0 "0123456789">';
    for (let i = 1; i < 8; i++) bomb += `<!ENTITY e${i} "${`&e${i - 1};`.repeat(10)}">`;
    bomb += ']>\n<omm><OBJECT_NAME>&e7;</OBJECT_NAME></omm>';
    const cases = [
      bomb,
      `${'<a>'.repeat(5000)}${'</a>'.repeat(5000)}`,
      `<omm>${'<a>'.repeat(90)}<EPOCH>x</EPOCH>${'</a>'.repeat(90)}</omm>`,
      '<omm><__proto__>1</__proto__><constructor>2</constructor></omm>',
      '<omm><hasOwnProperty>1</hasOwnProperty></omm>',
      '<?xml version="1.0"',
      '<omm><!-- unclosed comment</omm>',
      '<omm><![CDATA[ <EPOCH> ]]></omm>',
      '<omm><EPOCH>2027-03-01T00:00:00</EPOCH><EPOCH>2027-03-02T00:00:00</EPOCH></omm>',
      '<',
      '<omm/>',
    ];
    for (const c of cases) callFile(c, 'fuzz.xml');
  });
});

// ---------------------------------------------------------------------------------------------
// Scenario

describe('parseScenarioText (src/io/scenario.ts)', () => {
  const call = (text: string, name: string): void => returnsOrInputError(`parseScenarioText(${JSON.stringify(text)}, ${name})`, () => parseScenarioText(text, name, ts), checkScenario);

  it('random text as YAML and as JSON', () => run(fc.property(randomText, fc.constantFrom('fuzz.yaml', 'fuzz.json', 'fuzz.txt'), call)));
  it('mutated YAML', () => run(fc.property(mutationsOf([SCENARIO_YAML]), (t) => call(t, 'fuzz.yaml')), 400));
  it('mutated JSON', () => run(fc.property(mutationsOf([SCENARIO_JSON]), (t) => call(t, 'fuzz.json'))));

  /** Every path to a leaf of the seed object. */
  const leafPaths: (string | number)[][] = [];
  const walk = (v: unknown, path: (string | number)[]): void => {
    if (Array.isArray(v)) v.forEach((x, i) => walk(x, [...path, i]));
    else if (typeof v === 'object' && v !== null) for (const [k, x] of Object.entries(v)) walk(x, [...path, k]);
    else leafPaths.push(path);
  };
  walk(SCENARIO_OBJECT, []);
  const oddLeaf = fc.oneof(
    fc.constantFrom<unknown>(Number.NaN, Infinity, -Infinity, -0, 0, -1, 1e308, -1e308, 5e-324, '', ' ', 'a\nb', '1e999s', '1e999d', '-0s', 'P1e5D', 'PT', 'P', '9'.repeat(400) + 'd', 'MJD 1e99', `MJD ${'9'.repeat(30)}`, `GPSW ${'9'.repeat(30)} 0`, '2027-02-29T00:00:00Z', '2016-12-31T23:59:60.5Z', '2017-12-31T23:59:60Z', '1969-01-01T00:00:00Z', '9999-12-31T23:59:59.999999999999 TT', null, true, [], {}, [1, 2], { x: 1 }),
    fc.double(),
    fc.string({ maxLength: 20, unit: 'binary' }),
  );
  const setAt = (root: unknown, path: (string | number)[], value: unknown): unknown => {
    const copy = structuredClone(root) as Record<string | number, unknown>;
    let node = copy;
    for (const seg of path.slice(0, -1)) node = node[seg] as Record<string | number, unknown>;
    const last = path[path.length - 1];
    if (value === undefined) delete node[last];
    else node[last] = value;
    return copy;
  };
  const editedObject = fc
    .array(fc.tuple(fc.constantFrom(...leafPaths), fc.option(oddLeaf, { nil: undefined })), { minLength: 1, maxLength: 3 })
    .map((edits) => edits.reduce<unknown>((obj, [path, value]) => setAt(obj, path, value), SCENARIO_OBJECT));

  it('valid object with leaves replaced by odd values (as YAML, including .nan and .inf)', () =>
    run(fc.property(editedObject, (obj) => call(yamlStringify(obj), 'fuzz.yaml'))));
  it('valid object with leaves replaced by odd values (as JSON)', () =>
    run(fc.property(editedObject, (obj) => call(JSON.stringify(obj) ?? 'null', 'fuzz.json'))));
  it('arbitrary JSON documents', () => run(fc.property(fc.json({ maxDepth: 4 }), (t) => call(t, 'fuzz.json'))));

  it('hostile YAML: alias bombs, unresolved and self aliases, deep nesting, odd tags', () => {
    let bomb = 'a0: &a0 [x, x, x, x, x, x, x, x, x, x]\n';
    for (let i = 1; i < 9; i++) bomb += `a${i}: &a${i} [${Array(10).fill(`*a${i - 1}`).join(', ')}]\n`;
    const cases = [
      bomb,
      'window: *nowhere\n',
      'a: &x [*x]\n',
      '&x {window: *x}\n',
      `window: ${'['.repeat(3000)}${']'.repeat(3000)}\n`,
      Array.from({ length: 2000 }, (_, i) => `${' '.repeat(i)}a:`).join('\n'),
      '!!binary aGVsbG8=\n',
      'window: !!set {a, b}\n',
      '--- a\n--- b\n',
      'window: {start: !!float 1e999, end: .nan}\nsatellites: [{id: .inf, orbit: {}}]\n',
      '? [a, b]\n: 1\n',
      '<<: {window: 1}\n',
    ];
    for (const c of cases) call(c, 'fuzz.yaml');
  });
  it('hostile JSON: deep nesting, duplicate keys, __proto__ keys', () => {
    const cases = [
      '['.repeat(5000) + ']'.repeat(5000),
      '{"a":'.repeat(3000) + '1' + '}'.repeat(3000),
      '['.repeat(5000),
      `{"__proto__": {"window": 1}, ${SCENARIO_JSON.slice(1)}`,
      `{"window": 1, ${SCENARIO_JSON.slice(1)}`,
      `{"constructor": 1, ${SCENARIO_JSON.slice(1)}`,
    ];
    for (const c of cases) call(c, 'fuzz.json');
  });
});

// ---------------------------------------------------------------------------------------------
// Measurements

describe('parseMeasurementsCsv (src/io/measurements.ts)', () => {
  const call = (text: string): void => returnsOrInputError(`parseMeasurementsCsv(${JSON.stringify(text)})`, () => parseMeasurementsCsv(text, 'fuzz.csv', ts), checkMeasurements);

  it('random text', () => run(fc.property(randomText, call)));
  it('random text after a valid header', () => run(fc.property(fc.constantFrom('time,offsetNs\n', 'time,offsetNs,sigmaNs\n'), randomText, (h, t) => call(h + t))));
  it('mutated valid files', () => run(fc.property(mutationsOf(CSV_SEEDS), call), 400));
  it('generated rows with odd numbers and quoted fields', () => {
    const cell = fc.oneof(fc.constantFrom('NaN', 'Infinity', '-0', '1e999', '1e-999', '0x10', '', ' ', '"1,5"', '"a\nb"', '"GPSW\n2456 0"', '"2027-03-01T00:00:00\nGPS"', '"""', '12.5', '-3.2e2'), fc.double().map(String), fc.string({ maxLength: 8 }));
    const time = fc.oneof(
      fc.constantFrom(...CSV_SEEDS[0].split('\n').slice(1, -1).map((r) => r.split(',')[0]), '"GPSW\n2456 0"', '"GPSW 2456\r\n0"', '"2027-03-01T00:00:00\nGPS"', '"MJD 61465\nTT"', '"2016-12-31T23:59:60.5Z"'),
      fc.string({ maxLength: 10 }),
    );
    run(
      fc.property(fc.boolean(), fc.array(fc.tuple(time, cell, cell), { maxLength: 6 }), (sigma, rows) =>
        call(`time,offsetNs${sigma ? ',sigmaNs' : ''}\n${rows.map(([t, a, b]) => (sigma ? `${t},${a},${b}` : `${t},${a}`)).join('\n')}`),
      ),
    );
  });
});

// ---------------------------------------------------------------------------------------------
// Times and durations

describe('TimeSystem.parse (src/time/timeSystem.ts)', () => {
  const call = (text: string): void => returnsOrInputError(`TimeSystem.parse(${JSON.stringify(text)})`, () => ts.parse(text, 'fuzz'), (t) => checkInstant(t, 'parsed time'));

  const num = (digits: number): fc.Arbitrary<string> => fc.oneof(fc.integer({ min: 0, max: 10 ** digits - 1 }).map((n) => String(n).padStart(digits, '0')), fc.constantFrom('9'.repeat(digits), '0'.repeat(digits)));
  const scale = fc.constantFrom('Z', ' GPS', ' TAI', ' TT', ' GST', ' BDT', ' UTC', ' utc', '\tGPS', '\nGPS', ' UT1', ' XYZ', '', 'z');
  const iso = fc
    .tuple(num(4), num(2), num(2), fc.constantFrom('T', ' ', 't'), num(2), num(2), num(2), fc.constantFrom('', '.5', '.999999999999', '.9999999999999', '.', '.000000000001'), scale)
    .map(([y, mo, d, sep, h, mi, s, f, z]) => `${y}-${mo}-${d}${sep}${h}:${mi}:${s}${f}${z}`);
  const gpsw = fc.tuple(fc.oneof(fc.nat(5000).map(String), fc.constantFrom('9'.repeat(30), '9'.repeat(400), '-1', '1.5')), fc.oneof(fc.double({ min: 0, max: 700000, noNaN: true }).map(String), fc.constantFrom('604799.999999999', '604800', '1e3', '9'.repeat(400))), fc.constantFrom(' ', '  ', '\t', '\n')).map(([w, s, sp]) => `GPSW${sp}${w}${sp}${s}`);
  const mjd = fc.tuple(fc.oneof(fc.double({ min: -1e6, max: 1e7, noNaN: true }).map(String), fc.constantFrom('1e99', '9'.repeat(30), '9'.repeat(400), '-0', '57753.99999999999', '41317', '41316.9999999', '2973483', '2973484.5', '1e10')), fc.constantFrom('', ' TT', ' GPS', ' UTC', ' tai', ' XYZ')).map(([m, s]) => `MJD ${m}${s}`);

  it('generated ISO, GPSW and MJD times, in and out of range', () => run(fc.property(fc.oneof(iso, gpsw, mjd), call), 500));
  it('mutated valid times', () => run(fc.property(mutationsOf(['2027-03-01T00:00:00Z', '2016-12-31T23:59:60.5Z', '2027-03-01 12:34:56.789 GPS', 'GPSW 2459 345600.5', 'MJD 61465.25 TT', '2027-03-01T00:00Z']), call)));
  it('random text', () => run(fc.property(randomText, call)));
});

describe('parseDurationS (src/time/duration.ts)', () => {
  const call = (text: string): void =>
    returnsOrInputError(`parseDurationS(${JSON.stringify(text)})`, () => parseDurationS(text, 'fuzz'), (v) => finite(v, 'duration'));
  const amount = fc.oneof(fc.double({ noNaN: true, noDefaultInfinity: true }).map(String), fc.nat().map(String), fc.constantFrom('1e999', '9'.repeat(400), '-0', '1e-999', '1.', '.5', '1e5'));
  const unit = fc.constantFrom('s', 'sec', 'min', 'm', 'h', 'd', 'w', 'S', 'D', 'y', '', ' s', 'ms');
  const iso = fc
    .tuple(fc.array(fc.tuple(amount, fc.constantFrom('W', 'D', 'H', 'M', 'S', 'T')), { maxLength: 5 }), fc.boolean())
    .map(([parts, t]) => `P${t ? 'T' : ''}${parts.map(([a, u]) => a + u).join('')}`);

  it('generated amounts with units and ISO 8601 durations', () => run(fc.property(fc.oneof(fc.tuple(amount, unit).map(([a, u]) => a + u), iso), call), 500));
  it('mutated valid durations', () => run(fc.property(mutationsOf(['3600s', '90min', '36h', '7d', '2w', 'P7DT12H', 'PT90M', 'P1W', '1.5e3 s']), call)));
  it('random text', () => run(fc.property(randomText, call)));
});

// ---------------------------------------------------------------------------------------------
// SP3

/** The first `epochs` epoch blocks of an invented SP3 fixture, with the count in line 1 fixed to match. */
function sp3Seed(name: string, epochs: number): string {
  const lines = readFileSync(new URL(`./fixtures/sp3/${name}`, import.meta.url), 'utf8').split('\n');
  const firstEpoch = lines.findIndex((l) => l.startsWith('*'));
  const starts = lines.map((l, i) => (l.startsWith('*') ? i : -1)).filter((i) => i >= 0);
  const end = starts[epochs] ?? lines.findIndex((l) => l.startsWith('EOF'));
  const head = lines.slice(0, firstEpoch);
  head[0] = `${head[0].slice(0, 32)}${String(epochs).padStart(7, ' ')}${head[0].slice(39)}`;
  return [...head, ...lines.slice(firstEpoch, end), 'EOF', ''].join('\n');
}

function checkSp3(f: Sp3File): void {
  expect(f.epochs.length).toBe(f.epochCount);
  finite(f.intervalS, 'intervalS');
  if (!(f.intervalS > 0)) throw new Error(`interval ${f.intervalS}`);
  for (const v of [f.gpsWeek, f.secondsOfWeek, f.mjdStart, f.fractionalDay]) finite(v, 'header number');
  checkCivil(f.startCivil, 'startCivil');
  let prev = -Infinity;
  for (const e of f.epochs) {
    checkCivil(e.civil, 'epoch civil');
    checkCivil(e.scaleCivil, 'epoch scaleCivil');
    if (!Number.isSafeInteger(e.labelWholeS) || !(e.labelFracS >= 0 && e.labelFracS < 1)) throw new Error(`epoch label ${e.labelWholeS} + ${e.labelFracS}`);
    const t = e.labelWholeS + e.labelFracS;
    if (!(t > prev)) throw new Error('epochs not increasing');
    prev = t;
    for (const r of e.records.values()) {
      if (!f.satelliteIds.includes(r.satelliteId)) throw new Error(`record for unlisted ${r.satelliteId}`);
      r.positionKm?.forEach((v) => finite(v, 'positionKm'));
      if (r.clockUs !== null) finite(r.clockUs, 'clockUs');
      r.velocity?.velocityDmPerS?.forEach((v) => finite(v, 'velocityDmPerS'));
      for (const x of r.sdevExponents) if (x !== null) finite(x, 'sdev exponent');
    }
  }
}

describe('parseSp3 (src/io/sp3.ts)', () => {
  const SP3_SEEDS = [sp3Seed('meo-15min-p.sp3', 3), sp3Seed('leo-60s-pv.sp3', 2), sp3Seed('meo-15min-gap-maneuver.sp3', 4)];
  const call = (text: string): void => returnsOrInputError(`parseSp3(${JSON.stringify(text)})`, () => parseSp3(text, 'fuzz.sp3'), checkSp3);

  it('the cut seeds parse', () => {
    for (const s of SP3_SEEDS) checkSp3(parseSp3(s, 'fuzz.sp3'));
    expect(parseSp3(SP3_SEEDS[1], 'fuzz.sp3').epochs[1].records.get('X51')?.velocity).not.toBeNull();
  });
  it('random text', () => run(fc.property(randomText, (t) => call(`#dP${t}`))));
  it('mutated valid files', () => run(fc.property(mutationsOf(SP3_SEEDS), call), 500));
  it('long runs of one character', () => {
    for (const c of [' ', '9', '.', '-', 'P']) call(SP3_SEEDS[0].replace('PX01', `PX01${c.repeat(50_000)}`));
  });
  it('one data or header field replaced by an odd token', () =>
    run(
      fc.property(fc.constantFrom(...SP3_SEEDS), fc.nat(), fc.integer({ min: 0, max: 79 }), fc.integer({ min: 1, max: 14 }), fc.constantFrom(...ODD_TOKENS, '999999.999999', '0.000000', '-0.000000', '99999999999999', '   ', 'E', 'M', 'P', 'GLO', 'UTC', 'X99', '  1'), (seed, lineAt, col, len, token) => {
        const lines = seed.split('\n');
        const li = lineAt % lines.length;
        const line = lines[li].padEnd(col + len, ' ');
        lines[li] = `${line.slice(0, col)}${token.padStart(len, ' ').slice(-len)}${line.slice(col + len)}`;
        call(lines.join('\n'));
      }),
      500,
    ));
});
