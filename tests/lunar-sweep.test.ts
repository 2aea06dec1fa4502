/**
 * `sweep --body moon` (src/plan/lunarSweep.ts) against the closed form for two-body circular orbits
 * about the Moon (derived, physics.md §12): the rate against a surface clock is
 * −(3GM_M/(2a) − GM_M/R)/c², zero at a = 3R/2, i.e. 868.7 km above the 1737.4 km sphere.
 * Tolerances: 0.001 µs/day per row (the surface clock's second-order Earth terms, < 1e-4 µs/day
 * measured), 1 km on the match altitude (those terms move the zero by about 0.1 km).
 */
import { describe, expect, it } from 'vitest';
import { sweepLunarAltitude } from '../src/api/lunarSweep.ts';

const GM_MOON = 4.902800066e12;
const R_M = 1_737_400;
const C2 = 299_792_458 ** 2;
const US_PER_DAY = 86_400e6;

describe('sweep --body moon', () => {
  const r = sweepLunarAltitude({ fromKm: 100, toKm: 3000, points: 6 });

  it('rows follow −(3GM_M/(2a) − GM_M/R)/c² against the surface clock', () => {
    for (const row of r.rows) {
      const aM = R_M + row.altitudeKm * 1000;
      const wanted = (-((3 * GM_MOON) / (2 * aM) - GM_MOON / R_M) / C2) * US_PER_DAY;
      const got = row.meanFractionalOffsetVsLunarSurface * US_PER_DAY;
      expect(Math.abs(got - wanted), `${row.altitudeKm} km: wanted ${wanted.toFixed(5)}, got ${got.toFixed(5)} µs/day`).toBeLessThan(0.001);
    }
  });

  it('an orbiting clock matches the surface clock at a = 3R/2 (868.7 km altitude)', () => {
    const wanted = R_M / 2 / 1000;
    expect(r.surfaceMatchAltitudeKm).not.toBeNull();
    expect(Math.abs((r.surfaceMatchAltitudeKm as number) - wanted), `wanted ${wanted} km, got ${r.surfaceMatchAltitudeKm} km`).toBeLessThan(1);
    expect(r.breakEvenAltitudeKm).toBeNull();
  });

  it('bad input: the lowest orbit inside the Moon', () => {
    expect(() => sweepLunarAltitude({ fromKm: 100, toKm: 500, e: 0.1 })).toThrow(/intersects the Moon/);
  });
});
