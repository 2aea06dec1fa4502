/**
 * SP3 clock column (src/io/sp3Clock.ts) against "The Extended Standard Product 3 Orbit Format
 * (SP3-d)", S. Hilla, IGS, 2016: clock in µs in columns 47–60 of the P record, 999999.999999 for
 * a missing clock, clock-event flag `E` in column 75, clock-prediction flag `P` in column 76
 * (layout confirmed against the format's own example in ../shared/realdata/format-samples). The
 * fixture tests/fixtures/sp3-clock/sp3d-clock.sp3 is ours (see its README); expected values are
 * those written in it (confirmed by construction).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { pickSeries, readClockFile, readClockText } from '../src/io/clockFormats.ts';
import { defaultTimeSystem } from '../src/io/tables.ts';
import { fitSeries } from '../src/plan/clockFit.ts';
import { realDescribe, real } from './helpers/realdata.ts';

const ts = defaultTimeSystem();
const opts = { timeSystem: ts, wanted: null };
const FIXTURE = 'tests/fixtures/sp3-clock/sp3d-clock.sp3';

function near(got: number, wanted: number, tol: number, what: string): void {
  const diff = got - wanted;
  expect(Math.abs(diff), `${what}: wanted ${wanted}, got ${got}, difference ${diff} (tolerance ${tol})`).toBeLessThanOrEqual(tol);
}

describe('SP3-d fixture', () => {
  const f = readClockText(readFileSync(FIXTURE, 'utf8'), 'sp3d-clock.sp3', opts);

  it('is recognised from its first line and read in µs → ns', () => {
    expect(f.format).toBe('sp3');
    const g = pickSeries(f, 'G01');
    near(g.offsetNs[0], 100000, 1e-6, 'G01 first clock [ns] (100.000000 µs)');
    expect(g.periodicTerm).toBe('excluded');
  });
  it('999999.999999 is skipped and counted, never read as a value', () => {
    const g = pickSeries(f, 'G01');
    expect(g.skipped).toBe(1);
    expect(g.offsetNs.length).toBe(4);
    expect(Math.max(...g.offsetNs)).toBeLessThan(1e6);
  });
  it('the E flag (column 75) starts a new segment with its own offset; the P flag (column 76) is counted', () => {
    const e = pickSeries(f, 'E14');
    expect(e.segment).toEqual([0, 0, 0, 1, 1]);
    expect(e.predicted).toBe(1);
    // −12 ps per 900 s in both segments: y = −1.3333e-14; offsets −1061.352898 µs and
    // −950.000000 µs + 3 × 12 ps (the second segment's line taken back to the first epoch).
    const r = fitSeries(e, { degree: 1, timeSystem: ts, clipSigma: 0, trajectory: null });
    near(r.fractionalFrequency ?? Number.NaN, -0.012e-9 / 900, 1e-20, 'y (decimal rounding of µs values: < 1e-20)');
    near(r.segmentOffsetsNs[0], -1061352.898, 1e-6, 'segment 1 offset [ns]');
    near(r.segmentOffsetsNs[1], -950000 + 0.036, 1e-6, 'segment 2 offset [ns]');
    expect(r.source?.segments).toBe(2);
  });
});

realDescribe('real SP3-d (CODE MGEX, 2023-02-19)', ['format-samples/COD0MGXFIN_20230500000_01D_05M_ORB.SP3.gz'], () => {
  it('absent clocks (999999.999999, many in this file per the README) are skipped, and every kept value is a real clock', async () => {
    const f = await readClockFile(real('format-samples/COD0MGXFIN_20230500000_01D_05M_ORB.SP3.gz'), opts);
    expect(f.clocks.length).toBe(118);
    let skipped = 0;
    let kept = 0;
    for (const s of f.series.values()) {
      skipped += s.skipped;
      kept += s.offsetNs.length;
      // Satellite clocks are steered within a few ms of system time: |offset| < 1 s whatever the satellite.
      for (const x of s.offsetNs) expect(Math.abs(x)).toBeLessThan(1e9);
    }
    expect(skipped).toBeGreaterThan(0);
    expect(skipped + kept).toBe(118 * 289);
  });
});
