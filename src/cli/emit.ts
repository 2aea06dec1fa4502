/** Turning a command's result into the requested format, on stdout or atomically into --out. */
import { InputError } from '../errors.ts';
import { toJsonText, writeFileAtomic } from '../io/output.ts';
import { escapeUnsafeText } from '../report/safeText.ts';

export type OutputFormat = 'text' | 'json' | 'csv' | 'html';
export const OUTPUT_FORMATS: readonly OutputFormat[] = ['text', 'json', 'csv', 'html'];

/** Renderers for one result. Missing ones mean the format is not offered by that command. */
export interface Rendered {
  text: () => string;
  json: () => unknown;
  csv?: () => string;
  html?: () => string;
}

/** Render in `format` and write to `out` (atomic) or stdout. Rendering completes before anything is written. */
export function emit(r: Rendered, format: OutputFormat, out: string | undefined, command: string): void {
  let body: string;
  switch (format) {
    case 'json':
      body = toJsonText(r.json());
      break;
    case 'csv':
      if (r.csv === undefined) throw new InputError(`${command} has no CSV output`, '--format', 'use text or json');
      body = r.csv();
      break;
    case 'html':
      if (r.html === undefined) throw new InputError(`${command} has no HTML output`, '--format', 'use text, json or csv');
      body = r.html();
      break;
    default:
      // Names from input files reach the terminal: no control or bidirectional characters.
      body = escapeUnsafeText(r.text());
  }
  if (out === undefined) process.stdout.write(body);
  else writeFileAtomic(out, body);
}
