/**
 * Bad input for clocks near the Moon, through the real CLI: one line on stderr
 * `tauplan: <what> (<where>) — <fix>`, exit 2, no output file. Scenario files are one-fault edits of
 * the invented fixture tests/fixtures/lunar/relay.yaml, written to a temporary folder.
 */
import { mkdtempSync, readFileSync, writeFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { ONE_LINE_ERROR, runCli } from './helpers/cli.ts';

const base = readFileSync('tests/fixtures/lunar/relay.yaml', 'utf8');
const dir = mkdtempSync(join(tmpdir(), 'tauplan-lunar-'));

function scenarioWith(name: string, from: string, to: string): string {
  if (!base.includes(from)) throw new Error(`fixture has no ${from}`);
  const path = join(dir, `${name}.yaml`);
  writeFileSync(path, base.replace(from, to));
  return path;
}

function expectOneLine(args: string[], fragments: string[]): void {
  const out = join(dir, `out-${Math.random().toString(36).slice(2)}.json`);
  const r = runCli([...args, '--format', 'json', '--out', out]);
  expect(r.code, r.stderr).toBe(2);
  expect(r.stderr).toMatch(ONE_LINE_ERROR);
  for (const f of fragments) expect(r.stderr).toContain(f);
  expect(existsSync(out)).toBe(false);
}

describe('lunar bad input (compare)', () => {
  it('an unknown body', () => {
    expectOneLine(['compare', scenarioWith('mars', 'keplerian: { body: moon, epoch: 2027-01-01T00:00:00 TT, aKm: 6142, e: 0.6, iDeg: 57.8, raanDeg: 0', 'keplerian: { body: mars, epoch: 2027-01-01T00:00:00 TT, aKm: 6142, e: 0.6, iDeg: 57.8, raanDeg: 0')], ['satellites[0].orbit.keplerian.body', 'earth, moon']);
  });
  it('a frame that does not match the body', () => {
    expectOneLine(['compare', scenarioWith('frame', 'state: { frame: LCRS,', 'state: { body: moon, frame: GCRF,')], ['satellites[2].orbit.state.frame', 'LCRS']);
  });
  it('an orbit that intersects the Moon', () => {
    expectOneLine(['compare', scenarioWith('low', 'aKm: 6142, e: 0.6, iDeg: 57.8, raanDeg: 0,', 'aKm: 2000, e: 0.2, iDeg: 57.8, raanDeg: 0,')], ['satellites[0].orbit.keplerian.aKm', 'intersects the Moon']);
  });
  it('an LCRS state inside the Moon', () => {
    expectOneLine(['compare', scenarioWith('inside', 'positionKm: [1837.4, 0, 0]', 'positionKm: [1637.4, 0, 0]')], ['satellites[2].orbit.state.positionKm', 'inside the Moon']);
  });
  it('a selenographic latitude above 90°', () => {
    expectOneLine(['compare', scenarioWith('lat', 'latDeg: -89.5', 'latDeg: -95')], ['stations[2].latDeg']);
  });
  it('a window outside the Moon ephemeris\' span', () => {
    const w = scenarioWith('2150', 'window: { start: 2027-01-01T00:00:00 TT, end: 2027-01-28T13:18:33 TT }', 'window: { start: 2150-01-01T00:00:00 TT, end: 2150-01-03T00:00:00 TT }');
    const fixed = join(dir, '2150b.yaml');
    writeFileSync(fixed, readFileSync(w, 'utf8').replaceAll('epoch: 2027-01-01T00:00:00 TT', 'epoch: 2150-01-01T00:00:00 TT'));
    expectOneLine(['compare', fixed], ['Moon ephemeris', '2100']);
  });
});

describe('lunar bad input (size, sweep)', () => {
  it('an unknown body', () => {
    expectOneLine(['size', '--body', 'mars', '--a-km', '6142'], ['--body', 'earth or moon']);
  });
  it('an orbit that intersects the Moon', () => {
    expectOneLine(['size', '--body', 'moon', '--a-km', '1800', '--e', '0.1'], ['--a-km', 'intersects the Moon']);
  });
  it('a reference latitude above 90°', () => {
    expectOneLine(['size', '--body', 'moon', '--a-km', '6142', '--reference-lat-deg', '95'], ['--reference.latDeg', 'latitude']);
  });
  it('a window outside the Moon ephemeris\' span', () => {
    expectOneLine(['size', '--body', 'moon', '--a-km', '6142', '--epoch', '2150-01-01T00:00:00 TT', '--span', '1d'], ['Moon ephemeris', '2100']);
  });
  it('--keep lunar-surface on an Earth orbit', () => {
    expectOneLine(['size', '--a-km', '26561.75', '--keep', 'lunar-surface'], ['--keep', '--body moon']);
  });
  it('sweep --body moon whose lowest orbit is inside the Moon', () => {
    expectOneLine(['sweep', '--body', 'moon', '--from-km', '10', '--to-km', '500', '--e', '0.2'], ['--from-km', 'intersects the Moon']);
  });
});

describe('size --body moon through the CLI', () => {
  it('the 12-hour frozen orbit, JSON with body, meanFractionalOffsetVsLunarSurface and parts', () => {
    const r = runCli(['size', '--body', 'moon', '--a-km', '6142', '--e', '0.6', '--i-deg', '57.8', '--argp-deg', '90', '--span', '2d', '--format', 'json']);
    expect(r.code, r.stderr).toBe(0);
    const j = JSON.parse(r.stdout) as { body: string; meanFractionalOffsetVsLunarSurface: number; parts: Record<string, number>; meanFractionalOffset: number };
    expect(j.body).toBe('moon');
    // Derived (physics.md §12): −(3GM_M/(2a) − GM_M/R)/c² = +1.5617 µs/day; perturbations < 0.002.
    expect(Math.abs(j.meanFractionalOffsetVsLunarSurface * 86_400e6 - 1.5617)).toBeLessThan(0.002);
    expect(Object.keys(j.parts).sort()).toEqual(['earth', 'moon', 'sun', 'velocity']);
  });
});
