/**
 * A small SVG builder: elements as strings, no DOM. Every number written into the
 * document goes through `num`, rounded to a fixed number of decimals, so that the same
 * input always gives byte-identical output (golden-file tests compare it).
 * Text is escaped for XML (the five predefined entities of XML 1.0, section 2.4) and
 * characters not allowed in XML 1.0 (section 2.2) are dropped.
 */

/** Attribute values: numbers are rounded by `num`; undefined and false leave the attribute out. */
export type Attrs = Readonly<Record<string, string | number | boolean | undefined>>;

/**
 * A number as short, stable text: rounded to `digits` decimals, trailing zeros removed, no "-0".
 * @example num(12.3456) // "12.3"; num(-0.04) // "0"; num(3, 2) // "3"
 */
export function num(x: number, digits = 1): string {
  if (!Number.isFinite(x)) return '0';
  const factor = 10 ** digits;
  const rounded = Math.round(x * factor) / factor;
  if (rounded === 0) return '0';
  // The shortest text of `rounded` itself: the same as String(Number(rounded.toFixed(digits))), since
  // rounded is the double nearest k / 10^digits, toFixed writes that decimal (or one within half a
  // unit of the last place the double holds), and reading it back gives the same double
  // (ECMA-262 Number::toString and Number.prototype.toFixed); tests/charts/svg.test.ts checks both ways agree.
  return String(rounded);
}

/**
 * Text that escapeXml returns unchanged: tab, newline, carriage return and printable ASCII (U+0020 to U+007E, all
 * allowed by XML 1.0 section 2.2) other than the five characters it escapes (& < > " ').
 */
const NOTHING_TO_ESCAPE = /^[\t\n\r\u0020\u0021\u0023-\u0025\u0028-\u003B\u003D\u003F-\u007E]*$/;

/**
 * Text made safe inside XML or HTML content and attribute values.
 * @example escapeXml('Tanners\' Hall <north> & "south"') // "Tanners&#39; Hall &lt;north&gt; &amp; &quot;south&quot;"
 */
export function escapeXml(text: string): string {
  // Most text written (path data, numbers, class names) has nothing to drop or escape: returned as it is after one scan.
  if (NOTHING_TO_ESCAPE.test(text)) return text;
  // XML 1.0 section 2.2: only tab, newline, carriage return and U+0020 and above (no lone surrogates, no U+FFFE/FFFF)
  const clean = text.replace(/[^\t\n\r\u0020-\uD7FF\uE000-\uFFFD\u{10000}-\u{10FFFF}]/gu, '');
  return clean.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}

function attrText(attrs: Attrs): string {
  let out = '';
  for (const [key, value] of Object.entries(attrs)) {
    if (value === undefined || value === false) continue;
    const text = value === true ? key : typeof value === 'number' ? num(value) : escapeXml(value);
    out += ` ${key}="${text}"`;
  }
  return out;
}

/**
 * One element. `children` is markup already built (use `text` for plain text).
 * @example el('rect', { x: 1, y: 2.25, width: 3, height: 4 }) // '<rect x="1" y="2.3" width="3" height="4"/>'
 */
export function el(name: string, attrs: Attrs = {}, children?: string | readonly string[]): string {
  const inner = children === undefined ? '' : typeof children === 'string' ? children : children.join('');
  if (inner === '') return `<${name}${attrText(attrs)}/>`;
  return `<${name}${attrText(attrs)}>${inner}</${name}>`;
}

/** A text element with escaped content. */
export function text(x: number, y: number, content: string, attrs: Attrs = {}): string {
  return el('text', { x, y, ...attrs }, escapeXml(content));
}

/** A group. */
export function group(attrs: Attrs, children: readonly string[]): string {
  return el('g', attrs, children.join('\n'));
}

/**
 * Path data through points: "M x y L x y ...", optionally closed; null points break the line.
 * @example pathData([[0, 0], [10, 5]]) // "M0 0L10 5"
 */
export function pathData(points: readonly (readonly [number, number] | null)[], closed = false): string {
  let d = '';
  let pen = false;
  for (const p of points) {
    if (p === null) {
      pen = false;
      continue;
    }
    d += `${pen ? 'L' : 'M'}${num(p[0])} ${num(p[1])}`;
    pen = true;
  }
  return closed && d !== '' ? `${d}Z` : d;
}

export interface SvgDocumentSpec {
  readonly width: number;
  readonly height: number;
  /** Accessible title (also shown as the chart's heading). */
  readonly title: string;
  /** Accessible description: the one-line caption. */
  readonly description: string;
  readonly style: string;
  readonly body: readonly string[];
  /** Prefix of ids inside the document, so that several charts can share one HTML page. */
  readonly idPrefix: string;
}

/** A standalone SVG document (also valid inline in HTML). */
export function svgDocument(spec: SvgDocumentSpec): string {
  const titleId = `${spec.idPrefix}-title`;
  const descId = `${spec.idPrefix}-desc`;
  return [
    `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${num(spec.width)} ${num(spec.height)}" width="${num(spec.width)}" height="${num(spec.height)}" role="img" aria-labelledby="${titleId} ${descId}" class="hc-chart" id="${spec.idPrefix}">`,
    el('title', { id: titleId }, escapeXml(spec.title)),
    el('desc', { id: descId }, escapeXml(spec.description)),
    el('style', {}, spec.style),
    ...spec.body,
    '</svg>',
    '',
  ].join('\n');
}
