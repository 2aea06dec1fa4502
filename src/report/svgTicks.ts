/**
 * Axis ticks and their labels: linear tick labels, UTC time ticks (d3 `scaleUtc().ticks()`) and
 * decade ticks (d3 `scaleLog().ticks()`).
 */
import { lazyPackage } from '../lazyPackage.ts';
import { escapeXml, finite, MINUS, n } from './svgPrimitives.ts';

const d3 = lazyPackage<typeof import('d3-scale')>('d3-scale');

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

/** `HH:MM:SS` of a UTC ms count, for axes with ticks less than a minute apart. */
function utcClockSecondsLabel(ms: number): string {
  return `${utcClockLabel(ms)}:${pad2(new Date(ms).getUTCSeconds())}`;
}

/** Milliseconds in an hour and a day. */
export const HOUR_MS = 3_600_000;
export const DAY_MS = 86_400_000;

/** One tick of a UTC time axis, at `ms` (UTC ms since 1970). */
export interface TimeTick {
  ms: number;
  /** First line: clock time below a day step, the date otherwise. */
  line1: string;
  /** Second line: the date where the day changes (and at the first tick); empty otherwise. */
  line2: string;
}

/**
 * UTC-aligned ticks between `fromMs` and `toMs`, at most `maxTicks`, with labels. The ticks are
 * d3's UTC calendar ticks (whole minutes, hours, days, weeks, months, years); the count is a hint
 * to d3, so it is lowered until the ticks fit.
 */
export function timeTicks(fromMs: number, toMs: number, maxTicks: number): TimeTick[] {
  finite(fromMs, 'time axis start');
  finite(toMs, 'time axis end');
  const scale = d3().scaleUtc().domain([new Date(fromMs), new Date(Math.max(toMs, fromMs + 1))]);
  let dates = scale.ticks(Math.max(1, maxTicks));
  for (let count = maxTicks - 1; dates.length > maxTicks && count >= 1; count--) dates = scale.ticks(count);
  const ms = dates.map((d) => d.getTime());
  const stepMs = ms.length > 1 ? ms[1] - ms[0] : DAY_MS;
  const ticks: TimeTick[] = [];
  let lastDate = '';
  for (const t of ms) {
    const date = utcDateLabel(t);
    if (stepMs >= DAY_MS) ticks.push({ ms: t, line1: date, line2: '' });
    else ticks.push({ ms: t, line1: stepMs < 60_000 ? utcClockSecondsLabel(t) : utcClockLabel(t), line2: date !== lastDate ? date : '' });
    lastDate = date;
  }
  return ticks;
}

/**
 * Decades (major) and the 2…9 multiples between them (minor) from `lo` to `hi`, both powers of
 * ten as `scaleLog().nice()` leaves them: d3's log ticks split by mantissa.
 */
export function logTicks(lo: number, hi: number): { major: number[]; minor: number[] } {
  const all = d3().scaleLog().domain([lo, hi]).ticks();
  const major: number[] = [];
  const minor: number[] = [];
  for (const v of all) (mantissa(v) === 1 ? major : minor).push(v);
  return { major, minor };
}

/** Leading digit m of m·10^e, for ticks that d3 places at whole multiples of a decade. */
function mantissa(v: number): number {
  return Math.round(v / 10 ** Math.floor(Math.log10(v) + 1e-9));
}

/** Log tick label for m·10^e: plain for 0.001 … 1000, else `10` (or `m×10`) with a superscript exponent. */
export function powerLabel(v: number, x: number, y: number, anchor: string): string {
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
export function labelledMinor(majorCount: number, minor: number[]): number[] {
  if (majorCount > 3) return [];
  return minor.filter((v) => {
    const m = mantissa(v);
    return m === 2 || m === 5;
  });
}

