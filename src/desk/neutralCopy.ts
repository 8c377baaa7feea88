/**
 * The copies of the document that measuring needs (derive.ts for the figures and their shadows,
 * derivePerspective.ts for the camera and the suns): the scene file's structure with neutral
 * stand-ins for what does not change a measurement (title, site, calendar, window, the other
 * observations), so that measuring does not wait for them. Observations keep their places, so
 * that fields and Monte Carlo seeds are those of the file.
 */
import type { Draft, DraftValue } from './draft.js';

/** A fact that changes no measurement, in place of observation k. */
export function standIn(k: number): DraftValue {
  return { id: `desk-stand-in-${k + 1}`, kind: 'sun-up' };
}

/** The copy: `keep(o)` says which observations stay; the others become stand-ins; `keys` are copied as they are. */
export function neutralCopy(draft: Draft, title: string, walls: DraftValue[], keep: (o: DraftValue) => boolean, keys: readonly string[]): Draft {
  const observations = (Array.isArray(draft.observations) ? draft.observations : []).map((o, k) => (keep(o) ? o : standIn(k)));
  if (observations.length === 0) observations.push(standIn(0));
  const copy: Draft = {
    heliochron: 1,
    title,
    site: { latitudeDeg: 0, longitudeDeg: 0 },
    calendar: 'gregorian',
    window: { fromYear: 1900, toYear: 1900 },
    walls,
    observations,
  };
  for (const key of keys) if (draft[key] !== undefined) copy[key] = draft[key];
  return copy;
}
