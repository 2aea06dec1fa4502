/**
 * The public interface (../shared/contract.md, version 1): every command's JSON carries the
 * contract's field names with the right types, through the real CLI. Values are checked elsewhere;
 * here a renamed or missing field fails.
 */
import { describe, expect, it } from 'vitest';
import { runCli } from './helpers/cli.ts';

const DEMO = 'data/demo/tessera.yaml';

function json(args: string[]): Record<string, unknown> {
  const r = runCli([...args, '--format', 'json', '--quiet']);
  expect(r.code, r.stderr).toBe(0);
  return JSON.parse(r.stdout) as Record<string, unknown>;
}

function hasFields(obj: unknown, fields: Record<string, 'number' | 'string' | 'boolean' | 'object' | 'number|null' | 'string|null' | 'object|null'>): void {
  const o = obj as Record<string, unknown>;
  for (const [k, t] of Object.entries(fields)) {
    expect(k in o, `missing field ${k}`).toBe(true);
    const v = o[k];
    const actual = v === null ? 'null' : typeof v;
    expect(t.split('|'), `field ${k} is ${actual}`).toContain(actual);
  }
}

describe('contract JSON fields', () => {
  it('time', () => {
    const j = json(['time', '2027-03-01T00:00:00Z']);
    hasFields(j, { utc: 'string', tai: 'string', tt: 'string', gps: 'string', gpsWeek: 'number', gpsSecondsOfWeek: 'number', mjdUtc: 'number', taiMinusUtcS: 'number' });
    expect(j.utc).toBe('2027-03-01T00:00:00.000Z');
    expect(j.tai).toMatch(/ TAI$/);
    expect(j.tt).toMatch(/ TT$/);
    expect(j.gps).toMatch(/ GPS$/);
  });

  it('size', () => {
    const j = json(['size', '--a-km', '26561.75', '--i-deg', '55', '--gravity', 'point']);
    hasFields(j, { meanFractionalOffset: 'number', driftNsPerDay: 'number', components: 'object', nominalHz: 'number', recommendedHz: 'number', recommendedOffsetHz: 'number', eccentricityAmplitudeNs: 'number', residualPeriodicAmplitudeNs: 'number', sensitivityPerKm: 'number' });
    hasFields(j.components, { gravitational: 'number', velocity: 'number' });
    // Sign convention: GPS-like orbits run fast (+4.4647e-10), the ground setting is lower.
    expect(j.meanFractionalOffset as number).toBeGreaterThan(4.46e-10);
    expect(j.recommendedOffsetHz as number).toBeLessThan(0);
  });

  it('passes', () => {
    const j = json(['passes', DEMO, '--to', '2027-01-04T12:00:00Z']);
    const passes = j.passes as Record<string, unknown>[];
    expect(passes.length).toBeGreaterThan(0);
    for (const p of passes) {
      hasFields(p, { satellite: 'string', station: 'string', aos: 'string', tca: 'string', los: 'string', maxElevationDeg: 'number', durationS: 'number', clockOffsetAtAosNs: 'number', clockOffsetAtLosNs: 'number', driftDuringPassNs: 'number', relativisticPeriodicAtTcaNs: 'number', lightTimeAtTcaNs: 'number', sagnacAtTcaNs: 'number', shapiroAtTcaNs: 'number', keepInMarginNs: 'number|null', truncated: 'boolean' });
    }
    const aos = passes.map((p) => p.aos as string);
    expect([...aos].sort()).toEqual(aos); // sorted by AOS
  });

  it('resets', () => {
    const j = json(['resets', DEMO, '--horizon', '20d']);
    const sats = j.satellites as Record<string, unknown>[];
    expect(sats.length).toBeGreaterThan(0);
    let adjustments = 0;
    for (const s of sats) {
      hasFields(s, { satellite: 'string', limitNs: 'number', firstCrossing: 'object|null', adjustments: 'object', crossingProbabilityWithinHorizon: 'number', strategies: 'object', notes: 'object' });
      // Version 2: latest is null when the far band edge does not reach the limit within the horizon.
      if (s.firstCrossing !== null) hasFields(s.firstCrossing, { at: 'string', side: 'string', earliest: 'string', latest: 'string|null' });
      for (const st of s.strategies as unknown[]) hasFields(st, { prefer: 'string', adjustments: 'number', minMarginNs: 'number', maxPhaseStepNs: 'number', maxFrequencyStep: 'number' });
      expect((s.strategies as { prefer: string }[]).map((st) => st.prefer)).toEqual(['phase', 'frequency', 'combined']);
      for (const a of s.adjustments as Record<string, unknown>[]) {
        adjustments++;
        hasFields(a, { at: 'string', station: 'string', passAos: 'string', passLos: 'string', kind: 'string', phaseStepNs: 'number', frequencyStep: 'number', offsetBeforeNs: 'number', offsetAfterNs: 'number', frequencyStepHz: 'number', frequencyStepNsPerDay: 'number', quantisationErrorNs: 'number' });
        expect(['phase', 'frequency', 'combined']).toContain(a.kind);
        expect((a.at as string) >= (a.passAos as string) && (a.at as string) <= (a.passLos as string)).toBe(true);
      }
    }
    expect(adjustments).toBeGreaterThan(0);
  });

  it('fit', () => {
    const j = json(['fit', 'data/demo/tsr1-offsets.csv', '--degree', '2']);
    hasFields(j, { epoch: 'string', offsetNs: 'number', offsetSigmaNs: 'number|null', fractionalFrequency: 'number|null', fractionalFrequencySigma: 'number|null', driftPerDay: 'number|null', driftPerDaySigma: 'number|null', rmsNs: 'number', used: 'number', rejected: 'object', stability: 'object' });
    for (const s of j.stability as unknown[]) hasFields(s, { tauS: 'number', oadev: 'number', mdev: 'number', count: 'number' });
  });

  it('compare', () => {
    const j = json(['compare', DEMO]);
    for (const c of j.clocks as unknown[]) hasFields(c, { id: 'string', kind: 'string', meanFractionalOffset: 'number', driftNsPerDay: 'number', periodicAmplitudeNs: 'number', elapsedOffsetNs: 'number' });
    for (const p of j.pairs as unknown[]) hasFields(p, { a: 'string', b: 'string', elapsedDifferenceNs: 'number' });
  });

  it('sweep', () => {
    const j = json(['sweep', '--points', '8', '--from-km', '1000', '--to-km', '20000', '--gravity', 'point']);
    hasFields(j, { rows: 'object', breakEvenAltitudeKm: 'number|null' });
    for (const r of j.rows as unknown[]) hasFields(r, { altitudeKm: 'number', meanFractionalOffset: 'number', gravitational: 'number', velocity: 'number' });
  });

  it('track', () => {
    const j = json(['track', DEMO, '--sat', 'TSR-1', '--to', '2027-01-04T01:00:00Z', '--step', '600s', '--frame', 'ECEF']);
    hasFields(j, { satellite: 'string', frame: 'string', rows: 'object' });
    const rows = j.rows as unknown[];
    expect(rows).toHaveLength(7);
    for (const r of rows) hasFields(r, { time: 'string', xKm: 'number', yKm: 'number', zKm: 'number', vxKmPerS: 'number', vyKmPerS: 'number', vzKmPerS: 'number', fractionalOffset: 'number', offsetNs: 'number', periodicNs: 'number' });
  });
});
