/**
 * The same orbit given as a TLE, an OMM, a state vector and an SP3 file gives consistent `size`
 * results, within the accuracy of each source (issue: orbit sources). The element set is invented.
 * Tolerances:
 * - OMM vs TLE: same numbers through the same SGP4, so agreement to rounding (1e-18).
 * - SP3 vs TLE: the SP3 file is written from the SGP4 positions at 15-min spacing with 1 mm
 *   resolution, and its velocities come from the interpolating polynomial. Positions then agree to
 *   < 1 mm, but SGP4's own velocity is not exactly the derivative of its position: they differ by
 *   about 1 cm/s at MEO (measured here), and v·δv/c² ≈ 4e-16. Tolerance 1e-15.
 * - State vector vs TLE: a numerical zonal propagation from SGP4's osculating state at the epoch
 *   drifts from SGP4 by up to a few km per day (SGP4's known accuracy; mean-element theory vs
 *   Cowell), and 1 km of semi-major axis is 9.4e-15 in rate at MEO (physics.md §2): 5e-14 allowed.
 */
import { describe, expect, it } from 'vitest';
import { gravityModel } from '../src/orbit/gravity.ts';
import { ommFromObject } from '../src/io/omm.ts';
import { parseSp3 } from '../src/io/sp3.ts';
import { writeSp3Text } from '../src/io/sp3Write.ts';
import { defaultTimeSystem } from '../src/io/tables.ts';
import { parseTleFile } from '../src/io/tle.ts';
import { buildTleLines } from '../src/io/tleBuild.ts';
import { Sgp4Trajectory } from '../src/orbit/sgp4.ts';
import { gmstRadAtTt, Sp3Trajectory } from '../src/orbit/sp3.ts';
import { trajectoryFromStateVector } from '../src/orbit/stateVector.ts';
import { sizeClock } from '../src/plan/size.ts';

const ts = defaultTimeSystem();
const G = gravityModel('zonal');

describe('one orbit, four sources', () => {
  it('TLE, OMM, state vector and SP3 give consistent mean fractional offsets', () => {
    // Invented MEO element set (not a real satellite).
    const el = { catalogNumber: 99871, designator: '27050A', epochYear: 2027, epochDayOfYear: 40.25, inclinationDeg: 56.1, raanDeg: 211.3, eccentricity: 0.0123, argpDeg: 33.3, meanAnomalyDeg: 120.5, meanMotionRevPerDay: 2.0056 };
    const [l1, l2] = buildTleLines(el);
    const [tle] = parseTleFile(`INVENTED MEO\n${l1}\n${l2}\n`, 'invented.tle');
    const sgp4 = new Sgp4Trajectory(tle, ts);
    const epoch = sgp4.epochTtJ2000S;
    const spanS = 86400;
    const size = (traj: Parameters<typeof sizeClock>[0]['trajectory']) => sizeClock({ trajectory: traj, gravity: G, fromTtJ2000S: epoch, spanS, nominalHz: 10.23e6 }).meanFractionalOffset;
    const yTle = size(sgp4);

    const omm = ommFromObject(
      { OBJECT_NAME: 'INVENTED MEO', OBJECT_ID: '2027-050A', EPOCH: '2027-02-09T06:00:00.000000', MEAN_MOTION: el.meanMotionRevPerDay, ECCENTRICITY: el.eccentricity, INCLINATION: el.inclinationDeg, RA_OF_ASC_NODE: el.raanDeg, ARG_OF_PERICENTER: el.argpDeg, MEAN_ANOMALY: el.meanAnomalyDeg, NORAD_CAT_ID: el.catalogNumber, BSTAR: 0, MEAN_MOTION_DOT: 0, MEAN_MOTION_DDOT: 0, EPHEMERIS_TYPE: 0, CLASSIFICATION_TYPE: 'U', ELEMENT_SET_NO: 1, REV_AT_EPOCH: 0 },
      'invented OMM',
    );
    const yOmm = size(new Sgp4Trajectory(omm, ts));
    expect(Math.abs(yOmm - yTle), `OMM ${yOmm} vs TLE ${yTle}`).toBeLessThan(1e-18);

    const s0 = sgp4.stateAt(epoch);
    const state = trajectoryFromStateVector({ id: 'sv', epochTtJ2000S: epoch, frame: 'TEME', positionKm: s0.positionM.map((x) => x / 1000), velocityKmPerS: s0.velocityMPerS.map((x) => x / 1000), gravity: G, fromTtJ2000S: epoch, toTtJ2000S: epoch + spanS, jdUtcAtEpoch: ts.jdUtcFromTtJ2000S(epoch) });
    const yState = size(state);
    expect(Math.abs(yState - yTle), `state ${yState} vs TLE ${yTle}`).toBeLessThan(5e-14);

    // SP3 epochs from 1.5 h before the element-set epoch, so the interpolation window is centred there.
    const start = ts.parse('2027-02-09T04:30:00 GPS');
    const text = writeSp3Text(ts, start, 900, 4 * 24 + 12, [{ id: 'X71', trajectory: sgp4 }], (t) => gmstRadAtTt(ts, t), ['INVENTED: written from SGP4 of an invented element set']);
    const sp3 = new Sp3Trajectory(parseSp3(text, 'invented.sp3'), 'X71', ts);
    const ySp3 = size(sp3);
    expect(Math.abs(ySp3 - yTle), `SP3 ${ySp3} vs TLE ${yTle}`).toBeLessThan(1e-15);
  });

  it('a state vector taken from SGP4 and propagated numerically stays close to SGP4 for hours', () => {
    // Invented LEO and MEO element sets. SGP4 is an analytic mean-element theory with drag and
    // third bodies for deep space; Cowell here has zonal gravity only. Their difference grows from
    // zero at the shared epoch; SGP4's own accuracy is about 1 km at epoch growing by 1–3 km per day
    // (Vallado et al. 2006, §1, from memory), so 2 km after 3 h is the honest bound for both orbits.
    for (const el of [
      { catalogNumber: 99872, designator: '27051A', epochYear: 2027, epochDayOfYear: 40.5, inclinationDeg: 97.7, raanDeg: 30, eccentricity: 0.0011, argpDeg: 80, meanAnomalyDeg: 10, meanMotionRevPerDay: 15.05 },
      { catalogNumber: 99873, designator: '27052A', epochYear: 2027, epochDayOfYear: 40.5, inclinationDeg: 55, raanDeg: 120, eccentricity: 0.004, argpDeg: 10, meanAnomalyDeg: 200, meanMotionRevPerDay: 2.0056 },
    ]) {
      const [l1, l2] = buildTleLines(el);
      const [rec] = parseTleFile(`${l1}\n${l2}\n`, 'invented.tle');
      const sgp4 = new Sgp4Trajectory(rec, ts);
      const epoch = sgp4.epochTtJ2000S;
      const s0 = sgp4.stateAt(epoch);
      const cowell = trajectoryFromStateVector({ id: 'sv', epochTtJ2000S: epoch, frame: 'TEME', positionKm: s0.positionM.map((x) => x / 1000), velocityKmPerS: s0.velocityMPerS.map((x) => x / 1000), gravity: G, fromTtJ2000S: epoch, toTtJ2000S: epoch + 3 * 3600, jdUtcAtEpoch: ts.jdUtcFromTtJ2000S(epoch) });
      let worstM = 0;
      for (let k = 0; k <= 36; k++) {
        const a = sgp4.stateAt(epoch + k * 300).positionM;
        const b = cowell.stateAt(epoch + k * 300).positionM;
        worstM = Math.max(worstM, Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]));
      }
      expect(worstM, `catalogue ${el.catalogNumber}: ${(worstM / 1000).toFixed(3)} km after 3 h`).toBeLessThan(2000);
    }
  });
});
