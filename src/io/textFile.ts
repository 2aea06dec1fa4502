/**
 * Reading a text file that may be gzip-compressed (`.gz`, recognised by its magic bytes, not its
 * name), as GNSS products usually are. File-system faults become one-line input errors.
 */
import { readFileSync } from 'node:fs';
import { gunzipSync } from 'node:zlib';
import { InputError } from '../errors.ts';

/** Text of a plain or gzip file (UTF-8). `where` names the flag or field for messages. */
export function readTextMaybeGzip(path: string, where: string): string {
  let bytes: Buffer;
  try {
    bytes = readFileSync(path);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const what = code === 'ENOENT' ? `file not found: ${path}` : code === 'EISDIR' ? `${path} is a folder, not a file` : `cannot read ${path} (${code ?? 'error'})`;
    throw new InputError(what, where, 'check the path');
  }
  if (bytes.length >= 2 && bytes[0] === 0x1f && bytes[1] === 0x8b) {
    try {
      bytes = gunzipSync(bytes);
    } catch {
      throw new InputError(`${path} starts like a gzip file but does not unpack`, where, 'check the download is complete, or unpack it yourself');
    }
  }
  return bytes.toString('utf8');
}
