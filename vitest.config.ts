import { readdirSync, readFileSync } from 'node:fs';
import { defineConfig } from 'vitest/config';

/**
 * Two projects. `unit`: in-process checks, no child processes, worker threads or browser (the inner
 * loop, `npm run test:unit`). `e2e`: the CLI as users run it, worker threads, the browser and the
 * packed package. `npm test` runs both. A test file is e2e when it starts a process, a worker or a
 * browser, which this reads from its imports (no list to keep up to date).
 */
const E2E_MARKERS = /from\s+['"](?:\.\/helpers\/(?:cli|browser)\.ts|node:child_process|node:worker_threads|\.\.\/src\/cli\/[^'"]*)['"]/;

const testFiles = readdirSync(new URL('./tests', import.meta.url)).filter((f) => f.endsWith('.test.ts'));
const e2e = testFiles.filter((f) => E2E_MARKERS.test(readFileSync(new URL(`./tests/${f}`, import.meta.url), 'utf8'))).map((f) => `tests/${f}`);

export default defineConfig({
  test: {
    testTimeout: 60_000,
    hookTimeout: 60_000,
    pool: 'forks',
    projects: [
      { extends: true, test: { name: 'unit', include: ['tests/**/*.test.ts'], exclude: e2e } },
      { extends: true, test: { name: 'e2e', include: e2e } },
    ],
  },
});
