/**
 * Reading one whole input file as text without hanging or running out of memory:
 * - the file type is checked first: a folder, a device (`/dev/zero`, `/dev/urandom`), a socket is
 *   refused at once; a FIFO is read without blocking (one with no writer reads as empty);
 *   `/dev/stdin` is read as before;
 * - reads stop at a size cap per kind of input (a wrong file fails at once, and no text ever
 *   reaches V8's string limit, ERR_STRING_TOO_LONG);
 * - gzip is unpacked (by its magic bytes), a UTF-8 BOM dropped, UTF-16 refused.
 * The file is recorded as an input of the run, so `--out` never replaces it (output.ts).
 */
import { closeSync, constants as fsConstants, fstatSync, openSync, readSync, statSync } from 'node:fs';
import { gunzipSync } from 'node:zlib';
import { InputError } from '../errors.ts';
import { noteInputFile } from './output.ts';

/** Size caps per kind of input [bytes, unpacked]: guards against the wrong file, far above real ones (common practice). */
export const INPUT_SIZE_CAPS = {
  /** Scenarios are a few kB; generated ones with thousands of satellites stay below 16 MB. */
  scenario: 16 * 1024 * 1024,
  /** The whole public catalogue is ~3 MB as TLE and ~30 MB as OMM XML. */
  elements: 128 * 1024 * 1024,
  /** A day of 5-minute SP3-d for 120 satellites is ~6 MB. */
  orbit: 256 * 1024 * 1024,
  /** Measurements: 58 days at 1 Hz as CSV is ~200 MB; below V8's longest string (2^29 − 24 characters). */
  measurements: 400 * 1024 * 1024,
  /** Leap-second tables are 10 kB. */
  table: 1024 * 1024,
  /** Anything else read whole. */
  text: 256 * 1024 * 1024,
} as const;

export type InputKind = keyof typeof INPUT_SIZE_CAPS;

/** Paths that name standard input, read as they always were. */
const STDIN_PATHS = new Set(['/dev/stdin', '/dev/fd/0', '/proc/self/fd/0']);
/** Bytes read per call. */
const CHUNK_BYTES = 1024 * 1024;
/** A pipe with a writer but no data for this long is given up [ms]: the writer is stuck. */
const PIPE_IDLE_LIMIT_MS = 30_000;
/** Wait between polls of an empty non-blocking pipe [ms]. */
const PIPE_POLL_MS = 5;
/** Bytes inspected for UTF-16 without a BOM (NUL bytes among text). */
const SNIFF_BYTES = 1024;

const sleeper = new Int32Array(new SharedArrayBuffer(4));
/** Standard input and pipes can be read only once: what they gave is kept for a second reader of the same path. */
const streamed = new Map<string, Buffer>();

function tooLarge(path: string, kind: InputKind, where: string): InputError {
  const mb = Math.round(INPUT_SIZE_CAPS[kind] / 1024 / 1024);
  return new InputError(`file too large for ${kind === 'text' ? 'an input' : `a ${kind} file`}: ${path} is more than ${mb} MB`, where, 'check that this is the right file, or split it into smaller ones');
}

function readFault(e: unknown, path: string, where: string): InputError {
  const code = (e as NodeJS.ErrnoException).code;
  if (code === 'ENOENT') return new InputError(`file not found: ${path}`, where, 'check the path');
  if (code === 'EISDIR') return new InputError(`${path} is a folder, not a file`, where, 'give the path of a file');
  if (code === 'EACCES' || code === 'EPERM') return new InputError(`no permission to read ${path}`, where, 'give a file you can read');
  if (code === 'ERR_STRING_TOO_LONG') return new InputError(`file too large: ${path}`, where, 'check that this is the right file, or split it into smaller ones');
  return new InputError(`cannot read ${path} (${code ?? 'error'})`, where, 'check the path and the disk');
}

/** Read every byte of `fd` up to `cap` (+1 to tell "too large"); non-blocking pipes are polled. */
function readCapped(fd: number, cap: number, path: string, kind: InputKind, where: string): Buffer {
  const chunks: Buffer[] = [];
  let total = 0;
  let idleSince = Date.now();
  for (;;) {
    const buf = Buffer.allocUnsafe(CHUNK_BYTES);
    let n: number;
    try {
      n = readSync(fd, buf, 0, CHUNK_BYTES, null);
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code !== 'EAGAIN') throw readFault(e, path, where);
      if (Date.now() - idleSince > PIPE_IDLE_LIMIT_MS) throw new InputError(`no data from ${path} for ${PIPE_IDLE_LIMIT_MS / 1000} s`, where, 'check the program writing into the pipe');
      Atomics.wait(sleeper, 0, 0, PIPE_POLL_MS);
      continue;
    }
    if (n === 0) break;
    idleSince = Date.now();
    chunks.push(buf.subarray(0, n));
    total += n;
    if (total > cap) throw tooLarge(path, kind, where);
  }
  return Buffer.concat(chunks, total);
}

/** The raw bytes of an input, checked for type and size. */
function readBytes(path: string, kind: InputKind, where: string): Buffer {
  const cap = INPUT_SIZE_CAPS[kind];
  const kept = streamed.get(path);
  if (kept !== undefined) return kept;
  if (STDIN_PATHS.has(path)) {
    const bytes = readCapped(0, cap, path, kind, where);
    streamed.set(path, bytes);
    return bytes;
  }
  let st;
  try {
    st = statSync(path);
  } catch (e) {
    throw readFault(e, path, where);
  }
  if (st.isDirectory()) throw new InputError(`${path} is a folder, not a file`, where, 'give the path of a file');
  if (st.isFile()) {
    if (st.size > cap) throw tooLarge(path, kind, where);
  } else if (!st.isFIFO()) {
    const what = st.isCharacterDevice() || st.isBlockDevice() ? 'a device' : st.isSocket() ? 'a socket' : 'a special file';
    throw new InputError(`${path} is ${what}, not a file`, where, 'give the path of a regular file (or /dev/stdin to read standard input)');
  }
  noteInputFile(path);
  let fd: number;
  try {
    // A FIFO opened without O_NONBLOCK would wait for a writer forever.
    fd = openSync(path, st.isFIFO() ? fsConstants.O_RDONLY | fsConstants.O_NONBLOCK : fsConstants.O_RDONLY);
  } catch (e) {
    throw readFault(e, path, where);
  }
  try {
    // The file may have changed between stat and open: the cap holds for what is actually read.
    if (fstatSync(fd).isDirectory()) throw new InputError(`${path} is a folder, not a file`, where, 'give the path of a file');
    const bytes = readCapped(fd, cap, path, kind, where);
    if (st.isFIFO()) streamed.set(path, bytes);
    return bytes;
  } finally {
    closeSync(fd);
  }
}

/** True when the first bytes look like UTF-16 (a BOM, or NUL bytes among text). */
function looksUtf16(head: Uint8Array): boolean {
  if (head.length >= 2 && ((head[0] === 0xff && head[1] === 0xfe) || (head[0] === 0xfe && head[1] === 0xff))) return true;
  for (let i = 0; i < Math.min(head.length, SNIFF_BYTES); i++) if (head[i] === 0) return true;
  return false;
}

/**
 * The whole text of an input file (see the module comment).
 * @param where the option or argument the path came from, for messages
 */
export function readInputText(path: string, where: string, kind: InputKind = 'text'): string {
  let raw = readBytes(path, kind, where);
  if (raw.length >= 2 && raw[0] === 0x1f && raw[1] === 0x8b) {
    try {
      raw = gunzipSync(raw, { maxOutputLength: INPUT_SIZE_CAPS[kind] + 1 });
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code === 'ERR_BUFFER_TOO_LARGE') throw tooLarge(path, kind, where);
      throw new InputError(`${path} is a damaged gzip file (${(e as NodeJS.ErrnoException).code ?? 'error'})`, where, 'copy or download the file again; gzip -t FILE checks it');
    }
    if (raw.length > INPUT_SIZE_CAPS[kind]) throw tooLarge(path, kind, where);
  }
  if (looksUtf16(raw.subarray(0, SNIFF_BYTES))) throw new InputError(`${path} is UTF-16 text (or binary)`, where, 'save the file as UTF-8');
  let text: string;
  try {
    text = raw.toString('utf8');
  } catch (e) {
    throw readFault(e, path, where);
  }
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}
