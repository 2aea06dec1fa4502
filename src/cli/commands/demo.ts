/**
 * `tauplan demo [--out DIR]`: the whole job on the embedded INVENTED scenario (data/demo/tessera.yaml):
 * sizing, passes with clock offsets, the keep-in plan, a clock fit to simulated measurements, the
 * clock comparison and the altitude sweep; one HTML report plus CSV and JSON files.
 * Everything is computed before the first file is written; the files go into a temporary folder and
 * are moved in together (src/io/outputFolder.ts), never over files another program wrote unless --force.
 */
import { join, resolve } from 'node:path';
import type { Argv } from 'yargs';
import { PREDICTION_RULE_TEXT } from '../../clock/noise.ts';
import { toJsonText } from '../../io/output.ts';
import { escapeUnsafeText } from '../../report/safeText.ts';
import { prepareOutputFolder, writeOutputFolder } from '../../io/outputFolder.ts';
import { dataPath } from '../../io/tables.ts';
import { planPasses } from '../../plan/passes.ts';
import { sizeClock } from '../../plan/size.ts';
import { compareToJson, sweepToCsv } from '../../report/analysisReports.ts';
import { PLANNING_CAUTION } from '../../report/caution.ts';
import { fitToJson } from '../../report/fitReport.ts';
import { compareSection, fitSection, modelsSection, page, passesSections, resetsSection, sizeSection, windowMeta } from '../../report/htmlReport.ts';
import { passesToCsv, passesToJson, passesToText } from '../../report/passesReport.ts';
import { resetsToCsv, resetsToJson, resetsToText } from '../../report/resetsReport.ts';
import { sizeToCsv } from '../../report/sizeReport.ts';
import { sweepSection } from '../../report/htmlReport.ts';
import type { TimeSystem } from '../../time/timeSystem.ts';
import { loadScenarioContext } from '../scenarioContext.ts';
import { computeCompare, computeFit, computeSweep } from './analysis.ts';
import { computeResets } from './resets.ts';

export function demoOptions<T>(y: Argv<T>) {
  return y
    .option('out', { type: 'string', requiresArg: true, default: './tauplan-demo', describe: 'folder for the report and data files' })
    .option('force', { type: 'boolean', default: false, describe: 'replace files in the folder that tauplan did not write' })
    .option('quiet', { type: 'boolean', default: false, describe: 'print only where the report is' });
}

/** The files the demo writes, in the order of the summary. */
const DEMO_FILES = ['report.html', 'passes.txt', 'passes.csv', 'passes.json', 'resets.txt', 'resets.csv', 'resets.json', 'size.csv', 'fit.json', 'compare.json', 'sweep.csv'] as const;

export function runDemo(a: { out: string; quiet: boolean; force?: boolean }, ts: TimeSystem): void {
  // The output folder is checked (and made) before any work, so a bad --out fails at once.
  const folderOptions = { force: a.force === true };
  prepareOutputFolder(a.out, DEMO_FILES, folderOptions);
  const dir = resolve(a.out);
  const scenarioPath = dataPath('demo/tessera.yaml');
  const ctx = loadScenarioContext(scenarioPath, ts, {});
  const passes = planPasses(ctx.runs, ctx.stations, ctx.gmstRadAt, ctx.fromTtJ2000S, ctx.toTtJ2000S);
  const passMeta = { notes: ctx.runs.flatMap((r) => (r.note === null ? [] : [r.note])), scenario: ctx.scenario.name, fromTtJ2000S: ctx.fromTtJ2000S, toTtJ2000S: ctx.toTtJ2000S, reference: ctx.scenario.reference, gravity: ctx.gravity.name };
  const resets = computeResets({ scenario: scenarioPath }, ts);
  const sizes = ctx.runs.map((run) => sizeClock({ trajectory: run.trajectory, gravity: ctx.gravity, fromTtJ2000S: ctx.fromTtJ2000S, spanS: 86400, nominalHz: 10.23e6 }));
  const { result: fit } = computeFit({ measurements: dataPath('demo/tsr1-offsets.csv'), degree: 1, scenario: scenarioPath, sat: 'TSR-1', clip: 4 }, ts);
  const compare = computeCompare({ scenario: scenarioPath }, ts);
  const sweep = computeSweep({ fromKm: 300, toKm: 40000, points: 120, e: 0, iDeg: 55, gravity: ctx.gravity.name, epoch: '2027-01-04T00:00:00Z' }, ts);

  const html = page(
    'tauplan demo — Tessera timing constellation (invented)',
    'Every satellite, station and measurement in this report is invented for the demonstration.',
    [...windowMeta(ts, ctx.fromTtJ2000S, ctx.toTtJ2000S, ctx.scenario.reference), { label: 'gravity model', value: ctx.gravity.name }, { label: 'scenario', value: 'data/demo/tessera.yaml' }],
    [
      ...passesSections(ts, ctx.runs, passes.rows, ctx.stations.map((s) => s.id), ctx.fromTtJ2000S, ctx.toTtJ2000S),
      resetsSection(ts, resets.ctx.runs, resets.plans, resets.ctx.fromTtJ2000S, resets.ctx.toTtJ2000S, PREDICTION_RULE_TEXT),
      ...sizes.map((r) => sizeSection(r)),
      fitSection(fit),
      compareSection(compare.result),
      sweepSection(sweep.result, sweep.meta.gravity),
      modelsSection(),
    ],
  );
  const files: [(typeof DEMO_FILES)[number], string][] = [
    ['report.html', html],
    ['passes.txt', escapeUnsafeText(passesToText(passes.rows, passMeta, ts))],
    ['passes.csv', passesToCsv(passes.rows, ts)],
    ['passes.json', toJsonText(passesToJson(passes.rows, passMeta, ts))],
    ['resets.txt', escapeUnsafeText(resetsToText(resets.plans, resets.meta, ts))],
    ['resets.csv', resetsToCsv(resets.plans, ts)],
    ['resets.json', toJsonText(resetsToJson(resets.plans, resets.meta, ts))],
    ['size.csv', sizeToCsv(sizes, ts)],
    ['fit.json', toJsonText(fitToJson(fit))],
    ['compare.json', toJsonText(compareToJson(compare.result, ts, compare.meta))],
    ['sweep.csv', sweepToCsv(sweep.result)],
  ];
  writeOutputFolder(dir, files, folderOptions);
  const adjustments = resets.plans.reduce((n, p) => n + p.adjustments.length, 0);
  if (!a.quiet) {
    process.stdout.write(
      [
        'tauplan demo — invented Tessera constellation (6 satellites, 3 stations)',
        `  ${passes.rows.length} passes in ${((ctx.toTtJ2000S - ctx.fromTtJ2000S) / 86400).toFixed(1)} days; ${adjustments} keep-in adjustments planned over ${((resets.ctx.toTtJ2000S - resets.ctx.fromTtJ2000S) / 86400).toFixed(0)} days`,
        `  TSR-1 fit from simulated offsets: y = ${fit.fractionalFrequency?.toExponential(3)} (hardware + mean relativistic)`,
        `  break-even altitude ${sweep.result.breakEvenAltitudeKm?.toFixed(1)} km (i = 55°, ${ctx.gravity.name} gravity)`,
        '',
        `Report: ${join(dir, 'report.html')}`,
        `Data:   ${files.slice(1).map(([n]) => n).join(', ')} in ${dir}`,
        '',
        PLANNING_CAUTION,
        '',
      ].join('\n'),
    );
  } else process.stdout.write(`${join(dir, 'report.html')}\n`);
}
