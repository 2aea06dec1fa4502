/**
 * `tauplan report SCENARIO [--out DIR] [--from --to] [--horizon]`: the whole job on a scenario —
 * passes with clock offsets, the keep-in plan, sizing per satellite, the clock comparison, and a
 * clock fit for every satellite that names `measurements`, and the clock rate against altitude —
 * as one HTML report plus text, CSV and JSON files. `tauplan demo` is `report` on the embedded
 * INVENTED scenario (data/demo/tessera.yaml).
 * Everything is computed before the first file is written; each file is written atomically.
 */
import { join, resolve } from 'node:path';
import type { Argv } from 'yargs';
import { PREDICTION_BAND_RULE } from '../../api/resets.ts';
import { loadScenario } from '../../io/loadScenario.ts';
import type { ScenarioSpec } from '../../model/scenario.ts';
import { toJsonText } from '../../io/output.ts';
import { prepareOutputFolder, writeOutputFolder } from '../../io/outputFolder.ts';
import { escapeUnsafeText } from '../../report/safeText.ts';
import { dataPath } from '../../io/tables.ts';
import { compareToCsv, compareToJson, compareToText, sweepToCsv } from '../../report/analysisReports.ts';
import { PLANNING_CAUTION } from '../../report/caution.ts';
import { fitToCsv, fitToJson, fitToText } from '../../report/fitReport.ts';
import { typographicMinus } from '../../report/format.ts';
import type { SectionSpec } from '../../report/html.ts';
import { compareFigures, compareSection, fitSection, modelsSection, page, passesSections, resetsSection, sizeSection, sweepSection, windowMeta } from '../../report/htmlReport.ts';
import { withNotes, type NoteFormat } from '../../report/notes.ts';
import { passesToCsv, passesToJson, passesToText } from '../../report/passesReport.ts';
import { resetsToCsv, resetsToJson, resetsToText } from '../../report/resetsReport.ts';
import { sizeToCsv, sizeToJson, sizeToText } from '../../report/sizeReport.ts';
import type { TimeSystem } from '../../time/timeSystem.ts';
import { runNotes } from '../emit.ts';
import { computeReportParts } from '../reportParts.ts';
import { writeReportShard } from '../reportShard.ts';
import { shardOf, type ShardArgs } from '../shard.ts';

export function reportOptions<T>(y: Argv<T>) {
  return y
    .positional('scenario', { type: 'string', demandOption: true, describe: 'scenario file (JSON or YAML)' })
    .option('out', { type: 'string', requiresArg: true, default: './tauplan-report', describe: 'folder for the report and data files' })
    .option('from', { type: 'string', requiresArg: true, describe: 'window start (default: scenario window)' })
    .option('to', { type: 'string', requiresArg: true, describe: 'window end (default: scenario window)' })
    .option('horizon', { type: 'string', requiresArg: true, describe: 'keep-in planning horizon from the window start (default: policy.horizon, else 180d)' })
    .option('force', { type: 'boolean', default: false, describe: 'replace files in the folder that tauplan did not write' })
    .option('quiet', { type: 'boolean', default: false, describe: 'print only where the report is' });
}

export function demoOptions<T>(y: Argv<T>) {
  return y
    .option('out', { type: 'string', requiresArg: true, default: './tauplan-demo', describe: 'folder for the report and data files' })
    .option('force', { type: 'boolean', default: false, describe: 'replace files in the folder that tauplan did not write' })
    .option('quiet', { type: 'boolean', default: false, describe: 'print only where the report is' });
}

export interface ReportArgs {
  scenario: string;
  out: string;
  from?: string;
  to?: string;
  horizon?: string;
  quiet: boolean;
  force?: boolean;
}

/** Files every report writes (resets and fit files depend on the scenario). */
const ALWAYS_WRITTEN = ['report.html', 'passes.txt', 'passes.csv', 'passes.json', 'size.txt', 'size.csv', 'size.json', 'compare.txt', 'compare.csv', 'compare.json', 'sweep.csv'];

interface ReportStyle {
  title: string;
  subtitle: string;
  /** How the scenario is named in the report's meta rows. */
  scenarioLabel: string;
}

export function runReport(a: ReportArgs & ShardArgs, ts: TimeSystem): void {
  const shard = shardOf(a);
  if (shard !== null) {
    writeReportShard(a, ts, shard);
    return;
  }
  const scenario = loadScenario(a.scenario, ts);
  writeReport(a, ts, { title: `tauplan report — ${scenario.name}`, subtitle: 'Passes, keep-in plan, sizing, clock comparison and fits for this scenario.', scenarioLabel: a.scenario }, scenario);
}

export function runDemo(a: { out: string; quiet: boolean; force?: boolean }, ts: TimeSystem): void {
  writeReport(
    { scenario: dataPath('demo/tessera.yaml'), out: a.out, quiet: a.quiet, force: a.force },
    ts,
    { title: 'tauplan demo — Tessera timing constellation (invented)', subtitle: 'Every satellite, station and measurement in this report is invented for the demonstration.', scenarioLabel: 'data/demo/tessera.yaml' },
  );
}

/** `parsed`: the scenario already read (runReport reads it for the title). */
function writeReport(a: ReportArgs, ts: TimeSystem, style: ReportStyle, parsed?: ScenarioSpec): void {
  // The output folder is checked (and made) before any work, so a bad --out fails at once; files
  // go in through a temporary folder, never over files another program wrote unless --force.
  const folderOptions = { force: a.force === true };
  prepareOutputFolder(a.out, ALWAYS_WRITTEN, folderOptions);
  const dir = resolve(a.out);
  const scenario = parsed ?? loadScenario(a.scenario, ts);
  const { passes, resets, sizes, fits, compare, sweep: sweepRun, noteStages } = computeReportParts(a, ts, scenario);
  const ctx = passes.context;
  const passMeta = passes.meta;
  const sweep = sweepRun as NonNullable<typeof sweepRun>;

  const sections: SectionSpec[] = [
    ...passesSections(ts, ctx.runs, passes.rows, ctx.stations.map((s) => s.id), ctx.fromTtJ2000S, ctx.toTtJ2000S),
    ...(resets === null ? [] : [resetsSection(ts, resets.context.runs, resets.plans, resets.context.fromTtJ2000S, resets.context.toTtJ2000S, PREDICTION_BAND_RULE)]),
    ...sizes.map((s) => sizeSection(s.result, s.title)),
    ...fits.map((f) => fitSection(f.result)),
    compareSection(ts, compare.result, compare.meta, compareFigures(ts, compare.result)),
    sweepSection(sweep.result, sweep.meta.gravity),
    modelsSection(),
  ];
  const meta = [...windowMeta(ts, ctx.fromTtJ2000S, ctx.toTtJ2000S, ctx.scenario.reference), { label: 'gravity model', value: ctx.gravity.name }, { label: 'scenario', value: style.scenarioLabel }];

  // Render everything (UTC formatting may still touch the leap-second table), then add the run's notes.
  const files: [string, NoteFormat, string][] = [
    ['report.html', 'html', page(style.title, style.subtitle, meta, sections)],
    ['passes.txt', 'text', passesToText(passes.rows, passMeta, ts)],
    ['passes.csv', 'csv', passesToCsv(passes.rows, ts)],
    ['passes.json', 'json', toJsonText(passesToJson(passes.rows, passMeta, ts))],
    ...(resets === null
      ? []
      : ([
          ['resets.txt', 'text', resetsToText(resets.plans, resets.meta, ts)],
          ['resets.csv', 'csv', resetsToCsv(resets.plans, ts)],
          ['resets.json', 'json', toJsonText(resetsToJson(resets.plans, resets.meta, ts))],
        ] as [string, NoteFormat, string][])),
    ['size.txt', 'text', sizes.map((s) => sizeToText(s.result, ts, s.title)).join('\n')],
    ['size.csv', 'csv', sizeToCsv(sizes.map((s) => s.result), ts)],
    ['size.json', 'json', toJsonText({ satellites: sizes.map((s) => sizeToJson(s.result, ts)) })],
    ...fits.flatMap(({ stem, result }): [string, NoteFormat, string][] => {
      return [
        [`${stem}.txt`, 'text', fitToText(result, ts)],
        [`${stem}.csv`, 'csv', fitToCsv(result)],
        [`${stem}.json`, 'json', toJsonText(fitToJson(result))],
      ];
    }),
    ['compare.txt', 'text', compareToText(compare.result, ts, compare.meta)],
    ['compare.csv', 'csv', compareToCsv(compare.result, ts)],
    ['compare.json', 'json', toJsonText(compareToJson(compare.result, ts, compare.meta))],
    ['sweep.csv', 'csv', sweepToCsv(sweep.result)],
  ];
  const all = runNotes(noteStages.flat(), ts);
  const finished = files.map(([name, format, body]): [string, string] => {
    const b = withNotes(format, body, all);
    return [name, format === 'text' ? typographicMinus(escapeUnsafeText(b)) : b];
  });
  writeOutputFolder(dir, finished, folderOptions);

  const adjustments = resets === null ? 0 : resets.plans.reduce((n, p) => n + p.adjustments.length, 0);
  if (a.quiet) {
    process.stdout.write(`${join(dir, 'report.html')}\n`);
    return;
  }
  const lines = [
    `${style.title}`,
    `  ${ctx.runs.length} satellites, ${ctx.stations.length} stations; ${passes.rows.length} passes in ${((ctx.toTtJ2000S - ctx.fromTtJ2000S) / 86400).toFixed(1)} days`,
    resets === null ? '  no keep-in plan (no satellite has a keep-in limit)' : `  ${adjustments} keep-in adjustments planned over ${((resets.context.toTtJ2000S - resets.context.fromTtJ2000S) / 86400).toFixed(0)} days`,
    ...fits.map((f) => `  ${f.satellite} fit from ${f.result.used} measurements: y = ${f.result.fractionalFrequency === null ? '—' : f.result.fractionalFrequency.toExponential(3)} (hardware + mean relativistic)`),
    `  break-even altitude ${sweep.result.breakEvenAltitudeKm?.toFixed(1)} km (i = 55°, ${ctx.gravity.name} gravity)`,
    ...all.map((n) => `  NOTE: ${n}`),
    '',
    `Report: ${join(dir, 'report.html')}`,
    `Data:   ${finished.slice(1).map(([n]) => n).join(', ')} in ${dir}`,
    '',
    PLANNING_CAUTION,
    '',
  ];
  process.stdout.write(typographicMinus(escapeUnsafeText(lines.join('\n'))));
}
