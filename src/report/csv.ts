/**
 * The CSV answer of `heliochron date --csv`: a header row, then one row per candidate in
 * rank order (with --all-years: one row per year of each family instead). Fields follow
 * RFC 4180 (comma separated, CRLF line ends, quotes around fields holding a comma, quote
 * or line break, quotes doubled). Numbers are rounded as in the JSON answer (json.ts DIGITS).
 */
import type { Scene } from '../scene/types.js';
import type { Candidate, DateAnswer } from '../solver/types.js';
import { formatIsoDay } from '../calendar/format.js';
import { civilDateRendering, clockAssumptionCode, ellipse95, familyIdOf, hhmm, roundProbability, roundTo } from './formatTimes.js';
import { DIGITS } from './json.js';

export const CSV_COLUMNS = [
  'rank', 'id', 'family', 'clock_assumption', 'date', 'date_iso', 'calendar', 'old_style', 'new_style', 'weekday',
  'local_apparent', 'local_mean', 'ut', 'ut_date', 'clock_time', 'clock_label', 'jd_ut',
  'azimuth_deg', 'altitude_deg', 'declination_deg', 'hour_angle_deg', 'equation_of_time_min', 'delta_t_s',
  'chi_square', 'dof', 'p_value', 'weight',
  'uncertainty_method', 'half_width_days_95', 'half_width_minutes_95', 'interval_from', 'interval_to', 'interval_open', 'invalid_reason',
] as const;

/** One CSV field, quoted when needed (RFC 4180, sec. 2). */
export function csvField(value: string | number | boolean | null): string {
  if (value === null) return '';
  const text = String(value);
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

function row(c: Candidate, familyId: string, scene: Scene): (string | number | boolean | null)[] {
  const date = civilDateRendering(c.civilDate, scene);
  const e = c.uncertainty.fixesDayAndHour ? ellipse95(c.uncertainty) : null;
  const p = c.uncertainty.profile;
  const scan = c.uncertainty.method === 'profile-scan' && p !== undefined;
  return [
    c.rank, c.id, familyId, clockAssumptionCode(c.clockAssumption), date.text, date.iso, date.calendar, date.oldStyle ?? null, date.newStyle ?? null, c.weekdayName,
    hhmm(c.times.localApparentMinutes), hhmm(c.times.localMeanMinutes), hhmm(c.times.utMinutes), formatIsoDay(c.times.utDate),
    c.times.clock ? hhmm(c.times.clock.minutes) : null, c.times.clock?.label ?? null, roundTo(c.jdUT, DIGITS.jd),
    roundTo(c.sun.azimuthDeg, DIGITS.angleDeg), roundTo(c.sun.altitudeDeg, DIGITS.angleDeg), roundTo(c.sun.declinationDeg, DIGITS.angleDeg), roundTo(c.sun.hourAngleDeg, DIGITS.angleDeg),
    roundTo(c.times.equationOfTimeMinutes, DIGITS.minutes), roundTo(c.times.deltaTSeconds, DIGITS.seconds),
    roundTo(c.chiSquare, DIGITS.chiSquare), c.degreesOfFreedom, roundProbability(c.pValue, DIGITS.probabilitySignificant), roundTo(c.relativeWeight, DIGITS.weight),
    c.uncertainty.method,
    e && !scan ? roundTo(e.halfWidthDays, DIGITS.days) : null,
    e && !scan ? roundTo(e.halfWidthMinutes, DIGITS.minutes) : null,
    scan ? formatIsoDay(p.fromDate) : null,
    scan ? formatIsoDay(p.toDate) : null,
    scan ? p.open : null,
    c.uncertainty.invalidReason ?? null,
  ];
}

/**
 * The `date` answer as CSV text.
 * @param allYears one row per year of each family (its members) instead of the ranked candidates
 */
export function dateAnswerCsv(answer: DateAnswer, scene: Scene, options: { allYears?: boolean } = {}): string {
  const lines = [CSV_COLUMNS.join(',')];
  if (options.allYears) {
    for (const f of answer.families) for (const m of f.members ?? [f.best]) lines.push(row(m, f.id, scene).map(csvField).join(','));
  } else {
    for (const c of answer.candidates) lines.push(row(c, familyIdOf(answer, c), scene).map(csvField).join(','));
  }
  return `${lines.join('\r\n')}\r\n`;
}
