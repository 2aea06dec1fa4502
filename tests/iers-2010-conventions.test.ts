/**
 * IERS Conventions (2010), IERS Technical Note 36, chapter 10:
 * - eq. 10.7–10.9: dτ/dTT − 1 = L_G − (v²/2 + U)/c², L_G = 6.969290134e-10 (Table 1.1; confirmed);
 * - eqs. 10.10–10.11: the periodic term −2 r·v/c² = −(2/c²)√(GMa)·e·sin E (confirmed).
 * Derived values (physics.md §2): amplitude 22.9 ns for e = 0.01 at GPS a; circular GPS components
 * +5.2996e-10 and −8.349e-11; break-even radius 9545.5 km; 400 km circular −2.845e-10 (−24.6 µs/day).
 */
import { describe, expect, it } from 'vitest';
import { breakEvenRadiusM, eccentricityAmplitudeS, keplerMeanFractionalOffset } from '../src/clock/closedForms.ts';
import { gravityModel } from '../src/orbit/gravity.ts';
import { integrateAlong } from '../src/clock/integrate.ts';
import { conventionalPeriodicS, fractionalOffset } from '../src/clock/rate.ts';
import { IERS2010_L_G, SPEED_OF_LIGHT_M_PER_S, WGS84_A_M } from '../src/constants.ts';
import { elementsFromDegKm, KeplerianTrajectory } from '../src/orbit/keplerian.ts';
import { sizeClock } from '../src/plan/size.ts';

const G = gravityModel('point');
const EPOCH = 852_076_800;

function kepler(aKm: number, e: number, iDeg = 55): KeplerianTrajectory {
  const el = elementsFromDegKm({ epochTtJ2000S: EPOCH, aKm, e, iDeg, raanDeg: 40, argpDeg: 70, meanAnomalyDeg: 15 }, { a: 'a', e: 'e' });
  return new KeplerianTrajectory('t', el, G.gmM3PerS2);
}

describe('IERS 2010 ch. 10', () => {
  it('L_G·c² is the geoid potential W0 = 62 636 856.0 m²/s² (Table 1.1)', () => {
    expect(Math.abs(IERS2010_L_G * SPEED_OF_LIGHT_M_PER_S ** 2 - 62_636_856.0)).toBeLessThan(0.1); // W0 quoted to 0.1 m²/s²
  });

  it('eqs. 10.10–10.11: integrated proper time minus −2r·v/c² is a straight line (two-body)', () => {
    const traj = kepler(26561.75, 0.02);
    const [track] = integrateAlong(traj, EPOCH, EPOCH + 86400, 300, [(x, y, z, vx, vy, vz) => fractionalOffset(G, x, y, z, vx, vy, vz)]);
    const s0 = traj.stateAt(EPOCH);
    const p0 = conventionalPeriodicS(s0.positionM[0], s0.positionM[1], s0.positionM[2], s0.velocityMPerS[0], s0.velocityMPerS[1], s0.velocityMPerS[2]);
    const mean = keplerMeanFractionalOffset(26561.75e3);
    let worstS = 0;
    for (let k = 1; k <= 96; k++) {
      const t = EPOCH + k * 900;
      const s = traj.stateAt(t);
      const p = conventionalPeriodicS(s.positionM[0], s.positionM[1], s.positionM[2], s.velocityMPerS[0], s.velocityMPerS[1], s.velocityMPerS[2]);
      const predicted = mean * (t - EPOCH) + (p - p0);
      worstS = Math.max(worstS, Math.abs(track.integralAt(t) - predicted));
    }
    // 1 ps: the integration target; the closed form is exact for two-body motion.
    expect(worstS, `worst deviation ${worstS * 1e12} ps`).toBeLessThan(1e-12);
  });

  it('amplitude 2√(GMa)e/c² is 22.9 ns for e = 0.01 at GPS a (derived)', () => {
    expect(Math.abs(eccentricityAmplitudeS(26561.75e3, 0.01) * 1e9 - 22.9)).toBeLessThan(0.05); // quoted to 0.1 ns
  });

  it('circular GPS components: gravitational +5.2996e-10, velocity −8.349e-11 (derived)', () => {
    const r = sizeClock({ trajectory: kepler(26561.75, 0), gravity: G, fromTtJ2000S: EPOCH, spanS: 86400, nominalHz: 10.23e6 });
    expect(Math.abs(r.components.gravitational - 5.2996e-10)).toBeLessThan(5e-15);
    expect(Math.abs(r.components.velocity - -8.349e-11)).toBeLessThan(5e-15);
    // Contract: the parts add up to the mean within 1e-15.
    expect(Math.abs(r.components.gravitational + r.components.velocity - r.meanFractionalOffset)).toBeLessThan(1e-15);
  });

  it('the parts add up within 1e-15 on an eccentric orbit over a non-whole number of revolutions', () => {
    const r = sizeClock({ trajectory: kepler(26561.75, 0.05), gravity: G, fromTtJ2000S: EPOCH, spanS: 70_000, nominalHz: 10.23e6 });
    expect(Math.abs(r.components.gravitational + r.components.velocity - r.meanFractionalOffset)).toBeLessThan(1e-15);
    expect(Math.abs(r.meanFractionalOffset - keplerMeanFractionalOffset(26561.75e3))).toBeLessThan(1e-17);
  });

  it('break-even radius 3GM/(2 L_G c²) = 9545.5 km, altitude ≈ 3167 km (derived), and the pipeline agrees', () => {
    const aM = breakEvenRadiusM();
    expect(Math.abs(aM / 1000 - 9545.5)).toBeLessThan(0.05);
    expect(Math.abs((aM - WGS84_A_M) / 1000 - 3167)).toBeLessThan(0.5);
    const r = sizeClock({ trajectory: kepler(aM / 1000, 0), gravity: G, fromTtJ2000S: EPOCH, spanS: 86400, nominalHz: 10.23e6 });
    expect(Math.abs(r.meanFractionalOffset)).toBeLessThan(1e-17);
  });

  it('400 km circular runs slow by about 24.6 µs/day, −2.845e-10 (derived)', () => {
    const r = sizeClock({ trajectory: kepler(6378.137 + 400, 0, 51.6), gravity: G, fromTtJ2000S: EPOCH, spanS: 86400, nominalHz: 10.23e6 });
    expect(Math.abs(r.meanFractionalOffset - -2.845e-10)).toBeLessThan(5e-14);
    expect(Math.abs(r.driftNsPerDay / 1000 - -24.6)).toBeLessThan(0.05);
  });

  it('sensitivity 3GM/(2a²c²) = 9.429e-18 per metre at GPS a (derived; Ashby, PTTI 2001)', () => {
    const base = { epochTtJ2000S: EPOCH, e: 0, iDeg: 55, raanDeg: 0, argpDeg: 0, meanAnomalyDeg: 0 };
    const build = (d: number) => new KeplerianTrajectory('s', elementsFromDegKm({ ...base, aKm: 26561.75 + d }, { a: 'a', e: 'e' }), G.gmM3PerS2);
    const r = sizeClock({ trajectory: build(0), gravity: G, fromTtJ2000S: EPOCH, spanS: 86400, nominalHz: 10.23e6, rebuildWithDeltaAKm: build });
    expect(Math.abs(r.sensitivityPerKm / 1000 - 9.429e-18)).toBeLessThan(5e-22);
  });
});
