/**
 * The bridge to astronomy-engine (Don Cross, astronomy-engine 2.1, VSOP87 / NOVAS-based):
 * the only module of heliochron that imports it.
 *
 * The one global setting: at load, astronomy-engine's Delta T is replaced by ours
 * (`SetDeltaTFunction`), so that every internal conversion of the library agrees with
 * src/time/deltaT.ts. Why not keep its built-in Espenak-Meeus? It evaluates the same
 * polynomials but with its own decimal year (2000 + (days since 2000 Jan 15) / 365.24217,
 * proleptic Gregorian), which drifts from Espenak and Meeus's calendar year (Julian before
 * 1582) by up to about two weeks in the early centuries: around -1000 that is near 1 s of
 * Delta T, over the 0.1 s we want to guarantee. Setting it once keeps the two identical.
 *
 * Times are built from a number only: days since J2000.0 in UT = jdUT - 2451545.0,
 * never from a JavaScript Date.
 */
import { AstroTime, SetDeltaTFunction } from 'astronomy-engine';
import { SECONDS_PER_DAY, deltaTAtJdUT } from '../time/timeScales.js';

/** JD of J2000.0 (2000 January 1.5). */
export const J2000_JD = 2451545.0;

SetDeltaTFunction((ut: number) => deltaTAtJdUT(ut + J2000_JD).seconds);

/**
 * An astronomy-engine time for an instant given as a UT Julian Day. With `deltaTSeconds`
 * given, TT is set to UT + that value instead of our Delta T model (for checks against
 * published examples that state their Delta T).
 */
export function astroTimeFromJdUT(jdUT: number, deltaTSeconds?: number): AstroTime {
  const time = new AstroTime(jdUT - J2000_JD);
  if (deltaTSeconds !== undefined) time.tt = time.ut + deltaTSeconds / SECONDS_PER_DAY;
  return time;
}
