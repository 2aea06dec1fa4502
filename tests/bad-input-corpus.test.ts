/**
 * Bad-input corpus (tests/bad-input/cases.json) through the real CLI, against the error contract of
 * the tauplan public interface, `/work/shared/contract.md` § Conventions: exit code 2, exactly one
 * line `tauplan: <what is wrong> (<where>) — <how to fix>` on stderr, no stack trace, and no output
 * file (nor temporary file) left behind when `--out` was given. Every input is invented (see
 * tests/bad-input/README.md); the expected fragments (location, a word of the fix) are common
 * practice for this contract, not reference values.
 */
import { spawn } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ONE_LINE_ERROR } from './helpers/cli.ts';

const ROOT = fileURLToPath(new URL('..', import.meta.url));
const CORPUS = join(ROOT, 'tests', 'bad-input');
const BIN = join(ROOT, 'bin', 'tauplan.mjs');

interface Case {
  id: string;
  kind: string;
  args: string[];
  stdin?: string;
  expect: string[];
  expectRe?: string[];
  out?: boolean;
  /** Name of an empty regular file to create in the case's temporary folder first. */
  setupFile?: string;
  knownBug?: string;
  skip?: boolean;
  /** Repeats a path other cases check; run only with TAUPLAN_CORPUS=full. */
  extended?: boolean;
}

interface Run {
  code: number | null;
  stderr: string;
  stdout: string;
  tmp: string;
  outPath: string | null;
}

const manifest = JSON.parse(readFileSync(join(CORPUS, 'cases.json'), 'utf8')) as { cases: Case[] };
const cases = manifest.cases;
/** The default run skips the extended cases to stay near a minute on two cores. */
const FULL = process.env.TAUPLAN_CORPUS === 'full';
const skipped = (c: Case): boolean => c.skip === true || (c.extended === true && !FULL);
/** Child processes at once: each is mostly CPU (TypeScript loading), so about the core count. */
const PARALLEL = 4;
/** A single case must finish well within this [ms]; a hang is a bug too. */
const CASE_TIMEOUT_MS = 60_000;

function runCase(c: Case, tmp: string): Promise<Run> {
  const fill = (s: string): string => s.replaceAll('{dir}', CORPUS).replaceAll('{tmp}', tmp);
  const args = c.args.map(fill);
  const outPath = c.out === true ? join(tmp, 'out.json') : null;
  if (outPath !== null) args.push('--out', outPath);
  if (c.setupFile !== undefined) writeFileSync(join(tmp, c.setupFile), '');
  return new Promise((resolvePromise) => {
    const child = spawn(process.execPath, [BIN, ...args], { cwd: ROOT, env: { ...process.env, TAUPLAN_DEBUG: '' } });
    let stdout = '';
    let stderr = '';
    child.stdout.setEncoding('utf8').on('data', (d: string) => (stdout += d));
    child.stderr.setEncoding('utf8').on('data', (d: string) => (stderr += d));
    const timer = setTimeout(() => child.kill('SIGKILL'), CASE_TIMEOUT_MS);
    child.on('close', (code) => {
      clearTimeout(timer);
      resolvePromise({ code, stderr, stdout, tmp, outPath });
    });
    child.stdin.end(c.stdin ?? '');
  });
}

const runs = new Map<string, Run>();
const tmpRoot = mkdtempSync(join(tmpdir(), 'tauplan-bad-input-'));

beforeAll(async () => {
  const queue = cases.filter((c) => !skipped(c));
  const worker = async (): Promise<void> => {
    for (let c = queue.shift(); c !== undefined; c = queue.shift()) {
      const tmp = mkdtempSync(join(tmpRoot, `${c.id}-`));
      runs.set(c.id, await runCase(c, tmp));
    }
  };
  await Promise.all(Array.from({ length: PARALLEL }, worker));
}, 600_000);

afterAll(() => rmSync(tmpRoot, { recursive: true, force: true }));

/** Every contract check for one case; throws (via expect) at the first one that fails. */
function checkCase(c: Case, r: Run): void {
  const where = `${c.id}: stderr was ${JSON.stringify(r.stderr)}`;
  expect(r.code, where).toBe(2);
  expect(r.stderr, where).toMatch(ONE_LINE_ERROR);
  expect(r.stderr.split('\n').filter((l) => l.length > 0), where).toHaveLength(1);
  expect(r.stderr, where).not.toMatch(/^\s*at /m);
  expect(r.stderr, where).not.toMatch(/\b[A-Z][A-Za-z]*Error:/);
  expect(r.stderr, where).not.toContain('internal fault');
  for (const fragment of c.expect) expect(r.stderr, where).toContain(fragment);
  for (const re of c.expectRe ?? []) expect(r.stderr, where).toMatch(new RegExp(re));
  if (r.outPath !== null) {
    const left = readdirSync(r.tmp);
    expect(left, `${c.id}: --out file or temporary file left behind`).not.toContain('out.json');
    expect(left.filter((f) => f.startsWith('.tauplan-tmp-')), `${c.id}: temporary file left behind`).toEqual([]);
  }
  expect(r.stdout, `${c.id}: a failed run printed a result`).toBe('');
}

describe('bad-input corpus: one clean line and exit 2 for every bad input', () => {
  it('has at least 60 cases over every input kind, with unique ids', () => {
    expect(cases.length).toBeGreaterThanOrEqual(60);
    expect(new Set(cases.map((c) => c.id)).size).toBe(cases.length);
    for (const kind of ['tle', 'omm', 'sp3', 'scenario', 'csv', 'time', 'flags']) expect(cases.some((c) => c.kind === kind), kind).toBe(true);
    // Most cases that could write a file are run with --out, to check nothing is left behind.
    expect(cases.filter((c) => c.out === true).length).toBeGreaterThanOrEqual(60);
    expect(cases.filter((c) => !skipped(c)).length).toBeGreaterThanOrEqual(60);
  });

  for (const c of cases) {
    const title = `${c.kind}: ${c.id}`;
    if (c.knownBug !== undefined && c.skip === true) {
      it.skip(`${title} — known bug: ${c.knownBug}`, () => undefined);
    } else if (skipped(c)) {
      it.skip(`${title} — extended case (TAUPLAN_CORPUS=full)`, () => undefined);
    } else if (c.knownBug !== undefined) {
      it.fails(`${title} — known bug: ${c.knownBug}`, () => checkCase(c, runs.get(c.id) as Run));
    } else {
      it(title, () => checkCase(c, runs.get(c.id) as Run));
    }
  }
});
