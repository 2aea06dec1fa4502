/** Line plot over a numeric or UTC time axis, with shaded intervals, limit lines and marked points. */
import { lazyPackage } from '../lazyPackage.ts';
import { InternalError } from '../errors.ts';
import { decimateMinMax } from './svgDecimate.ts';
import { AXIS, axisTitle, clip, colour, contentId, dash, edgeText, escapeXml, finite, FONT_PX, GRID, INK, legendLayout, LIMIT, lineSwatch, n, SHADE, svgOpen, textWidthPx, type AxisSpec, type Frame, type LegendItem } from './svgPrimitives.ts';
import { formatTick, HOUR_MS, timeTicks } from './svgTicks.ts';

const d3 = lazyPackage<typeof import('d3-scale')>('d3-scale');

/** One (x, y) series of a line plot. `x` is in the x axis unit, or UTC ms on a time axis. */
export interface LineSeries {
  label: string;
  x: ArrayLike<number>;
  y: ArrayLike<number>;
  /** Draw markers at each (decimated) point as well as the line. */
  markers?: boolean;
}

/** A shaded x interval such as a ground-station pass, in x units (UTC ms on a time axis). */
export interface XInterval {
  from: number;
  to: number;
  label?: string;
}

/** A labelled horizontal line such as a keep-in limit, at `y` in the y axis unit. */
export interface HLine {
  y: number;
  label: string;
}

/** A labelled point such as a break-even altitude, in axis units. */
export interface MarkedPoint {
  x: number;
  y: number;
  label: string;
}

/** Options for {@link linePlot}. */
export interface LinePlotOptions {
  title: string;
  /** Numeric x axis (default) or a UTC time axis with x in UTC ms. */
  xKind?: 'linear' | 'time';
  /** x axis title and unit; on a time axis defaults to `Time [UTC]`. */
  xAxis?: AxisSpec;
  yAxis: AxisSpec;
  series: LineSeries[];
  shaded?: XInterval[];
  hLines?: HLine[];
  points?: MarkedPoint[];
  /** Force the y range (axis units); otherwise the data, lines and points set it. */
  yDomain?: [number, number];
  /** Force the x range (axis units or UTC ms). */
  xDomain?: [number, number];
  /** Size in px (the SVG scales down with the page). Defaults 760 × 380. */
  widthPx?: number;
  heightPx?: number;
  /** Most points drawn per series; more are decimated keeping each bucket's min and max. */
  maxPointsPerSeries?: number;
}

interface XScale {
  (v: number): number;
}

/**
 * Line plot of several series over a numeric or UTC time x axis, with optional shaded intervals
 * (passes), labelled horizontal lines (keep-in limits) and labelled points (break-even).
 * Throws InternalError on any non-finite input.
 */
export function linePlot(opts: LinePlotOptions): string {
  const widthPx = opts.widthPx ?? 760;
  const heightPx = opts.heightPx ?? 380;
  const maxPts = opts.maxPointsPerSeries ?? 2000;
  const isTime = opts.xKind === 'time';
  const xAxis = opts.xAxis ?? (isTime ? { label: 'Time', unit: 'UTC' } : { label: 'x', unit: '' });

  // Validate and decimate.
  const series = opts.series.map((s, i) => {
    if (s.x.length !== s.y.length) throw new InternalError(`series ${i} has ${s.x.length} x values but ${s.y.length} y values`);
    for (let k = 0; k < s.x.length; k++) {
      finite(s.x[k], `series[${i}].x[${k}]`);
      finite(s.y[k], `series[${i}].y[${k}]`);
    }
    return { ...decimateMinMax(s.x, s.y, maxPts), label: s.label, markers: s.markers ?? false };
  });
  const shaded = (opts.shaded ?? []).map((r, i) => ({ from: finite(r.from, `shaded[${i}].from`), to: finite(r.to, `shaded[${i}].to`), label: r.label }));
  const hLines = (opts.hLines ?? []).map((h, i) => ({ y: finite(h.y, `hLines[${i}].y`), label: h.label }));
  const points = (opts.points ?? []).map((p, i) => ({ x: finite(p.x, `points[${i}].x`), y: finite(p.y, `points[${i}].y`), label: p.label }));

  // Domains.
  let xMin = Infinity, xMax = -Infinity, yMin = Infinity, yMax = -Infinity;
  for (const s of series) for (let k = 0; k < s.x.length; k++) {
    xMin = Math.min(xMin, s.x[k]); xMax = Math.max(xMax, s.x[k]);
    yMin = Math.min(yMin, s.y[k]); yMax = Math.max(yMax, s.y[k]);
  }
  for (const p of points) { xMin = Math.min(xMin, p.x); xMax = Math.max(xMax, p.x); yMin = Math.min(yMin, p.y); yMax = Math.max(yMax, p.y); }
  for (const h of hLines) { yMin = Math.min(yMin, h.y); yMax = Math.max(yMax, h.y); }
  if (opts.xDomain) [xMin, xMax] = [finite(opts.xDomain[0], 'xDomain[0]'), finite(opts.xDomain[1], 'xDomain[1]')];
  if (opts.yDomain) [yMin, yMax] = [finite(opts.yDomain[0], 'yDomain[0]'), finite(opts.yDomain[1], 'yDomain[1]')];
  if (!Number.isFinite(xMin)) { xMin = 0; xMax = 1; }
  if (!Number.isFinite(yMin)) { yMin = 0; yMax = 1; }
  if (xMax === xMin) { xMin -= isTime ? HOUR_MS : Math.abs(xMin) * 0.05 || 1; xMax += isTime ? HOUR_MS : Math.abs(xMax) * 0.05 || 1; }
  if (yMax === yMin) { const d = Math.abs(yMin) * 0.05 || 1; yMin -= d; yMax += d; }

  if (!opts.yDomain) {
    // Headroom so limit lines and extremes do not sit on the frame.
    const padY = 0.04 * (yMax - yMin);
    yMin -= padY;
    yMax += padY;
  }
  const ySc = d3().scaleLinear().domain([yMin, yMax]);
  if (!opts.yDomain) ySc.nice(6);
  const yTicks = ySc.ticks(6);
  const yStep = yTicks.length > 1 ? Math.abs(yTicks[1] - yTicks[0]) : Math.abs(yMax - yMin);
  const yMaxAbs = Math.max(...yTicks.map(Math.abs), 0);
  const yLabels = yTicks.map((t) => formatTick(t, yStep, yMaxAbs));

  // Legend first: its height shrinks the plot.
  const legendItems: LegendItem[] = series.map((s, i) => ({ label: s.label, swatch: lineSwatch(i, s.markers) }));
  if (shaded.length > 0) {
    const shadeLabel = shaded.find((s) => s.label !== undefined)?.label;
    legendItems.push({ label: shadeLabel ?? 'shaded interval', swatch: (x, y) => `<rect x="${n(x)}" y="${n(y - 6)}" width="24" height="12" fill="${SHADE}"/>` });
  }
  const left = 18 + FONT_PX + 8 + Math.max(...yLabels.map((l) => textWidthPx(l)), 10) + 6;
  const legend = legendLayout(legendItems, widthPx, left);
  const f: Frame = { left, top: 32, right: widthPx - 20, bottom: heightPx - (isTime ? 58 : 46) - legend.rows * 18 };
  if (f.bottom - f.top < 60) throw new InternalError(`plot "${opts.title}" too small for its legend`);
  ySc.range([f.bottom, f.top]);

  let xScale: XScale;
  let xTickMarkup = '';
  const plotW = f.right - f.left;
  if (isTime) {
    const lin = d3().scaleLinear().domain([xMin, xMax]).range([f.left, f.right]);
    xScale = (v) => lin(v);
    const ticks = timeTicks(xMin, xMax, Math.max(2, Math.floor(plotW / 80)));
    xTickMarkup = ticks
      .map((t) => {
        const x = lin(t.ms);
        return (
          `<line x1="${n(x)}" y1="${n(f.top)}" x2="${n(x)}" y2="${n(f.bottom)}" stroke="${GRID}"/>` +
          `<line x1="${n(x)}" y1="${n(f.bottom)}" x2="${n(x)}" y2="${n(f.bottom + 5)}" stroke="${AXIS}"/>` +
          edgeText(x, f.bottom + 18, t.line1, widthPx) +
          (t.line2 ? edgeText(x, f.bottom + 32, t.line2, widthPx, ` fill="${AXIS}"`) : '')
        );
      })
      .join('');
  } else {
    const lin = d3().scaleLinear().domain([xMin, xMax]);
    if (!opts.xDomain) lin.nice(8);
    [xMin, xMax] = lin.domain() as [number, number];
    lin.range([f.left, f.right]);
    xScale = (v) => lin(v);
    // Fewer ticks until the labels fit side by side.
    let count = Math.max(2, Math.floor(plotW / 70));
    let ticks = lin.ticks(count);
    for (let guard = 0; guard < 10; guard++) {
      const step = ticks.length > 1 ? Math.abs(ticks[1] - ticks[0]) : 1;
      const maxAbs = Math.max(...ticks.map(Math.abs), 0);
      const widest = Math.max(...ticks.map((t) => textWidthPx(formatTick(t, step, maxAbs))));
      if (ticks.length < 2 || (widest + 12) * ticks.length <= plotW) break;
      count = Math.max(1, Math.floor(count / 2));
      ticks = lin.ticks(count);
    }
    const step = ticks.length > 1 ? Math.abs(ticks[1] - ticks[0]) : Math.abs(xMax - xMin);
    const maxAbs = Math.max(...ticks.map(Math.abs), 0);
    xTickMarkup = ticks
      .map((t) => {
        const x = lin(t);
        return (
          `<line x1="${n(x)}" y1="${n(f.top)}" x2="${n(x)}" y2="${n(f.bottom)}" stroke="${GRID}"/>` +
          `<line x1="${n(x)}" y1="${n(f.bottom)}" x2="${n(x)}" y2="${n(f.bottom + 5)}" stroke="${AXIS}"/>` +
          edgeText(x, f.bottom + 18, formatTick(t, step, maxAbs), widthPx)
        );
      })
      .join('');
  }
  const yTickMarkup = yTicks
    .map((t, i) => {
      const y = ySc(t);
      return (
        `<line x1="${n(f.left)}" y1="${n(y)}" x2="${n(f.right)}" y2="${n(y)}" stroke="${GRID}"/>` +
        `<line x1="${n(f.left - 5)}" y1="${n(y)}" x2="${n(f.left)}" y2="${n(y)}" stroke="${AXIS}"/>` +
        `<text x="${n(f.left - 8)}" y="${n(y + 4)}" text-anchor="end">${escapeXml(yLabels[i])}</text>`
      );
    })
    .join('');

  const clipId = contentId('tpc', [opts.title, ...series.map((s) => `${s.label}:${s.x.length}:${s.x[0]}:${s.y[0]}`)]);
  const out: string[] = [svgOpen(widthPx, heightPx, opts.title)];
  out.push(`<defs><clipPath id="${clipId}"><rect x="${n(f.left)}" y="${n(f.top)}" width="${n(plotW)}" height="${n(f.bottom - f.top)}"/></clipPath></defs>`);

  // Shaded intervals under everything.
  out.push(`<g clip-path="url(#${clipId})">`);
  for (const s of shaded) {
    const x0 = xScale(Math.min(s.from, s.to));
    const x1 = xScale(Math.max(s.from, s.to));
    out.push(`<rect x="${n(x0)}" y="${n(f.top)}" width="${n(Math.max(1, x1 - x0))}" height="${n(f.bottom - f.top)}" fill="${SHADE}"/>`);
  }
  out.push('</g>');
  out.push(xTickMarkup, yTickMarkup);
  out.push(`<rect x="${n(f.left)}" y="${n(f.top)}" width="${n(plotW)}" height="${n(f.bottom - f.top)}" fill="none" stroke="${AXIS}"/>`);

  // Limit lines.
  out.push(`<g clip-path="url(#${clipId})">`);
  for (const h of hLines) {
    const y = ySc(h.y);
    out.push(`<line x1="${n(f.left)}" y1="${n(y)}" x2="${n(f.right)}" y2="${n(y)}" stroke="${LIMIT}" stroke-width="1.2" stroke-dasharray="7 4"/>`);
  }
  // Series.
  series.forEach((s, i) => {
    if (s.x.length === 0) return;
    let d = '';
    for (let k = 0; k < s.x.length; k++) d += `${k === 0 ? 'M' : 'L'}${n(xScale(s.x[k]))},${n(ySc(s.y[k]))}`;
    out.push(`<path d="${d}" fill="none" stroke="${colour(i)}" stroke-width="1.6" stroke-linejoin="round"${dash(i) ? ` stroke-dasharray="${dash(i)}"` : ''}/>`);
    if (s.markers) for (let k = 0; k < s.x.length; k++) out.push(`<circle cx="${n(xScale(s.x[k]))}" cy="${n(ySc(s.y[k]))}" r="2.5" fill="${colour(i)}"/>`);
  });
  out.push('</g>');
  // Labels of limit lines, inside the plot at the right, just above the line (below for the lowest half).
  for (const h of hLines) {
    const y = ySc(h.y);
    if (y < f.top - 0.5 || y > f.bottom + 0.5) continue;
    const below = y < f.top + 16;
    out.push(`<text x="${n(f.right - 6)}" y="${n(below ? y + 14 : y - 5)}" text-anchor="end" fill="${LIMIT}" stroke="#fff" stroke-width="3" paint-order="stroke">${escapeXml(clip(h.label, 40))}</text>`);
  }
  // Marked points.
  for (const p of points) {
    const x = xScale(p.x);
    const y = ySc(p.y);
    const label = clip(p.label, 48);
    const rightSide = x + 10 + textWidthPx(label) < f.right;
    const above = y - 10 > f.top + 4;
    out.push(
      `<circle cx="${n(x)}" cy="${n(y)}" r="4.5" fill="#fff" stroke="${INK}" stroke-width="1.6"/>` +
        `<text x="${n(rightSide ? x + 9 : x - 9)}" y="${n(above ? y - 8 : y + 18)}" text-anchor="${rightSide ? 'start' : 'end'}" stroke="#fff" stroke-width="3" paint-order="stroke">${escapeXml(label)}</text>`,
    );
  }
  // Axis titles.
  const xTitleY = f.bottom + (isTime ? 48 : 36);
  out.push(`<text x="${n((f.left + f.right) / 2)}" y="${n(xTitleY)}" text-anchor="middle">${escapeXml(axisTitle(xAxis))}</text>`);
  out.push(`<text transform="translate(${n(16)},${n((f.top + f.bottom) / 2)}) rotate(-90)" text-anchor="middle">${escapeXml(axisTitle(opts.yAxis))}</text>`);
  out.push(legend.place(xTitleY + 20));
  out.push('</svg>');
  return out.join('');
}
