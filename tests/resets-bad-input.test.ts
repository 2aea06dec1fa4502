/**
 * Bad input for keep-in planning (contract § Conventions: one line `tauplan: <what> (<where>) —
 * <fix>`, exit 2; physics.md §7 for the policy keys). The scenario is invented (satellite KIP-1,
 * stations Moss Hollow and Tarn Edge do not exist); expected fragments are the JSON paths and the
 * words of our own messages (common practice for this contract, not reference values).
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { InputError } from '../src/errors.ts';
import { defaultTimeSystem } from '../src/io/tables.ts';
import { parseScenarioText } from '../src/io/scenario.ts';
import { clockStepsOf } from '../src/plan/resetsInputs.ts';
import { ONE_LINE_ERROR, runCli } from './helpers/cli.ts';

const ts = defaultTimeSystem();
const dir = mkdtempSync(join(tmpdir(), 'tauplan-resets-bad-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** An invented scenario with one keep-in clock; `clock`, `stations` and `policy` lines replace the defaults. */
function scenario(parts: { clock?: string; stations?: string; policy?: string } = {}): string {
  return `name: keep-in bad input (invented)
window: { start: 2027-01-04T00:00:00Z, end: 2027-01-06T00:00:00Z }
gravity: point
satellites:
  - id: KIP-1
    orbit:
      keplerian: { epoch: 2027-01-04T00:00:00Z, aKm: 26560, e: 0.001, iDeg: 55, raanDeg: 0, argpDeg: 0, meanAnomalyDeg: 0 }
    clock: { offsetNs: 0, hardwareFractionalOffset: -4.4647e-10, agingPerDay: 1.0e-14, keepInNs: 100${parts.clock ?? ''} }
stations:
${parts.stations ?? '  - { id: Moss Hollow, latDeg: 50, lonDeg: 10, heightM: 100 }\n  - { id: Tarn Edge, latDeg: -30, lonDeg: 140, heightM: 200 }'}
policy: { marginNs: 10, horizon: 2d${parts.policy ?? ''} }
`;
}

function parseError(text: string): InputError {
  try {
    const spec = parseScenarioText(text, 'kip.yaml', ts);
    for (const s of spec.satellites) clockStepsOf(s.clock, s.path);
  } catch (e) {
    if (e instanceof InputError) return e;
    throw e;
  }
  throw new Error('no error was raised');
}

describe('scenario keys of the keep-in planner', () => {
  it('accepts the new keys and applies the defaults (combined, target 0, uplink true, 10.23 MHz)', () => {
    const spec = parseScenarioText(scenario(), 'kip.yaml', ts);
    expect(spec.policy.prefer).toBe('combined');
    expect(spec.policy.targetNs).toBe(0);
    expect(spec.policy.minSpacingS).toBe(0);
    expect(spec.stations.every((s) => s.uplink)).toBe(true);
    expect(spec.satellites[0].clock?.nominalHz).toBe(10.23e6);
    const full = parseScenarioText(
      scenario({ clock: ', steps: { phaseResolutionNs: 0.1, frequencyResolutionHz: 1.023e-8, maxFrequencyStep: 1e-12 }, nominalHz: 10.23e6', policy: ', prefer: frequency, target: { offsetNs: 5 }, minSpacing: 12h, blackouts: [{ start: 2027-01-04T06:00:00Z, end: 2027-01-04T09:00:00Z, satellites: [KIP-1] }]' }),
      'kip.yaml',
      ts,
    );
    // 1.023e-8 Hz at 10.23 MHz is 1e-15 fractional (definition of a fractional frequency).
    expect(full.satellites[0].clock?.steps.frequencyResolution).toBeCloseTo(1e-15, 28);
    expect(full.policy.minSpacingS).toBe(43200);
    expect(full.policy.blackouts[0].end.minusS(full.policy.blackouts[0].start)).toBe(10800);
  });

  const faults: [string, Parameters<typeof scenario>[0], string[]][] = [
    ['target outside the limit', { policy: ', target: { offsetNs: 95 }' }, ['policy.target.offsetNs', 'outside the keep-in limit']],
    ['phase resolution of zero', { clock: ', steps: { phaseResolutionNs: 0 }' }, ['clock.steps.phaseResolutionNs', 'greater than 0']],
    ['negative frequency resolution', { clock: ', steps: { frequencyResolution: -1e-15 }' }, ['clock.steps.frequencyResolution', 'greater than 0']],
    ['largest step below the resolution', { clock: ', steps: { frequencyResolution: 1e-14, maxFrequencyStep: 1e-15 }' }, ['clock.steps.maxFrequencyStep', 'smaller than the resolution']],
    ['blackout ending before it starts', { policy: ', blackouts: [{ start: 2027-01-05T00:00:00Z, end: 2027-01-04T00:00:00Z }]' }, ['policy.blackouts[0].end', 'not after its start']],
    ['blackout naming no satellite of the scenario', { policy: ', blackouts: [{ start: 2027-01-04T00:00:00Z, end: 2027-01-05T00:00:00Z, satellites: [KIP-9] }]' }, ['policy.blackouts[0].satellites[0]', 'KIP-9']],
    ['unknown strategy', { policy: ', prefer: steer' }, ['policy.prefer', 'combined']],
    ['resolution given twice', { clock: ', steps: { frequencyResolution: 1e-15, frequencyResolutionHz: 1e-8 }' }, ['frequencyResolutionHz', 'once']],
  ];
  for (const [label, parts, fragments] of faults) {
    it(`refuses ${label}`, () => {
      const e = parseError(scenario(parts));
      for (const f of fragments) expect(e.message, `wanted "${f}" in: ${e.message}`).toContain(f);
    });
  }
});

describe('through the CLI: one line, exit 2', () => {
  it('no uplink station: the error names the stations', () => {
    const file = join(dir, 'no-uplink.yaml');
    writeFileSync(file, scenario({ stations: '  - { id: Moss Hollow, latDeg: 50, lonDeg: 10, heightM: 100, uplink: false }\n  - { id: Tarn Edge, latDeg: -30, lonDeg: 140, heightM: 200, uplink: false }' }));
    const r = runCli(['resets', file, '--format', 'json']);
    expect(r.code, r.stderr).toBe(2);
    expect(r.stderr).toMatch(ONE_LINE_ERROR);
    expect(r.stderr).toContain('Moss Hollow, Tarn Edge');
    expect(r.stderr).toContain('uplink');
    expect(r.stdout).toBe('');
  });

  it('`now` with a malformed duration', () => {
    const file = join(dir, 'ok.yaml');
    writeFileSync(file, scenario());
    for (const word of ['now+3x']) {
      const r = runCli(['resets', file, '--from', word, '--quiet']);
      expect(r.code, `${word}: ${r.stderr}`).toBe(2);
      expect(r.stderr).toMatch(ONE_LINE_ERROR);
      expect(r.stderr).toContain('--from');
    }
  });

  it('blackouts over the whole horizon: a FINDING in the plan, exit 0', () => {
    const file = join(dir, 'all-dark.yaml');
    // A detuned clock (about 90 ns/day off) crosses on the second day, after several passes.
    writeFileSync(file, scenario({ policy: ', blackouts: [{ start: 2027-01-01T00:00:00Z, end: 2027-02-01T00:00:00Z }]' }).replace('hardwareFractionalOffset: -4.4647e-10', 'hardwareFractionalOffset: -4.455e-10'));
    const r = runCli(['resets', file, '--quiet']);
    expect(r.code, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/FINDING: .*blackout/);
    expect(r.stdout).toMatch(/blackouts cover the whole horizon/);
  });
});
