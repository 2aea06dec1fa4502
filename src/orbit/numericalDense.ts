/**
 * Dense output of the numerical propagator: quintic Hermite interpolation between stored nodes
 * (position, velocity and acceleration at both ends), and the node store.
 *
 * The store keeps nodes in chunks of at most {@link CHUNK_NODES}. Each chunk remembers the
 * integrator state it started from, so that a chunk dropped to bound memory (long spans: a
 * 10-year LEO has ~5 million nodes) is rebuilt on demand by integrating it again; the integrator is
 * deterministic, so the rebuilt nodes are the same to the bit. At most {@link RESIDENT_NODE_LIMIT}
 * nodes stay in memory, least recently used dropped first.
 */

/** Nodes per chunk. */
export const CHUNK_NODES = 8192;
/** Nodes kept in memory (10 doubles each: about 24 MB). */
export const RESIDENT_NODE_LIMIT = 300_000;
/** Numbers per node: r [m], v [m/s], a [m/s²]. */
export const NODE_WIDTH = 9;

/** Quintic Hermite position and velocity at τ on [τ0, τ1] from node records (r, v, a) at o0 and o1. */
export function hermiteInto(
  tau0: number,
  n0: ArrayLike<number>,
  o0: number,
  tau1: number,
  n1: ArrayLike<number>,
  o1: number,
  tau: number,
  outR: Float64Array,
  outV: Float64Array,
  oo: number,
): void {
  const h = tau1 - tau0;
  if (h === 0) {
    for (let c = 0; c < 3; c++) {
      outR[oo + c] = n0[o0 + c];
      outV[oo + c] = n0[o0 + 3 + c];
    }
    return;
  }
  const s = (tau - tau0) / h;
  const s2 = s * s;
  const s3 = s2 * s;
  const s4 = s3 * s;
  const s5 = s4 * s;
  const h1 = s - 6 * s3 + 8 * s4 - 3 * s5;
  const h2 = 0.5 * (s2 - 3 * s3 + 3 * s4 - s5);
  const h3 = 10 * s3 - 15 * s4 + 6 * s5;
  const h4 = -4 * s3 + 7 * s4 - 3 * s5;
  const h5 = 0.5 * (s3 - 2 * s4 + s5);
  const d0 = -30 * s2 + 60 * s3 - 30 * s4;
  const d1 = 1 - 18 * s2 + 32 * s3 - 15 * s4;
  const d2 = 0.5 * (2 * s - 9 * s2 + 12 * s3 - 5 * s4);
  const d4 = -12 * s2 + 28 * s3 - 15 * s4;
  const d5 = 0.5 * (3 * s2 - 8 * s3 + 5 * s4);
  const hh = h * h;
  for (let c = 0; c < 3; c++) {
    const p0 = n0[o0 + c];
    const v0 = n0[o0 + 3 + c];
    const a0 = n0[o0 + 6 + c];
    const p1 = n1[o1 + c];
    const v1 = n1[o1 + 3 + c];
    const a1 = n1[o1 + 6 + c];
    const dp = p1 - p0; // H3 = 1 − H0, so write p0 + H3·(p1 − p0) for less rounding
    outR[oo + c] = p0 + h3 * dp + h * (h1 * v0 + h4 * v1) + hh * (h2 * a0 + h5 * a1);
    outV[oo + c] = (-d0 * dp) / h + d1 * v0 + d4 * v1 + h * (d2 * a0 + d5 * a1);
  }
}

/** Integrator state a chunk starts from: τ [s], y = (r, v), a, and the step size proposed next. */
export interface Checkpoint {
  tauS: number;
  y: Float64Array;
  a: Float64Array;
  hAbsS: number;
}

/** One chunk: its first node is its checkpoint; `count` accepted nodes follow. */
export interface Chunk {
  start: Checkpoint;
  /** Leg direction: +1 forward, −1 backward from the epoch. */
  dir: 1 | -1;
  count: number;
  loTauS: number;
  hiTauS: number;
  /** Ascending τ and nodes (9 each), or null when dropped. */
  taus: Float64Array | null;
  nodes: Float64Array | null;
  lastUse: number;
}

/** Rebuilds a dropped chunk's nodes, in integration order (τ then 9 numbers per node, start included). */
export type ChunkRebuilder = (chunk: Chunk) => { taus: Float64Array; nodes: Float64Array };

/** Chunk from nodes in integration order; stored ascending in τ. */
export function makeChunk(start: Checkpoint, dir: 1 | -1, taus: Float64Array, nodes: Float64Array): Chunk {
  const n = taus.length;
  const c: Chunk = { start, dir, count: n - 1, loTauS: 0, hiTauS: 0, taus: null, nodes: null, lastUse: 0 };
  setChunkNodes(c, taus, nodes);
  c.loTauS = c.taus![0];
  c.hiTauS = c.taus![n - 1];
  return c;
}

/** Store nodes given in integration order ascending in τ. */
export function setChunkNodes(c: Chunk, taus: Float64Array, nodes: Float64Array): void {
  if (c.dir === 1) {
    c.taus = taus;
    c.nodes = nodes;
    return;
  }
  const n = taus.length;
  const t = new Float64Array(n);
  const nd = new Float64Array(n * NODE_WIDTH);
  for (let i = 0; i < n; i++) {
    t[i] = taus[n - 1 - i];
    nd.set(nodes.subarray((n - 1 - i) * NODE_WIDTH, (n - i) * NODE_WIDTH), i * NODE_WIDTH);
  }
  c.taus = t;
  c.nodes = nd;
}

/** Chunks ascending in τ, with LRU residency and lookup by τ. */
export class NodeStore {
  private readonly chunks: Chunk[] = [];
  private resident = 0;
  private clock = 0;
  private hint = 0;

  constructor(
    private readonly rebuild: ChunkRebuilder,
    private readonly limit = RESIDENT_NODE_LIMIT,
  ) {}

  /** Nodes now in memory. */
  get residentNodes(): number {
    return this.resident;
  }

  /** Add a chunk as it is integrated (dropping old ones past the memory limit). */
  add(c: Chunk): void {
    c.lastUse = ++this.clock;
    this.chunks.push(c);
    if (c.taus !== null) this.resident += c.taus.length;
    this.trim(c);
  }

  /** Order the chunks by τ once both legs are in. */
  finish(): void {
    this.chunks.sort((a, b) => a.loTauS - b.loTauS);
  }

  /** Drop least recently used chunks until the resident count is under the limit (keeping `keep`). */
  trim(keep: Chunk | null = null): void {
    if (this.resident <= this.limit) return;
    const live = this.chunks.filter((c) => c.taus !== null && c !== keep).sort((a, b) => a.lastUse - b.lastUse);
    for (const c of live) {
      if (this.resident <= this.limit) break;
      this.resident -= c.taus!.length;
      c.taus = null;
      c.nodes = null;
    }
  }

  get chunkCount(): number {
    return this.chunks.length;
  }

  /** The chunk holding τ (clamped to the stored range), with its nodes in memory. */
  chunkAt(tau: number): Chunk {
    const cs = this.chunks;
    let i = this.hint;
    if (!(i < cs.length && tau >= cs[i].loTauS && tau <= cs[i].hiTauS)) {
      let lo = 0;
      let hi = cs.length - 1;
      while (lo < hi) {
        const mid = (lo + hi + 1) >> 1;
        if (cs[mid].loTauS <= tau) lo = mid;
        else hi = mid - 1;
      }
      i = lo;
      this.hint = i;
    }
    return this.materialize(cs[i]);
  }

  /** Every chunk in order, materialised one at a time (for diagnostics). */
  *all(): Generator<Chunk> {
    for (const c of this.chunks) yield this.materialize(c);
  }

  private materialize(c: Chunk): Chunk {
    c.lastUse = ++this.clock;
    if (c.taus === null) {
      const { taus, nodes } = this.rebuild(c);
      setChunkNodes(c, taus, nodes);
      this.resident += taus.length;
      this.trim(c);
    }
    return c;
  }
}
