/**
 * `tauplan size --tle FILE --all` (or `--omm FILE --all`): every element set of a catalogue, one row
 * each, in file order whatever the number of worker threads.
 *
 * - `--jobs N` asks for worker threads (default os.availableParallelism()), capped by the element sets
 *   and the cores (../workers.ts); `--jobs 1` sizes in-process.
 * - `--shard K/N` sizes only the element sets whose 0-based file index i has i mod N = K − 1.
 *   Rows carry `index`, so `tauplan merge` can put shard outputs back into file order.
 * - csv and jsonl stream: a row is written as soon as every row before it is done; only the rows
 *   waiting behind a slower batch are held. json and text are buffered.
 * - A satellite that cannot be sized is a row with its reason (and a line on stderr); the run
 *   goes on and exits 0. `--strict` makes any such failure a failed run (exit 2, no --out file).
 *   A fault in the file itself (bad checksum, ...) still fails the whole run at once.
 */
import { checkJobs, jobsFor, runOrderedPool } from '../workers.ts';
import cliProgress from 'cli-progress';
import { InputError } from '../../errors.ts';
import { idOf, labelOf, readElementSets } from '../../io/orbitSources.ts';
import { openOutput, toJsonText } from '../../io/output.ts';
import { escapeUnsafeText } from '../../report/safeText.ts';
import {
  catalogueGravity,
  inShard,
  parseShard,
  sizeCatalogueItem,
  type CatalogueItem,
  type CatalogueOutcome,
  type CatalogueSizeOptions,
  type ShardSpec,
} from '../../api/catalogue.ts';
import { SIZE_CSV_COLUMNS, sizeCsvRow, sizeToJson } from '../../report/sizeReport.ts';
import { toCsv, type CsvCell } from '../../report/csv.ts';
import { fixed, signed } from '../../report/format.ts';
import { PLANNING_CAUTION } from '../../report/caution.ts';
import { parsePositiveDurationS } from '../../time/duration.ts';
import type { TimeSystem } from '../../time/timeSystem.ts';
import type { SizeArgs } from './size.ts';
import type { WorkerInit, WorkerReply } from '../sizeWorker.ts';

/** Output formats of `size --all`. */
export const SIZE_ALL_FORMATS = ['csv', 'jsonl', 'json', 'text'] as const;

/** CSV columns of `size --all`: the single-size columns, then the file index (0-based) and the name. */
export const CATALOGUE_CSV_COLUMNS: readonly string[] = [...SIZE_CSV_COLUMNS, 'index', 'name'];

/** Arguments of `size --all` (the single `size` flags plus these). */
export interface SizeAllArgs extends SizeArgs {
  all?: boolean;
  jobs?: number;
  shard?: string;
  strict?: boolean;
  format: string;
  out?: string;
  quiet?: boolean;
}

/** Counts of a finished run. */
export interface SizeAllSummary {
  /** Element sets in the file. */
  inFile: number;
  /** Element sets in this shard (all of them without --shard). */
  attempted: number;
  sized: number;
  failed: number;
}

/** Where rows go: stdout, or a temporary file renamed into place at the end (src/io/output.ts). */
interface Sink {
  write(text: string): void;
  finish(): void;
}

function openSink(out: string | undefined): Sink {
  // A reader of stdout that stops early (`| head`) ends the run quietly: src/cli/main.ts.
  if (out === undefined) return { write: (t) => void process.stdout.write(t), finish: () => undefined };
  const file = openOutput(out);
  return { write: (t) => file.write(t), finish: () => file.commit() };
}

/** JSON text of one value on one line; refuses non-finite numbers like toJsonText does. */
function jsonLine(value: unknown): string {
  // toJsonText checks every number; its indentation is then dropped for one line per object.
  return `${JSON.stringify(JSON.parse(toJsonText(value)))}\n`;
}

/** CSV cells of one outcome (CATALOGUE_CSV_COLUMNS). */
function csvCells(o: CatalogueOutcome, sourceLabel: string, gravityName: string, ts: TimeSystem): CsvCell[] {
  if (o.ok) {
    const cells = sizeCsvRow(o.result, ts);
    return [...cells, o.index, o.name];
  }
  const cells: CsvCell[] = SIZE_CSV_COLUMNS.map(() => null);
  cells[SIZE_CSV_COLUMNS.indexOf('satellite')] = o.id;
  cells[SIZE_CSV_COLUMNS.indexOf('source')] = sourceLabel;
  cells[SIZE_CSV_COLUMNS.indexOf('gravity')] = gravityName;
  cells[SIZE_CSV_COLUMNS.indexOf('error')] = o.error;
  return [...cells, o.index, o.name];
}

/** JSON object of one outcome (sizeToJson fields plus index and name; failures carry `error`). */
function jsonObject(o: CatalogueOutcome, sourceLabel: string, gravityName: string, ts: TimeSystem): Record<string, unknown> {
  if (o.ok) return { index: o.index, name: o.name, ...sizeToJson(o.result, ts) };
  return { index: o.index, name: o.name, satellite: o.id, source: sourceLabel, gravity: gravityName, error: o.error };
}

/**
 * Size `items` and call `onOutcomes` with outcomes in item order, as soon as an in-order prefix is complete.
 * `jobs` = 1 runs in-process; more spreads batches over the worker pool (../workers.ts).
 */
export async function sizeItems(
  items: readonly CatalogueItem[],
  options: CatalogueSizeOptions,
  jobs: number,
  ts: TimeSystem,
  onOutcomes: (outcomes: CatalogueOutcome[]) => void,
): Promise<void> {
  if (items.length === 0) return;
  if (jobs <= 1) {
    const gravity = catalogueGravity(options.gravityName);
    let lastYieldMs = performance.now();
    for (const it of items) {
      onOutcomes([sizeCatalogueItem(it, options, ts, gravity)]);
      // Let timers (progress bar) and signals in every ~50 ms. Two turns of the event loop: a single
      // setImmediate resumes in the same turn's check phase, before any poll phase, so a pending
      // SIGINT/SIGTERM/SIGHUP would never be seen before the run ends.
      if (performance.now() - lastYieldMs > 50) {
        await new Promise<void>((resolve) => setImmediate(resolve));
        await new Promise<void>((resolve) => setImmediate(resolve));
        lastYieldMs = performance.now();
      }
    }
    return;
  }
  const batchSize = Math.max(1, Math.min(32, Math.ceil(items.length / (jobs * 8))));
  const batches: CatalogueItem[][] = [];
  for (let i = 0; i < items.length; i += batchSize) batches.push(items.slice(i, i + batchSize));
  const init: WorkerInit = { options };
  await runOrderedPool<CatalogueItem[], WorkerReply>('sizeWorker', init, batches, jobs, (reply) => {
    if (reply.usedPastExpiry) ts.leap.usedPastExpiry = true;
    onOutcomes(reply.outcomes);
  });
}

/** Progress on stderr for runs longer than about 2 s, only on a terminal and without --quiet. */
function progress(total: number, enabled: boolean): { tick(n: number, failed: number): void; note(line: string): void; stop(): void } {
  const started = Date.now();
  let bar: cliProgress.SingleBar | null = null;
  let value = 0;
  return {
    tick(n, failed) {
      value += n;
      if (!enabled) return;
      if (bar === null && Date.now() - started > 2000 && value < total) {
        bar = new cliProgress.SingleBar(
          { stream: process.stderr, format: 'size --all |{bar}| {value}/{total} satellites, {failed} failed, eta {eta_formatted}', hideCursor: true, clearOnComplete: true },
          cliProgress.Presets.shades_classic,
        );
        bar.start(total, value, { failed });
      } else bar?.update(value, { failed });
    },
    note(line) {
      process.stderr.write(bar === null ? line : `\r\x1b[K${line}`);
    },
    stop() {
      bar?.stop();
    },
  };
}

/** Run `size --all`; writes the rows and returns the counts. Throws InputError for --strict failures. */
export async function runSizeAll(a: SizeAllArgs, ts: TimeSystem): Promise<SizeAllSummary> {
  if (a.tle === undefined && a.omm === undefined) throw new InputError('--all needs an element-set file', '--all', 'give --tle FILE or --omm FILE');
  if (a.tle !== undefined && a.omm !== undefined) throw new InputError('both --tle and --omm given', '--tle/--omm', 'give one element-set file');
  if (a.sat !== undefined) throw new InputError('--sat and --all both given', '--sat/--all', 'drop --sat to size every satellite, or drop --all to size one');
  if (a.scenario !== undefined || a.aKm !== undefined || a.altitudeKm !== undefined) {
    throw new InputError('--all works on a TLE or OMM file only', '--all', 'drop --scenario / --a-km / --altitude-km');
  }
  const format = a.format;
  if (!(SIZE_ALL_FORMATS as readonly string[]).includes(format)) {
    throw new InputError(`size --all has no ${format} output`, '--format', 'use csv, jsonl, json or text');
  }
  const gravity = catalogueGravity(a.gravity);
  const spanS = parsePositiveDurationS(a.span ?? '1d', '--span');
  if (!(a.nominalHz > 0)) throw new InputError(`nominal frequency ${a.nominalHz} Hz is not positive`, '--nominal-hz', 'give e.g. 10.23e6');
  const fromTtJ2000S = a.from === undefined ? null : ts.parse(a.from, '--from').ttJ2000S;
  checkJobs(a.jobs);
  const shard: ShardSpec | null = a.shard === undefined ? null : parseShard(a.shard, '--shard');
  const kind = a.tle !== undefined ? 'tle' : 'omm';
  const file = (a.tle ?? a.omm) as string;
  // A fault in the file fails the whole run here, before anything is written.
  const records = readElementSets(file, kind, `--${kind}`);
  const items: CatalogueItem[] = [];
  records.forEach((record, index) => {
    if (inShard(index, shard)) items.push({ index, id: idOf(record), name: labelOf(record), record });
  });
  const jobs = jobsFor(a.jobs, items.length, ['element set', 'element sets'], a.quiet === true);
  const options: CatalogueSizeOptions = { gravityName: a.gravity, spanS, fromTtJ2000S, nominalHz: a.nominalHz };
  const sourceLabel = kind === 'tle' ? 'SGP4 (TLE)' : 'SGP4 (OMM)';
  const streaming = format === 'csv' || format === 'jsonl';
  const sink = streaming ? openSink(a.out) : null;
  const kept: CatalogueOutcome[] = [];
  const bar = progress(items.length, process.stderr.isTTY === true && a.quiet !== true);
  let sized = 0;
  let failed = 0;
  const header = toCsv(CATALOGUE_CSV_COLUMNS, []);
  if (sink !== null && format === 'csv') sink.write(header);
  try {
    await sizeItems(items, options, jobs, ts, (outcomes) => {
      for (const o of outcomes) {
        if (o.ok) sized++;
        else {
          failed++;
          bar.note(`tauplan: satellite ${o.id} (${o.name}, element set ${o.index + 1} of ${file}) not sized: ${o.error}\n`);
        }
      }
      if (sink === null) kept.push(...outcomes);
      else if (format === 'csv') sink.write(toCsv(CATALOGUE_CSV_COLUMNS, outcomes.map((o) => csvCells(o, sourceLabel, gravity.name, ts))).slice(header.length));
      else sink.write(outcomes.map((o) => jsonLine(jsonObject(o, sourceLabel, gravity.name, ts))).join(''));
      bar.tick(outcomes.length, failed);
    });
  } finally {
    bar.stop();
  }
  const summary: SizeAllSummary = { inFile: records.length, attempted: items.length, sized, failed };
  const shardNote = shard === null ? '' : ` (shard ${shard.k}/${shard.n} of ${records.length})`;
  const countLine = `tauplan: sized ${sized} of ${items.length}${shardNote}; ${failed} failed\n`;
  if (a.strict === true && failed > 0) {
    process.stderr.write(countLine);
    throw new InputError(`${failed} of ${items.length} satellites could not be sized`, `--strict, ${file}`, 'see the lines above; drop --strict to keep the rows of the others');
  }
  if (sink !== null) sink.finish();
  else writeBuffered(kept, format, a.out, sourceLabel, gravity.name, ts, summary);
  if (a.quiet !== true || failed > 0) process.stderr.write(countLine);
  return summary;
}

function writeBuffered(kept: CatalogueOutcome[], format: string, out: string | undefined, sourceLabel: string, gravityName: string, ts: TimeSystem, s: SizeAllSummary): void {
  let body: string;
  if (format === 'json') {
    const results = kept.filter((o) => o.ok).map((o) => jsonObject(o, sourceLabel, gravityName, ts));
    const failures = kept.filter((o) => !o.ok).map((o) => jsonObject(o, sourceLabel, gravityName, ts));
    body = toJsonText({ results, failures });
  } else body = escapeUnsafeText(catalogueText(kept, s));
  const sink = openSink(out);
  sink.write(body);
  sink.finish();
}

/** The text table of a catalogue run. */
function catalogueText(kept: CatalogueOutcome[], s: SizeAllSummary): string {
  const lines = [
    `Frequency-offset sizing, ${s.attempted} satellites (${s.sized} sized, ${s.failed} failed)`,
    '',
    `${'index'.padStart(6)}  ${'satellite'.padEnd(10)} ${'name'.padEnd(24)} ${'drift ns/day'.padStart(14)} ${'offset mHz'.padStart(12)} ${'ecc. ampl. ns'.padStart(14)}`,
  ];
  for (const o of kept) {
    const head = `${String(o.index).padStart(6)}  ${o.id.padEnd(10)} ${o.name.slice(0, 24).padEnd(24)}`;
    if (o.ok) {
      const r = o.result;
      lines.push(`${head} ${signed(r.driftNsPerDay, 3).padStart(14)} ${signed(r.recommendedOffsetHz * 1e3, 6).padStart(12)} ${fixed(r.eccentricityAmplitudeNs, 3).padStart(14)}`);
    } else lines.push(`${head} not sized: ${o.error}`);
  }
  lines.push('', 'Drift: positive means the clock runs fast against TT. Offset: set on the ground as nominal + offset.', '', PLANNING_CAUTION, '');
  return lines.join('\n');
}
