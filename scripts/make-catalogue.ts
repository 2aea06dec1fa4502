/**
 * Writes an INVENTED catalogue of TLE element sets for scale tests and the benchmark.
 * None of these objects exists: the elements are drawn from a fixed-seed generator so the file is
 * the same on every machine. Mix: LEO (60 %), MEO (15 %), GEO (10 %), HEO (Molniya-like and
 * transfer orbits, 15 %). Names are `INVENTED-00001`, ...; catalogue numbers 1..N.
 * Checksums come from formatTleLine (src/io/tle.ts), so the file reads cleanly.
 *
 * Usage: node --import tsx scripts/make-catalogue.ts COUNT OUT.tle [--seed S] [--decaying K]
 *   --decaying K  makes K objects (spread through the file) decay within about an hour (very low
 *                 orbit, huge B*): SGP4 fails part-way through the span, a failure row in `size --all`.
 */
import { writeFileSync } from 'node:fs';
import { pathToFileURL } from 'node:url';
import { formatTleLine } from '../src/io/tle.ts';

/** Options of {@link makeCatalogue}. */
export interface CatalogueOptions {
  /** Number of element sets (1..99999). */
  count: number;
  /** Generator seed (default 20270101). */
  seed?: number;
  /** How many objects to make decay within the first day (default 0). */
  decaying?: number;
}

/** mulberry32: a small, fixed, well-mixed 32-bit generator; returns numbers in [0, 1). */
function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const fix = (v: number, width: number, decimals: number): string => v.toFixed(decimals).padStart(width, ' ');

/** TLE assumed-decimal exponent field, e.g. 2.8098e-5 → " 28098-4" (8 characters). */
function expField(v: number): string {
  if (v === 0) return ' 00000-0';
  const sign = v < 0 ? '-' : ' ';
  let e = Math.floor(Math.log10(Math.abs(v))) + 1;
  let digits = Math.round((Math.abs(v) / 10 ** e) * 1e5);
  if (digits >= 100000) {
    digits = 10000;
    e += 1;
  }
  if (Math.abs(e) > 9) throw new RangeError(`exponent of ${v} does not fit one digit`);
  return `${sign}${String(digits).padStart(5, '0')}${e < 0 ? '-' : '+'}${Math.abs(e)}`;
}

/** First derivative of mean motion field, e.g. " .00000023" (10 characters). */
function ndotField(v: number): string {
  return `${v < 0 ? '-' : ' '}${Math.abs(v).toFixed(8).slice(1)}`;
}

interface Elements {
  n: number;
  e: number;
  i: number;
  raan: number;
  argp: number;
  m: number;
  bstar: number;
  ndot: number;
}

function drawElements(r: () => number, decays: boolean): Elements {
  const angle = (): number => r() * 360;
  if (decays) {
    // About 150 km and a B* hundreds of times a normal one: within about an hour SGP4's mean elements
    // leave their valid range (its usual signature of a decay), so sizing fails part-way through the span.
    return { n: 16.35 + r() * 0.1, e: 0.0005, i: 50 + r() * 40, raan: angle(), argp: angle(), m: angle(), bstar: 0.05, ndot: 0.5 };
  }
  const kind = r();
  if (kind < 0.6) {
    // LEO: 300–1500 km.
    return { n: 13.2 + r() * 2.6, e: r() * 0.02, i: r() * 100, raan: angle(), argp: angle(), m: angle(), bstar: 1e-5 + r() * 2e-4, ndot: r() * 1e-5 };
  }
  if (kind < 0.75) {
    // MEO: navigation-like, 12 h and 14 h orbits.
    return { n: 1.7 + r() * 0.35, e: r() * 0.02, i: 50 + r() * 15, raan: angle(), argp: angle(), m: angle(), bstar: 0, ndot: 0 };
  }
  if (kind < 0.85) {
    // GEO.
    return { n: 1.0027 + (r() - 0.5) * 0.002, e: r() * 0.001, i: r() * 5, raan: angle(), argp: angle(), m: angle(), bstar: 0, ndot: 0 };
  }
  if (kind < 0.93) {
    // Molniya-like: 12 h, e ≈ 0.7, critical inclination.
    return { n: 2.005 + r() * 0.002, e: 0.68 + r() * 0.06, i: 63.4, raan: angle(), argp: 260 + r() * 20, m: angle(), bstar: 1e-5, ndot: 0 };
  }
  // Transfer orbits: perigee a few hundred km, apogee near GEO.
  return { n: 2.2 + r() * 0.1, e: 0.72 + r() * 0.01, i: r() * 28, raan: angle(), argp: angle(), m: angle(), bstar: 5e-5, ndot: 0 };
}

/** Text of an invented TLE catalogue (3LE: name line, line 1, line 2 per object). */
export function makeCatalogue(opts: CatalogueOptions): string {
  const { count } = opts;
  if (!(Number.isInteger(count) && count >= 1 && count <= 99999)) throw new RangeError(`count ${count} is not in 1..99999`);
  const decaying = opts.decaying ?? 0;
  const r = rng(opts.seed ?? 20270101);
  // Decaying objects at evenly spread positions, never the first one.
  const decayAt = new Set<number>();
  for (let k = 0; k < decaying; k++) decayAt.add(Math.min(count - 1, Math.floor(((k + 0.5) * count) / decaying) + (count > 1 ? 1 : 0)));
  const out: string[] = [];
  for (let idx = 0; idx < count; idx++) {
    const num = idx + 1;
    const cat = String(num).padStart(5, '0');
    const el = drawElements(r, decayAt.has(idx));
    const epochDay = 1 + r() * 29; // 2027 day 1 to 30, UTC
    const launch = `27${String(1 + (idx % 999)).padStart(3, '0')}A  `.slice(0, 8);
    const body1 =
      `1 ${cat}U ${launch} 27${fix(epochDay, 12, 8).replace(/ /g, '0')} ${ndotField(el.ndot)}  00000-0 ${expField(el.bstar)} 0 ${String(num % 10000).padStart(4, ' ')}`;
    const ecc = String(Math.round(el.e * 1e7)).padStart(7, '0');
    const body2 = `2 ${cat} ${fix(el.i, 8, 4)} ${fix(el.raan % 360, 8, 4)} ${ecc} ${fix(el.argp % 360, 8, 4)} ${fix(el.m % 360, 8, 4)} ${fix(el.n, 11, 8)}${String(num % 100000).padStart(5, ' ')}`;
    out.push(`INVENTED-${cat}`, formatTleLine(body1), formatTleLine(body2));
  }
  return `${out.join('\n')}\n`;
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  const args = process.argv.slice(2);
  const flag = (name: string): number | undefined => {
    const i = args.indexOf(name);
    if (i < 0) return undefined;
    const v = Number(args[i + 1]);
    args.splice(i, 2);
    return v;
  };
  const seed = flag('--seed');
  const decaying = flag('--decaying');
  const [countText, outPath] = args;
  if (countText === undefined || outPath === undefined) {
    process.stderr.write('usage: node --import tsx scripts/make-catalogue.ts COUNT OUT.tle [--seed S] [--decaying K]\n');
    process.exit(2);
  }
  writeFileSync(outPath, makeCatalogue({ count: Number(countText), seed, decaying }));
  process.stderr.write(`wrote ${countText} invented element sets to ${outPath}\n`);
}
