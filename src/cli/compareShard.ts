/**
 * `compare --shard K/N|auto`: the satellites are split round-robin as for the other scenario
 * commands, and the rows go with them so that merge can join the shards into exactly what one run
 * writes:
 * - a clock's row goes with its satellite; the stations' rows go with shard 1;
 * - a pair goes with its first clock in the run's order (satellites, then stations), except that a
 *   pair with the `--against` reference goes with its other clock;
 * - a shard computes only the clocks its rows and pairs need. Against a reference (the default
 *   with --against) that is its satellites plus the reference; with every pair (no --against, or
 *   --pairs all) a clock's partners are every clock after it, which a shard integrates without
 *   their own figures (about a quarter of a clock's cost).
 * compare's output has no whole-run figure (each row and pair is computed from its own clocks), so
 * the merge only orders rows. Every clock is integrated over the window (a flight over its part
 * inside it; src/plan/compare.ts) whatever the shard, which keeps each figure bit-identical to one run.
 */
import type { ScenarioSpec } from '../model/scenario.ts';
import type { TimeSystem } from '../time/timeSystem.ts';
import type { Rendered } from './emit.ts';
import { requireMergeableFormat, SHARD_OPTIONS, shardIds, shardOf, shardScenario, tagRendered, type ShardArgs, type ShardSpec } from './shard.ts';

/** What one compare shard computes and writes. */
export interface CompareShardPlan {
  /** Every clock of the run, in its order (the tag's order). */
  order: string[];
  /** Clocks whose rows this shard writes. */
  rows: Set<string>;
  /** Clocks it must compute (its rows and both members of its pairs), in the run's order. */
  needed: string[];
  /** Whether the pair (a, b), a before b in the run's order, is this shard's. */
  ownsPair: (a: string, b: string) => boolean;
}

/**
 * The share of shard K/N of a comparison of `satellites` and `stations` (ids in scenario order).
 * `against`: the reference clock; `allPairs`: every pair is kept (no --against, or --pairs all).
 */
export function compareShardPlan(satellites: readonly string[], stations: readonly string[], shard: ShardSpec, against: string | undefined, allPairs: boolean): CompareShardPlan {
  const mine = new Set(shardIds(satellites, shard));
  const rows = new Set([...mine, ...(shard.k === 1 ? stations : [])]);
  const order = [...satellites, ...stations];
  const ownsPair = (a: string, b: string): boolean => (a === against ? rows.has(b) : b === against ? rows.has(a) : rows.has(a));
  const need = new Set(rows);
  if (against !== undefined && !allPairs) {
    need.add(against);
  } else {
    // Every pair (i < j) is kept: a pair's owner needs both clocks (capped: order² pairs).
    for (let i = 0; i < order.length; i++) {
      for (let j = i + 1; j < order.length; j++) {
        if (ownsPair(order[i], order[j])) {
          need.add(order[i]);
          need.add(order[j]);
        }
      }
    }
  }
  return { order, rows, needed: order.filter((id) => need.has(id)), ownsPair };
}

/** What one shard of compare computes (`clocks`, in the run's order) and keeps. */
export interface CompareShare {
  scenario: ScenarioSpec;
  clocks: string[];
  /** Of `clocks`, those whose own row this shard writes (the others are pair partners only). */
  rows: string[];
  keepClock: (id: string) => boolean;
  keepPair: (a: string, b: string) => boolean;
}

/** compare's shard options: the shared ones, with how pairs are shared out. */
export const COMPARE_SHARD_OPTIONS = {
  ...SHARD_OPTIONS,
  shard: {
    ...SHARD_OPTIONS.shard,
    describe: `${SHARD_OPTIONS.shard.describe}. A shard writes its satellites' rows and the pairs they begin (a pair with the --against reference goes with its other clock; stations go with shard 1). Against a reference a shard computes its satellites plus the reference; with every pair it also integrates each pair's partner (without its figures), so it saves less`,
  },
} as const;

/** The compare arguments this needs. */
interface CompareShardArgs extends ShardArgs {
  scenario: string;
  against?: string;
  pairs?: string;
  format?: string;
}

/**
 * Run compare on its shard, or whole without --shard. `run` computes the comparison of the given
 * clocks (all when undefined) and filters its rows with `keep` before rendering.
 */
export function shardedCompare<A extends CompareShardArgs>(
  a: A,
  ts: TimeSystem,
  run: (a: A, share?: CompareShare) => Rendered,
): Rendered {
  const shard = shardOf(a);
  if (shard === null) return run(a);
  requireMergeableFormat(a.format);
  const scenario = shardScenario(a, ts);
  const allPairs = a.against === undefined || a.pairs === 'all';
  const plan = compareShardPlan(
    scenario.satellites.map((s) => s.id),
    scenario.stations.map((s) => s.id),
    shard,
    a.against,
    allPairs,
  );
  const r = run(a, { scenario, clocks: plan.needed, rows: plan.order.filter((id) => plan.rows.has(id)), keepClock: (id) => plan.rows.has(id), keepPair: plan.ownsPair });
  return tagRendered(r, { command: 'compare', index: shard.k, count: shard.n, order: plan.order });
}
