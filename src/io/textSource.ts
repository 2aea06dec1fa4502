/**
 * The one way in for every text input. A path (or `-` / `/dev/stdin` for standard input):
 * - its type is checked first: a folder, a device (`/dev/zero`, `/dev/urandom`) or a socket is
 *   refused at once; a FIFO is opened without blocking (one with no writer reads as empty);
 * - bytes are read in chunks up to a size cap per kind of input (a wrong file fails at once and no
 *   text ever reaches V8's string limit, ERR_STRING_TOO_LONG);
 * - gzip is recognised by its magic bytes (1f 8b, RFC 1952 §2.3.1) whatever the file is called;
 * - a UTF-8 BOM is dropped, UTF-16 refused ("save the file as UTF-8"), lines split on LF with an
 *   optional CR before it.
 * The path is recorded as an input of the run, so `--out` never replaces it (output.ts).
 *
 * Three forms, one set of rules:
 * - {@link readLinesSync}: a generator of `{ text, line }`, synchronous, for readers that keep less
 *   than the file (TLE, SP3, OEM, RINEX nav); plain text streams chunk by chunk, gzip is inflated
 *   whole into a buffer (outside the JavaScript heap) and split from there;
 * - {@link readTextLines}: the same as an async generator, inflating gzip as it streams, for the
 *   big clock products (a 30-s RINEX clock day is 17 MB unpacked, a 1-Hz CSV over 58 days 200 MB);
 * - {@link readTextWhole}: the whole text, for documents a parser needs whole (YAML/JSON
 *   scenarios, OMM XML/JSON, leap-second tables).
 * Faults are {@link InputError}s naming the path, with a fix.
 */
import { closeSync, constants as fsConstants, fstatSync, openSync, readSync, statSync } from 'node:fs';
import { Readable } from 'node:stream';
import { createGunzip, gunzipSync } from 'node:zlib';
import { InputError } from '../errors.ts';
import { noteInputFile } from './output.ts';

/** Size caps per kind of input [bytes, unpacked]: guards against the wrong file, far above real ones (common practice). */
export const INPUT_SIZE_CAPS = {
  /** Scenarios are a few kB; generated ones with thousands of satellites stay below 16 MB. */
  scenario: 16 * 1024 * 1024,
  /** The whole public catalogue is ~3 MB as TLE and ~30 MB as OMM XML. */
  elements: 128 * 1024 * 1024,
  /** A day of 5-minute SP3-d for 120 satellites is ~6 MB; a 30-s RINEX nav day a few MB. */
  orbit: 256 * 1024 * 1024,
  /** Measurements: 58 days at 1 Hz as CSV is ~200 MB; a 5-s RINEX clock day of 150 clocks ~120 MB. */
  measurements: 500 * 1024 * 1024,
  /** Leap-second tables are 10 kB. */
  table: 1024 * 1024,
  /** Anything else read whole. */
  text: 256 * 1024 * 1024,
} as const;

export type InputKind = keyof typeof INPUT_SIZE_CAPS;
/** The same kinds under the name the streaming readers used. */
export type TextKind = InputKind;
/** @deprecated the same object as {@link INPUT_SIZE_CAPS}. */
export const TEXT_SIZE_CAPS = INPUT_SIZE_CAPS;

/** One line of a text source, without its line ending. */
export interface TextLine {
  text: string;
  /** 1-based line number. */
  line: number;
}

/** Paths that name standard input. */
const STDIN_PATHS = new Set(['-', '/dev/stdin', '/dev/fd/0', '/proc/self/fd/0']);
/** Bytes read per call. */
const CHUNK_BYTES = 1024 * 1024;
/** A pipe with a writer but no data for this long is given up [ms]: the writer is stuck. */
const PIPE_IDLE_LIMIT_MS = 30_000;
/** Wait between polls of an empty non-blocking pipe [ms]. */
const PIPE_POLL_MS = 5;
/** Bytes inspected for UTF-16 without a BOM (NUL bytes among text). */
const SNIFF_BYTES = 1024;
const GZIP_MAGIC_0 = 0x1f;
const GZIP_MAGIC_1 = 0x8b;

const sleeper = new Int32Array(new SharedArrayBuffer(4));
/** Standard input and pipes can be read only once: what a whole read got is kept for a second reader of the same path. */
const streamed = new Map<string, Buffer>();

/** The name used in messages: `stdin` for `-`, the path otherwise. */
export function sourceName(path: string): string {
  return path === '-' ? 'stdin' : path;
}

function tooLarge(path: string, kind: InputKind, where: string): InputError {
  const mb = Math.round(INPUT_SIZE_CAPS[kind] / 1024 / 1024);
  return new InputError(`file too large for ${kind === 'text' ? 'an input' : `a ${kind} file`}: ${sourceName(path)} is more than ${mb} MB unpacked`, where, 'check that this is the right file, or split it into smaller ones');
}

function readFault(e: unknown, path: string, where: string): InputError {
  const code = (e as NodeJS.ErrnoException).code;
  const name = sourceName(path);
  if (code === 'ENOENT') return new InputError(`file not found: ${name}`, where, 'check the path');
  if (code === 'EISDIR') return new InputError(`${name} is a folder, not a file`, where, 'give the path of a file');
  if (code === 'EACCES' || code === 'EPERM') return new InputError(`no permission to read ${name}`, where, 'give a file you can read');
  if (code === 'ERR_STRING_TOO_LONG') return new InputError(`file too large: ${name}`, where, 'check that this is the right file, or split it into smaller ones');
  return new InputError(`cannot read ${name} (${code ?? 'error'})`, where, 'check the path and the disk');
}

function gzipFault(path: string, where: string, e: unknown): InputError {
  const code = (e as NodeJS.ErrnoException).code ?? 'error';
  return new InputError(`${sourceName(path)} is a damaged gzip file (${code})`, where, 'copy or download the file again; gzip -t FILE checks it');
}

function utf16Fault(path: string, where: string): InputError {
  return new InputError(`${sourceName(path)} is UTF-16 text (or binary)`, where, 'save the file as UTF-8');
}

/** True when the first bytes look like UTF-16 (a BOM, or NUL bytes among text). */
function looksUtf16(head: Uint8Array): boolean {
  if (head.length >= 2 && ((head[0] === 0xff && head[1] === 0xfe) || (head[0] === 0xfe && head[1] === 0xff))) return true;
  const n = Math.min(head.length, SNIFF_BYTES);
  for (let i = 0; i < n; i++) if (head[i] === 0) return true;
  return false;
}

function isGzip(head: Uint8Array): boolean {
  return head.length >= 2 && head[0] === GZIP_MAGIC_0 && head[1] === GZIP_MAGIC_1;
}

/** An opened, type-checked input read in capped chunks. */
class ByteSource {
  private fd = -1;
  private total = 0;
  private ended = false;
  private readonly cap: number;
  private readonly kept: Buffer | undefined;
  private keptRead = false;
  /** True for standard input and FIFOs, which can be read once only. */
  readonly once: boolean;

  constructor(
    readonly path: string,
    readonly kind: InputKind,
    readonly where: string,
  ) {
    this.cap = INPUT_SIZE_CAPS[kind];
    this.kept = streamed.get(path);
    this.once = STDIN_PATHS.has(path);
    if (this.kept !== undefined || this.once) {
      this.fd = this.kept === undefined ? 0 : -1;
      return;
    }
    let st;
    try {
      st = statSync(path);
    } catch (e) {
      throw readFault(e, path, where);
    }
    if (st.isDirectory()) throw new InputError(`${path} is a folder, not a file`, where, 'give the path of a file');
    if (st.isFile()) {
      if (st.size > this.cap) throw tooLarge(path, kind, where);
    } else if (!st.isFIFO()) {
      const what = st.isCharacterDevice() || st.isBlockDevice() ? 'a device' : st.isSocket() ? 'a socket' : 'a special file';
      throw new InputError(`${path} is ${what}, not a file`, where, 'give the path of a regular file (or - to read standard input)');
    }
    this.once = st.isFIFO();
    noteInputFile(path);
    try {
      // A FIFO opened without O_NONBLOCK would wait for a writer forever.
      this.fd = openSync(path, st.isFIFO() ? fsConstants.O_RDONLY | fsConstants.O_NONBLOCK : fsConstants.O_RDONLY);
    } catch (e) {
      throw readFault(e, path, where);
    }
    // The file may have changed between stat and open: the cap holds for what is actually read.
    if (fstatSync(this.fd).isDirectory()) {
      this.close();
      throw new InputError(`${path} is a folder, not a file`, where, 'give the path of a file');
    }
  }

  /** The next chunk, or null at the end; pipes without data are polled up to an idle limit. */
  read(): Buffer | null {
    if (this.kept !== undefined) {
      if (this.keptRead) return null;
      this.keptRead = true;
      return this.kept;
    }
    if (this.ended) return null;
    const buf = Buffer.allocUnsafe(CHUNK_BYTES);
    let idleSince = Date.now();
    for (let polls = 0; ; polls++) {
      let n: number;
      try {
        n = readSync(this.fd, buf, 0, CHUNK_BYTES, null);
      } catch (e) {
        if ((e as NodeJS.ErrnoException).code !== 'EAGAIN') throw readFault(e, this.path, this.where);
        if (Date.now() - idleSince > PIPE_IDLE_LIMIT_MS) throw new InputError(`no data from ${sourceName(this.path)} for ${PIPE_IDLE_LIMIT_MS / 1000} s`, this.where, 'check the program writing into the pipe');
        Atomics.wait(sleeper, 0, 0, PIPE_POLL_MS);
        continue;
      }
      if (n === 0) {
        this.ended = true;
        return null;
      }
      idleSince = Date.now();
      this.total += n;
      if (this.total > this.cap) throw tooLarge(this.path, this.kind, this.where);
      return buf.subarray(0, n);
    }
  }

  /** Every remaining byte (capped). */
  readAll(first: Buffer | null = null): Buffer {
    const chunks: Buffer[] = first === null ? [] : [first];
    for (let c = this.read(); c !== null; c = this.read()) chunks.push(c);
    return chunks.length === 1 ? chunks[0] : Buffer.concat(chunks);
  }

  close(): void {
    if (this.fd > 0) closeSync(this.fd);
    this.fd = -1;
  }
}

/** Inflate a whole gzip buffer, capped at the kind's size. */
function gunzipCapped(raw: Buffer, src: ByteSource): Buffer {
  let out: Buffer;
  try {
    out = gunzipSync(raw, { maxOutputLength: INPUT_SIZE_CAPS[src.kind] + 1 });
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code === 'ERR_BUFFER_TOO_LARGE') throw tooLarge(src.path, src.kind, src.where);
    throw gzipFault(src.path, src.where, e);
  }
  if (out.length > INPUT_SIZE_CAPS[src.kind]) throw tooLarge(src.path, src.kind, src.where);
  return out;
}

/** Splits decoded text into lines: BOM at the start dropped, CR before LF dropped, a last line without LF kept. */
class LineSplitter {
  private readonly decoder = new TextDecoder('utf-8');
  private pending = '';
  private lineNo = 0;
  private started = false;
  private unpacked = 0;

  constructor(private readonly src: ByteSource) {}

  /** Lines completed by this chunk of bytes. */
  push(chunk: Uint8Array, out: TextLine[]): void {
    this.unpacked += chunk.length;
    if (this.unpacked > INPUT_SIZE_CAPS[this.src.kind]) throw tooLarge(this.src.path, this.src.kind, this.src.where);
    if (!this.started) {
      this.started = true;
      if (looksUtf16(chunk.subarray(0, SNIFF_BYTES))) throw utf16Fault(this.src.path, this.src.where);
    }
    let text = this.decoder.decode(chunk, { stream: true });
    if (this.lineNo === 0 && this.pending === '' && text.charCodeAt(0) === 0xfeff) text = text.slice(1);
    const all = this.pending === '' ? text : this.pending + text;
    let start = 0;
    for (let nl = all.indexOf('\n'); nl >= 0; nl = all.indexOf('\n', start)) {
      const end = nl > start && all.charCodeAt(nl - 1) === 13 ? nl - 1 : nl;
      this.lineNo++;
      out.push({ text: all.slice(start, end), line: this.lineNo });
      start = nl + 1;
    }
    this.pending = all.slice(start);
  }

  /** The last line, when the text does not end with a line ending. */
  end(out: TextLine[]): void {
    let rest = this.pending + this.decoder.decode();
    if (rest.endsWith('\r')) rest = rest.slice(0, -1);
    if (rest !== '') out.push({ text: rest, line: this.lineNo + 1 });
  }
}

/** Size of the slices a whole inflated buffer is split in [bytes]. */
const SLICE_BYTES = 1024 * 1024;

/**
 * Lines of an input, synchronously, as they are read (see the module comment). A final line
 * without a line ending is still yielded; a final empty line after the last LF is not.
 * @param where the option or argument the path came from, for messages
 */
export function* readLinesSync(path: string, kind: InputKind, where: string): Generator<TextLine> {
  const src = new ByteSource(path, kind, where);
  try {
    const split = new LineSplitter(src);
    const out: TextLine[] = [];
    let chunk = src.read();
    if (chunk !== null && isGzip(chunk)) {
      const body = gunzipCapped(src.readAll(chunk), src);
      for (let at = 0; at < body.length; at += SLICE_BYTES) {
        split.push(body.subarray(at, at + SLICE_BYTES), out);
        yield* out;
        out.length = 0;
      }
    } else {
      for (; chunk !== null; chunk = src.read()) {
        split.push(chunk, out);
        yield* out;
        out.length = 0;
      }
    }
    split.end(out);
    yield* out;
  } finally {
    src.close();
  }
}

/**
 * Stream the lines of an input, inflating gzip as it is read (see the module comment).
 * @param where the option or argument the path came from, for messages
 */
export async function* readTextLines(path: string, kind: InputKind, where: string): AsyncGenerator<TextLine> {
  const src = new ByteSource(path, kind, where);
  try {
    const first = src.read();
    if (first === null || !isGzip(first)) {
      yield* readPlain(src, first);
      return;
    }
    const gz = createGunzip();
    const raw = Readable.from(
      (function* () {
        yield first;
        for (let c = src.read(); c !== null; c = src.read()) yield c;
      })(),
    );
    raw.on('error', (e) => gz.destroy(e));
    raw.pipe(gz);
    const split = new LineSplitter(src);
    const out: TextLine[] = [];
    try {
      for await (const chunk of gz as AsyncIterable<Buffer>) {
        split.push(chunk, out);
        yield* out;
        out.length = 0;
      }
    } catch (e) {
      if (e instanceof InputError) throw e;
      throw gzipFault(path, where, e);
    } finally {
      raw.destroy();
      gz.destroy();
    }
    split.end(out);
    yield* out;
  } finally {
    src.close();
  }
}

function* readPlain(src: ByteSource, first: Buffer | null): Generator<TextLine> {
  const split = new LineSplitter(src);
  const out: TextLine[] = [];
  for (let chunk = first; chunk !== null; chunk = src.read()) {
    split.push(chunk, out);
    yield* out;
    out.length = 0;
  }
  split.end(out);
  yield* out;
}

/**
 * The whole text of an input (see the module comment): for documents a parser reads whole.
 * @param where the option or argument the path came from, for messages
 */
export function readTextWhole(path: string, kind: InputKind, where: string): string {
  const src = new ByteSource(path, kind, where);
  let raw: Buffer;
  try {
    raw = src.readAll();
  } finally {
    src.close();
  }
  if (src.once) streamed.set(path, raw);
  if (isGzip(raw)) raw = gunzipCapped(raw, src);
  if (looksUtf16(raw.subarray(0, SNIFF_BYTES))) throw utf16Fault(path, where);
  let text: string;
  try {
    text = raw.toString('utf8');
  } catch (e) {
    throw readFault(e, path, where);
  }
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}

/**
 * The first `maxLines` lines of an input (to recognise its format) without reading the rest.
 * Standard input and FIFOs are read whole and kept, so the reader that follows still gets them.
 */
export function readHeadLines(path: string, kind: InputKind, where: string, maxLines: number): string[] {
  const out: string[] = [];
  if (STDIN_PATHS.has(path) || streamed.has(path) || isFifo(path)) {
    for (const l of linesOf(readTextWhole(path, kind, where))) {
      if (out.length >= maxLines) break;
      out.push(l.text);
    }
    return out;
  }
  const it = readLinesSync(path, kind, where);
  try {
    for (let r = it.next(); r.done !== true && out.length < maxLines; r = it.next()) out.push(r.value.text);
  } finally {
    it.return(undefined);
  }
  return out;
}

function isFifo(path: string): boolean {
  try {
    return statSync(path).isFIFO();
  } catch {
    return false;
  }
}

/** {@link readTextWhole} with the arguments in the order of the former readInput.ts. */
export function readInputText(path: string, where: string, kind: InputKind = 'text'): string {
  return readTextWhole(path, kind, where);
}

/** Whole-text lines with numbers, for parsers given a string (tests, library callers): the same splitting rules. */
export function* linesOf(text: string): Generator<TextLine> {
  let start = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  let lineNo = 0;
  for (let nl = text.indexOf('\n', start); nl >= 0; nl = text.indexOf('\n', start)) {
    const end = nl > start && text.charCodeAt(nl - 1) === 13 ? nl - 1 : nl;
    lineNo++;
    yield { text: text.slice(start, end), line: lineNo };
    start = nl + 1;
  }
  let rest = text.slice(start);
  if (rest.endsWith('\r')) rest = rest.slice(0, -1);
  if (rest !== '') yield { text: rest, line: lineNo + 1 };
}
