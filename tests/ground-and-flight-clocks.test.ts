/**
 * Ground clocks, orbiting clocks and a ballistic flight in one field (physics.md §4 and §11).
 * References, each derived from confirmed constants (physics.md §2, §4, §10):
 * - a clock 1000 m higher on the ground runs faster by g·H/c² ≈ 1.09e-16 per metre (g = 9.80665);
 * - a 400 km circular orbit runs slow by about 24.6 µs/day;
 * - the break-even altitude 3GM/(2 L_G c²) − a_E ≈ 3167 km;
 * - a vertical launch that falls back gains proper time against the launch-site clock, while a
 *   circular orbit at the launch radius loses against it. The flight's size is checked against an
 *   independent fixed-step RK4 integration written in this file (common practice);
 * - a flight launched before the compare window counts from the window start: the part cut off is
 *   ∫ (y_flight − y_pad) dt over the cut, with y = L_G − (v²/2 + GM/r)/c² (IERS Conventions 2010
 *   §10.1, point mass; derived), the flight's speed at mid-cut from energy conservation.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { compareClocks as compareScenarioClocks } from '../src/api/compare.ts';
import { loadScenario } from '../src/api/scenario.ts';
import { ONE_LINE_ERROR, runCli } from './helpers/cli.ts';
import { groundClockFractionalOffset } from '../src/clock/groundClock.ts';
import { gravityModel } from '../src/orbit/gravity.ts';
import { IERS2010_L_G, SPEED_OF_LIGHT_M_PER_S, WGS84_A_M, WGS84_GM_M3_PER_S2, WGS84_OMEGA_RAD_PER_S } from '../src/constants.ts';
import { geodeticToEcefM } from '../src/events/station.ts';
import { elementsFromDegKm, KeplerianTrajectory } from '../src/orbit/keplerian.ts';
import { trajectoryFromStateVector } from '../src/orbit/stateVector.ts';
import { compareClocks } from '../src/plan/compare.ts';
import { sweepAltitude } from '../src/plan/sweep.ts';

const T0 = 852_292_869;
const C2 = SPEED_OF_LIGHT_M_PER_S ** 2;
const station = (id: string, heightM: number, latDeg = 0, lonDeg = 0) => ({ id, latDeg, lonDeg, heightM, geoidHeightM: 0, maskDeg: 10, minPassS: 300 });

describe('ground clocks', () => {
  it('1000 m of height: 1.09e-16 per metre (g/c², derived)', () => {
    const g = gravityModel('zonal');
    for (const lat of [0, 45, 80]) {
      const r0 = geodeticToEcefM(lat, 10, 0);
      const r1 = geodeticToEcefM(lat, 10, 1000);
      const perM = (groundClockFractionalOffset(g, r1[0], r1[1], r1[2]) - groundClockFractionalOffset(g, r0[0], r0[1], r0[2])) / 1000;
      // Local gravity is 9.78–9.83 m/s² (equator to pole) against standard 9.80665: 0.4 % spread.
      expect(Math.abs(perM / 1.0911e-16 - 1), `lat ${lat}: ${perM.toExponential(4)} per m`).toBeLessThan(0.005);
    }
  });

  it('a geoid undulation N lowers the rate by 1.091e-16 per metre (physics.md §4)', () => {
    // Published figure: 1.091e-16 per metre of height near the geoid (physics.md §4, derived there
    // from standard gravity); 4 digits quoted, so half a unit in the last place is 5e-20 per metre.
    const PER_METRE = 1.091e-16;
    const g = gravityModel('zonal');
    const r = geodeticToEcefM(30, 0, 100);
    const d = groundClockFractionalOffset(g, r[0], r[1], r[2], 0) - groundClockFractionalOffset(g, r[0], r[1], r[2], 50);
    const want = PER_METRE * 50;
    expect(Math.abs(d - want), `wanted ${want}, got ${d}, difference ${d - want}`).toBeLessThan(5e-20 * 50);
  });

  it('a clock on the equatorial ellipsoid is within 1e-15 of TT rate (geoid ≈ ellipsoid + undulation)', () => {
    const g = gravityModel('zonal');
    const r = geodeticToEcefM(0, 0, 0);
    expect(Math.abs(groundClockFractionalOffset(g, r[0], r[1], r[2]))).toBeLessThan(1e-15);
  });
});

describe('orbits against ground clocks', () => {
  it('400 km circular orbit: −24.6 µs/day (derived)', () => {
    const g = gravityModel('point');
    const el = elementsFromDegKm({ epochTtJ2000S: T0, aKm: 6778.137, e: 0, iDeg: 51.6, raanDeg: 0, argpDeg: 0, meanAnomalyDeg: 0 }, { a: 'a', e: 'e' });
    const r = compareClocks([{ id: 'low', trajectory: new KeplerianTrajectory('low', el, g.gmM3PerS2), flight: null }], [], g, T0, T0 + 86400);
    expect(Math.abs(r.clocks[0].driftNsPerDay / 1000 - -24.6)).toBeLessThan(0.05);
    expect(Math.abs(r.clocks[0].elapsedOffsetNs / 1000 - -24.6)).toBeLessThan(0.05);
  });

  it('break-even altitude from the sweep matches 3GM/(2 L_G c²) − a_E ≈ 3167 km', () => {
    const r = sweepAltitude({ fromKm: 1000, toKm: 6000, points: 11, e: 0, iDeg: 0, gravity: gravityModel('point'), epochTtJ2000S: T0 });
    const closedKm = (3 * WGS84_GM_M3_PER_S2) / (2 * IERS2010_L_G * C2) / 1000 - WGS84_A_M / 1000;
    expect(Math.abs((r.breakEvenAltitudeKm as number) - closedKm), `sweep ${r.breakEvenAltitudeKm} km, closed form ${closedKm} km`).toBeLessThan(0.01);
  });

  it('a circular orbit at the launch radius loses against the clock held there (closed form)', () => {
    const g = gravityModel('point');
    const el = elementsFromDegKm({ epochTtJ2000S: T0, aKm: WGS84_A_M / 1000, e: 0, iDeg: 0, raanDeg: 0, argpDeg: 0, meanAnomalyDeg: 0 }, { a: 'a', e: 'e' });
    const r = compareClocks([{ id: 'skim', trajectory: new KeplerianTrajectory('skim', el, g.gmM3PerS2), flight: null }], [station('PAD', 0)], g, T0, T0 + 86400);
    const pair = r.pairs[0];
    const a = WGS84_A_M;
    const closedNs = ((-WGS84_GM_M3_PER_S2 / (2 * a) + (WGS84_OMEGA_RAD_PER_S * a) ** 2 / 2) / C2) * 86400e9;
    expect(pair.elapsedDifferenceNs).toBeLessThan(0);
    expect(Math.abs(pair.elapsedDifferenceNs - closedNs), `got ${pair.elapsedDifferenceNs} ns, closed form ${closedNs} ns`).toBeLessThan(0.01);
  });
});

describe('vertical launch that falls back', () => {
  it('gains proper time against the launch-site clock; size matches an independent RK4 integration', () => {
    const g = gravityModel('point');
    const a = WGS84_A_M;
    const upMPerS = 3000;
    // Launch from the equator at 0° longitude of the inertial frame at the epoch, straight up,
    // carrying the ground's rotation speed eastward.
    const r0 = [a, 0, 0];
    const v0 = [upMPerS, WGS84_OMEGA_RAD_PER_S * a, 0];
    const traj = trajectoryFromStateVector({ id: 'hop', epochTtJ2000S: T0, frame: 'TEME', positionKm: r0.map((x) => x / 1000), velocityKmPerS: v0.map((x) => x / 1000), gravity: g, fromTtJ2000S: T0, toTtJ2000S: T0 + 3600, jdUtcAtEpoch: 2461409.5 });
    const flightEnd = traj.flightEndTtJ2000S as number;
    const r = compareClocks([{ id: 'hop', trajectory: traj, flight: { startTtJ2000S: T0, endTtJ2000S: flightEnd } }], [station('PAD', 0)], g, T0, T0 + 3600);
    const pair = r.pairs.find((p) => p.a === 'hop' && p.b === 'PAD')!;
    expect(pair.elapsedDifferenceNs, 'the falling clock gains').toBeGreaterThan(0);

    // Independent reference: RK4 with 0.01 s steps on point-mass gravity, proper time by the
    // trapezoid rule, until the radius is back at a.
    const gm = WGS84_GM_M3_PER_S2;
    const acc = (p: number[]) => {
      const rr = Math.hypot(p[0], p[1], p[2]);
      return p.map((x) => (-gm * x) / rr ** 3);
    };
    const rate = (p: number[], v: number[]) => IERS2010_L_G - ((v[0] ** 2 + v[1] ** 2 + v[2] ** 2) / 2 + gm / Math.hypot(p[0], p[1], p[2])) / C2;
    let p = [...r0];
    let v = [...v0];
    let t = 0;
    let tau = 0;
    const h = 0.01;
    let yPrev = rate(p, v);
    for (let k = 0; k < 200_000; k++) {
      const k1v = acc(p), k1p = v;
      const p2 = p.map((x, i) => x + (h / 2) * k1p[i]), v2 = v.map((x, i) => x + (h / 2) * k1v[i]);
      const k2v = acc(p2), k2p = v2;
      const p3 = p.map((x, i) => x + (h / 2) * k2p[i]), v3 = v.map((x, i) => x + (h / 2) * k2v[i]);
      const k3v = acc(p3), k3p = v3;
      const p4 = p.map((x, i) => x + h * k3p[i]), v4 = v.map((x, i) => x + h * k3v[i]);
      const k4v = acc(p4), k4p = v4;
      const pn = p.map((x, i) => x + (h / 6) * (k1p[i] + 2 * k2p[i] + 2 * k3p[i] + k4p[i]));
      const vn = v.map((x, i) => x + (h / 6) * (k1v[i] + 2 * k2v[i] + 2 * k3v[i] + k4v[i]));
      const rn = Math.hypot(pn[0], pn[1], pn[2]);
      const yn = rate(pn, vn);
      if (t > 1 && rn < a) {
        // Last partial step by linear interpolation of the radius.
        const rPrev = Math.hypot(p[0], p[1], p[2]);
        const frac = (rPrev - a) / (rPrev - rn);
        tau += frac * h * (yPrev + (yPrev + frac * (yn - yPrev))) / 2;
        t += frac * h;
        break;
      }
      tau += (h * (yPrev + yn)) / 2;
      t += h;
      p = pn;
      v = vn;
      yPrev = yn;
    }
    const stationRate = IERS2010_L_G - (gm / a + (WGS84_OMEGA_RAD_PER_S * a) ** 2 / 2) / C2;
    const referenceNs = (tau - stationRate * t) * 1e9;
    expect(Math.abs(flightEnd - T0 - t), `flight ${flightEnd - T0} s vs RK4 ${t} s`).toBeLessThan(1e-3);
    // RK4 at 0.01 s and the trapezoid rule are good to far below 1 ps over a 10-minute flight.
    expect(Math.abs(pair.elapsedDifferenceNs - referenceNs), `tauplan ${pair.elapsedDifferenceNs} ns, RK4 ${referenceNs} ns`).toBeLessThan(1e-3);
  });
});

describe('a flight launched before the compare window', () => {
  // INVENTED: a made-up sounding flight, orbiter and stations (one on the Moon, whose clock is
  // integrated over the window). The flight is launched half a second before the window, as a
  // countdown slipping past the planned window start would do.
  const scenario = (launch: string, clock = ''): string => `name: Early hop (invented)
window: { start: 2027-03-01T00:00:00Z, end: 2027-03-01T02:00:00Z }
gravity: point
satellites:
  - id: HOP-1
    orbit:
      state: { epoch: ${launch}, frame: TEME, positionKm: [6380.0, 0, 0], velocityKmPerS: [3.0, 0.5, 0] }
${clock}  - id: RING-1
    orbit:
      keplerian: { epoch: 2027-03-01T00:00:00Z, aKm: 7000, e: 0.001, iDeg: 50, raanDeg: 0, argpDeg: 0, meanAnomalyDeg: 0 }
stations:
  - { id: PADFIELD, latDeg: 0, lonDeg: 0, heightM: 10, geoidHeightM: 0, maskDeg: 5, minPassS: 0 }
  - { id: HALDEN-BASE, body: moon, latDeg: 0, lonDeg: 0, heightM: 0, maskDeg: 5, minPassS: 300 }
`;
  const dir = mkdtempSync(join(tmpdir(), 'tauplan-early-hop-'));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));
  const ms = (iso: string): number => Date.parse(iso);

  it('counts over its part inside the window; the cut part matches (y_flight − y_pad)·Δt', () => {
    const text = scenario('2027-02-28T23:59:59.500Z');
    const cut = compareScenarioClocks(loadScenario(text));
    const whole = compareScenarioClocks(loadScenario(text), { from: '2027-02-28T23:59:59.500Z' });
    const hop = cut.clocks.find((c) => c.id === 'HOP-1')!;
    expect(hop.flightStart).toBe('2027-02-28T23:59:59.500Z');
    expect(hop.from, 'the figures start at the window start').toBe('2027-03-01T00:00:00.000Z');
    const hopPairs = cut.pairs.filter((p) => p.a === 'HOP-1' || p.b === 'HOP-1');
    expect(hopPairs.map((p) => p.b).sort()).toEqual(['HALDEN-BASE', 'PADFIELD', 'RING-1']);
    for (const p of hopPairs) {
      expect(p.from, `${p.a} − ${p.b} starts at the window start`).toBe('2027-03-01T00:00:00.000Z');
      expect(p.to, `${p.a} − ${p.b} ends at the landing`).toBe(hop.flightEnd);
      expect(ms(p.to)).toBeLessThan(ms('2027-03-01T02:00:00Z'));
    }
    // The 0.5 s cut off: rate difference at mid-cut (radius from the launch climb rate ṙ = 3 km/s,
    // speed from v²/2 − GM/r = const), times 0.5 s. The pad's radius and ground speed from WGS-84.
    const gm = WGS84_GM_M3_PER_S2;
    const r0 = 6_380_000;
    const v0 = Math.hypot(3000, 500);
    const rMid = r0 + 3000 * 0.25;
    const hopRate = -((v0 ** 2 / 2 - gm / r0 + gm / rMid) + gm / rMid) / C2;
    const pad = geodeticToEcefM(0, 0, 10);
    const padR = Math.hypot(pad[0], pad[1], pad[2]);
    const padRate = -((WGS84_OMEGA_RAD_PER_S * Math.hypot(pad[0], pad[1])) ** 2 / 2 + gm / padR) / C2;
    const wantNs = (hopRate - padRate) * 0.5 * 1e9;
    const pairOf = (r: typeof cut) => r.pairs.find((p) => p.a === 'HOP-1' && p.b === 'PADFIELD')!.elapsedDifferenceNs;
    const gotNs = pairOf(whole) - pairOf(cut);
    // 0.1 %: the rate's change over the cut is taken at its midpoint (error ~1e-5 of it); the Moon
    // and Sun tides of this lunar scenario differ between flight and pad by ~1e-6 of it.
    expect(Math.abs(gotNs - wantNs), `wanted ${wantNs} ns, got ${gotNs} ns, difference ${gotNs - wantNs} ns`).toBeLessThan(Math.abs(wantNs) * 1e-3);
  });

  it('a flight that lands before the window is refused in one line naming the satellite and the fix', () => {
    const path = join(dir, 'landed.yaml');
    writeFileSync(path, scenario('2027-02-28T23:30:00Z'));
    const r = runCli(['compare', path]);
    expect(r.code, r.stderr).toBe(2);
    expect(r.stderr).toMatch(ONE_LINE_ERROR);
    expect(r.stderr).toMatch(/sub-orbital flight of HOP-1 .* has no part in the window .*satellites\[0\]\) — give a window that holds part of the flight/);
    expect(r.stdout).toBe('');
  });

  it('passes with a clock epoch before the launch: refused in one line naming clock.epoch', () => {
    const path = join(dir, 'early-clock.yaml');
    writeFileSync(path, scenario('2027-02-28T23:59:59.500Z', '    clock: { epoch: 2027-02-28T23:00:00Z }\n'));
    const r = runCli(['passes', path]);
    expect(r.code, r.stderr).toBe(2);
    expect(r.stderr).toMatch(ONE_LINE_ERROR);
    expect(r.stderr).toMatch(/clock epoch .* of HOP-1 is outside its sub-orbital flight .*satellites\[0\]\.clock\.epoch\) — give a clock epoch/);
  });
});
