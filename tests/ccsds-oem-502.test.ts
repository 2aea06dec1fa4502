/**
 * CCSDS OEM reader and trajectory (src/io/oem.ts, src/orbit/oem.ts) against CCSDS 502.0-B-3
 * "Orbit Data Messages" (2023), KVN OEM: header, META_START/META_STOP with REF_FRAME, TIME_SYSTEM,
 * START/STOP and USEABLE times, INTERPOLATION and INTERPOLATION_DEGREE, data lines `epoch x y z vx
 * vy vz` in km and km/s, several segments. The ephemerides are written by the test from our own
 * two-body propagator (an invented Galileo-like orbit), so the expected states are known exactly;
 * the mean rate check uses IERS 2010 ch. 10 (L_G − 3GM/(2ac²), confirmed).
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { InputError, SpanError } from '../src/errors.ts';
import { oemTrajectory } from '../src/io/orbitSources.ts';
import { defaultTimeSystem } from '../src/io/tables.ts';
import { applyMatrix, equationOfEquinoxesRad, gcrfToTodMatrix, temeToEcef, todToTeme, transpose } from '../src/orbit/frames.ts';
import { elementsFromDegKm, KeplerianTrajectory } from '../src/orbit/keplerian.ts';
import { gmstRadAtTt } from '../src/orbit/sp3.ts';
import type { Vec3 } from '../src/orbit/vec.ts';
import { Instant } from '../src/time/instant.ts';
import { runCli } from './helpers/cli.ts';

const ts = defaultTimeSystem();
const dir = mkdtempSync(join(tmpdir(), 'tauplan-oem-'));
const GM = 3.986004418e14; // IERS 2010 Table 1.1
const L_G = 6.969290134e-10; // IERS 2010 Table 1.1
const C2 = 299_792_458 ** 2;
const epoch = ts.parse('2027-01-01T00:00:00Z').ttJ2000S;
const A_KM = 29600.318;
const kep = new KeplerianTrajectory('GAL-LIKE (invented)', elementsFromDegKm({ epochTtJ2000S: epoch, aKm: A_KM, e: 0.001, iDeg: 56, raanDeg: 40, argpDeg: 10, meanAnomalyDeg: 0 }, { a: 'a', e: 'e' }), GM);

const utc = (tt: number): string => ts.format(Instant.fromTtJ2000S(tt)).replace('Z', '');

/** State of the invented orbit in `frame` [km, km/s] at tt. */
function stateIn(frame: string, tt: number): number[] {
  const s = kep.stateAt(tt);
  const jd = ts.jdUtcFromTtJ2000S(tt);
  let r: readonly number[] = s.positionM;
  let v: readonly number[] = s.velocityMPerS;
  if (frame === 'EME2000' || frame === 'GCRF') {
    const m = transpose(gcrfToTodMatrix(jd));
    r = applyMatrix<'TOD', 'GCRF'>(m, s.positionM);
    v = applyMatrix<'TOD', 'GCRF'>(m, s.velocityMPerS);
  } else if (frame === 'TEME' || frame === 'ITRF') {
    const eq = equationOfEquinoxesRad(jd);
    const rt = todToTeme(s.positionM, eq);
    const vt = todToTeme(s.velocityMPerS, eq);
    if (frame === 'TEME') [r, v] = [rt, vt];
    else {
      const e = temeToEcef(rt, vt, gmstRadAtTt(ts, tt));
      [r, v] = [e.r, e.v];
    }
  }
  return [...r.map((x) => x / 1000), ...v.map((x) => x / 1000)];
}

function segment(frame: string, from: number, to: number, stepS: number, interp = 'LAGRANGE', degree = 8, object = 'GAL-LIKE'): string {
  const lines = ['META_START', `OBJECT_NAME = ${object}`, 'OBJECT_ID = 2027-999A', 'CENTER_NAME = EARTH', `REF_FRAME = ${frame}`, 'TIME_SYSTEM = UTC', `START_TIME = ${utc(from)}`, `STOP_TIME = ${utc(to)}`, `INTERPOLATION = ${interp}`, `INTERPOLATION_DEGREE = ${degree}`, 'META_STOP', 'COMMENT invented orbit, two-body'];
  for (let t = from; t <= to + 1e-6; t += stepS) lines.push(`${utc(t)} ${stateIn(frame, t).map((x) => x.toFixed(9)).join(' ')}`);
  return lines.join('\n');
}

function oemFile(name: string, ...segments: string[]): string {
  const p = join(dir, name);
  writeFileSync(p, ['CCSDS_OEM_VERS = 3.0', 'CREATION_DATE = 2026-01-01T00:00:00', 'ORIGINATOR = TAUPLAN-TESTS', ...segments, ''].join('\n'));
  return p;
}

function errorNear(got: Vec3<'TOD'>, want: readonly number[]): number {
  return Math.hypot(got[0] - want[0], got[1] - want[1], got[2] - want[2]);
}

describe('frames and interpolation', () => {
  for (const frame of ['EME2000', 'GCRF', 'TEME', 'ITRF']) {
    it(`${frame}, Lagrange degree 8 at 300 s: states back in TOD within 1 mm and 1 µm/s`, () => {
      const p = oemFile(`${frame}.oem`, segment(frame, epoch, epoch + 86400, 300));
      const traj = oemTrajectory(p, undefined, ts, 'test');
      let worstM = 0;
      let worstMPerS = 0;
      for (let t = epoch + 1000; t < epoch + 86000; t += 3917) {
        const s = traj.stateAt(t);
        const want = kep.stateAt(t);
        worstM = Math.max(worstM, errorNear(s.positionM, want.positionM));
        worstMPerS = Math.max(worstMPerS, errorNear(s.velocityMPerS, want.velocityMPerS));
      }
      // 9-point interpolation over 40 min of a 14-h orbit is far below 1 mm; the file's 1e-9 km (µm)
      // digits and the frame round trips (same functions both ways) add nothing visible.
      expect(worstM, `${frame}: worst position error ${worstM} m`).toBeLessThan(1e-3);
      expect(worstMPerS, `${frame}: worst velocity error ${worstMPerS} m/s`).toBeLessThan(1e-6);
    });
  }
  it('Hermite degree 7 (4 nodes with velocities) at 300 s: within 1 cm and 10 µm/s', () => {
    const p = oemFile('hermite.oem', segment('GCRF', epoch, epoch + 43200, 300, 'HERMITE', 7));
    const traj = oemTrajectory(p, undefined, ts, 'test');
    for (let t = epoch + 777; t < epoch + 43000; t += 2777) {
      expect(errorNear(traj.stateAt(t).positionM, kep.stateAt(t).positionM)).toBeLessThan(1e-2);
      expect(errorNear(traj.stateAt(t).velocityMPerS, kep.stateAt(t).velocityMPerS)).toBeLessThan(1e-5);
    }
  });
});

describe('segments', () => {
  it('two segments with a gap: inside each one is served, the gap is refused', () => {
    const p = oemFile('gap.oem', segment('GCRF', epoch, epoch + 21600, 300), segment('GCRF', epoch + 36000, epoch + 57600, 300));
    const traj = oemTrajectory(p, 'GAL-LIKE', ts, 'test');
    expect(errorNear(traj.stateAt(epoch + 40000).positionM, kep.stateAt(epoch + 40000).positionM)).toBeLessThan(1e-3);
    expect(() => traj.stateAt(epoch + 30000)).toThrow(SpanError);
    expect(() => traj.stateAt(epoch + 30000)).toThrow(/gap between segments/);
  });
  it('an object that is not in the file is refused, naming those that are', () => {
    const p = oemFile('two.oem', segment('GCRF', epoch, epoch + 7200, 300, 'LAGRANGE', 8, 'ONE'), segment('GCRF', epoch, epoch + 7200, 300, 'LAGRANGE', 8, 'TWO'));
    expect(() => oemTrajectory(p, undefined, ts, '--oem')).toThrow(/2 objects/);
    expect(() => oemTrajectory(p, 'THREE', ts, '--oem')).toThrow(/ONE \(2027-999A\), TWO/);
  });
});

describe('refusals', () => {
  const good = segment('GCRF', epoch, epoch + 7200, 300);
  const cases: [string, string, RegExp][] = [
    ['frame', good.replace('REF_FRAME = GCRF', 'REF_FRAME = RTN'), /REF_FRAME "RTN" is not read/],
    ['time system', good.replace('TIME_SYSTEM = UTC', 'TIME_SYSTEM = TDB'), /TIME_SYSTEM "TDB" is not read/],
    ['truncated metadata', good.split('META_STOP')[0], /ends inside the metadata/],
    ['truncated data line', `${good}\n${utc(epoch + 7500)} 1 2 3`, /data line has 4 fields/],
  ];
  for (const [name, seg, re] of cases) {
    it(name, () => {
      const p = oemFile(`bad-${name.replace(/ /g, '-')}.oem`, seg);
      let err: unknown = null;
      try {
        oemTrajectory(p, undefined, ts, 'test');
      } catch (e) {
        err = e;
      }
      expect(err).toBeInstanceOf(InputError);
      expect((err as InputError).what).toMatch(re);
      expect((err as InputError).where).toMatch(/bad-.*\.oem:\d+$/);
    });
  }
});

describe('size --oem (CLI)', () => {
  it('mean rate of the invented near-circular orbit = L_G − 3GM/(2ac²) (IERS 2010 ch. 10) within 1e-15', () => {
    const p = oemFile('size.oem', segment('EME2000', epoch, epoch + 2 * 86400, 300));
    const r = runCli(['size', '--oem', p, '--gravity', 'point', '--span', '1d', '--format', 'json']);
    expect(r.code, r.stderr).toBe(0);
    const got = (JSON.parse(r.stdout) as { meanFractionalOffset: number }).meanFractionalOffset;
    const want = L_G - (3 * GM) / (2 * A_KM * 1000 * C2);
    // e = 0.001 changes nothing in the mean (the periodic part is removed); 1e-15 covers interpolation.
    expect(Math.abs(got - want), `wanted ${want}, got ${got}, difference ${got - want}`).toBeLessThan(1e-15);
  });
});

