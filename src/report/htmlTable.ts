/**
 * HTML tables that never clip a column, on screen or on paper: units on a second header line,
 * numbers right-aligned with fixed decimals per column and one minus sign (U+2212), date group rows
 * instead of dates in every time cell, a smaller text size for wide tables, and, as a last resort,
 * a wide table split into parts that repeat its key columns.
 */
import { InternalError } from '../errors.ts';
import { MINUS_SIGN, typographicMinus } from './format.ts';
import { escapeXml } from './svg.ts';

/** A table column: its title, optional unit (second header line), and how to print numbers. */
export interface TableColumn {
  label: string;
  unit?: string;
  /** Force right alignment even for text cells (e.g. preformatted numbers). */
  numeric?: boolean;
  /** Fixed decimals for number cells (the column's precision); default: up to 6 significant digits. */
  decimals?: number;
  /** Scientific notation with this many digits after the point (dimensionless rates). */
  sciDigits?: number;
  /** Show a plus sign on positive numbers (offsets, steps). */
  signed?: boolean;
  /** Formatter for number cells; overrides decimals/sciDigits (its ASCII minus is shown as U+2212). */
  format?: (value: number) => string;
  /** Repeated in every part when a wide table is split (satellite, station, AOS …). */
  key?: boolean;
  /** Which part (1, 2, …) a non-key column goes to when the table is split; default: an even share. */
  part?: number;
}

/** A cell: text, a number (right-aligned), or null (shown as an em dash). */
export type TableCell = string | number | null;

/** A row spanning the whole table that opens a group (e.g. one UTC day). */
export interface TableGroupRow {
  group: string;
}

/** A table with a caption; a column may be given as just its label. */
export interface TableSpec {
  caption: string;
  columns: (string | TableColumn)[];
  rows: (TableCell[] | TableGroupRow)[];
  /** Most columns per part before the table is split (key columns repeated); default 12. */
  maxColumns?: number;
}

/** ASCII hyphen-minus to U+2212 in a number's text (also in exponents). */
function numberMinus(s: string): string {
  return s.replace(/-/g, MINUS_SIGN);
}

function defaultNumber(v: number): string {
  if (v === 0) return '0';
  const a = Math.abs(v);
  return a >= 1e-3 && a < 1e9 ? String(Number(v.toPrecision(6))) : v.toExponential(5).replace(/\.?0+e/, 'e');
}

/** A number cell as text with the column's decimals, sign and U+2212. */
export function formatNumberCell(c: TableColumn, v: number): string {
  let s: string;
  if (c.format !== undefined) s = c.format(v);
  else if (c.sciDigits !== undefined) s = v.toExponential(c.sciDigits);
  else if (c.decimals !== undefined) s = v.toFixed(c.decimals);
  else s = defaultNumber(v);
  // A value that rounds to zero prints without a sign ("−0.00" would claim a direction).
  if (/^-0(\.0+)?(e[+-]?\d+)?$/.test(s)) s = s.slice(1);
  if (c.signed === true && !s.startsWith('-') && v !== 0 && !/^0(\.0+)?$/.test(s)) s = `+${s}`;
  return numberMinus(s);
}

function column(c: string | TableColumn): TableColumn {
  return typeof c === 'string' ? { label: c } : c;
}

const isGroup = (r: TableCell[] | TableGroupRow): r is TableGroupRow => !Array.isArray(r);

/** Column index sets of each part: all columns, or key columns plus a share of the others. */
export function splitColumns(cols: readonly TableColumn[], maxColumns: number): number[][] {
  if (cols.length <= maxColumns) return [cols.map((_, j) => j)];
  const keys = cols.flatMap((c, j) => (c.key === true ? [j] : []));
  const rest = cols.flatMap((c, j) => (c.key === true ? [] : [j]));
  if (rest.every((j) => cols[j].part !== undefined)) {
    const parts = [...new Set(rest.map((j) => cols[j].part as number))].sort((a, b) => a - b);
    return parts.map((p) => [...keys, ...rest.filter((j) => cols[j].part === p)].sort((a, b) => a - b));
  }
  const room = Math.max(1, maxColumns - keys.length);
  const parts = Math.ceil(rest.length / room);
  const per = Math.ceil(rest.length / parts);
  const out: number[][] = [];
  for (let p = 0; p < parts; p++) out.push([...keys, ...rest.slice(p * per, (p + 1) * per)].sort((a, b) => a - b));
  return out;
}

/** Text size class from the number of columns shown. */
function sizeClass(n: number): string {
  return n > 10 ? ' class="t-small"' : n > 7 ? ' class="t-medium"' : '';
}

/** One table (or several parts of it) as HTML; throws InternalError on a malformed row or a non-finite number. */
export function renderTable(t: TableSpec, where: string): string {
  const cols = t.columns.map(column);
  const dataRows = t.rows.filter((r): r is TableCell[] => !isGroup(r));
  // A column is numeric if declared so or if all its non-null cells are numbers.
  const numericCol = cols.map(
    (c, j) => c.numeric === true || (dataRows.length > 0 && dataRows.every((r) => r[j] === null || r[j] === undefined || typeof r[j] === 'number') && dataRows.some((r) => typeof r[j] === 'number')),
  );
  const cellHtml = (r: TableCell[], i: number, j: number): string => {
    const cell = r[j];
    const cls = numericCol[j] ? ' class="num"' : '';
    if (cell === null || cell === undefined) return `<td${cls}>—</td>`;
    if (typeof cell === 'number') {
      if (!Number.isFinite(cell)) throw new InternalError(`${where} row ${i} column ${j} is not finite: ${cell}`, cols[j].label);
      return `<td class="num">${escapeXml(formatNumberCell(cols[j], cell))}</td>`;
    }
    return `<td${cls}>${escapeXml(typographicMinus(cell))}</td>`;
  };
  t.rows.forEach((r, i) => {
    if (!isGroup(r) && r.length !== cols.length) throw new InternalError(`${where} row ${i} has ${r.length} cells for ${cols.length} columns`);
  });
  const parts = splitColumns(cols, t.maxColumns ?? 12);
  return parts
    .map((idx, p) => {
      const caption = parts.length === 1 ? t.caption : `${t.caption} (part ${p + 1} of ${parts.length})`;
      const head = idx
        .map((j) => {
          const c = cols[j];
          const unit = c.unit === undefined || c.unit === '' ? '' : `<br><span class="unit">${escapeXml(c.unit)}</span>`;
          return `<th scope="col"${numericCol[j] ? ' class="num"' : ''}>${escapeXml(c.label)}${unit}</th>`;
        })
        .join('');
      const body = t.rows
        .map((r, i) => (isGroup(r) ? `<tr class="group"><th scope="rowgroup" colspan="${idx.length}">${escapeXml(r.group)}</th></tr>` : `<tr>${idx.map((j) => cellHtml(r, i, j)).join('')}</tr>`))
        .join('\n');
      return `<div class="table-wrap"><table${sizeClass(idx.length)}><caption>${escapeXml(caption)}</caption><thead><tr>${head}</tr></thead><tbody>\n${body}\n</tbody></table></div>`;
    })
    .join('\n');
}

/** Rows grouped under one group row per distinct key (e.g. UTC date), keeping the row order. */
export function groupedRows<T>(items: readonly T[], groupOf: (item: T) => string, rowOf: (item: T) => TableCell[]): (TableCell[] | TableGroupRow)[] {
  const out: (TableCell[] | TableGroupRow)[] = [];
  let last: string | null = null;
  for (const it of items) {
    const g = groupOf(it);
    if (g !== last) {
      out.push({ group: g });
      last = g;
    }
    out.push(rowOf(it));
  }
  return out;
}
