/**
 * IS-GPS-200 (Navstar GPS Space Segment/Navigation User Interfaces), §3.3.1.1 "Frequency Plan":
 * the satellite's 10.23 MHz reference is offset by Δf/f = −4.4647e-10 to 10.22999999543 MHz so that
 * the clock keeps ground rate in orbit (confirmed via quotation, physics.md §2).
 * §20.3.3.3.3.1: relativistic correction Δtr = F·e·√A·sin E with F = −2√μ/c² = −4.442807633e-10 s/√m
 * at μ = 3.986005e14 m³/s² (confirmed via code citing the spec, physics.md §2).
 */
import { describe, expect, it } from 'vitest';
import { gravityModel } from '../src/orbit/gravity.ts';
import { keplerMeanFractionalOffset } from '../src/clock/closedForms.ts';
import { WGS84_GM_M3_PER_S2 } from '../src/constants.ts';
import { elementsFromDegKm, KeplerianTrajectory } from '../src/orbit/keplerian.ts';
import { sizeClock } from '../src/plan/size.ts';

const GPS_A_KM = 26561.75; // nominal GPS semi-major axis used with the spec's figure (physics.md §2)
const EPOCH = 852_076_800; // 2027-01-01T00:00:00 TT-ish, any epoch works for two-body motion

function sizeGps(e: number) {
  const g = gravityModel('point');
  const el = elementsFromDegKm({ epochTtJ2000S: EPOCH, aKm: GPS_A_KM, e, iDeg: 55, raanDeg: 10, argpDeg: 20, meanAnomalyDeg: 30 }, { a: 'a', e: 'e' });
  return sizeClock({ trajectory: new KeplerianTrajectory('gps-like', el, g.gmM3PerS2), gravity: g, fromTtJ2000S: EPOCH, spanS: 86400, nominalHz: 10.23e6 });
}

describe('IS-GPS-200 §3.3.1.1 frequency offset', () => {
  it('mean fractional offset at GPS a is +4.4647e-10 (the spec quotes the ground setting, −4.4647e-10)', () => {
    const r = sizeGps(0);
    // The spec gives 5 significant digits: half a unit in the last place is 5e-15.
    expect(Math.abs(r.meanFractionalOffset - 4.4647e-10), `got ${r.meanFractionalOffset}`).toBeLessThan(5e-15);
    expect(Math.abs(keplerMeanFractionalOffset(GPS_A_KM * 1000) - 4.4647e-10)).toBeLessThan(5e-15);
  });

  it('recommended frequency is 10.22999999543 MHz', () => {
    const r = sizeGps(0.01);
    // Spec quotes 0.01 mHz resolution (10.22999999543 MHz): tolerance half of that, 5e-6 Hz.
    expect(Math.abs(r.recommendedHz - 10.22999999543e6), `got ${r.recommendedHz} Hz`).toBeLessThan(5e-6);
    expect(r.recommendedOffsetHz).toBeLessThan(0);
  });

  it('the eccentricity amplitude equals |F|·e·√A with the published F = −4.442807633e-10 s/√m', () => {
    // F as printed in §20.3.3.3.3.1 (confirmed), for μ = 3.986005e14 m³/s² (the spec's μ).
    const F_PUBLISHED_S_PER_SQRT_M = -4.442807633e-10;
    const MU_SPEC_M3_PER_S2 = 3.986005e14;
    // F = −2√μ/c² scales as √μ: at the contract GM (3.986004418e14) it is 7.3e-8 smaller in
    // relative terms (derived), 0.0017 ns on this amplitude, so the scaling is kept.
    const fAtContractGm = Math.abs(F_PUBLISHED_S_PER_SQRT_M) * Math.sqrt(WGS84_GM_M3_PER_S2 / MU_SPEC_M3_PER_S2);
    const r = sizeGps(0.01);
    const wantNs = fAtContractGm * 0.01 * Math.sqrt(GPS_A_KM * 1000) * 1e9;
    // Half peak-to-peak on a grid of 75 s spacing misses the peak by < 1e-4 relative (about 2e-3 ns):
    // 1e-3 ns is met; F's 10 printed digits are worth 2e-9 ns here.
    const diff = r.eccentricityAmplitudeNs - wantNs;
    expect(Math.abs(diff), `wanted ${wantNs} ns, got ${r.eccentricityAmplitudeNs} ns, difference ${diff} ns`).toBeLessThan(1e-3);
  });
});
