/**
 * The plain-text answers of `heliochron date` and `heliochron check`, for a scholar:
 * the verdict first, then the families of dates, the best candidates as a table, the
 * residuals of the best candidate, the consistency test, the assumptions and the caution.
 *
 * Pure functions of the answer and the scene: no clock, no console; the caller prints.
 * Times are rounded to the minute, angles to 0.1 deg, chi-square to 0.01.
 */
import { signedFixed } from '../textUnits.js';
import { consistencyMark, consistencyMarkNotes } from './consistencyWords.js';
import { moonReportLines } from './moonLines.js';
import type { Scene } from '../scene/types.js';
import type { Candidate, CandidateFamily, CheckAnswer, DateAnswer, Proposal, ResidualEntry } from '../solver/types.js';
import { formatDayWords, formatYearBcAd } from '../calendar/format.js';
import { MONTH_NAMES } from '../calendar/julianDay.js';
import { describeClockKind } from '../time/clock.js';
import { describeSundialHours } from '../time/hourSystems.js';
import { countWords } from '../solver/candidates.js';
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
  minuteRange,
  refractionWords,
  siteWords,
  profileWords,
  replacedReason,
  yearStartWords,
} from './formatTimes.js';

export interface DateTextOptions {
  /** List every year of each family (needs an answer solved with perYear). */
  readonly allYears?: boolean;
}

/** Columns padded to their widest cell; the first row is the header, underlined. */
export function textTable(rows: readonly (readonly string[])[], rightAligned: readonly number[] = []): string[] {
  const widths = rows[0].map((_, i) => Math.max(...rows.map((r) => (r[i] ?? '').length)));
  const line = (r: readonly string[]): string =>
    r.map((cell, i) => (rightAligned.includes(i) ? cell.padStart(widths[i]) : cell.padEnd(widths[i]))).join('  ').trimEnd();
  return [line(rows[0]), widths.map((w) => '-'.repeat(w)).join('  '), ...rows.slice(1).map(line)];
}

const fixed = (x: number | null, digits: number): string => (x === null || !Number.isFinite(x) ? '-' : x.toFixed(digits));

/** p-values: small ones in scientific notation so that they do not read as zero. */
export function pText(p: number | null): string {
  if (p === null) return '-';
  if (p < 0.001) return p === 0 ? '<1e-300' : p.toExponential(1);
  return p.toFixed(3);
}

function sameDay(a: { year: number; month: number; day: number }, b: { year: number; month: number; day: number }): boolean {
  return a.year === b.year && a.month === b.month && a.day === b.day;
}

function utText(c: Candidate): string {
  const t = hhmm(c.times.utMinutes);
  return sameDay(c.times.utDate, c.civilDate) ? t : `${t} (${c.times.utDate.day} ${MONTH_NAMES[c.times.utDate.month - 1].slice(0, 3)})`;
}

/** Short uncertainty for the table; the long words follow below it. */
function shortUncertainty(c: Candidate): string {
  const e = ellipse95(c.uncertainty);
  if (!c.uncertainty.fixesDayAndHour) return 'not fixed (see below)';
  if (c.uncertainty.method === 'ellipse' && e) return `+/-${e.halfWidthDays.toFixed(1)} d +/-${e.halfWidthMinutes.toFixed(0)} min`;
  const p = c.uncertainty.profile;
  if (!p) return 'none (see below)';
  const signed = (d: number): string => (d >= 0 ? '+' : '') + d.toFixed(0);
  if (p.fromDays === p.toDays) return 'scan: this day only';
  return `scan ${signed(p.fromDays)}..${signed(p.toDays)} d${p.open ? ' (open)' : ''}`;
}

/** The clock time of a candidate when it adds to the apparent, mean and UT columns (zone or another meridian). */
function extraClock(c: Candidate): { readonly minutes: number; readonly label: string } | null {
  const clock = c.times.clock;
  return clock && (clock.kind.kind === 'zone' || clock.kind.kind === 'meridian') ? clock : null;
}

function candidateTable(candidates: readonly Candidate[], scene: Scene): string[] {
  const withClock = candidates.some((c) => extraClock(c) !== null);
  const header = ['rank', 'date (site calendar)', 'weekday', 'apparent', 'mean', 'UT'];
  if (withClock) header.push('clock');
  header.push('azimuth', 'altitude', 'chi2', 'dof', 'p', 'weight', '95% uncertainty', 'clock assumption');
  const rows: string[][] = [header];
  for (const c of candidates) {
    const row = [
      String(c.rank),
      civilDateRendering(c.civilDate, scene).text,
      c.weekdayName,
      hhmm(c.times.localApparentMinutes),
      hhmm(c.times.localMeanMinutes),
      utText(c),
    ];
    if (withClock) row.push(extraClock(c) ? hhmm((extraClock(c) as { minutes: number }).minutes) : '-');
    row.push(
      fixed(c.sun.azimuthDeg, 1),
      fixed(c.sun.altitudeDeg, 1),
      fixed(c.chiSquare, 2),
      String(c.degreesOfFreedom),
      pText(c.pValue),
      fixed(c.relativeWeight, 3),
      shortUncertainty(c),
      c.clockAssumptionLabel,
    );
    rows.push(row);
  }
  const right = withClock ? [0, 7, 8, 9, 10, 11, 12] : [0, 6, 7, 8, 9, 10, 11];
  return textTable(rows, right);
}

/** Minutes after midnight as hh:mm.m (a tenth of a minute), for clock readings. */
function clockText(minutes: number): string {
  const tenths = Math.round(minutes * 10);
  const m = ((tenths % 14400) + 14400) % 14400;
  return `${String(Math.floor(m / 600)).padStart(2, '0')}:${(m % 600 / 10).toFixed(1).padStart(4, '0')}`;
}

function residualTable(residuals: readonly ResidualEntry[]): string[] {
  const rows: string[][] = [['observation', 'kind', 'measured quantity', 'measured', 'predicted', 'sigma', 'unit', 'residual/sigma']];
  for (const r of residuals) {
    const digits = r.unit === 'ratio' ? 3 : r.unit === 'm' ? 2 : 1;
    // A clock reading reads best as a time of day: minutes after midnight to hh:mm.m.
    const value = (x: number): string => (r.unit === 'min' && r.component === 'reading' ? clockText(x) : fixed(x, digits));
    rows.push([r.observationId, r.light === 'moon' ? `${r.observationKind} (moonlight)` : r.observationKind, r.component, value(r.measured), value(r.predicted), fixed(r.sigma, digits), r.unit, signedFixed(r.normalised, 2)]);
  }
  return [...textTable(rows, [3, 4, 5, 7]), ...residuals.flatMap((r) => (r.fullCount ? [`  ${dialCountWords(r)}`] : []))];
}

/**
 * Which of the readings a 12- or 6-hour dial cannot tell apart fits, in words.
 * @example dialCountWords(r) // "church-clock: a 12-hour dial shows 03:00 twice a day; the one that fits is 15:00 of the 24-hour count (the reading plus 12 h)"
 */
export function dialCountWords(r: ResidualEntry): string {
  const fc = r.fullCount;
  if (!fc) return '';
  const times = fc.dialHours === 12 ? 'twice' : 'four times';
  const plus = fc.turnsOfDial === 0 ? 'the reading as shown' : `the reading plus ${fc.turnsOfDial * fc.dialHours} h`;
  return `${r.observationId}: a ${fc.dialHours}-hour dial shows ${hhmm(r.measured)} ${times} a day; the one that fits is ${hhmm(fc.minutes)} of the 24-hour count (${plus})`;
}

function familyLine(f: CandidateFamily): string {
  const label = f.summary.includes(f.clockAssumptionLabel) ? '' : ` (${f.clockAssumptionLabel})`;
  return `  ${f.rank}. ${f.summary}; best chi2 ${fixed(f.bestChiSquare, 2)}, p ${pText(f.bestPValue)}, weight ${fixed(f.relativeWeight, 3)}${label}`;
}

function membersLines(f: CandidateFamily, scene: Scene): string[] {
  if (!f.members || f.members.length === 0) return [`  family ${f.rank}: no per-year members in this answer`];
  const keepings = f.keepings.length > 1;
  const rows: string[][] = [['year', 'date (site calendar)', 'weekday', 'apparent', 'mean', 'chi2', 'p', ...(keepings ? ['clock kept'] : [])]];
  for (const m of f.members) {
    const kept = m.clockAssumption.kind === 'none' ? '' : describeClockKind(m.clockAssumption);
    rows.push([String(m.civilDate.year), civilDateRendering(m.civilDate, scene).text, m.weekdayName, hhmm(m.times.localApparentMinutes), hhmm(m.times.localMeanMinutes), fixed(m.chiSquare, 2), pText(m.pValue), ...(keepings ? [kept] : [])]);
  }
  return [`  Family ${f.rank} (${f.clockAssumptionLabel}), every year:`, ...textTable(rows, [0, 5, 6]).map((l) => `    ${l}`)];
}

function assumptionLines(scene: Scene, answer: { readonly clockAssumptions?: DateAnswer['clockAssumptions'] }, best: Candidate | null): string[] {
  const lines = [
    `  calendar: ${calendarRuleWords(scene.calendar)}; ${yearStartWords(scene.yearStart)}`,
  ];
  const clocks = answer.clockAssumptions ?? [];
  if (clocks.length > 0) lines.push(`  clock: ${clocks.map(clockAssumptionWords).join('; ')}`);
  for (const o of scene.observations) {
    if (o.kind === 'sundial') lines.push(`  sundial ${o.id}: read in ${describeSundialHours(o.hours)}, as its hour lines say; a sundial shows the sun's hour angle, so no clock keeping applies (a dial drawn or set wrong would shift it)`);
  }
  if (best) lines.push(`  time scale: ${deltaTWords(best, scene)}`);
  const sunNote = sunAccuracyWords(scene);
  if (sunNote) lines.push(`  sun: ${sunNote}`);
  lines.push(`  ${refractionWords(scene)}`);
  lines.push(`  site: ${siteWords(scene)}`);
  return lines;
}

/**
 * The answer of `heliochron date` as plain text.
 * @example renderDateText(solveDates(scene), scene) // "Marktgasse view ...\n\nVerdict: Several dates fit ..."
 */
/** Most rows of the candidates table without --all-years (each family's best is added to them). */
const TABLE_ROWS = 10;

export function renderDateText(answer: DateAnswer, scene: Scene, options: DateTextOptions = {}): string {
  const out: string[] = [];
  out.push(`${answer.sceneTitle}`);
  const years = answer.window.fromYear === answer.window.toYear ? `Year searched: ${answer.window.fromYear}` : `Years searched: ${answer.window.fromYear} to ${answer.window.toYear}`;
  out.push(`${years}; ${countWords(answer.measuredResiduals, 'measured value', 'measured values')}; seed ${answer.seed}`);
  out.push('');
  out.push(`Verdict: ${answer.verdict}`);
  const best = answer.candidates[0] ?? null;

  if (answer.families.length > 0) {
    out.push(
      '',
      answer.status === 'undetermined'
        ? 'Examples of dates and hours that fit (points along a curve of equally good fits, not separate answers):'
        : 'Families of dates (the same light in several years and clock keepings), best first:',
    );
    for (const f of answer.families) out.push(familyLine(f));
    if (answer.status === 'nothing-fits') out.push('  (weights compare these poor fits with one another only; none of them fits the evidence)');
    if (options.allYears) {
      out.push('');
      for (const f of answer.families) out.push(...membersLines(f, scene));
    }
  }
  const moonLines = moonReportLines(answer);
  if (moonLines.length > 0) out.push('', 'The moon (fitted at each candidate\'s own instant, in every year of the window):', ...moonLines.map((l) => `  ${l}`));

  // The table shows the best candidates in rank order (at most TABLE_ROWS without --all-years) and,
  // after them, the best year of every family not yet shown, so that every distinct answer (both
  // sides of the solstice, morning and afternoon, each clock assumption) is in view.
  const top = options.allYears ? answer.candidates : answer.candidates.slice(0, TABLE_ROWS);
  const shownIds = new Set(top.map((c) => c.id));
  const shown = [...top, ...answer.families.map((f) => f.best).filter((c) => !shownIds.has(c.id))].sort((a, b) => a.rank - b.rank);
  if (shown.length > 0) {
    const more = answer.candidates.length > top.length ? `; ${answer.candidates.length - top.length} more with --all-years` : '';
    out.push('', `Best candidates (${shown.length}${more}), times of day in local apparent time, local mean time and UT; sun azimuth clockwise from true north, altitude refracted, degrees:`);
    out.push(...candidateTable(shown, scene).map((l) => `  ${l}`));
    const clocked = shown.map(extraClock).find((x) => x !== null);
    if (clocked) out.push(`  (clock column: the time the clock showed under the assumption of its row, ${clocked.label})`);
    const styles = dualStyleWords(scene);
    if (styles) out.push(`  (${styles})`);
    const free = shown.filter((c) => !c.uncertainty.fixesDayAndHour);
    if (free.length > 0) {
      out.push('', `No ellipse and no interval for rank ${free.map((c) => c.rank).join(', ')}: the evidence does not fix the day and the hour separately, so the day is free along a curve.`);
    }
    const replaced = shown.filter((c) => c.uncertainty.fixesDayAndHour && (c.uncertainty.method !== 'ellipse' || ellipse95(c.uncertainty) === null));
    const reasons = [...new Set(replaced.map(replacedReason))];
    for (const reason of reasons) {
      const these = replaced.filter((c) => replacedReason(c) === reason);
      out.push('', `The error ellipse was replaced by a profile scan of the day (rank ${these.map((c) => c.rank).join(', ')}) because ${reason}:`);
      for (const c of these) out.push(`  rank ${c.rank}: ${profileWords(c) ?? 'no interval could be scanned'}`);
    }
  }

  if (best) {
    out.push('', `Residuals of the best candidate (rank 1, ${civilDateRendering(best.civilDate, scene).text}, ${hhmm(best.times.localApparentMinutes)} local apparent time):`);
    if (best.residuals.length > 0) out.push(...residualTable(best.residuals).map((l) => `  ${l}`));
    for (const fact of best.facts) out.push(`  ${fact.satisfied ? 'holds' : 'FAILS'}: ${fact.observationId} - ${fact.note}`);
    if (best.nuisances.length > 0) {
      // the camera's components are in sigmas of its error, not degrees (their unit says so)
      const camera = best.nuisances.filter((n) => n.unit === 'camera sigma');
      for (const n of best.nuisances) {
        if (n.unit === 'deg') out.push(`  fitted ${n.name}: ${n.fittedDeg.toFixed(1)} deg (stated ${n.priorDeg.toFixed(1)} +/- ${n.priorSigmaDeg.toFixed(1)})`);
      }
      if (camera.length > 0) {
        const far = camera.some((n) => Math.abs(n.fittedDeg) > 3);
        out.push(
          `  fitted camera error (shared by the shadows clicked through the camera), in its own sigmas: ${camera.map((n) => `${n.fittedDeg >= 0 ? '+' : ''}${n.fittedDeg.toFixed(2)}`).join(', ')}` +
            (far ? '; more than 3 sigmas: the shadows cannot be reconciled through this camera without moving it far from its lines' : ''),
        );
      }
    }
  }

  out.push('', 'Consistency of the observations (each left out in turn):');
  out.push(`  rule: ${answer.consistency.rule}`);
  if (answer.consistency.entries.length === 0) out.push('  not run');
  for (const e of answer.consistency.entries) {
    const without = e.bestWithout
      ? `; without it the best is ${civilDateRendering(e.bestWithout.civilDate, scene).text} ${hhmm(e.bestWithout.times.localApparentMinutes)} apparent`
      : '';
    out.push(
      `  ${consistencyMark(e, answer.consistency.pThreshold, answer.consistency.entries).padEnd(7)} ${e.observationId} (${e.observationKind}): chi2 ${e.chiSquareAll.toFixed(2)} -> ${e.chiSquareWithout.toFixed(2)} without it, ` +
        `improvement ${e.improvement.toFixed(2)} (p ${pText(e.pValue)})${without}`,
    );
  }
  for (const words of consistencyMarkNotes(answer.consistency.entries, answer.consistency.pThreshold)) out.push(`  ${words}`);
  if (answer.consistency.flaggedIds.length > 0) {
    out.push(`  flagged: ${answer.consistency.flaggedIds.join(', ')} - these do not agree with the rest; check how they were measured, or whether they show other light.`);
  } else if (answer.consistency.entries.length > 0) {
    out.push('  no observation is flagged.');
  }
  if (answer.conflictingIds.length > 0) {
    out.push(
      answer.consistency.flaggedIds.length > 0
        ? `  in conflict: ${answer.conflictingIds.join(', ')}`
        : `  no single observation explains why nothing fits; the largest falls of chi-square come from leaving out ${answer.conflictingIds.join(' or ')}`,
    );
  }
  if (answer.groupTests && answer.groupTests.length > 0) {
    out.push('', 'Parts of the picture (each group against the rest: one sun for all, or a sun of its own):');
    for (const g of answer.groupTests) {
      out.push(`  ${g.differs ? 'DIFFERS' : 'ok     '} ${g.sentence}.`);
      out.push(`          observations of the group: ${g.observationIds.join(', ')}; the rest: ${g.restIds.join(', ')}; chi2 ${g.chiSquareOneSun.toFixed(2)} with one sun, ${g.chiSquareSeparate.toFixed(2)} with a separate sun for the group`);
    }
  }

  out.push('', 'Assumptions:');
  out.push(...assumptionLines(scene, answer, best));
  for (const n of answer.notes) out.push(`  ${n}`);
  out.push('', `Caution: ${CAUTION}`);
  return `${out.join('\n')}\n`;
}

/** A proposal in words: "on 30 July 1771 at 07:42 local apparent time". */
export function proposalWords(p: Proposal): string {
  switch (p.kind) {
    case 'day': {
      const within = p.timeToleranceMinutes ? ` (+/- ${p.timeToleranceMinutes} min)` : '';
      const at = p.timeMinutes === undefined ? ' (any hour)' : ` at ${hhmm(p.timeMinutes)} ${describeClockKind(p.timeClock ?? { kind: 'apparent' })}${within}`;
      return `on ${formatDayWords(p.day)}${at}`;
    }
    case 'range':
      return `between ${formatDayWords(p.from)} and ${formatDayWords(p.to)}`;
    case 'season': {
      const months = p.months.map((m) => MONTH_NAMES[m - 1]).join(', ');
      const years =
        p.fromYear !== undefined && p.toYear !== undefined
          ? p.fromYear === p.toYear
            ? ` ${formatYearBcAd(p.fromYear)}`
            : `, years ${formatYearBcAd(p.fromYear)}-${formatYearBcAd(p.toYear)}`
          : ", any year of the scene's window";
      return `in ${months}${years}`;
    }
  }
}

function candidateLine(c: Candidate, scene: Scene): string {
  const extra = extraClock(c);
  const clock = extra ? `, ${hhmm(extra.minutes)} ${extra.label}` : '';
  return (
    `${civilDateRendering(c.civilDate, scene).text}, ${c.weekdayName}, ${hhmm(c.times.localApparentMinutes)} local apparent time ` +
    `(${hhmm(c.times.localMeanMinutes)} local mean time, ${utText(c)} UT${clock}); sun at azimuth ${c.sun.azimuthDeg.toFixed(1)}, altitude ${c.sun.altitudeDeg.toFixed(1)} deg`
  );
}

/**
 * The answer of `heliochron check` as plain text: the one-line verdict first.
 */
export function renderCheckText(answer: CheckAnswer, scene: Scene): string {
  const out: string[] = [];
  out.push(`${answer.sceneTitle}`);
  out.push(`Proposal: ${proposalWords(answer.proposal)}`);
  out.push('');
  out.push(`Verdict: ${answer.verdict} - ${answer.verdictText}`);
  out.push('');
  if (answer.best) {
    out.push(`Best fit inside the proposal: ${candidateLine(answer.best, scene)}`);
    const dof = answer.degreesOfFreedom > 0 ? `with ${countWords(answer.degreesOfFreedom, 'degree of freedom', 'degrees of freedom')}, p ${pText(answer.pValue)}` : 'with no degrees of freedom left to judge it';
    out.push(`  on its own: chi2 ${fixed(answer.chiSquare, 2)} ${dof} (${answer.best.clockAssumptionLabel})`);
    const r = answer.relative;
    if (r) {
      out.push(
        `  against the best in the window: Delta chi2 ${r.deltaChiSquare.toFixed(2)} with ${countWords(r.degreesOfFreedom, 'degree of freedom', 'degrees of freedom')} (what the proposal fixes), p ${pText(r.pValue)}, likelihood ratio ${r.likelihoodRatio.toPrecision(2)}`,
      );
    }
  } else {
    out.push('Best fit inside the proposal: none (the sun is not up where the evidence needs it at any instant of the proposal)');
  }
  if (answer.globalBest) {
    out.push(`Best fit anywhere in the window: ${candidateLine(answer.globalBest, scene)}`);
    out.push(`  chi2 ${fixed(answer.globalBest.chiSquare, 2)}, p ${pText(answer.globalBest.pValue)}`);
    if (answer.globalHeadline) out.push(`  the same light on: ${answer.globalHeadline}`);
  }
  if (answer.overall) out.push(`Fit of the evidence as a whole: ${answer.overall.words}`);
  if (answer.best) {
    out.push('', 'Residuals of the best fit inside the proposal:');
    if (answer.best.residuals.length > 0) out.push(...residualTable(answer.best.residuals).map((l) => `  ${l}`));
    for (const fact of answer.best.facts) out.push(`  ${fact.satisfied ? 'holds' : 'FAILS'}: ${fact.observationId} - ${fact.note}`);
  }
  out.push('', 'Assumptions:');
  const checked = answer.best ?? answer.globalBest;
  out.push(...assumptionLines(scene, { clockAssumptions: checked && checked.clockAssumption.kind !== 'none' ? [checked.clockAssumption] : [] }, checked));
  out.push(`  seed ${scene.seed} (of any Monte Carlo run; the scene's seed: or --seed)`);
  for (const n of answer.notes) out.push(`  ${n}`);
  out.push('', `Caution: ${CAUTION}`);
  return `${out.join('\n')}\n`;
}
