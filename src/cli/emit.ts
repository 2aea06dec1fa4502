/** Turning a command's result into the requested format, on stdout or atomically into --out. */
import { InputError } from '../errors.ts';
import { toJsonText, writeFileAtomic } from '../io/output.ts';
import { escapeUnsafeText } from '../report/safeText.ts';
import { typographicMinus } from '../report/format.ts';
import { leapExpiryNote, uniqueNotes, withNotes } from '../report/notes.ts';
import type { TimeSystem } from '../time/timeSystem.ts';

export type OutputFormat = 'text' | 'json' | 'csv' | 'html';
export const OUTPUT_FORMATS: readonly OutputFormat[] = ['text', 'json', 'csv', 'html'];

/** Renderers for one result. Missing ones mean the format is not offered by that command. */
export interface Rendered {
  text: () => string;
  json: () => unknown;
  csv?: () => string;
  html?: () => string;
  /** Notes and warnings for every format (src/report/notes.ts); writers may place some themselves. */
  notes?: readonly string[];
}

function renderOnce(r: Rendered, format: OutputFormat, command: string): string {
  switch (format) {
    case 'json':
      return toJsonText(r.json());
    case 'csv':
      if (r.csv === undefined) throw new InputError(`${command} has no CSV output`, '--format', 'use text or json');
      return r.csv();
    case 'html':
      if (r.html === undefined) throw new InputError(`${command} has no HTML output`, '--format', 'use text, json or csv');
      return r.html();
    default:
      return r.text();
  }
}

/** A result's notes plus the leap-second note when the run used the table past its expiry. */
export function runNotes(notes: readonly string[], ts: TimeSystem | undefined): string[] {
  return uniqueNotes(notes, ts !== undefined && ts.leap.usedPastExpiry ? [leapExpiryNote(ts.leap)] : []);
}

/**
 * Render in `format` with the result's notes, and write to `out` (atomic) or stdout. Rendering
 * completes before anything is written. When the run (computing or rendering) converted a UTC time
 * past the leap-second table's expiry, the output carries that note too.
 */
export function emit(r: Rendered, format: OutputFormat, out: string | undefined, command: string, ts?: TimeSystem): void {
  const rendered = withNotes(format, renderOnce(r, format, command), runNotes(r.notes ?? [], ts));
  // Names from input files reach the terminal: no control or bidirectional characters in text.
  const body = format === 'text' ? typographicMinus(escapeUnsafeText(rendered)) : rendered;
  if (out === undefined) process.stdout.write(body);
  else writeFileAtomic(out, body);
}
