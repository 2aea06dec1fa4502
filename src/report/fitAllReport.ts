/**
 * Writers of `fit --all` (a survey of every clock in a file): CSV, JSON Lines, JSON, text and an
 * HTML page with a sorted dot plot of the hardware offsets. Pure string building.
 */
import type { FitSurveyRow } from '../plan/fitAll.ts';
import { PLANNING_CAUTION } from './caution.ts';
import { toCsv, type CsvCell } from './csv.ts';
import { textTable } from './format.ts';
import { page } from './htmlReport.ts';
import { escapeXml } from './svg.ts';

/** What the survey was run on. */
export interface SurveyMeta {
  file: string;
  format: string;
  notes: string[];
  /** Orbit source, or null when there was none (then no relativistic split). */
  orbit: string | null;
  degree: number;
}

/** Columns of the CSV, in order (the JSON row fields). */
export const SURVEY_COLUMNS: readonly (keyof FitSurveyRow)[] = [
  'satellite',
  'kind',
  'samples',
  'skipped',
  'segments',
  'fractionalFrequency',
  'relativisticMeanFractionalOffset',
  'hardwareFractionalOffset',
  'driftPerDay',
  'rmsNs',
  'adev1000',
  'adev1000TauS',
  'adev1d',
  'error',
];

function metaNotes(meta: SurveyMeta): string[] {
  return [...meta.notes, meta.orbit === null ? 'no orbit: no relativistic split (give --orbit)' : `orbit: ${meta.orbit}`, PLANNING_CAUTION];
}

/** CSV with the notes as `#` lines before the header. */
export function surveyToCsv(rows: readonly FitSurveyRow[], meta: SurveyMeta): string {
  const notes = metaNotes(meta).map((n) => `# ${n.replace(/\n/g, ' ')}\n`).join('');
  return notes + toCsv(SURVEY_COLUMNS as string[], rows.map((r) => SURVEY_COLUMNS.map((c) => r[c] as CsvCell)));
}

/** One JSON object per line, one line per clock. */
export function surveyToJsonl(rows: readonly FitSurveyRow[]): string {
  return rows.map((r) => `${JSON.stringify(r)}\n`).join('');
}

/** The JSON document: the file, the notes and the rows. */
export function surveyToJson(rows: readonly FitSurveyRow[], meta: SurveyMeta) {
  return { file: meta.file, format: meta.format, degree: meta.degree, clocks: rows.length, fitted: rows.filter((r) => r.error === null).length, notes: metaNotes(meta), rows };
}

const e3 = (x: number | null): string => (x === null ? '—' : x.toExponential(3));

/** A text table, one line per clock. */
export function surveyToText(rows: readonly FitSurveyRow[], meta: SurveyMeta): string {
  const out: string[] = [];
  out.push(`Clock survey of ${meta.file} (${meta.format}, ${rows.length} clocks, degree ${meta.degree})`);
  out.push('y = fitted fractional frequency = relativistic mean rate + hardware offset; ADEV of the fit residuals.');
  out.push('');
  out.push(
    textTable(
      ['clock', 'samples', 'skipped', 'y', 'relativistic', 'hardware', 'drift/day', 'rms ns', 'ADEV ~1000 s', 'ADEV 1 d', 'note'],
      rows.map((r) => [r.satellite, String(r.samples), String(r.skipped), e3(r.fractionalFrequency), e3(r.relativisticMeanFractionalOffset), e3(r.hardwareFractionalOffset), e3(r.driftPerDay), r.rmsNs === null ? '—' : r.rmsNs.toFixed(3), e3(r.adev1000), e3(r.adev1d), r.error ?? '']),
    ),
  );
  out.push('');
  for (const n of metaNotes(meta)) out.push(`Note: ${n}`);
  return `${out.join('\n')}\n`;
}

/** Sorted dot plot of the hardware offsets (parts in 1e10), one row per clock. */
export function hardwareDotPlot(rows: readonly FitSurveyRow[]): string | null {
  const pts = rows.filter((r) => r.hardwareFractionalOffset !== null).map((r) => ({ name: r.satellite, v: (r.hardwareFractionalOffset as number) * 1e10 })).sort((a, b) => a.v - b.v);
  if (pts.length === 0) return null;
  const rowH = 14;
  const left = 70;
  const width = 720;
  const plotW = width - left - 20;
  const top = 30;
  const height = top + pts.length * rowH + 40;
  let lo = Math.min(...pts.map((p) => p.v));
  let hi = Math.max(...pts.map((p) => p.v));
  if (hi - lo < 1e-6) {
    lo -= 0.5;
    hi += 0.5;
  }
  const pad = (hi - lo) * 0.05;
  lo -= pad;
  hi += pad;
  const x = (v: number): number => left + ((v - lo) / (hi - lo)) * plotW;
  const parts: string[] = [];
  parts.push(`<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${width} ${height}" width="${width}" height="${height}" role="img" aria-label="hardware fractional offset per clock, sorted">`);
  parts.push(`<text x="${left}" y="16" font-size="12">Hardware fractional offset [parts in 1e10], sorted</text>`);
  const ticks = 5;
  for (let k = 0; k <= ticks; k++) {
    const v = lo + ((hi - lo) * k) / ticks;
    const xv = x(v).toFixed(1);
    parts.push(`<line x1="${xv}" y1="${top - 4}" x2="${xv}" y2="${top + pts.length * rowH}" stroke="#ddd"/>`);
    parts.push(`<text x="${xv}" y="${top + pts.length * rowH + 16}" font-size="10" text-anchor="middle">${v.toFixed(3)}</text>`);
  }
  pts.forEach((p, i) => {
    const y = top + i * rowH + rowH / 2;
    parts.push(`<text x="${left - 6}" y="${(y + 4).toFixed(1)}" font-size="10" text-anchor="end">${escapeXml(p.name)}</text>`);
    parts.push(`<circle cx="${x(p.v).toFixed(1)}" cy="${y.toFixed(1)}" r="3.5" fill="#1f5f99"><title>${escapeXml(`${p.name}: ${(p.v * 1e-10).toExponential(4)}`)}</title></circle>`);
  });
  parts.push('</svg>');
  return parts.join('');
}

/** HTML page: the dot plot and the table. */
export function surveyToHtml(rows: readonly FitSurveyRow[], meta: SurveyMeta): string {
  const plot = hardwareDotPlot(rows);
  return page('tauplan — clock survey', meta.file, [{ label: 'format', value: meta.format }, { label: 'clocks', value: String(rows.length) }, { label: 'orbit', value: meta.orbit ?? 'none (no relativistic split)' }], [
    {
      heading: 'Hardware offsets',
      intro: `Each clock's fitted rate minus the relativistic mean rate along its orbit: the oscillator's own offset. A clock whose factory offset was sized for its orbit sits near minus its relativistic rate.\n\n${meta.notes.join('\n')}`,
      ...(plot === null ? {} : { figures: [{ svg: plot, caption: 'Hardware fractional offset per clock, sorted.' }] }),
      tables: [
        {
          caption: 'One row per clock',
          columns: ['clock', 'samples', 'skipped', { label: 'y', numeric: true }, { label: 'relativistic', numeric: true }, { label: 'hardware', numeric: true }, { label: 'drift', unit: '1/day', numeric: true }, { label: 'rms', unit: 'ns', numeric: true }, { label: 'ADEV ~1000 s', numeric: true }, { label: 'ADEV 1 d', numeric: true }, 'note'],
          rows: rows.map((r) => [r.satellite, r.samples, r.skipped, e3(r.fractionalFrequency), e3(r.relativisticMeanFractionalOffset), e3(r.hardwareFractionalOffset), e3(r.driftPerDay), r.rmsNs === null ? null : Number(r.rmsNs.toFixed(3)), e3(r.adev1000), e3(r.adev1d), r.error ?? '']),
        },
      ],
    },
  ]);
}
