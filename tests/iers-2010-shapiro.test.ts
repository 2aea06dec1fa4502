/**
 * Shapiro delay of src/events/oneWay.ts against IERS Conventions 2010 (IERS Technical Note 36),
 * chapter 11: for a signal between a GNSS satellite and a ground receiver in the Earth's field,
 *   Δt = (2GM/c³) ln((r_s + r_r + ρ)/(r_s + r_r − ρ))   (confirmed, physics.md §4).
 * Values for a GPS orbit: about 42 ps at the zenith and 62 ps at the horizon (derived).
 */
import { describe, expect, it } from 'vitest';
import { SPEED_OF_LIGHT_M_PER_S, WGS84_A_M, WGS84_GM_M3_PER_S2, WGS84_OMEGA_RAD_PER_S } from '../src/constants.ts';
import { oneWayTerms, shapiroDelayNs } from '../src/events/oneWay.ts';
import { geodeticToEcefM } from '../src/events/station.ts';
import { elementsFromDegKm, KeplerianTrajectory } from '../src/orbit/keplerian.ts';

const C = SPEED_OF_LIGHT_M_PER_S;
const GPS_A_M = 26_561_750;
const TWO_GM_OVER_C3_NS = ((2 * WGS84_GM_M3_PER_S2) / C ** 3) * 1e9;

describe('IERS 2010 ch. 11 Shapiro delay, GNSS geometry (derived)', () => {
  const rr = WGS84_A_M;

  it('zenith: (2GM/c³) ln(r_s/r_r) ≈ 42 ps', () => {
    const ns = shapiroDelayNs(GPS_A_M, rr, GPS_A_M - rr);
    console.log(`Shapiro at zenith: ${(ns * 1000).toFixed(2)} ps`);
    // At the zenith the log argument reduces to r_s/r_r exactly; 1e-15 ns is rounding.
    expect(Math.abs(ns - TWO_GM_OVER_C3_NS * Math.log(GPS_A_M / rr))).toBeLessThan(1e-15);
    expect(ns * 1000).toBeGreaterThan(41.5);
    expect(ns * 1000).toBeLessThan(42.5);
  });

  it('horizon: ρ = √(r_s² − r_r²) gives ≈ 62 ps', () => {
    const ns = shapiroDelayNs(GPS_A_M, rr, Math.sqrt(GPS_A_M ** 2 - rr ** 2));
    console.log(`Shapiro at the horizon: ${(ns * 1000).toFixed(2)} ps`);
    expect(ns * 1000).toBeGreaterThan(61.5);
    expect(ns * 1000).toBeLessThan(62.8);
  });

  it('grows with the path length between zenith and horizon', () => {
    let prev = -Infinity;
    for (let zDeg = 0; zDeg <= 90; zDeg += 5) {
      // Law of cosines for the range at zenith angle z seen from radius r_r.
      const z = (zDeg * Math.PI) / 180;
      const rho = -rr * Math.cos(z) + Math.sqrt(GPS_A_M ** 2 - rr ** 2 * Math.sin(z) ** 2);
      const ns = shapiroDelayNs(GPS_A_M, rr, rho);
      expect(ns).toBeGreaterThan(prev);
      prev = ns;
    }
  });

  it('oneWayTerms gives the zenith value for a satellite built to pass overhead', () => {
    // Equatorial circular GPS-radius orbit that stands over (0°, 0°) at tZenith (smooth sidereal angle).
    const t0 = 851_000_000;
    const w = WGS84_OMEGA_RAD_PER_S;
    const theta0 = 0.5;
    const gmstRadAt = (t: number): number => theta0 + w * (t - t0);
    const n = Math.sqrt(WGS84_GM_M3_PER_S2 / GPS_A_M ** 3);
    const tZenith = t0 + 1_000;
    const u0Deg = ((gmstRadAt(tZenith) - n * 1_000) * 180) / Math.PI;
    const traj = new KeplerianTrajectory(
      'zenith',
      elementsFromDegKm({ epochTtJ2000S: t0, aKm: GPS_A_M / 1000, e: 0, iDeg: 0, raanDeg: 0, argpDeg: 0, meanAnomalyDeg: u0Deg }, { a: 'a', e: 'e' }),
      WGS84_GM_M3_PER_S2,
    );
    const station = geodeticToEcefM(0, 0, 0);
    const tau = (GPS_A_M - rr) / C;
    const terms = oneWayTerms(traj, station, gmstRadAt, tZenith + tau);
    const want = shapiroDelayNs(GPS_A_M, rr, GPS_A_M - rr);
    console.log(`oneWayTerms at zenith: light ${terms.lightTimeNs.toFixed(3)} ns, Shapiro ${(terms.shapiroNs * 1000).toFixed(3)} ps, Sagnac ${terms.sagnacNs.toFixed(4)} ns`);
    // 0.01 ps: the satellite is within ~300 m of the zenith during the flight time, a second-order change in ρ.
    expect(Math.abs(terms.shapiroNs - want)).toBeLessThan(1e-5);
    // Light time close to (r_s − r_r)/c: the satellite moves about 260 m across the line of sight (< 2 m of range).
    expect(Math.abs(terms.lightTimeNs - tau * 1e9)).toBeLessThan(10);
    // Nearly in the meridian plane: the Sagnac term is a fraction of a ns.
    expect(Math.abs(terms.sagnacNs)).toBeLessThan(1);
  });
});
