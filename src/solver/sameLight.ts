/**
 * The same light in a later year: the days and present zone times of a chosen year when the sun
 * stands where a candidate put it, for a scholar who wants to photograph the site in the light of
 * the picture.
 *
 * Method (heliochron's own): the sun returns to a direction (azimuth, altitude) when its declination
 * and hour angle return to the candidate's; the declination passes each value at most twice a year.
 * For every day of the year the sun is taken at the candidate's local apparent time (its hour angle,
 * src/time/clock.ts), and the days where its angular distance from the candidate's direction is
 * smallest (local minima) are refined by a golden-section search on the time of day (bounded, 60 steps:
 * Kiefer 1953; Press et al., Numerical Recipes, sec. 10.2). The full ephemeris (src/ephemeris/sunPosition.ts)
 * with the scene's air gives the direction, so the `sun` command reproduces each listed moment.
 * Within one day the sun runs along its circle of declination, so the closest it comes is about the
 * day's declination difference: near the equinoxes (0.4 deg a day) the best day may stay 0.1-0.2 deg
 * away; each listed moment says how far.
 */
import { calendarDateToJd, jdToCalendarDate } from '../calendar/julianDay.js';
import { sunPosition, type SunSite } from '../ephemeris/sunPosition.js';
import { cosDeg, radToDeg, acosClamped, sinDeg } from '../math/angles.js';
import type { Air, ClockKind } from '../scene/types.js';
import type { DeltaTModel } from '../time/deltaT.js';
import { clockToJdUT, isSummerTimeInZone, jdUTToClockMinutes, zoneReading } from '../time/clock.js';

/** A moment of the chosen year when the sun stands (nearly) where the candidate put it. */
export interface SameLightMoment {
  readonly jdUT: number;
  /** The day in the Gregorian calendar (the civil calendar of every region by then). */
  readonly date: { readonly year: number; readonly month: number; readonly day: number };
  /** Minutes after midnight in the zone's civil time that day (with summer time when in force). */
  readonly zoneMinutes: number;
  /** Offset of the zone from UT then, minutes. */
  readonly zoneOffsetMinutes: number;
  /** True when the zone keeps summer time then. */
  readonly summerTime: boolean;
  readonly azimuthDeg: number;
  readonly altitudeDeg: number;
  /** Angle between the sun then and the candidate's direction, degrees. */
  readonly separationDeg: number;
}

/** Largest distance of a daily minimum still listed (a day further away is not the same light at all), degrees. */
/** Moments farther than this from the candidate's direction are not listed, degrees. */
export const LISTED_WITHIN_DEG = 1;
const GOLDEN_STEPS = 60;

/** Angle between two directions given by azimuth and altitude, degrees (spherical law of cosines, Meeus 1998 eq. 17.1). */
export function separationDeg(az1: number, alt1: number, az2: number, alt2: number): number {
  return radToDeg(acosClamped(sinDeg(alt1) * sinDeg(alt2) + cosDeg(alt1) * cosDeg(alt2) * cosDeg(az1 - az2)));
}

/**
 * The moments of `year` (Gregorian) when the sun comes closest to (azimuthDeg, altitudeDeg) as seen
 * from `site`, each a local minimum over the days of the year within 1 deg, with the civil time of
 * `zone` (an IANA name; years from 1970 use the runtime's zone data with summer time).
 * @example sameLightIn(2026, { azimuthDeg: 200, altitudeDeg: 40, hourAngleDeg: 20 }, site, 'Europe/Zurich')
 */
export function sameLightIn(
  year: number,
  target: { readonly azimuthDeg: number; readonly altitudeDeg: number; readonly hourAngleDeg: number },
  site: SunSite,
  zone: string,
  air?: Air,
  deltaTModel?: DeltaTModel,
): readonly SameLightMoment[] {
  const first = calendarDateToJd({ calendar: 'gregorian', year, month: 1, day: 1 });
  const next = calendarDateToJd({ calendar: 'gregorian', year: year + 1, month: 1, day: 1 });
  const apparent: ClockKind = { kind: 'apparent' };
  const targetMinutes = 720 + 4 * target.hourAngleDeg; // local apparent time of the candidate's hour angle
  const distanceAt = (jdUT: number): number => {
    const p = sunPosition(jdUT, site, air, { deltaTModel });
    return separationDeg(p.azimuthDeg, p.altitudeDeg, target.azimuthDeg, target.altitudeDeg);
  };
  const daily: { dayJd0: number; jdUT: number; distance: number }[] = [];
  for (let d = first - 1; d <= next; d += 1) {
    const jdUT = clockToJdUT(d, targetMinutes, apparent, site);
    daily.push({ dayJd0: d, jdUT, distance: distanceAt(jdUT) });
  }
  const moments: SameLightMoment[] = [];
  for (let i = 1; i + 1 < daily.length; i += 1) {
    const here = daily[i];
    if (here.dayJd0 < first || here.dayJd0 >= next) continue;
    if (!(here.distance <= daily[i - 1].distance && here.distance < daily[i + 1].distance) || here.distance > LISTED_WITHIN_DEG) continue;
    const jdUT = closestInDay(here.jdUT, distanceAt);
    const p = sunPosition(jdUT, site, air, { deltaTModel });
    const clock = jdUTToClockMinutes(jdUT, { kind: 'zone', zone }, site);
    const date = jdToCalendarDate(clock.dayJd0, 'gregorian').date;
    moments.push({
      jdUT,
      date: { year: date.year, month: date.month, day: date.day },
      zoneMinutes: clock.minutesOfDay,
      zoneOffsetMinutes: zoneReading(zone, jdUT).offsetMinutes,
      summerTime: isSummerTimeInZone(zone, jdUT),
      azimuthDeg: p.azimuthDeg,
      altitudeDeg: p.altitudeDeg,
      separationDeg: separationDeg(p.azimuthDeg, p.altitudeDeg, target.azimuthDeg, target.altitudeDeg),
    });
  }
  return moments;
}

/** The instant within an hour either side of `jdUT` where `distance` is smallest (golden-section search, bounded). */
function closestInDay(jdUT: number, distance: (jdUT: number) => number): number {
  const ratio = (Math.sqrt(5) - 1) / 2;
  let a = jdUT - 1 / 24;
  let b = jdUT + 1 / 24;
  let c = b - ratio * (b - a);
  let d = a + ratio * (b - a);
  let fc = distance(c);
  let fd = distance(d);
  for (let i = 0; i < GOLDEN_STEPS && b - a > 1e-7; i += 1) {
    if (fc < fd) {
      b = d;
      d = c;
      fd = fc;
      c = b - ratio * (b - a);
      fc = distance(c);
    } else {
      a = c;
      c = d;
      fc = fd;
      d = a + ratio * (b - a);
      fd = distance(d);
    }
  }
  return (a + b) / 2;
}

/** The same light of each family's best candidate. */
export interface SameLightAnswer {
  readonly year: number;
  readonly zone: string;
  readonly families: readonly {
    readonly familyId: string;
    readonly target: { readonly azimuthDeg: number; readonly altitudeDeg: number; readonly hourAngleDeg: number };
    readonly moments: readonly SameLightMoment[];
  }[];
}

/** Largest distance at which a moment counts as the same light (the issue's criterion), degrees. */
export const SAME_LIGHT_DEG = 0.1;

const MONTHS = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December'];

/** Minutes after midnight as hh:mm:ss. */
export function hhmmss(minutes: number): string {
  const s = Math.round(minutes * 60) % 86400;
  const two = (n: number): string => String(n).padStart(2, '0');
  return `${two(Math.floor(s / 3600))}:${two(Math.floor((s % 3600) / 60))}:${two(s % 60)}`;
}

/** An offset from UT in minutes as "UT+1:00". */
export function offsetWords(minutes: number): string {
  const sign = minutes < 0 ? '-' : '+';
  const a = Math.round(Math.abs(minutes));
  return `UT${sign}${Math.floor(a / 60)}:${String(a % 60).padStart(2, '0')}`;
}

/** The answer as lines of text, with the `sun` command that checks each line. */
export function sameLightLines(a: SameLightAnswer, site: SunSite, familyWords: (familyId: string) => string, air?: Air): string[] {
  const lines = ['', `The same light in ${a.year}, in the site's present zone time ${a.zone} (with summer time where in force):`];
  for (const f of a.families) {
    lines.push(`  ${familyWords(f.familyId)}; sun azimuth ${f.target.azimuthDeg.toFixed(2)}, altitude ${f.target.altitudeDeg.toFixed(2)} deg:`);
    if (f.moments.length === 0) lines.push(`    the sun does not come within ${LISTED_WITHIN_DEG} deg of that direction in ${a.year}`);
    for (const m of f.moments) {
      const near = m.separationDeg <= SAME_LIGHT_DEG ? '' : ` - closest that year, more than ${SAME_LIGHT_DEG} deg away`;
      lines.push(
        `    ${m.date.day} ${MONTHS[m.date.month - 1]} ${m.date.year}  ${hhmmss(m.zoneMinutes)} (${offsetWords(m.zoneOffsetMinutes)}${m.summerTime ? ', summer time' : ''})  ` +
          `sun ${m.azimuthDeg.toFixed(2)} / ${m.altitudeDeg.toFixed(2)} deg, ${m.separationDeg.toFixed(3)} deg from the candidate's direction${near}`,
      );
    }
  }
  const example = a.families.flatMap((f) => f.moments)[0];
  if (example) {
    const date = `${example.date.year}-${String(example.date.month).padStart(2, '0')}-${String(example.date.day).padStart(2, '0')}`;
    lines.push(`  Check a line with: heliochron sun --lat ${site.latitudeDeg} --lon ${site.longitudeDeg} --elevation ${site.elevationM} --date ${date} --time ${hhmmss(example.zoneMinutes)} --clock zone:${a.zone}${air ? ` --pressure ${air.pressureHPa} --temperature ${air.temperatureC}` : ''}`);
  }
  lines.push('  (Times to the second: the sun moves about 0.25 deg a minute. The candidate itself is uncertain by its own ellipse, so this is where the estimate puts the light, not a certainty.)');
  return lines;
}
