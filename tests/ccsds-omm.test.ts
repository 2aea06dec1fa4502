/**
 * CCSDS 502.0-B Orbit Data Messages: the OMM with SGP4 mean elements, in KVN, XML (NDM/XML) and
 * JSON, read by src/io/omm.ts and propagated by src/orbit/sgp4.ts.
 *
 * Reference values: the fixtures carry the elements of catalogue 00005 from Vallado et al. 2006,
 * SGP4-VER.TLE (confirmed), converted to OMM keywords by hand (derived; see
 * tests/fixtures/omm/README.md). The states they give are compared with those of the TLE itself,
 * and at t = 0 with tcppver.out (confirmed).
 *
 * Tolerance: 1 mm. The OMM and the TLE carry the same numbers, so SGP4 sees the same mean elements
 * bit for bit; only the epoch is read differently (day fraction × 86400 s for the TLE, seconds
 * for the OMM). The two epochs differ by about 1 ns (checked below to < 10 ns), which moves the
 * satellite by under 0.1 mm at 8 km/s; 1 mm bounds that with margin.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { InputError } from '../src/errors.ts';
import { ommFromObject, parseOmmFile, type OmmRecord } from '../src/io/omm.ts';
import { defaultTimeSystem } from '../src/io/tables.ts';
import { parseTleFile } from '../src/io/tle.ts';
import { Sgp4Trajectory } from '../src/orbit/sgp4.ts';
import type { StateM } from '../src/orbit/vec.ts';

const ts = defaultTimeSystem();
const FIX = new URL('./fixtures/omm/', import.meta.url);
const read = (name: string): string => readFileSync(new URL(name, FIX), 'utf8');

const TLE = parseTleFile(
  '1 00005U 58002B   00179.78495062  .00000023  00000-0  28098-4 0  4753\n2 00005  34.2682 348.7242 1859667 331.7664  19.3264 10.82419157413667\n',
  'vallado-00005.tle',
)[0];
const SAME_STATE_TOL_M = 1e-3;
const SAME_VELOCITY_TOL_M_PER_S = 1e-6; // same elements: only the < 10 ns epoch rounding, times < 10 m/s²

function maxDiff(a: StateM<'TEME'>, b: StateM<'TEME'>): { drM: number; dvMPerS: number } {
  let drM = 0;
  let dvMPerS = 0;
  for (let k = 0; k < 3; k++) {
    drM = Math.max(drM, Math.abs(a.positionM[k] - b.positionM[k]));
    dvMPerS = Math.max(dvMPerS, Math.abs(a.velocityMPerS[k] - b.velocityMPerS[k]));
  }
  return { drM, dvMPerS };
}

function checkSameAsTle(omm: OmmRecord, label: string): void {
  const fromTle = new Sgp4Trajectory(TLE, ts);
  const fromOmm = new Sgp4Trajectory(omm, ts);
  expect(fromOmm.id).toBe('5');
  expect(Math.abs(fromOmm.epochTtJ2000S - fromTle.epochTtJ2000S), `${label} epoch`).toBeLessThan(1e-8);
  for (const minutes of [0, 360, 1440, 4320, -720]) {
    const t = fromTle.epochTtJ2000S + 60 * minutes;
    const { drM, dvMPerS } = maxDiff(fromOmm.stateAt(t), fromTle.stateAt(t));
    expect(drM, `${label} position at ${minutes} min, diff ${drM} m`).toBeLessThan(SAME_STATE_TOL_M);
    expect(dvMPerS, `${label} velocity at ${minutes} min, diff ${dvMPerS} m/s`).toBeLessThan(SAME_VELOCITY_TOL_M_PER_S);
  }
  // tcppver.out, 00005 at t = 0: 7022.46529266 -1400.08296755 0.03995155 km (confirmed); 1e-8 km printing step.
  const s0 = fromOmm.stateAtMinutesSinceEpoch(0);
  expect(Math.abs(s0.positionM[0] - 7022.46529266e3)).toBeLessThan(1e-5);
  expect(Math.abs(s0.positionM[1] + 1400.08296755e3)).toBeLessThan(1e-5);
  expect(Math.abs(s0.positionM[2] - 0.03995155e3)).toBeLessThan(1e-5);
}

describe('CCSDS OMM (502.0-B) in KVN, XML and JSON give the TLE states', () => {
  it('KVN (with COMMENT lines and [unit] suffixes)', () => {
    const recs = parseOmmFile(read('vallado-00005.kvn'), 'vallado-00005.kvn');
    expect(recs).toHaveLength(1);
    expect(recs[0].objectName).toBe('VANGUARD 1');
    expect(recs[0].meanMotionRevPerDay).toBe(10.82419157);
    expect(recs[0].bstarPerEarthRadius).toBe(2.8098e-5);
    expect(recs[0].epochUtc).toEqual({ year: 2000, month: 6, day: 27, hour: 18, minute: 50, second: 19.733568 });
    checkSameAsTle(recs[0], 'KVN');
  });
  it('XML (ndm/omm/body/segment/data, units attributes)', () => {
    const recs = parseOmmFile(read('vallado-00005.xml'), 'vallado-00005.xml');
    expect(recs).toHaveLength(1);
    expect(recs[0].objectId).toBe('1958-002B');
    expect(recs[0].revAtEpoch).toBe(41366);
    checkSameAsTle(recs[0], 'XML');
  });
  it('JSON (array of objects, numbers as numbers)', () => {
    const recs = parseOmmFile(read('vallado-00005.json'), 'vallado-00005.json');
    expect(recs).toHaveLength(1);
    checkSameAsTle(recs[0], 'JSON');
  });
  it('ommFromObject (as scenario files embed it), with a day-of-year EPOCH and string values', () => {
    const rec = ommFromObject(
      { OBJECT_ID: '1958-002B', NORAD_CAT_ID: '5', EPOCH: '2000-179T18:50:19.733568Z', MEAN_MOTION: '10.82419157', ECCENTRICITY: '0.1859667', INCLINATION: '34.2682', RA_OF_ASC_NODE: '348.7242', ARG_OF_PERICENTER: '331.7664', MEAN_ANOMALY: '19.3264', BSTAR: '0.28098E-4' },
      'satellites[0].orbit.omm',
    );
    checkSameAsTle(rec, 'object');
  });
  it('a KVN file with two messages gives two records', () => {
    const text = read('vallado-00005.kvn');
    const recs = parseOmmFile(`${text}\n${text.replace('NORAD_CAT_ID = 5', 'NORAD_CAT_ID = 6')}`, 'two.kvn');
    expect(recs.map((r) => r.noradCatId)).toEqual(['5', '6']);
  });
});

describe('OMM faults give an InputError naming the file, the keyword and the fix', () => {
  function faultOf(text: string, file: string): InputError {
    try {
      parseOmmFile(text, file);
    } catch (e) {
      expect(e).toBeInstanceOf(InputError);
      return e as InputError;
    }
    throw new Error('expected an InputError, parsing succeeded');
  }
  it('missing MEAN_MOTION in KVN: file and line of the message start', () => {
    const e = faultOf(read('vallado-00005-no-mean-motion.kvn'), 'vallado-00005-no-mean-motion.kvn');
    expect(e.what).toContain('MEAN_MOTION');
    expect(e.where).toBe('vallado-00005-no-mean-motion.kvn:1');
    expect(e.fix).toContain('MEAN_MOTION');
  });
  it('missing MEAN_MOTION in XML and JSON', () => {
    const xml = read('vallado-00005.xml').replace(/<MEAN_MOTION [^\n]*\n/, '');
    expect(faultOf(xml, 'x.xml').what).toContain('MEAN_MOTION');
    const obj = JSON.parse(read('vallado-00005.json')) as Record<string, unknown>[];
    delete obj[0].MEAN_MOTION;
    const e = faultOf(JSON.stringify(obj), 'x.json');
    expect(e.what).toContain('MEAN_MOTION');
    expect(e.where).toContain('x.json');
  });
  it('eccentricity ≥ 1 and mean motion ≤ 0 are refused, with the KVN line', () => {
    const text = read('vallado-00005.kvn');
    const e = faultOf(text.replace('ECCENTRICITY = 0.1859667', 'ECCENTRICITY = 1.2'), 'e.kvn');
    expect(e.what).toContain('ECCENTRICITY');
    expect(e.where).toBe(`e.kvn:${text.split('\n').findIndex((l) => l.startsWith('ECCENTRICITY')) + 1}`);
    expect(faultOf(text.replace('MEAN_MOTION = 10.82419157', 'MEAN_MOTION = -1'), 'n.kvn').what).toContain('MEAN_MOTION');
  });
  it('a non-numeric value, a wrong frame, no id, and a malformed KVN line', () => {
    const text = read('vallado-00005.kvn');
    expect(faultOf(text.replace('INCLINATION = 34.2682', 'INCLINATION = 34.2x'), 'a.kvn').what).toContain('INCLINATION');
    expect(faultOf(text.replace('REF_FRAME = TEME', 'REF_FRAME = GCRF'), 'b.kvn').what).toContain('REF_FRAME');
    expect(faultOf(text.replace('NORAD_CAT_ID = 5\n', '').replace('OBJECT_ID = 1958-002B\n', ''), 'c.kvn').what).toContain('NORAD_CAT_ID');
    expect(faultOf(`${text}\nthis is not a keyword line\n`, 'd.kvn').where).toMatch(/^d\.kvn:\d+:1$/);
  });
  it('broken XML reports line and column', () => {
    const e = faultOf('<ndm><omm><body></omm></ndm>', 'broken.xml');
    expect(e.where).toMatch(/^broken\.xml:1:\d+$/);
  });
});
