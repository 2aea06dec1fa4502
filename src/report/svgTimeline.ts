/** Timeline of passes: one row per station, one bar per pass over a UTC time axis. */
import { lazyPackage } from '../lazyPackage.ts';
import { AXIS, clip, colour, edgeText, escapeXml, finite, GRID, legendLayout, n, svgOpen, textWidthPx, type Frame } from './svgPrimitives.ts';
import { DAY_MS, HOUR_MS, timeTicks, utcClockLabel, utcDateLabel } from './svgTicks.ts';

const d3 = lazyPackage<typeof import('d3-scale')>('d3-scale');

/** One bar of a timeline: a pass of `row` from `fromMs` to `toMs` (UTC ms). */
export interface TimelineBar {
  row: string;
  fromMs: number;
  toMs: number;
  /** Short text drawn inside the bar when it fits (e.g. the satellite id). */
  label?: string;
  /** Colour group; bars with the same key share a colour and a legend entry. */
  group?: string;
}

/** Options for {@link timeline}. Rows appear in the order given, then any others in order of first use. */
export interface TimelineOptions {
  title: string;
  rows?: string[];
  bars: TimelineBar[];
  /** Time range in UTC ms; defaults to the bars' extent. */
  fromMs?: number;
  toMs?: number;
  widthPx?: number;
  /**
   * One lane per group inside each row (e.g. one per satellite inside a station's band), so bars of
   * different groups that overlap in time never hide each other. Default false: one lane per row.
   */
  laneByGroup?: boolean;
}
/**
 * Timeline: one row per station, a bar per pass over a UTC time axis. Bar text is drawn only
 * when it fits; every bar also carries an escaped `<title>` (hover text) with row, label and times.
 */
export function timeline(opts: TimelineOptions): string {
  const widthPx = opts.widthPx ?? 760;
  const rows: string[] = [...(opts.rows ?? [])];
  for (const b of opts.bars) if (!rows.includes(b.row)) rows.push(b.row);
  const groups: string[] = [];
  for (const b of opts.bars) if (b.group !== undefined && !groups.includes(b.group)) groups.push(b.group);
  let fromMs = opts.fromMs ?? Infinity;
  let toMs = opts.toMs ?? -Infinity;
  opts.bars.forEach((b, i) => {
    finite(b.fromMs, `bars[${i}].fromMs`);
    finite(b.toMs, `bars[${i}].toMs`);
    if (opts.fromMs === undefined) fromMs = Math.min(fromMs, b.fromMs);
    if (opts.toMs === undefined) toMs = Math.max(toMs, b.toMs);
  });
  if (!Number.isFinite(fromMs) || !Number.isFinite(toMs)) { fromMs = 0; toMs = DAY_MS; }
  finite(fromMs, 'fromMs');
  finite(toMs, 'toMs');
  if (toMs <= fromMs) toMs = fromMs + HOUR_MS;

  // Lanes per row: the groups that have bars in it, in legend order (or one lane).
  const lanesOf = rows.map((r) => (opts.laneByGroup === true ? groups.filter((g) => opts.bars.some((b) => b.row === r && b.group === g)) : []));
  const laneH = 12;
  const bandH = lanesOf.map((l) => Math.max(26, l.length * laneH + 6));
  const bandTop: number[] = [];
  bandH.reduce((y, h, i) => ((bandTop[i] = y), y + h), 0);
  const totalBandH = bandH.reduce((s, h) => s + h, 0);
  const rowLabels = rows.map((r) => clip(r, 24));
  const left = Math.max(60, Math.max(0, ...rowLabels.map((r) => textWidthPx(r))) + 18);
  const legend = legendLayout(
    groups.map((g, i) => ({ label: g, swatch: (x: number, y: number) => `<rect x="${n(x)}" y="${n(y - 6)}" width="24" height="12" rx="2" fill="${colour(i)}"/>` })),
    widthPx,
    left,
  );
  const f: Frame = { left, top: 32, right: widthPx - 20, bottom: 32 + Math.max(26, totalBandH) };
  const heightPx = f.bottom + 58 + (legend.rows > 0 ? legend.rows * 18 + 8 : 0);
  const xs = d3().scaleLinear().domain([fromMs, toMs]).range([f.left, f.right]);

  const out: string[] = [svgOpen(widthPx, heightPx, opts.title)];
  rows.forEach((r, i) => {
    const y = f.top + bandTop[i];
    if (i % 2 === 1) out.push(`<rect x="${n(f.left)}" y="${n(y)}" width="${n(f.right - f.left)}" height="${n(bandH[i])}" fill="#f6f6f6"/>`);
    if (i > 0 && opts.laneByGroup === true) out.push(`<line x1="${n(f.left)}" y1="${n(y)}" x2="${n(f.right)}" y2="${n(y)}" stroke="#c8c8c8"/>`);
    out.push(`<text x="${n(f.left - 8)}" y="${n(y + bandH[i] / 2 + 4)}" text-anchor="end">${escapeXml(rowLabels[i])}</text>`);
  });
  for (const t of timeTicks(fromMs, toMs, Math.max(2, Math.floor((f.right - f.left) / 80)))) {
    const x = xs(t.ms);
    out.push(
      `<line x1="${n(x)}" y1="${n(f.top)}" x2="${n(x)}" y2="${n(f.bottom)}" stroke="${GRID}"/>` +
        `<line x1="${n(x)}" y1="${n(f.bottom)}" x2="${n(x)}" y2="${n(f.bottom + 5)}" stroke="${AXIS}"/>` +
        edgeText(x, f.bottom + 18, t.line1, widthPx) +
        (t.line2 ? edgeText(x, f.bottom + 32, t.line2, widthPx, ` fill="${AXIS}"`) : ''),
    );
  }
  out.push(`<rect x="${n(f.left)}" y="${n(f.top)}" width="${n(f.right - f.left)}" height="${n(f.bottom - f.top)}" fill="none" stroke="${AXIS}"/>`);
  for (const b of opts.bars) {
    const i = rows.indexOf(b.row);
    const a = Math.max(fromMs, Math.min(b.fromMs, b.toMs));
    const e = Math.min(toMs, Math.max(b.fromMs, b.toMs));
    if (e < a) continue;
    const x0 = xs(a);
    const w = Math.max(2, xs(e) - x0);
    const lane = b.group === undefined ? -1 : lanesOf[i].indexOf(b.group);
    const laned = lane >= 0;
    const y = f.top + bandTop[i] + (laned ? 3 + lane * laneH : 5);
    const h = laned ? laneH - 2 : bandH[i] - 10;
    const c = b.group !== undefined ? colour(groups.indexOf(b.group)) : colour(0);
    const tip = `${b.row}${b.label ? ` — ${b.label}` : ''}: ${utcDateLabel(b.fromMs)} ${utcClockLabel(b.fromMs)}–${utcClockLabel(b.toMs)} UTC`;
    out.push(`<g><title>${escapeXml(tip)}</title><rect x="${n(x0)}" y="${n(y)}" width="${n(w)}" height="${n(h)}" rx="2" fill="${c}"/>`);
    if (b.label) {
      // Text only where it fits inside its own bar (bars of one lane never overlap, so neither do labels).
      const fontPx = laned ? 8 : 10;
      const text = clip(b.label, 16);
      if (textWidthPx(text, fontPx) + 6 <= w) out.push(`<text x="${n(x0 + w / 2)}" y="${n(y + h / 2 + fontPx * 0.35)}" text-anchor="middle" font-size="${fontPx}" fill="#fff">${escapeXml(text)}</text>`);
    }
    out.push('</g>');
  }
  out.push(`<text x="${n((f.left + f.right) / 2)}" y="${n(f.bottom + 48)}" text-anchor="middle">${escapeXml('Time [UTC]')}</text>`);
  out.push(legend.place(f.bottom + 70));
  out.push('</svg>');
  return out.join('');
}
