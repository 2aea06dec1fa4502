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
import { buildTleLines } from '../src/io/tleBuild.ts';
import { mulberry32 as rng } from './prng.ts';

/** Options of {@link makeCatalogue}. */
export interface CatalogueOptions {
  /** Number of element sets (1..99999). */
  count: number;
  /** Generator seed (default 20270101). */
  seed?: number;
  /** How many objects to make decay within the first day (default 0). */
  decaying?: number;
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
    const [line1, line2] = buildTleLines({
      catalogNumber: num,
      designator: `27${String(1 + (idx % 999)).padStart(3, '0')}A`,
      epochYear: 2027,
      epochDayOfYear: epochDay,
      inclinationDeg: el.i,
      raanDeg: el.raan % 360,
      eccentricity: el.e,
      argpDeg: el.argp % 360,
      meanAnomalyDeg: el.m % 360,
      meanMotionRevPerDay: el.n,
      meanMotionDotRevPerDay2: el.ndot,
      bstar: el.bstar,
      elementSetNumber: num % 10000,
      revolutionNumber: num % 100000,
    });
    out.push(`INVENTED-${cat}`, line1, line2);
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
