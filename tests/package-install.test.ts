/**
 * The library as a user gets it: `npm pack` the project, lay the tarball out as an installed package
 * in a fresh folder (no network: its dependencies are linked from this project's node_modules), then
 * type-check a strict TypeScript file that imports `tauplan` and run it. Its numbers must equal the
 * CLI's JSON for the same orbit and scenario: the library and the CLI are one code path, so the
 * tolerance is zero (same doubles). Reference: the CLI's own `--format json` output.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readdirSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCli } from './helpers/cli.ts';

const ROOT = fileURLToPath(new URL('..', import.meta.url));
const DEMO = join(ROOT, 'data/demo/tessera.yaml');
// A short window keeps the check quick; the scenario is the invented demo.
const FROM = '2027-01-04T00:00:00Z';
const TO = '2027-01-04T12:00:00Z';

const CONSUMER = `
import { sizeOrbit, loadScenario, predictPasses, InputError, type SizeJson, type PassesJson } from 'tauplan';

const size: SizeJson = sizeOrbit({ aKm: 26561.75, e: 0.01, iDeg: 55 }, { gravity: 'point', span: '1d' });
const scenario = loadScenario(${JSON.stringify(DEMO)});
const passes: PassesJson = predictPasses(scenario, { from: '${FROM}', to: '${TO}' });
let refused = '';
try {
  sizeOrbit({ aKm: 26561.75, e: 1.5 });
} catch (e) {
  if (e instanceof InputError) refused = e.where;
}
const first = passes.passes[0];
process.stdout.write(JSON.stringify({
  meanFractionalOffset: size.meanFractionalOffset,
  driftNsPerDay: size.driftNsPerDay,
  recommendedHz: size.recommendedHz,
  passCount: passes.passes.length,
  firstAos: first?.aos ?? null,
  firstOffsetAtAosNs: first?.clockOffsetAtAosNs ?? null,
  lastOffsetAtLosNs: passes.passes[passes.passes.length - 1]?.clockOffsetAtLosNs ?? null,
  refused,
}));
`;

let dir = '';

beforeAll(() => {
  execFileSync(process.execPath, [join(ROOT, 'scripts/build.mjs')], { cwd: ROOT, stdio: 'pipe' });
  dir = mkdtempSync(join(tmpdir(), 'tauplan-pack-'));
  const npm = spawnSync('npm', ['pack', '--ignore-scripts', '--pack-destination', dir], { cwd: ROOT, encoding: 'utf8' });
  if (npm.status !== 0) throw new Error(`npm pack failed: ${npm.stderr}`);
}, 300_000);

afterAll(() => {
  if (dir !== '') rmSync(dir, { recursive: true, force: true });
});

describe('the packed library installs and gives the CLI numbers', () => {
  it('type-checks a strict consumer and matches size and passes JSON', () => {
    const tarball = readdirSync(dir).find((f) => f.endsWith('.tgz'));
    expect(tarball, 'npm pack wrote no tarball').toBeDefined();
    // Install layout: node_modules/tauplan from the tarball; its dependencies linked from here.
    const pkgDir = join(dir, 'node_modules/tauplan');
    mkdirSync(pkgDir, { recursive: true });
    execFileSync('tar', ['-xzf', join(dir, tarball as string), '-C', pkgDir, '--strip-components=1']);
    symlinkSync(join(ROOT, 'node_modules'), join(pkgDir, 'node_modules'), 'dir');
    mkdirSync(join(dir, 'node_modules/@types'), { recursive: true });
    symlinkSync(join(ROOT, 'node_modules/@types/node'), join(dir, 'node_modules/@types/node'), 'dir');
    writeFileSync(join(dir, 'package.json'), JSON.stringify({ name: 'consumer', private: true, type: 'module' }));
    writeFileSync(join(dir, 'main.ts'), CONSUMER);
    writeFileSync(
      join(dir, 'tsconfig.json'),
      JSON.stringify({ compilerOptions: { target: 'ES2022', module: 'NodeNext', moduleResolution: 'NodeNext', strict: true, skipLibCheck: false, types: ['node'], outDir: 'out' }, files: ['main.ts'] }),
    );
    const tsc = createRequire(join(ROOT, 'package.json')).resolve('typescript/bin/tsc');
    const check = spawnSync(process.execPath, [tsc, '-p', dir], { cwd: dir, encoding: 'utf8' });
    expect(check.status, `tsc on the consumer failed:\n${check.stdout}${check.stderr}`).toBe(0);
    const run = spawnSync(process.execPath, [join(dir, 'out/main.js')], { cwd: dir, encoding: 'utf8' });
    expect(run.status, `the consumer failed:\n${run.stderr}`).toBe(0);
    const lib = JSON.parse(run.stdout) as Record<string, number | string | null>;

    const size = runCli(['size', '--a-km', '26561.75', '--e', '0.01', '--i-deg', '55', '--gravity', 'point', '--span', '1d', '--format', 'json', '--quiet']);
    expect(size.code, size.stderr).toBe(0);
    const cliSize = JSON.parse(size.stdout) as Record<string, number>;
    const passes = runCli(['passes', DEMO, '--from', FROM, '--to', TO, '--format', 'json', '--quiet']);
    expect(passes.code, passes.stderr).toBe(0);
    const cliPasses = (JSON.parse(passes.stdout) as { passes: Record<string, number | string>[] }).passes;

    const want = {
      meanFractionalOffset: cliSize.meanFractionalOffset,
      driftNsPerDay: cliSize.driftNsPerDay,
      recommendedHz: cliSize.recommendedHz,
      passCount: cliPasses.length,
      firstAos: cliPasses[0]?.aos ?? null,
      firstOffsetAtAosNs: cliPasses[0]?.clockOffsetAtAosNs ?? null,
      lastOffsetAtLosNs: cliPasses[cliPasses.length - 1]?.clockOffsetAtLosNs ?? null,
      refused: '--e',
    };
    expect(cliPasses.length, 'the demo window should hold passes').toBeGreaterThan(0);
    expect(lib, `library ${JSON.stringify(lib)} vs CLI ${JSON.stringify(want)}`).toEqual(want);
  }, 300_000);
});
