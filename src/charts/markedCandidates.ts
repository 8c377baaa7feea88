/**
 * Which candidates the charts mark, and how they are labelled: the best member of each family
 * of dates ("F1", "F2", ... in the order of the answer's families), or, when the answer has no
 * families, its ranked candidates ("1", "2", ...). The same labels are used in the report's tables.
 */
import type { Candidate, DateAnswer } from '../solver/types.js';

export interface MarkedCandidate {
  readonly label: string;
  readonly candidate: Candidate;
}

/** At most `max` marked candidates, best first. */
export function markedCandidates(answer: DateAnswer, max = 6): MarkedCandidate[] {
  if (answer.families.length > 0) return answer.families.slice(0, max).map((f) => ({ label: `F${f.rank}`, candidate: f.best }));
  return answer.candidates.slice(0, max).map((c) => ({ label: String(c.rank), candidate: c }));
}
