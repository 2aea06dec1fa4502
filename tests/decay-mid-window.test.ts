/**
 * A satellite whose SGP4 propagation fails inside the window (a decaying, invented low orbit with
 * a large B*) is reported up to the failure, the report says so, and the other satellites complete
 * (issue: hardening, "nothing lost"). Common practice; no outside reference.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { buildTleLines } from '../src/io/tleBuild.ts';
import { runCli } from './helpers/cli.ts';

const dir = mkdtempSync(join(tmpdir(), 'tauplan-decay-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('decay inside the window', () => {
  it('reports the decaying satellite up to the failure and the others in full', () => {
    const n = (86400 / (2 * Math.PI)) * Math.sqrt(398600.4418 / (6378.137 + 190) ** 3);
    const [a, b] = buildTleLines({ catalogNumber: 99001, designator: '27099A', epochYear: 2027, epochDayOfYear: 4, inclinationDeg: 51.6, raanDeg: 10, eccentricity: 0.0005, argpDeg: 0, meanAnomalyDeg: 0, meanMotionRevPerDay: n, bstar: 0.05 });
    const [c, d] = buildTleLines({ catalogNumber: 99002, designator: '27099B', epochYear: 2027, epochDayOfYear: 4, inclinationDeg: 97.5, raanDeg: 10, eccentricity: 0.001, argpDeg: 0, meanAnomalyDeg: 0, meanMotionRevPerDay: 15.2 });
    const file = join(dir, 'decay.yaml');
    writeFileSync(
      file,
      [
        'name: decay check (invented)',
        'window: { start: 2027-01-04T00:00:00Z, end: 2027-01-06T00:00:00Z }',
        'satellites:',
        `  - { id: SINKER, orbit: { tle: ["${a}", "${b}"] } }`,
        `  - { id: STEADY, orbit: { tle: ["${c}", "${d}"] } }`,
        'stations:',
        '  - { id: A, latDeg: 10, lonDeg: 20, heightM: 0, minPassS: 60 }',
        '',
      ].join('\n'),
    );
    const r = runCli(['passes', file, '--format', 'json', '--quiet']);
    expect(r.code, r.stderr).toBe(0);
    const j = JSON.parse(r.stdout) as { notes: string[]; passes: { satellite: string; los: string }[] };
    expect(j.notes).toHaveLength(1);
    expect(j.notes[0]).toMatch(/^SINKER: SGP4 .* reported up to then$/);
    const steady = j.passes.filter((p) => p.satellite === 'STEADY');
    expect(steady.length).toBeGreaterThan(3);
    expect(steady.some((p) => p.los > '2027-01-05T12')).toBe(true);
  });
});
