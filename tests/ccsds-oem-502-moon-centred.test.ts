/**
 * CCSDS 502.0-B-3 (Orbit Data Messages, 2023) OEM with CENTER_NAME = MOON: a Moon-centred ephemeris
 * (REF_FRAME = ICRF: the LCRS axes) is read as a lunar orbiter. Round trip (common practice): the
 * OEM is written here from tauplan's own propagation of a 12-hour lunar frozen orbit (nodes every
 * 60 s, Lagrange degree 9), and `compare` must give its clock the same mean rate as the same orbit
 * given as elements about the Moon, within 1e-15 (interpolation error of millimetres). A Moon-centred
 * OEM in an Earth-fixed frame is refused (frame not matching the body).
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { compareClocks } from '../src/api/compare.ts';
import { loadScenario } from '../src/api/scenario.ts';
import { lunarForces, lunarOrbitFromElements } from '../src/orbit/lunarOrbitInput.ts';

const START = 852_033_600; // 2027-01-01T00:00:00 TT
const SPAN_S = 2 * 86_400;
const dir = mkdtempSync(join(tmpdir(), 'tauplan-oem-moon-'));
const ttText = (t: number): string => new Date(Date.UTC(2000, 0, 1, 12) + t * 1000).toISOString().slice(0, 23);

function writeOem(frame: string): string {
  const o = lunarOrbitFromElements('LR-OEM', { epochTtJ2000S: START, aKm: 6142, e: 0.6, iDeg: 57.8, raanDeg: 0, argpDeg: 90, meanAnomalyDeg: 0 }, lunarForces('full'), { fromTtJ2000S: START, toTtJ2000S: START + SPAN_S });
  const lines = ['CCSDS_OEM_VERS = 2.0', 'CREATION_DATE = 2026-12-01T00:00:00', 'ORIGINATOR = TAUPLAN-TEST (invented)', 'META_START', 'OBJECT_NAME = LR-OEM', 'OBJECT_ID = 2027-000A', 'CENTER_NAME = MOON', `REF_FRAME = ${frame}`, 'TIME_SYSTEM = TT', `START_TIME = ${ttText(START)}`, `STOP_TIME = ${ttText(START + SPAN_S)}`, 'INTERPOLATION = LAGRANGE', 'INTERPOLATION_DEGREE = 9', 'META_STOP'];
  const r = new Float64Array(3);
  const v = new Float64Array(3);
  for (let t = START; t <= START + SPAN_S; t += 60) {
    o.trajectory.lcrsStateInto(t, r, v, 0);
    lines.push(`${ttText(t)} ${[...r].map((x) => (x / 1000).toFixed(6)).join(' ')} ${[...v].map((x) => (x / 1000).toFixed(9)).join(' ')}`);
  }
  const path = join(dir, `lr-${frame}.oem`);
  writeFileSync(path, `${lines.join('\n')}\n`);
  return path;
}

function scenario(oemPath: string): string {
  return [
    'name: oem-moon',
    'window: { start: 2027-01-01T00:10:00 TT, end: 2027-01-02T23:50:00 TT }',
    'reference: TT',
    'satellites:',
    `  - { id: FROM-OEM, orbit: { oem: { file: ${JSON.stringify(oemPath)} } } }`,
    '  - { id: FROM-ELEMENTS, orbit: { keplerian: { body: moon, epoch: 2027-01-01T00:00:00 TT, aKm: 6142, e: 0.6, iDeg: 57.8, raanDeg: 0, argpDeg: 90, meanAnomalyDeg: 0 } } }',
  ].join('\n');
}

describe('CCSDS OEM about the Moon', () => {
  it('an ICRF Moon-centred OEM gives the same clock rate as the same orbit from elements', () => {
    const r = compareClocks(loadScenario(scenario(writeOem('ICRF')), { fileName: join(dir, 's.yaml') }));
    const a = r.clocks.find((c) => c.id === 'FROM-OEM')!;
    const b = r.clocks.find((c) => c.id === 'FROM-ELEMENTS')!;
    expect(a.body).toBe('moon');
    expect(Math.abs(a.meanFractionalOffset - b.meanFractionalOffset), `OEM ${a.meanFractionalOffset}, elements ${b.meanFractionalOffset}`).toBeLessThan(1e-15);
    expect(Math.abs(a.periodicAmplitudeNs - b.periodicAmplitudeNs), `periodic ${a.periodicAmplitudeNs} vs ${b.periodicAmplitudeNs} ns`).toBeLessThan(0.01);
  });

  it('CENTER_NAME = MOON with an Earth-fixed frame is refused', () => {
    expect(() => compareClocks(loadScenario(scenario(writeOem('ITRF2014')), { fileName: join(dir, 's2.yaml') }))).toThrow(/does not go with CENTER_NAME = MOON/);
  });
});
