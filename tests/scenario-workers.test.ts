/**
 * Multi-satellite scenarios spread over worker threads give exactly the output of one process,
 * in the same order, whatever the number of workers (issue: speed and scale). Common practice.
 */
import { describe, expect, it } from 'vitest';
import { runCli } from './helpers/cli.ts';

const DEMO = 'data/demo/tessera.yaml';

describe('--jobs on scenario commands', () => {
  it('passes: --jobs 1 and --jobs 2 give identical JSON', () => {
    const one = runCli(['passes', DEMO, '--to', '2027-01-05T00:00:00Z', '--format', 'json', '--jobs', '1', '--quiet']);
    const two = runCli(['passes', DEMO, '--to', '2027-01-05T00:00:00Z', '--format', 'json', '--jobs', '2', '--quiet']);
    expect(one.code, one.stderr).toBe(0);
    expect(two.code, two.stderr).toBe(0);
    expect(two.stdout).toBe(one.stdout);
  });

  it('resets: --jobs 1 and --jobs 3 give identical CSV', () => {
    const one = runCli(['resets', DEMO, '--horizon', '15d', '--format', 'csv', '--jobs', '1', '--quiet']);
    const three = runCli(['resets', DEMO, '--horizon', '15d', '--format', 'csv', '--jobs', '3', '--quiet']);
    expect(one.code, one.stderr).toBe(0);
    expect(three.code, three.stderr).toBe(0);
    expect(three.stdout).toBe(one.stdout);
  });

  it('a fault in a worker is the same one-line error as in process', () => {
    const r = runCli(['passes', DEMO, '--to', '2027-06-01T00:00:00Z', '--jobs', '2', '--station', 'NOWHERE']);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/^tauplan: no station "NOWHERE" in the scenario \(--station\) — use one of .+\n$/);
    const bad = runCli(['passes', DEMO, '--jobs', '0']);
    expect(bad.code).toBe(2);
    expect(bad.stderr).toMatch(/--jobs 0 is not a whole number/);
  });
});
