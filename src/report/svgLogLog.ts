/** Log-log plot for stability curves (deviation against averaging time), with error bars. */
import { lazyPackage } from '../lazyPackage.ts';
import { InternalError } from '../errors.ts';
import { AXIS, axisTitle, colour, dash, escapeXml, finite, GRID, legendLayout, lineSwatch, n, svgOpen, type AxisSpec, type Frame } from './svgPrimitives.ts';
import { labelledMinor, logTicks, powerLabel } from './svgTicks.ts';

const d3 = lazyPackage<typeof import('d3-scale')>('d3-scale');

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
  /** Optional short label drawn above each point (e.g. the identified noise type); null for none. */
  pointLabels?: ArrayLike<string | null>;
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
    return { label: s.label, x, y, lo, hi, tags: s.pointLabels };
  });
  if (!Number.isFinite(xMin)) { xMin = 1; xMax = 10; }
  if (!Number.isFinite(yMin)) { yMin = 1; yMax = 10; }
  const xs = d3().scaleLog().domain([xMin, xMax === xMin ? xMin * 10 : xMax]).nice();
  const ys = d3().scaleLog().domain([yMin, yMax === yMin ? yMin * 10 : yMax]).nice();
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
      const tag = s.tags?.[k];
      if (tag !== undefined && tag !== null) out.push(`<text x="${n(x)}" y="${n(ys(s.hi?.[k] ?? s.y[k]) - 6)}" text-anchor="middle" font-size="10" fill="${c}">${escapeXml(tag)}</text>`);
    }
  });
  out.push(`<text x="${n((f.left + f.right) / 2)}" y="${n(f.bottom + 40)}" text-anchor="middle">${escapeXml(axisTitle(opts.xAxis))}</text>`);
  out.push(`<text transform="translate(${n(18)},${n((f.top + f.bottom) / 2)}) rotate(-90)" text-anchor="middle">${escapeXml(axisTitle(opts.yAxis))}</text>`);
  out.push(legend.place(f.bottom + 62));
  out.push('</svg>');
  return out.join('');
}
