/**
 * Inline SVG figures for the HTML report. Pure functions: numbers in, an `<svg>` string out.
 * This module gathers the parts: primitives (`svgPrimitives.ts`), ticks (`svgTicks.ts`),
 * decimation (`svgDecimate.ts`) and one file per plot kind.
 * No scripts, no external references, every user string through {@link escapeXml}.
 *
 * Time axes take x as **UTC milliseconds since 1970-01-01T00:00:00Z** (POSIX count, leap
 * seconds not counted), the same number `Date.UTC` gives; use {@link utcMsFromMjdUtc} with
 * `TimeSystem#mjdUtc(instant)` to get it. A leap second is only a label question here: a
 * point inside one is drawn at the start of the next second.
 */

export { escapeXml, utcMsFromMjdUtc, type AxisSpec } from './svgPrimitives.ts';
export { formatTick, timeTicks, utcClockLabel, utcDateLabel, type TimeTick } from './svgTicks.ts';
export { decimateMinMax } from './svgDecimate.ts';
export { linePlot, type HLine, type LinePlotOptions, type LineSeries, type MarkedPoint, type XInterval } from './svgLinePlot.ts';
export { logLogPlot, type LogLogPlotOptions, type LogLogSeries } from './svgLogLog.ts';
export { timeline, type TimelineBar, type TimelineOptions } from './svgTimeline.ts';
export { ageErrorPlot, type AgeCurve } from './svgAgePlot.ts';
