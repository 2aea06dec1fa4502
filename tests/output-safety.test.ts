/**
 * Writes that cannot lose the user's data, through the real CLI. Checked against the error contract of
 * the tauplan public interface (`/work/shared/contract.md` § Conventions: `--out` is atomic, a failed
 * run leaves no output file, bad input exits 2 with one line) and POSIX behaviour of write(2) (a write
 * may take fewer bytes than asked; ENOSPC when the disk is full), rename(2) (atomic replacement within
 * one file system) and open(2) on a FIFO (O_NONBLOCK|O_WRONLY fails with ENXIO when there is no
 * reader). Every expectation here is common practice for these interfaces, not a reference value.
 */
import { spawn, spawnSync } from 'node:child_process';
import { chmodSync, closeSync, linkSync, mkdirSync, mkdtempSync, openSync, readdirSync, readFileSync, rmSync, statSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { ONE_LINE_ERROR, runCli } from './helpers/cli.ts';

const ROOT = fileURLToPath(new URL('..', import.meta.url));
const BIN = join(ROOT, 'bin', 'tauplan.mjs');
const MEASUREMENTS = join(ROOT, 'data', 'demo', 'tsr1-offsets.csv');
const SCENARIO = join(ROOT, 'data', 'demo', 'tessera.yaml');
const TIME = ['time', '2027-01-01T00:00:00Z', '--quiet'];
const tmpRoot = mkdtempSync(join(tmpdir(), 'tauplan-output-safety-'));
let n = 0;
const fresh = (): string => {
  const d = join(tmpRoot, String(n++));
  mkdirSync(d);
  return d;
};
const temps = (dir: string): string[] => readdirSync(dir).filter((f) => f.startsWith('.tauplan-tmp-'));
afterAll(() => rmSync(tmpRoot, { recursive: true, force: true }));

function expectRefused(r: { code: number; stderr: string }, ...fragments: string[]): void {
  expect(r.code, r.stderr).toBe(2);
  expect(r.stderr).toMatch(ONE_LINE_ERROR);
  for (const f of fragments) expect(r.stderr).toContain(f);
}

describe('--out never replaces one of the run\'s inputs', () => {
  it('fit m.csv --out m.csv is refused and the measurements stay as they were', () => {
    const d = fresh();
    const m = join(d, 'm.csv');
    writeFileSync(m, readFileSync(MEASUREMENTS));
    const before = readFileSync(m, 'utf8');
    expectRefused(runCli(['fit', m, '--out', m, '--quiet']), 'is an input of this run');
    expect(readFileSync(m, 'utf8')).toBe(before);
    expect(temps(d)).toEqual([]);
  });

  it('through a symbolic link or a hard link to the scenario, too', () => {
    const d = fresh();
    const s = join(d, 's.yaml');
    writeFileSync(s, readFileSync(SCENARIO));
    symlinkSync(s, join(d, 'sym.json'));
    linkSync(s, join(d, 'hard.json'));
    for (const out of ['sym.json', 'hard.json']) {
      expectRefused(runCli(['compare', s, '--out', join(d, out), '--format', 'json', '--quiet']), 'is an input of this run');
    }
    expect(readFileSync(s, 'utf8')).toBe(readFileSync(SCENARIO, 'utf8'));
  });
});

describe('what is at --out is respected', () => {
  it('a read-only file is refused without --force and replaced with it; a 600 file stays 600', () => {
    const d = fresh();
    const ro = join(d, 'ro.txt');
    writeFileSync(ro, 'keep me\n');
    chmodSync(ro, 0o444);
    expectRefused(runCli([...TIME, '--out', ro]), 'read-only', '--force');
    expect(readFileSync(ro, 'utf8')).toBe('keep me\n');
    expect(runCli([...TIME, '--out', ro, '--force']).code).toBe(0);
    expect(readFileSync(ro, 'utf8')).toContain('2027-01-01T00:00:00.000Z');
    const priv = join(d, 'private.txt');
    writeFileSync(priv, 'old\n');
    chmodSync(priv, 0o600);
    expect(runCli([...TIME, '--out', priv]).code).toBe(0);
    expect(statSync(priv).mode & 0o777).toBe(0o600);
  });

  it('a symbolic link target is written through: the link stays a link', () => {
    const d = fresh();
    writeFileSync(join(d, 'real.txt'), 'old\n');
    symlinkSync(join(d, 'real.txt'), join(d, 'link.txt'));
    expect(runCli([...TIME, '--out', join(d, 'link.txt')]).code).toBe(0);
    expect(readFileSync(join(d, 'real.txt'), 'utf8')).toContain('TAI');
    expect(statSync(join(d, 'link.txt'), { throwIfNoEntry: false })).toBeDefined();
    expect(readdirSync(d).sort()).toEqual(['link.txt', 'real.txt']);
  });

  it('/dev/null is written through and stays a device; a folder is refused', () => {
    expect(runCli([...TIME, '--out', '/dev/null']).code).toBe(0);
    expect(statSync('/dev/null').isCharacterDevice()).toBe(true);
    const d = fresh();
    expectRefused(runCli([...TIME, '--out', d]), 'is a folder');
  });

  it('a FIFO without a reader is refused at once (no hang); with a reader it gets the output', async () => {
    const d = fresh();
    const fifo = join(d, 'pipe');
    if (spawnSync('mkfifo', [fifo]).status !== 0) {
      console.warn('output-safety: mkfifo is not available here; FIFO check skipped');
      return;
    }
    const t0 = Date.now();
    expectRefused(runCli([...TIME, '--out', fifo]), 'FIFO with no reader');
    expect(Date.now() - t0).toBeLessThan(20_000);
    // A reader first (cat), then the run: the text arrives through the FIFO, which stays a FIFO.
    const cat = spawn('cat', [fifo]);
    let got = '';
    cat.stdout.setEncoding('utf8').on('data', (s: string) => (got += s));
    await new Promise((r) => setTimeout(r, 300));
    expect(runCli([...TIME, '--out', fifo]).code).toBe(0);
    await new Promise((r) => cat.on('close', r));
    expect(got).toContain('GPS');
    expect(statSync(fifo).isFIFO()).toBe(true);
  });
});

describe('a full disk never leaves a truncated file (tmpfs of 64 KiB)', () => {
  const mnt = join(tmpRoot, 'small');
  mkdirSync(mnt);
  const mounted = spawnSync('mount', ['-t', 'tmpfs', '-o', 'size=64k', 'tauplan-test', mnt]).status === 0;
  afterAll(() => {
    if (mounted) spawnSync('umount', [mnt]);
  });
  const itMounted = mounted ? it : it.skip;
  if (!mounted) console.warn('output-safety: cannot mount a small tmpfs here (needs root); the ENOSPC checks are skipped');

  itMounted('track JSON larger than the disk: exit 2, one line naming the disk, old file whole, no temp file', () => {
    const target = join(mnt, 'track.json');
    writeFileSync(target, '{"old": true}\n');
    const r = runCli(['track', SCENARIO, '--sat', 'TSR-1', '--format', 'json', '--out', target, '--quiet']);
    expectRefused(r, 'no space left', target);
    expect(r.stderr).not.toContain('internal fault');
    expect(readFileSync(target, 'utf8')).toBe('{"old": true}\n');
    expect(temps(mnt)).toEqual([]);
  });

  itMounted('size --all CSV streaming into a full disk: same', () => {
    const target = join(mnt, 'all.csv');
    const r = runCli(['size', '--tle', join(ROOT, 'tests/fixtures/vallado-2006/sgp4-ver-subset.tle'), '--all', '--format', 'csv', '--out', target, '--quiet', '--jobs', '1', '--span', '1h']);
    // The catalogue's CSV is small: it fits, or it fails cleanly; never a partial file.
    if (r.code === 0) expect(readFileSync(target, 'utf8').split('\n')[0]).toContain('index');
    else {
      expectRefused(r, 'no space left');
      expect(statSync(target, { throwIfNoEntry: false })).toBeUndefined();
    }
    expect(temps(mnt)).toEqual([]);
  });

  itMounted('a demo that does not fit leaves the previous report in the folder whole', () => {
    const big = join(tmpRoot, 'big');
    mkdirSync(big);
    expect(spawnSync('mount', ['-t', 'tmpfs', '-o', 'size=1m', 'tauplan-test', big]).status).toBe(0);
    try {
      const dir = join(big, 'report');
      expect(runCli(['demo', '--out', dir, '--quiet']).code).toBe(0);
      const before = readFileSync(join(dir, 'report.html'), 'utf8');
      // Fill the disk so that a second report cannot fit beside the first.
      const free = 1024 * 1024 - Number(spawnSync('du', ['-sb', big], { encoding: 'utf8' }).stdout.split('\t')[0]);
      writeFileSync(join(big, 'filler'), Buffer.alloc(Math.max(0, free - 64 * 1024)));
      const r = runCli(['demo', '--out', dir, '--quiet']);
      expectRefused(r, 'no space left');
      expect(readFileSync(join(dir, 'report.html'), 'utf8')).toBe(before);
      expect(temps(dir)).toEqual([]);
    } finally {
      spawnSync('umount', [big]);
    }
  });
});

describe('demo never overwrites what it did not write', () => {
  it('an empty --out is refused; a file of the user\'s is kept unless --force; a rerun replaces its own files', () => {
    expectRefused(runCli(['demo', '--out', '', '--quiet']), '--out is empty');
    const dir = join(fresh(), 'rep');
    mkdirSync(dir);
    writeFileSync(join(dir, 'passes.csv'), 'my own table\n');
    expectRefused(runCli(['demo', '--out', dir, '--quiet']), 'passes.csv', '--force');
    expect(readFileSync(join(dir, 'passes.csv'), 'utf8')).toBe('my own table\n');
    expect(readdirSync(dir)).toEqual(['passes.csv']);
    expect(runCli(['demo', '--out', dir, '--quiet', '--force']).code).toBe(0);
    expect(readFileSync(join(dir, 'passes.csv'), 'utf8')).toContain('satellite');
    expect(runCli(['demo', '--out', dir, '--quiet']).code).toBe(0);
    expect(temps(dir)).toEqual([]);
  });
});

describe('standard output', () => {
  /** Run with stdout a pipe whose reader has gone before the first write (EPIPE). */
  function runClosedPipe(args: string[]): Promise<{ code: number | null; stderr: string }> {
    return new Promise((res) => {
      const child = spawn(process.execPath, [BIN, ...args], { stdio: ['ignore', 'pipe', 'pipe'] });
      child.stdout.destroy();
      let stderr = '';
      child.stderr.setEncoding('utf8').on('data', (s: string) => (stderr += s));
      child.on('close', (code) => res({ code, stderr }));
    });
  }

  it.each([
    ['time', TIME],
    ['track', ['track', SCENARIO, '--sat', 'TSR-1', '--quiet']],
    ['size --all', ['size', '--tle', join(ROOT, 'tests/fixtures/vallado-2006/sgp4-ver-subset.tle'), '--all', '--format', 'csv', '--span', '1h', '--jobs', '1', '--quiet']],
    ['sweep', ['sweep', '--format', 'json', '--quiet']],
  ])('%s into a closed pipe (| head) ends quietly with exit 0', async (_name, args) => {
    const r = await runClosedPipe(args);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
  });

  it('> /dev/full is one line, exit 2', () => {
    const fd = openSync('/dev/full', 'w');
    try {
      const r = spawnSync(process.execPath, [BIN, ...TIME], { stdio: ['ignore', fd, 'pipe'], encoding: 'utf8' });
      expect(r.status).toBe(2);
      expect(r.stderr).toMatch(ONE_LINE_ERROR);
      expect(r.stderr).toContain('no space left');
    } finally {
      closeSync(fd);
    }
  });
});

describe('temporary files', () => {
  it('SIGHUP during a write removes the temporary file and exits 129', async () => {
    const d = fresh();
    const child = spawn(process.execPath, [BIN, 'size', '--tle', join(ROOT, 'tests/fixtures/vallado-2006/sgp4-ver-subset.tle'), '--all', '--format', 'csv', '--span', '60d', '--jobs', '1', '--out', join(d, 'all.csv'), '--quiet'], { stdio: 'ignore' });
    const code = await new Promise<number | null>((res) => {
      child.on('close', (c) => res(c));
      const poll = setInterval(() => {
        if (temps(d).length > 0) {
          clearInterval(poll);
          child.kill('SIGHUP');
        }
      }, 50);
      setTimeout(() => clearInterval(poll), 50_000);
    });
    expect(code).toBe(129);
    expect(readdirSync(d)).toEqual([]);
  });

  it('Ctrl-C during a long computation with nothing written yet stops the run at once (common practice for a CLI)', async () => {
    // A 2000-day plan computes for minutes before it writes; a handler that waits for the event
    // loop would hold the interrupt until the end.
    const child = spawn(process.execPath, [BIN, 'resets', join(ROOT, 'data/demo/tessera.yaml'), '--horizon', '2000d', '--jobs', '1', '--quiet'], { stdio: 'ignore' });
    const started = Date.now();
    await new Promise((res) => setTimeout(res, 2500));
    const killedAt = Date.now();
    child.kill('SIGINT');
    const end = await new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((res) => child.on('close', (code, signal) => res({ code, signal })));
    const stopS = (Date.now() - killedAt) / 1000;
    expect(end.code === 130 || end.signal === 'SIGINT', `exit ${end.code}, signal ${end.signal}`).toBe(true);
    expect(stopS, `stopped ${stopS.toFixed(1)} s after Ctrl-C (run started ${((killedAt - started) / 1000).toFixed(1)} s before it)`).toBeLessThan(5);
  }, 60_000);

  it('a temporary file left by a dead run is removed by the next run in that folder; a live run\'s is kept', () => {
    const d = fresh();
    const dead = spawnSync(process.execPath, ['-e', 'process.stdout.write(String(process.pid))'], { encoding: 'utf8' });
    const stale = `.tauplan-tmp-${dead.stdout}-abcd-out.json`;
    const live = `.tauplan-tmp-${process.pid}-abcd-out.json`;
    writeFileSync(join(d, stale), 'half');
    writeFileSync(join(d, live), 'being written');
    expect(runCli([...TIME, '--out', join(d, 'out.txt')]).code).toBe(0);
    expect(readdirSync(d).sort()).toEqual([live, 'out.txt'].sort());
  });
});
