/**
 * How each line of the leave-one-out table is marked, in the text and the HTML report alike.
 *
 * When something fits, an observation is FLAGGED exactly when leaving it out lowers chi-square
 * beyond chance (p below the stated threshold). When nothing fits, the observations in conflict are
 * those whose removal lets the rest fit; the others may still lower chi-square beyond chance.
 * Marking those "ok" would contradict the stated rule, and marking them as suspect would mislead:
 * - "pulled": observations in conflict were found, and the rest fits without them; this one's fall
 *   is large only because the fit with every observation is dragged by the conflict.
 * - "strains": no observation in conflict was found; this one pulls against the rest.
 */
import type { LeaveOneOutEntry } from '../solver/types.js';

export type ConsistencyMark = 'FLAGGED' | 'pulled' | 'strains' | 'ok';

/**
 * The mark of one leave-one-out entry.
 * @param conflictIds the observations named as in conflict when nothing fits (empty otherwise).
 */
export function consistencyMark(entry: LeaveOneOutEntry, pThreshold: number, conflictIds: readonly string[]): ConsistencyMark {
  if (entry.flagged) return 'FLAGGED';
  if (!(entry.pValue < pThreshold)) return 'ok';
  return conflictIds.length > 0 ? 'pulled' : 'strains';
}

/** The sentence that explains a mark other than FLAGGED and ok, shown once when any entry carries it. */
export function consistencyMarkWords(mark: 'pulled' | 'strains', conflictIds: readonly string[]): string {
  return mark === 'pulled'
    ? `pulled: its fall of chi-square passes the rule only because the fit with every observation is dragged by ${conflictIds.join(', ')}; without ${conflictIds.length > 1 ? 'them' : 'it'} the rest fits, so this is not a conflict.`
    : 'strains: leaving it out lowers chi-square beyond chance, but the rest still does not fit without it, so it is not named as the conflict; check it too.';
}

/** The explanation lines for the marks present in `entries`. */
export function consistencyMarkNotes(entries: readonly LeaveOneOutEntry[], pThreshold: number, conflictIds: readonly string[]): string[] {
  const marks = new Set(entries.map((e) => consistencyMark(e, pThreshold, conflictIds)));
  return (['pulled', 'strains'] as const).filter((m) => marks.has(m)).map((m) => consistencyMarkWords(m, conflictIds));
}
