/**
 * The parts of `tauplan report` (passes, keep-in plans, sizes, fits, comparison, sweep) and the
 * run's notes in the order the report gathers them, for the whole scenario or for one shard's
 * satellites (src/cli/reportShard.ts). Both paths compute each part the same way, so a shard's
 * rows are the rows one run writes for those satellites.
 */
import { runPasses, type PassesRun } from '../api/passes.ts';
import { runResets, type ResetsRun } from '../api/resets.ts';
import { sizeScenarioSatellites } from '../api/size.ts';
import type { FitResult } from '../api/fitFile.ts';
import type { CompareRun } from '../api/compare.ts';
import { InputError } from '../errors.ts';
import type { ScenarioSpec } from '../model/scenario.ts';
import { missingGeoidNote } from '../report/notes.ts';
import type { TimeSystem } from '../time/timeSystem.ts';
import { computeCompare } from './commands/compare.ts';
import { computeFit } from './commands/fit.ts';
import { computeSweep } from './commands/sweep.ts';
import type { CompareShare } from './compareShard.ts';

/** The report flags the parts depend on. */
export interface ReportPartArgs {
  scenario: string;
  from?: string;
  to?: string;
  horizon?: string;
}

/** The note a report without any keep-in limit carries. */
export const NO_LIMIT_NOTE = 'no satellite has a keep-in limit (clock.keepInNs): the report has no adjustment plan';

/** One shard's share of a report: its satellites and its part of the comparison. */
export interface ReportShare {
  satellites: string[];
  compare: CompareShare;
  /** Shard 1 also writes the parts that belong to no satellite (the sweep). */
  first: boolean;
}

/** Everything a report renders. */
export interface ReportParts {
  passes: PassesRun;
  /** Null when no satellite of the run has a keep-in limit. */
  resets: ResetsRun | null;
  sizes: ReturnType<typeof sizeScenarioSatellites>['sizes'];
  fits: { satellite: string; stem: string; result: FitResult }[];
  compare: CompareRun;
  /** Null in a shard other than the first. */
  sweep: ReturnType<typeof computeSweep> | null;
  /**
   * The run's notes by stage, in the report's order: passes, stations without a geoid height,
   * keep-in plans, sizes, comparison (the leap-second note is added after rendering).
   */
  noteStages: string[][];
}

/** A satellite id as part of a file name: letters, digits, dot, dash and underscore only. */
export function fileStem(id: string): string {
  const s = id.replace(/[^A-Za-z0-9._-]+/g, '_').replace(/^[.-]+/, '');
  if (s === '') throw new InputError(`satellite id ${JSON.stringify(id)} gives no usable file name`, 'satellites[].id', 'use letters and digits in ids with measurements');
  return s;
}

/** Compute the report's parts for the whole scenario, or for `share` of it. */
export function computeReportParts(a: ReportPartArgs, ts: TimeSystem, scenario: ScenarioSpec, share?: ReportShare): ReportParts {
  const sat = share === undefined ? undefined : share.satellites.join(',');
  const passes = runPasses(scenario, { timeSystem: ts, from: a.from, to: a.to, sat });
  const ctx = passes.context;
  const geoid = ctx.scenario.stations.filter((s) => !s.geoidHeightGiven && s.body !== 'moon').map((s) => missingGeoidNote(s.id));

  // Whether the report has a plan is a property of the whole run, not of one shard's satellites.
  const withLimit = share === undefined ? ctx.runs.some((r) => r.keepInNs !== null) : scenario.satellites.some((s) => s.clock !== null && s.clock.keepInNs !== null);
  // A shard without a limited satellite still has the plan's header (window and policy), no plans.
  const resets = withLimit ? runResets(scenario, { timeSystem: ts, horizon: a.horizon, from: a.from, sat, noPlansWithoutLimit: share !== undefined }) : null;

  const { sizes, notes: sizeNotes } = sizeScenarioSatellites(ctx);

  // File names follow the whole run: fit.* when one satellite of the scenario has measurements.
  const measured = scenario.satellites.filter((s) => s.measurementsFile !== null).length;
  const fits: ReportParts['fits'] = [];
  for (const s of ctx.satellites) {
    if (s.measurementsFile === null) continue;
    const { result } = computeFit({ measurements: s.measurementsFile, degree: 1, scenario: a.scenario, sat: s.id, clip: 4 }, ts);
    fits.push({ satellite: s.id, stem: measured === 1 ? 'fit' : `fit-${fileStem(s.id)}`, result });
  }

  const compareRun = computeCompare({ scenario: a.scenario, from: a.from, to: a.to }, ts, scenario, share?.compare);
  const compare = share === undefined ? compareRun : { ...compareRun, result: { ...compareRun.result, clocks: compareRun.result.clocks.filter((c) => share.compare.keepClock(c.id)), pairs: compareRun.result.pairs.filter((p) => share.compare.keepPair(p.a, p.b)) } };
  // The rate against altitude puts the scenario's orbits in context (circular orbits at 55°).
  const sweep = share === undefined || share.first ? computeSweep({ fromKm: 300, toKm: 40000, points: 120, e: 0, iDeg: 55, gravity: ctx.gravity.name, epoch: ts.format(ctx.scenario.window.start) }, ts) : null;

  const noteStages = [passes.meta.notes, geoid, resets === null ? [NO_LIMIT_NOTE] : resets.meta.notes, sizeNotes, compare.notes];
  return { passes, resets, sizes, fits, compare, sweep, noteStages };
}
