/**
 * Integration accuracy of the clock offset (physics.md §1: "below 1 ps per day ... show the error
 * against a 1-s reference"). Reference: composite Simpson's rule with 1-s spacing over one day
 * (error ~h⁴·y⁗, far below 1e-15 s here), common practice.
 */
import { describe, expect, it } from 'vitest';
import { gravityModel } from '../src/orbit/gravity.ts';
import { clockStepS, integrateAlong } from '../src/clock/integrate.ts';
import { fractionalOffset } from '../src/clock/rate.ts';
import { elementsFromDegKm, KeplerianTrajectory } from '../src/orbit/keplerian.ts';

const G = gravityModel('zonal');
const EPOCH = 852_076_800;

function simpson1s(traj: KeplerianTrajectory, from: number, spanS: number): number {
  let sum = 0;
  for (let k = 0; k <= spanS; k++) {
    const s = traj.stateAt(from + k);
    const r = s.positionM;
    const v = s.velocityMPerS;
    const y = fractionalOffset(G, r[0], r[1], r[2], v[0], v[1], v[2]);
    sum += (k === 0 || k === spanS ? 1 : k % 2 === 1 ? 4 : 2) * y;
  }
  return sum / 3;
}

describe('clock integration vs a 1-s reference', () => {
  for (const [label, aKm, e] of [
    ['LEO 500 km, e = 0.01', 6878.137, 0.01],
    ['GPS-like MEO, e = 0.02', 26561.75, 0.02],
    ['HEO, e = 0.7', 26600, 0.7],
  ] as const) {
    it(`${label}: error < 1 ps over one day`, () => {
      const el = elementsFromDegKm({ epochTtJ2000S: EPOCH, aKm, e, iDeg: 63.4, raanDeg: 30, argpDeg: 270, meanAnomalyDeg: 0 }, { a: 'a', e: 'e' });
      const traj = new KeplerianTrajectory('t', el, G.gmM3PerS2);
      const stepS = clockStepS(traj.periodS, e);
      const [track] = integrateAlong(traj, EPOCH, EPOCH + 86400, stepS, [(x, y, z, vx, vy, vz) => fractionalOffset(G, x, y, z, vx, vy, vz)]);
      const reference = simpson1s(traj, EPOCH, 86400);
      const errS = Math.abs(track.total - reference);
      expect(errS, `step ${stepS.toFixed(1)} s, error ${(errS * 1e12).toExponential(2)} ps`).toBeLessThan(1e-12);
      // Dense output at an off-step instant agrees with the 1-s reference too.
      const mid = 43_211;
      const errMid = Math.abs(track.integralAt(EPOCH + mid) - simpson1s(traj, EPOCH, mid - 1) - 0.5 * (track.valueAt(EPOCH + mid - 1) + track.valueAt(EPOCH + mid)));
      expect(errMid, `dense output error ${(errMid * 1e12).toExponential(2)} ps`).toBeLessThan(1e-12);
    });
  }
});

describe('node integrals', () => {
  it('the per-node integrals equal the dense output at the nodes (same polynomial)', () => {
    const el = elementsFromDegKm({ epochTtJ2000S: EPOCH, aKm: 7000, e: 0.05, iDeg: 40, raanDeg: 0, argpDeg: 0, meanAnomalyDeg: 0 }, { a: 'a', e: 'e' });
    const traj = new KeplerianTrajectory('t', el, G.gmM3PerS2);
    const times: number[] = [];
    const nodes = [new Float64Array(8 * 20)];
    const [track] = integrateAlong(traj, EPOCH, EPOCH + 6000, 300, [(x, y, z, vx, vy, vz) => fractionalOffset(G, x, y, z, vx, vy, vz)], (t, _b, n) => times.push(...t.subarray(0, n)), nodes);
    let worst = 0;
    times.forEach((t, i) => (worst = Math.max(worst, Math.abs(nodes[0][i] - track.integralAt(t)))));
    // Two algebraically equal evaluations (weights vs monomial coefficients) round differently;
    // 1 fs is a millionth of the 1 ps/day target.
    expect(worst, `worst ${worst} s`).toBeLessThan(1e-15);
  });
});
