/**
 * The safe first step of reading a scene file: text (YAML or JSON) to plain data.
 *
 * One parser for both: JSON is read as YAML 1.2 (of which it is a subset) by
 * the `yaml` package with the core schema only. Refused, each with a message
 * naming the file: files over MAX_SCENE_BYTES, binary content (NUL and other
 * control characters, undecodable bytes), nesting deeper than MAX_NESTING_DEPTH
 * (checked on the text before parsing, so that no deep recursion can start),
 * YAML tags of any kind (`!!js/function`, `!foo`, `!!binary`), keys that are
 * not plain text, duplicate keys, more than one document, YAML directives, and
 * alias expansion beyond MAX_ALIAS_COUNT (the "billion laughs" pattern).
 */
import { isAlias, isCollection, isMap, isPair, isScalar, parseDocument, visit } from 'yaml';
import { InvalidInputError } from '../errors.js';

/** Largest scene file read, bytes (1 MiB). A scene with a thousand observations is well under 200 KB. */
export const MAX_SCENE_BYTES = 1024 * 1024;
/** Deepest nesting of lists and maps allowed. A scene needs 6 levels. */
export const MAX_NESTING_DEPTH = 32;
/** Most alias expansions allowed in one file (the yaml package's `maxAliasCount`). */
export const MAX_ALIAS_COUNT = 100;

/** The parser's complaints that need other words for a scholar. */
const PLAIN_WORDS: Readonly<Record<string, { allowed: string; detail?: string }>> = {
  DUPLICATE_KEY: { allowed: 'each key at most once in a map', detail: 'The same key is written twice; keep one.' },
  MULTIPLE_DOCS: { allowed: 'one scene per file', detail: 'A line "---" starts a second document; remove it or split the file.' },
  TAG_RESOLVE_FAILED: { allowed: 'plain values without YAML tags (no "!" or "!!" before a value)' },
  TAB_AS_INDENT: { allowed: 'indentation by spaces', detail: 'YAML does not allow tabs for indentation.' },
};

/** Where in the text a character offset falls, as "line L, column C". */
function lineColumn(text: string, offset: number): string {
  let line = 1;
  let lineStart = 0;
  for (let i = 0; i < offset && i < text.length; i++) {
    if (text.charCodeAt(i) === 10) {
      line++;
      lineStart = i + 1;
    }
  }
  return `line ${line}, column ${offset - lineStart + 1}`;
}

function lineAt(text: string, offset: number): string {
  const start = text.lastIndexOf('\n', Math.max(0, offset - 1)) + 1;
  let end = text.indexOf('\n', offset);
  if (end < 0) end = text.length;
  return text.slice(start, end).trim();
}

/** Refuse control characters other than tab, line feed and carriage return, and U+FFFD (undecodable bytes). */
function refuseBinary(text: string, fileName: string): void {
  const m = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f\ufffd\ufffe\uffff]/.exec(text);
  if (m) {
    const code = m[0].charCodeAt(0).toString(16).toUpperCase().padStart(4, '0');
    throw new InvalidInputError(
      `${fileName} (${lineColumn(text, m.index)})`,
      `U+${code}`,
      'a text file (YAML or JSON in UTF-8)',
      'The file holds a control character or bytes that are not UTF-8 text; is it a picture or a word-processor file?',
    );
  }
}

/**
 * A conservative estimate of the nesting depth of a YAML or JSON text, without
 * parsing: flow brackets outside quotes, plus the block indentation levels and
 * sequence dashes open on each line. It never underestimates the depth of
 * brackets, so a bracket bomb is refused before the parser sees it.
 */
export function estimateNestingDepth(text: string): { depth: number; offset: number } {
  let flow = 0;
  let worst = 0;
  let worstOffset = 0;
  const indents: number[] = [];
  let i = 0;
  const n = text.length;
  while (i < n) {
    // Start of a line: indentation and leading "- " markers (block structure).
    let col = 0;
    while (i < n && text[i] === ' ') {
      i++;
      col++;
    }
    const first = text[i];
    const blank = i >= n || first === '\n' || first === '\r' || first === '#';
    if (!blank && flow === 0) {
      while (indents.length > 0 && indents[indents.length - 1] > col) indents.pop();
      if (indents.length === 0 || indents[indents.length - 1] < col) indents.push(col);
    }
    let dashes = 0;
    while (!blank && flow === 0 && text[i] === '-' && (text[i + 1] === ' ' || text[i + 1] === '\n')) {
      dashes++;
      i++;
      while (i < n && text[i] === ' ') i++;
    }
    const blockDepth = indents.length + dashes;
    if (blockDepth + flow > worst) {
      worst = blockDepth + flow;
      worstOffset = i;
    }
    // Rest of the line: count brackets outside quoted scalars and comments.
    let previous = ' ';
    while (i < n && text[i] !== '\n') {
      const c = text[i];
      if (c === '#' && (previous === ' ' || previous === '\t')) {
        while (i < n && text[i] !== '\n') i++;
        break;
      }
      if ((c === '"' || c === "'") && ' \t[{,:'.includes(previous)) {
        // A quoted scalar (it may run over several lines).
        i++;
        while (i < n && text[i] !== c) {
          if (c === '"' && text[i] === '\\') i++;
          i++;
        }
        i++;
        previous = c;
        continue;
      }
      if (c === '-' && (previous === ' ' || previous === '\t') && (text[i + 1] === ' ' || text[i + 1] === '\n')) {
        // A dash later in the line ("key: - - x") may open a further sequence level: count it.
        dashes++;
      }
      if (c === '[' || c === '{') flow++;
      else if ((c === ']' || c === '}') && flow > 0) flow--;
      if (indents.length + dashes + flow > worst) {
        worst = indents.length + dashes + flow;
        worstOffset = i;
      }
      previous = c;
      i++;
    }
    i++;
  }
  return { depth: worst, offset: worstOffset };
}

/**
 * Parse the text of a scene file (YAML or JSON) into plain data, safely.
 * @param fileName used in messages only
 * @throws InvalidInputError naming the file (and line) for anything that is not a readable scene text
 */
export function parseSceneText(text: string, fileName: string): unknown {
  return parseSceneTextWithLines(text, fileName).data;
}

/** Parsed data and a way back from a path in it (`observations[2].sigmaDeg`) to its line in the text. */
export interface ParsedScene {
  readonly data: unknown;
  /** The line (from 1) where the value at a path, or else its nearest enclosing map or list, is written. */
  readonly lineOf: (path: string) => number | undefined;
}

/** The segments of a path as the reader writes it: `walls[1].mapPoints["odd key"]` -> walls, 1, mapPoints, odd key. */
export function pathSegments(path: string): (string | number)[] | undefined {
  const out: (string | number)[] = [];
  const re = /(?:^|\.)([A-Za-z_$][\w$-]*)|\[(\d+)\]|\[("(?:[^"\\]|\\.)*")\]/y;
  let i = 0;
  while (i < path.length) {
    re.lastIndex = i;
    const m = re.exec(path);
    if (!m) return undefined;
    out.push(m[1] !== undefined ? m[1] : m[2] !== undefined ? Number(m[2]) : (JSON.parse(m[3]) as string));
    i = re.lastIndex;
  }
  return out;
}

/** Like parseSceneText, keeping the positions of the values for messages. */
export function parseSceneTextWithLines(text: string, fileName: string): ParsedScene {
  if (typeof text !== 'string') {
    throw new InvalidInputError(fileName, typeof text, 'the text of a scene file');
  }
  // UTF-16 code units overestimate nothing for ASCII and underestimate bytes for other text; the
  // byte size of files is checked by readSceneFile before decoding.
  if (text.length > MAX_SCENE_BYTES) {
    throw new InvalidInputError(
      fileName,
      `${text.length} characters`,
      `a scene file of at most ${MAX_SCENE_BYTES} bytes (1 MiB)`,
      'Scene files are small; is this the right file?',
    );
  }
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  refuseBinary(body, fileName);
  if (body.trim() === '') {
    throw new InvalidInputError(fileName, '', 'a scene: a YAML or JSON map starting with "heliochron: 1"', 'The file is empty.');
  }
  const estimate = estimateNestingDepth(body);
  if (estimate.depth > MAX_NESTING_DEPTH) {
    throw new InvalidInputError(
      `${fileName} (${lineColumn(body, estimate.offset)})`,
      `nesting ${estimate.depth} levels deep`,
      `lists and maps nested at most ${MAX_NESTING_DEPTH} levels deep`,
    );
  }
  if (/^%/m.test(body)) {
    const offset = body.search(/^%/m);
    throw new InvalidInputError(
      `${fileName} (${lineColumn(body, offset)})`,
      lineAt(body, offset),
      'plain YAML 1.2 or JSON without directives',
      'Remove the line starting with "%".',
    );
  }

  const doc = parseDocument(body, {
    schema: 'core',
    customTags: [],
    uniqueKeys: true,
    merge: false,
    version: '1.2',
    strict: true,
    prettyErrors: false,
    keepSourceTokens: false,
  });
  const problem = doc.errors[0] ?? doc.warnings[0];
  if (problem) {
    const offset = problem.pos[0];
    const plain = PLAIN_WORDS[problem.code];
    const message = problem.message.split('\n')[0].replace(/ at line \d+, column \d+:?$/, '');
    throw new InvalidInputError(
      `${fileName} (${lineColumn(body, offset)})`,
      lineAt(body, offset),
      plain?.allowed ?? 'well-formed YAML or JSON',
      plain?.detail ?? `${message}.`,
    );
  }

  // Refuse tags (any explicit `!...`) and keys that are not plain text, before building values.
  visit(doc, (_key, node) => {
    if ((isScalar(node) || isCollection(node)) && node.tag) {
      const offset = node.range?.[0] ?? 0;
      throw new InvalidInputError(
        `${fileName} (${lineColumn(body, offset)})`,
        node.tag,
        'plain values without YAML tags (no "!" or "!!" before a value)',
      );
    }
    if (isMap(node)) {
      for (const pair of node.items) {
        if (!isPair(pair)) continue;
        const k = pair.key;
        if (!isScalar(k) || (typeof k.value !== 'string' && typeof k.value !== 'number')) {
          const offset = (isScalar(k) || isCollection(k) || isAlias(k) ? k.range?.[0] : undefined) ?? node.range?.[0] ?? 0;
          throw new InvalidInputError(
            `${fileName} (${lineColumn(body, offset)})`,
            lineAt(body, offset),
            'keys that are plain words, such as "azimuthDeg"',
          );
        }
      }
    }
  });

  const lineOf = (path: string): number | undefined => {
    const segments = pathSegments(path);
    if (segments === undefined) return undefined;
    for (let n = segments.length; n > 0; n--) {
      const node = doc.getIn(segments.slice(0, n), true) as { range?: [number, number, number] } | undefined;
      if (node && typeof node === 'object' && node.range) {
        let line = 1;
        for (let i = 0; i < node.range[0]; i++) if (body.charCodeAt(i) === 10) line++;
        return line;
      }
    }
    return undefined;
  };
  try {
    return { data: doc.toJS({ maxAliasCount: MAX_ALIAS_COUNT }), lineOf };
  } catch (error) {
    if (error instanceof ReferenceError || error instanceof RangeError) {
      throw new InvalidInputError(
        fileName,
        'aliases (*name)',
        `at most ${MAX_ALIAS_COUNT} alias expansions in one file`,
        'The file repeats anchored blocks so often that it would grow out of bounds; write the values out instead.',
      );
    }
    throw error;
  }
}
