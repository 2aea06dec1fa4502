/**
 * Long spans of numerically propagated orbits (src/orbit/numerical.ts): the contract caps a run at
 * 10 years; a LEO needs ~400 000 integrator steps a year, so the nodes are kept in chunks with
 * bounded memory and rebuilt on demand. References (derived; common practice):
 * - A rebuilt chunk must give the same states to the bit (the integrator is deterministic).
 * - Over years under J2 a near-circular LEO keeps its radius within a + J2 short-period terms:
 *   |r − a| < a·e + 15 km (J2 short-period amplitude ~ (3/4)·J2·R²/a ≈ 7 km; from memory,
 *   Vallado 4th ed. §9.6), and the semi-major axis from vis-viva stays within 20 km.
 */
import { describe, expect, it } from 'vitest';
import { WGS84_GM_M3_PER_S2 } from '../src/constants.ts';
import { gravityModel } from '../src/orbit/gravity.ts';
import { elementsFromDegKm, keplerState } from '../src/orbit/keplerian.ts';
import { NumericalTrajectory } from '../src/orbit/numerical.ts';
import { trajectoryFromKeplerian } from '../src/orbit/stateVector.ts';

const EPOCH = 852_076_800; // 2027-01-01T12:00:00 TT (derived)
const DAY_S = 86_400;
const GM = WGS84_GM_M3_PER_S2;
const el = elementsFromDegKm({ epochTtJ2000S: EPOCH, aKm: 6878.137, e: 0.001, iDeg: 51.6, raanDeg: 30, argpDeg: 40, meanAnomalyDeg: 10 }, { a: 'aKm', e: 'e' });

describe('chunked node storage with bounded memory', () => {
  it('dropped chunks are rebuilt to the same states, bit for bit (30-day LEO, 20 000 nodes kept)', () => {
    const { r, v } = keplerState(el, GM, 0);
    const opts = { id: 'L', frame: 'TEME' as const, axes: 'gcrf' as const, epochTtJ2000S: EPOCH, positionM: r, velocityMPerS: v, gravity: gravityModel('j2'), fromTtJ2000S: EPOCH - 5 * DAY_S, toTtJ2000S: EPOCH + 25 * DAY_S };
    const all = new NumericalTrajectory(opts);
    const bounded = new NumericalTrajectory({ ...opts, maxResidentNodes: 20_000 });
    expect(bounded.chunkCount).toBeGreaterThan(3);
    // Memory bound: the limit plus the chunk being used (8193 nodes).
    expect(bounded.residentNodeCount).toBeLessThanOrEqual(20_000 + 8193);
    for (const t of [EPOCH - 4.9 * DAY_S, EPOCH + 24 * DAY_S, EPOCH - 2 * DAY_S, EPOCH + 0.3, EPOCH + 13.37 * DAY_S, EPOCH - 4 * DAY_S]) {
      const a = all.stateAt(t);
      const b = bounded.stateAt(t);
      expect([...b.positionM, ...b.velocityMPerS]).toEqual([...a.positionM, ...a.velocityMPerS]);
      expect(bounded.residentNodeCount).toBeLessThanOrEqual(20_000 + 8193);
    }
  });
});

describe('a multi-year LEO propagates past the old one-million-step limit', () => {
  it('2.5-year Keplerian LEO under J2 (≈ 1.1 million steps)', { timeout: 900_000 }, () => {
    const span = { fromTtJ2000S: EPOCH, toTtJ2000S: EPOCH + 2.5 * 365.25 * DAY_S };
    const traj = trajectoryFromKeplerian(el, gravityModel('j2'), span, 'LEO') as NumericalTrajectory;
    expect(traj.stepCount).toBeGreaterThan(1_000_000);
    expect(traj.residentNodeCount).toBeLessThanOrEqual(300_000 + 8193);
    let worstR = 0;
    let worstA = 0;
    for (let t = span.fromTtJ2000S; t <= span.toTtJ2000S; t += 9.1 * DAY_S) {
      const s = traj.stateAt(t);
      const rM = Math.hypot(...s.positionM);
      const v2 = s.velocityMPerS[0] ** 2 + s.velocityMPerS[1] ** 2 + s.velocityMPerS[2] ** 2;
      const aM = 1 / (2 / rM - v2 / GM);
      worstR = Math.max(worstR, Math.abs(rM - el.aM));
      worstA = Math.max(worstA, Math.abs(aM - el.aM));
    }
    expect(worstR, `|r − a| reached ${(worstR / 1000).toFixed(2)} km`).toBeLessThan(el.aM * el.e + 15_000);
    expect(worstA, `|a − a0| reached ${(worstA / 1000).toFixed(2)} km`).toBeLessThan(20_000);
  });
});
