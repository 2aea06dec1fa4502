/**
 * Strict JSON with located syntax errors. `JSON.parse` reads the value (strict RFC 8259); when it
 * fails, jsonc-parser (comments and trailing commas disallowed) finds the first fault's offset,
 * which becomes file:line and a column with what was expected there.
 */
import type { ParseError, ParseErrorCode } from 'jsonc-parser';
import { lazyPackage } from '../lazyPackage.ts';

// Loaded only when a file is not valid JSON, or when duplicate keys are looked for.
const jsonc = lazyPackage<typeof import('jsonc-parser')>('jsonc-parser');

/** Where strict JSON first goes wrong: 1-based line and column, and what was expected. */
export interface JsonSyntaxFault {
  readonly line: number;
  readonly column: number;
  /** e.g. `expected "," or "}" but found "x"`. */
  readonly reason: string;
}

/** What was expected where jsonc-parser reports each error code. */
function expectedFor(code: ParseErrorCode): string | undefined {
  const { ParseErrorCode: E } = jsonc();
  const expected: Partial<Record<ParseErrorCode, string>> = {
    [E.InvalidSymbol]: 'a value',
    [E.InvalidNumberFormat]: 'a number',
    [E.PropertyNameExpected]: 'a double-quoted key',
    [E.ValueExpected]: 'a value',
    [E.ColonExpected]: '":"',
    [E.CommaExpected]: '"," or a closing bracket',
    [E.CloseBraceExpected]: '"," or "}"',
    [E.CloseBracketExpected]: '"," or "]"',
    [E.EndOfFileExpected]: 'the end of the file',
    [E.InvalidCommentToken]: 'no comment (JSON has none)',
    [E.UnexpectedEndOfComment]: 'no comment (JSON has none)',
    [E.UnexpectedEndOfString]: 'a closing "',
    [E.UnexpectedEndOfNumber]: 'digits',
    [E.InvalidUnicode]: 'four hex digits after \\u',
    [E.InvalidEscapeCharacter]: 'a valid escape (\\" \\\\ \\/ \\b \\f \\n \\r \\t \\uXXXX)',
    [E.InvalidCharacter]: 'no raw control character inside a string (write \\n)',
  };
  return expected[code];
}

/** The first strict-JSON fault in `text`, or null when jsonc-parser finds none. */
export function jsonSyntaxFault(text: string): JsonSyntaxFault | null {
  // jsonc-parser recurses per bracket: refuse deep nesting before it runs out of stack.
  const deep = tooDeepAt(text);
  if (deep !== null) return locate(text, deep, 'less nesting');
  const errors: ParseError[] = [];
  jsonc().parse(text, errors, { disallowComments: true, allowTrailingComma: false, allowEmptyContent: false });
  const first = errors[0];
  if (first === undefined) return null;
  return locate(text, first.offset, expectedFor(first.error) ?? 'valid JSON');
}

/** Deepest nesting read before calling the fault a nesting fault; no real file comes near. */
const MAX_JSON_DEPTH = 500;

/** Offset of the first bracket nested deeper than MAX_JSON_DEPTH outside strings, or null. */
function tooDeepAt(text: string): number | null {
  let depth = 0;
  let inString = false;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (inString) {
      if (c === '\\') i++;
      else if (c === '"') inString = false;
    } else if (c === '"') inString = true;
    else if (c === '{' || c === '[') {
      depth++;
      if (depth > MAX_JSON_DEPTH) return i;
    } else if (c === '}' || c === ']') depth--;
  }
  return null;
}

function locate(text: string, at: number, expected: string): JsonSyntaxFault {
  const offset = Math.min(at, text.length);
  const before = text.slice(0, offset);
  const line = before.split('\n').length;
  const column = offset - before.lastIndexOf('\n');
  const found = offset >= text.length ? 'the end of the file' : JSON.stringify(text[offset]);
  return { line, column, reason: `expected ${expected} but found ${found}` };
}

/**
 * Parse strict JSON; on a syntax error call `fault` with its location (null when it cannot be
 * found, with the parser's own message) and throw what it returns.
 */
export function parseJsonLocated(text: string, fault: (where: JsonSyntaxFault | null, message: string) => Error): unknown {
  try {
    return JSON.parse(text);
  } catch (e) {
    throw fault(jsonSyntaxFault(text), String((e as Error)?.message ?? e).split('\n')[0]);
  }
}

/**
 * The first key given twice in one JSON object (RFC 8259 §4: names SHOULD be unique; `JSON.parse`
 * silently keeps the last), located like a syntax fault, or null. YAML files are refused the same way.
 */
export function duplicateJsonKey(text: string): (JsonSyntaxFault & { key: string }) | null {
  // jsonc-parser's visitor recurses per bracket; nesting that deep is refused later by the schema.
  if (tooDeepAt(text) !== null) return null;
  const stack: Set<string>[] = [];
  let found: { offset: number; key: string } | null = null;
  jsonc().visit(text, {
    onObjectBegin: () => {
      stack.push(new Set());
    },
    onObjectEnd: () => {
      stack.pop();
    },
    onObjectProperty: (key, offset) => {
      const keys = stack[stack.length - 1];
      if (found !== null || keys === undefined) return;
      if (keys.has(key)) found = { offset, key };
      else keys.add(key);
    },
  });
  if (found === null) return null;
  const { offset, key } = found as { offset: number; key: string };
  return { ...locate(text, offset, 'each key once'), key };
}
