/**
 * `--shard K/N` and `--shard auto` for the scenario commands passes, resets, navclock, compare and
 * report: the satellites a run selects are split round-robin (scenario order, after --sat) and this
 * run keeps those whose 0-based position i has i mod N = K − 1, as `size --all --shard` does with
 * element sets. The output is tagged (JSON: a `shard` field; CSV: a first `# shard` line) so that
 * `tauplan merge` can join the shard outputs into exactly what one run writes. compare's pairs are
 * shared out in src/cli/compareShard.ts, report's folders in src/cli/reportShard.ts.
 *
 * `--shard auto` takes K and N from a batch scheduler's environment (only the CLI reads it):
 * - Slurm job arrays: SLURM_ARRAY_TASK_ID, SLURM_ARRAY_TASK_COUNT and SLURM_ARRAY_TASK_MIN
 *   (K = (ID − MIN) / STEP + 1 with SLURM_ARRAY_TASK_STEP, default 1; N = COUNT);
 * - Kubernetes Indexed Jobs: JOB_COMPLETION_INDEX (0-based) with `--shard-count N`.
 */
import { InputError } from '../errors.ts';
import { loadScenario } from '../io/loadScenario.ts';
import type { SatelliteSpec, ScenarioSpec } from '../model/scenario.ts';
import type { TimeSystem } from '../time/timeSystem.ts';
import type { Rendered } from './emit.ts';
import { selectSatellites } from '../api/scenario.ts';

/** Shard K of N (1 ≤ K ≤ N). */
export interface ShardSpec {
  k: number;
  n: number;
}

/** `K/N` as size --all --shard reads it. */
function parseShard(text: string, where: string): ShardSpec {
  const m = /^\s*(\d+)\s*\/\s*(\d+)\s*$/.exec(text);
  const k = m === null ? NaN : Number(m[1]);
  const n = m === null ? NaN : Number(m[2]);
  if (!(Number.isSafeInteger(k) && Number.isSafeInteger(n) && k >= 1 && n >= 1 && k <= n)) {
    throw new InputError(`shard "${text}" is not K/N with 1 ≤ K ≤ N, or auto`, where, 'write e.g. 2/4 for the second of four slices, or auto under Slurm or Kubernetes');
  }
  return { k, n };
}

/** The shard options of a scenario command. */
export interface ShardArgs {
  shard?: string;
  shardCount?: number;
}

const SLURM_HINT = 'run it as a Slurm job array (sbatch --array=0-N) or give --shard K/N';
const K8S_HINT = 'run it as a Kubernetes Indexed Job (completionMode: Indexed) or give --shard K/N';

/** A whole number from an environment variable, or an input error naming it. */
function envInteger(env: NodeJS.ProcessEnv, name: string, hint: string): number {
  const text = env[name];
  if (text === undefined || text.trim() === '') throw new InputError(`${name} is not set`, name, hint);
  if (!/^\s*-?\d+\s*$/.test(text)) throw new InputError(`${name} ${JSON.stringify(text)} is not a whole number`, name, hint);
  const v = Number(text);
  if (!Number.isSafeInteger(v)) throw new InputError(`${name} ${JSON.stringify(text)} is not a whole number`, name, hint);
  return v;
}

/** The shard K/N of `--shard auto` from the scheduler's environment. */
export function shardFromEnvironment(env: NodeJS.ProcessEnv, shardCount: number | undefined): ShardSpec {
  if (env.SLURM_ARRAY_TASK_ID !== undefined) {
    const id = envInteger(env, 'SLURM_ARRAY_TASK_ID', SLURM_HINT);
    const count = envInteger(env, 'SLURM_ARRAY_TASK_COUNT', SLURM_HINT);
    const min = envInteger(env, 'SLURM_ARRAY_TASK_MIN', SLURM_HINT);
    const step = env.SLURM_ARRAY_TASK_STEP === undefined ? 1 : envInteger(env, 'SLURM_ARRAY_TASK_STEP', SLURM_HINT);
    if (count < 1) throw new InputError(`SLURM_ARRAY_TASK_COUNT ${count} is below 1`, 'SLURM_ARRAY_TASK_COUNT', SLURM_HINT);
    if (step < 1) throw new InputError(`SLURM_ARRAY_TASK_STEP ${step} is below 1`, 'SLURM_ARRAY_TASK_STEP', SLURM_HINT);
    const k = (id - min) / step;
    if (!(Number.isSafeInteger(k) && k >= 0 && k < count)) {
      throw new InputError(`SLURM_ARRAY_TASK_ID ${id} is not one of the ${count} tasks from ${min} in steps of ${step}`, 'SLURM_ARRAY_TASK_ID', 'give the array as one range, e.g. --array=0-7 (no lists with gaps)');
    }
    if (shardCount !== undefined && shardCount !== count) {
      throw new InputError(`--shard-count ${shardCount} differs from SLURM_ARRAY_TASK_COUNT ${count}`, '--shard-count', 'leave --shard-count out under Slurm, or make the array that size');
    }
    return { k: k + 1, n: count };
  }
  if (env.JOB_COMPLETION_INDEX !== undefined) {
    const index = envInteger(env, 'JOB_COMPLETION_INDEX', K8S_HINT);
    if (shardCount === undefined) throw new InputError('JOB_COMPLETION_INDEX needs --shard-count', '--shard-count', 'give --shard-count equal to the Job\'s completions');
    if (!(index >= 0 && index < shardCount)) {
      throw new InputError(`JOB_COMPLETION_INDEX ${index} is outside 0–${shardCount - 1}`, 'JOB_COMPLETION_INDEX', 'give --shard-count equal to the Job\'s completions');
    }
    return { k: index + 1, n: shardCount };
  }
  throw new InputError('--shard auto found no scheduler variables (SLURM_ARRAY_TASK_ID or JOB_COMPLETION_INDEX)', '--shard', 'run it as a Slurm job array (sbatch --array=0-N) or a Kubernetes Indexed Job (completionMode: Indexed), or give --shard K/N');
}

/** The shard of a run, or null without --shard. Refuses --shard-count without --shard auto. */
export function shardOf(a: ShardArgs, env: NodeJS.ProcessEnv = process.env): ShardSpec | null {
  if (a.shardCount !== undefined && !(Number.isSafeInteger(a.shardCount) && a.shardCount >= 1)) {
    throw new InputError(`--shard-count ${a.shardCount} is not a whole number ≥ 1`, '--shard-count', 'give the number of shards, e.g. 8');
  }
  if (a.shard === undefined) {
    if (a.shardCount !== undefined) throw new InputError('--shard-count is only read with --shard auto', '--shard-count', 'add --shard auto, or leave --shard-count out');
    return null;
  }
  if (a.shard.trim() === 'auto') return shardFromEnvironment(env, a.shardCount);
  if (a.shardCount !== undefined) throw new InputError('--shard-count is only read with --shard auto', '--shard-count', 'leave it out with --shard K/N');
  return parseShard(a.shard, '--shard');
}

/** The ids of one shard: position i of `ids` is kept when i mod N = K − 1. An empty shard is refused. */
export function shardIds(ids: readonly string[], shard: ShardSpec): string[] {
  const kept = ids.filter((_, i) => i % shard.n === shard.k - 1);
  if (kept.length === 0) throw new InputError(`shard ${shard.k}/${shard.n} has no satellites (the run selects ${ids.length})`, '--shard', `use at most ${ids.length} shards`);
  return kept;
}

/** The tag merge reads: which shard this is and the order of every satellite of the run. */
export interface ShardTag {
  command: string;
  index: number;
  count: number;
  /** Every satellite the unsharded run would have, in its order (compare: every clock, satellites then stations). */
  order: string[];
  /**
   * The output's notes from per-satellite stages, stage by stage (resets: the orbits' notes, then the
   * plans'), so that merge joins each stage in satellite order instead of interleaving them.
   */
  stages?: string[][];
}

/** A command's rendering with, optionally, its notes by stage (for the tag). */
export type StagedRendered = Rendered & { noteStages?: string[][] };

/** A rendered output with the shard tag merge reads (JSON: a leading `shard` field; CSV: a first `# shard` line). */
export function tagRendered(r: Rendered, tag: ShardTag): Rendered {
  const csv = r.csv;
  return {
    ...r,
    json: () => ({ shard: tag, ...(r.json() as Record<string, unknown>) }),
    ...(csv === undefined ? {} : { csv: () => `${CSV_TAG_PREFIX}${JSON.stringify(tag)}\n${csv()}` }),
  };
}

/** The first line of a tagged CSV shard (src/report/shardMerge.ts reads it). */
export const CSV_TAG_PREFIX = '# shard ';

/** The scenario a shard runs on (--shard needs one). */
export function shardScenario(a: { scenario?: string }, ts: TimeSystem): ScenarioSpec {
  if (a.scenario === undefined) throw new InputError('--shard needs a scenario', '--shard', 'give the scenario file, or leave --shard out');
  return loadScenario(a.scenario, ts);
}

/** --shard writes JSON or CSV (what merge joins). */
export function requireMergeableFormat(format: string | undefined): void {
  if (format !== 'json' && format !== 'csv') throw new InputError(`--shard writes json or csv, not ${format ?? 'text'}`, '--format', 'add --format json or --format csv, then join the shards with tauplan merge');
}

/** The yargs options. */
export const SHARD_OPTIONS = {
  shard: { type: 'string', requiresArg: true, describe: 'K/N: only satellites whose 0-based position i has i mod N = K-1 (join with merge); auto: K and N from Slurm array or Kubernetes Indexed Job variables' },
  'shard-count': { type: 'number', requiresArg: true, describe: 'with --shard auto under a Kubernetes Indexed Job: the number of shards (the Job\'s completions)' },
} as const;

/** report's shard options: the shared ones, with what a shard folder holds. */
export const REPORT_SHARD_OPTIONS = {
  ...SHARD_OPTIONS,
  shard: {
    ...SHARD_OPTIONS.shard,
    describe: `${SHARD_OPTIONS.shard.describe}. The --out folder gets the data files (CSV, JSON) of this shard's satellites and a shard.json, no report.html or text files; tauplan merge DIR_1 ... DIR_N --out DIR joins them into the data files of one report`,
  },
} as const;

/**
 * Run a scenario command on its shard: with --shard, the run's satellites (after --sat, and only
 * those `eligible` for the command) are split round-robin, the command runs on this shard's
 * satellites, and its JSON or CSV carries the tag merge reads. Without --shard, `run` as is.
 * The scenario read here is passed to `run`, so a shard reads and checks it once.
 */
export async function sharded<A extends ShardArgs & { scenario?: string; sat?: string; format?: string }>(
  a: A,
  command: string,
  ts: TimeSystem,
  run: (a: A, scenario?: ScenarioSpec) => StagedRendered | Promise<StagedRendered>,
  eligible: (s: SatelliteSpec) => boolean = () => true,
): Promise<Rendered> {
  const shard = shardOf(a);
  if (shard === null) return run(a);
  requireMergeableFormat(a.format);
  const scenario = shardScenario(a, ts);
  const order = selectSatellites(scenario, a).filter(eligible).map((s) => s.id);
  const ids = shardIds(order, shard);
  const r = await run({ ...a, sat: ids.join(',') }, scenario);
  return tagRendered(r, { command, index: shard.k, count: shard.n, order, ...(r.noteStages === undefined ? {} : { stages: r.noteStages }) });
}
