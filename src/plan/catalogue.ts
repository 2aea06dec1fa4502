/**
 * Use case `size --all`: sizing every element set of a catalogue, one outcome per element set.
 * A satellite that cannot be sized (SGP4 decay, eccentricity out of range, ...) becomes a failure
 * outcome carrying its reason; the others go on. No I/O here: the CLI edge reads the file, spreads
 * the work over worker threads and writes the rows (src/cli/commands/sizeAll.ts).
 *
 * Times are seconds since J2000.0 TT; spans in seconds; frequencies in Hz.
 */
import { gravityModel, type GravityModel } from '../orbit/gravity.ts';
import { InputError, InternalError } from '../errors.ts';
import type { OmmRecord, TleRecord } from '../model/elementSet.ts';
import { Sgp4Trajectory } from '../orbit/sgp4.ts';
import type { TimeSystem } from '../time/timeSystem.ts';
import { sizeClock, type SizeResult } from './size.ts';

/** Options shared by every satellite of a catalogue run (the same as single `size`). */
export interface CatalogueSizeOptions {
  /** Gravity model name: point | j2 | zonal. */
  gravityName: string;
  /** Length of the span [s]. */
  spanS: number;
  /** Start of the span [s since J2000.0 TT]; null = each element set's own epoch. */
  fromTtJ2000S: number | null;
  /** Nominal oscillator frequency [Hz]. */
  nominalHz: number;
}

/** One element set to size, with its position in the file. */
export interface CatalogueItem {
  /** 0-based position of the element set in the file (file order, before any sharding). */
  index: number;
  /** Satellite id as single `size` reports it (catalogue number, or OMM NORAD_CAT_ID / OBJECT_ID). */
  id: string;
  /** Display name (TLE name line, OMM OBJECT_NAME) or the id. */
  name: string;
  record: TleRecord | OmmRecord;
}

/** The outcome for one element set: a result, or the one-line reason it could not be sized. */
export type CatalogueOutcome =
  | { index: number; id: string; name: string; ok: true; result: SizeResult }
  | { index: number; id: string; name: string; ok: false; error: string };

/** The K-th (1-based) of N slices: element sets whose 0-based index i has i mod N = K − 1. */
export interface ShardSpec {
  k: number;
  n: number;
}

/** Read `K/N` (1 ≤ K ≤ N). */
export function parseShard(text: string, where: string): ShardSpec {
  const m = /^\s*(\d+)\s*\/\s*(\d+)\s*$/.exec(text);
  const k = m === null ? NaN : Number(m[1]);
  const n = m === null ? NaN : Number(m[2]);
  if (!(Number.isSafeInteger(k) && Number.isSafeInteger(n) && k >= 1 && n >= 1 && k <= n)) {
    throw new InputError(`shard "${text}" is not K/N with 1 ≤ K ≤ N`, where, 'write e.g. 2/4 for the second of four slices');
  }
  return { k, n };
}

/** Whether the element set at 0-based file position `index` belongs to the shard (round-robin slices). */
export function inShard(index: number, shard: ShardSpec | null): boolean {
  return shard === null || index % shard.n === shard.k - 1;
}

/** Reason text of a per-satellite failure (one line). */
export function failureReason(e: unknown): string {
  if (e instanceof InputError) return e.message.replace(/\s+/g, ' ');
  const msg = e instanceof Error ? `${e.name}: ${e.message}` : String(e);
  return `internal fault: ${msg.replace(/\s+/g, ' ')}`;
}

/**
 * Size one element set over [from, from + span], `from` being the given start or the element-set
 * epoch, exactly as single `size --tle FILE --sat ID` does. Never throws: a fault is an outcome.
 */
export function sizeCatalogueItem(item: CatalogueItem, opts: CatalogueSizeOptions, ts: TimeSystem, gravity: GravityModel = gravityModel(opts.gravityName, '--gravity')): CatalogueOutcome {
  const { index, id, name } = item;
  try {
    // The span is widened to hold the element-set epoch, as the single-satellite path does.
    const trajectory = new Sgp4Trajectory(item.record, ts, {
      id,
      spanFor: (epoch) => {
        const start = opts.fromTtJ2000S ?? epoch;
        return { fromTtJ2000S: Math.min(start, epoch), toTtJ2000S: Math.max(start + opts.spanS, epoch) };
      },
    });
    const from = opts.fromTtJ2000S ?? trajectory.epochTtJ2000S;
    const result = sizeClock({ trajectory, gravity, fromTtJ2000S: from, spanS: opts.spanS, nominalHz: opts.nominalHz });
    return { index, id, name, ok: true, result };
  } catch (e) {
    return { index, id, name, ok: false, error: failureReason(e) };
  }
}

/**
 * Releases items in sequence order as soon as the in-order prefix is complete, so a caller can
 * stream results that arrive out of order while holding only the ones ahead of a gap.
 */
export class InOrderBuffer<T> {
  private readonly waiting = new Map<number, T>();
  private nextSeq = 0;

  /** Store item `seq` (0, 1, 2, ...) and return every item now releasable, in order. */
  put(seq: number, item: T): T[] {
    if (seq < this.nextSeq || this.waiting.has(seq)) throw new InternalError(`sequence ${seq} delivered twice`, 'catalogue order');
    this.waiting.set(seq, item);
    const ready: T[] = [];
    for (let v = this.waiting.get(this.nextSeq); v !== undefined; v = this.waiting.get(this.nextSeq)) {
      this.waiting.delete(this.nextSeq);
      ready.push(v);
      this.nextSeq++;
    }
    return ready;
  }

  /** Items held back behind a gap. */
  get pending(): number {
    return this.waiting.size;
  }

  /** Sequence number the buffer is waiting for. */
  get next(): number {
    return this.nextSeq;
  }
}
