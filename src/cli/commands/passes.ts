/** `tauplan passes SCENARIO [--from --to --sat --station]`. */
import type { Argv } from 'yargs';
import { planPasses } from '../../plan/passes.ts';
import { passesToCsv, passesToJson, passesToText } from '../../report/passesReport.ts';
import type { TimeSystem } from '../../time/timeSystem.ts';
import type { Rendered } from '../emit.ts';
import { loadScenarioContext } from '../scenarioContext.ts';
import { page, passesSections, windowMeta } from '../../report/htmlReport.ts';

export function passesOptions<T>(y: Argv<T>) {
  return y
    .positional('scenario', { type: 'string', demandOption: true, describe: 'scenario file (JSON or YAML)' })
    .option('from', { type: 'string', describe: 'window start (default: scenario window)' })
    .option('to', { type: 'string', describe: 'window end (default: scenario window)' })
    .option('sat', { type: 'string', describe: 'only these satellites (comma-separated ids or names)' })
    .option('station', { type: 'string', describe: 'only these stations (comma-separated ids)' });
}

export interface PassesArgs {
  scenario: string;
  from?: string;
  to?: string;
  sat?: string;
  station?: string;
}

export function runPasses(a: PassesArgs, ts: TimeSystem): Rendered {
  const ctx = loadScenarioContext(a.scenario, ts, a);
  const plan = planPasses(ctx.runs, ctx.stations, ctx.gmstRadAt, ctx.fromTtJ2000S, ctx.toTtJ2000S);
  const meta = { notes: ctx.runs.flatMap((r) => (r.note === null ? [] : [r.note])), scenario: ctx.scenario.name, fromTtJ2000S: ctx.fromTtJ2000S, toTtJ2000S: ctx.toTtJ2000S, reference: ctx.scenario.reference, gravity: ctx.gravity.name };
  return {
    json: () => passesToJson(plan.rows, meta, ts),
    csv: () => passesToCsv(plan.rows, ts),
    text: () => passesToText(plan.rows, meta, ts),
    html: () =>
      page('tauplan — passes and onboard clock offsets', ctx.scenario.name, windowMeta(ts, ctx.fromTtJ2000S, ctx.toTtJ2000S, ctx.scenario.reference), passesSections(ts, ctx.runs, plan.rows, ctx.stations.map((s) => s.id), ctx.fromTtJ2000S, ctx.toTtJ2000S)),
  };
}
