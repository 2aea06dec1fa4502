/**
 * Keep-in plot: the free-running and the planned clock offsets, each inside its 95 % band, the two
 * limits, the adjustment passes shaded and each adjustment numbered. Numbers are placed where they
 * overlap neither each other nor the limit labels (else left off the plot); the list under the plot
 * always names every adjustment. Pure: numbers in, an `<svg>` string out.
 */
import { lazyPackage } from '../lazyPackage.ts';
import { InternalError } from '../errors.ts';
import { decimateMinMax } from './svgDecimate.ts';
import { AXIS, axisTitle, clip, colour, contentId, edgeText, escapeXml, finite, FONT_PX, GRID, INK, legendLayout, LIMIT, lineSwatch, n, SHADE, svgOpen, textWidthPx, type LegendItem } from './svgPrimitives.ts';
import { formatTick, timeTicks } from './svgTicks.ts';

const d3 = lazyPackage<typeof import('d3-scale')>('d3-scale');

/** One curve with its band: y ± halfWidth at each x (UTC ms). */
export interface BandedCurve {
  label: string;
  y: ArrayLike<number>;
  halfWidth: ArrayLike<number>;
}

/** One numbered adjustment: where its marker goes and the line listed under the plot. */
export interface KeepInMark {
  xMs: number;
  y: number;
  text: string;
}

export interface KeepInPlotOptions {
  title: string;
  /** Sample times, UTC ms, increasing. */
  xMs: ArrayLike<number>;
  curves: BandedCurve[];
  limitNs: number;
  marks: KeepInMark[];
  /** Adjustment passes, UTC ms. */
  passes: { fromMs: number; toMs: number }[];
  widthPx?: number;
  heightPx?: number;
}

const BAND_OPACITY = 0.16;
const LIST_ROW_PX = 16;
const MAX_LIST_ROWS = 40;

interface Rect {
  x0: number;
  y0: number;
  x1: number;
  y1: number;
}
const overlaps = (a: Rect, b: Rect): boolean => a.x0 < b.x1 && b.x0 < a.x1 && a.y0 < b.y1 && b.y0 < a.y1;

export function keepInPlot(opts: KeepInPlotOptions): string {
  const widthPx = opts.widthPx ?? 760;
  const plotHeightPx = opts.heightPx ?? 380;
  const L = finite(opts.limitNs, 'limitNs');
  const x = Array.from(opts.xMs, (v, k) => finite(v, `xMs[${k}]`));
  if (x.length < 2) throw new InternalError('keep-in plot needs at least two samples');
  const curves = opts.curves.map((c, i) => {
    if (c.y.length !== x.length || c.halfWidth.length !== x.length) throw new InternalError(`curve ${i} has ${c.y.length} values for ${x.length} times`);
    const y = Array.from(c.y, (v, k) => finite(v, `curves[${i}].y[${k}]`));
    const h = Array.from(c.halfWidth, (v, k) => finite(v, `curves[${i}].halfWidth[${k}]`));
    return { label: c.label, y, h };
  });

  // y range: the curves and the limits (bands are clipped, they may grow far out).
  let yMin = -L;
  let yMax = L;
  for (const c of curves) for (const v of c.y) { yMin = Math.min(yMin, v); yMax = Math.max(yMax, v); }
  const pad = 0.08 * (yMax - yMin);
  const ySc = d3().scaleLinear().domain([yMin - pad, yMax + pad]).nice(6);
  const yTicks = ySc.ticks(6);
  const yStep = yTicks.length > 1 ? Math.abs(yTicks[1] - yTicks[0]) : 1;
  const yMaxAbs = Math.max(...yTicks.map(Math.abs), 0);
  const yLabels = yTicks.map((t) => formatTick(t, yStep, yMaxAbs));

  const legendItems: LegendItem[] = curves.map((c, i) => ({ label: `${c.label} (band: 95 %)`, swatch: (sx, sy) => `<rect x="${n(sx)}" y="${n(sy - 6)}" width="24" height="12" fill="${colour(i)}" fill-opacity="${BAND_OPACITY}"/>${lineSwatch(i, false)(sx, sy)}` }));
  if (opts.passes.length > 0) legendItems.push({ label: 'adjustment pass', swatch: (sx, sy) => `<rect x="${n(sx)}" y="${n(sy - 6)}" width="24" height="12" fill="${SHADE}"/>` });
  const left = 18 + FONT_PX + 8 + Math.max(...yLabels.map((l) => textWidthPx(l)), 10) + 6;
  const legend = legendLayout(legendItems, widthPx, left);
  const listRows = Math.min(opts.marks.length, MAX_LIST_ROWS) + (opts.marks.length > MAX_LIST_ROWS ? 1 : 0);
  const f = { left, top: 32, right: widthPx - 20, bottom: plotHeightPx - 58 - legend.rows * 18 };
  if (f.bottom - f.top < 60) throw new InternalError(`plot "${opts.title}" too small for its legend`);
  const heightPx = plotHeightPx + (listRows > 0 ? 10 + listRows * LIST_ROW_PX : 0);
  ySc.range([f.bottom, f.top]);
  const xMin = x[0];
  const xMax = x[x.length - 1] > xMin ? x[x.length - 1] : xMin + 3_600_000;
  const xSc = d3().scaleLinear().domain([xMin, xMax]).range([f.left, f.right]);
  const plotW = f.right - f.left;

  const clipId = contentId('tpk', [opts.title, String(x.length), String(x[0]), ...curves.map((c) => `${c.label}:${c.y[0]}`)]);
  const out: string[] = [svgOpen(widthPx, heightPx, opts.title)];
  out.push(`<defs><clipPath id="${clipId}"><rect x="${n(f.left)}" y="${n(f.top)}" width="${n(plotW)}" height="${n(f.bottom - f.top)}"/></clipPath></defs>`);
  out.push(`<g clip-path="url(#${clipId})">`);
  for (const p of opts.passes) {
    const x0 = xSc(finite(p.fromMs, 'pass start'));
    const x1 = xSc(finite(p.toMs, 'pass end'));
    out.push(`<rect x="${n(x0)}" y="${n(f.top)}" width="${n(Math.max(1.5, x1 - x0))}" height="${n(f.bottom - f.top)}" fill="${SHADE}"/>`);
  }
  out.push('</g>');
  for (const t of timeTicks(xMin, xMax, Math.max(2, Math.floor(plotW / 80)))) {
    const tx = xSc(t.ms);
    out.push(`<line x1="${n(tx)}" y1="${n(f.top)}" x2="${n(tx)}" y2="${n(f.bottom)}" stroke="${GRID}"/>`, `<line x1="${n(tx)}" y1="${n(f.bottom)}" x2="${n(tx)}" y2="${n(f.bottom + 5)}" stroke="${AXIS}"/>`, edgeText(tx, f.bottom + 18, t.line1, widthPx));
    if (t.line2) out.push(edgeText(tx, f.bottom + 32, t.line2, widthPx, ` fill="${AXIS}"`));
  }
  yTicks.forEach((t, i) => {
    const ty = ySc(t);
    out.push(`<line x1="${n(f.left)}" y1="${n(ty)}" x2="${n(f.right)}" y2="${n(ty)}" stroke="${GRID}"/>`, `<line x1="${n(f.left - 5)}" y1="${n(ty)}" x2="${n(f.left)}" y2="${n(ty)}" stroke="${AXIS}"/>`, `<text x="${n(f.left - 8)}" y="${n(ty + 4)}" text-anchor="end">${escapeXml(yLabels[i])}</text>`);
  });
  out.push(`<rect x="${n(f.left)}" y="${n(f.top)}" width="${n(plotW)}" height="${n(f.bottom - f.top)}" fill="none" stroke="${AXIS}"/>`);

  out.push(`<g clip-path="url(#${clipId})">`);
  // Bands (decimated by keeping each bucket's extremes of both edges). About one point per pixel of
  // width keeps every peak visible and the six plots of a report in tens of kB, not a megabyte.
  const maxPoints = Math.round(widthPx);
  curves.forEach((c, i) => {
    const hi = decimateMinMax(x, c.y.map((v, k) => v + c.h[k]), maxPoints);
    const lo = decimateMinMax(x, c.y.map((v, k) => v - c.h[k]), maxPoints);
    let d = '';
    for (let k = 0; k < hi.x.length; k++) d += `${k === 0 ? 'M' : 'L'}${n(xSc(hi.x[k]))},${n(ySc(clampY(hi.y[k], ySc)))}`;
    for (let k = lo.x.length - 1; k >= 0; k--) d += `L${n(xSc(lo.x[k]))},${n(ySc(clampY(lo.y[k], ySc)))}`;
    out.push(`<path d="${d}Z" fill="${colour(i)}" fill-opacity="${BAND_OPACITY}" stroke="none"/>`);
  });
  for (const y of [L, -L]) out.push(`<line x1="${n(f.left)}" y1="${n(ySc(y))}" x2="${n(f.right)}" y2="${n(ySc(y))}" stroke="${LIMIT}" stroke-width="1.2" stroke-dasharray="7 4"/>`);
  curves.forEach((c, i) => {
    const dec = decimateMinMax(x, c.y, maxPoints);
    let d = '';
    for (let k = 0; k < dec.x.length; k++) d += `${k === 0 ? 'M' : 'L'}${n(xSc(dec.x[k]))},${n(ySc(clampY(dec.y[k], ySc)))}`;
    out.push(`<path d="${d}" fill="none" stroke="${colour(i)}" stroke-width="1.6" stroke-linejoin="round"/>`);
  });
  out.push('</g>');

  // Limit labels first: the adjustment numbers must avoid them.
  const taken: Rect[] = [];
  for (const [y, label] of [[L, `+${fmt(L)} ns limit`], [-L, `${fmtSigned(-L)} ns limit`]] as const) {
    const ly = ySc(y) + (y > 0 ? -5 : 14);
    const w = textWidthPx(label);
    taken.push({ x0: f.right - 6 - w, y0: ly - FONT_PX, x1: f.right - 6, y1: ly + 3 });
    out.push(`<text x="${n(f.right - 6)}" y="${n(ly)}" text-anchor="end" fill="${LIMIT}" stroke="#fff" stroke-width="3" paint-order="stroke">${escapeXml(label)}</text>`);
  }
  // Numbered markers; a number goes in the first free spot around its marker, or nowhere.
  opts.marks.forEach((m, i) => {
    const mx = xSc(finite(m.xMs, `marks[${i}].xMs`));
    const my = ySc(clampY(finite(m.y, `marks[${i}].y`), ySc));
    taken.push({ x0: mx - 4, y0: my - 4, x1: mx + 4, y1: my + 4 });
    out.push(`<circle cx="${n(mx)}" cy="${n(my)}" r="4" fill="#fff" stroke="${INK}" stroke-width="1.5"/>`);
  });
  opts.marks.forEach((m, i) => {
    const label = String(i + 1);
    const w = textWidthPx(label) + 2;
    const mx = xSc(m.xMs);
    const my = ySc(clampY(m.y, ySc));
    const spots: Rect[] = [
      { x0: mx - w / 2, y0: my - 8 - FONT_PX, x1: mx + w / 2, y1: my - 6 },
      { x0: mx - w / 2, y0: my + 7, x1: mx + w / 2, y1: my + 9 + FONT_PX },
      { x0: mx + 7, y0: my - FONT_PX / 2, x1: mx + 7 + w, y1: my + FONT_PX / 2 + 2 },
      { x0: mx - 7 - w, y0: my - FONT_PX / 2, x1: mx - 7, y1: my + FONT_PX / 2 + 2 },
      { x0: mx - w / 2, y0: my - 22 - FONT_PX, x1: mx + w / 2, y1: my - 20 },
      { x0: mx - w / 2, y0: my + 21, x1: mx + w / 2, y1: my + 23 + FONT_PX },
    ];
    const spot = spots.find((s) => s.x0 >= f.left && s.x1 <= f.right && s.y0 >= f.top && s.y1 <= f.bottom && !taken.some((t) => overlaps(s, t)));
    if (spot === undefined) return;
    taken.push(spot);
    out.push(`<text x="${n((spot.x0 + spot.x1) / 2)}" y="${n(spot.y1 - 3)}" text-anchor="middle" font-weight="bold" stroke="#fff" stroke-width="3" paint-order="stroke">${label}</text>`);
  });

  const xTitleY = f.bottom + 48;
  out.push(`<text x="${n((f.left + f.right) / 2)}" y="${n(xTitleY)}" text-anchor="middle">${escapeXml(axisTitle({ label: 'Time', unit: 'UTC' }))}</text>`);
  out.push(`<text transform="translate(${n(16)},${n((f.top + f.bottom) / 2)}) rotate(-90)" text-anchor="middle">${escapeXml(axisTitle({ label: 'Clock offset', unit: 'ns' }))}</text>`);
  out.push(legend.place(xTitleY + 20));
  // The list of adjustments under the plot.
  const listTop = plotHeightPx + 6;
  opts.marks.slice(0, MAX_LIST_ROWS).forEach((m, i) => {
    out.push(`<text x="${n(left)}" y="${n(listTop + (i + 1) * LIST_ROW_PX - 4)}"><tspan font-weight="bold">${i + 1}</tspan>  ${escapeXml(clip(m.text, Math.floor((widthPx - left - 30) / (0.6 * FONT_PX))))}</text>`);
  });
  if (opts.marks.length > MAX_LIST_ROWS) out.push(`<text x="${n(left)}" y="${n(listTop + (MAX_LIST_ROWS + 1) * LIST_ROW_PX - 4)}">… and ${opts.marks.length - MAX_LIST_ROWS} more (see the plan table)</text>`);
  out.push('</svg>');
  return out.join('');
}

/** Keep a value inside the axis domain (so clipped shapes stay finite and near the frame). */
function clampY(v: number, sc: { domain(): number[] }): number {
  const [a, b] = sc.domain();
  const span = b - a;
  return Math.max(a - span, Math.min(b + span, v));
}

function fmt(v: number): string {
  return Number.isInteger(v) ? String(v) : v.toFixed(1);
}
function fmtSigned(v: number): string {
  return v < 0 ? `\u2212${fmt(-v)}` : `+${fmt(v)}`;
}
