/**
 * Writers for the stability table (`tauplan stability`, and the stability part of `tauplan fit`):
 * JSON, CSV, text and an HTML section. Pure string building; the numbers come from
 * src/clock/stabilityTable.ts.
 */
import { lazyPackage } from '../lazyPackage.ts';
import type { DeviationInterval, StabilityTableRow } from '../plan/stability.ts';
import type { StabilityResult } from '../plan/stability.ts';
import { PLANNING_CAUTION } from './caution.ts';
import { textTable } from './format.ts';
import type { SectionSpec } from './html.ts';
import { logLogPlot } from './svg.ts';

const csvStringify = lazyPackage<typeof import('csv-stringify/sync')>('csv-stringify/sync');

/** Name of a power-law noise type. */
export function noiseTypeName(alpha: number | null): string {
  switch (alpha) {
    case 2:
      return 'white PM';
    case 1:
      return 'flicker PM';
    case 0:
      return 'white FM';
    case -1:
      return 'flicker FM';
    case -2:
      return 'random-walk FM';
    default:
      return 'unknown';
  }
}

/** Short noise-type tags for plots. */
const SHORT_NOISE: Record<number, string> = { 2: 'WPM', 1: 'FPM', 0: 'WFM', [-1]: 'FFM', [-2]: 'RWFM' };

/** JSON row: the contract's fields plus the α the intervals assume. */
export interface StabilityJsonRow {
  tauS: number;
  m: number;
  alpha: number | null;
  alphaForEdf: number;
  oadev: DeviationInterval | null;
  mdev: DeviationInterval | null;
  tdevS: DeviationInterval | null;
  ohdev: DeviationInterval | null;
}

/** One table row as JSON. */
export function stabilityRowJson(r: StabilityTableRow): StabilityJsonRow {
  return { tauS: r.tauS, m: r.m, alpha: r.alpha, alphaForEdf: r.alphaForEdf, oadev: r.oadev, mdev: r.mdev, tdevS: r.tdevS, ohdev: r.ohdev };
}

/** JSON of `tauplan stability`. */
export function stabilityToJson(r: StabilityResult) {
  return {
    source: r.source,
    dataType: r.dataType,
    tau0S: r.tau0S,
    points: r.points,
    missing: r.missing,
    rows: r.rows.map(stabilityRowJson),
    notes: [...r.notes, EDF_NOTE],
  };
}

const EDF_NOTE =
  'intervals: chi-squared with the equivalent degrees of freedom of NIST SP 1065 Table 5 (OADEV) and of the exact Gaussian estimator (MDEV, TDEV, OHDEV) for the noise type alpha';

const STATS = ['oadev', 'mdev', 'tdevS', 'ohdev'] as const;

/** CSV columns of {@link stabilityToCsv}. */
export const STABILITY_CSV_COLUMNS = ['tauS', 'm', 'alpha', ...STATS.flatMap((s) => [s, `${s}Edf`, `${s}Lo68`, `${s}Hi68`, `${s}Lo95`, `${s}Hi95`])];

/** CSV: notes as `#` lines, then one row per τ; an undefined statistic is empty fields. */
export function stabilityToCsv(r: StabilityResult): string {
  const head = [...r.notes, EDF_NOTE].map((n) => `# ${n}\n`).join('');
  const rows = r.rows.map((row) => {
    const cells: (string | number)[] = [row.tauS, row.m, row.alpha ?? ''];
    for (const s of STATS) {
      const v = row[s];
      if (v === null) cells.push('', '', '', '', '', '');
      else cells.push(v.value, v.edf, v.ci68[0], v.ci68[1], v.ci95[0], v.ci95[1]);
    }
    return cells.map(String);
  });
  return head + csvStringify().stringify([STABILITY_CSV_COLUMNS, ...rows]);
}

function pm(v: DeviationInterval | null): string {
  if (v === null) return '—';
  return `${v.value.toExponential(3)} [${v.ci68[0].toExponential(2)}, ${v.ci68[1].toExponential(2)}]`;
}

/** Text table body (shared with the fit worksheet). */
export function stabilityTextTable(rows: readonly StabilityTableRow[]): string {
  return textTable(
    ['tau [s]', 'noise', 'OADEV [68 %]', 'MDEV [68 %]', 'TDEV [s] [68 %]', 'OHDEV [68 %]'],
    rows.map((r) => [String(r.tauS), noiseTypeName(r.alpha), pm(r.oadev), pm(r.mdev), pm(r.tdevS), pm(r.ohdev)]),
  );
}

/** Plain-text report. */
export function stabilityToText(r: StabilityResult): string {
  const out: string[] = [];
  out.push(`Frequency stability of ${r.source} (${r.dataType} data, tau0 = ${r.tau0S} s, ${r.points} samples, ${r.missing} missing)`);
  out.push('OADEV overlapping Allan, MDEV modified Allan, TDEV time, OHDEV overlapping Hadamard deviation (NIST SP 1065);');
  out.push('noise type per tau by the lag-1 autocorrelation (Riley & Greenhall 2004); brackets are 68 % intervals (95 % in JSON/CSV).');
  out.push('');
  out.push(stabilityTextTable(r.rows));
  for (const n of [...r.notes, EDF_NOTE]) out.push(`Note: ${n}.`);
  out.push('');
  out.push(PLANNING_CAUTION);
  return `${out.join('\n')}\n`;
}

/** HTML section: the log-log plot and the table with both intervals. */
export function stabilitySection(r: StabilityResult, heading = 'Frequency stability'): SectionSpec {
  const series = (['oadev', 'mdev', 'ohdev'] as const)
    .map((s) => ({ s, rows: r.rows.filter((row) => row[s] !== null && (row[s] as DeviationInterval).value > 0) }))
    .filter((x) => x.rows.length > 0)
    .map(({ s, rows }) => ({
      // 68 % interval as the error bar (a zero lower end cannot sit on a log axis: drawn at the value).
      yLow: rows.map((row) => {
        const v = row[s] as DeviationInterval;
        return v.ci68[0] > 0 ? v.ci68[0] : v.value;
      }),
      yHigh: rows.map((row) => (row[s] as DeviationInterval).ci68[1]),
      // Noise type per τ on the first curve only (one label per τ).
      ...(s === 'oadev' ? { pointLabels: rows.map((row) => (row.alpha === null ? null : SHORT_NOISE[row.alpha])) } : {}),
      label: { oadev: 'overlapping Allan deviation', mdev: 'modified Allan deviation', ohdev: 'overlapping Hadamard deviation' }[s],
      x: rows.map((row) => row.tauS),
      y: rows.map((row) => (row[s] as DeviationInterval).value),
    }));
  const cell = (v: DeviationInterval | null): string | null => (v === null ? null : v.value.toExponential(3));
  const ci = (v: DeviationInterval | null, k: 'ci68' | 'ci95'): string | null => (v === null ? null : `${v[k][0].toExponential(2)} – ${v[k][1].toExponential(2)}`);
  return {
    heading,
    intro: `${r.dataType} data from ${r.source}: τ0 = ${r.tau0S} s, ${r.points} samples, ${r.missing} missing. ${[...r.notes, EDF_NOTE].join('. ')}.`,
    figures: series.length === 0 ? [] : [logLogPlot({ title: 'Stability (bars: 68 % intervals; noise type: WPM/FPM white/flicker PM, WFM/FFM/RWFM white/flicker/random-walk FM)', xAxis: { label: 'Averaging time τ', unit: 's' }, yAxis: { label: 'Deviation', unit: '1' }, series })],
    tables: [
      {
        caption: 'Deviations with 68 % and 95 % intervals',
        columns: [
          { label: 'τ', unit: 's', numeric: true },
          'noise type',
          { label: 'OADEV', numeric: true },
          { label: 'OADEV 95 %', numeric: true },
          { label: 'MDEV', numeric: true },
          { label: 'TDEV', unit: 's', numeric: true },
          { label: 'TDEV 68 %', unit: 's', numeric: true },
          { label: 'OHDEV', numeric: true },
          { label: 'OHDEV 95 %', numeric: true },
        ],
        rows: r.rows.map((row) => [String(row.tauS), noiseTypeName(row.alpha), cell(row.oadev), ci(row.oadev, 'ci95'), cell(row.mdev), cell(row.tdevS), ci(row.tdevS, 'ci68'), cell(row.ohdev), ci(row.ohdev, 'ci95')]),
      },
    ],
  };
}
