/**
 * The moon's events: moonrise, transit and moonset in a local day; its age since the last new moon;
 * the instant of a named lunar phase near a given instant.
 *
 * Definitions: moonrise and moonset are when the upper edge of the disc crosses a level horizon with
 * standard refraction (34 arcmin) and the parallax of the moment, as seen from the site at its elevation
 * (astronomy-engine's SearchRiseSet; the same as Meeus 1998 ch. 15 with h0 = 0.7275 pi - 34' for the
 * geocentric centre). No dip for a raised observer, no local horizon profile. Transit: the moon's local
 * hour angle is 0 (astronomy-engine's SearchHourAngle). Phases: the moon's ecliptic longitude minus the
 * sun's is 0 (new), 90 (first quarter), 180 (full) or 270 deg (last quarter) (Meeus 1998 ch. 49).
 *
 * Method: astronomy-engine's searches, fed with times made from our Julian Day (never a JS Date), with
 * the Delta T model in force for the whole search (engine.ts). Phase instants are then refined by Newton
 * steps on moonPhaseLongitudeDeg, which carries the secular-acceleration shift of moonPosition.ts; rise,
 * set and transit are not (the shift moves them by under 15 s in AD 1000, under 2 s after 1600).
 * Accuracy (measured, tests/ephemeris/moonEvents.test.ts): the new moon of Meeus Example 49.a within 2 s;
 * rise and set within 4 s of Meeus ch. 15 applied to the moon of Meeus ch. 47 (astronomia), 1600-2100.
 * The real horizon and atmosphere move rise and set by minutes.
 */
import { Body, Observer, SearchHourAngle, SearchMoonPhase, SearchRiseSet, type AstroTime } from 'astronomy-engine';
import { ConvergenceError } from '../errors.js';
import { normalizeDeg180 } from '../math/angles.js';
import { astroTimeFromJdUT, J2000_JD, withDeltaT, type DeltaTChoice } from './engine.js';
import { moonPhaseLongitudeDeg } from './moonPosition.js';
import type { SunSite } from './sunPosition.js';
import type { DeltaTModel } from '../time/deltaT.js';

/** The four principal phases of the moon. */
export type LunarPhaseName = 'new' | 'first-quarter' | 'full' | 'last-quarter';

/** Phase longitude (moon minus sun, ecliptic) of each principal phase, degrees (Meeus 1998 ch. 49). */
export const LUNAR_PHASE_LONGITUDE_DEG: Readonly<Record<LunarPhaseName, number>> = {
  new: 0,
  'first-quarter': 90,
  full: 180,
  'last-quarter': 270,
};

/** Mean synodic month, days (Meeus 1998 eq. 49.1: 29.530588861 days). */
export const SYNODIC_MONTH_DAYS = 29.530588861;
/** Mean rate of the phase longitude, degrees per day (360 / synodic month). */
const PHASE_RATE_DEG_PER_DAY = 360 / SYNODIC_MONTH_DAYS;
const MAX_PHASE_STEPS = 8;
const PHASE_TOLERANCE_DAYS = 1e-6; // 0.09 s

export interface LunarPhaseInstant {
  readonly phase: LunarPhaseName;
  readonly jdUT: number;
  readonly jdTT: number;
  readonly converged: boolean;
  /** Newton steps after astronomy-engine's search. */
  readonly iterations: number;
}

export interface MoonEvents {
  /** Moonrise within the local day, or null when the moon does not rise that day (about once a month, or at high latitudes). */
  readonly moonriseJdUT: number | null;
  /** Upper transit within the local day, or null (about once a month the moon transits just before and just after the day). */
  readonly transitJdUT: number | null;
  /** Moonset within the local day, or null. */
  readonly moonsetJdUT: number | null;
}

/** Options: the Delta T model, or a fixed Delta T in seconds (for checks against published examples), as for sunPosition. */
export interface MoonEventOptions {
  readonly deltaTModel?: DeltaTModel;
  readonly deltaTSeconds?: number;
}

const deltaTChoice = (options: MoonEventOptions | undefined): DeltaTChoice | undefined => options?.deltaTSeconds ?? options?.deltaTModel;

const jdUTOf = (time: AstroTime): number => time.ut + J2000_JD;
const jdTTOf = (time: AstroTime): number => time.tt + J2000_JD;

/** Newton steps on the phase longitude from astronomy-engine's instant `start` to the target longitude. */
function refinePhase(phase: LunarPhaseName, start: AstroTime): LunarPhaseInstant {
  const target = LUNAR_PHASE_LONGITUDE_DEG[phase];
  let time = start;
  for (let i = 1; i <= MAX_PHASE_STEPS; i += 1) {
    const stepDays = -normalizeDeg180(moonPhaseLongitudeDeg(time) - target) / PHASE_RATE_DEG_PER_DAY;
    time = time.AddDays(stepDays);
    if (Math.abs(stepDays) < PHASE_TOLERANCE_DAYS) return { phase, jdUT: jdUTOf(time), jdTT: jdTTOf(time), converged: true, iterations: i };
  }
  throw new ConvergenceError(`search for the ${phase} moon`, MAX_PHASE_STEPS);
}

/**
 * The instant of the named phase nearest to jdUT (the one within half a mean lunation before or after).
 * @example lunarPhaseNear('new', 2443192.6, { deltaTSeconds: 48 }).jdTT // 2443192.651... (Meeus Example 49.a: JDE 2443192.65118)
 */
export function lunarPhaseNear(phase: LunarPhaseName, jdUT: number, options?: MoonEventOptions): LunarPhaseInstant {
  return withDeltaT(deltaTChoice(options), () => {
    const start = astroTimeFromJdUT(jdUT - SYNODIC_MONTH_DAYS / 2);
    const found = SearchMoonPhase(LUNAR_PHASE_LONGITUDE_DEG[phase], start, SYNODIC_MONTH_DAYS + 1);
    if (found === null) throw new ConvergenceError(`search for the ${phase} moon`, 0);
    return refinePhase(phase, found);
  });
}

/**
 * The last new moon at or before jdUT and the moon's age since then, days.
 * @example moonAge(2443193.0).ageDays // about 0.35 (new moon 1977 Feb 18, 3h37m TD, Meeus Example 49.a)
 */
export function moonAge(jdUT: number, options?: MoonEventOptions): { readonly ageDays: number; readonly newMoon: LunarPhaseInstant } {
  return withDeltaT(deltaTChoice(options), () => {
    // Search backwards from a little after jdUT, so that a new moon just after jdUT by astronomy-engine's
    // uncorrected series but just before it by the refined one is not missed.
    const found = SearchMoonPhase(0, astroTimeFromJdUT(jdUT + 0.5), -(SYNODIC_MONTH_DAYS + 2));
    if (found === null) throw new ConvergenceError('search for the last new moon', 0);
    let newMoon = refinePhase('new', found);
    if (newMoon.jdUT > jdUT) {
      const earlier = SearchMoonPhase(0, astroTimeFromJdUT(newMoon.jdUT - 1), -(SYNODIC_MONTH_DAYS + 2));
      if (earlier === null) throw new ConvergenceError('search for the last new moon', 0);
      newMoon = refinePhase('new', earlier);
    }
    return { ageDays: jdUT - newMoon.jdUT, newMoon };
  });
}

/**
 * Moonrise, transit and moonset within the local day [localDayJd0UT, localDayJd0UT + 1) (UT instant
 * of that day's local 0h in whatever clock the caller keeps).
 * @example moonEvents(2460482.5 - 9.35 / 360, velmar) // each a UT Julian Day or null
 */
export function moonEvents(localDayJd0UT: number, site: SunSite, options?: MoonEventOptions): MoonEvents {
  return withDeltaT(deltaTChoice(options), () => {
    const observer = new Observer(site.latitudeDeg, site.longitudeDeg, site.elevationM);
    const start = astroTimeFromJdUT(localDayJd0UT);
    const end = localDayJd0UT + 1;
    const within = (time: AstroTime | null): number | null => (time === null || jdUTOf(time) >= end ? null : jdUTOf(time));
    return {
      moonriseJdUT: within(SearchRiseSet(Body.Moon, observer, +1, start, 1)),
      transitJdUT: within(SearchHourAngle(Body.Moon, observer, 0, start, +1).time),
      moonsetJdUT: within(SearchRiseSet(Body.Moon, observer, -1, start, 1)),
    };
  });
}
