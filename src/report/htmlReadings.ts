/**
 * Two optional sections of the HTML report: the readings of a disputed calendar switch that the
 * window touches (src/solver/calendarReadings.ts) and the same light in a later year
 * (src/solver/sameLight.ts). Pure functions of their answers; every text is escaped.
 */
import { escapeXml } from '../charts/svg.js';
import { formatDayWords } from '../calendar/format.js';
import { MONTH_NAMES } from '../calendar/julianDay.js';
import type { CalendarReadings } from '../solver/calendarReadings.js';
import { hhmmss, LISTED_WITHIN_DEG, offsetWords, SAME_LIGHT_DEG, type SameLightAnswer } from '../solver/sameLight.js';
import type { DateAnswer } from '../solver/types.js';
import { n, row, table } from './htmlTable.js';

const h = escapeXml;

/**
 * The readings of a disputed switch: the verdict, then one row per reading with its switch, the
 * best candidate named under it, its chi-square, whether it fits best, and its source.
 * @example calendarReadingsSection(readings) // '<section id="calendar-readings"><h2>Calendar switch in dispute</h2>...'
 */
export function calendarReadingsSection(r: CalendarReadings): string {
  const main = r.outcomes.find((o) => o.main);
  const rows = r.outcomes.map((o) => row([
    h(o.ruleText + (o.main ? ' (main reading)' : '')),
    h(o.switchWords),
    h(o.best === null ? o.refusal ?? 'no candidate' : `${formatDayWords(o.best.civilDate)} (${o.best.civilDate.calendar === 'julian' ? 'Julian' : 'Gregorian'})`),
    n(o.best === null ? '-' : o.best.chiSquare.toFixed(2)),
    h(r.fitting.includes(o.readingId) ? (r.fitting.length === r.outcomes.length ? 'alike' : 'best') : 'worse'),
    h(o.source),
  ]));
  return `<section id="calendar-readings"><h2>Calendar switch in dispute: ${h(r.regionName)}</h2>
<p><strong>${h(r.verdict)}</strong> The rest of this report uses the table's main reading ("${h(main?.ruleText ?? r.regionId)}"); to draw it under another, state that reading as the scene's calendar (for example <code>calendar: ${h(r.outcomes.find((o) => !o.main)?.ruleText ?? r.regionId)}</code>).</p>
${table('calendar-readings-table', 'Each published reading of the switch: the best candidate of the scene solved under it, with the day named as under that reading', ['reading', 'switch', 'best candidate', 'chi2', 'fit', 'source'], rows)}</section>`;
}

/**
 * The same light in a later year: per family, the days and zone times when the sun stands where
 * the family's best candidate put it, and how far from that direction.
 * @example sameLightSection(sameLight, answer) // '<section id="same-light"><h2>The same light in 2026</h2>...'
 */
export function sameLightSection(a: SameLightAnswer, answer: DateAnswer): string {
  const familyWords = (id: string): string => {
    const f = answer.families.find((x) => x.id === id);
    return f === undefined ? id : `F${f.rank}`;
  };
  const rows = a.families.flatMap((f) => {
    const target = `${f.target.azimuthDeg.toFixed(2)} / ${f.target.altitudeDeg.toFixed(2)}`;
    if (f.moments.length === 0) return [row([h(familyWords(f.familyId)), n(target), h(`the sun does not come within ${LISTED_WITHIN_DEG} deg of that direction in ${a.year}`), '', '', '', ''])];
    return f.moments.map((m) => row([
      h(familyWords(f.familyId)),
      n(target),
      { nowrap: h(`${m.date.day} ${MONTH_NAMES[m.date.month - 1]} ${m.date.year}`) },
      n(hhmmss(m.zoneMinutes)),
      h(`${offsetWords(m.zoneOffsetMinutes)}${m.summerTime ? ', summer time' : ''}`),
      n(`${m.azimuthDeg.toFixed(2)} / ${m.altitudeDeg.toFixed(2)}`),
      n(`${m.separationDeg.toFixed(3)}${m.separationDeg <= SAME_LIGHT_DEG ? '' : ' (closest that year)'}`),
    ]));
  });
  return `<section id="same-light"><h2>The same light in ${a.year}</h2>
<p>For a photograph of the site in the light of the picture: the days and times of ${a.year} when the sun stands where the best candidate of each family puts it, in the site's present zone time ${h(a.zone)} (with summer time where in force), and how far the sun is then from that direction. Times to the second: the sun moves about 0.25 deg a minute. Each candidate is itself uncertain (its ellipse), so this is where the estimate puts the light, not a certainty.</p>
${table('same-light-table', `Same light in ${a.year}: sun azimuth clockwise from true north / refracted altitude, degrees; distance from the candidate's direction, degrees`, ['family', 'candidate sun', 'day', 'zone time', 'offset', 'sun then', 'distance'], rows)}</section>`;
}
