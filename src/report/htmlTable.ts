/**
 * Table markup for the HTML report: cells (escaped text, right-aligned numbers, text kept on one
 * line), rows and captioned tables. Pure functions; every text is escaped by the caller or here.
 */
import { escapeXml } from '../charts/svg.js';

const h = escapeXml;

/**
 * A table cell: escaped markup, a number-like cell (right-aligned), text kept on one line, or
 * right-aligned text that may break where its markup allows.
 */
export type Cell = string | { readonly num: string } | { readonly nowrap: string } | { readonly wrap: string };

function cellMarkup(tag: string, c: Cell): string {
  if (typeof c === 'string') return `<${tag}>${c}</${tag}>`;
  if ('num' in c) return `<${tag} class="num">${c.num}</${tag}>`;
  if ('wrap' in c) return `<${tag} class="num-wrap">${c.wrap}</${tag}>`;
  return `<${tag} class="nowrap">${c.nowrap}</${tag}>`;
}

export function row(cells: readonly Cell[], header = false, attrs = ''): string {
  const tag = header ? 'th' : 'td';
  return `<tr${attrs}>${cells.map((c) => cellMarkup(tag, c)).join('')}</tr>`;
}

/** A numeric cell (its text already escaped or safe). */
export function n(text: string): Cell {
  return { num: text };
}

export function table(id: string, caption: string, header: readonly string[], rows: readonly string[]): string {
  return `<table id="${id}"><caption class="muted" style="caption-side:top;text-align:left">${h(caption)}</caption><thead>${row(header.map(h), true)}</thead><tbody>${rows.join('')}</tbody></table>`;
}

