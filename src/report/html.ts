/**
 * The report of `heliochron report`: one self-contained HTML file (inline CSS, the three
 * charts as inline SVG, no scripts, no fonts or images fetched) that a scholar can open,
 * read and print to PDF. It states the question, every assumption (site, calendar and
 * year start, time-keeping, Delta T, refraction, where each wall azimuth came from), the
 * evidence, the ranked answer, the charts, the consistency test, the cautions, and what is
 * needed to reproduce it (version, SHA-256 of the scene file, command line, seed).
 *
 * Every piece of text from the scene file is escaped (escapeXml). Pure function of its
 * input: no clock (the page carries no time of making), no console.
 */
import { deltaTModelName } from '../time/deltaT.js';
import type { Observation, Scene } from '../scene/types.js';
import type { Candidate, CandidateFamily, DateAnswer, LeaveOneOutEntry } from '../solver/types.js';
import { formatDayWords } from '../calendar/format.js';
import { MONTH_NAMES, WEEKDAY_NAMES } from '../calendar/julianDay.js';
import { describeClockKind } from '../time/clock.js';
import { escapeXml } from '../charts/svg.js';
import {
  CAUTION,
  calendarRuleWords,
  civilDateRendering,
  clockAssumptionWords,
  deltaTWords,
  sunAccuracyWords,
  dualStyleWords,
  ellipse95,
  hhmm,
  refractionWords,
  siteWords,
  uncertaintyWords,
  yearStartWords,
} from './formatTimes.js';
import { pText } from './text.js';
import { REPORT_STYLE } from './htmlStyle.js';

/** The three charts, as SVG markup (from src/charts). */
export interface ReportCharts {
  readonly map: string;
  readonly sky: string;
  readonly residuals: string;
}

export interface Reproducibility {
  readonly version: string;
  /** SHA-256 of the scene file's bytes, hexadecimal. */
  readonly sceneSha256: string;
  /** The command that made the report, as typed (paths as given). */
  readonly commandLine: string;
  readonly seed: number;
  readonly sceneFileName: string;
}

export interface HtmlReportInput {
  readonly scene: Scene;
  readonly answer: DateAnswer;
  readonly charts: ReportCharts;
  readonly reproducibility: Reproducibility;
}

/** Escaped text. */
const h = escapeXml;

/** A table cell: escaped markup, a number-like cell (right-aligned), or text kept on one line. */
type Cell = string | { readonly num: string } | { readonly nowrap: string };

function cellMarkup(tag: string, c: Cell): string {
  if (typeof c === 'string') return `<${tag}>${c}</${tag}>`;
  if ('num' in c) return `<${tag} class="num">${c.num}</${tag}>`;
  return `<${tag} class="nowrap">${c.nowrap}</${tag}>`;
}

function row(cells: readonly Cell[], header = false, attrs = ''): string {
  const tag = header ? 'th' : 'td';
  return `<tr${attrs}>${cells.map((c) => cellMarkup(tag, c)).join('')}</tr>`;
}

/** A numeric cell (its text already escaped or safe). */
function n(text: string): Cell {
  return { num: text };
}

function table(id: string, caption: string, header: readonly string[], rows: readonly string[]): string {
  return `<table id="${id}"><caption class="muted" style="caption-side:top;text-align:left">${h(caption)}</caption><thead>${row(header.map(h), true)}</thead><tbody>${rows.join('')}</tbody></table>`;
}

function fixed(x: number | null | undefined, digits: number): string {
  return x === null || x === undefined || !Number.isFinite(x) ? '-' : x.toFixed(digits);
}

function monthList(months: readonly number[]): string {
  return months.map((m) => MONTH_NAMES[m - 1]).join(', ');
}

function windowWords(scene: Scene): string {
  const w = scene.window;
  const parts = [`the years ${w.fromYear} to ${w.toYear}`];
  if (w.notBefore) parts.push(`not before ${formatDayWords(w.notBefore)}`);
  if (w.notAfter) parts.push(`not after ${formatDayWords(w.notAfter)}`);
  if (w.months && w.months.length > 0) parts.push(`only in ${monthList(w.months)}`);
  if (w.weekday !== undefined) parts.push(`only on a ${WEEKDAY_NAMES[w.weekday]}`);
  return parts.join('; ');
}

/** One observation's measured values in words. */
export function observationWords(o: Observation): string {
  const deg = (x: number | undefined): string => (x === undefined ? '?' : `${x} deg`);
  switch (o.kind) {
    case 'rod-shadow':
      return o.slopeDeg !== undefined ? `shadow slope ${deg(o.slopeDeg)} below the horizontal, running down to the ${o.side ?? '?'}, sigma ${deg(o.sigmaDeg)}` : 'measured in the picture (pixels)';
    case 'overhang-shadow':
      return o.depthRatio !== undefined ? `shadow depth / projection ${o.depthRatio}, sigma ${o.sigma ?? '?'}` : 'measured in the picture (pixels)';
    case 'fin-shadow':
      return o.widthRatio !== undefined ? `shadow width / fin depth ${o.widthRatio}, to the ${o.side ?? '?'}, sigma ${o.sigma ?? '?'}` : 'measured in the picture (pixels)';
    case 'pole-shadow': {
      const parts: string[] = [];
      if (o.shadowAzimuthDeg !== undefined) parts.push(`shadow azimuth ${deg(o.shadowAzimuthDeg)}, sigma ${deg(o.shadowAzimuthSigmaDeg)}`);
      if (o.lengthRatio !== undefined) parts.push(`shadow length / height ${o.lengthRatio}, sigma ${o.lengthRatioSigma ?? '?'}`);
      return parts.length > 0 ? parts.join('; ') : 'measured in the picture (pixels)';
    }
    case 'eave-shadow':
      return `shadow line distance / eave height ${o.distanceRatio}, sigma ${o.sigma}, eave projection / height ${o.projectionRatio}`;
    case 'shadow-points':
      return `caster (${o.caster.join(', ')}) m, shadow (${o.shadow.join(', ')}) m, sigma ${o.sigmaM} m`;
    case 'sun-direction':
      return `sun azimuth ${deg(o.azimuthDeg)} +/- ${deg(o.azimuthSigmaDeg)}, altitude ${deg(o.altitudeDeg)} +/- ${deg(o.altitudeSigmaDeg)}`;
    case 'wall-lit':
      return 'the wall is in sun';
    case 'wall-shaded':
      return 'the wall is in shade';
    case 'sun-up':
      return 'the sun is above the horizon';
    case 'object-shadow':
      return `object point [${o.objectPx.join(', ')}] px and its shadow point [${o.shadowPx.join(', ')}] px${o.group ? `, group "${o.group}"` : ''}`;
    case 'clock': {
      const kept = o.kept.kind === 'unknown' ? 'what it kept is unknown (each kind is tried)' : `kept ${describeClockKind(o.kept)}`;
      return `reads ${hhmm(o.readingMinutes)} on a ${o.dialHours}-hour dial, precision ${o.precisionMinutes} min${o.hourHandTrusted ? '' : ', hour hand not trusted'}; ${kept}`;
    }
  }
}

function questionSection(scene: Scene): string {
  return `<section id="question"><h2>The question</h2>
<p>On what dates and at what hours could the sunlight shown in <em>${h(scene.title)}</em> have fallen? Searched: ${h(windowWords(scene))}.</p></section>`;
}

function clockWords(scene: Scene, answer: DateAnswer): string {
  const clocks = scene.observations.filter((o): o is Extract<Observation, { kind: 'clock' }> => o.kind === 'clock');
  if (clocks.length === 0) return 'No clock in the picture: times are given in local apparent (sundial) time, local mean time and UT.';
  const tried = answer.clockAssumptions.map(clockAssumptionWords).join('; ');
  return `Clock readings: ${clocks.map((c) => `${c.id} ${observationWords(c)}`).join('; ')}. Assumptions tried: ${tried || 'none'}.`;
}

function assumptionsSection(scene: Scene, answer: DateAnswer): string {
  const best = answer.candidates[0];
  const items: [string, string][] = [
    ['Site', `${siteWords(scene)}${scene.site.latitudeSigmaDeg > 0 || scene.site.longitudeSigmaDeg > 0 ? ` (uncertainty ${scene.site.latitudeSigmaDeg} deg in latitude, ${scene.site.longitudeSigmaDeg} deg in longitude, fitted)` : ''}`],
    ['Calendar', `${calendarRuleWords(scene.calendar)}; ${yearStartWords(scene.yearStart)}. ${dualStyleWords(scene) ?? 'Dates are written in the calendar in force at the site that day.'}`],
    ['Time-keeping', clockWords(scene, answer)],
    ['Delta T', best ? `${deltaTWords(best, scene)}; Delta T moves the sun along its path by only 0.041 arcseconds per second, far below any shadow measurement.` : `${deltaTModelName(scene.deltaT)} (no candidate to evaluate it at).`],
    ['Refraction', refractionWords(scene)],
    ['Map north', `map bearings are turned by ${scene.mapNorthCorrectionDeg >= 0 ? '+' : ''}${scene.mapNorthCorrectionDeg} deg to true north (as stated in the scene)`],
    ['Ephemeris', `the sun from astronomy-engine (VSOP87, IAU 2006 precession, IAU 2000B nutation), topocentric apparent place${sunAccuracyWords(scene) ? `; ${sunAccuracyWords(scene)}` : ''}`],
  ];
  const walls = scene.walls.map((w) =>
    row([h(w.id), n(`${w.azimuthDeg.toFixed(1)} deg`), n(w.azimuthSigmaDeg > 0 ? `${w.azimuthSigmaDeg} deg` : 'exact'), h(w.azimuthSource), h(w.note ?? '')]),
  );
  return `<section id="assumptions"><h2>Site and assumptions</h2>
<dl class="facts">${items.map(([k, v]) => `<dt>${h(k)}</dt><dd>${h(v)}</dd>`).join('')}</dl>
${scene.walls.length > 0 ? table('walls', 'Walls: azimuth of the outward normal, clockwise from true north, and where it came from', ['wall', 'azimuth', 'sigma', 'azimuth from', 'note'], walls) : ''}
</section>`;
}

function evidenceSection(scene: Scene, answer: DateAnswer): string {
  const flagged = new Set(answer.consistency.flaggedIds);
  const rows = scene.observations.map((o) =>
    row([h(o.id), h(o.kind), h('wallId' in o ? o.wallId : ''), h(observationWords(o)), h(o.note ?? ''), h(flagged.has(o.id) ? 'flagged' : '')], false, flagged.has(o.id) ? ' class="flagged"' : ''),
  );
  return `<section id="evidence"><h2>The evidence</h2>
${table('evidence-table', `${scene.observations.length} observations; ${answer.measuredResiduals} measured numbers`, ['observation', 'kind', 'wall', 'measured', 'note', 'test'], rows)}
</section>`;
}

function familyRow(f: CandidateFamily): string {
  return row([h(`F${f.rank}`), h(f.summary), n(fixed(f.bestChiSquare, 2)), n(h(pText(f.bestPValue))), n(fixed(f.relativeWeight, 3)), h(f.clockAssumptionLabel)]);
}

/** The 95% uncertainty in a few words for the table; the full words follow below it. */
function shortUncertainty(c: Candidate): string {
  const e = ellipse95(c.uncertainty);
  if (c.uncertainty.method === 'ellipse' && e) return `+/-${e.halfWidthDays.toFixed(1)} d, +/-${e.halfWidthMinutes.toFixed(0)} min`;
  const p = c.uncertainty.profile;
  if (!p) return 'see below';
  return `${p.fromDays.toFixed(0)} to +${p.toDays.toFixed(0)} d${p.open ? ' (open)' : ''}, profile scan`;
}

/** Which optional columns the candidates table needs. */
interface CandidateColumns {
  readonly clock: boolean;
  readonly assumption: boolean;
}

function candidateColumns(candidates: readonly Candidate[]): CandidateColumns {
  return {
    clock: candidates.some((c) => c.times.clock !== undefined),
    assumption: new Set(candidates.map((c) => c.clockAssumptionLabel)).size > 1,
  };
}

function candidateRow(c: Candidate, scene: Scene, columns: CandidateColumns): string {
  const date = civilDateRendering(c.civilDate, scene);
  const cells: Cell[] = [
    n(String(c.rank)),
    { nowrap: h(date.text) },
    h(c.weekdayName),
    n(hhmm(c.times.localApparentMinutes)),
    n(hhmm(c.times.localMeanMinutes)),
    n(hhmm(c.times.utMinutes)),
  ];
  if (columns.clock) cells.push(n(c.times.clock ? hhmm(c.times.clock.minutes) : '-'));
  cells.push(
    n(fixed(c.sun.azimuthDeg, 1)),
    n(fixed(c.sun.altitudeDeg, 1)),
    n(fixed(c.chiSquare, 2)),
    n(String(c.degreesOfFreedom)),
    n(h(pText(c.pValue))),
    n(fixed(c.relativeWeight, 3)),
    { nowrap: h(shortUncertainty(c)) },
  );
  if (columns.assumption) cells.push(h(c.clockAssumptionLabel));
  return row(cells, false, ` data-rank="${c.rank}" data-date="${h(date.iso)}"`);
}

function answerSection(scene: Scene, answer: DateAnswer): string {
  const families = answer.families.length
    ? table('families', 'Families: the same light in several years, best first (F1, F2, ... as marked in the charts)', ['family', 'dates and hours', 'best chi2', 'p', 'weight', 'clock'], answer.families.map(familyRow))
    : '<p>No family of candidates.</p>';
  const columns = candidateColumns(answer.candidates);
  const header = ['rank', 'date (site calendar)', 'weekday', 'apparent', 'mean', 'UT'];
  if (columns.clock) header.push('clock');
  header.push('azimuth', 'altitude', 'chi2', 'dof', 'p', 'weight', '95% uncertainty');
  if (columns.assumption) header.push('clock assumption');
  const shared = !columns.assumption && answer.candidates.length > 0 ? `; every row: ${answer.candidates[0].clockAssumptionLabel}` : '';
  const clockNote = columns.clock ? '; clock: the time the clock showed under the row\u2019s assumption' : '';
  const candidates = answer.candidates.length
    ? table(
        'candidates',
        `Best candidates: times of day in local apparent time, local mean time and UT${clockNote}; sun azimuth clockwise from true north and refracted altitude, degrees${shared}`,
        header,
        answer.candidates.map((c) => candidateRow(c, scene, columns)),
      )
    : '<p id="candidates">No candidate.</p>';
  const replaced = answer.candidates.filter((c) => !(c.uncertainty.method === 'ellipse' && ellipse95(c.uncertainty)));
  const replacedList = replaced.length
    ? `<p>Where the error ellipse does not hold, a profile scan of the day gives the 95% interval:</p><ul>${replaced.map((c) => `<li>rank ${c.rank}: ${h(uncertaintyWords(c))}</li>`).join('')}</ul>`
    : '';
  return `<section id="answer"><h2>The answer</h2>${families}${candidates}${replacedList}</section>`;
}

function chartsSection(charts: ReportCharts): string {
  const figure = (id: string, svg: string, caption: string): string => `<figure id="${id}">${svg}<figcaption>${h(caption)}</figcaption></figure>`;
  return `<section id="charts"><h2>Pictures of the answer</h2>
${figure('figure-map', charts.map, 'Date and hour map. Darker cells fit the evidence better; the candidates are marked with their 68% (solid) and 95% (dashed) error ellipses, or with their 95% day interval when the ellipse does not hold. See docs/pictures.md for how to read it.')}
${figure('figure-sky', charts.sky, 'Sky chart. Each band holds the sun directions that agree with one measured shadow to within 1 sigma; where the bands cross, the sun stood. The lines are the sun\u2019s paths on the candidate days, with a dot at each whole hour of local apparent time.')}
${figure('figure-residuals', charts.residuals, 'Residuals at the best candidate. A bar beyond the dotted 2-sigma lines marks a measurement that disagrees with the rest; outlined bars are flagged by the leave-one-out test.')}
</section>`;
}

function consistencyRow(e: LeaveOneOutEntry): string {
  return row(
    [h(e.observationId), h(e.observationKind), n(String(e.residualCount)), n(fixed(e.chiSquareAll, 2)), n(fixed(e.chiSquareWithout, 2)), n(fixed(e.improvement, 2)), n(h(pText(e.pValue))), h(e.flagged ? 'FLAGGED' : 'ok'), h(e.note)],
    false,
    e.flagged ? ' class="flagged"' : '',
  );
}

function consistencySection(answer: DateAnswer): string {
  const c = answer.consistency;
  const body = c.entries.length
    ? table('consistency-table', 'Each observation left out in turn', ['observation', 'kind', 'numbers', 'chi2 all', 'chi2 without', 'improvement', 'p', 'test', 'note'], c.entries.map(consistencyRow))
    : '<p>The test was not run.</p>';
  const flagged = c.flaggedIds.length
    ? `<p><strong>Flagged: ${h(c.flaggedIds.join(', '))}.</strong> These do not agree with the rest; check how they were measured, or whether they show other light.</p>`
    : c.entries.length
      ? '<p>No observation is flagged.</p>'
      : '';
  return `<section id="consistency"><h2>Consistency of the evidence</h2><p>Rule: ${h(c.rule)}.</p>${body}${flagged}</section>`;
}

function cautionSection(answer: DateAnswer): string {
  const notes = answer.notes.map((t) => `<li>${h(t)}</li>`).join('');
  return `<section id="cautions"><h2>Cautions</h2>
<p class="caution">${h(CAUTION)} A painter or engraver may have moved, simplified or invented shadows; a print may be reversed; a clock may have been wrong.</p>
${notes ? `<ul>${notes}</ul>` : ''}</section>`;
}

function reproducibilitySection(r: Reproducibility): string {
  const items: [string, string][] = [
    ['heliochron version', r.version],
    ['scene file', r.sceneFileName],
    ['SHA-256 of the scene file', r.sceneSha256],
    ['command', r.commandLine],
    ['seed', String(r.seed)],
  ];
  return `<section id="reproducibility" class="repro"><h2>Reproducing this report</h2>
<dl class="facts">${items.map(([k, v]) => `<dt>${h(k)}</dt><dd><code>${h(v)}</code></dd>`).join('')}</dl>
<p>The same scene file (the same SHA-256), the same version of heliochron and the same command give the same report, byte for byte; nothing in it depends on the network or on the time it was made.</p></section>`;
}

/**
 * The whole report as one HTML document.
 * @example renderHtmlReport({ scene, answer, charts, reproducibility }) // "<!DOCTYPE html>\n<html lang=\"en\">..."
 */
export function renderHtmlReport(input: HtmlReportInput): string {
  const { scene, answer, charts, reproducibility } = input;
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="generator" content="heliochron ${h(reproducibility.version)}">
<title>${h(scene.title)} - heliochron report</title>
<style>${REPORT_STYLE}</style>
</head>
<body>
<header><h1>${h(scene.title)}</h1>
<p class="subtitle">When could this light have fallen? A report of heliochron ${h(reproducibility.version)}.</p>
<div class="verdict status-${answer.status}" id="verdict"><span class="status">${h(answer.status.replace('-', ' '))}</span><br>${h(answer.verdict)}</div></header>
<main>
${questionSection(scene)}
${assumptionsSection(scene, answer)}
${evidenceSection(scene, answer)}
${answerSection(scene, answer)}
${chartsSection(charts)}
${consistencySection(answer)}
${cautionSection(answer)}
${reproducibilitySection(reproducibility)}
</main>
</body>
</html>
`;
}
