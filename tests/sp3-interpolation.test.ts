/**
 * SP3-c / SP3-d reading and interpolation.
 *
 * Documents: S. Hilla, "The Extended Standard Product 3 Orbit Format (SP3-c)", NGS 2002/2010, and
 * "(SP3-d)", IGS 2016 — header lines 1–2, `+`/`++`, `%c` time system, epoch/P/V record columns,
 * bad-value conventions (0.000000 position, 999999.999999 clock) and the E/P/M/P flags in columns
 * 75–80 (column layout from memory of those documents). Lagrange interpolation of 15-min GNSS
 * orbits with ~10 nodes is common practice (mm-level), which is what we measure here.
 *
 * Fixtures: tests/fixtures/sp3/ — invented SP3-d files written by scripts/make-sp3-fixtures.ts
 * from tauplan's two-body trajectory; truth.json holds the generating elements, so every
 * reference state below is recomputed (derived), never pasted.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { buildSp3Fixtures, truthJson, truthStateTeme, type Sp3FixtureTruth } from '../scripts/make-sp3-fixtures.ts';
import { OrbitFileError, SpanError } from '../src/errors.ts';
import { parseSp3, readSp3File, type Sp3File } from '../src/io/sp3.ts';
import { defaultTimeSystem } from '../src/io/tables.ts';
import { gmstRad } from '../src/orbit/frames.ts';
import { gmstRadFromUtcJ2000S, Sp3Trajectory } from '../src/orbit/sp3.ts';
import { allocStateBlock } from '../src/orbit/trajectory.ts';
import { WGS84_OMEGA_RAD_PER_S } from '../src/constants.ts';
import { Instant } from '../src/time/instant.ts';

const ts = defaultTimeSystem();
const DIR = new URL('./fixtures/sp3/', import.meta.url);
const readText = (name: string): string => readFileSync(new URL(name, DIR), 'utf8');
const truth = JSON.parse(readText('truth.json')) as Sp3FixtureTruth;
const MEO = 'meo-15min-p.sp3';
const LEO = 'leo-60s-pv.sp3';
const GAP = 'meo-15min-gap-maneuver.sp3';
const load = (name: string): Sp3File => parseSp3(readText(name), name);
const segmentsOf = (file: string, id: string) => {
  const s = truth.satellites.find((x) => x.file === file && x.id === id);
  if (s === undefined) throw new Error(`no truth for ${file} ${id}`);
  return s.segments;
};

/** Tolerances, each with its reason. */
// Positions are written with 6 decimals of km: ±0.5 mm rounding per axis, summed over 10 nodes
// (Lagrange weights' absolute sum ≈ 1.3–1.5 inside the window). Measured interior max: 0.9 mm.
const POSITION_INTERIOR_M = 2e-3;
// First/last intervals use a one-sided window: the error factor Π(t − tᵢ) grows ~700×. Measured 11 mm (MEO).
const POSITION_EDGE_M = 2e-2;
// Derivative of the 15-min MEO polynomial: measured 1.7e-6 m/s after the ω convention term.
const VELOCITY_MEO_DERIV_MPS = 1e-5;
// 60-s LEO derivative: 1 mm rounding over 60 s spacing is ~2e-5 m/s of noise; measured 2.6e-5.
const VELOCITY_LEO_DERIV_MPS = 1e-4;
// V records carry 1e-6 dm/s = 1e-7 m/s resolution; measured 1e-7.
const VELOCITY_RECORDS_MPS = 1e-6;

// Derived: GMST rate of the IAU-82 formula per UT1 second, minus the WGS-84 ω that ecefToTeme adds.
// The derivative path returns v_true + Δω ẑ × r (the reader's documented convention).
const OMEGA_GMST_RAD_PER_S = ((2 * Math.PI) / 86400) * (1 + 8640184.812866 / (36525 * 86400));
const D_OMEGA_RAD_PER_S = WGS84_OMEGA_RAD_PER_S - OMEGA_GMST_RAD_PER_S;

interface Errors {
  posM: number;
  velM: number;
  worstAt: string;
}

/** Max errors against the truth at off-node times (fractions of each interval) for intervals [k0, k1). */
function measure(traj: Sp3Trajectory, file: string, k0: number, k1: number, expectRotationTerm: boolean): Errors {
  const segs = segmentsOf(file, traj.id);
  const h = traj.file.intervalS;
  let posM = 0;
  let velM = 0;
  let worstAt = '';
  for (let k = k0; k < k1; k++) {
    for (const frac of [0.13, 0.5, 0.77]) {
      const t = traj.validFromTtJ2000S + (k + frac) * h;
      const s = traj.stateAt(t);
      const want = truthStateTeme(segs, truth.gmM3PerS2, t);
      const term = expectRotationTerm ? [-D_OMEGA_RAD_PER_S * want.r[1], D_OMEGA_RAD_PER_S * want.r[0], 0] : [0, 0, 0];
      const dp = Math.hypot(s.positionM[0] - want.r[0], s.positionM[1] - want.r[1], s.positionM[2] - want.r[2]);
      const dv = Math.hypot(s.velocityMPerS[0] - want.v[0] - term[0], s.velocityMPerS[1] - want.v[1] - term[1], s.velocityMPerS[2] - want.v[2] - term[2]);
      if (dp > posM) worstAt = traj.formatTime(t);
      posM = Math.max(posM, dp);
      velM = Math.max(velM, dv);
    }
  }
  return { posM, velM, worstAt };
}

describe('fixtures (provenance, not correctness)', () => {
  it('the stored files are what scripts/make-sp3-fixtures.ts writes', () => {
    const built = buildSp3Fixtures(ts);
    for (const f of built.files) expect(f.text, `${f.name} is stale: rerun the script`).toBe(readText(f.name));
    expect(truthJson(built.truth)).toBe(readText('truth.json'));
  });
});

describe('parseSp3 (SP3-d header and records)', () => {
  it('reads the header fields and the records of the MEO file', () => {
    const f = load(MEO);
    expect(f.version).toBe('d');
    expect(f.hasVelocities).toBe(false);
    expect(f.intervalS).toBe(900);
    expect(f.epochCount).toBe(97);
    expect(f.epochs.length).toBe(97);
    expect(f.satelliteIds).toEqual(['X01']);
    expect(f.timeSystemCode).toBe('GPS');
    expect(f.timeScale).toBe('GPS');
    expect(f.coordinateSystem).toBe('IGS20');
    expect(f.gpsWeek).toBe(2312); // derived: 2024-05-01 is Wednesday of GPS week 2312 (start 2024-04-28)
    expect(f.epochs[1].civil).toEqual({ year: 2024, month: 5, day: 1, hour: 0, minute: 15, second: 0 });
    expect(f.epochs[0].records.get('X01')?.clockUs).toBe(123.456789);
  });

  it('records bad values, the clock-event flag and the maneuver flag (gap file)', () => {
    const f = load(GAP);
    expect(f.epochs.length).toBe(96);
    expect(f.epochs.some((e) => e.civil.hour === 6 && e.civil.minute === 0)).toBe(false);
    const at = (h: number, m: number) => f.epochs.find((e) => e.civil.hour === h && e.civil.minute === m)!;
    const bad = at(12, 0).records.get('X02')!;
    expect(bad.positionKm).toBeNull();
    expect(bad.clockUs).toBeNull();
    expect(at(12, 0).records.get('X01')!.positionKm).not.toBeNull();
    expect(at(18, 0).records.get('X02')!.clockEvent).toBe(true);
    expect(at(18, 0).records.get('X02')!.maneuver).toBe(false);
    expect(at(15, 0).records.get('X01')!.maneuver).toBe(true);
    expect(at(14, 45).records.get('X01')!.maneuver).toBe(false);
  });

  it('reads V records in dm/s and the clock rate in 1e-4 µs/s (LEO file)', () => {
    const f = load(LEO);
    expect(f.hasVelocities).toBe(true);
    const r = f.epochs[0].records.get('X51')!;
    expect(r.velocity?.clockRate1e4UsPerS).toBeCloseTo(-0.03, 12);
    // A LEO speed in the earth-fixed frame is 7.0–7.7 km/s = 70000–77000 dm/s (common practice).
    const v = r.velocity!.velocityDmPerS!;
    expect(Math.hypot(v[0], v[1], v[2])).toBeGreaterThan(70000);
    expect(Math.hypot(v[0], v[1], v[2])).toBeLessThan(77000);
  });

  it('reads the same file as SP3-c (header "#c", 5 "+" lines)', () => {
    const f = parseSp3(readText(MEO).replace(/^#d/, '#c'), MEO);
    expect(f.version).toBe('c');
    expect(f.epochs.length).toBe(97);
  });

  /** The MEO text with `n` satellites X01..Xnn on `plusLines` "+"/"++" lines (records only for X01). */
  function manySats(n: number, plusLines: number, version: 'c' | 'd'): string {
    const ids = Array.from({ length: n }, (_, k) => `X${String(k + 1).padStart(2, '0')}`);
    const plus: string[] = [];
    const acc: string[] = [];
    for (let li = 0; li < plusLines; li++) {
      const chunk = Array.from({ length: 17 }, (_, k) => ids[li * 17 + k] ?? '  0').join('');
      plus.push((li === 0 ? `+  ${String(n).padStart(3)}   ` : '+        ') + chunk);
      acc.push('++       ' + '  2'.repeat(17));
    }
    const lines = readText(MEO).split('\n').filter((l) => !l.startsWith('+'));
    lines.splice(2, 0, ...plus, ...acc);
    lines[0] = `#${version}` + lines[0].slice(2);
    return lines.join('\n');
  }

  it('SP3-d allows more than 85 satellites on more "+" lines; SP3-c refuses them', () => {
    expect(parseSp3(manySats(90, 6, 'd'), 'many.sp3').satelliteIds.length).toBe(90);
    expect(() => parseSp3(manySats(90, 6, 'c'), 'many.sp3')).toThrow(/SP3-c allows 85 satellites/);
    expect(() => parseSp3(manySats(90, 5, 'd'), 'many.sp3')).toThrow(/need 6 "\+" lines/);
  });

  /** Parse `text` edited by `edit`, expecting an OrbitFileError; returns it. */
  function broken(edit: (lines: string[]) => void, name = MEO): OrbitFileError {
    const lines = readText(name).split('\n');
    edit(lines);
    try {
      parseSp3(lines.join('\n'), 'broken.sp3');
    } catch (e) {
      expect(e).toBeInstanceOf(OrbitFileError);
      return e as OrbitFileError;
    }
    throw new Error('no error thrown');
  }
  const lineOf = (name: string, prefix: string): number => readText(name).split('\n').findIndex((l) => l.startsWith(prefix)) + 1;

  it('refuses a blank line inside the data section at the blank line, but accepts blank lines after EOF', () => {
    const at = lineOf(MEO, '*  ') + 3;
    const e = broken((l) => l.splice(at - 1, 0, '   '));
    expect([e.line, e.what]).toEqual([at, 'blank line in the data section']);
    expect(() => parseSp3(`${readText(MEO)}\n\n  \n`, 'tail.sp3')).not.toThrow();
  });

  it('refuses text after EOF at its line, after the epoch count is checked', () => {
    const n = readText(MEO).split('\n').findIndex((l) => l.startsWith('EOF')) + 1;
    const e = broken((l) => l.splice(n, 0, '', 'extra'));
    expect([e.line, e.what]).toEqual([n + 2, 'text after "EOF"']);
  });

  it('refuses a wrong version character at line 1 column 2', () => {
    const e = broken((l) => (l[0] = '#e' + l[0].slice(2)));
    expect([e.line, e.column]).toEqual([1, 2]);
    expect(e.where).toBe('broken.sp3:1:2');
  });

  it('refuses SP3-a with a pointer to convert', () => {
    const e = broken((l) => (l[0] = '#a' + l[0].slice(2)));
    expect(e.fix).toMatch(/SP3-c or SP3-d/);
  });

  it('refuses a non-numeric epoch count at line 1 column 33', () => {
    const e = broken((l) => (l[0] = l[0].slice(0, 32) + '    abc' + l[0].slice(39)));
    expect([e.line, e.column]).toEqual([1, 33]);
  });

  it('refuses a header without the %c lines, naming the line', () => {
    const at = lineOf(MEO, '%c');
    const e = broken((l) => l.splice(at - 1, 2));
    expect(e.line).toBe(at);
    expect(e.what).toMatch(/%c/);
  });

  it('refuses an unknown time system in %c', () => {
    const at = lineOf(MEO, '%c');
    const e = broken((l) => (l[at - 1] = l[at - 1].replace('GPS', 'XYZ')));
    expect([e.line, e.column]).toEqual([at, 10]);
  });

  it('refuses a header epoch count that disagrees with the records, saying which', () => {
    const e = broken((l) => (l[0] = l[0].slice(0, 32) + '     98' + l[0].slice(39)));
    expect(e.line).toBe(1);
    expect(e.what).toMatch(/98 epochs/);
    expect(e.what).toMatch(/97 epoch records/);
  });

  it('refuses a truncated file (count mismatch, no EOF)', () => {
    const e = broken((l) => l.splice(l.length - 20));
    expect(e.what).toMatch(/no EOF/);
  });

  it('refuses a record for a satellite not in the + list, at its line and column 2', () => {
    const at = lineOf(MEO, 'PX01') + 4; // a P record a few epochs in
    const e = broken((l) => (l[at - 1] = 'PX09' + l[at - 1].slice(4)));
    expect([e.line, e.column]).toEqual([at, 2]);
    expect(e.what).toMatch(/X09/);
  });

  it('refuses a malformed P record field with its column', () => {
    const at = lineOf(MEO, 'PX01');
    const e = broken((l) => (l[at - 1] = l[at - 1].slice(0, 18) + '      12ab.cd' + l[at - 1].slice(31)));
    expect([e.line, e.column]).toEqual([at, 19]);
  });

  it('refuses a malformed epoch line (month 13)', () => {
    const at = lineOf(MEO, '*  ') + 2;
    const e = broken((l) => (l[at - 1] = l[at - 1].slice(0, 8) + '13' + l[at - 1].slice(10)));
    expect([e.line, e.column]).toEqual([at, 9]);
  });

  it('refuses an unknown flag in the maneuver column 79', () => {
    const at = lineOf(MEO, 'PX01');
    const e = broken((l) => (l[at - 1] = l[at - 1] + ' '.repeat(18) + 'Q'));
    expect([e.line, e.column]).toEqual([at, 79]);
  });

  it('refuses a V record in a file whose line 1 says P', () => {
    const at = lineOf(MEO, 'PX01');
    const e = broken((l) => l.splice(at, 0, 'VX01      1.000000      1.000000      1.000000      0.000000'));
    expect(e.line).toBe(at + 1);
  });

  it('refuses line 2 that does not match the start epoch', () => {
    const e = broken((l) => (l[1] = l[1].slice(0, 39) + '60432' + l[1].slice(44)));
    expect([e.line, e.column]).toEqual([2, 40]);
  });
});

describe('Sp3Trajectory: time systems', () => {
  // Derived from the leap-second table: in 2024 TAI − UTC = 37 s and TAI − GPS = 19 s.
  const startWith = (code: string): number => {
    const text = readText(MEO).replace('%c M  cc GPS', `%c M  cc ${code}`);
    return new Sp3Trajectory(parseSp3(text, MEO), 'X01', ts).validFromTtJ2000S;
  };
  const gps = startWith('GPS');
  it('UTC labels are 18 s later than GPS labels', () => expect(startWith('UTC') - gps).toBeCloseTo(18, 6));
  it('TAI labels are 19 s earlier than GPS labels', () => expect(startWith('TAI') - gps).toBeCloseTo(-19, 6));
  it('GLO labels are UTC + 3 h', () => expect(startWith('GLO') - gps).toBeCloseTo(18 - 10800, 6));
  it('GPS 2024-05-01T00:00:00 is 2024-04-30T23:59:42Z', () => expect(ts.format(Instant.fromTtJ2000S(gps))).toBe('2024-04-30T23:59:42.000Z'));
});

describe('Sp3Trajectory: interpolation against the two-body truth', () => {
  it('MEO, 15-min epochs, 10-point Lagrange: positions < 2 mm inside, < 2 cm in the edge intervals', () => {
    const traj = new Sp3Trajectory(load(MEO), 'X01', ts);
    expect(traj.frame).toBe('TEME');
    expect(traj.velocityFromRecords).toBe(false);
    const inner = measure(traj, MEO, 4, 92, true);
    expect(inner.posM, `worst at ${inner.worstAt}: ${(inner.posM * 1000).toFixed(3)} mm`).toBeLessThan(POSITION_INTERIOR_M);
    const edge = Math.max(measure(traj, MEO, 0, 4, true).posM, measure(traj, MEO, 92, 96, true).posM);
    expect(edge).toBeLessThan(POSITION_EDGE_M);
    expect(inner.velM, `velocity error ${inner.velM} m/s`).toBeLessThan(VELOCITY_MEO_DERIV_MPS);
  });

  it('MEO derivative-path velocity differs from the TEME truth by the ω convention only (≤ |Δω|·r ≈ 2.3e-4 m/s)', () => {
    const traj = new Sp3Trajectory(load(MEO), 'X01', ts);
    const t = traj.validFromTtJ2000S + 40.5 * 900;
    const want = truthStateTeme(segmentsOf(MEO, 'X01'), truth.gmM3PerS2, t);
    const s = traj.stateAt(t);
    const dv = Math.hypot(s.velocityMPerS[0] - want.v[0], s.velocityMPerS[1] - want.v[1], s.velocityMPerS[2] - want.v[2]);
    const bound = Math.abs(D_OMEGA_RAD_PER_S) * Math.hypot(want.r[0], want.r[1]) + VELOCITY_MEO_DERIV_MPS;
    expect(dv).toBeLessThan(bound);
    // Effect on the clock rate, 2·v·δv/c², stays below 1e-16 (derived: 2·3.9e3·2.3e-4/9e16 = 2e-17).
    expect((2 * Math.hypot(...want.v) * dv) / 299792458 ** 2).toBeLessThan(1e-16);
  });

  it('LEO, 60-s epochs: positions < 2 mm; V-record velocities < 1e-6 m/s', () => {
    const traj = new Sp3Trajectory(load(LEO), 'X51', ts);
    expect(traj.velocityFromRecords).toBe(true);
    const e = measure(traj, LEO, 4, 176, false);
    expect(e.posM, `worst at ${e.worstAt}`).toBeLessThan(POSITION_INTERIOR_M);
    expect(e.velM).toBeLessThan(VELOCITY_RECORDS_MPS);
  });

  it('LEO derivative path (V records ignored): velocity < 1e-4 m/s after the ω convention term', () => {
    const traj = new Sp3Trajectory(load(LEO), 'X51', ts, { velocitySource: 'derivative' });
    expect(traj.velocityFromRecords).toBe(false);
    const e = measure(traj, LEO, 4, 176, true);
    expect(e.velM).toBeLessThan(VELOCITY_LEO_DERIV_MPS);
  });

  it('sampleInto gives the same states as stateAt', () => {
    const traj = new Sp3Trajectory(load(MEO), 'X01', ts);
    const times = Float64Array.from([0.3, 17.5, 60.01], (k) => traj.validFromTtJ2000S + k * 900);
    const block = allocStateBlock(times.length);
    traj.sampleInto(times, block);
    times.forEach((t, i) => {
      const s = traj.stateAt(t);
      expect(Array.from(block.positionM.subarray(3 * i, 3 * i + 3))).toEqual([...s.positionM]);
      expect(Array.from(block.velocityMPerS.subarray(3 * i, 3 * i + 3))).toEqual([...s.velocityMPerS]);
    });
  });

  it('the span is the first to the last epoch; outside it SpanError', () => {
    const f = load(MEO);
    const traj = new Sp3Trajectory(f, 'X01', ts);
    expect(traj.validToTtJ2000S - traj.validFromTtJ2000S).toBeCloseTo(96 * 900, 6);
    expect(() => traj.stateAt(traj.validToTtJ2000S)).not.toThrow();
    expect(() => traj.stateAt(traj.validToTtJ2000S + 60)).toThrow(SpanError);
    expect(() => traj.stateAt(traj.validFromTtJ2000S - 60)).toThrow(SpanError);
  });

  it('GMST with the split time argument agrees with frames.gmstRad (same IAU-82 formula)', () => {
    // At a Julian date exact in binary (….5), both forms see the same time. gmstRad sums ~7.6e8 s
    // in one double (ulp 1.2e-7 s ≈ 9e-12 rad), so agreement is to a few 1e-11 rad (derived).
    const jd = 2460431.5;
    const utcS = (jd - 2451545) * 86400;
    expect(Math.abs(gmstRadFromUtcJ2000S(utcS, 0) - gmstRad(jd))).toBeLessThan(5e-11);
    // Elsewhere gmstRad's single-double JD carries ≤ 20 µs of time error: ≤ 1.5e-9 rad (derived).
    const jd2 = 2460431.5 + 1234.567 / 86400;
    const d = Math.abs(gmstRadFromUtcJ2000S(utcS + 1234, 0.567) - gmstRad(jd2));
    expect(Math.min(d, 2 * Math.PI - d)).toBeLessThan(1.5e-9);
  });
});

describe('Sp3Trajectory: gaps, bad records and maneuvers are refused', () => {
  const f = load(GAP);
  const x01 = new Sp3Trajectory(f, 'X01', ts);
  const x02 = new Sp3Trajectory(f, 'X02', ts);
  const t0 = x01.validFromTtJ2000S;
  const at = (hours: number): number => t0 + hours * 3600;
  const fmt = (t: number): string => ts.format(Instant.fromTtJ2000S(t));
  function refusal(traj: Sp3Trajectory, t: number): SpanError {
    try {
      traj.stateAt(t);
    } catch (e) {
      expect(e).toBeInstanceOf(SpanError);
      return e as SpanError;
    }
    throw new Error(`no refusal at ${fmt(t)}`);
  }
  const posErrM = (traj: Sp3Trajectory, t: number): number => {
    const want = truthStateTeme(segmentsOf(GAP, traj.id), truth.gmM3PerS2, t);
    const s = traj.stateAt(t);
    return Math.hypot(s.positionM[0] - want.r[0], s.positionM[1] - want.r[1], s.positionM[2] - want.r[2]);
  };

  it('the missing 06:00 epoch: requests whose window uses it are refused, naming satellite and span', () => {
    // Missing node b = 24; 10-point windows start at k − 4, so intervals k = 19..28 use it:
    // refused from node 19 (04:45 GPS) to node 29 (07:15 GPS).
    const e = refusal(x01, at(6.1));
    expect(e.what).toContain('X01');
    expect(e.what).toContain(`${fmt(at(4.75))} to ${fmt(at(7.25))}`);
    expect(e.what).toContain(fmt(at(6)));
    expect(e.sourceId).toContain('X01');
    expect(e.fix).toMatch(/outside/);
    expect(() => x01.stateAt(at(4.75) - 1)).not.toThrow();
    expect(posErrM(x01, at(7.25) + 1)).toBeLessThan(POSITION_INTERIOR_M);
    expect(() => x01.stateAt(at(7.25) - 1)).toThrow(SpanError);
  });

  it('the maneuver flagged at 15:00: windows spanning 14:45–15:00 are refused; each side matches its own truth', () => {
    // Maneuver between nodes 59 and 60: intervals 55..63 → refused from 13:45 to 16:00 GPS.
    const e = refusal(x01, at(15.5));
    expect(e.what).toContain('X01');
    expect(e.what).toMatch(/maneuver/);
    expect(e.what).toContain(`${GAP}:`);
    expect(e.what).toContain(`${fmt(at(13.75))} to ${fmt(at(16))}`);
    expect(posErrM(x01, at(13.75) - 300)).toBeLessThan(POSITION_INTERIOR_M);
    expect(posErrM(x01, at(16) + 300)).toBeLessThan(POSITION_INTERIOR_M);
    expect(posErrM(x01, at(20.3))).toBeLessThan(POSITION_INTERIOR_M);
  });

  it('a bad record is per satellite: X02 refused near 12:00, X01 served there', () => {
    const e = refusal(x02, at(12.2));
    expect(e.what).toContain('X02');
    expect(e.what).toMatch(/marked bad/);
    expect(posErrM(x01, at(12.2))).toBeLessThan(POSITION_INTERIOR_M);
  });

  it('a clock event (E) does not block the orbit', () => {
    expect(posErrM(x02, at(18.1))).toBeLessThan(POSITION_INTERIOR_M);
  });

  it('an unknown satellite id is refused', () => {
    expect(() => new Sp3Trajectory(f, 'X03', ts)).toThrow(/X03 is not in the SP3 file/);
  });
});

describe('streamed read (header part, then the epochs line by line)', () => {
  it('a gzip copy read from disk gives the same file as the text parsed whole, for P and P+V files', () => {
    const dir = mkdtempSync(join(tmpdir(), 'tauplan-sp3-'));
    for (const name of [MEO, LEO, GAP]) {
      const p = join(dir, `${name}.gz`);
      writeFileSync(p, gzipSync(readText(name)));
      const streamed = readSp3File(p, '--orbit');
      const whole = load(name);
      expect({ ...streamed, fileName: name }).toEqual(whole);
    }
  });
});
