/**
 * Strict JSON with located syntax errors. `JSON.parse` reads the value (strict RFC 8259); when it
 * fails, jsonc-parser (comments and trailing commas disallowed) finds the first fault's offset,
 * which becomes file:line and a column with what was expected there.
 */
import { parse, ParseErrorCode, visit, type ParseError } from 'jsonc-parser';

/** Where strict JSON first goes wrong: 1-based line and column, and what was expected. */
export interface JsonSyntaxFault {
  readonly line: number;
  readonly column: number;
  /** e.g. `expected "," or "}" but found "x"`. */
  readonly reason: string;
}

const EXPECTED: Partial<Record<ParseErrorCode, string>> = {
  [ParseErrorCode.InvalidSymbol]: 'a value',
  [ParseErrorCode.InvalidNumberFormat]: 'a number',
  [ParseErrorCode.PropertyNameExpected]: 'a double-quoted key',
  [ParseErrorCode.ValueExpected]: 'a value',
  [ParseErrorCode.ColonExpected]: '":"',
  [ParseErrorCode.CommaExpected]: '"," or a closing bracket',
  [ParseErrorCode.CloseBraceExpected]: '"," or "}"',
  [ParseErrorCode.CloseBracketExpected]: '"," or "]"',
  [ParseErrorCode.EndOfFileExpected]: 'the end of the file',
  [ParseErrorCode.InvalidCommentToken]: 'no comment (JSON has none)',
  [ParseErrorCode.UnexpectedEndOfComment]: 'no comment (JSON has none)',
  [ParseErrorCode.UnexpectedEndOfString]: 'a closing "',
  [ParseErrorCode.UnexpectedEndOfNumber]: 'digits',
  [ParseErrorCode.InvalidUnicode]: 'four hex digits after \\u',
  [ParseErrorCode.InvalidEscapeCharacter]: 'a valid escape (\\" \\\\ \\/ \\b \\f \\n \\r \\t \\uXXXX)',
  [ParseErrorCode.InvalidCharacter]: 'no raw control character inside a string (write \\n)',
};

/** The first strict-JSON fault in `text`, or null when jsonc-parser finds none. */
export function jsonSyntaxFault(text: string): JsonSyntaxFault | null {
  // jsonc-parser recurses per bracket: refuse deep nesting before it runs out of stack.
  const deep = tooDeepAt(text);
  if (deep !== null) return locate(text, deep, 'less nesting');
  const errors: ParseError[] = [];
  parse(text, errors, { disallowComments: true, allowTrailingComma: false, allowEmptyContent: false });
  const first = errors[0];
  if (first === undefined) return null;
  return locate(text, first.offset, EXPECTED[first.error] ?? 'valid JSON');
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
  visit(text, {
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
