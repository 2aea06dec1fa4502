/**
 * `size` fits its mean rate as the continuous least-squares line through the proper-time offset
 * with −2 r·v/c² removed (contract: meanFractionalOffset; physics.md §1). Reference (derived):
 * the same line computed independently from a dense sampling of the orbit every 5 s — the offset
 * by a 4th-order cumulative rule, the fit integrals ∫(t − t̄)(x − x̄) dt by Simpson's rule, and
 * ∫(t − t̄)² dt = T³/12 exactly. Tolerance 1e-18 (0.09 ps/day), the bound; the dense
 * reference is good to ~1e-20 (halving its step changes it by less than that).
 * Orbit: Molniya-like (a = 26 600 km, e = 0.74, i = 63.4°) under zonal gravity, 2 days: its sharp
 * perigee passes are where an unweighted fit through Gauss nodes went wrong (~2e-17).
 */
import { describe, expect, it } from 'vitest';
import { IERS2010_L_G, WGS84_GM_M3_PER_S2 } from '../src/constants.ts';
import { potentialM2PerS2, gravityModel } from '../src/orbit/gravity.ts';
import { elementsFromDegKm } from '../src/orbit/keplerian.ts';
import { trajectoryFromKeplerian } from '../src/orbit/stateVector.ts';
import { allocStateBlock } from '../src/orbit/trajectory.ts';
import { sizeClock } from '../src/plan/size.ts';

const C = 299_792_458;
const C2 = C * C;
const EPOCH = 852_076_800; // 2027-01-01T12:00:00 TT (derived)
const SPAN_S = 2 * 86_400;
const H_S = 5;

describe('size: the mean rate is the continuous least-squares slope', () => {
  it('Molniya-like orbit, zonal gravity, 2 days: within 1e-18 of a dense independent fit', () => {
    const gravity = gravityModel('zonal');
    const el = elementsFromDegKm({ epochTtJ2000S: EPOCH, aKm: 26_600, e: 0.74, iDeg: 63.4, raanDeg: 30, argpDeg: 270, meanAnomalyDeg: 10 }, { a: 'aKm', e: 'e' });
    const traj = trajectoryFromKeplerian(el, gravity, { fromTtJ2000S: EPOCH, toTtJ2000S: EPOCH + SPAN_S }, 'MOL');
    const got = sizeClock({ trajectory: traj, gravity, fromTtJ2000S: EPOCH, spanS: SPAN_S, nominalHz: 10.23e6 }).meanFractionalOffset;

    const n = SPAN_S / H_S; // even
    const t = new Float64Array(n + 1);
    for (let i = 0; i <= n; i++) t[i] = EPOCH + i * H_S;
    const b = allocStateBlock(n + 1);
    traj.sampleInto(t, b);
    const y = new Float64Array(n + 1);
    const p = new Float64Array(n + 1);
    for (let i = 0; i <= n; i++) {
      const [x0, x1, x2] = [b.positionM[3 * i], b.positionM[3 * i + 1], b.positionM[3 * i + 2]];
      const [v0, v1, v2] = [b.velocityMPerS[3 * i], b.velocityMPerS[3 * i + 1], b.velocityMPerS[3 * i + 2]];
      y[i] = IERS2010_L_G - (0.5 * (v0 * v0 + v1 * v1 + v2 * v2) + potentialM2PerS2(gravity, x0, x1, x2)) / C2;
      p[i] = (-2 * (x0 * v0 + x1 * v1 + x2 * v2)) / C2;
    }
    // Offset x(t): 4th-order cumulative rule inside, trapezoid on the two end intervals.
    const x = new Float64Array(n + 1);
    for (let i = 0; i < n; i++) {
      const inc = i === 0 || i === n - 1 ? (H_S / 2) * (y[i] + y[i + 1]) : (H_S / 24) * (-y[i - 1] + 13 * y[i] + 13 * y[i + 1] - y[i + 2]);
      x[i + 1] = x[i] + inc;
    }
    const simpson = (f: (i: number) => number): number => {
      let s = f(0) + f(n);
      for (let i = 1; i < n; i++) s += (i % 2 === 1 ? 4 : 2) * f(i);
      return (s * H_S) / 3;
    };
    const tMid = EPOCH + SPAN_S / 2;
    const xc = (i: number): number => x[i] - p[i];
    const xMean = simpson(xc) / SPAN_S;
    const want = simpson((i) => (t[i] - tMid) * (xc(i) - xMean)) / (SPAN_S ** 3 / 12);
    const d = got - want;
    expect(Math.abs(d), `wanted ${want.toExponential(12)}, got ${got.toExponential(12)}, difference ${d.toExponential(2)}`).toBeLessThan(1e-18);
    void WGS84_GM_M3_PER_S2;
  });
});
