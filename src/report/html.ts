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
import { consistencyMark, consistencyMarkNotes } from './consistencyWords.js';
import { moonReportLines } from './moonLines.js';
import { deltaTModelName } from '../time/deltaT.js';
import type { Observation, Scene } from '../scene/types.js';
import type { Candidate, CandidateFamily, DateAnswer, LeaveOneOutEntry } from '../solver/types.js';
import { formatDayWords } from '../calendar/format.js';
import { MONTH_NAMES, WEEKDAY_NAMES } from '../calendar/julianDay.js';
import { describeClockKind, formatClockKind } from '../time/clock.js';
import { describeSundialHours } from '../time/hourSystems.js';
import { escapeXml } from '../charts/svg.js';
import { chartLightOf } from '../charts/chartLight.js';
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
import { n, row, table, type Cell } from './htmlTable.js';
import { calendarReadingsSection, sameLightSection } from './htmlReadings.js';
import type { CalendarReadings } from '../solver/calendarReadings.js';
import type { SameLightAnswer } from '../solver/sameLight.js';

/** The three charts, as SVG markup (from src/charts). */
export interface ReportCharts {
  readonly map: string;
  readonly sky: string;
  readonly residuals: string;
  /** The light the map and sky chart are drawn for (src/charts/chartLight.ts); worked out from the scene when absent. */
  readonly light?: 'sun' | 'moon';
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
  /** The scene solved under every reading of a disputed calendar switch its window touches (src/solver/calendarReadings.ts). */
  readonly calendarReadings?: CalendarReadings | null;
  /** The days and zone times of a later year with the same light (src/solver/sameLight.ts). */
  readonly sameLight?: SameLightAnswer | null;
}

/**
 * How the answer of a report is solved: with every year of each family listed (perYear), so that
 * each row of the candidates table can name its family. `heliochron report` and the desk use it.
 */
export const REPORT_SOLVE_OPTIONS = { perYear: true } as const;

/** Escaped text. */
const h = escapeXml;

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

/** One observation's measured values in words, with its light when that is the moon. */
export function observationWords(o: Observation): string {
  const words = measuredWords(o);
  return 'light' in o && o.light === 'moon' ? `${words}; cast by moonlight` : words;
}

function measuredWords(o: Observation): string {
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
      return o.distanceRatio !== undefined
        ? `shadow line distance / eave height ${o.distanceRatio}, sigma ${o.sigma ?? '?'}, eave projection / height ${o.projectionRatio ?? 0}`
        : 'measured in the picture (pixels)';
    case 'shadow-points':
      return o.caster !== undefined && o.shadow !== undefined
        ? `caster (${o.caster.join(', ')}) m, shadow (${o.shadow.join(', ')}) m, sigma ${o.sigmaM ?? '?'} m`
        : 'measured in the picture (pixels)';
    case 'sun-direction':
      return `sun azimuth ${deg(o.azimuthDeg)} +/- ${deg(o.azimuthSigmaDeg)}, altitude ${deg(o.altitudeDeg)} +/- ${deg(o.altitudeSigmaDeg)}`;
    case 'wall-lit':
      return 'the wall is in sun';
    case 'wall-shaded':
      return 'the wall is in shade';
    case 'sun-up':
      return 'the sun is above the horizon';
    case 'sun-not-up':
      return 'the sun is below the horizon (a night view)';
    case 'object-shadow':
      return `object point [${o.objectPx.join(', ')}] px and its shadow point [${o.shadowPx.join(', ')}] px${o.group ? `, group "${o.group}"` : ''}`;
    case 'shadow-wedge':
      return `shadow point [${o.shadowPx.join(', ')}] px, its object point within the wedge towards [${o.edgesPx[0].join(', ')}] and [${o.edgesPx[1].join(', ')}] px${o.group ? `, group "${o.group}"` : ''}`;
    case 'clock': {
      const kept = o.kept.kind === 'unknown' ? 'what it kept is unknown (each kind is tried)' : `kept ${describeClockKind(o.kept)}`;
      return `reads ${hhmm(o.readingMinutes)} on a ${o.dialHours}-hour dial, precision ${o.precisionMinutes} min${o.hourHandTrusted ? '' : ', hour hand not trusted'}; ${kept}`;
    }
    case 'sundial':
      return `sundial reads ${hhmm(o.readingMinutes)} in ${describeSundialHours(o.hours)}, precision ${o.precisionMinutes} min`;
    case 'moon-direction':
      if (o.pixels !== undefined) return `the moon's centre clicked at [${o.pixels.centrePx.join(', ')}] px${o.pixels.wallId !== undefined ? `, through wall ${o.pixels.wallId}` : ''} (measured in the picture)`;
      return `moon azimuth ${deg(o.azimuthDeg)} +/- ${deg(o.azimuthSigmaDeg)}, altitude ${deg(o.altitudeDeg)} +/- ${deg(o.altitudeSigmaDeg)}`;
    case 'moon-phase':
      return o.phase !== undefined ? `the moon drawn as ${o.phase}, sigma ${deg(o.sigmaDeg)} of phase` : `the moon's lit fraction ${o.illuminatedFraction} +/- ${o.sigma}`;
    case 'moon-lit-side':
      return `the moon's lit edge faces ${deg(o.litSideDeg)} from straight up (positive towards the left) +/- ${deg(o.sigmaDeg)}, as drawn`;
    case 'moon-up':
      return 'the moon is in the sky';
    case 'moon-not-up':
      return 'the moon is not in the sky';
  }
}

/** The question; a scene lit by the moon alone (src/charts/chartLight.ts) asks about its moonlight. */
function questionSection(scene: Scene, light: 'sun' | 'moon'): string {
  return `<section id="question"><h2>The question</h2>
<p>On what dates and at what hours could the ${light === 'moon' ? 'moonlight' : 'sunlight'} shown in <em>${h(scene.title)}</em> have fallen? Searched: ${h(windowWords(scene))}.</p></section>`;
}

function clockWords(scene: Scene, answer: DateAnswer): string {
  const clocks = scene.observations.filter((o): o is Extract<Observation, { kind: 'clock' }> => o.kind === 'clock');
  const dials = scene.observations.filter((o): o is Extract<Observation, { kind: 'sundial' }> => o.kind === 'sundial');
  const dialText = dials.length > 0 ? ` Sundials (the sun's hour angle, no clock convention): ${dials.map((d) => `${d.id} ${observationWords(d)}`).join('; ')}.` : '';
  if (clocks.length === 0) return `No clock in the picture: times are given in local apparent (sundial) time, local mean time and UT.${dialText}`;
  const tried = answer.clockAssumptions.map(clockAssumptionWords).join('; ');
  return `Clock readings: ${clocks.map((c) => `${c.id} ${observationWords(c)}`).join('; ')}. Assumptions tried: ${tried || 'none'}.${dialText}`;
}

function assumptionsSection(scene: Scene, answer: DateAnswer): string {
  const best = answer.candidates[0];
  const items: [string, string][] = [
    ['Site', `${siteWords(scene)}${scene.site.latitudeSigmaDeg > 0 || scene.site.longitudeSigmaDeg > 0 ? ` (uncertainty ${scene.site.latitudeSigmaDeg} deg in latitude, ${scene.site.longitudeSigmaDeg} deg in longitude, fitted)` : ''}`],
    ['Calendar', `${calendarRuleWords(scene.calendar)}; ${yearStartWords(scene.yearStart)}. ${dualStyleWords(scene) ?? 'Dates are written in the calendar in force at the site that day.'}`],
    ['Time-keeping', clockWords(scene, answer)],
    ['Delta T', best ? `${deltaTWords(best, scene)}; Delta T moves the sun along its path by only 0.041 arcseconds per second, far below any shadow measurement${answer.moon ? ', and the moon by about 0.55 arcseconds per second (13.2 deg a day), still far below any drawn moon' : ''}.` : `${deltaTModelName(scene.deltaT)} (no candidate to evaluate it at).`],
    ['Refraction', refractionWords(scene)],
    ['Map north', `map bearings are turned by ${scene.mapNorthCorrectionDeg >= 0 ? '+' : ''}${scene.mapNorthCorrectionDeg} deg to true north (as stated in the scene)`],
    ['Ephemeris', `the sun from astronomy-engine (VSOP87, IAU 2006 precession, IAU 2000B nutation), topocentric apparent place${sunAccuracyWords(scene) ? `; ${sunAccuracyWords(scene)}` : ''}${answer.moon ? "; the moon from astronomy-engine's lunar theory (about 1 arcminute), with the lunar secular acceleration of lunar laser ranging, topocentric apparent place (docs/moon.md)" : ''}`],
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
  readonly kept: boolean;
  /** A calendar note every date cell shares (" (Gregorian)"), written once in the caption instead. */
  readonly sharedSuffix: string;
}

function candidateColumns(candidates: readonly Candidate[], scene: Scene): CandidateColumns {
  const texts = candidates.map((c) => civilDateRendering(c.civilDate, scene).text);
  const suffix = / \((Julian|Gregorian)\)$/.exec(texts[0] ?? '')?.[0] ?? '';
  return {
    clock: candidates.some((c) => c.times.clock !== undefined),
    kept: new Set(candidates.map((c) => c.clockAssumptionLabel)).size > 1,
    sharedSuffix: suffix !== '' && texts.every((t) => t.endsWith(suffix)) ? suffix : '',
  };
}

/** What the clock was assumed to keep, in one or two words for a narrow column ("mean", "apparent", "zone:Europe/Vienna"). */
function keptShort(c: Candidate): string {
  const a = c.clockAssumption;
  return a.kind === 'none' ? 'no clock' : formatClockKind(a);
}

/** The 95% uncertainty, free to break after its comma, so that the column stays narrow on paper. */
function uncertaintyCell(c: Candidate): string {
  return h(shortUncertainty(c))
    .split(', ')
    .map((part) => `<span class="nowrap">${part}</span>`)
    .join(', ');
}

/** @param family the row's family label ("F2"), '' when not known, null when the answer has no families (no column) */
function candidateRow(c: Candidate, scene: Scene, columns: CandidateColumns, family: string | null): string {
  const date = civilDateRendering(c.civilDate, scene);
  const dateText = columns.sharedSuffix !== '' ? date.text.slice(0, -columns.sharedSuffix.length) : date.text;
  const cells: Cell[] = [
    ...(family === null ? [] : [h(family)]),
    n(String(c.rank)),
    { nowrap: h(dateText) },
    h(c.weekdayName.slice(0, 3)),
    n(hhmm(c.times.localApparentMinutes)),
    n(hhmm(c.times.localMeanMinutes)),
    n(hhmm(c.times.utMinutes)),
  ];
  // A clock that kept apparent time showed the apparent time.
  const shownClock = c.times.clock ? c.times.clock.minutes : c.clockAssumption.kind === 'apparent' ? c.times.localApparentMinutes : null;
  if (columns.clock) cells.push(n(shownClock === null ? '-' : hhmm(shownClock)));
  cells.push(
    n(fixed(c.sun.azimuthDeg, 1)),
    n(fixed(c.sun.altitudeDeg, 1)),
    n(fixed(c.chiSquare, 2)),
    n(h(pText(c.pValue))),
    n(fixed(c.relativeWeight, 3)),
    { wrap: uncertaintyCell(c) },
  );
  if (columns.kept) cells.push(h(keptShort(c)));
  return row(cells, false, ` data-rank="${c.rank}" data-date="${h(date.iso)}"${family === null ? '' : ` data-family="${h(family)}"`}`);
}

/** Rows of the other years shown after the best of each family. */
const OTHER_YEAR_ROWS = 10;

/** The family label ("F2") of each candidate the answer can place: every family's best, and its members when listed. */
function familyOfCandidates(answer: DateAnswer): Map<string, string> {
  const of = new Map<string, string>();
  for (const f of answer.families) {
    for (const m of f.members ?? []) of.set(m.id, `F${f.rank}`);
    of.set(f.best.id, `F${f.rank}`);
  }
  return of;
}

function candidatesTable(scene: Scene, answer: DateAnswer): string {
  const familyOf = familyOfCandidates(answer);
  const bests = answer.families.map((f) => f.best);
  const bestIds = new Set(bests.map((c) => c.id));
  const others = answer.candidates.filter((c) => !bestIds.has(c.id));
  const shownOthers = (bests.length > 0 ? others : answer.candidates).slice(0, OTHER_YEAR_ROWS);
  const shown = [...bests, ...shownOthers];
  const columns = candidateColumns(shown, scene);
  const header: Cell[] = [...(bests.length > 0 ? ['family'] : []), n('rank'), 'date', 'day', n('apparent'), n('mean'), n('UT')];
  if (columns.clock) header.push(n('clock'));
  header.push(n('azimuth'), n('altitude'), n('chi2'), n('p'), n('weight'), n('95%'));
  if (columns.kept) header.push('clock kept');
  const span = header.length;
  const group = (words: string): string => `<tr class="group"><th colspan="${span}">${h(words)}</th></tr>`;
  const rows: string[] = [];
  if (bests.length > 0) {
    rows.push(group('The best of each family (F1, F2, ... as in the table above and the charts)'));
    rows.push(...bests.map((c) => candidateRow(c, scene, columns, familyOf.get(c.id) ?? '')));
    if (shownOthers.length > 0) rows.push(group('Other years, best first'));
  }
  rows.push(...shownOthers.map((c) => candidateRow(c, scene, columns, bests.length > 0 ? (familyOf.get(c.id) ?? '') : null)));
  const hidden = answer.candidates.length - shownOthers.length - bests.filter((c) => answer.candidates.some((x) => x.id === c.id)).length;
  const dof = answer.candidates[0]?.degreesOfFreedom;
  const parts = [
    'Candidates: times of day in local apparent time, local mean time and UT',
    columns.clock ? 'clock: the time the clock showed under the row\u2019s assumption' : '',
    'sun azimuth clockwise from true north and refracted altitude, degrees',
    dof !== undefined ? `${dof} degree${dof === 1 ? '' : 's'} of freedom in every row` : '',
    '95%: half-widths of the 95% error ellipse in days and minutes, or the 95% interval of a profile scan',
    columns.sharedSuffix !== '' ? `dates in the ${columns.sharedSuffix.slice(2, -1)} calendar` : '',
    !columns.kept && shown.length > 0 ? `every row: ${shown[0].clockAssumptionLabel}` : '',
    hidden > 0 ? `${hidden} more candidates not shown (heliochron date --all-years lists every year)` : '',
  ].filter((x) => x !== '');
  const table = `<table id="candidates" class="candidates"><caption class="muted" style="caption-side:top;text-align:left">${h(parts.join('; '))}.</caption><thead>${row(header.map((c) => (typeof c === 'string' ? h(c) : c)), true)}</thead><tbody>${rows.join('')}</tbody></table>`;
  return table;
}

function answerSection(scene: Scene, answer: DateAnswer): string {
  const families = answer.families.length
    ? table('families', 'Families: the same light in several years, best first (F1, F2, ... as marked in the charts)', ['family', 'dates and hours', 'best chi2', 'p', 'weight', 'clock'], answer.families.map(familyRow)) +
      (answer.status === 'nothing-fits' ? '<p>The weights compare these poor fits with one another only; none of them fits the evidence.</p>' : '')
    : '<p>No family of candidates.</p>';
  const candidates = answer.candidates.length ? candidatesTable(scene, answer) : '<p id="candidates">No candidate.</p>';
  const replaced = answer.candidates.filter((c) => !(c.uncertainty.method === 'ellipse' && ellipse95(c.uncertainty)));
  const replacedList = replaced.length
    ? `<p>Where the error ellipse does not hold, a profile scan of the day gives the 95% interval:</p><ul>${replaced.map((c) => `<li>rank ${c.rank}: ${h(uncertaintyWords(c))}</li>`).join('')}</ul>`
    : '';
  const moonLines = moonReportLines(answer);
  const moon = moonLines.length ? `<h3 id="moon">The moon (fitted at each candidate's own instant, in every year of the window)</h3><ul>${moonLines.map((l) => `<li>${h(l)}</li>`).join('')}</ul>` : '';
  return `<section id="answer"><h2>The answer</h2>${families}${moon}${candidates}${replacedList}</section>`;
}

/**
 * The pictures with their captions; for a scene lit by the moon alone (light 'moon') the captions of the moon's map
 * and sky chart, and in place of a chart left empty (no SVG given) a sentence saying that it could not be drawn.
 */
function chartsSection(charts: ReportCharts, light: 'sun' | 'moon'): string {
  const figure = (id: string, svg: string, caption: string): string =>
    svg === '' ? `<figure id="${id}"><p class="note">This picture could not be drawn for this scene.</p><figcaption>${caption}</figcaption></figure>` : `<figure id="${id}">${svg}<figcaption>${caption}</figcaption></figure>`;
  const moon = light === 'moon';
  return `<section id="charts"><h2>Pictures of the answer</h2>
<p>The three pictures are drawn from the same estimate as the tables. The words in <em>italics</em> are explained in the list that follows them.${moon ? ' The light of this scene is the moon\u2019s: the map and the sky chart are drawn for the moon, not the sun.' : ''}</p>
${figure('figure-map', charts.map, moon ? MOON_MAP_CAPTION : MAP_CAPTION)}
${figure('figure-sky', charts.sky, moon ? MOON_SKY_CAPTION : SKY_CAPTION)}
${figure('figure-residuals', charts.residuals, RESIDUALS_CAPTION)}
</section>
${glossarySection()}`;
}

/** How to read the date-and-hour map (shades, marks and panels as drawn by src/charts/dateHourMap.ts). */
const MAP_CAPTION =
  '<strong>The date-and-hour map.</strong> Across: the days of one civil year at the site, with the month boundaries of the calendar in force; ' +
  'up: the hour in local apparent time (the time a sundial at the site shows). Each small cell is one day and one hour, shaded by how well the sun of that ' +
  'day and hour agrees with all the evidence at once (its <em>Delta chi-square</em> above the best fit): darkest blue fits within 1 <em>sigma</em> (68%), ' +
  'then within 95%, then within 99.7% (3 sigma); the palest blue, dotted, is a poor fit (3 to 5 sigma); white does not fit. Thin black lines follow the ' +
  'edges of the 68% (solid) and 95% (dashed) regions; hatched months lie outside the months the scene allows. Vermilion dots mark the best date and hour ' +
  'of each family (F1, F2, ... as in the tables); an open vermilion circle is the best of a family in another year, placed on its day of the year, ' +
  'since the sun repeats its course almost exactly every year. Around a dot, vermilion <em>error ellipses</em> hold the dates and hours within 68% ' +
  '(solid) and 95% (dashed); where an ellipse does not hold, a vermilion bar shows the 95% interval of days found by scanning day by day. The left panel ' +
  'shows the whole year, with the 95% ellipses only, drawn thin so that the shading stays visible; the right panel enlarges the surroundings of F1, ' +
  'where the ellipses and the shading can be compared: they should agree. A dark cell says that a date is consistent with the light as measured, not that ' +
  'the picture was made then.';

/** How to read the sky chart (src/charts/skyChart.ts). */
const SKY_CAPTION =
  '<strong>The sky chart.</strong> Across: the sun\u2019s azimuth, its compass direction in degrees clockwise from true north (90 east, 180 south, ' +
  '270 west); up: its altitude above the horizon in degrees, with refraction. Each measured shadow allows only certain positions of the sun: its band, ' +
  'in its own colour and outline style (see the key beside the chart), holds the sun positions that agree with it within 1 sigma. A pole\u2019s shadow ' +
  'points away from the sun, so its band is drawn at the sun\u2019s azimuth, opposite the shadow\u2019s, as the note under the chart says. Where the ' +
  'bands cross, the sun stood; a band that misses the crossing points to a measurement to look at again. A band smaller than a sun\u2019s mark is ringed in its own colour. The black lines are the sun\u2019s course on the ' +
  'best day of each family (solid, dashed, dotted), with a dot at each whole hour of local apparent time. The yellow dots are the sun at F1, F2, ..., ' +
  'each with black ellipses of direction holding 68% (solid) and 95% (dashed); where several lie together, their labels are set beside them with thin ' +
  'grey lines to their own dots. A clock fixes the hour, not the direction of the sun, and facts without numbers (a wall in shade) are not drawn.';

/** How to read the moon's date-and-hour map of a scene lit by the moon alone (src/charts/dateHourMap.ts). */
const MOON_MAP_CAPTION =
  '<strong>The date-and-hour map of the moon.</strong> The light of this scene is the moon\u2019s, and the moon\u2019s place at a given day and hour ' +
  'differs from year to year: the map is drawn for one year, that of the best candidate, and holds for that year alone. Across: the days of that ' +
  'year, with the month boundaries of the calendar in force; up: the hour in local apparent time, from the earliest sunset of the year to the ' +
  'latest sunrise, so that a night is one column, under the day on whose evening it begins. Each small cell is shaded by how well the moon of that night and hour agrees with all the ' +
  'evidence at once (its <em>Delta chi-square</em> above the best fit, the same sum the solver uses): darkest blue within 1 <em>sigma</em> (68%), then ' +
  'within 95%, then within 99.7%; the palest blue, dotted, is a poor fit; white does not fit, daylight hours included. Vermilion dots mark the best ' +
  'candidates of that year; candidates of other years are listed in the tables, not placed. The right panel enlarges the nights around F1.';

/** How to read the moon's sky chart of a scene lit by the moon alone (src/charts/skyChart.ts). */
const MOON_SKY_CAPTION =
  '<strong>The sky chart of the moon.</strong> Across: the moon\u2019s azimuth, its compass direction in degrees clockwise from true north; up: its ' +
  'altitude above the horizon in degrees, with refraction. Each shadow cast by moonlight allows only certain positions of the moon: its band, in its ' +
  'own colour and outline style, holds the moon positions that agree with it within 1 sigma (a pole\u2019s shadow points away from the moon, so its ' +
  'band lies opposite the shadow). The grey lines are the moon\u2019s course through the night of each of the best candidates, from 12 hours before ' +
  'its instant to 12 hours after, with an open circle at each whole hour of local apparent time. The small discs are the moon at F1, F2, ..., its ' +
  'lit part white and turned as the observer sees it.';

/** How to read the residuals chart (src/charts/residualChart.ts). */
const RESIDUALS_CAPTION =
  '<strong>The residuals.</strong> One bar for each measured number at the best candidate: its <em>residual</em>, (measured - predicted) / sigma, ' +
  'that is how far the measurement lies from what the sun of that date and hour would give, in units of its own uncertainty. A bar to the right: the ' +
  'measurement is larger than predicted; to the left, smaller. Bars within 1 sigma are blue, within 2 sigma orange, beyond 2 sigma vermilion; the ' +
  'value is printed beside each bar. About two bars in three should end inside the dashed lines (1 sigma) and nearly all inside the dotted lines ' +
  '(2 sigma). An outlined bar marked FLAGGED disagrees with the rest by the leave-one-out test (the fit improves beyond chance without it): a prompt to ' +
  'look again at that part of the picture, not a verdict. Below the bars, the facts without numbers, each with \u201cholds\u201d or \u201cFAILS\u201d.';

/** The few statistical words of the report, in plain terms. */
function glossarySection(): string {
  const items: [string, string][] = [
    ['sigma', 'One standard deviation: the uncertainty stated with each measured number. A shadow angle of 38 deg with sigma 2 deg means that the true value lies between 36 and 40 deg about two times in three. Regions of \u201c1 sigma\u201d hold 68% of the chance, \u201c2 sigma\u201d 95%, \u201c3 sigma\u201d 99.7%.'],
    ['residual', 'Measured minus predicted, divided by its sigma: how many sigmas a measurement lies from what the sun of a candidate date and hour would give. The same sign in every table and picture: positive when the measurement is larger than predicted.'],
    ['chi-square (chi2)', 'The sum of the squared residuals of all measured numbers: 0 is a perfect fit. With measurements as uncertain as stated, it is on average about the number of degrees of freedom (the measured numbers less the two unknowns, day and hour). Delta chi-square is how much larger it is at another date and hour than at the best fit; the shades of the map and the error ellipses are drawn at fixed values of it.'],
    ['p-value (p)', 'The chance that measurements as uncertain as stated would fit at least this badly if the date and hour were right. Below 0.05 the evidence fits poorly there. A large p does not prove a date: it says only that the light does not speak against it.'],
    ['error ellipse', 'The region of dates and hours (on the map) or of sun directions (on the sky chart) that fit within a stated chance, 68% or 95%, worked out from how fast chi-square grows around the best fit. It is a straight-line approximation; where it fails (often near a solstice, when the sun\u2019s height hardly changes from day to day), a day-by-day scan (profile scan) gives the interval instead.'],
    ['family', 'Candidates with the same light in several years: the sun repeats its course almost exactly every year, so the light alone rarely tells the years apart.'],
  ];
  return `<section id="glossary"><h2>Words used in this report</h2>
<dl class="facts glossary">${items.map(([k, v]) => `<dt>${h(k)}</dt><dd>${h(v)}</dd>`).join('')}</dl></section>`;
}

function consistencyRow(e: LeaveOneOutEntry, pThreshold: number, entries: readonly LeaveOneOutEntry[]): string {
  return row(
    [h(e.observationId), h(e.observationKind), n(String(e.residualCount)), n(fixed(e.chiSquareAll, 2)), n(fixed(e.chiSquareWithout, 2)), n(fixed(e.improvement, 2)), n(h(pText(e.pValue))), h(consistencyMark(e, pThreshold, entries)), h(e.note)],
    false,
    e.flagged ? ' class="flagged"' : '',
  );
}

function consistencySection(answer: DateAnswer): string {
  const c = answer.consistency;
  const body = c.entries.length
    ? table('consistency-table', 'Each observation left out in turn', ['observation', 'kind', 'numbers', 'chi2 all', 'chi2 without', 'improvement', 'p', 'test', 'note'], c.entries.map((e) => consistencyRow(e, c.pThreshold, c.entries)))
    : '<p>The test was not run.</p>';
  const strains = consistencyMarkNotes(c.entries, c.pThreshold).map((t) => `<p>${h(t)}</p>`).join('');
  const flagged = c.flaggedIds.length
    ? `${strains}<p><strong>Flagged: ${h(c.flaggedIds.join(', '))}.</strong> These do not agree with the rest; check how they were measured, or whether they show other light.</p>`
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
  const readings = input.calendarReadings ? calendarReadingsSection(input.calendarReadings) : '';
  const sameLight = input.sameLight ? sameLightSection(input.sameLight, answer) : '';
  const light = charts.light ?? chartLightOf(scene);
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
${readings}${questionSection(scene, light)}
${assumptionsSection(scene, answer)}
${evidenceSection(scene, answer)}
${answerSection(scene, answer)}
${sameLight}${chartsSection(charts, light)}
${consistencySection(answer)}
${cautionSection(answer)}
${reproducibilitySection(reproducibility)}
</main>
</body>
</html>
`;
}
