/**
 * Inline SVG figures for the HTML report. Pure functions: numbers in, an `<svg>` string out.
 * No scripts, no external references, every user string through {@link escapeXml}.
 *
 * Time axes take x as **UTC milliseconds since 1970-01-01T00:00:00Z** (POSIX count, leap
 * seconds not counted), the same number `Date.UTC` gives; use {@link utcMsFromMjdUtc} with
 * `TimeSystem#mjdUtc(instant)` to get it. A leap second is only a label question here: a
 * point inside one is drawn at the start of the next second.
 */
import { scaleLinear, scaleLog } from 'd3-scale';
import { InternalError } from '../errors.ts';

// ---------------------------------------------------------------------------------------------
// Option types

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

/** An axis title and its unit; the unit is shown in brackets, e.g. `Clock offset [ns]`. */
export interface AxisSpec {
  label: string;
  unit: string;
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

/** One stability curve: averaging times, deviations and optional 1-sigma-style error bars. */
export interface LogLogSeries {
  label: string;
  /** Averaging time τ in s (or whatever the x axis unit says); all > 0. */
  x: ArrayLike<number>;
  /** Deviation (dimensionless Allan-type deviation, or the y axis unit); all > 0. */
  y: ArrayLike<number>;
  /** Lower and upper ends of the error bar at each point, same unit as y; both > 0. */
  yLow?: ArrayLike<number>;
  yHigh?: ArrayLike<number>;
}

/** Options for {@link logLogPlot}. */
export interface LogLogPlotOptions {
  title: string;
  xAxis: AxisSpec;
  yAxis: AxisSpec;
  series: LogLogSeries[];
  widthPx?: number;
  heightPx?: number;
}

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
}

// ---------------------------------------------------------------------------------------------
// Small helpers

/** Escape text for SVG/XML content and attribute values (`& < > " '`). */
export function escapeXml(text: string): string {
  return String(text)
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&#39;');
}

/** UTC ms since 1970 from an MJD in UTC (as `TimeSystem#mjdUtc` returns). */
export function utcMsFromMjdUtc(mjdUtc: number): number {
  return (finite(mjdUtc, 'mjdUtc') - 40587) * 86_400_000;
}

function finite(v: number, what: string): number {
  if (typeof v !== 'number' || !Number.isFinite(v)) throw new InternalError(`plot input ${what} is not finite: ${v}`, what);
  return v;
}

/** Coordinate to text: finite or InternalError, two decimals, no "-0". */
function n(v: number): string {
  if (!Number.isFinite(v)) throw new InternalError(`non-finite SVG coordinate: ${v}`, 'svg coordinate');
  const r = Math.round(v * 100) / 100;
  return Object.is(r, -0) ? '0' : String(r);
}

const FONT_PX = 12;

/** Rough advance width of a sans-serif string, for layout only. */
function textWidthPx(s: string, fontPx = FONT_PX): number {
  return [...s].length * 0.6 * fontPx;
}

/** Shorten a label to at most `maxChars` characters (before escaping). */
function clip(s: string, maxChars: number): string {
  const chars = [...String(s)];
  return chars.length <= maxChars ? chars.join('') : chars.slice(0, Math.max(1, maxChars - 1)).join('') + '…';
}

/** Restrained palette: distinct in colour and, for print, in dash pattern. */
const PALETTE = ['#2b5c8a', '#b0502a', '#3f7f3f', '#7a4d8c', '#8a7a2b', '#2f7f86', '#8c3b5c', '#555555'];
const DASHES = ['', '6 3', '2 3', '8 3 2 3'];
const INK = '#222';
const GRID = '#e4e4e4';
const AXIS = '#666';
const SHADE = '#dfe9f3';
const LIMIT = '#a33';

function colour(i: number): string {
  return PALETTE[i % PALETTE.length];
}
function dash(i: number): string {
  return DASHES[Math.floor(i / PALETTE.length) % DASHES.length];
}

function axisTitle(a: AxisSpec): string {
  return a.unit.trim() === '' ? a.label : `${a.label} [${a.unit}]`;
}

/** Stable id from content, so several figures on one page never share a clip path id. */
function contentId(prefix: string, parts: string[]): string {
  let h = 0x811c9dc5;
  for (const p of parts) {
    for (let i = 0; i < p.length; i++) {
      h ^= p.charCodeAt(i);
      h = Math.imul(h, 0x01000193) >>> 0;
    }
    h ^= 0x2c;
  }
  return `${prefix}${h.toString(36)}`;
}

// ---------------------------------------------------------------------------------------------
// Number and time tick labels

const MINUS = '\u2212';

/** Tick label for linear ticks with spacing `stepAbs`: fixed decimals, or exponent form for very large/small values. */
export function formatTick(v: number, stepAbs: number, maxAbs: number): string {
  finite(v, 'tick');
  if (v === 0) return '0';
  const useExp = maxAbs >= 1e6 || (maxAbs > 0 && maxAbs < 1e-3);
  let s: string;
  if (useExp) {
    // Mantissa digits enough to tell neighbouring ticks apart.
    const expMax = Math.floor(Math.log10(maxAbs));
    const digits = Math.max(0, Math.min(6, expMax - Math.floor(Math.log10(stepAbs))));
    const exp = Math.floor(Math.log10(Math.abs(v)));
    const mant = v / 10 ** exp;
    s = `${mant.toFixed(Math.max(0, digits - (expMax - exp)))}e${exp}`;
  } else {
    // Fewest decimals that show the step exactly (0.25 needs 2, 0.5 needs 1).
    let decimals = 0;
    while (decimals < 6 && Math.abs(Math.round(stepAbs * 10 ** decimals) - stepAbs * 10 ** decimals) > 1e-6 * stepAbs * 10 ** decimals) decimals++;
    s = v.toFixed(decimals);
  }
  return s.replace(/-/g, MINUS);
}

function pad2(v: number): string {
  return v < 10 ? `0${v}` : String(v);
}

/** `YYYY-MM-DD` of a UTC ms count. */
export function utcDateLabel(ms: number): string {
  const d = new Date(finite(ms, 'time'));
  return `${d.getUTCFullYear()}-${pad2(d.getUTCMonth() + 1)}-${pad2(d.getUTCDate())}`;
}

/** `HH:MM` of a UTC ms count. */
export function utcClockLabel(ms: number): string {
  const d = new Date(finite(ms, 'time'));
  return `${pad2(d.getUTCHours())}:${pad2(d.getUTCMinutes())}`;
}

const MIN_MS = 60_000;
const HOUR_MS = 3_600_000;
const DAY_MS = 86_400_000;
const TIME_STEPS_MS = [
  MIN_MS, 2 * MIN_MS, 5 * MIN_MS, 10 * MIN_MS, 15 * MIN_MS, 30 * MIN_MS,
  HOUR_MS, 2 * HOUR_MS, 3 * HOUR_MS, 6 * HOUR_MS, 12 * HOUR_MS,
  DAY_MS, 2 * DAY_MS, 5 * DAY_MS, 7 * DAY_MS, 10 * DAY_MS, 15 * DAY_MS,
];

/** One tick of a UTC time axis, at `ms` (UTC ms since 1970). */
export interface TimeTick {
  ms: number;
  /** First line: clock time below a day step, the date otherwise. */
  line1: string;
  /** Second line: the date where the day changes (and at the first tick); empty otherwise. */
  line2: string;
}

/** UTC-aligned ticks between `fromMs` and `toMs`, at most `maxTicks`, with labels. */
export function timeTicks(fromMs: number, toMs: number, maxTicks: number): TimeTick[] {
  finite(fromMs, 'time axis start');
  finite(toMs, 'time axis end');
  const span = Math.max(toMs - fromMs, 1);
  if (span / maxTicks > 20 * DAY_MS) return monthTicks(fromMs, toMs, maxTicks);
  const step = TIME_STEPS_MS.find((s) => span / s <= Math.max(2, maxTicks)) ?? 365 * DAY_MS * Math.ceil(span / (365 * DAY_MS * maxTicks));
  const first = Math.ceil(fromMs / step) * step; // multiples of the step from 1970 fall on whole UTC hours/days
  const ticks: TimeTick[] = [];
  let lastDate = '';
  for (let k = 0, t = first; t <= toMs + 1e-6 && k < 1000; k++, t = first + k * step) {
    const date = utcDateLabel(t);
    if (step >= DAY_MS) {
      ticks.push({ ms: t, line1: date, line2: '' });
    } else {
      ticks.push({ ms: t, line1: utcClockLabel(t), line2: date !== lastDate ? date : '' });
    }
    lastDate = date;
  }
  return ticks;
}

/** Ticks on the first of whole months (1, 2, 3, 6 or 12 months apart) for long spans. */
function monthTicks(fromMs: number, toMs: number, maxTicks: number): TimeTick[] {
  const d0 = new Date(fromMs);
  const m0 = d0.getUTCFullYear() * 12 + d0.getUTCMonth() + (fromMs > Date.UTC(d0.getUTCFullYear(), d0.getUTCMonth(), 1) ? 1 : 0);
  const d1 = new Date(toMs);
  const m1 = d1.getUTCFullYear() * 12 + d1.getUTCMonth();
  const months = Math.max(1, m1 - m0 + 1);
  const stepM = [1, 2, 3, 6, 12].find((k) => months / k <= maxTicks) ?? 12 * Math.ceil(months / (12 * maxTicks));
  const first = Math.ceil(m0 / stepM) * stepM; // Jan/Apr/Jul/Oct for 3-month steps
  const ticks: TimeTick[] = [];
  for (let m = first; m <= m1 && ticks.length < 1000; m += stepM) {
    const ms = Date.UTC(Math.floor(m / 12), m % 12, 1);
    if (ms <= toMs) ticks.push({ ms, line1: utcDateLabel(ms), line2: '' });
  }
  return ticks;
}

// ---------------------------------------------------------------------------------------------
// Decimation

/**
 * Keep at most about `maxPoints` points of an x-ordered series: split it into buckets by index and keep
 * each bucket's minimum and maximum y (in x order), plus the first and last points, so peaks survive.
 */
export function decimateMinMax(x: ArrayLike<number>, y: ArrayLike<number>, maxPoints: number): { x: number[]; y: number[] } {
  const len = x.length;
  if (len <= maxPoints) return { x: Array.from(x), y: Array.from(y) };
  const buckets = Math.max(1, Math.floor((maxPoints - 2) / 2));
  const ox: number[] = [x[0]];
  const oy: number[] = [y[0]];
  for (let b = 0; b < buckets; b++) {
    const i0 = 1 + Math.floor((b * (len - 2)) / buckets);
    const i1 = 1 + Math.floor(((b + 1) * (len - 2)) / buckets);
    if (i1 <= i0) continue;
    let iMin = i0;
    let iMax = i0;
    for (let i = i0 + 1; i < i1; i++) {
      if (y[i] < y[iMin]) iMin = i;
      if (y[i] > y[iMax]) iMax = i;
    }
    const [a, c] = iMin <= iMax ? [iMin, iMax] : [iMax, iMin];
    ox.push(x[a]);
    oy.push(y[a]);
    if (c !== a) {
      ox.push(x[c]);
      oy.push(y[c]);
    }
  }
  ox.push(x[len - 1]);
  oy.push(y[len - 1]);
  return { x: ox, y: oy };
}

// ---------------------------------------------------------------------------------------------
// Shared frame: title, legend, grid

interface Frame {
  left: number;
  top: number;
  right: number;
  bottom: number;
}

function svgOpen(widthPx: number, heightPx: number, title: string): string {
  const t = escapeXml(title);
  return (
    `<svg xmlns="http://www.w3.org/2000/svg" class="tp-fig" width="${n(widthPx)}" height="${n(heightPx)}" ` +
    `viewBox="0 0 ${n(widthPx)} ${n(heightPx)}" role="img" aria-label="${t}" ` +
    `font-family="'DejaVu Sans', 'Liberation Sans', Arial, sans-serif" font-size="${FONT_PX}" fill="${INK}">` +
    `<title>${t}</title>` +
    `<rect x="0" y="0" width="${n(widthPx)}" height="${n(heightPx)}" fill="#fff"/>` +
    `<text x="${n(widthPx / 2)}" y="18" text-anchor="middle" font-size="14" font-weight="bold">${escapeXml(clip(title, Math.floor(widthPx / 8.5)))}</text>`
  );
}

interface LegendItem {
  label: string;
  swatch: (x: number, y: number) => string;
}

/** Legend laid out in rows under the plot; returns the markup and the height it needs. */
function legendLayout(items: LegendItem[], widthPx: number, leftPx: number): { rows: number; place: (y: number) => string } {
  const maxChars = 48;
  const placed: { item: LegendItem; col: number; row: number }[] = [];
  let row = 0;
  let x = leftPx;
  for (const item of items) {
    const w = 34 + textWidthPx(clip(item.label, maxChars)) + 18;
    if (x + w > widthPx - 8 && x > leftPx) {
      row++;
      x = leftPx;
    }
    placed.push({ item, col: x, row });
    x += w;
  }
  return {
    rows: items.length === 0 ? 0 : row + 1,
    place: (y0: number) =>
      placed
        .map(({ item, col, row: r }) => {
          const y = y0 + r * 18;
          return `<g>${item.swatch(col, y)}<text x="${n(col + 30)}" y="${n(y + 4)}">${escapeXml(clip(item.label, maxChars))}</text></g>`;
        })
        .join(''),
  };
}

function lineSwatch(i: number, withMarker: boolean): (x: number, y: number) => string {
  return (x, y) =>
    `<line x1="${n(x)}" y1="${n(y)}" x2="${n(x + 24)}" y2="${n(y)}" stroke="${colour(i)}" stroke-width="2"${dash(i) ? ` stroke-dasharray="${dash(i)}"` : ''}/>` +
    (withMarker ? `<circle cx="${n(x + 12)}" cy="${n(y)}" r="3" fill="${colour(i)}"/>` : '');
}

/** Tick label centred on `x`, shifted to stay inside the figure near its left and right edges. */
function edgeText(x: number, y: number, text: string, widthPx: number, extra = ''): string {
  const half = textWidthPx(text) / 2;
  let anchor = 'middle';
  let at = x;
  if (x + half > widthPx - 2) { anchor = 'end'; at = Math.min(x + half, widthPx - 2); }
  else if (x - half < 2) { anchor = 'start'; at = Math.max(x - half, 2); }
  return `<text x="${n(at)}" y="${n(y)}" text-anchor="${anchor}"${extra}>${escapeXml(text)}</text>`;
}

// ---------------------------------------------------------------------------------------------
// Line plot

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
  const ySc = scaleLinear().domain([yMin, yMax]);
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
    const lin = scaleLinear().domain([xMin, xMax]).range([f.left, f.right]);
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
    const lin = scaleLinear().domain([xMin, xMax]);
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

// ---------------------------------------------------------------------------------------------
// Log-log plot

function logTicks(lo: number, hi: number): { major: number[]; minor: number[] } {
  const e0 = Math.floor(Math.log10(lo) + 1e-9);
  const e1 = Math.ceil(Math.log10(hi) - 1e-9);
  const major: number[] = [];
  const minor: number[] = [];
  for (let e = e0; e <= e1; e++) {
    major.push(10 ** e);
    if (e < e1) for (let m = 2; m <= 9; m++) minor.push(m * 10 ** e);
  }
  return { major, minor };
}

/** Log tick label for m·10^e: plain for 0.001 … 1000, else `10` (or `m×10`) with a superscript exponent. */
function powerLabel(v: number, x: number, y: number, anchor: string): string {
  const e = Math.floor(Math.log10(v) + 1e-9);
  const m = Math.round(v / 10 ** e);
  if (e >= -3 && e <= 3) {
    const s = e < 0 ? v.toFixed(-e) : String(Math.round(v));
    return `<text x="${n(x)}" y="${n(y)}" text-anchor="${anchor}">${escapeXml(s)}</text>`;
  }
  const exp = e < 0 ? `${MINUS}${-e}` : String(e);
  return `<text x="${n(x)}" y="${n(y)}" text-anchor="${anchor}">${m === 1 ? '' : `${m}×`}10<tspan dy="-5" font-size="9">${escapeXml(exp)}</tspan></text>`;
}

/** With two decades or fewer, the 2 and 5 minor ticks get labels too. */
function labelledMinor(majorCount: number, minor: number[]): number[] {
  if (majorCount > 3) return [];
  return minor.filter((v) => {
    const m = Math.round(v / 10 ** Math.floor(Math.log10(v) + 1e-9));
    return m === 2 || m === 5;
  });
}

/**
 * Log-log plot for stability: deviation vs averaging time, points joined by thin lines, optional
 * vertical error bars. All x, y, yLow, yHigh must be finite and > 0 (InternalError otherwise).
 */
export function logLogPlot(opts: LogLogPlotOptions): string {
  const widthPx = opts.widthPx ?? 760;
  const heightPx = opts.heightPx ?? 420;
  const pos = (v: number, what: string) => {
    finite(v, what);
    if (v <= 0) throw new InternalError(`log-axis value ${what} is not > 0: ${v}`, what);
    return v;
  };
  let xMin = Infinity, xMax = -Infinity, yMin = Infinity, yMax = -Infinity;
  const series = opts.series.map((s, i) => {
    if (s.x.length !== s.y.length) throw new InternalError(`series ${i} has ${s.x.length} x values but ${s.y.length} y values`);
    const x = Array.from(s.x, (v, k) => pos(v, `series[${i}].x[${k}]`));
    const y = Array.from(s.y, (v, k) => pos(v, `series[${i}].y[${k}]`));
    const lo = s.yLow ? Array.from(s.yLow, (v, k) => pos(v, `series[${i}].yLow[${k}]`)) : undefined;
    const hi = s.yHigh ? Array.from(s.yHigh, (v, k) => pos(v, `series[${i}].yHigh[${k}]`)) : undefined;
    if ((lo && lo.length !== x.length) || (hi && hi.length !== x.length)) throw new InternalError(`series ${i} error bars do not match its points`);
    for (let k = 0; k < x.length; k++) {
      xMin = Math.min(xMin, x[k]); xMax = Math.max(xMax, x[k]);
      yMin = Math.min(yMin, y[k], lo?.[k] ?? Infinity); yMax = Math.max(yMax, y[k], hi?.[k] ?? -Infinity);
    }
    return { label: s.label, x, y, lo, hi };
  });
  if (!Number.isFinite(xMin)) { xMin = 1; xMax = 10; }
  if (!Number.isFinite(yMin)) { yMin = 1; yMax = 10; }
  const xs = scaleLog().domain([xMin, xMax === xMin ? xMin * 10 : xMax]).nice();
  const ys = scaleLog().domain([yMin, yMax === yMin ? yMin * 10 : yMax]).nice();
  const [xLo, xHi] = xs.domain() as [number, number];
  const [yLo, yHi] = ys.domain() as [number, number];

  const legend = legendLayout(series.map((s, i) => ({ label: s.label, swatch: lineSwatch(i, true) })), widthPx, 80);
  const f: Frame = { left: 80, top: 32, right: widthPx - 20, bottom: heightPx - 50 - legend.rows * 18 };
  xs.range([f.left, f.right]);
  ys.range([f.bottom, f.top]);
  const xt = logTicks(xLo, xHi);
  const yt = logTicks(yLo, yHi);
  // Label every other decade when decades are crowded.
  const xEvery = Math.ceil(xt.major.length / Math.max(2, Math.floor((f.right - f.left) / 56)));
  const yEvery = Math.ceil(yt.major.length / Math.max(2, Math.floor((f.bottom - f.top) / 28)));

  const out: string[] = [svgOpen(widthPx, heightPx, opts.title)];
  for (const v of xt.minor) out.push(`<line x1="${n(xs(v))}" y1="${n(f.top)}" x2="${n(xs(v))}" y2="${n(f.bottom)}" stroke="#f1f1f1"/>`);
  for (const v of yt.minor) out.push(`<line x1="${n(f.left)}" y1="${n(ys(v))}" x2="${n(f.right)}" y2="${n(ys(v))}" stroke="#f1f1f1"/>`);
  xt.major.forEach((v, i) => {
    const x = xs(v);
    out.push(`<line x1="${n(x)}" y1="${n(f.top)}" x2="${n(x)}" y2="${n(f.bottom)}" stroke="${GRID}"/><line x1="${n(x)}" y1="${n(f.bottom)}" x2="${n(x)}" y2="${n(f.bottom + 5)}" stroke="${AXIS}"/>`);
    if (i % xEvery === 0) out.push(powerLabel(v, x, f.bottom + 20, 'middle'));
  });
  yt.major.forEach((v, i) => {
    const y = ys(v);
    out.push(`<line x1="${n(f.left)}" y1="${n(y)}" x2="${n(f.right)}" y2="${n(y)}" stroke="${GRID}"/><line x1="${n(f.left - 5)}" y1="${n(y)}" x2="${n(f.left)}" y2="${n(y)}" stroke="${AXIS}"/>`);
    if (i % yEvery === 0) out.push(powerLabel(v, f.left - 8, y + 4, 'end'));
  });
  for (const v of labelledMinor(xt.major.length, xt.minor)) out.push(powerLabel(v, xs(v), f.bottom + 20, 'middle'));
  for (const v of labelledMinor(yt.major.length, yt.minor)) out.push(powerLabel(v, f.left - 8, ys(v) + 4, 'end'));
  out.push(`<rect x="${n(f.left)}" y="${n(f.top)}" width="${n(f.right - f.left)}" height="${n(f.bottom - f.top)}" fill="none" stroke="${AXIS}"/>`);
  series.forEach((s, i) => {
    const c = colour(i);
    if (s.x.length > 1) {
      let d = '';
      for (let k = 0; k < s.x.length; k++) d += `${k === 0 ? 'M' : 'L'}${n(xs(s.x[k]))},${n(ys(s.y[k]))}`;
      out.push(`<path d="${d}" fill="none" stroke="${c}" stroke-width="1.2"${dash(i) ? ` stroke-dasharray="${dash(i)}"` : ''}/>`);
    }
    for (let k = 0; k < s.x.length; k++) {
      const x = xs(s.x[k]);
      if (s.lo || s.hi) {
        const y0 = ys(s.lo?.[k] ?? s.y[k]);
        const y1 = ys(s.hi?.[k] ?? s.y[k]);
        out.push(`<path d="M${n(x)},${n(y0)}L${n(x)},${n(y1)}M${n(x - 3)},${n(y0)}L${n(x + 3)},${n(y0)}M${n(x - 3)},${n(y1)}L${n(x + 3)},${n(y1)}" stroke="${c}" stroke-width="1"/>`);
      }
      out.push(`<circle cx="${n(x)}" cy="${n(ys(s.y[k]))}" r="3" fill="${c}"/>`);
    }
  });
  out.push(`<text x="${n((f.left + f.right) / 2)}" y="${n(f.bottom + 40)}" text-anchor="middle">${escapeXml(axisTitle(opts.xAxis))}</text>`);
  out.push(`<text transform="translate(${n(18)},${n((f.top + f.bottom) / 2)}) rotate(-90)" text-anchor="middle">${escapeXml(axisTitle(opts.yAxis))}</text>`);
  out.push(legend.place(f.bottom + 62));
  out.push('</svg>');
  return out.join('');
}

// ---------------------------------------------------------------------------------------------
// Timeline

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

  const rowH = 26;
  const rowLabels = rows.map((r) => clip(r, 24));
  const left = Math.max(60, Math.max(0, ...rowLabels.map((r) => textWidthPx(r))) + 18);
  const legend = legendLayout(
    groups.map((g, i) => ({ label: g, swatch: (x: number, y: number) => `<rect x="${n(x)}" y="${n(y - 6)}" width="24" height="12" rx="2" fill="${colour(i)}"/>` })),
    widthPx,
    left,
  );
  const f: Frame = { left, top: 32, right: widthPx - 20, bottom: 32 + Math.max(1, rows.length) * rowH };
  const heightPx = f.bottom + 58 + (legend.rows > 0 ? legend.rows * 18 + 8 : 0);
  const xs = scaleLinear().domain([fromMs, toMs]).range([f.left, f.right]);

  const out: string[] = [svgOpen(widthPx, heightPx, opts.title)];
  rows.forEach((r, i) => {
    const y = f.top + i * rowH;
    if (i % 2 === 1) out.push(`<rect x="${n(f.left)}" y="${n(y)}" width="${n(f.right - f.left)}" height="${rowH}" fill="#f6f6f6"/>`);
    out.push(`<text x="${n(f.left - 8)}" y="${n(y + rowH / 2 + 4)}" text-anchor="end">${escapeXml(rowLabels[i])}</text>`);
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
    const y = f.top + i * rowH + 5;
    const c = b.group !== undefined ? colour(groups.indexOf(b.group)) : colour(0);
    const tip = `${b.row}${b.label ? ` — ${b.label}` : ''}: ${utcDateLabel(b.fromMs)} ${utcClockLabel(b.fromMs)}–${utcClockLabel(b.toMs)} UTC`;
    out.push(`<g><title>${escapeXml(tip)}</title><rect x="${n(x0)}" y="${n(y)}" width="${n(w)}" height="${rowH - 10}" rx="2" fill="${c}"/>`);
    if (b.label) {
      const text = clip(b.label, 16);
      if (textWidthPx(text, 10) + 6 <= w) out.push(`<text x="${n(x0 + w / 2)}" y="${n(y + rowH / 2)}" text-anchor="middle" font-size="10" fill="#fff">${escapeXml(text)}</text>`);
    }
    out.push('</g>');
  }
  out.push(`<text x="${n((f.left + f.right) / 2)}" y="${n(f.bottom + 48)}" text-anchor="middle">${escapeXml('Time [UTC]')}</text>`);
  out.push(legend.place(f.bottom + 70));
  out.push('</svg>');
  return out.join('');
}
