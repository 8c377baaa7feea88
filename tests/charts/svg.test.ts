import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { el, escapeXml, num, pathData, svgDocument, text } from '../../src/charts/svg.js';

describe('num', () => {
  it('rounds to the given decimals and drops trailing zeros', () => {
    expect(num(12.3456)).toBe('12.3');
    expect(num(12.36)).toBe('12.4');
    expect(num(3)).toBe('3');
    expect(num(2.5, 0)).toBe('3');
    expect(num(1.23456, 3)).toBe('1.235');
  });
  it('writes the same text as reading back toFixed would (the form it had before; property test)', () => {
    // The earlier form, String(Number(rounded.toFixed(digits))) (ECMA-262 Number.prototype.toFixed), kept here as the reference.
    const before = (x: number, digits: number): string => {
      if (!Number.isFinite(x)) return '0';
      const rounded = Math.round(x * 10 ** digits) / 10 ** digits;
      return rounded === 0 ? '0' : String(Number(rounded.toFixed(digits)));
    };
    fc.assert(
      fc.property(fc.oneof(fc.double(), fc.double({ min: -2000, max: 2000 }), fc.integer({ min: -100000, max: 100000 }).map((k) => k / 20)), fc.integer({ min: 0, max: 4 }), (x, digits) => {
        expect(num(x, digits)).toBe(before(x, digits));
      }),
      { numRuns: 20000 },
    );
  });
  it('never writes a negative zero, NaN or Infinity', () => {
    expect(num(-0.04)).toBe('0');
    expect(num(-0)).toBe('0');
    expect(num(NaN)).toBe('0');
    expect(num(Infinity)).toBe('0');
  });
});

describe('escapeXml', () => {
  it('escapes the five XML special characters (XML 1.0, section 2.4)', () => {
    expect(escapeXml(`Tanners' Hall <north> & "south"`)).toBe('Tanners&#39; Hall &lt;north&gt; &amp; &quot;south&quot;');
  });
  it('drops characters XML 1.0 does not allow (section 2.2) and keeps the rest', () => {
    expect(escapeXml('a\u0000b\u0007c\td\ne')).toBe('abc\td\ne');
    expect(escapeXml('Z\u00fcrich \u{1F31E}')).toBe('Z\u00fcrich \u{1F31E}');
  });
  it('gives every character from U+0000 to U+00FF, alone and in text, as the full replacements do (XML 1.0, sections 2.2 and 2.4)', () => {
    // The replacements escapeXml made before it returned text with nothing to escape unchanged (common practice: a fast path checked against the slow one).
    const slow = (t: string): string =>
      t
        .replace(/[^\t\n\r\u0020-\uD7FF\uE000-\uFFFD\u{10000}-\u{10FFFF}]/gu, '')
        .replace(/&/g, '&amp;')
        .replace(/</g, '&lt;')
        .replace(/>/g, '&gt;')
        .replace(/"/g, '&quot;')
        .replace(/'/g, '&#39;');
    for (let c = 0; c <= 0xff; c += 1) {
      const ch = String.fromCharCode(c);
      for (const t of [ch, `M1.5 2L3 4${ch}`, `${ch}hc-band hc-band-0`]) expect(escapeXml(t)).toBe(slow(t));
    }
    for (const t of ['', 'M62 400H602V60Z', 'url(#hc-map-clip)', 'a\uFFFEb', '\uD800x', '\u{1F31E}', 'x y;z:1%']) expect(escapeXml(t)).toBe(slow(t));
  });
});

describe('elements', () => {
  it('writes numbers rounded and leaves out undefined and false attributes', () => {
    expect(el('rect', { x: 1, y: 2.25, width: 3, height: undefined, hidden: false })).toBe('<rect x="1" y="2.3" width="3"/>');
  });
  it('escapes attribute values and text content', () => {
    expect(el('g', { 'data-id': 'a"b' })).toBe('<g data-id="a&quot;b"/>');
    expect(text(0, 0, '<b>')).toBe('<text x="0" y="0">&lt;b&gt;</text>');
  });
  it('builds path data with breaks at null points and an optional close', () => {
    expect(pathData([[0, 0], [10, 5.04]])).toBe('M0 0L10 5');
    expect(pathData([[0, 0], null, [1, 1], [2, 2]], true)).toBe('M0 0M1 1L2 2Z');
    expect(pathData([])).toBe('');
  });
  it('makes a standalone document with an accessible title and description', () => {
    const doc = svgDocument({ width: 10, height: 20, title: 'T & t', description: 'D', style: 'text{}', body: ['<g/>'], idPrefix: 'p' });
    expect(doc.startsWith('<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 10 20"')).toBe(true);
    expect(doc).toContain('<title id="p-title">T &amp; t</title>');
    expect(doc).toContain('aria-labelledby="p-title p-desc"');
    expect(doc.trimEnd().endsWith('</svg>')).toBe(true);
  });
});
