/**
 * The bridge to astronomy-engine (Don Cross, astronomy-engine 2.1, VSOP87 / NOVAS-based):
 * the only module of heliochron that imports it.
 *
 * Delta T: astronomy-engine keeps one global Delta T function (`SetDeltaTFunction`) and uses
 * it whenever it makes a time from UT, including inside its own routines (the light-time step
 * of the sun's position builds a new time from UT). Setting TT on a time object from outside
 * therefore does not reach those inner steps (measured: at -500 the sun moved by 0.2 deg when
 * only the outer time carried a different TT). So at load heliochron installs one function that
 * asks src/time for Delta T by the model in force, and `withDeltaT` states that model (or a fixed
 * value) for the length of one synchronous computation, then restores the previous one. This is
 * the one piece of module state in the core, forced by the library's design; it is restored in a
 * `finally`, so an error cannot leave another model in force. Why not keep the library's built-in
 * Espenak-Meeus? It evaluates the polynomials with its own proleptic-Gregorian decimal year, which
 * drifts from the calendar year of the published models by up to two weeks in early centuries.
 *
 * Times are built from a number only: days since J2000.0 in UT = jdUT - 2451545.0,
 * never from a JavaScript Date.
 */
import { AstroTime, SetDeltaTFunction } from 'astronomy-engine';
import { DEFAULT_DELTA_T_MODEL, deltaTSeconds as modelDeltaTSeconds, type DeltaTModel } from '../time/deltaT.js';
import { SECONDS_PER_DAY, jdToDecimalYear } from '../time/timeScales.js';

/** JD of J2000.0 (2000 January 1.5). */
export const J2000_JD = 2451545.0;

/** A Delta T model by name, or a fixed Delta T in seconds (for checks against published examples). */
export type DeltaTChoice = DeltaTModel | number;

let inForce: DeltaTChoice = DEFAULT_DELTA_T_MODEL;

/** Delta T in seconds at a UT Julian Day by a model or fixed value (its sigma is not needed here). */
function deltaTByChoice(jdUT: number, choice: DeltaTChoice): number {
  return typeof choice === 'number' ? choice : modelDeltaTSeconds(jdToDecimalYear(jdUT), choice);
}

SetDeltaTFunction((ut: number) => deltaTByChoice(ut + J2000_JD, inForce));

/**
 * Delta T in seconds that astronomy-engine's Delta T hook returns for `ut` (days of UT since
 * J2000.0, the library's own argument) inside withDeltaT(choice, ...): by `choice`, or by the
 * choice in force when it is undefined. For code that evaluates the library's formulas itself
 * (src/ephemeris/sunOfDate.ts) and must make the same times without a closure.
 * @example deltaTSecondsAtUt(0, 67) // 67
 */
export function deltaTSecondsAtUt(ut: number, choice: DeltaTChoice | undefined): number {
  return deltaTByChoice(ut + J2000_JD, choice ?? inForce);
}

/**
 * Run one synchronous computation with the given Delta T model or fixed value in force for
 * every astronomy-engine time made during it; the previous choice is restored afterwards.
 * @example withDeltaT('espenak-meeus-2006', () => sunPositionCore(...))
 */
export function withDeltaT<T>(choice: DeltaTChoice | undefined, compute: () => T): T {
  if (choice === undefined || choice === inForce) return compute();
  const previous = inForce;
  inForce = choice;
  try {
    return compute();
  } finally {
    inForce = previous;
  }
}

/**
 * An astronomy-engine time for an instant given as a UT Julian Day, with TT from the Delta T in
 * force (see withDeltaT). With `deltaTSeconds` given, TT of this time object is set to UT + that
 * value; inner steps of the library still use the Delta T in force, so callers that need a fixed
 * Delta T throughout wrap their computation in withDeltaT(deltaTSeconds, ...).
 */
export function astroTimeFromJdUT(jdUT: number, deltaTSeconds?: number): AstroTime {
  const time = new AstroTime(jdUT - J2000_JD);
  if (deltaTSeconds !== undefined) time.tt = time.ut + deltaTSeconds / SECONDS_PER_DAY;
  return time;
}
