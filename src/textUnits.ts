/**
 * Text as a reader sees it: lengths in user-perceived characters (extended
 * grapheme clusters, Unicode Standard Annex #29, through Intl.Segmenter), text
 * shortened without cutting a character in half, and control characters made
 * visible so that they never reach a terminal raw.
 *
 * Control characters: C0 (U+0000-U+001F), DEL (U+007F) and C1 (U+0080-U+009F),
 * ISO/IEC 6429 (ECMA-48, 5th ed. 1991), sec. 5: the code points a terminal may
 * act on (ESC starts a sequence; U+009B is the one-character CSI).
 * Runs unchanged in a browser (Intl.Segmenter is part of ECMA-402).
 */

/**
 * The grapheme segmenter, made on first use: creating one loads ICU's break rules, which costs a
 * command-line start some 20 ms, and most runs never count characters (the one cache of this module).
 */
let segmenter: Intl.Segmenter | undefined;
const graphemes = (text: string): Intl.Segments => (segmenter ??= new Intl.Segmenter('en', { granularity: 'grapheme' })).segment(text);

/**
 * The number of user-perceived characters of `text`, counted up to `stopAfter` at most
 * (Intl.Segmenter takes time growing faster than the length on long texts: stop early
 * when only "more than N" matters).
 * @example graphemeLength('👍🏽é') // 2 (UTF-16 length 6)
 */
export function graphemeLength(text: string, stopAfter = Infinity): number {
  let n = 0;
  for (const _ of graphemes(text)) {
    if (++n >= stopAfter) break;
  }
  return n;
}

/** Longest text whose length in characters a message states exactly; beyond it, "more than". */
export const EXACT_COUNT_LIMIT = 5000;

/**
 * `text` cut to at most `max` user-perceived characters, ending "..." when cut.
 * @example shortenText('abcdef', 5) // 'ab...'
 */
export function shortenText(text: string, max: number): string {
  if (text.length <= max) return text;
  const kept: string[] = [];
  for (const { segment } of graphemes(text)) {
    kept.push(segment);
    if (kept.length > max) return `${kept.slice(0, Math.max(0, max - 3)).join('')}...`;
  }
  return text;
}

/** C0, DEL and C1 control characters (tab and line feed included). */
export const CONTROL_CHARACTERS = /[\u0000-\u001f\u007f-\u009f]/g;

/**
 * `text` with every control character written as a visible escape (`\n`, `\t`, `\u001b`),
 * so that it prints as one line and cannot act on a terminal.
 * @example escapeControls('a\u001b[2Jb\n') // 'a\\u001b[2Jb\\n'
 */
export function escapeControls(text: string): string {
  return text.replace(CONTROL_CHARACTERS, (c) => {
    if (c === '\n') return '\\n';
    if (c === '\r') return '\\r';
    if (c === '\t') return '\\t';
    return `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`;
  });
}

/**
 * A number with its sign always written and `digits` decimals, never "-0.00": a value that
 * rounds to zero is written "+0.00" (a reader would otherwise take the minus for a direction).
 * @example signedFixed(-0.001, 2) // "+0.00"; signedFixed(-0.26, 1) // "-0.3"
 */
export function signedFixed(x: number, digits: number): string {
  const text = x.toFixed(digits);
  if (Number(text) === 0) return `+${(0).toFixed(digits)}`;
  return x > 0 ? `+${text}` : text;
}
