/**
 * Folder outputs (`demo`, `report`): several files written into one folder without losing anything
 * already there. Files are written into a temporary folder inside the target, fsync'd, and only then
 * moved in, so a failed run leaves the previous report whole. A file already in the folder is
 * replaced only when an earlier tauplan run wrote it and nobody changed it since (recorded in
 * `.tauplan-files`), or with `--force`.
 */
import { closeSync, fsyncSync, mkdirSync, openSync, readFileSync, renameSync, rmSync, statSync } from 'node:fs';
import { accessSync, constants as fsConstants } from 'node:fs';
import { dirname, join, resolve, sep } from 'node:path';
import { InputError } from '../errors.ts';
import { releaseTemp, removeStaleTemps, reserveTemp, writeAllSync, writeFault } from './output.ts';

/** The record of what tauplan wrote into a folder: name → size and modification time. */
export const FOLDER_RECORD = '.tauplan-files';
/** Deepest folder chain `ensureDir` creates. */
const MAX_FOLDER_DEPTH = 256;

export interface FolderOptions {
  /** The option named in messages. */
  flag?: string;
  /** Replace files that tauplan did not write (or that changed since). */
  force?: boolean;
}

interface FileRecord {
  bytes: number;
  mtimeMs: number;
}

/** stat, or undefined when the path is absent or runs through a file (ENOTDIR: a level above is a file). */
function statOrUndefined(p: string): ReturnType<typeof statSync> {
  try {
    return statSync(p, { throwIfNoEntry: false });
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code === 'ENOTDIR') return undefined;
    throw e;
  }
}

/** Create a folder for outputs, level by level; refuse when a file is in the way or it is not writable. */
export function ensureDir(path: string, flag = '--out'): void {
  if (path.trim() === '') throw new InputError(`${flag} is empty`, flag, 'give a folder path, e.g. --out ./report');
  // Walk up to the nearest existing folder and create each level in turn: mkdirSync's own
  // recursive mode can loop forever on special file systems such as /proc on Node 20.
  const missing: string[] = [];
  let p = resolve(path);
  for (let guard = 0; guard < MAX_FOLDER_DEPTH; guard++) {
    const st = statOrUndefined(p);
    if (st === undefined) {
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

function readRecord(dir: string): Record<string, FileRecord> {
  try {
    const data = JSON.parse(readFileSync(join(dir, FOLDER_RECORD), 'utf8')) as { files?: Record<string, FileRecord> };
    return data.files !== null && typeof data.files === 'object' ? data.files : {};
  } catch {
    return {};
  }
}

function checkName(name: string): void {
  const parts = name.split('/');
  if (name === '' || name.startsWith('/') || parts.some((x) => x === '' || x === '.' || x === '..')) throw new Error(`bad output file name ${JSON.stringify(name)}`);
}

/**
 * Make the output folder and check that the named files may be written, before any work is done.
 * Refuses an empty path, a file in the way of the folder, and (without `force`) a file of the same
 * name that tauplan did not write there.
 */
export function prepareOutputFolder(dir: string, names: readonly string[], opts: FolderOptions = {}): void {
  const flag = opts.flag ?? '--out';
  ensureDir(dir, flag);
  removeStaleTemps(dir);
  const record = readRecord(dir);
  const blocked: string[] = [];
  for (const name of names) {
    checkName(name);
    const st = statSync(join(dir, name), { throwIfNoEntry: false });
    if (st === undefined) continue;
    if (!st.isFile()) throw new InputError(`${join(dir, name)} is in the way and is not a regular file`, flag, 'move it away, or give another folder');
    const r = record[name];
    const ours = r !== undefined && r.bytes === st.size && r.mtimeMs === st.mtimeMs;
    if (!ours && opts.force !== true) blocked.push(name);
  }
  if (blocked.length > 0) {
    const list = blocked.slice(0, 4).join(', ') + (blocked.length > 4 ? `, … (${blocked.length} files)` : '');
    throw new InputError(`${dir} already holds ${list}, not written by an earlier tauplan run`, flag, 'give a new or empty folder, or add --force to replace them');
  }
}

/**
 * Write `files` (name → text; names may hold `/` for subfolders) into `dir`: checked as in
 * {@link prepareOutputFolder}, written into a temporary folder, then moved in.
 */
export function writeOutputFolder(dir: string, files: readonly (readonly [string, string])[], opts: FolderOptions = {}): void {
  const flag = opts.flag ?? '--out';
  const names = files.map(([n]) => n);
  prepareOutputFolder(dir, names, opts);
  const tmp = reserveTemp(join(dir, 'files'));
  try {
    mkdirSync(tmp);
    for (const [name, body] of files) writeOne(join(tmp, name), body);
    for (const name of names) {
      const target = join(dir, name);
      mkdirSync(dirname(target), { recursive: true });
      renameSync(join(tmp, name), target);
    }
    writeRecord(dir, names);
  } catch (e) {
    rmSync(tmp, { recursive: true, force: true });
    releaseTemp(tmp);
    throw writeFault(e, `${dir}${sep}`, flag);
  }
  rmSync(tmp, { recursive: true, force: true });
  releaseTemp(tmp);
}

function writeOne(path: string, body: string): void {
  mkdirSync(dirname(path), { recursive: true });
  const fd = openSync(path, 'wx', 0o666);
  try {
    writeAllSync(fd, body);
    fsyncSync(fd);
  } finally {
    closeSync(fd);
  }
}

/** Record the files just written (kept with those of earlier runs that still match). */
function writeRecord(dir: string, names: readonly string[]): void {
  const record = readRecord(dir);
  const files: Record<string, FileRecord> = {};
  for (const [name, r] of Object.entries(record)) {
    const st = statSync(join(dir, name), { throwIfNoEntry: false });
    if (st !== undefined && st.size === r.bytes && st.mtimeMs === r.mtimeMs) files[name] = r;
  }
  for (const name of names) {
    const st = statSync(join(dir, name));
    files[name] = { bytes: st.size, mtimeMs: st.mtimeMs };
  }
  const tmpRecord = reserveTemp(join(dir, FOLDER_RECORD));
  writeOne(tmpRecord, `${JSON.stringify({ writtenBy: 'tauplan', files }, null, 1)}\n`);
  renameSync(tmpRecord, join(dir, FOLDER_RECORD));
  releaseTemp(tmpRecord);
}
