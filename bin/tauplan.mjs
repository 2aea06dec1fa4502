#!/usr/bin/env node
// Entry point. Runs the bundle in dist/ when it is up to date with src/ (fast start), else the
// TypeScript sources through the tsx loader shipped as a dependency.
import { readdirSync, statSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('..', import.meta.url));

function newestMtimeMs(dir) {
  let newest = 0;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const path = `${dir}/${entry.name}`;
    newest = Math.max(newest, entry.isDirectory() ? newestMtimeMs(path) : statSync(path).mtimeMs);
  }
  return newest;
}

function bundleIsFresh() {
  let bundleMs;
  try {
    bundleMs = statSync(`${root}dist/cli.mjs`).mtimeMs;
  } catch {
    return false;
  }
  // An installed package ships dist/ without src/.
  try {
    return bundleMs >= newestMtimeMs(`${root}src`);
  } catch {
    return true;
  }
}

let main;
if (process.env.TAUPLAN_FROM_SOURCE !== '1' && bundleIsFresh()) {
  ({ main } = await import('../dist/cli.mjs'));
} else {
  const { register } = await import('tsx/esm/api');
  register();
  ({ main } = await import('../src/cli/main.ts'));
}
process.exitCode = await main(process.argv.slice(2));
