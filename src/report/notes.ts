/**
 * Notes and warnings that travel with a result into every output format, so that nothing a user
 * should know is printed only to a terminal:
 * - text: `NOTE: …` lines under the title,
 * - JSON: a top-level `notes: [...]` array (always present on an object result, maybe empty),
 * - CSV: `# NOTE: …` lines before the header row (spreadsheets and csv-parse's `comment: '#'` skip them),
 * - HTML: a notes box at the top of the page, under the planning caution.
 *
 * A command collects its notes as plain strings (one sentence or two each, no line breaks) and hands
 * them to `emit` (src/cli/emit.ts) with its renderers, or applies {@link withNotes} to each file it
 * writes. Writers may place the notes themselves; {@link withNotes} adds only the ones missing.
 */
import { InternalError } from '../errors.ts';
import type { LeapSecondTable } from '../time/leapSeconds.ts';
import { escapeXml as escapeHtml } from './svgPrimitives.ts';

/** The formats a note can be carried in. */
export type NoteFormat = 'text' | 'json' | 'csv' | 'html';

/** Where `htmlPage` leaves room for a notes box when it has none (an empty element, replaced by {@link withNotes}). */
export const HTML_NOTES_SLOT = '<div class="notes-slot"></div>';
/** Opening of the notes box; {@link withNotes} adds items before the first `</ul>` after it (user text is escaped, so that one is ours). */
const HTML_NOTES_OPEN = '<div class="notes" role="note">';

/** One line per note: control characters and line breaks become spaces. */
export function cleanNote(note: string): string {
  return note.replace(/[\u0000-\u001f\u007f\u2028\u2029]+/g, ' ').trim();
}

/** The notes without duplicates, in first-seen order, cleaned to one line each. */
export function uniqueNotes(...lists: readonly (readonly string[])[]): string[] {
  const out: string[] = [];
  for (const list of lists) for (const n of list) {
    const c = cleanNote(n);
    if (c !== '' && !out.includes(c)) out.push(c);
  }
  return out;
}

/** `NOTE: …` lines for a text report. */
export function noteLines(notes: readonly string[]): string[] {
  return uniqueNotes(notes).map((n) => `NOTE: ${n}`);
}

const noteItems = (notes: readonly string[]): string => notes.map((n) => `<li>${escapeHtml(n)}</li>`).join('');

/** The notes box of an HTML page, with room for more; without notes only the slot for a later box. */
export function notesBoxHtml(notes: readonly string[]): string {
  const list = uniqueNotes(notes);
  if (list.length === 0) return HTML_NOTES_SLOT;
  return `${HTML_NOTES_OPEN}<strong>Notes</strong><ul>${noteItems(list)}</ul></div>`;
}

/**
 * The rendered output with every note present:
 * text — missing notes as `NOTE:` lines after the first line; CSV — `# NOTE:` lines before the header;
 * JSON text — merged into the top-level `notes` array; HTML — the notes box in the page's slot.
 */
export function withNotes(format: NoteFormat, body: string, notes: readonly string[]): string {
  const list = uniqueNotes(notes);
  switch (format) {
    case 'csv': {
      const missing = list.filter((n) => !body.includes(`# NOTE: ${n}\n`));
      return missing.map((n) => `# NOTE: ${n}\n`).join('') + body;
    }
    case 'json': {
      const value = JSON.parse(body) as unknown;
      if (value === null || typeof value !== 'object' || Array.isArray(value)) return body;
      const obj = value as Record<string, unknown>;
      if (list.length === 0 && Array.isArray(obj.notes)) return body;
      const before = Array.isArray(obj.notes) ? (obj.notes as unknown[]).filter((n): n is string => typeof n === 'string') : [];
      return `${JSON.stringify({ ...obj, notes: uniqueNotes(before, list) }, null, 2)}\n`;
    }
    case 'html': {
      const missing = list.filter((n) => !body.includes(`<li>${escapeHtml(n)}</li>`));
      if (missing.length === 0) return body;
      const open = body.indexOf(HTML_NOTES_OPEN);
      if (open >= 0) {
        const end = body.indexOf('</ul>', open);
        return `${body.slice(0, end)}${noteItems(missing)}${body.slice(end)}`;
      }
      if (body.includes(HTML_NOTES_SLOT)) return body.replace(HTML_NOTES_SLOT, notesBoxHtml(missing));
      throw new InternalError('an HTML page with notes has no notes slot (build it with htmlPage)');
    }
    default: {
      const missing = list.filter((n) => !body.includes(n));
      if (missing.length === 0) return body;
      const nl = body.indexOf('\n');
      const lines = noteLines(missing).join('\n');
      return nl < 0 ? `${body}\n${lines}\n` : `${body.slice(0, nl + 1)}${lines}\n${body.slice(nl + 1)}`;
    }
  }
}

/** The note for a run that converted a UTC time past the leap-second table's expiry. */
export function leapExpiryNote(leap: Pick<LeapSecondTable, 'expiresUtc' | 'source'>): string {
  const file = leap.source.startsWith('user file ') ? leap.source.slice('user file '.length) : 'the packaged table data/leap-seconds.json';
  return `UTC times on or after ${leap.expiresUtc}, when the leap-second table expires (${file}), assume no new leap second; give a newer IERS Leap_Second.dat with --leap-seconds FILE`;
}

/** A station given without its geoid undulation: the size of the error it can cause. */
export function missingGeoidNote(stationId: string): string {
  // |N| reaches about 100 m (EGM2008 range, about −107 m to +86 m; from memory); g·N/c² ≈ 9.81·100/c² ≈ 1.1e-14.
  return `station ${stationId} has no geoidHeightM: its clock rate takes the height above the ellipsoid as height above the geoid, an error of up to about 1.1e-14 (about 1 ns/day) where the geoid undulation reaches 100 m; give the station's geoidHeightM`;
}
