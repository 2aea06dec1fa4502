/**
 * Text from inputs (satellite and station names, file names) shown safely in text and CSV output:
 * bidirectional controls (U+202A–U+202E, U+2066–U+2069, and the marks U+200E, U+200F, U+061C) could
 * make a line read differently from what it holds (Unicode TR 9; the "Trojan Source" class), and C0
 * controls such as ESC could drive the terminal. Both are shown as `\uXXXX`. Tab and line feed stay:
 * the writers use them for layout.
 */

/** Characters shown escaped: C0 controls but tab and LF, DEL, C1 controls, bidi controls and marks, line/paragraph separators. */
const UNSAFE = /[\u0000-\u0008\u000b-\u001f\u007f-\u009f\u061c\u200e\u200f\u2028\u2029\u202a-\u202e\u2066-\u2069]/g;

/** `s` with every unsafe character as `\uXXXX`. */
export function escapeUnsafeText(s: string): string {
  return s.replace(UNSAFE, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);
}

/** `s` on one line: also tab and LF escaped (for error messages and single cells). */
export function oneLineText(s: string): string {
  return escapeUnsafeText(s).replace(/[\t\n]/g, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);
}
