/**
 * Scenario text → data, with a map from JSON paths back to file lines so that later errors can
 * say `file:line`. YAML through the yaml library; JSON through `JSON.parse`, located by
 * jsonc-parser when it fails (`jsonText.ts`).
 */
import { isMap, isScalar, isSeq, LineCounter, parseDocument, type Document } from 'yaml';
import { ScenarioError } from '../errors.ts';
import { duplicateJsonKey, parseJsonLocated } from './jsonText.ts';
import type { PathSeg } from './scenarioSchema.ts';

/** File line (1-based) of the deepest node along a JSON path, or null. */
export type LineOf = (path: readonly PathSeg[]) => number | null;

/** Parse a scenario body as JSON or YAML (by extension, else by content), with its line map. */
export function readDocument(body: string, fileName: string): { data: unknown; lineOf: LineOf } {
  const lower = fileName.toLowerCase();
  const isJson = lower.endsWith('.json') || (!lower.endsWith('.yaml') && !lower.endsWith('.yml') && body.trimStart().startsWith('{'));
  if (isJson) {
    const data = parseJsonLocated(body, (fault, message) =>
      fault === null
        ? new ScenarioError(`JSON syntax error: ${message}`, `${fileName}:1`, 'check the file is valid JSON')
        : new ScenarioError(
            `JSON syntax error: ${fault.reason} (column ${fault.column})`,
            `${fileName}:${fault.line}`,
            'check commas, quotes and brackets there (JSON allows no trailing commas or comments)',
          ),
    );
    const dup = duplicateJsonKey(body);
    if (dup !== null) throw new ScenarioError(`key ${JSON.stringify(dup.key)} is given twice in one object (column ${dup.column})`, `${fileName}:${dup.line}`, 'give each key once in its object');
    // JSON is YAML 1.2 flow style, so the YAML parser can point at lines for later errors.
    let cached: LineOf | undefined;
    return {
      data,
      lineOf: (path) => {
        cached ??= yamlLineOf(body);
        return cached(path);
      },
    };
  }
  const lineCounter = new LineCounter();
  const doc = parseDocument(body, { lineCounter, prettyErrors: true, uniqueKeys: true });
  const first = doc.errors[0];
  if (first?.code === 'MULTIPLE_DOCS') {
    const line = first.linePos?.[0].line ?? 1;
    throw new ScenarioError(`the file holds more than one YAML document (another starts at line ${line} after "---")`, `${fileName}:${line}`, 'keep one scenario per file: remove the second "---" and what follows, or split it into its own file');
  }
  if (first !== undefined) {
    const line = first.linePos?.[0].line ?? 1;
    const col = first.linePos?.[0].col;
    const message = first.message.split('\n')[0].replace(/ at line \d+, column \d+:?$/, '');
    throw new ScenarioError(
      `YAML syntax error: ${message}${col === undefined ? '' : ` (column ${col})`}`,
      `${fileName}:${line}`,
      first.code === 'DUPLICATE_KEY' ? 'give each key once in its mapping' : 'check indentation, colons, quotes and brackets on that line or the one before',
    );
  }
  let data: unknown;
  try {
    data = doc.toJS({ maxAliasCount: 1000 });
  } catch (err) {
    // The yaml library throws a ReferenceError for an alias with no anchor before it and for an
    // alias bomb (more than maxAliasCount expansions); both are faults of the file.
    const message = (err as Error).message.split('\n')[0];
    throw new ScenarioError(`YAML aliases cannot be expanded: ${message}`, fileName, 'define each anchor (&name) before its alias (*name), and do not nest aliases many levels deep');
  }
  return { data, lineOf: lineOfDocument(doc, lineCounter) };
}

function yamlLineOf(body: string): LineOf {
  const lineCounter = new LineCounter();
  const doc = parseDocument(body, { lineCounter });
  if (doc.errors.length > 0) return () => null;
  return lineOfDocument(doc, lineCounter);
}

/** The line of the deepest node along `path` that exists in the document (1-based). */
function lineOfDocument(doc: Document, lineCounter: LineCounter): LineOf {
  return (path) => {
    let node: unknown = doc.contents;
    let line: number | null = null;
    const lineAt = (n: unknown): number | null => {
      const range = (n as { range?: [number, number, number] } | null)?.range;
      return range === undefined ? null : lineCounter.linePos(range[0]).line;
    };
    line = lineAt(node);
    for (const seg of path) {
      if (isMap(node)) {
        const pair = node.items.find((p) => isScalar(p.key) && String(p.key.value) === String(seg));
        if (pair === undefined) break;
        line = lineAt(pair.key) ?? line;
        node = pair.value;
      } else if (isSeq(node) && typeof seg === 'number') {
        node = node.items[seg];
        if (node === undefined) break;
        line = lineAt(node) ?? line;
      } else break;
    }
    return line;
  };
}
