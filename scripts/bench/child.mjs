// One tauplan CLI run for the benchmark, as users run it (the bundle in dist/ when it is fresh,
// else the TypeScript sources through tsx), reporting on stdout one line
// `BENCH-CHILD {"code","wallMs","mainMs","cpuMs","maxRssKb","states","propagations"}`: wall time
// since the process started, the command's own time, CPU time, peak RSS, and the orbit states the run evaluated (src/orbit/stateCount.ts keeps them
// on a process-wide symbol, so the bundle and the sources share it).
import { readdirSync, statSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('../..', import.meta.url));

function newestMtimeMs(dir) {
  let newest = 0;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const path = `${dir}/${entry.name}`;
    newest = Math.max(newest, entry.isDirectory() ? newestMtimeMs(path) : statSync(path).mtimeMs);
  }
  return newest;
}

function bundleIsFresh() {
  try {
    return statSync(`${root}dist/cli.mjs`).mtimeMs >= newestMtimeMs(`${root}src`);
  } catch {
    return false;
  }
}

let main;
if (bundleIsFresh()) {
  ({ main } = await import('../../dist/cli.mjs'));
} else {
  const { register } = await import('tsx/esm/api');
  register();
  ({ main } = await import('../../src/cli/main.ts'));
}
// mainMs: the command itself (from main() to its return), without Node's start-up and the entry
// module's loading, which coldStartVsNode measures; cpuMs: user + system time of every thread.
const mainStartMs = performance.now();
const code = await main(process.argv.slice(2));
const mainMs = performance.now() - mainStartMs;
const cpu = process.cpuUsage();
const counts = globalThis[Symbol.for('tauplan.orbitStateCount')] ?? { states: 0, propagations: 0 };
process.stdout.write(`BENCH-CHILD ${JSON.stringify({ code, wallMs: performance.now(), mainMs, cpuMs: (cpu.user + cpu.system) / 1000, maxRssKb: process.resourceUsage().maxRSS, states: counts.states, propagations: counts.propagations })}\n`);
process.exitCode = code;
