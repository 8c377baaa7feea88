/**
 * The moon's part of a date answer in plain lines, shared by the text and HTML reports: the years it
 * names, its near-repeats in the window with their fit, the moon at the best candidate, a moon that
 * cannot be, and the caution that goes with it.
 */
import type { DateAnswer } from '../solver/types.js';
import { formatYearBcAd } from '../calendar/format.js';
import { alikeYearsText, NO_CANDIDATE_THAT_YEAR } from '../solver/moonAnswer.js';

/** Lines about the moon, or none when the answer holds no evidence of the moon. */
export function moonReportLines(answer: DateAnswer): string[] {
  const moon = answer.moon;
  if (!moon) return [];
  const out: string[] = [];
  out.push(
    moon.years.length <= 1
      ? `Years that fit: ${formatYearBcAd(moon.bestYear)} alone (every other year of the best light is worse by more than 3.84 in chi-square).`
      : `Years that fit alike (within 3.84 in chi-square of the best): ${alikeYearsText(moon.alike)}.`,
  );
  for (const n of moon.nearRepeats) {
    const fit = n.deltaChiSquare === null
      ? NO_CANDIDATE_THAT_YEAR
      : `Delta chi-square ${n.refined ? '' : 'at most '}${n.deltaChiSquare.toFixed(1)}${n.pValue === null ? '' : `, p = ${n.pValue.toPrecision(2)}`}: ${n.fitsAlike ? 'fits as well' : n.refined ? 'fits worse' : 'fits far worse (screened, not refined)'}`;
    out.push(`Near-repeat ${formatYearBcAd(n.year)} (${n.offsetYears > 0 ? '+' : ''}${n.offsetYears} years, the ${n.cycle} return of the phase): ${fit}.`);
  }
  if (moon.nearRepeats.length === 0) out.push('No near-repeat of the moon (8, 11, 19, 27 or 38 years) falls inside the window.');
  const best = answer.candidates[0];
  if (best?.moon) {
    const m = best.moon;
    out.push(
      `At the best candidate the moon stands at azimuth ${m.azimuthDeg.toFixed(1)} deg, altitude ${m.altitudeDeg.toFixed(1)} deg: ${m.words}, ${m.elongationDeg.toFixed(0)} deg from the sun, its lit edge facing ${m.litSideTiltDeg.toFixed(0)} deg from straight up (positive towards the left).`,
    );
  }
  for (const w of moon.impossible) out.push(w);
  out.push('A painted moon may be a convention or added in the studio: the years above hold only if the moon was drawn as it stood at that hour.');
  return out;
}
