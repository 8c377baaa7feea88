/**
 * Shared by the tests of the bundled examples made from a true instant (examples/README.md): the true
 * instant as a Julian Day (UT) from its civil day and local apparent time, and an observation of the
 * example's scene by id and kind.
 */
import { sunPosition } from '../../src/ephemeris/sunPosition.js';
import { calendarDateToJd } from '../../src/calendar/julianDay.js';
import type { Observation, Scene } from '../../src/scene/types.js';

export interface ExampleTruth {
  readonly year: number;
  readonly month: number;
  readonly day: number;
  /** Local apparent time, minutes after midnight. */
  readonly apparentMinutes: number;
}

/** jdUT = d + (m - E) / 1440 - longitude / 360 (src/solver/sunModel.ts), iterated on the equation of time E. */
export function truthJdUT(scene: Scene, truth: ExampleTruth): number {
  const day0 = calendarDateToJd({ calendar: 'gregorian', year: truth.year, month: truth.month, day: truth.day });
  let jd = day0 + truth.apparentMinutes / 1440 - scene.site.longitudeDeg / 360;
  for (let i = 0; i < 3; i += 1) jd = day0 + (truth.apparentMinutes - sunPosition(jd, scene.site).equationOfTimeMinutes) / 1440 - scene.site.longitudeDeg / 360;
  return jd;
}

/** The scene's observation `id`, which must be of `kind`. */
export function observationOf<K extends Observation['kind']>(scene: Scene, id: string, kind: K): Extract<Observation, { kind: K }> {
  const o = scene.observations.find((x) => x.id === id);
  if (!o || o.kind !== kind) throw new Error(`no ${kind} ${id}`);
  return o as Extract<Observation, { kind: K }>;
}
