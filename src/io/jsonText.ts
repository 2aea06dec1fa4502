/** Locating a JSON syntax error as file:line:column (V8 reports a character position). */
import { InputError } from '../errors.ts';

/** An InputError for a JSON.parse failure on `text`, located at file:line[:column] where possible. */
export function jsonSyntaxError(text: string, error: unknown, fileName: string, what: string, fix: string): InputError {
  const message = String((error as Error)?.message ?? error).replace(/\s+/g, ' ');
  let line: number | null = null;
  let column: number | null = null;
  const lc = /line (\d+) column (\d+)/.exec(message);
  const pos = /position (\d+)/.exec(message);
  if (lc !== null) {
    line = Number(lc[1]);
    column = Number(lc[2]);
  } else if (pos !== null) {
    const p = Math.min(Number(pos[1]), text.length);
    const before = text.slice(0, p);
    line = before.split('\n').length;
    column = p - before.lastIndexOf('\n');
  } else if (/end of (JSON )?input/i.test(message)) {
    line = text.split('\n').length;
  }
  const where = line === null ? fileName : column === null ? `${fileName}:${line}` : `${fileName}:${line}:${column}`;
  const reason = message.replace(/ in JSON at position \d+.*$/, '').replace(/^JSON\.parse: /, '');
  return new InputError(`${what}: ${reason.length > 120 ? `${reason.slice(0, 117)}...` : reason}`, where, fix);
}
