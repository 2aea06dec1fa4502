/**
 * Writing results: stdout, or a file written atomically (temporary file in the same folder, then
 * rename). A run that fails, or is interrupted by SIGINT/SIGTERM, leaves no output file behind.
 */
import { accessSync, closeSync, constants as fsConstants, fsyncSync, mkdirSync, openSync, renameSync, rmSync, statSync, writeSync } from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';
import { InputError, InternalError } from '../errors.ts';

const pendingTemps = new Set<string>();
let signalsHooked = false;

function hookSignals(): void {
  if (signalsHooked) return;
  signalsHooked = true;
  const clean = (signal: NodeJS.Signals): void => {
    removePendingTemps();
    process.stderr.write(`tauplan: interrupted by ${signal}; no output written\n`);
    process.exit(signal === 'SIGINT' ? 130 : 143);
  };
  process.once('SIGINT', clean);
  process.once('SIGTERM', clean);
}

/** Remove every temporary file still being written (on failure or interruption). */
export function removePendingTemps(): void {
  for (const p of pendingTemps) rmSync(p, { force: true });
  pendingTemps.clear();
}

/** Temporary path next to `target`; registered so that a failure removes it. */
export function reserveTemp(target: string): string {
  hookSignals();
  const tmp = join(dirname(target), `.tauplan-tmp-${process.pid}-${Math.random().toString(36).slice(2)}-${basename(target)}`);
  pendingTemps.add(tmp);
  return tmp;
}

/** Move a finished temporary file into place. */
export function commitTemp(tmp: string, target: string): void {
  renameSync(tmp, target);
  pendingTemps.delete(tmp);
}

/** Write `text` to `path` atomically. The folder must exist. */
export function writeFileAtomic(path: string, text: string, flag = '--out'): void {
  const tmp = reserveTemp(path);
  let fd: number;
  try {
    fd = openSync(tmp, 'w');
  } catch (e) {
    pendingTemps.delete(tmp);
    const code = (e as NodeJS.ErrnoException).code ?? 'error';
    throw new InputError(`cannot write ${path} (${code})`, flag, 'give a path in an existing folder you can write to');
  }
  try {
    writeSync(fd, text);
    fsyncSync(fd);
  } finally {
    closeSync(fd);
  }
  commitTemp(tmp, path);
}

/** Create a folder for outputs (the demo's). */
export function ensureDir(path: string, flag = '--out'): void {
  // Walk up to the nearest existing folder and create each level in turn: mkdirSync's own
  // recursive mode can loop forever on special file systems such as /proc on Node 20.
  const missing: string[] = [];
  let p = resolve(path);
  for (let guard = 0; guard < 256; guard++) {
    let st;
    try {
      st = statSync(p);
    } catch {
      missing.push(p);
      const up = dirname(p);
      if (up === p) break;
      p = up;
      continue;
    }
    if (!st.isDirectory()) throw new InputError(`${p} exists and is not a folder`, flag, 'give a folder path for the output');
    break;
  }
  for (const dir of missing.reverse()) {
    try {
      mkdirSync(dir);
    } catch (e) {
      const code = (e as NodeJS.ErrnoException).code ?? 'error';
      throw new InputError(`cannot create folder ${dir} (${code})`, flag, 'give a folder path you can write to');
    }
  }
  try {
    accessSync(resolve(path), fsConstants.W_OK);
  } catch {
    throw new InputError(`folder ${path} is not writable`, flag, 'give a folder path you can write to');
  }
}

/** JSON text of a result; refuses NaN and ±Infinity anywhere (they would print as null silently). */
export function toJsonText(value: unknown): string {
  checkFinite(value, '$');
  return `${JSON.stringify(value, null, 2)}\n`;
}

function checkFinite(value: unknown, path: string): void {
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) throw new InternalError(`non-finite number ${value} at ${path} in the output`, path);
  } else if (Array.isArray(value)) {
    value.forEach((v, i) => checkFinite(v, `${path}[${i}]`));
  } else if (value !== null && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) checkFinite(v, `${path}.${k}`);
  }
}
