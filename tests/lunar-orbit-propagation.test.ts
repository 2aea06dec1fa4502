/**
 * The lunar orbit propagator (src/orbit/lunarOrbit.ts) against closed forms (derived):
 * - a point-mass Moon integrated numerically against the exact two-body solution;
 * - J2's secular node regression dΩ/dt = −(3/2)·n·J2·(R/p)²·cos i (Vallado, Fundamentals of
 *   Astrodynamics, 4th ed., eq. 9-41; common practice), with the GRAIL-era J2 = 2.0322e-4 at R = 1738 km;
 * - an orbit that meets the Moon is refused as bad input.
 */
import { describe, expect, it } from 'vitest';
import { InputError } from '../src/errors.ts';
import { lcrsToLunarElements, lunarElementsToLcrs } from '../src/orbit/lunarFrames.ts';
import { LunarImpactError, LunarOrbitTrajectory } from '../src/orbit/lunarOrbit.ts';
import { MOON_DEGREE_2, MOON_POINT_MASS } from '../src/orbit/moonGravity.ts';
import { lunarForces, lunarOrbitFromElements } from '../src/orbit/lunarOrbitInput.ts';

const EPOCH = 852_076_800;
const DAY_S = 86_400;
const FROZEN = { epochTtJ2000S: EPOCH, aKm: 6142, e: 0.6, iDeg: 57.8, raanDeg: 30, argpDeg: 90, meanAnomalyDeg: 0 };

describe('lunar orbit propagation', () => {
  it('numerical point mass follows the two-body orbit within 1 m over 30 days', () => {
    const s0 = lunarElementsToLcrs(FROZEN, MOON_POINT_MASS.gmM3PerS2);
    const span = 30 * DAY_S;
    const common = { epochTtJ2000S: EPOCH, positionM: s0.positionM, velocityMPerS: s0.velocityMPerS, fromTtJ2000S: EPOCH - DAY_S, toTtJ2000S: EPOCH + span };
    const num = new LunarOrbitTrajectory({ id: 'num', ...common, forces: { moon: MOON_POINT_MASS, earth: false, sun: false }, forceNumerical: true });
    const kep = new LunarOrbitTrajectory({ id: 'kep', ...common, forces: { moon: MOON_POINT_MASS, earth: false, sun: false } });
    let worst = 0;
    const a = new Float64Array(3);
    const b = new Float64Array(3);
    const v = new Float64Array(3);
    for (let t = EPOCH - DAY_S; t <= EPOCH + span; t += 3_637) {
      num.lcrsStateInto(t, a, v);
      kep.lcrsStateInto(t, b, v);
      worst = Math.max(worst, Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]));
    }
    expect(worst, `largest position difference ${worst.toFixed(4)} m (wanted < 1 m)`).toBeLessThan(1);
  });

  it('J2 regresses the node at −(3/2)·n·J2·(R/p)²·cos i', () => {
    const span = 30 * DAY_S;
    const forces = { moon: { ...MOON_DEGREE_2, c22: 0 }, earth: false, sun: false };
    const o = lunarOrbitFromElements('j2', FROZEN, forces, { fromTtJ2000S: EPOCH, toTtJ2000S: EPOCH + span });
    const gm = MOON_DEGREE_2.gmM3PerS2;
    const aM = FROZEN.aKm * 1000;
    const n = Math.sqrt(gm / aM ** 3);
    const p = aM * (1 - FROZEN.e ** 2);
    const wanted = -1.5 * n * MOON_DEGREE_2.j2 * (MOON_DEGREE_2.radiusM / p) ** 2 * Math.cos((FROZEN.iDeg * Math.PI) / 180);
    // Mean node over the first and the last revolution (short-period terms average out).
    const meanNode = (from: number): number => {
      let s = 0;
      let k = 0;
      const r = new Float64Array(3);
      const v = new Float64Array(3);
      for (let t = from; t < from + o.trajectory.periodS; t += 600, k++) {
        o.trajectory.lcrsStateInto(t, r, v);
        s += lcrsToLunarElements({ positionM: [r[0], r[1], r[2]], velocityMPerS: [v[0], v[1], v[2]] }, gm, EPOCH).raanRad;
      }
      return s / k;
    };
    const last = EPOCH + span - o.trajectory.periodS;
    const got = (meanNode(last) - meanNode(EPOCH)) / (last - EPOCH);
    // 3 %: the lunar pole moves (0.04° in 30 days) under the fixed equator of epoch, and e, i vary slightly.
    expect(Math.abs(got / wanted - 1), `wanted ${wanted.toExponential(4)} rad/s, got ${got.toExponential(4)} rad/s`).toBeLessThan(0.03);
  });

  it('an orbit whose periselene is below 1737.4 km is refused before propagation', () => {
    expect(() => lunarOrbitFromElements('low', { ...FROZEN, aKm: 2000, e: 0.2 }, lunarForces('full'), { fromTtJ2000S: EPOCH, toTtJ2000S: EPOCH + DAY_S })).toThrow(InputError);
    expect(() => lunarOrbitFromElements('low', { ...FROZEN, aKm: 2000, e: 0.2 }, lunarForces('full'), { fromTtJ2000S: EPOCH, toTtJ2000S: EPOCH + DAY_S })).toThrow(/intersects the Moon/);
  });

  it('an orbit that the Earth pulls down into the Moon is stopped at the impact', () => {
    // A 12-hour orbit with a 20 km periselene: the Earth's tide lowers it into the surface within days.
    const grazing = { ...FROZEN, aKm: 6142, e: 1 - 1757.4 / 6142, argpDeg: 90 };
    let caught: unknown = null;
    try {
      lunarOrbitFromElements('grazing', grazing, lunarForces('full'), { fromTtJ2000S: EPOCH, toTtJ2000S: EPOCH + 60 * DAY_S });
    } catch (e) {
      caught = e;
    }
    expect(caught, 'expected a LunarImpactError').toBeInstanceOf(LunarImpactError);
  });
});
