/**
 * One way in for every text input: a path (or `-` for stdin), checked to be a regular file, gzip
 * detected by its magic bytes (1f 8b, RFC 1952 §2.3.1) whatever the file is called, a UTF-8 BOM
 * stripped, UTF-16 refused (its BOM, or NUL bytes in the first kilobyte), lines split on LF with
 * an optional CR before it, and a size cap per kind of input so a wrong file (a disk image, a
 * 2 GB log) fails at once instead of filling memory.
 *
 * Two forms:
 * - {@link readTextLines}: an async iterator of `{ text, line }`, streaming through node:zlib, for
 *   large products (a 30-s RINEX clock day is 17 MB unpacked) so the whole text never exists as
 *   one string;
 * - {@link readTextWhole}: the whole text at once, synchronously, for small inputs that parsers
 *   read as one string (scenarios, element sets, SP3 orbits).
 * Both throw {@link InputError} with the path as `where` and a fix.
 */
import { closeSync, createReadStream, openSync, readSync, statSync } from 'node:fs';
import { createGunzip, gunzipSync } from 'node:zlib';
import { InputError } from '../errors.ts';

/** Kinds of input and their size caps (unpacked bytes). A cap is a guard against the wrong file, not a limit on real products. */
export const TEXT_SIZE_CAPS = {
  /** Scenario files: a few kB; 16 MB leaves room for generated ones with thousands of satellites. */
  scenario: 16 * 1024 * 1024,
  /** TLE/OMM catalogues: the full public catalogue is ~3 MB as TLE, ~30 MB as OMM XML. */
  elements: 128 * 1024 * 1024,
  /** Orbit products (SP3, OEM): a 5-min SP3-d day for 120 satellites is ~6 MB. */
  orbit: 256 * 1024 * 1024,
  /** Clock measurements (CSV, RINEX clock, SP3 clock, TDM): a 5-s RINEX clock day of 150 satellites is ~120 MB. */
  measurements: 1024 * 1024 * 1024,
} as const;

export type TextKind = keyof typeof TEXT_SIZE_CAPS;

/** One line of a text source, without its line ending. */
export interface TextLine {
  text: string;
  /** 1-based line number. */
  line: number;
}

const GZIP_MAGIC_0 = 0x1f;
const GZIP_MAGIC_1 = 0x8b;
/** Bytes inspected for a UTF-16 file without a BOM (NUL bytes in ASCII-range text). */
const SNIFF_BYTES = 1024;

/** The name used in messages: `stdin` for `-`, the path otherwise. */
export function sourceName(path: string): string {
  return path === '-' ? 'stdin' : path;
}

function checkRegularFile(path: string, flag: string): number {
  if (path === '-') return -1;
  let size: number;
  try {
    const st = statSync(path);
    if (st.isDirectory()) throw new InputError(`${path} is a folder, not a file`, flag, 'give the path of a file');
    if (!st.isFile()) throw new InputError(`${path} is not a regular file`, flag, 'give the path of a file (not a device, pipe or socket); use - to read stdin');
    size = st.size;
  } catch (e) {
    if (e instanceof InputError) throw e;
    const code = (e as NodeJS.ErrnoException).code;
    throw new InputError(code === 'ENOENT' ? `file not found: ${path}` : `cannot read ${path} (${code ?? 'error'})`, flag, 'check the path');
  }
  return size;
}

function tooBig(path: string, kind: TextKind, flag: string): InputError {
  const mb = Math.round(TEXT_SIZE_CAPS[kind] / 1024 / 1024);
  return new InputError(`${sourceName(path)} is larger than ${mb} MB unpacked, more than any ${kind} input should be`, flag, 'check that this is the right file, or split it');
}

function utf16Error(path: string, flag: string): InputError {
  return new InputError(`${sourceName(path)} is UTF-16 text`, flag, 'save the file as UTF-8');
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

function gzipError(path: string, flag: string, e: unknown): InputError {
  const code = (e as NodeJS.ErrnoException).code ?? 'error';
  return new InputError(`${sourceName(path)} is a damaged gzip stream (${code})`, flag, 'download or copy the file again; `gzip -t FILE` checks it');
}

/**
 * The whole text of a small input, synchronously: gunzipped when it starts with the gzip magic,
 * BOM stripped, UTF-16 refused, capped at the kind's size.
 * @param flag where the path came from, for messages (`--orbit`, `measurements`, ...)
 */
export function readTextWhole(path: string, kind: TextKind, flag: string): string {
  if (path === '-') throw new InputError('stdin cannot be read here', flag, 'give the path of a file');
  const size = checkRegularFile(path, flag);
  if (size > TEXT_SIZE_CAPS[kind]) throw tooBig(path, kind, flag);
  let raw: Buffer;
  const fd = openSync(path, 'r');
  try {
    raw = Buffer.alloc(size);
    let got = 0;
    for (let guard = 0; got < size && guard < 1e6; guard++) {
      const n = readSync(fd, raw, got, size - got, got);
      if (n === 0) break;
      got += n;
    }
    raw = raw.subarray(0, got);
  } finally {
    closeSync(fd);
  }
  if (isGzip(raw)) {
    try {
      raw = gunzipSync(raw, { maxOutputLength: TEXT_SIZE_CAPS[kind] + 1 });
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code === 'ERR_BUFFER_TOO_LARGE') throw tooBig(path, kind, flag);
      throw gzipError(path, flag, e);
    }
  }
  if (raw.length > TEXT_SIZE_CAPS[kind]) throw tooBig(path, kind, flag);
  if (looksUtf16(raw.subarray(0, SNIFF_BYTES))) throw utf16Error(path, flag);
  const text = raw.toString('utf8');
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}

/**
 * Stream the lines of an input (a path, or `-` for stdin): gzip detected by its magic bytes and
 * inflated as it is read, BOM stripped, UTF-16 refused, CR before LF dropped, size capped. A
 * final line without a line ending is still yielded; a final empty line after the last LF is not.
 * @param flag where the path came from, for messages
 */
export async function* readTextLines(path: string, kind: TextKind, flag: string): AsyncGenerator<TextLine> {
  checkRegularFile(path, flag);
  const input: NodeJS.ReadableStream = path === '-' ? process.stdin : createReadStream(path, { highWaterMark: 256 * 1024 });
  const cap = TEXT_SIZE_CAPS[kind];
  const decoder = new TextDecoder('utf-8');
  let source: AsyncIterable<Buffer> = input as AsyncIterable<Buffer>;
  let checkedHead = false;
  let pending = '';
  let lineNo = 0;
  let total = 0;
  let gunzip: ReturnType<typeof createGunzip> | null = null;
  const rawIter = (input as AsyncIterable<Buffer>)[Symbol.asyncIterator]();
  // Peek at the first chunk to decide between plain text and gzip.
  const first = await rawIter.next().catch((e: unknown) => {
    throw new InputError(`cannot read ${sourceName(path)} (${(e as NodeJS.ErrnoException).code ?? 'error'})`, flag, 'check the path');
  });
  if (first.done === true) return;
  const head = first.value;
  if (isGzip(head)) {
    const gz = createGunzip();
    gunzip = gz;
    // Feed the raw chunks into the inflater in the background; errors surface in the loop below.
    void (async () => {
      try {
        gz.write(head);
        for (let r = await rawIter.next(); r.done !== true; r = await rawIter.next()) {
          if (!gz.write(r.value)) await new Promise<void>((res) => gz.once('drain', () => res()));
        }
        gz.end();
      } catch (e) {
        gz.destroy(e as Error);
      }
    })();
    source = gz as AsyncIterable<Buffer>;
  } else {
    source = (async function* () {
      yield head;
      for (let r = await rawIter.next(); r.done !== true; r = await rawIter.next()) yield r.value;
    })();
  }
  try {
    for await (const chunk of source) {
      total += chunk.length;
      if (total > cap) throw tooBig(path, kind, flag);
      if (!checkedHead) {
        checkedHead = true;
        if (looksUtf16(chunk.subarray(0, SNIFF_BYTES))) throw utf16Error(path, flag);
      }
      let text = decoder.decode(chunk, { stream: true });
      if (lineNo === 0 && pending === '' && text.charCodeAt(0) === 0xfeff) text = text.slice(1);
      pending += text;
      let start = 0;
      for (let nl = pending.indexOf('\n'); nl >= 0; nl = pending.indexOf('\n', start)) {
        const end = nl > start && pending.charCodeAt(nl - 1) === 13 ? nl - 1 : nl;
        lineNo++;
        yield { text: pending.slice(start, end), line: lineNo };
        start = nl + 1;
      }
      pending = pending.slice(start);
    }
  } catch (e) {
    if (e instanceof InputError) throw e;
    if (gunzip !== null) throw gzipError(path, flag, e);
    throw new InputError(`cannot read ${sourceName(path)} (${(e as NodeJS.ErrnoException).code ?? 'error'})`, flag, 'check the path');
  } finally {
    gunzip?.destroy();
    if (path !== '-') (input as ReturnType<typeof createReadStream>).destroy();
  }
  pending += decoder.decode();
  if (pending.endsWith('\r')) pending = pending.slice(0, -1);
  if (pending !== '') yield { text: pending, line: lineNo + 1 };
}

/** Whole-text lines with numbers, for parsers given a string (tests, small files): the same splitting rules as {@link readTextLines}. */
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

/** First bytes of a file, gunzipped when compressed, as text: enough to recognise a format. */
export async function peekText(path: string, kind: TextKind, flag: string, maxLines = 3): Promise<string[]> {
  const out: string[] = [];
  const it = readTextLines(path, kind, flag);
  try {
    for (let r = await it.next(); r.done !== true && out.length < maxLines; r = await it.next()) out.push(r.value.text);
  } finally {
    await it.return(undefined);
  }
  return out;
}
