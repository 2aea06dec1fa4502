/**
 * Writing results so that no run can lose the user's data:
 * - a regular file is written to a temporary file in the same folder (every write's byte count
 *   checked, fsync'd), then renamed over the target, which keeps its permissions;
 * - a FIFO or character device (`/dev/null`, `/dev/stdout`) is written through, never replaced;
 * - a folder, a block device or a socket is refused, and so is a read-only file without `--force`
 *   and a target that is one of the run's own input files;
 * - a disk fault (ENOSPC, EDQUOT, EIO, ...) removes the temporary file and is one line (exit 2).
 * Interrupted runs (SIGINT, SIGTERM, SIGHUP) remove their temporary files; those of runs that died
 * harder (SIGKILL, power loss) are removed by the next run writing into the same folder (the pid is in
 * the name). Folder outputs (demo, report) are in `outputFolder.ts`.
 */
import {
  accessSync,
  closeSync,
  constants as fsConstants,
  fchmodSync,
  fchownSync,
  fsyncSync,
  openSync,
  readdirSync,
  realpathSync,
  renameSync,
  rmSync,
  statSync,
  writeSync,
  type Stats,
} from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';
import { InputError, InternalError } from '../errors.ts';

/** A fault writing an output: a full disk, a quota, an I/O error. Exit 2 like any input fault. */
export class OutputError extends InputError {
  constructor(
    what: string,
    where: string,
    fix: string,
    readonly code: string,
  ) {
    super(what, where, fix);
    this.name = 'OutputError';
  }
}

/** Prefix of every temporary file or folder; followed by `<pid>-`. */
export const TEMP_PREFIX = '.tauplan-tmp-';
const TEMP_NAME = /^\.tauplan-tmp-(\d+)-/;
/** Largest number of write calls for one buffer: a writer that keeps accepting 1 byte is a fault. */
const MAX_WRITE_CALLS = 1_000_000;

const pendingTemps = new Set<string>();
const sweptFolders = new Set<string>();
let signalsHooked = false;

/** Remove every temporary file or folder still being written (on failure or interruption). */
export function removePendingTemps(): void {
  for (const p of pendingTemps) {
    try {
      rmSync(p, { force: true, recursive: true });
    } catch {
      // best effort: the run is failing already
    }
  }
  pendingTemps.clear();
}

const SIGNAL_EXIT: Partial<Record<NodeJS.Signals, number>> = { SIGHUP: 129, SIGINT: 130, SIGTERM: 143 };

function onSignal(signal: NodeJS.Signals): void {
  removePendingTemps();
  try {
    process.stderr.write(`tauplan: interrupted by ${signal}; no output written\n`);
  } catch {
    // a hung-up terminal cannot take the line
  }
  process.exit(SIGNAL_EXIT[signal] ?? 1);
}

/**
 * SIGINT, SIGTERM and SIGHUP remove the temporary files and exit 128 + signal number. Hooked only
 * while a temporary file exists: a JavaScript handler runs only when the event loop turns, so a
 * hooked Ctrl-C during a long computation would wait for its end; unhooked, it stops the run at once.
 */
export function hookSignals(): void {
  if (signalsHooked) return;
  signalsHooked = true;
  for (const s of Object.keys(SIGNAL_EXIT) as NodeJS.Signals[]) process.on(s, onSignal);
}

function unhookSignals(): void {
  if (!signalsHooked) return;
  signalsHooked = false;
  for (const s of Object.keys(SIGNAL_EXIT) as NodeJS.Signals[]) process.off(s, onSignal);
}

/** True when a process with this id exists (ours or another user's). */
function pidAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    return (e as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/** Remove temporary files and folders left in `folder` by tauplan runs whose process is gone. */
export function removeStaleTemps(folder: string): void {
  const key = resolve(folder);
  if (sweptFolders.has(key)) return;
  sweptFolders.add(key);
  let names: string[];
  try {
    names = readdirSync(key);
  } catch {
    return;
  }
  for (const name of names) {
    const m = TEMP_NAME.exec(name);
    if (m === null) continue;
    const pid = Number(m[1]);
    if (pid === process.pid || pidAlive(pid)) continue;
    try {
      rmSync(join(key, name), { force: true, recursive: true });
    } catch {
      // someone else's file we cannot remove: leave it
    }
  }
}

/** Temporary path next to `target`; registered so that a failure or a signal removes it. */
export function reserveTemp(target: string): string {
  hookSignals();
  removeStaleTemps(dirname(resolve(target)));
  const tmp = join(dirname(target), `${TEMP_PREFIX}${process.pid}-${Math.random().toString(36).slice(2, 10)}-${basename(target)}`);
  pendingTemps.add(tmp);
  return tmp;
}

/** Forget a temporary path without removing it (it was renamed into place, or is gone). */
export function releaseTemp(tmp: string): void {
  pendingTemps.delete(tmp);
  if (pendingTemps.size === 0) unhookSignals();
}

// ---- the run's input files -------------------------------------------------------------

const inputIds = new Map<string, string>();

/** Record a file this run reads, so that `--out` can never replace it. */
export function noteInputFile(path: string): void {
  const st = statSync(path, { throwIfNoEntry: false });
  if (st?.isFile() === true) inputIds.set(`${st.dev}:${st.ino}`, path);
}

/** The input file that `target` is (same file, through any link), or null. */
export function inputFileAt(target: string): string | null {
  const st = statSync(target, { throwIfNoEntry: false });
  if (st === undefined || !st.isFile()) return null;
  return inputIds.get(`${st.dev}:${st.ino}`) ?? null;
}

// ---- writing ---------------------------------------------------------------------------

/** One line for a failed write or open; disk faults say what to do about the disk. */
export function writeFault(e: unknown, path: string, flag: string): InputError {
  if (e instanceof InputError) return e;
  const code = (e as NodeJS.ErrnoException).code ?? 'EIO';
  const where = `${flag} ${path}`;
  switch (code) {
    case 'ENOSPC':
      return new OutputError(`no space left on the disk while writing ${path}; nothing was written`, where, 'free some space, or write to another disk', code);
    case 'EDQUOT':
      return new OutputError(`disk quota exceeded while writing ${path}; nothing was written`, where, 'free some space within your quota, or write to another disk', code);
    case 'EFBIG':
      return new OutputError(`${path} would be larger than the file system allows; nothing was written`, where, 'write to another file system, or make a shorter output', code);
    case 'EIO':
      return new OutputError(`input/output error while writing ${path}; nothing was written`, where, 'check the disk, or write to another disk', code);
    case 'EROFS':
      return new OutputError(`${path} is on a read-only file system`, where, 'write to a writable disk', code);
    case 'EACCES':
    case 'EPERM':
      return new OutputError(`no permission to write ${path}`, where, 'give a path in a folder you can write to', code);
    case 'ENOENT':
    case 'ENOTDIR':
      return new OutputError(`folder of ${path} does not exist`, where, 'create the folder first, or give a path in an existing folder', code);
    default:
      return new OutputError(`cannot write ${path} (${code})`, where, 'give a path in an existing folder you can write to', code);
  }
}

/** Write every byte of `data` to `fd`, checking each call's count. Throws the write's own error. */
export function writeAllSync(fd: number, data: string | Uint8Array): void {
  const buf = typeof data === 'string' ? Buffer.from(data, 'utf8') : data;
  let done = 0;
  for (let calls = 0; done < buf.length; calls++) {
    if (calls >= MAX_WRITE_CALLS) throw Object.assign(new Error('write made no progress'), { code: 'EIO' });
    const n = writeSync(fd, buf, done, buf.length - done);
    // A write that takes nothing on a regular file means the disk is full.
    if (n <= 0) throw Object.assign(new Error('write took no bytes'), { code: 'ENOSPC' });
    done += n;
  }
}

/** How `--out` will be written. */
export interface OutputOptions {
  /** The option named in messages (`--out`, `--update-scenario`). */
  flag?: string;
  /** Replace a read-only file. */
  force?: boolean;
  /** The target may be an input of the run (updating a scenario in place). */
  mayBeInput?: boolean;
}

type TargetKind = 'new' | 'file' | 'through';

let runDefaults: OutputOptions = {};

/** Options of the whole run (the CLI's `--force`), under those each write gives. */
export function setOutputDefaults(opts: OutputOptions): void {
  runDefaults = { ...opts };
}

/** What is at `path` now, refused when it must not be written or replaced. */
export function checkOutputTarget(path: string, given: OutputOptions = {}): { kind: TargetKind; stats: Stats | null } {
  const opts = { ...runDefaults, ...given };
  const flag = opts.flag ?? '--out';
  if (path.trim() === '') throw new InputError(`${flag} is empty`, flag, 'give a file path, e.g. --out result.json');
  const st = statSync(path, { throwIfNoEntry: false });
  if (st === undefined) {
    const folder = statSync(dirname(resolve(path)), { throwIfNoEntry: false });
    if (folder === undefined || !folder.isDirectory()) throw new InputError(`folder ${dirname(path)} does not exist`, flag, 'create the folder first, or give a path in an existing folder');
    return { kind: 'new', stats: null };
  }
  if (st.isDirectory()) throw new InputError(`${path} is a folder`, flag, `give a file path inside it, e.g. ${flag} ${join(path, 'result.json')}`);
  if (st.isFIFO() || st.isCharacterDevice()) return { kind: 'through', stats: st };
  if (!st.isFile()) throw new InputError(`${path} is not a regular file (${st.isBlockDevice() ? 'a block device' : st.isSocket() ? 'a socket' : 'a special file'})`, flag, 'give the path of a regular file');
  const input = opts.mayBeInput === true ? null : inputFileAt(path);
  if (input !== null) throw new InputError(`${path} is an input of this run (${input}); writing it would replace the input`, flag, 'give another output path');
  if (opts.force !== true && !writable(path, st)) throw new InputError(`${path} is read-only`, flag, 'give another path, or add --force to replace it');
  return { kind: 'file', stats: st };
}

/** Writable for us: the permission bits say so (root ignores them, but a read-only mark is a wish). */
function writable(path: string, st: Stats): boolean {
  if ((st.mode & 0o222) === 0) return false;
  try {
    accessSync(path, fsConstants.W_OK);
    return true;
  } catch {
    return false;
  }
}

/** An output being written: `write` as often as needed, then `commit` (or `abort`). */
export interface OutputFile {
  write(text: string): void;
  commit(): void;
  abort(): void;
}

/** Open `given` for output (see the module comment). The checks run again here, at writing time. */
export function openOutput(given: string, opts: OutputOptions = {}): OutputFile {
  const flag = opts.flag ?? '--out';
  const { kind, stats } = checkOutputTarget(given, opts);
  if (kind === 'through') return openThrough(given, stats as Stats, flag);
  // Through a symbolic link, the file it points to is replaced (the link stays a link).
  const path = kind === 'file' ? realpathSync(given) : given;
  const tmp = reserveTemp(path);
  let fd: number;
  try {
    fd = openSync(tmp, 'wx', 0o666);
    if (stats !== null) keepOwnership(fd, stats);
  } catch (e) {
    releaseTemp(tmp);
    rmSync(tmp, { force: true });
    throw writeFault(e, given, flag);
  }
  let open = true;
  const fail = (e: unknown): never => {
    if (open) {
      open = false;
      try {
        closeSync(fd);
      } catch {
        // the write fault is the one to report
      }
    }
    rmSync(tmp, { force: true });
    releaseTemp(tmp);
    throw writeFault(e, given, flag);
  };
  return {
    write: (text) => {
      if (!open) throw new InternalError(`write after the end of ${given}`);
      try {
        writeAllSync(fd, text);
      } catch (e) {
        fail(e);
      }
    },
    commit: () => {
      if (!open) throw new InternalError(`${given} committed twice`);
      try {
        fsyncSync(fd);
        open = false;
        closeSync(fd);
        renameSync(tmp, path);
      } catch (e) {
        fail(e);
      }
      releaseTemp(tmp);
      syncFolder(dirname(resolve(path)));
    },
    abort: () => {
      if (open) {
        open = false;
        closeSync(fd);
      }
      rmSync(tmp, { force: true });
      releaseTemp(tmp);
    },
  };
}

/** The replaced file's mode (and owner, when we may set it) carry over to the new one. */
function keepOwnership(fd: number, st: Stats): void {
  fchmodSync(fd, st.mode & 0o7777);
  try {
    fchownSync(fd, st.uid, st.gid);
  } catch {
    // only root may give a file away; the file stays ours
  }
}

/** fsync a folder so that a rename survives a power loss (not possible everywhere: best effort). */
export function syncFolder(folder: string): void {
  try {
    const fd = openSync(folder, 'r');
    try {
      fsyncSync(fd);
    } finally {
      closeSync(fd);
    }
  } catch {
    // some file systems refuse fsync on folders
  }
}

/** A FIFO or character device is written in place; a FIFO with no reader is refused (no hang). */
function openThrough(path: string, st: Stats, flag: string): OutputFile {
  let fd: number;
  try {
    if (st.isFIFO()) {
      // Opening a FIFO for writing blocks until a reader comes; without one, refuse at once. The
      // probe stays open until the real descriptor is: closing it first would end the reader's input.
      const probe = openSync(path, fsConstants.O_WRONLY | fsConstants.O_NONBLOCK);
      try {
        fd = openSync(path, fsConstants.O_WRONLY);
      } finally {
        closeSync(probe);
      }
    } else fd = openSync(path, fsConstants.O_WRONLY);
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code === 'ENXIO') throw new InputError(`${path} is a FIFO with no reader`, flag, 'start the reader first, or give a regular file');
    throw writeFault(e, path, flag);
  }
  let open = true;
  const close = (): void => {
    if (open) closeSync(fd);
    open = false;
  };
  return {
    write: (text) => {
      try {
        writeAllSync(fd, text);
      } catch (e) {
        close();
        throw writeFault(e, path, flag);
      }
    },
    commit: close,
    abort: close,
  };
}

/** Write `text` to `path` (see {@link openOutput}). */
export function writeFileAtomic(path: string, text: string, flagOrOptions: string | OutputOptions = {}): void {
  const opts = typeof flagOrOptions === 'string' ? { flag: flagOrOptions } : flagOrOptions;
  const f = openOutput(path, opts);
  f.write(text);
  f.commit();
}

/** JSON text of a result; refuses NaN and ±Infinity anywhere (they would print as null silently). */
export function toJsonText(value: unknown): string {
  const fault = nonFinite(value);
  if (fault !== null) {
    const path = `$${fault.path.join('')}`;
    throw new InternalError(`non-finite number ${fault.value} at ${path} in the output`, path);
  }
  return `${JSON.stringify(value, null, 2)}\n`;
}

/**
 * The first NaN or ±Infinity in `value` with its path (`[i]` and `.key` parts, outermost first), or
 * null. The path is collected on the way back out, so a clean walk builds no strings.
 */
function nonFinite(value: unknown): { value: number; path: string[] } | null {
  if (typeof value === 'number') return Number.isFinite(value) ? null : { value, path: [] };
  if (value === null || typeof value !== 'object') return null;
  if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i++) {
      const f = nonFinite(value[i]);
      if (f !== null) {
        f.path.unshift(`[${i}]`);
        return f;
      }
    }
    return null;
  }
  for (const k in value) {
    if (!Object.hasOwn(value, k)) continue;
    const f = nonFinite((value as Record<string, unknown>)[k]);
    if (f !== null) {
      f.path.unshift(`.${k}`);
      return f;
    }
  }
  return null;
}
