/** Run the real CLI in a child process (as users do) and capture its streams. */
import { spawn, spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';

const BIN = fileURLToPath(new URL('../../bin/tauplan.mjs', import.meta.url));

export interface CliRun {
  code: number;
  stdout: string;
  stderr: string;
}

export function runCli(args: string[], opts: { cwd?: string; input?: string } = {}): CliRun {
  const r = spawnSync(process.execPath, [BIN, ...args], { encoding: 'utf8', cwd: opts.cwd, input: opts.input, timeout: 120_000 });
  return { code: r.status ?? -1, stdout: r.stdout, stderr: r.stderr };
}

/** The contract's one-line error form: `tauplan: <what> (<where>) — <how to fix>`. */
export const ONE_LINE_ERROR = /^tauplan: .+ \(.+\) — .+\n$/;

/**
 * Start `tauplan ARGS` without waiting, with extra environment variables (a batch scheduler's); the
 * caller's own SLURM_* and JOB_COMPLETION_INDEX are removed first. For shard processes run at once.
 */
export function startCli(args: string[], env: Record<string, string>): Promise<CliRun> {
  return new Promise((resolve, reject) => {
    const clean = Object.fromEntries(Object.entries(process.env).filter(([k]) => !k.startsWith('SLURM_') && k !== 'JOB_COMPLETION_INDEX'));
    const p = spawn(process.execPath, [BIN, ...args], { env: { ...clean, ...env }, stdio: ['ignore', 'pipe', 'pipe'] });
    let stdout = '';
    let stderr = '';
    p.stdout.on('data', (d: Buffer) => (stdout += d.toString()));
    p.stderr.on('data', (d: Buffer) => (stderr += d.toString()));
    p.on('error', reject);
    p.on('close', (code) => resolve({ code: code ?? -1, stdout, stderr }));
  });
}
