// Bundles the CLI (and the catalogue worker) into dist/ so that start-up does not pay for
// transforming TypeScript on every run. bin/tauplan.mjs uses dist/ only when it is newer than
// every file in src/, and falls back to running src/ through tsx otherwise.
// Run by `npm ci`/`npm install` (prepare) and by `npm test`.
import { build } from 'esbuild';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('..', import.meta.url));
await build({
  absWorkingDir: root,
  entryPoints: { cli: 'src/cli/main.ts', sizeWorker: 'src/cli/sizeWorker.ts', scenarioWorker: 'src/cli/scenarioWorker.ts' },
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
