/**
 * `tauplan merge FILES... [--out PATH]`: joins the outputs of `size --all --shard K/N` runs back
 * into file order, by their `index` column (CSV) or field (JSON Lines). The inputs must all be CSV
 * with the same header, or all JSON Lines; the output has the same format. Every index from 0 to
 * the largest must be present exactly once (a missing shard is refused, not skipped).
 * Reads the shard files whole (a row is a few hundred bytes, so 100 000 rows are tens of MB).
 */
import { existsSync, statSync } from 'node:fs';
import { join, resolve } from 'node:path';
import type { Argv } from 'yargs';
import { lazyPackage } from '../../lazyPackage.ts';
import { InputError } from '../../errors.ts';
import { readTextFile } from '../../io/orbitSources.ts';
import { writeFileAtomic } from '../../io/output.ts';
import { writeOutputFolder } from '../../io/outputFolder.ts';
import { mergeReportShards, readReportManifest, REPORT_SHARD_MANIFEST, type ReportShardFolder } from '../../report/reportShardMerge.ts';
import { safeCsvCell } from '../../report/csv.ts';
import { mergeScenarioShards, scenarioShardTag } from '../../report/shardMerge.ts';

const csvParse = lazyPackage<typeof import('csv-parse/sync')>('csv-parse/sync');
const csvStringify = lazyPackage<typeof import('csv-stringify/sync')>('csv-stringify/sync');

export function mergeOptions<T>(y: Argv<T>) {
  return y
    .positional('files', { type: 'string', array: true, demandOption: true, describe: 'shard outputs of size --all (CSV or JSON Lines), of passes / resets / navclock / compare --shard (JSON or CSV), or the folders of report --shard' })
    .option('out', { type: 'string', requiresArg: true, describe: 'write to this file (atomically) instead of stdout; for report shard folders, the folder for the merged data files' })
    .option('quiet', { type: 'boolean', default: false, describe: 'no summary on stderr' });
}

interface Row {
  index: number;
  /** The row as it will be written (CSV cells or one JSON line). */
  cells: string[] | string;
  where: string;
}

function indexOf(value: unknown, where: string): number {
  const n = typeof value === 'number' ? value : typeof value === 'string' && value.trim() !== '' ? Number(value) : NaN;
  if (!(Number.isSafeInteger(n) && n >= 0)) {
    throw new InputError(`index ${JSON.stringify(value)} is not a whole number ≥ 0`, where, 'merge the unedited outputs of tauplan size --all');
  }
  return n;
}

/** Merge shard outputs; returns the merged text (also written to `out` or stdout). */
export function mergeShardTexts(inputs: readonly { name: string; text: string }[]): string {
  if (inputs.length === 0) throw new InputError('no files to merge', 'merge', 'give the shard outputs of size --all');
  const rows: Row[] = [];
  let kind: 'csv' | 'jsonl' | null = null;
  let header: string[] | null = null;
  for (const { name, text } of inputs) {
    const trimmed = text.trimStart();
    if (trimmed === '') continue;
    const k = trimmed.startsWith('{') ? 'jsonl' : 'csv';
    if (kind !== null && k !== kind) throw new InputError(`${name} is ${k} but an earlier file is ${kind}`, name, 'merge files of one format');
    kind = k;
    if (k === 'jsonl') {
      text.split('\n').forEach((line, i) => {
        if (line.trim() === '') return;
        const where = `${name}:${i + 1}`;
        let obj: unknown;
        try {
          obj = JSON.parse(line);
        } catch {
          throw new InputError('line is not JSON', where, 'merge the unedited JSON Lines outputs of tauplan size --all --format jsonl');
        }
        const index = indexOf((obj as { index?: unknown } | null)?.index, `${where} index`);
        rows.push({ index, cells: line.trim(), where });
      });
    } else {
      let records: string[][];
      try {
        records = csvParse().parse(text, { relax_column_count: false }) as string[][];
      } catch (e) {
        throw new InputError(`not a readable CSV file (${e instanceof Error ? e.message.replace(/\s+/g, ' ') : String(e)})`, name, 'merge the unedited CSV outputs of tauplan size --all');
      }
      const [head, ...body] = records;
      const col = head.indexOf('index');
      if (col < 0) throw new InputError('CSV header has no index column', `${name}:1`, 'merge outputs of tauplan size --all (they carry an index column)');
      if (header !== null && head.join(',') !== header.join(',')) throw new InputError('CSV header differs from the first file', `${name}:1`, 'merge outputs of the same tauplan version');
      header = head;
      body.forEach((cells, i) => rows.push({ index: indexOf(cells[col], `${name} row ${i + 1} index`), cells, where: `${name} row ${i + 1}` }));
    }
  }
  if (kind === null) throw new InputError('every file is empty', inputs.map((f) => f.name).join(', '), 'give the shard outputs of size --all');
  rows.sort((p, q) => p.index - q.index);
  for (let i = 0; i < rows.length; i++) {
    if (rows[i].index === i) continue;
    if (i > 0 && rows[i].index === rows[i - 1].index) {
      throw new InputError(`index ${rows[i].index} appears twice (${rows[i - 1].where} and ${rows[i].where})`, 'merge', 'give each shard file once');
    }
    throw new InputError(`index ${i} is missing (rows jump to ${rows[i].index})`, 'merge', 'give the outputs of every shard K/N, K = 1..N');
  }
  if (kind === 'jsonl') return rows.map((r) => `${r.cells as string}\n`).join('');
  // Cells may have been edited since size --all wrote them: formulas and unsafe characters are neutralised again.
  return csvStringify().stringify([(header as string[]).map(safeCsvCell), ...rows.map((r) => (r.cells as string[]).map(safeCsvCell))]);
}

/** Whether `path` is a folder (a report shard's); a missing path is left to the file reader's message. */
function isFolder(path: string): boolean {
  return statSync(path, { throwIfNoEntry: false })?.isDirectory() === true;
}

/** `tauplan merge DIR_1 … DIR_N --out DIR`: report shard folders into the data files of one report. */
function mergeReportFolders(dirs: string[], out: string | undefined, quiet: boolean): void {
  if (out === undefined) throw new InputError('merging report shard folders needs --out DIR', '--out', 'give the folder for the merged data files, e.g. --out report/');
  const into = dirs.find((d) => resolve(d) === resolve(out));
  if (into !== undefined) throw new InputError(`--out ${out} is one of the shard folders`, '--out', 'give a new folder for the merged data files');
  const folders: ReportShardFolder[] = dirs.map((dir) => {
    const path = join(dir, REPORT_SHARD_MANIFEST);
    if (!existsSync(path)) throw new InputError(`${dir} is not a report shard folder (no ${REPORT_SHARD_MANIFEST})`, dir, 'give the --out folders of report --shard K/N runs');
    const manifest = readReportManifest(readTextFile(path, 'merge'), path);
    return { name: dir, manifest, read: (file) => readTextFile(join(dir, file), 'merge') };
  });
  // Everything is joined before the folder is touched: a refused merge leaves no file.
  const files = mergeReportShards(folders);
  writeOutputFolder(resolve(out), files);
  if (!quiet) process.stderr.write(`tauplan: merged ${dirs.length} report shard folders into ${files.length} data files in ${resolve(out)} (report.html and the text files need one report process)\n`);
}

/** `tauplan merge`: read, merge, write (atomically with --out). */
export function runMerge(files: string[], out: string | undefined, quiet = false): void {
  const folders = files.filter(isFolder);
  if (folders.length > 0) {
    if (folders.length !== files.length) throw new InputError(`${files.find((f) => !isFolder(f))} is a file but ${folders[0]} is a folder`, 'merge', 'merge report shard folders, or shard output files, not both');
    mergeReportFolders(files, out, quiet);
    return;
  }
  const inputs = files.map((name) => ({ name, text: readTextFile(name, 'merge') }));
  // Scenario commands' shards carry a tag (src/report/shardMerge.ts); size --all shards an index.
  const merged = inputs.some((f) => scenarioShardTag(f.text) !== null) ? mergeScenarioShards(inputs) : mergeShardTexts(inputs);
  if (out === undefined) process.stdout.write(merged);
  else writeFileAtomic(out, merged);
  if (!quiet) process.stderr.write(`tauplan: merged ${files.length} files\n`);
}
