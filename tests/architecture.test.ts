/**
 * The layering of src/, read from the import statements (reference: DEVELOPERS.md "Architecture and
 * data flow", the project's own design rule). Data flows io → orbit → clock → events → plan →
 * report → cli, with time and the shared model below all:
 * - the core (orbit, clock, events, plan) imports only layers before it in that order, never io,
 *   report, the API or the CLI, so it does no I/O and can be reused as is;
 * - io (parsers, files, the orbit factory) produces the model's types and builds trajectories;
 * - report formats what plan computed (it imports no orbit, clock or events module);
 * - the API (src/index.ts and src/api/) may use every layer but the CLI;
 * - the CLI reaches the core only through the API, plus io (files, flags) and report (formats).
 * A failure lists every arrow against these rules as `file → imported file`.
 *
 * KNOWN_ARROWS lists the arrows still to remove (the CLI commands that call the core directly, and
 * report writers that sample trajectories): the test fails on any arrow not in it, so the list can
 * only shrink. Remove an entry when its import goes.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const SRC = fileURLToPath(new URL('../src', import.meta.url));

type Layer = 'base' | 'time' | 'model' | 'orbit' | 'clock' | 'events' | 'plan' | 'io' | 'report' | 'api' | 'cli';

/** What each layer may import (itself included). `base` is errors.ts, constants.ts and lazyPackage.ts. */
const ALLOWED: Record<Layer, readonly Layer[]> = {
  base: ['base'],
  time: ['base', 'time'],
  model: ['base', 'time', 'model'],
  orbit: ['base', 'time', 'model', 'orbit'],
  clock: ['base', 'time', 'model', 'orbit', 'clock'],
  events: ['base', 'time', 'model', 'orbit', 'clock', 'events'],
  plan: ['base', 'time', 'model', 'orbit', 'clock', 'events', 'plan'],
  io: ['base', 'time', 'model', 'orbit', 'io'],
  report: ['base', 'time', 'model', 'plan', 'report'],
  api: ['base', 'time', 'model', 'orbit', 'clock', 'events', 'plan', 'io', 'report', 'api'],
  cli: ['base', 'time', 'model', 'io', 'report', 'api', 'cli'],
};

/** Arrows against the layering that remain to be removed (`from → to`, paths under src/). */
const KNOWN_ARROWS: ReadonlySet<string> = new Set([
  // fit with real products and fit --all (issue 14), landed in parallel with the public API:
]);

/** The layer of a file under src/ (path relative to src, with `/`). */
export function layerOf(rel: string): Layer {
  if (rel === 'errors.ts' || rel === 'constants.ts' || rel === 'lazyPackage.ts') return 'base';
  if (rel === 'index.ts') return 'api';
  const top = rel.split('/')[0];
  if (top in ALLOWED && top !== 'base') return top as Layer;
  throw new Error(`src/${rel} is in no layer: add its folder to ALLOWED in tests/architecture.test.ts and to DEVELOPERS.md`);
}

/** Relative import and re-export specifiers of a TypeScript source (type-only ones count too). */
export function importsOf(text: string): string[] {
  const out: string[] = [];
  const re = /(?:^|\n)\s*(?:import|export)\s[^;]*?from\s*['"](\.[^'"]+)['"]|import\(\s*['"](\.[^'"]+)['"]\s*\)|(?:^|\n)\s*import\s*['"](\.[^'"]+)['"]/g;
  for (let m = re.exec(text); m !== null; m = re.exec(text)) out.push(m[1] ?? m[2] ?? m[3]);
  return out;
}

function sourceFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => (e.isDirectory() ? sourceFiles(join(dir, e.name)) : e.name.endsWith('.ts') ? [join(dir, e.name)] : []));
}

/** Every arrow against ALLOWED, as `from → to (fromLayer → toLayer)`. */
function violations(): { arrows: string[]; edges: number; files: number } {
  const arrows: string[] = [];
  let edges = 0;
  const files = sourceFiles(SRC);
  for (const file of files) {
    const from = relative(SRC, file).split('\\').join('/');
    const fromLayer = layerOf(from);
    for (const spec of importsOf(readFileSync(file, 'utf8'))) {
      const target = relative(SRC, resolve(dirname(file), spec)).split('\\').join('/');
      if (target.startsWith('..')) {
        arrows.push(`src/${from} → ${spec} (outside src/)`);
        continue;
      }
      edges++;
      const toLayer = layerOf(target);
      if (!ALLOWED[fromLayer].includes(toLayer)) arrows.push(`src/${from} → src/${target} (${fromLayer} → ${toLayer})`);
    }
  }
  return { arrows, edges, files: files.length };
}

describe('layering of src/ (DEVELOPERS.md, architecture)', () => {
  it('the import reader finds static, type-only, re-export and dynamic imports', () => {
    const text = [
      "import { a } from './a.ts';",
      "import type { B } from '../b/b.ts';",
      "export { c } from './c.ts';",
      "export * from '../d.ts';",
      "import {\n  e,\n  f,\n} from './ef.ts';",
      "const g = await import('./g.ts');",
      "import 'node:fs';",
      "import { h } from 'yargs';",
    ].join('\n');
    expect(importsOf(text)).toEqual(['./a.ts', '../b/b.ts', './c.ts', '../d.ts', './ef.ts', './g.ts']);
  });

  it('flags an arrow against the flow (a core file importing io)', () => {
    expect(ALLOWED[layerOf('orbit/sgp4.ts')].includes(layerOf('io/tle.ts'))).toBe(false);
    expect(ALLOWED[layerOf('cli/commands/size.ts')].includes(layerOf('orbit/gravity.ts'))).toBe(false);
    expect(ALLOWED[layerOf('report/htmlReport.ts')].includes(layerOf('clock/rate.ts'))).toBe(false);
  });

  it('has no arrow against the flow in src/ beyond the known ones still to remove', () => {
    const { arrows, edges, files } = violations();
    expect(files, 'no sources found').toBeGreaterThan(50);
    expect(edges, 'no imports found: the reader is broken').toBeGreaterThan(200);
    const arrowKey = (a: string): string => a.replace(/ \([a-z]+ → [a-z]+\)$/, '');
    const fresh = arrows.filter((a) => !KNOWN_ARROWS.has(arrowKey(a)));
    const gone = [...KNOWN_ARROWS].filter((k) => !arrows.some((a) => arrowKey(a) === k));
    if (gone.length > 0) console.warn(`architecture: ${gone.length} known arrows are gone; remove them from KNOWN_ARROWS:\n${gone.join('\n')}`);
    expect(fresh, `new arrows against the layering (wanted none, got ${fresh.length}):\n${fresh.join('\n')}`).toEqual([]);
  });
});
