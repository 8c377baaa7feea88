/**
 * How each line of the leave-one-out table is marked, in the text and the HTML report alike.
 *
 * When something fits, an observation is FLAGGED exactly when leaving it out lowers chi-square
 * beyond chance (p below the stated threshold). When nothing fits, the observations in conflict are
 * those whose removal lets the rest fit; the others may still lower chi-square beyond chance.
 * Marking those "ok" would contradict the stated rule, and marking them as suspect would mislead:
 * - "pulled": observations were found whose removal lets the rest fit (flagged); this one's fall
 *   is large only because the fit with every observation is dragged by them.
 * - "strains": no single removal lets the rest fit; this one pulls against the rest.
 */
import type { LeaveOneOutEntry } from '../solver/types.js';

export type ConsistencyMark = 'FLAGGED' | 'pulled' | 'strains' | 'ok';

/** True when some observation's removal lets the rest fit (it is then flagged). */
function conflictResolved(entries: readonly LeaveOneOutEntry[]): boolean {
  return entries.some((e) => e.flagged);
}

/**
 * The mark of one leave-one-out entry among `entries` (the whole table).
 */
export function consistencyMark(entry: LeaveOneOutEntry, pThreshold: number, entries: readonly LeaveOneOutEntry[]): ConsistencyMark {
  if (entry.flagged) return 'FLAGGED';
  if (!(entry.pValue < pThreshold)) return 'ok';
  return conflictResolved(entries) ? 'pulled' : 'strains';
}

/** The sentence that explains a mark other than FLAGGED and ok, shown once when any entry carries it. */
export function consistencyMarkWords(mark: 'pulled' | 'strains', resolvedBy: readonly string[]): string {
  return mark === 'pulled'
    ? `pulled: its fall of chi-square passes the rule only because the fit with every observation is dragged by ${resolvedBy.join(', ')}; without ${resolvedBy.length > 1 ? 'one of them' : 'it'} the rest fits, so this is not a conflict.`
    : 'strains: leaving it out lowers chi-square beyond chance, but the rest still does not fit without it (nor without any other single observation); check it, and whether parts of the picture show other light.';
}

/** The explanation lines for the marks present in `entries`. */
export function consistencyMarkNotes(entries: readonly LeaveOneOutEntry[], pThreshold: number): string[] {
  const marks = new Set(entries.map((e) => consistencyMark(e, pThreshold, entries)));
  const resolvedBy = entries.filter((e) => e.flagged).map((e) => e.observationId);
  return (['pulled', 'strains'] as const).filter((m) => marks.has(m)).map((m) => consistencyMarkWords(m, resolvedBy));
}
