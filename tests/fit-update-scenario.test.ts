/**
 * `fit --update-scenario`: the fitted clock block goes back into the scenario, the rest of the file
 * keeps its values, and the updated scenario feeds `resets` directly. The measurements are the
 * simulated demo offsets of the invented TSR-1 clock (hardware offset −4.4640e-10, 0.8 ns white
 * noise), so the written hardware offset must recover it within 3σ of the fit (common practice).
 */
import { copyFileSync, mkdtempSync, readFileSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { parseScenarioText } from '../src/io/scenario.ts';
import { defaultTimeSystem } from '../src/io/tables.ts';
import { runCli } from './helpers/cli.ts';

const dir = mkdtempSync(join(tmpdir(), 'tauplan-update-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const ts = defaultTimeSystem();

describe('fit --update-scenario', () => {
  it('writes the fitted clock of one satellite and nothing else', () => {
    const file = join(dir, 'tessera.yaml');
    copyFileSync('data/demo/tessera.yaml', file);
    const before = parseScenarioText(readFileSync(file, 'utf8'), file, ts);
    const r = runCli(['fit', 'data/demo/tsr1-offsets.csv', '--degree', '1', '--scenario', file, '--sat', 'TSR-1', '--update-scenario', file, '--format', 'json', '--quiet']);
    expect(r.code, r.stderr).toBe(0);
    const fit = JSON.parse(r.stdout) as { fractionalFrequencySigma: number };
    const text = readFileSync(file, 'utf8');
    expect(text).toContain('# INVENTED demo scenario'); // comments survive
    const after = parseScenarioText(text, file, ts);
    const clock = after.satellites[0].clock!;
    expect(Math.abs(clock.hardwareFractionalOffset - -4.464e-10), `written ${clock.hardwareFractionalOffset}`).toBeLessThan(3 * fit.fractionalFrequencySigma);
    expect(clock.keepInNs).toBe(100);
    expect(clock.noise).toEqual(before.satellites[0].clock!.noise);
    expect(after.satellites.slice(1)).toEqual(before.satellites.slice(1));
    expect(after.stations).toEqual(before.stations);
    expect(readdirSync(dir).filter((f) => f.startsWith('.tauplan-tmp-'))).toEqual([]);

    const resets = runCli(['resets', file, '--sat', 'TSR-1', '--horizon', '20d', '--format', 'json', '--quiet']);
    expect(resets.code, resets.stderr).toBe(0);
  });

  it('refuses --update-scenario without --scenario and --sat, and leaves the file alone', () => {
    const file = join(dir, 'untouched.yaml');
    copyFileSync('data/demo/tessera.yaml', file);
    const r = runCli(['fit', 'data/demo/tsr1-offsets.csv', '--update-scenario', file]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/^tauplan: --update-scenario needs --scenario and --sat/);
    expect(readFileSync(file, 'utf8')).toBe(readFileSync('data/demo/tessera.yaml', 'utf8'));
  });
});
