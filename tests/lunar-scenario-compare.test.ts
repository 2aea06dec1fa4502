/**
 * `compare` on a scenario with an Earth station, lunar surface stations and lunar orbiters (the
 * invented fixture tests/fixtures/lunar/relay.yaml), against the published lunar surface figure:
 * a clock on the Moon gains 56.02 µs/day on a clock on the geoid (Ashby & Patla 2024, AJ 168:112,
 * abstract, confirmed; Turyshev et al. 2024 give 56.0256 µs/day). The window is one anomalistic
 * month, so the elapsed difference per day is the mean over a whole period of the monthly term;
 * the evection and variation terms (0.09 and 0.06 µs) move a one-month mean by up to 0.04 µs/day,
 * hence the 0.05 µs/day tolerance. The Earth station sits on the ellipsoid with N = 0, a geoid
 * clock up to the model's neglected zonal undulation (< 1e-15 in rate).
 * The orbiters against the surface clock follow −(3GM_M/(2a) − GM_M/R)/c² (derived, physics.md §12):
 * +1.5617 µs/day for a = 6142 km, −1.1349 µs/day for 100 km; J2, C22, the Earth and the Sun move them
 * by under 0.005 µs/day (tolerance).
 */
import { describe, expect, it } from 'vitest';
import { compareClocks } from '../src/api/compare.ts';
import { loadScenario } from '../src/api/scenario.ts';

const DAYS = 27.55455;
const GM_MOON = 4.902800066e12;
const R_MOON_M = 1_737_400;
const C2 = 299_792_458 ** 2;
const US_PER_DAY = 86_400e6;

const result = compareClocks(loadScenario('tests/fixtures/lunar/relay.yaml'));
const pair = (a: string, b: string): number => {
  const p = result.pairs.find((x) => x.a === a && x.b === b);
  if (p === undefined) throw new Error(`no pair ${a} ${b}`);
  return p.elapsedDifferenceNs / 1000 / DAYS;
};

describe('compare with Earth and lunar clocks side by side', () => {
  it('lunar surface station vs Earth station: 56.02 µs/day (Ashby & Patla 2024)', () => {
    const got = -pair('FERNHOLT', 'HALDEN-BASE');
    expect(Math.abs(got - 56.02), `wanted 56.02 µs/day, got ${got.toFixed(4)}, difference ${(got - 56.02).toFixed(4)}`).toBeLessThan(0.05);
  });

  it('clocks carry their body', () => {
    const body = Object.fromEntries(result.clocks.map((c) => [c.id, c.body]));
    expect(body).toEqual({ 'LR-1': 'moon', 'LR-2': 'moon', 'LLO-1': 'moon', FERNHOLT: 'earth', 'HALDEN-BASE': 'moon', 'RIMA-POLE': 'moon' });
  });

  it('orbiters against the surface station follow −(3GM_M/(2a) − GM_M/R)/c²', () => {
    for (const [id, aM] of [['LR-1', 6_142e3], ['LR-2', 6_142e3], ['LLO-1', R_MOON_M + 100e3]] as const) {
      const wanted = (-((3 * GM_MOON) / (2 * aM) - GM_MOON / R_MOON_M) / C2) * US_PER_DAY;
      const got = pair(id, 'HALDEN-BASE');
      expect(Math.abs(got - wanted), `${id}: wanted ${wanted.toFixed(4)} µs/day, got ${got.toFixed(4)}, difference ${(got - wanted).toFixed(4)}`).toBeLessThan(0.005);
    }
  });
});
