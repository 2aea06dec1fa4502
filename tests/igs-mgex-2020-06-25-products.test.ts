/**
 * Real IGS/MGEX products of 2020-06-25 (GRG = CNES/CLS analysis centre; ../shared/realdata/
 * igs-2020-06-25, read there, never copied): the SP3 clock column and the RINEX clock file of the
 * same centre and day agree (µs × 1e-6 = s, per the realdata README and the SP3-d and RINEX clock
 * format descriptions), and `fit` gives the same rate from either (the done-when: within
 * 1e-14). Skipped with a message where the folder is absent.
 */
import { expect, it } from 'vitest';
import { fitFromFile } from '../src/cli/commands/fit.ts';
import { pickSeries, readClockFile } from '../src/io/clockFormats.ts';
import { defaultTimeSystem } from '../src/io/tables.ts';
import { runCli } from './helpers/cli.ts';
import { real, realDescribe } from './helpers/realdata.ts';

const ts = defaultTimeSystem();
const SP3 = 'igs-2020-06-25/GRG0MGXFIN_20201770000_01D_15M_ORB.SP3.gz';
const CLK9 = 'igs-2020-06-25/GRG0MGXFIN_20201770000_01D_30S_CLK_extract9.clk.gz';
const fitArgs = { degree: 2, clip: 4 };

realDescribe('GRG products of 2020-06-25', [SP3, CLK9], () => {
  it('SP3 clock (µs) × 1e-6 equals the RINEX clock (s) at every common epoch of the nine satellites', async () => {
    const sp3 = await readClockFile(real(SP3), { timeSystem: ts, wanted: null });
    const clk = await readClockFile(real(CLK9), { timeSystem: ts, wanted: null });
    let compared = 0;
    let worstPs = 0;
    for (const id of ['E01', 'E02', 'E11', 'E14', 'E18', 'G01', 'G02', 'G05', 'R01']) {
      const a = pickSeries(sp3, id);
      const b = pickSeries(clk, id);
      const byTime = new Map(b.ttJ2000S.map((t, i) => [Math.round(t * 1000), b.offsetNs[i]]));
      a.ttJ2000S.forEach((t, i) => {
        const other = byTime.get(Math.round(t * 1000));
        if (other === undefined) return;
        compared++;
        worstPs = Math.max(worstPs, Math.abs(a.offsetNs[i] - other) * 1000);
      });
    }
    // 96 SP3 epochs per satellite, all on the 30-s grid of the clock file.
    expect(compared).toBe(9 * 96);
    // SP3 prints 1e-6 µs = 1 ps; the clock file 12 significant digits (≤ 0.5 ps at 1 ms): ≤ 1 ps apart.
    expect(worstPs, `largest difference ${worstPs} ps, wanted ≤ 1 ps`).toBeLessThanOrEqual(1);
  });

  it('done-when: fit of the SP3 clock of E14 and of the RINEX clock with --orbit the SP3 agree within 1e-14', async () => {
    const sp3 = await readClockFile(real(SP3), { timeSystem: ts, wanted: new Set(['E14']) });
    const clk = await readClockFile(real(CLK9), { timeSystem: ts, wanted: new Set(['E14']) });
    const a = fitFromFile(sp3, { measurements: real(SP3), sat: 'E14', ...fitArgs }, ts);
    const b = fitFromFile(clk, { measurements: real(CLK9), sat: 'E14', orbit: real(SP3), ...fitArgs }, ts);
    const diff = (a.fractionalFrequency ?? Number.NaN) - (b.fractionalFrequency ?? Number.NaN);
    expect(Math.abs(diff), `SP3 ${a.fractionalFrequency}, RINEX clock ${b.fractionalFrequency}, difference ${diff}`).toBeLessThan(1e-14);
    expect(a.source?.periodicTerm).toBe('excluded');
    expect(b.source?.periodicTerm).toBe('excluded');
    // The split adds up, and the hardware offset nearly cancels relativity (the onboard offset was
    // set for the orbit): |hardware + relativistic| well under 1e-10 of the ~4.6e-10 (README: af1 ~1e-12–1e-11).
    const rel = a.relativisticMeanFractionalOffset ?? Number.NaN;
    const hw = a.hardwareFractionalOffset ?? Number.NaN;
    expect(Math.abs(hw + rel - (a.fractionalFrequency ?? 0))).toBeLessThan(1e-25);
    expect(Math.abs(hw + rel)).toBeLessThan(1e-10);
    expect(rel).toBeGreaterThan(4e-10);
  });

  it('fit --all surveys every satellite of the clock file in one run, the same rates as one-by-one', async () => {
    const r = runCli(['fit', real(CLK9), '--all', '--orbit', real(SP3), '--format', 'jsonl', '--jobs', '2']);
    expect(r.code, r.stderr).toBe(0);
    const rows = r.stdout.trim().split('\n').map((l) => JSON.parse(l) as { satellite: string; fractionalFrequency: number; hardwareFractionalOffset: number; adev1000: number | null; error: string | null });
    const withData = rows.filter((x) => x.error === null).map((x) => x.satellite);
    expect(withData.sort()).toEqual(['E01', 'E02', 'E11', 'E14', 'E18', 'G01', 'G02', 'G05', 'R01']);
    const clk = await readClockFile(real(CLK9), { timeSystem: ts, wanted: new Set(['G05']) });
    const one = fitFromFile(clk, { measurements: real(CLK9), sat: 'G05', orbit: real(SP3), ...fitArgs }, ts);
    const row = rows.find((x) => x.satellite === 'G05');
    expect(row?.fractionalFrequency).toBe(one.fractionalFrequency);
    expect(row?.adev1000).not.toBeNull();
  });
});
