/** Run the real CLI in a child process (as users do) and capture its streams. */
import { spawnSync } from 'node:child_process';
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
