/**
 * Closed forms for clocks about the Moon (derived; physics.md §12), checked against tauplan's full
 * geocentric-metric integration (Earth's zonal field, the Moon's potential taken exactly, the Sun's
 * tide, geocentric velocities) with a point-mass Moon and two-body orbits:
 * - a circular orbit of radius a against a clock at rest on the 1737.4 km sphere:
 *   Δy = −(3GM_M/(2a) − GM_M/R)/c²  (100 km: −1.1349 µs/day, derived with GM_M = 4902.800066 km³/s²,
 *   DE430, and R = 1737.4 km);
 * - the eccentricity term 2√(GM_M·a)·e/c² (12-hour frozen orbit a = 6142 km, e = 0.6: 73.268 ns, derived);
 * - the cross term −v_M·ρ/c² of the geocentric frame: amplitude at most |v_M|·a(1 + e)/c² (≈ 92 ns).
 * The Earth and the Sun enter both clocks almost alike: what they leave in the difference is the
 * tidal potential across the orbit and the surface clock's offset from the Moon's centre, below
 * 1e-4 µs/day (measured), so the tolerance on the rate is 0.001 µs/day.
 */
import { describe, expect, it } from 'vitest';
import { Matrix, solve } from 'ml-matrix';
import { eccentricAnomalyRad } from '../src/orbit/keplerian.ts';
import { integrateBulkAlong } from '../src/clock/integrate.ts';
import { LunarExternalField, lunarFractionalOffset, lunarPeriodicTermsS } from '../src/clock/lunarRate.ts';
import { gravityModel } from '../src/orbit/gravity.ts';
import { LunarSurfaceTrajectory } from '../src/orbit/lunarSurface.ts';
import { MOON_POINT_MASS } from '../src/orbit/moonGravity.ts';
import { analyseLunarRate } from '../src/plan/lunarRates.ts';
import { lunarForces, lunarOrbitFromElements } from '../src/orbit/lunarOrbitInput.ts';
import { sizeLunarClock } from '../src/plan/lunarSize.ts';

const GM_MOON = 4.902800066e12;
const R_MOON_M = 1_737_400;
const C2 = 299_792_458 ** 2;
const US_PER_DAY = 86_400e6;
const EPOCH = 852_076_800; // 2027-01-01T12:00 TT
const DAY_S = 86_400;

function orbit(aKm: number, e: number, spanS: number) {
  return lunarOrbitFromElements('closed-form', { epochTtJ2000S: EPOCH, aKm, e, iDeg: 57.8, raanDeg: 0, argpDeg: 90, meanAnomalyDeg: 0 }, lunarForces('point'), { fromTtJ2000S: EPOCH, toTtJ2000S: EPOCH + spanS });
}

describe('circular lunar orbit against a lunar surface clock', () => {
  it('100 km: −(3GM_M/(2a) − GM_M/R)/c² ≈ −1.1349 µs/day', () => {
    const aM = R_MOON_M + 100e3;
    const wanted = (-((3 * GM_MOON) / (2 * aM) - GM_MOON / R_MOON_M) / C2) * US_PER_DAY;
    const o = orbit(aM / 1000, 0, 2 * DAY_S);
    const r = sizeLunarClock({ trajectory: o.trajectory, earthGravity: gravityModel('zonal'), fromTtJ2000S: EPOCH, spanS: 2 * DAY_S, nominalHz: 10.23e6 });
    const got = r.meanFractionalOffsetVsLunarSurface * US_PER_DAY;
    expect(Math.abs(got - wanted), `wanted ${wanted.toFixed(5)} µs/day, got ${got.toFixed(5)}, difference ${(got - wanted).toExponential(2)}`).toBeLessThan(0.001);
    expect(wanted).toBeCloseTo(-1.135, 3);
  });

  it('the split: the Moon part differs by −GM_M(1/a − 1/R)/c², the velocity part by −GM_M/(2a c²)', () => {
    const aM = R_MOON_M + 100e3;
    const span = 2 * DAY_S;
    const o = orbit(aM / 1000, 0, span);
    const g = gravityModel('zonal');
    const f = new LunarExternalField(MOON_POINT_MASS);
    const sat = analyseLunarRate(o.trajectory, g, f, EPOCH, span, 600, true);
    const ref = analyseLunarRate(new LunarSurfaceTrajectory('ref', { latDeg: 0, lonDeg: 0, heightM: 0 }, EPOCH, EPOCH + span), g, f, EPOCH, span, 600, false);
    const moonWanted = (-GM_MOON * (1 / aM - 1 / R_MOON_M) / C2) * US_PER_DAY;
    const velWanted = (-GM_MOON / (2 * aM * C2)) * US_PER_DAY;
    const moonGot = (sat.parts.moon - ref.parts.moon) * US_PER_DAY;
    const velGot = (sat.parts.velocity - ref.parts.velocity) * US_PER_DAY;
    // 0.006 µs/day: the surface clock, 1737 km nearer the Earth, sits deeper in the Earth's potential
    // and moves 4.6 m/s slower (GM_E·R/r² and v_M·ωR, each 0.0045 µs/day, opposite in sign).
    expect(Math.abs(moonGot - moonWanted), `Moon part: wanted ${moonWanted.toFixed(5)}, got ${moonGot.toFixed(5)} µs/day`).toBeLessThan(0.006);
    expect(Math.abs(velGot - velWanted), `velocity part: wanted ${velWanted.toFixed(5)}, got ${velGot.toFixed(5)} µs/day`).toBeLessThan(0.006);
  });
});

describe('12-hour frozen orbit (a = 6142 km, e = 0.6)', () => {
  const aM = 6_142e3;
  const e = 0.6;
  const wantedNs = ((2 * Math.sqrt(GM_MOON * aM) * e) / C2) * 1e9;

  it('eccentricity term 2√(GM_M·a)·e/c² ≈ 73.27 ns in the integrated offset', () => {
    const span = DAY_S;
    const o = orbit(aM / 1000, e, span);
    const g = gravityModel('zonal');
    const f = new LunarExternalField(MOON_POINT_MASS);
    const t: number[] = [];
    const x: number[] = [];
    const rho = new Float64Array(3);
    const u = new Float64Array(3);
    const cross: number[] = [];
    const [track] = integrateBulkAlong(o.trajectory, EPOCH, EPOCH + span, 600, 1, (r, v, n, outs, times) => {
      for (let i = 0; i < n; i++) outs[0][i] = lunarFractionalOffset(g, f, times[i], r[3 * i], r[3 * i + 1], r[3 * i + 2], v[3 * i], v[3 * i + 1], v[3 * i + 2]);
    });
    for (let s = EPOCH; s <= EPOCH + span; s += 120) {
      const st = o.trajectory.stateAt(s);
      const m = f.moonTemeAt(s);
      for (let c = 0; c < 3; c++) {
        rho[c] = st.positionM[c] - m[c];
        u[c] = st.velocityMPerS[c] - m[3 + c];
      }
      t.push(s - EPOCH);
      cross.push(lunarPeriodicTermsS(rho, u, m.subarray(3, 6)).crossTerm);
      x.push(track.integralAt(s));
    }
    // Fit a + b·t + c·t² + k·sin E(t) to the offset with the cross term removed (the quadratic takes
    // the monthly term's curvature over a day, ~3 ns); E from the epoch elements (two-body: exact).
    const el = o.trajectory.elements;
    const nMean = Math.sqrt(GM_MOON / el.aM ** 3);
    const rows = t.map((ti) => [1, ti / span, (ti / span) ** 2, Math.sin(eccentricAnomalyRad(el.meanAnomalyRad + nMean * ti, el.e))]);
    const a = new Matrix(rows);
    const at = a.transpose();
    const coef = solve(at.mmul(a), at.mmul(Matrix.columnVector(x.map((xi, i) => xi - cross[i])))).to1DArray();
    // The term is −2√(GM·a)·e·sin E/c²: k is minus the amplitude.
    const gotNs = -coef[3] * 1e9;
    // 0.1 ns: the Earth's tide across the orbit (~5e-15 in rate) and the quadratic's fit of the monthly term.
    expect(Math.abs(gotNs - wantedNs), `wanted ${wantedNs.toFixed(3)} ns, got ${gotNs.toFixed(3)} ns, difference ${(gotNs - wantedNs).toFixed(3)} ns`).toBeLessThan(0.1);
    expect(wantedNs).toBeCloseTo(73.27, 2);
  });

  it('size reports the eccentricity amplitude and a cross term between 40 and 92 ns', () => {
    const span = DAY_S;
    const o = orbit(aM / 1000, e, span);
    const r = sizeLunarClock({ trajectory: o.trajectory, earthGravity: gravityModel('zonal'), fromTtJ2000S: EPOCH, spanS: span, nominalHz: 10.23e6 });
    expect(Math.abs(r.eccentricityAmplitudeNs - wantedNs), `wanted ${wantedNs} ns, got ${r.eccentricityAmplitudeNs} ns`).toBeLessThan(0.01);
    const vMoon = 1_022; // m/s, about (1.022 km/s mean orbital speed; from memory)
    const bound = ((vMoon * 1.06 * aM * (1 + e)) / C2) * 1e9;
    expect(r.crossTermAmplitudeNs).toBeGreaterThan(40);
    expect(r.crossTermAmplitudeNs, `cross term ${r.crossTermAmplitudeNs} ns vs bound ${bound} ns`).toBeLessThan(bound);
    // The frozen orbit against a surface clock, from the circular form at its a plus nothing from e
    // (the mean of the two-body rate depends on a only): −(3GM_M/(2a) − GM_M/R)/c².
    const wanted = (-((3 * GM_MOON) / (2 * aM) - GM_MOON / R_MOON_M) / C2) * US_PER_DAY;
    const got = r.meanFractionalOffsetVsLunarSurface * US_PER_DAY;
    expect(Math.abs(got - wanted), `wanted ${wanted.toFixed(5)} µs/day, got ${got.toFixed(5)}`).toBeLessThan(0.001);
  });
});
