/**
 * Joining the folders of `report --shard K/N` (src/cli/reportShard.ts) into the data files one
 * `report` run writes, byte for byte: each tagged data file is joined as the command's own shard
 * outputs are (./shardMerge.ts), the notes a writer places in a file are rebuilt stage by stage, and
 * every file then gets the whole run's notes, as the report adds them (./notes.ts withNotes).
 * Whole files (fits, the sweep) come from the one shard that wrote them. Nothing is recomputed.
 */
import { InputError } from '../errors.ts';
import { uniqueNotes, withNotes } from './notes.ts';
import { mergeLines, mergeScenarioShards, type ShardTagData } from './shardMerge.ts';

/** The manifest file of a report shard folder. */
export const REPORT_SHARD_MANIFEST = 'shard.json';

/** What a report shard folder's manifest holds. */
export interface ReportShardManifest {
  shard: ShardTagData;
  scenario: string;
  /** Every data file of the merged folder, whichever shard writes it. */
  files: string[];
  /** Files every shard writes with its satellites' rows (tagged). */
  rows: string[];
  /** Files only this shard writes, whole. */
  whole: string[];
  /** The run's notes as this shard found them, stage by stage in the report's order. */
  notes: string[][];
  /** For JSON files whose writer places notes: those notes, stage by stage. */
  bodyNotes: Record<string, string[][]>;
}

/** One shard folder as read: its name (for messages), manifest and data files. */
export interface ReportShardFolder {
  name: string;
  manifest: ReportShardManifest;
  /** Reads a data file of the folder (an input error when it is missing). */
  read: (file: string) => string;
}

const FIX = 'merge the unedited folders of one report --shard run, one per shard K = 1..N';

function isStringLists(v: unknown): v is string[][] {
  return Array.isArray(v) && v.every((l) => Array.isArray(l) && l.every((x) => typeof x === 'string'));
}

/** The manifest of a shard folder, checked; `where` names the file in messages. */
export function readReportManifest(text: string, where: string): ReportShardManifest {
  let m: Partial<ReportShardManifest> | null;
  try {
    m = JSON.parse(text) as Partial<ReportShardManifest> | null;
  } catch {
    throw new InputError('not readable JSON', where, FIX);
  }
  const tag = m?.shard;
  const strings = (v: unknown): boolean => Array.isArray(v) && v.every((x) => typeof x === 'string');
  const ok =
    m !== null &&
    tag !== undefined &&
    tag.command === 'report' &&
    Number.isSafeInteger(tag.index) &&
    Number.isSafeInteger(tag.count) &&
    tag.index >= 1 &&
    tag.index <= tag.count &&
    strings(tag.order) &&
    typeof m.scenario === 'string' &&
    strings(m.files) &&
    strings(m.rows) &&
    strings(m.whole) &&
    isStringLists(m.notes) &&
    m.bodyNotes !== null &&
    typeof m.bodyNotes === 'object' &&
    Object.values(m.bodyNotes).every(isStringLists);
  if (!ok) throw new InputError('not the manifest of a report --shard folder', where, FIX);
  return m as ReportShardManifest;
}

const formatOf = (file: string): 'json' | 'csv' => (file.endsWith('.json') ? 'json' : 'csv');

/** Join report shard folders (shards 1..N of one run, any order) into the run's data files [name, text]. */
export function mergeReportShards(folders: readonly ReportShardFolder[]): [string, string][] {
  if (folders.length === 0) throw new InputError('no folders to merge', 'merge', FIX);
  const first = folders[0].manifest;
  const n = first.shard.count;
  const same = (a: unknown, b: unknown): boolean => JSON.stringify(a) === JSON.stringify(b);
  for (const f of folders) {
    const m = f.manifest;
    if (m.shard.count !== n || !same(m.shard.order, first.shard.order) || m.scenario !== first.scenario || !same(m.files, first.files) || !same(m.rows, first.rows) || m.notes.length !== first.notes.length) {
      throw new InputError(`${f.name} comes from another report run than ${folders[0].name} (scenario, shard count, satellites or files differ)`, f.name, FIX);
    }
  }
  const byIndex = new Map<number, ReportShardFolder>();
  for (const f of folders) {
    const seen = byIndex.get(f.manifest.shard.index);
    if (seen !== undefined) throw new InputError(`shard ${f.manifest.shard.index}/${n} appears twice (${seen.name} and ${f.name})`, 'merge', 'give each shard folder once');
    byIndex.set(f.manifest.shard.index, f);
  }
  for (let k = 1; k <= n; k++) if (!byIndex.has(k)) throw new InputError(`shard ${k}/${n} of the report is missing`, 'merge', `give the folders of all ${n} shards`);
  const shards = Array.from({ length: n }, (_, k) => byIndex.get(k + 1) as ReportShardFolder);
  const order = first.shard.order;

  // The run's notes: each stage joined in satellite order, then one list as the report forms it.
  const stage = (lists: string[][][], s: number): string[] => mergeLines(lists.map((l) => l[s] ?? []), order);
  const notesOf = shards.map((f) => f.manifest.notes);
  const all = uniqueNotes(...first.notes.map((_, s) => stage(notesOf, s)));

  const out: [string, string][] = [];
  for (const file of first.files) {
    const format = formatOf(file);
    let body: string;
    if (first.rows.includes(file)) {
      body = mergeScenarioShards(shards.map((f) => ({ name: `${f.name}/${file}`, text: f.read(file) })));
      const writerNotes = shards.map((f) => f.manifest.bodyNotes[file]);
      if (format === 'json' && writerNotes.every((x) => x !== undefined)) {
        // The notes the writer put in the file, rebuilt stage by stage (a plain join would interleave stages).
        const obj = JSON.parse(body) as Record<string, unknown>;
        obj.notes = writerNotes[0].flatMap((_, s) => stage(writerNotes, s));
        body = `${JSON.stringify(obj, null, 2)}\n`;
      }
    } else {
      const owners = shards.filter((f) => f.manifest.whole.includes(file));
      if (owners.length === 0) throw new InputError(`no shard folder holds ${file}`, 'merge', FIX);
      if (owners.length > 1) throw new InputError(`${file} is in two shard folders (${owners[0].name}, ${owners[1].name})`, 'merge', FIX);
      body = owners[0].read(file);
    }
    out.push([file, withNotes(format, body, all)]);
  }
  return out;
}
