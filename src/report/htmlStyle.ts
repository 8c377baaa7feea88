/**
 * The stylesheet of the HTML report, inlined into the page (no external fonts or files).
 * Screen: a single readable column. Print (`@media print`): A4 with 18 mm by 16 mm margins,
 * black text, tables in a smaller type so that the widest (the candidates) fits the 178 mm
 * between the margins, tables and figures kept whole on a page, charts scaled down to the page
 * and never up, so that "Print to PDF" from a browser gives a clean document.
 */
import { FONT_STACK, INK, OKABE_ITO } from '../charts/palette.js';

/** A plain system serif for the prose; the charts and tables use the sans stack of the charts. */
export const REPORT_SERIF = 'Georgia, "Times New Roman", "Liberation Serif", "DejaVu Serif", serif';

export const REPORT_STYLE = `
:root { color-scheme: light; }
* { box-sizing: border-box; }
html { background: ${INK.paper}; }
body { margin: 0 auto; max-width: 66rem; padding: 2rem 1.5rem 4rem; font-family: ${REPORT_SERIF}; font-size: 16px; line-height: 1.5; color: ${INK.ink}; }
h1 { font-size: 1.7rem; line-height: 1.25; margin: 0 0 0.3rem; }
h2 { font-size: 1.25rem; margin: 2.2rem 0 0.6rem; padding-bottom: 0.2rem; border-bottom: 1px solid ${INK.grid}; }
h3 { font-size: 1.05rem; margin: 1.4rem 0 0.4rem; }
p, li { max-width: 46rem; }
.subtitle { color: ${INK.muted}; margin: 0 0 1.2rem; }
.verdict { border-left: 5px solid ${OKABE_ITO.blue}; background: #F2F7FB; padding: 0.7rem 1rem; margin: 1rem 0; }
.verdict.status-marginal { border-left-color: ${OKABE_ITO.orange}; background: #FDF6E8; }
.verdict.status-undetermined { border-left-style: dashed; border-left-color: ${INK.muted}; background: #F5F5F3; }
.verdict.status-nothing-fits, .verdict.status-no-candidates { border-left-color: ${OKABE_ITO.vermillion}; background: #FBEFE8; }
.status { font-family: ${FONT_STACK}; font-size: 0.8rem; font-weight: bold; text-transform: uppercase; letter-spacing: 0.04em; }
table { border-collapse: collapse; margin: 0.5rem 0 1rem; font-family: ${FONT_STACK}; font-size: 0.82rem; width: 100%; }
th, td { text-align: left; vertical-align: top; padding: 0.28rem 0.5rem; border-bottom: 1px solid ${INK.grid}; }
th { border-bottom: 1.5px solid ${INK.frame}; font-weight: bold; }
td.num, th.num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
td.nowrap, span.nowrap { white-space: nowrap; }
td.num-wrap, th.num-wrap { text-align: right; font-variant-numeric: tabular-nums; }
tr.flagged td { font-weight: bold; }
tr.group th { font-weight: bold; font-style: italic; border-bottom: 1px solid ${INK.grid}; padding-top: 0.6rem; }
table.candidates td, table.candidates th { padding-left: 0.35rem; padding-right: 0.35rem; }
dl.glossary { grid-template-columns: minmax(8rem, max-content) 1fr; }
dl.facts { display: grid; grid-template-columns: minmax(10rem, max-content) 1fr; gap: 0.25rem 1rem; margin: 0.5rem 0 1rem; }
dl.facts dt { font-weight: bold; }
dl.facts dd { margin: 0; }
figure { margin: 1.5rem 0; }
figure svg { display: block; max-width: 100%; height: auto; border: 1px solid ${INK.grid}; }
figcaption { font-size: 0.9rem; color: ${INK.muted}; margin-top: 0.4rem; max-width: 46rem; }
.caution { border: 1px solid ${INK.frame}; padding: 0.7rem 1rem; }
.repro { font-family: ${FONT_STACK}; font-size: 0.82rem; }
.repro code, code { font-family: "DejaVu Sans Mono", Menlo, Consolas, monospace; font-size: 0.85em; overflow-wrap: anywhere; }
.muted { color: ${INK.muted}; }
@media print {
  @page { size: A4; margin: 18mm 16mm; }
  body { max-width: none; padding: 0; font-size: 10.5pt; }
  h1 { font-size: 17pt; }
  h2 { font-size: 13pt; break-after: avoid; page-break-after: avoid; }
  h3 { break-after: avoid; page-break-after: avoid; }
  table, figure, .verdict, .caution, dl.facts { break-inside: avoid; page-break-inside: avoid; }
  thead { display: table-header-group; }
  figure svg { border: none; max-width: 100%; height: auto; }
  table { font-size: 8pt; }
  th, td { padding: 0.12rem 0.25rem; }
  table.candidates td, table.candidates th { padding-left: 0.18rem; padding-right: 0.18rem; }
  figcaption { font-size: 9pt; max-width: none; }
  p, li { max-width: none; }
  .verdict { background: none; }
  a { color: inherit; text-decoration: none; }
}
`;
