/**
 * The library's lunar sizing (`sizeLunarOrbit`, the object `size --body moon --format json` prints):
 * the 12-hour frozen orbit (a = 6142 km, e = 0.6, i = 57.8°, ω = 90°) with the full force
 * model, against TT and against the lunar surface reference, and its bad input.
 * Reference values (derived, physics.md §12): against a surface clock the two-body mean rate is
 * −(3GM_M/(2a) − GM_M/R)/c² = +1.5617 µs/day; J2, C22 and the Earth's and Sun's pulls move it by
 * under 0.002 µs/day (measured: 0.0007), the tolerance used here.
 */
import { describe, expect, it } from 'vitest';
import { sizeLunarOrbit } from '../src/api/lunarSize.ts';
import { InputError, SpanError } from '../src/errors.ts';

const GM_MOON = 4.902800066e12;
const R_MOON_M = 1_737_400;
const C2 = 299_792_458 ** 2;
const US_PER_DAY = 86_400e6;
const FROZEN = { aKm: 6142, e: 0.6, iDeg: 57.8, argpDeg: 90 };

describe('sizeLunarOrbit', () => {
  const r = sizeLunarOrbit(FROZEN, { span: '7d' });
  const wanted = (-((3 * GM_MOON) / (2 * 6_142e3) - GM_MOON / R_MOON_M) / C2) * US_PER_DAY;

  it('12-hour frozen orbit against the lunar surface reference: +1.5617 µs/day', () => {
    const got = r.meanFractionalOffsetVsLunarSurface * US_PER_DAY;
    expect(Math.abs(got - wanted), `wanted ${wanted.toFixed(5)} µs/day, got ${got.toFixed(5)}, difference ${(got - wanted).toFixed(5)}`).toBeLessThan(0.002);
    expect(r.body).toBe('moon');
  });

  it('against TT: the surface reference (≈ 56.02 µs/day) plus the orbit\'s own offset; parts add up', () => {
    const refUs = r.lunarSurfaceReference.meanFractionalOffset * US_PER_DAY;
    // Over 7 days the monthly term moves the reference's slope by up to ±0.11 µs/day around 56.02.
    expect(Math.abs(refUs - 56.02), `reference ${refUs} µs/day`).toBeLessThan(0.15);
    const sum = r.parts.earth + r.parts.moon + r.parts.sun + r.parts.velocity;
    expect(Math.abs(sum - r.meanFractionalOffset), `parts sum ${sum} vs ${r.meanFractionalOffset}`).toBeLessThan(1e-17);
    expect(Math.abs(r.meanFractionalOffset - r.lunarSurfaceReference.meanFractionalOffset - r.meanFractionalOffsetVsLunarSurface)).toBeLessThan(1e-18);
  });

  it('--keep lunar-surface sets the frequency from the rate against the reference', () => {
    const k = sizeLunarOrbit(FROZEN, { span: '2d', keep: 'lunar-surface', lunarForces: 'point' });
    expect(k.recommendedOffsetHz / k.nominalHz).toBeCloseTo(-k.meanFractionalOffsetVsLunarSurface, 20);
    const t = sizeLunarOrbit(FROZEN, { span: '2d', keep: 'TT', lunarForces: 'point' });
    expect(t.recommendedOffsetHz / t.nominalHz).toBeCloseTo(-t.meanFractionalOffset, 20);
  });

  it('a clock at rest on the surface sizes to the reference itself when it sits at the reference point', () => {
    const s = sizeLunarOrbit({ surface: { latDeg: 0, lonDeg: 0, heightM: 0 } }, { span: '3d' });
    expect(Math.abs(s.meanFractionalOffsetVsLunarSurface)).toBeLessThan(1e-18);
  });
});

describe('sizeLunarOrbit bad input', () => {
  it('an orbit that intersects the Moon', () => {
    expect(() => sizeLunarOrbit({ aKm: 1800, e: 0.1 })).toThrow(/intersects the Moon/);
  });
  it('a selenographic latitude above 90°', () => {
    expect(() => sizeLunarOrbit({ surface: { latDeg: 91, lonDeg: 0, heightM: 0 } })).toThrow(InputError);
    expect(() => sizeLunarOrbit(FROZEN, { reference: { latDeg: -95, lonDeg: 0, heightM: 0 } })).toThrow(/latitude/);
  });
  it('a window outside the Moon ephemeris\' span', () => {
    expect(() => sizeLunarOrbit({ ...FROZEN, epoch: '2150-01-01T00:00:00Z' }, { span: '1d' })).toThrow(SpanError);
  });
  it('an unknown keep reference', () => {
    expect(() => sizeLunarOrbit(FROZEN, { keep: 'TCL' as never })).toThrow(/keep/);
  });
});
