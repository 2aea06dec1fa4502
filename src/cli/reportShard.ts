/**
 * `tauplan report SCENARIO --shard K/N|auto --out DIR_K`: the report's data files for this shard's
 * satellites (round-robin over the scenario's satellites, as for the other scenario commands), for
 * `tauplan merge DIR_1 … DIR_N --out DIR` to join into exactly the data files one `report` writes.
 *
 * A shard folder holds:
 * - passes, resets, size and compare as CSV and JSON, each tagged like a `--shard` output of that
 *   command (compare's pairs shared out as in src/cli/compareShard.ts, with every pair);
 * - the fit files of its satellites, and sweep.csv in shard 1 (whole files);
 * - `shard.json`: the shard, the run's file list, and the run's notes as this shard found them, stage
 *   by stage (every report file carries all of the run's notes; merge gathers them from all shards).
 * The data files carry no run notes of their own (merge adds the whole run's). There is no
 * report.html and no text file: the HTML's figures and the text worksheets are drawn from the
 * computed series, which the data files do not hold, so they need one `report` process.
 */
import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { InputError } from '../errors.ts';
import { toJsonText } from '../io/output.ts';
import { prepareOutputFolder, writeOutputFolder } from '../io/outputFolder.ts';
import { loadScenario } from '../io/loadScenario.ts';
import { compareToCsv, compareToJson, sweepToCsv } from '../report/analysisReports.ts';
import { fitToCsv, fitToJson } from '../report/fitReport.ts';
import { passesToCsv, passesToJson } from '../report/passesReport.ts';
import { resetsNotes, resetsToCsv, resetsToJson } from '../report/resetsReport.ts';
import { readReportManifest, REPORT_SHARD_MANIFEST, type ReportShardManifest } from '../report/reportShardMerge.ts';
import { sizeToCsv, sizeToJson } from '../report/sizeReport.ts';
import type { TimeSystem } from '../time/timeSystem.ts';
import { compareShardPlan } from './compareShard.ts';
import { runNotes } from './emit.ts';
import { computeReportParts, fileStem, type ReportPartArgs } from './reportParts.ts';
import { CSV_TAG_PREFIX, shardIds, type ShardSpec, type ShardTag } from './shard.ts';

/** The report flags a shard reads. */
export interface ReportShardArgs extends ReportPartArgs {
  out: string;
  quiet: boolean;
  force?: boolean;
}

/** Write shard K/N of the report of `a.scenario` into `a.out`. */
export function writeReportShard(a: ReportShardArgs, ts: TimeSystem, shard: ShardSpec): void {
  const folderOptions = { force: a.force === true };
  refuseOtherShardsFolder(a.out, shard);
  prepareOutputFolder(a.out, [REPORT_SHARD_MANIFEST], folderOptions);
  const dir = resolve(a.out);
  const scenario = loadScenario(a.scenario, ts);
  const order = scenario.satellites.map((s) => s.id);
  const satellites = shardIds(order, shard);
  const plan = compareShardPlan(order, scenario.stations.map((s) => s.id), shard, undefined, true);
  const parts = computeReportParts(a, ts, scenario, {
    satellites,
    compare: { scenario, clocks: plan.needed, rows: plan.order.filter((id) => plan.rows.has(id)), keepClock: (id) => plan.rows.has(id), keepPair: plan.ownsPair },
    first: shard.k === 1,
  });
  const tag = (command: string, tagOrder: string[] = order): ShardTag => ({ command, index: shard.k, count: shard.n, order: tagOrder });
  const json = (command: string, value: object, tagOrder?: string[]): string => toJsonText({ shard: tag(command, tagOrder), ...value });
  const csv = (command: string, text: string, tagOrder?: string[]): string => `${CSV_TAG_PREFIX}${JSON.stringify(tag(command, tagOrder))}\n${text}`;

  const { passes, resets, sizes, fits, compare, sweep } = parts;
  const rows: [string, string][] = [
    ['passes.csv', csv('passes', passesToCsv(passes.rows, ts))],
    ['passes.json', json('passes', passesToJson(passes.rows, passes.meta, ts))],
    ...(resets === null
      ? []
      : ([
          ['resets.csv', csv('resets', resetsToCsv(resets.plans, ts))],
          ['resets.json', json('resets', resetsToJson(resets.plans, resets.meta, ts))],
        ] as [string, string][])),
    ['size.csv', csv('size', sizeToCsv(sizes.map((s) => s.result), ts))],
    ['size.json', json('size', { satellites: sizes.map((s) => sizeToJson(s.result, ts)) })],
    ['compare.csv', csv('compare', compareToCsv(compare.result, ts), plan.order)],
    ['compare.json', json('compare', compareToJson(compare.result, ts, compare.meta), plan.order)],
  ];
  const whole: [string, string][] = [
    ...fits.flatMap(({ stem, result }): [string, string][] => [
      [`${stem}.csv`, fitToCsv(result)],
      [`${stem}.json`, toJsonText(fitToJson(result))],
    ]),
    ...(sweep === null ? [] : ([['sweep.csv', sweepToCsv(sweep.result)]] as [string, string][])),
  ];
  // The files one report writes (text and HTML aside), whichever shard writes them.
  const measured = scenario.satellites.filter((s) => s.measurementsFile !== null);
  const fitNames = measured.flatMap((s) => {
    const stem = measured.length === 1 ? 'fit' : `fit-${fileStem(s.id)}`;
    return [`${stem}.csv`, `${stem}.json`];
  });
  const files = ['passes.csv', 'passes.json', ...(resets === null ? [] : ['resets.csv', 'resets.json']), 'size.csv', 'size.json', ...fitNames, 'compare.csv', 'compare.json', 'sweep.csv'];
  const manifest: ReportShardManifest = {
    shard: tag('report'),
    scenario: scenario.name,
    files,
    rows: rows.map(([n]) => n),
    whole: whole.map(([n]) => n),
    // After rendering: UTC formatting may still touch the leap-second table.
    notes: [...parts.noteStages, runNotes([], ts)],
    bodyNotes: {
      'passes.json': [passes.meta.notes],
      ...(resets === null ? {} : { 'resets.json': [resets.meta.notes, resets.plans.flatMap((p) => p.notes), resetsNotes([], { ...resets.meta, notes: [] })] }),
    },
  };
  writeOutputFolder(dir, [...rows, ...whole, [REPORT_SHARD_MANIFEST, toJsonText(manifest)]], folderOptions);
  if (!a.quiet) {
    process.stderr.write(`tauplan: report shard ${shard.k}/${shard.n} holds the data files of ${satellites.length} satellites, no report.html or text files (they need one process): join the ${shard.n} folders with tauplan merge DIR_1 … DIR_${shard.n} --out DIR\n`);
  }
  process.stdout.write(`${dir}\n`);
}

/**
 * A shard does not replace the folder of another shard (another index or count): array tasks given
 * one `--out`, or the default one, would otherwise leave only the last task's files, and the merge
 * would find shards missing. The same shard run again (a retried task) replaces its own folder.
 */
function refuseOtherShardsFolder(out: string, shard: ShardSpec): void {
  const file = join(out, REPORT_SHARD_MANIFEST);
  let tag: ReportShardManifest['shard'];
  try {
    tag = readReportManifest(readFileSync(file, 'utf8'), file).shard;
  } catch {
    return; // no shard folder there, or not one this run reads: the folder checks decide
  }
  if (tag.index === shard.k && tag.count === shard.n) return;
  throw new InputError(
    `${out} holds shard ${tag.index}/${tag.count} of a report, and this run is shard ${shard.k}/${shard.n}`,
    '--out',
    `give each shard its own folder, e.g. --out ${out.replace(/[\\/]+$/, '')}-${shard.k}`,
  );
}
