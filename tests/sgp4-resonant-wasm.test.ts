/**
 * Deep-space resonant orbits through satellite.js's two SGP4 implementations: the JavaScript port
 * and the WASM build of the C++ reference code (Vallado et al. 2006). tauplan uses WASM for these
 * orbits once it is enabled (the JS port re-integrates the resonance terms from the epoch at every
 * call). The two must agree; tolerance 1 mm, the residual-time correction's measured limit (0.6 mm).
 * The element set is invented (12-hour, e = 0.6).
 */
import { describe, expect, it } from 'vitest';
import { defaultTimeSystem } from '../src/io/tables.ts';
import { parseTleFile } from '../src/io/tle.ts';
import { buildTleLines } from '../src/io/tleBuild.ts';
import { enableWasmSgp4, Sgp4Trajectory } from '../src/orbit/sgp4.ts';
import { allocStateBlock } from '../src/orbit/trajectory.ts';

describe('resonant deep-space SGP4: WASM path vs JavaScript path', () => {
  it('agree within 1 mm and 1 mm/s ninety days from epoch', async () => {
    const ts = defaultTimeSystem();
    const [l1, l2] = buildTleLines({ catalogNumber: 99874, designator: '27053A', epochYear: 2027, epochDayOfYear: 4, inclinationDeg: 63.4, raanDeg: 75, eccentricity: 0.6, argpDeg: 270, meanAnomalyDeg: 10, meanMotionRevPerDay: 2.0057 });
    const [rec] = parseTleFile(`${l1}\n${l2}\n`, 'invented.tle');
    const traj = new Sgp4Trajectory(rec, ts, { spanFor: (e) => ({ fromTtJ2000S: e, toTtJ2000S: e + 100 * 86400 }) });
    const n = 200;
    const t = Float64Array.from({ length: n }, (_, i) => traj.epochTtJ2000S + 90 * 86400 + i * 307.3);
    const js = allocStateBlock(n);
    traj.sampleInto(t, js); // WASM not enabled yet: the JavaScript loop
    expect(await enableWasmSgp4()).toBe(true);
    const wasm = allocStateBlock(n);
    traj.sampleInto(t, wasm);
    let dr = 0;
    let dv = 0;
    for (let i = 0; i < 3 * n; i++) {
      dr = Math.max(dr, Math.abs(js.positionM[i] - wasm.positionM[i]));
      dv = Math.max(dv, Math.abs(js.velocityMPerS[i] - wasm.velocityMPerS[i]));
    }
    expect(dr, `position ${dr} m`).toBeLessThan(1e-3);
    expect(dv, `velocity ${dv} m/s`).toBeLessThan(1e-3);
  });
});
