/**
 * The Sagnac (earth-rotation) term of src/events/oneWay.ts against the IS-GPS-200 earth-rotation
 * correction (IS-GPS-200, §20.3.3.4.3.3.2, section number from memory): a receiver that computes the
 * satellite's earth-fixed position at transmit time must rotate it about z by ω_E·τ before taking the
 * range,  x' = x cos ωτ + y sin ωτ,  y' = −x sin ωτ + y cos ωτ.  The first-order effect on the light
 * time is ω_E (x_s y_r − y_s x_r)/c² (physics.md §4, confirmed formula).
 * - Size: at most ω_E r_r √(r_s² − r_r²)/c² ≈ 133.5 ns for a GPS orbit seen on the horizon from the
 *   equator (derived).
 * - Sign: negative for a satellite east of the receiver (the receiver moves toward the signal) (derived).
 */
import { describe, expect, it } from 'vitest';
import { SPEED_OF_LIGHT_M_PER_S, WGS84_A_M, WGS84_GM_M3_PER_S2, WGS84_OMEGA_RAD_PER_S } from '../src/constants.ts';
import { lookAngles, stationFrameFromGeodetic } from '../src/events/lookAngles.ts';
import { oneWayTerms, sagnacDelayNs } from '../src/events/oneWay.ts';
import { geodeticToEcefM } from '../src/events/station.ts';
import { temeToEcefPosition } from '../src/orbit/frames.ts';
import { elementsFromDegKm, KeplerianTrajectory } from '../src/orbit/keplerian.ts';
import { vec3 } from '../src/orbit/vec.ts';

const C = SPEED_OF_LIGHT_M_PER_S;
const W = WGS84_OMEGA_RAD_PER_S;
const GPS_A_M = 26_561_750;
const T0 = 851_000_000; // an instant in 2026–2027, seconds since J2000.0 TT
/** A smooth sidereal angle (rate ω_E exactly), so that ps-level checks see no rounding of Julian dates. */
const gmstRadAt = (t: number): number => 1.234 + W * (t - T0);

describe('Sagnac size and sign (derived)', () => {
  const rr = WGS84_A_M;
  const station = geodeticToEcefM(0, 0, 0);
  const horizonLonRad = Math.acos(rr / GPS_A_M);
  const bound = (W * rr * Math.sqrt(GPS_A_M ** 2 - rr ** 2)) / (C * C) * 1e9;

  it(`horizon from the equator: |Sagnac| = ω r_r √(r_s² − r_r²)/c² ≈ 133.5 ns`, () => {
    expect(bound).toBeGreaterThan(133);
    expect(bound).toBeLessThan(134);
    const east = vec3<'ECEF'>(GPS_A_M * Math.cos(horizonLonRad), GPS_A_M * Math.sin(horizonLonRad), 0);
    const west = vec3<'ECEF'>(east[0], -east[1], 0);
    // The geometry really is the horizon (spherical at the equator): elevation 0 to 1e-9°.
    expect(Math.abs(lookAngles(stationFrameFromGeodetic(0, 0, 0), east).elevationDeg)).toBeLessThan(1e-9);
    const sEast = sagnacDelayNs(east, station);
    const sWest = sagnacDelayNs(west, station);
    console.log(`Sagnac at the horizon: east ${sEast.toFixed(3)} ns, west ${sWest.toFixed(3)} ns`);
    // 1e-9 ns: the same closed form, evaluated two ways.
    expect(Math.abs(sEast + bound)).toBeLessThan(1e-9);
    expect(Math.abs(sWest - bound)).toBeLessThan(1e-9);
  });

  it('zero for a satellite in the receiver meridian plane', () => {
    expect(Math.abs(sagnacDelayNs(vec3<'ECEF'>(GPS_A_M, 0, 0), station))).toBe(0);
    const north = geodeticToEcefM(45, 0, 0);
    expect(Math.abs(sagnacDelayNs(vec3<'ECEF'>(GPS_A_M * 0.6, 0, GPS_A_M * 0.8), north))).toBe(0);
  });

  it('stays within the bound over visible GPS geometry from several latitudes', () => {
    const el = elementsFromDegKm({ epochTtJ2000S: T0, aKm: GPS_A_M / 1000, e: 0, iDeg: 55, raanDeg: 40, argpDeg: 0, meanAnomalyDeg: 0 }, { a: 'a', e: 'e' });
    const traj = new KeplerianTrajectory('gps', el, WGS84_GM_M3_PER_S2);
    let maxAbs = 0;
    for (const lat of [0, 30, 60]) {
      const f = stationFrameFromGeodetic(lat, 0, 0);
      for (let t = T0; t < T0 + 86_400; t += 120) {
        const s = traj.stateAt(t);
        const r = temeToEcefPosition(vec3<'TEME'>(s.positionM[0], s.positionM[1], s.positionM[2]), gmstRadAt(t));
        if (lookAngles(f, r).elevationDeg < 0) continue;
        maxAbs = Math.max(maxAbs, Math.abs(sagnacDelayNs(r, f.positionM)));
      }
    }
    console.log(`largest |Sagnac| seen: ${maxAbs.toFixed(2)} ns (bound ${bound.toFixed(2)} ns)`);
    expect(maxAbs).toBeLessThanOrEqual(bound);
    expect(maxAbs).toBeGreaterThan(60); // the sample reaches low elevations off the meridian
  });
});

describe('IS-GPS-200 earth-rotation correction reproduces the inertial light time (derived)', () => {
  it('c·τ equals the range to the satellite rotated by ωτ; τ − ρ_ECEF/c equals the Sagnac term', () => {
    const el = elementsFromDegKm({ epochTtJ2000S: T0, aKm: GPS_A_M / 1000, e: 0.01, iDeg: 55, raanDeg: 40, argpDeg: 10, meanAnomalyDeg: 20 }, { a: 'a', e: 'e' });
    const traj = new KeplerianTrajectory('gps', el, WGS84_GM_M3_PER_S2);
    const sites: [number, number][] = [
      [0, 20],
      [45, -60],
      [-35, 150],
    ];
    let checked = 0;
    for (const [lat, lon] of sites) {
      const f = stationFrameFromGeodetic(lat, lon, 100);
      for (let t = T0; t < T0 + 86_400; t += 1_800) {
        const s = traj.stateAt(t);
        const rNow = temeToEcefPosition(vec3<'TEME'>(s.positionM[0], s.positionM[1], s.positionM[2]), gmstRadAt(t));
        if (lookAngles(f, rNow).elevationDeg < 5) continue;
        const terms = oneWayTerms(traj, f.positionM, gmstRadAt, t);
        const tau = terms.lightTimeNs * 1e-9;
        // The receiver's view: satellite earth-fixed at transmit time, then the ICD rotation by ωτ.
        const st = traj.stateAt(terms.transmitTtJ2000S);
        const rE = temeToEcefPosition(vec3<'TEME'>(st.positionM[0], st.positionM[1], st.positionM[2]), gmstRadAt(terms.transmitTtJ2000S));
        const a = W * tau;
        const xr = rE[0] * Math.cos(a) + rE[1] * Math.sin(a);
        const yr = -rE[0] * Math.sin(a) + rE[1] * Math.cos(a);
        const rx = f.positionM;
        const rangeIcdM = Math.hypot(xr - rx[0], yr - rx[1], rE[2] - rx[2]);
        const rangeEcefM = Math.hypot(rE[0] - rx[0], rE[1] - rx[1], rE[2] - rx[2]);
        // 1 mm: the same geometry two ways; a time near 8.5e8 s resolves 1.2e-7 s (≤ 0.5 mm of motion).
        expect(Math.abs(rangeIcdM - tau * C), `ICD range vs c·τ at ${t}`).toBeLessThan(1e-3);
        // 3 ps: the Sagnac formula is first order in ωτ; the next term is ≤ (ωτ r_s)²/(2ρc) ≈ 1.5 ps.
        const exactNs = terms.lightTimeNs - (rangeEcefM / C) * 1e9;
        expect(Math.abs(exactNs - terms.sagnacNs), `Sagnac ${terms.sagnacNs} ns vs exact ${exactNs} ns`).toBeLessThan(0.003);
        expect(terms.iterations).toBeLessThanOrEqual(6);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(5);
  });
});
