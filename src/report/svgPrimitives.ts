/**
 * SVG primitives shared by every plot kind: escaping, number formatting, the palette, the figure
 * frame with its title, the legend, and edge-aware tick labels.
 */
import { InternalError } from '../errors.ts';

/** Minus sign for labels (U+2212). */
export const MINUS = '\u2212';

/** An axis title and its unit; the unit is shown in brackets, e.g. `Clock offset [ns]`. */
export interface AxisSpec {
  label: string;
  unit: string;
}

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

export function finite(v: number, what: string): number {
  if (typeof v !== 'number' || !Number.isFinite(v)) throw new InternalError(`plot input ${what} is not finite: ${v}`, what);
  return v;
}

/** Coordinate to text: finite or InternalError, two decimals, no "-0". */
export function n(v: number): string {
  if (!Number.isFinite(v)) throw new InternalError(`non-finite SVG coordinate: ${v}`, 'svg coordinate');
  const r = Math.round(v * 100) / 100;
  return Object.is(r, -0) ? '0' : String(r);
}

export const FONT_PX = 12;

/** Rough advance width of a sans-serif string, for layout only. */
export function textWidthPx(s: string, fontPx = FONT_PX): number {
  return [...s].length * 0.6 * fontPx;
}

/** Shorten a label to at most `maxChars` characters (before escaping). */
export function clip(s: string, maxChars: number): string {
  const chars = [...String(s)];
  return chars.length <= maxChars ? chars.join('') : chars.slice(0, Math.max(1, maxChars - 1)).join('') + '…';
}

/** Restrained palette: distinct in colour and, for print, in dash pattern. */
export const PALETTE = ['#2b5c8a', '#b0502a', '#3f7f3f', '#7a4d8c', '#8a7a2b', '#2f7f86', '#8c3b5c', '#555555'];
export const DASHES = ['', '6 3', '2 3', '8 3 2 3'];
export const INK = '#222';
export const GRID = '#e4e4e4';
export const AXIS = '#666';
export const SHADE = '#dfe9f3';
export const LIMIT = '#a33';

export function colour(i: number): string {
  return PALETTE[i % PALETTE.length];
}
export function dash(i: number): string {
  return DASHES[Math.floor(i / PALETTE.length) % DASHES.length];
}

export function axisTitle(a: AxisSpec): string {
  return a.unit.trim() === '' ? a.label : `${a.label} [${a.unit}]`;
}

/** Stable id from content, so several figures on one page never share a clip path id. */
export function contentId(prefix: string, parts: string[]): string {
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

/** The plot area inside a figure [px]. */
export interface Frame {
  left: number;
  top: number;
  right: number;
  bottom: number;
}

/** Opening `<svg>` with title, white background and the heading. */
export function svgOpen(widthPx: number, heightPx: number, title: string): string {
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

export interface LegendItem {
  label: string;
  swatch: (x: number, y: number) => string;
}

/** Legend laid out in rows under the plot; returns the markup and the height it needs. */
export function legendLayout(items: LegendItem[], widthPx: number, leftPx: number): { rows: number; place: (y: number) => string } {
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

export function lineSwatch(i: number, withMarker: boolean): (x: number, y: number) => string {
  return (x, y) =>
    `<line x1="${n(x)}" y1="${n(y)}" x2="${n(x + 24)}" y2="${n(y)}" stroke="${colour(i)}" stroke-width="2"${dash(i) ? ` stroke-dasharray="${dash(i)}"` : ''}/>` +
    (withMarker ? `<circle cx="${n(x + 12)}" cy="${n(y)}" r="3" fill="${colour(i)}"/>` : '');
}

/** Tick label centred on `x`, shifted to stay inside the figure near its left and right edges. */
export function edgeText(x: number, y: number, text: string, widthPx: number, extra = ''): string {
  const half = textWidthPx(text) / 2;
  let anchor = 'middle';
  let at = x;
  if (x + half > widthPx - 2) { anchor = 'end'; at = Math.min(x + half, widthPx - 2); }
  else if (x - half < 2) { anchor = 'start'; at = Math.max(x - half, 2); }
  return `<text x="${n(at)}" y="${n(y)}" text-anchor="${anchor}"${extra}>${escapeXml(text)}</text>`;
}
