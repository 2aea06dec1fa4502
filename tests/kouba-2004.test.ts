/**
 * J. Kouba, "Improved relativistic transformations in GPS", GPS Solutions 8:170–180 (2004), abstract:
 * the standard relativistic frequency offset corresponds to 38 575.008 ns/day for a = 26 561 400 m
 * (confirmed, abstract; physics.md §2). The J2 periodic residual left by −2r·v/c² is about 0.1 ns
 * for GPS (confirmed, abstract).
 */
import { describe, expect, it } from 'vitest';
import { gravityModel } from '../src/orbit/gravity.ts';
import { elementsFromDegKm, KeplerianTrajectory } from '../src/orbit/keplerian.ts';
import { sizeClock } from '../src/plan/size.ts';

describe('Kouba 2004', () => {
  it('38 575.008 ns/day at a = 26 561 400 m (point-mass, circular)', () => {
    const g = gravityModel('point');
    const epoch = 852_076_800;
    const el = elementsFromDegKm({ epochTtJ2000S: epoch, aKm: 26561.4, e: 0, iDeg: 55, raanDeg: 0, argpDeg: 0, meanAnomalyDeg: 0 }, { a: 'a', e: 'e' });
    const r = sizeClock({ trajectory: new KeplerianTrajectory('k', el, g.gmM3PerS2), gravity: g, fromTtJ2000S: epoch, spanS: 86400, nominalHz: 10.23e6 });
    // Quoted to 0.001 ns/day; the integration adds < 1e-6 ns/day. Tolerance: one unit in the last place.
    expect(Math.abs(r.driftNsPerDay - 38575.008), `got ${r.driftNsPerDay} ns/day`).toBeLessThan(0.001);
  });
});
