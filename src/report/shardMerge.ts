/**
 * Joining the outputs of scenario commands run with `--shard K/N` (passes, resets, navclock,
 * compare) into exactly what one unsharded run writes, byte for byte.
 *
 * Each shard output carries a tag (JSON: a leading `shard` field; CSV: a `# shard {...}` comment
 * line) with the command, K, N and the order of every satellite of the unsharded run. The join:
 * - fields equal in every shard are kept as they are; `notes` and CSV comment lines are merged so
 *   that each satellite's notes come in satellite order between the lines every shard shares, stage
 *   by stage when the tag names the stages (resets: the orbits' notes, then the plans');
 * - per-satellite arrays and CSV rows are put in the unsharded order: by satellite for most
 *   commands, by AOS (GPS week and seconds, to the microsecond), satellite and station for passes,
 *   by clock and then by pair (first and second clock) for compare;
 * - JSON is written as every command writes it (2-space JSON and a newline); CSV rows are copied.
 * A missing, repeated or foreign shard is refused with an input error.
 */
import { lazyPackage } from '../lazyPackage.ts';
import { InputError } from '../errors.ts';

const csvParse = lazyPackage<typeof import('csv-parse/sync')>('csv-parse/sync');

/** The tag a shard output carries (src/cli/shard.ts writes it). */
export interface ShardTagData {
  command: string;
  index: number;
  count: number;
  order: string[];
  /** The output's per-satellite notes stage by stage (resets: the orbits', then the plans'). */
  stages?: string[][];
}

interface ShardFile {
  name: string;
  tag: ShardTagData;
  format: 'json' | 'csv';
  /** JSON: the object without its tag. */
  json?: Record<string, unknown>;
  /** CSV: comment lines (tag removed), header line, row lines with their parsed cells. */
  comments?: string[];
  header?: string;
  columns?: string[];
  rows?: { line: string; cells: string[] }[];
}

const FIX = 'merge the unedited --shard outputs of one run, one file per shard K = 1..N';
const CSV_TAG = '# shard ';

/** The tag of a scenario shard output, or null when the text is not one (e.g. size --all shards). */
export function scenarioShardTag(text: string): ShardTagData | null {
  const t = text.replace(/^\uFEFF/, '').trimStart();
  if (t.startsWith('{')) {
    let obj: unknown;
    try {
      obj = JSON.parse(t);
    } catch {
      return null; // JSON Lines (size --all) or not JSON
    }
    const tag = (obj as { shard?: unknown } | null)?.shard;
    return tag !== null && typeof tag === 'object' && !Array.isArray(tag) ? (tag as ShardTagData) : null;
  }
  for (const line of t.split('\n')) {
    if (!line.startsWith('#')) break;
    if (line.startsWith(CSV_TAG)) {
      try {
        return JSON.parse(line.slice(CSV_TAG.length)) as ShardTagData;
      } catch {
        return null;
      }
    }
  }
  return null;
}

function readShard(name: string, text: string): ShardFile {
  const tag = scenarioShardTag(text);
  if (tag === null || typeof tag.command !== 'string' || !Number.isSafeInteger(tag.index) || !Number.isSafeInteger(tag.count) || !Array.isArray(tag.order)) {
    throw new InputError('not a --shard output of a scenario command (no shard tag)', name, FIX);
  }
  const body = text.replace(/^\uFEFF/, '');
  if (body.trimStart().startsWith('{')) {
    let obj: Record<string, unknown>;
    try {
      obj = JSON.parse(body) as Record<string, unknown>;
    } catch {
      throw new InputError('not readable JSON', name, FIX);
    }
    const { shard: _tag, ...rest } = obj;
    return { name, tag, format: 'json', json: rest };
  }
  const lines = body.split('\n');
  if (lines.at(-1) === '') lines.pop();
  let i = 0;
  const comments: string[] = [];
  for (; i < lines.length && lines[i].startsWith('#'); i++) if (!lines[i].startsWith(CSV_TAG)) comments.push(lines[i]);
  if (i >= lines.length) throw new InputError('CSV shard has no header row', name, FIX);
  const header = lines[i];
  const rowLines = lines.slice(i + 1);
  let parsed: string[][];
  try {
    parsed = csvParse().parse(`${[header, ...rowLines].join('\n')}\n`, { relax_column_count: false }) as string[][];
  } catch (e) {
    throw new InputError(`not a readable CSV file (${e instanceof Error ? e.message.replace(/\s+/g, ' ') : String(e)})`, name, FIX);
  }
  if (parsed.length !== rowLines.length + 1) throw new InputError('CSV cells span lines', name, FIX);
  return { name, tag, format: 'csv', comments, header, columns: parsed[0], rows: rowLines.map((line, k) => ({ line, cells: parsed[k + 1] })) };
}

/** Position of the first satellite id named in a note (as a word), or −1. */
function satelliteOfNote(note: string, order: readonly string[]): number {
  let best = -1;
  let at = Infinity;
  order.forEach((id, k) => {
    const re = new RegExp(`(^|[^\\w-])${id.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}(?![\\w-])`);
    const m = re.exec(note);
    if (m !== null && m.index < at) {
      at = m.index;
      best = k;
    }
  });
  return best;
}

/**
 * Ordered lists from each shard joined into one: lines every shard has are anchors in their
 * shared order; between two anchors, the other lines in satellite order (shard order for lines
 * naming no satellite), each once.
 */
export function mergeLines(lists: readonly string[][], order: readonly string[]): string[] {
  const inAll = new Set(lists[0].filter((l) => lists.every((x) => x.includes(l))));
  const out: string[] = [];
  const pos = lists.map(() => 0);
  for (let guard = 0; guard <= lists.reduce((s, l) => s + l.length, 0) + 1; guard++) {
    const segment: { line: string; sat: number; seq: number }[] = [];
    let anchor: string | null = null;
    lists.forEach((list, k) => {
      while (pos[k] < list.length && !inAll.has(list[pos[k]])) {
        const line = list[pos[k]++];
        if (!segment.some((s) => s.line === line)) segment.push({ line, sat: satelliteOfNote(line, order), seq: segment.length });
      }
      if (pos[k] < list.length) {
        anchor = list[pos[k]];
        pos[k]++;
      }
    });
    segment.sort((a, b) => (a.sat < 0 || b.sat < 0 ? a.seq - b.seq : a.sat - b.sat || a.seq - b.seq));
    out.push(...segment.map((s) => s.line));
    if (anchor === null) return out;
    out.push(anchor);
  }
  return out;
}

/** Marks a stage's block among note lines while they are joined (no note contains it). */
const STAGE_MARK = '\u0000stage ';
/** How a note is written as a line: CSV notes added to the run (`# NOTE: `), written by the writer (`# `), JSON (bare). */
const NOTE_PREFIXES = ['# NOTE: ', '# ', ''];

/**
 * Note lines of the shards joined when each shard names its notes' stages: every block of one
 * stage's notes (in one written form) becomes the whole run's block, that stage's notes of every
 * shard in satellite order; the other lines are joined as by {@link mergeLines}.
 */
function mergeStagedLines(lists: readonly string[][], stages: readonly string[][][], order: readonly string[]): string[] {
  const merged = stages[0].map((_, s) => mergeLines(stages.map((st) => st[s] ?? []), order));
  const tokens = lists.map((list, k) => {
    const sets = stages[k].map((st) => new Set(st));
    const out: string[] = [];
    for (const line of list) {
      let token = line;
      for (const prefix of NOTE_PREFIXES) {
        const s = line.startsWith(prefix) ? sets.findIndex((set) => set.has(line.slice(prefix.length))) : -1;
        if (s >= 0) {
          token = `${STAGE_MARK}${s} ${prefix}`;
          break;
        }
      }
      if (!(token.startsWith(STAGE_MARK) && out.at(-1) === token)) out.push(token);
    }
    return out;
  });
  return mergeLines(tokens, order).flatMap((t) => {
    if (!t.startsWith(STAGE_MARK)) return [t];
    const rest = t.slice(STAGE_MARK.length);
    const gap = rest.indexOf(' ');
    const prefix = rest.slice(gap + 1);
    return (merged[Number(rest.slice(0, gap))] ?? []).map((n) => `${prefix}${n}`);
  });
}

/** The shards' stages when every shard names them, else null. */
function stagesOf(files: readonly ShardFile[]): string[][][] | null {
  const stages = files.map((f) => f.tag.stages);
  return stages.every((s) => Array.isArray(s) && s.every((l) => Array.isArray(l))) ? (stages as string[][][]) : null;
}

type RowKey = (get: (column: string) => string) => (string | number)[];

/** How each command orders its per-satellite items (fields of JSON items = CSV columns). */
function rowKey(command: string, order: readonly string[]): RowKey {
  const satIndex = new Map(order.map((id, k) => [id, k]));
  const sat = (get: (c: string) => string): number => satIndex.get(get('satellite') || get('id') || get('satelliteId')) ?? Number.MAX_SAFE_INTEGER;
  if (command === 'passes') {
    // The unsharded order: AOS, then satellite id, then station id (plan/passes.ts comparePassRows).
    return (get) => [Number(get('aosGpsWeek')) * 604800 + Number(get('aosGpsSecondsOfWeek')), get('satellite'), get('station')];
  }
  if (command === 'compare') {
    // The tag's order lists every clock (satellites, then stations): clock rows in that order, then
    // the pairs (i, j) as one run forms them (plan/compare.ts), i before j. JSON keeps clocks and
    // pairs in two arrays; CSV has both in one table, pairs after the clocks.
    const at = (id: string): number => satIndex.get(id) ?? Number.MAX_SAFE_INTEGER;
    return (get) => (get('a') === '' ? [0, at(get('id'))] : [1, at(get('a')), at(get('b'))]);
  }
  return (get) => [sat(get)];
}

function compareKeys(a: (string | number)[], b: (string | number)[]): number {
  for (let i = 0; i < a.length; i++) {
    const x = a[i];
    const y = b[i];
    const d = typeof x === 'number' && typeof y === 'number' ? x - y : String(x).localeCompare(String(y));
    if (d !== 0) return d;
  }
  return 0;
}

function sortStable<T>(items: T[], key: (t: T) => (string | number)[]): T[] {
  return items
    .map((item, seq) => ({ item, seq, k: key(item) }))
    .sort((a, b) => compareKeys(a.k, b.k) || a.seq - b.seq)
    .map((x) => x.item);
}

function mergeJson(files: ShardFile[], command: string, order: string[]): string {
  const objs = files.map((f) => f.json as Record<string, unknown>);
  const key = rowKey(command, order);
  const merged: Record<string, unknown> = {};
  for (const field of Object.keys(objs[0])) {
    const values = objs.map((o) => o[field]);
    const texts = values.map((v) => JSON.stringify(v));
    if (texts.every((t) => t === texts[0])) {
      merged[field] = values[0];
    } else if (field === 'notes' && values.every((v) => Array.isArray(v))) {
      const stages = stagesOf(files);
      merged[field] = stages === null ? mergeLines(values as string[][], order) : mergeStagedLines(values as string[][], stages, order);
    } else if (values.every((v) => Array.isArray(v))) {
      const items = (values as unknown[][]).flat();
      merged[field] = sortStable(items, (item) => key((c) => {
        const v = (item as Record<string, unknown> | null)?.[c];
        return v === undefined || v === null ? '' : String(v);
      }));
    } else {
      throw new InputError(`field ${field} differs between shards (${files[0].name}, ${files[values.findIndex((_, k) => texts[k] !== texts[0])].name})`, field, FIX);
    }
  }
  return `${JSON.stringify(merged, null, 2)}\n`;
}

function mergeCsv(files: ShardFile[], command: string, order: string[]): string {
  const header = files[0].header as string;
  for (const f of files) if (f.header !== header) throw new InputError('CSV header differs from the first shard', `${f.name}:1`, FIX);
  const columns = files[0].columns as string[];
  const key = rowKey(command, order);
  const rows = sortStable(files.flatMap((f) => f.rows ?? []), (r) => key((c) => {
    const i = columns.indexOf(c);
    return i < 0 ? '' : r.cells[i];
  }));
  const stages = stagesOf(files);
  const lists = files.map((f) => f.comments ?? []);
  const comments = stages === null ? mergeLines(lists, order) : mergeStagedLines(lists, stages, order);
  return [...comments, header, ...rows.map((r) => r.line)].join('\n') + '\n';
}

/** Join scenario shard outputs (all JSON or all CSV, shards 1..N of one run) into the unsharded output. */
export function mergeScenarioShards(inputs: readonly { name: string; text: string }[]): string {
  const files = inputs.map((f) => readShard(f.name, f.text));
  const first = files[0];
  for (const f of files) {
    if (f.format !== first.format) throw new InputError(`${f.name} is ${f.format} but ${first.name} is ${first.format}`, f.name, 'merge files of one format');
    if (f.tag.command !== first.tag.command) throw new InputError(`${f.name} is a ${f.tag.command} shard but ${first.name} is a ${first.tag.command} shard`, f.name, FIX);
    if (f.tag.count !== first.tag.count || JSON.stringify(f.tag.order) !== JSON.stringify(first.tag.order)) {
      throw new InputError(`${f.name} comes from another run than ${first.name} (shard count or satellites differ)`, f.name, FIX);
    }
  }
  const n = first.tag.count;
  const byIndex = new Map<number, ShardFile>();
  for (const f of files) {
    const seen = byIndex.get(f.tag.index);
    if (seen !== undefined) throw new InputError(`shard ${f.tag.index}/${n} appears twice (${seen.name} and ${f.name})`, 'merge', 'give each shard file once');
    byIndex.set(f.tag.index, f);
  }
  for (let k = 1; k <= n; k++) if (!byIndex.has(k)) throw new InputError(`shard ${k}/${n} is missing`, 'merge', `give the outputs of all ${n} shards`);
  const sorted = Array.from({ length: n }, (_, k) => byIndex.get(k + 1) as ShardFile);
  return first.format === 'json' ? mergeJson(sorted, first.tag.command, first.tag.order) : mergeCsv(sorted, first.tag.command, first.tag.order);
}
