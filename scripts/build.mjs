// Builds dist/:
// - the esbuild bundles of the CLI and its worker threads (start-up does not pay for transforming
//   TypeScript on every run; bin/tauplan.mjs uses them when they are newer than every file in src/)
//   and of the library entry `dist/index.mjs` (package.json "exports");
// - the library's declaration files in dist/types (tsc, tsconfig.build.json), with the sources'
//   `.ts` import specifiers rewritten to `.js` so that consumers resolve them under NodeNext.
// Run by `npm ci`/`npm install` (prepare), by `npm test` and before `npm pack`.
import { build } from 'esbuild';
import { execFileSync } from 'node:child_process';
import { readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('..', import.meta.url));
// Chunk names change with the code: clear the old bundles so that dist/ (and the package) holds only the current ones.
for (const name of (statSync(join(root, 'dist'), { throwIfNoEntry: false })?.isDirectory() ? readdirSync(join(root, 'dist'), { withFileTypes: true }) : []).filter((e) => e.isFile() && /\.mjs(\.map)?$/.test(e.name))) {
  rmSync(join(root, 'dist', name.name), { force: true });
}
await build({
  absWorkingDir: root,
  entryPoints: { cli: 'src/cli/main.ts', sizeWorker: 'src/cli/sizeWorker.ts', scenarioWorker: 'src/cli/scenarioWorker.ts', fitWorker: 'src/cli/fitWorker.ts', index: 'src/index.ts' },
  outdir: 'dist',
  outExtension: { '.js': '.mjs' },
  bundle: true,
  splitting: true,
  format: 'esm',
  platform: 'node',
  target: 'node20',
  packages: 'external',
  sourcemap: true,
  logLevel: 'warning',
});

/** Newest modification time under `dir` [ms], 0 when it does not exist. */
function newestMtimeMs(dir) {
  let newest = 0;
  let entries;
  try {
    entries = readdirSync(dir, { withFileTypes: true });
  } catch {
    return 0;
  }
  for (const e of entries) {
    const path = join(dir, e.name);
    newest = Math.max(newest, e.isDirectory() ? newestMtimeMs(path) : statSync(path).mtimeMs);
  }
  return newest;
}

/** Every file under `dir` ending in `ending`. */
function filesUnder(dir, ending) {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => (e.isDirectory() ? filesUnder(join(dir, e.name), ending) : e.name.endsWith(ending) ? [join(dir, e.name)] : []));
}

// Declarations take a few seconds of tsc: redo them only when a source changed since.
const typesDir = join(root, 'dist/types');
const typesStamp = join(typesDir, 'index.d.ts');
let typesFresh = false;
try {
  typesFresh = statSync(typesStamp).mtimeMs >= Math.max(newestMtimeMs(join(root, 'src')), statSync(join(root, 'tsconfig.build.json')).mtimeMs);
} catch {
  typesFresh = false;
}
if (!typesFresh) {
  rmSync(typesDir, { recursive: true, force: true });
  const tsc = createRequire(import.meta.url).resolve('typescript/bin/tsc');
  execFileSync(process.execPath, [tsc, '-p', join(root, 'tsconfig.build.json')], { stdio: 'inherit' });
  for (const file of filesUnder(typesDir, '.d.ts')) {
    const text = readFileSync(file, 'utf8');
    const rewritten = text.replace(/(from\s+|import\()(['"])(\.{1,2}\/[^'"]+)\.ts\2/g, '$1$2$3.js$2');
    if (rewritten !== text) writeFileSync(file, rewritten);
  }
  // The stamp is written last, so an interrupted build is redone.
  writeFileSync(typesStamp, readFileSync(typesStamp, 'utf8'));
}
