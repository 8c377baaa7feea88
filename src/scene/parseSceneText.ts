/**
 * The safe first step of reading a scene file: text (YAML or JSON) to plain data.
 *
 * One parser for both: JSON is read as YAML 1.2 (of which it is a subset) by
 * the `yaml` package with the core schema only. Refused, each with a message
 * naming the file: files over MAX_SCENE_BYTES, binary content (NUL and other
 * control characters, undecodable bytes), nesting deeper than MAX_NESTING_DEPTH
 * (measured on the parser's own tokens before any value is built, so that no deep
 * recursion can start: see tooDeep), YAML tags of any kind (`!!js/function`, `!foo`, `!!binary`), keys that are
 * not plain text, duplicate keys, more than one document, YAML directives, and
 * alias expansion beyond MAX_ALIAS_COUNT (the "billion laughs" pattern).
 */
import { isAlias, isCollection, isMap, isPair, isScalar, Lexer, parseDocument, Parser, visit } from 'yaml';
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

/** A line "..." ends the document; anything after it would be a second one. */
const DOCUMENT_END = {
  allowed: 'one scene per file',
  detail: 'A line "..." ends the scene, and more text follows it; remove the "..." line (or what follows it).',
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

/** A node of the parser's concrete syntax tree (the `yaml` package's CST tokens), as far as depth needs it. */
interface CstNode {
  readonly type: string;
  readonly offset?: number;
  readonly value?: CstNode;
  readonly items?: ReadonlyArray<{ readonly key?: CstNode | null; readonly value?: CstNode | null }>;
}

/** The lexer's markers that stand for no text of the file (document, flow end, scalar: the `yaml` package's cst.ts). */
const LEXER_MARKERS = new Set(['\x02', '\x18', '\x1f']);

const COLLECTIONS = new Set(['block-map', 'block-seq', 'flow-collection']);

/**
 * The nesting depth of lists and maps of a YAML or JSON text, measured on the syntax tree of
 * the `yaml` package's own parser (its Parser builds the tree with an explicit stack, without
 * recursion; only building values afterwards recurses). Brackets inside quoted text and
 * comments are not structure and do not count. Time grows faster than the depth: for untrusted
 * text use `tooDeep`, which stops early.
 * @returns the deepest level and the character offset where it is reached
 * @example nestingDepth('a: [[1]]').depth // 3 (the map, two lists)
 */
export function nestingDepth(text: string): { depth: number; offset: number } {
  let worst = 0;
  let worstOffset = 0;
  const stack: Array<{ node: CstNode; depth: number }> = [];
  for (const token of new Parser().parse(text) as Iterable<CstNode>) stack.push({ node: token, depth: 0 });
  // Bounded: every node of the tree is visited once.
  while (stack.length > 0) {
    const { node, depth } = stack.pop()!;
    if (node.type === 'document') {
      if (node.value) stack.push({ node: node.value, depth });
      continue;
    }
    if (!COLLECTIONS.has(node.type)) continue;
    const level = depth + 1;
    if (level > worst) {
      worst = level;
      worstOffset = node.offset ?? 0;
    }
    for (const item of node.items ?? []) {
      if (item.key) stack.push({ node: item.key, depth: level });
      if (item.value) stack.push({ node: item.value, depth: level });
    }
  }
  return { depth: worst, offset: worstOffset };
}

/**
 * Whether the lists and maps of a text nest deeper than `limit`: the depth and where, or
 * undefined. First the parser's lexer alone, stopped as soon as flow brackets, or the sequence
 * dashes of one line ("- - - x"), nest too deep (the syntax tree of such a bomb would take
 * seconds to build); then, only when the indentation could hide deeper block nesting, the
 * exact depth of nestingDepth.
 * @example tooDeep('a: ' + '['.repeat(40), 32)?.depth // 33
 */
export function tooDeep(text: string, limit: number): { depth: number; offset: number } | undefined {
  let flow = 0;
  let dashes = 0;
  let offset = 0;
  let lexDepth = 0;
  for (const token of new Lexer().lex(text)) {
    if (token === '[' || token === '{') flow++;
    else if ((token === ']' || token === '}') && flow > 0) flow--;
    else if (token === '-') dashes++;
    else if (token === '\n' || token === '\r\n') dashes = 0;
    if (flow + dashes > limit) return { depth: flow + dashes, offset };
    lexDepth = Math.max(lexDepth, flow + dashes);
    if (!LEXER_MARKERS.has(token)) offset += token.length;
  }
  // A block map or list is indented deeper than its parent or, a list under a key, as deep:
  // at most two levels per indentation width in use.
  const widths = new Set(text.match(/^[ ]*(?=\S)/gm)?.map((w) => w.length));
  if (2 * widths.size + lexDepth <= limit) return undefined;
  const exact = nestingDepth(text);
  return exact.depth > limit ? exact : undefined;
}

/** The parser's complaints that are about indentation: the line it names may be the one after the offending one. */
const INDENT_CODES = new Set(['BAD_INDENT', 'BLOCK_AS_IMPLICIT_KEY', 'MULTILINE_IMPLICIT_KEY', 'MISSING_CHAR', 'UNEXPECTED_TOKEN']);

/**
 * For an indentation error at `offset`, the start of the line to blame: of the line the parser
 * names and its neighbours with content, the one whose indentation no other line of the file
 * uses (a line indented by 3 spaces among lines indented by 0, 2 and 4). The parser can only
 * see where the structure breaks, often on the line after a mis-indented one.
 */
function misindentedLineStart(text: string, offset: number): number {
  const lines: Array<{ start: number; indent: number }> = [];
  let lineStart = 0;
  for (const line of text.split('\n')) {
    const body = line.replace(/\r$/, '');
    const trimmed = body.trimStart();
    if (trimmed !== '' && !trimmed.startsWith('#')) lines.push({ start: lineStart, indent: body.length - trimmed.length });
    lineStart += line.length + 1;
  }
  const named = lines.findIndex((l, i) => offset >= l.start && (i + 1 === lines.length || offset < lines[i + 1].start));
  if (named < 0) return offset;
  const uses = new Map<number, number>();
  for (const l of lines) uses.set(l.indent, (uses.get(l.indent) ?? 0) + 1);
  const at = (i: number): number => lines[i].start + lines[i].indent;
  const lonely = [named - 1, named, named + 1].filter((i) => i >= 0 && i < lines.length && uses.get(lines[i].indent) === 1);
  return lonely.length === 1 && lonely[0] !== named ? at(lonely[0]) : offset;
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
  const deep = tooDeep(body, MAX_NESTING_DEPTH);
  if (deep !== undefined) {
    throw new InvalidInputError(
      `${fileName} (${lineColumn(body, deep.offset)})`,
      `nesting ${deep.depth} levels deep`,
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
    const offset = INDENT_CODES.has(problem.code) ? misindentedLineStart(body, problem.pos[0]) : problem.pos[0];
    const plain = problem.code === 'MULTIPLE_DOCS' && /^\.\.\.[ \t]*(#.*)?$/m.test(body) ? DOCUMENT_END : PLAIN_WORDS[problem.code];
    const message = problem.message.split('\n')[0].replace(/ at line \d+, column \d+:?$/, '');
    const noticed = lineColumn(body, problem.pos[0]).replace(/, column \d+$/, '');
    const moved = noticed !== lineColumn(body, offset).replace(/, column \d+$/, '');
    throw new InvalidInputError(
      `${fileName} (${lineColumn(body, offset)})`,
      lineAt(body, offset),
      plain?.allowed ?? 'well-formed YAML or JSON',
      plain?.detail ?? `${message}.${moved ? ` This line is indented unlike any other (the parser noticed the break on ${noticed}).` : ''}`,
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
