/**
 * Profile-likelihood scan over one parameter (here: the day), the others minimised at each
 * step: the interval where Delta chi2 <= 3.841 is the 95% confidence interval of that one
 * parameter whatever the shape of chi-square (Press et al., *Numerical Recipes*, 3rd ed. 2007,
 * section 15.6.5: projection of the Delta chi2 region onto one parameter; Venzon and Moolgavkar,
 * "A method for computing profile-likelihood-based confidence intervals", Applied Statistics
 * 37, 1988). Used where the linearised ellipse fails its check (near a solstice the declination
 * stands still and the day is poorly fixed; near noon the altitude says little about the hour).
 *
 * The scan walks outward from the best step in whole steps until Delta chi2 exceeds the
 * threshold by a margin on both sides or the limit is reached (bounded).
 */
import { DELTA_CHI2_1DOF_95 } from '../math/chiSquare.js';

export interface ProfilePoint {
  readonly offset: number;
  readonly objective: number;
  readonly other: number; // the minimised parameter of interest beside (e.g. the minute)
}

export interface ProfileInterval {
  readonly deltaChiSquare: number;
  readonly from: number;
  readonly to: number;
  readonly open: boolean;
  readonly points: readonly ProfilePoint[];
  readonly otherMin: number;
  readonly otherMax: number;
}

/**
 * Scan offsets 0, +-1, +-2, ... (in whole steps) up to +-limit.
 * @param evaluate the minimised objective at an offset and the value of the other parameter there; null when no point is allowed
 */
export function profileScan(
  evaluate: (offset: number) => { objective: number; other: number } | null,
  limit: number,
  threshold = DELTA_CHI2_1DOF_95,
  margin = 3,
): ProfileInterval {
  const points: ProfilePoint[] = [];
  const centre = evaluate(0);
  if (centre) points.push({ offset: 0, objective: centre.objective, other: centre.other });
  let best = centre ? centre.objective : Infinity;
  let openLow = true;
  let openHigh = true;
  for (const dir of [-1, 1]) {
    let misses = 0;
    for (let k = 1; k <= limit; k += 1) {
      const p = evaluate(dir * k);
      if (!p) {
        misses += 1;
        if (misses > 7) break;
        continue;
      }
      points.push({ offset: dir * k, objective: p.objective, other: p.other });
      if (p.objective < best) best = p.objective;
      if (p.objective > best + threshold + margin) {
        if (dir < 0) openLow = false;
        else openHigh = false;
        break;
      }
    }
  }
  points.sort((a, b) => a.offset - b.offset);
  const inside = points.filter((p) => p.objective <= best + threshold);
  const from = inside.length ? inside[0].offset : 0;
  const to = inside.length ? inside[inside.length - 1].offset : 0;
  const others = inside.map((p) => p.other);
  return {
    deltaChiSquare: threshold,
    from,
    to,
    open: (openLow && from === Math.min(...points.map((p) => p.offset))) || (openHigh && to === Math.max(...points.map((p) => p.offset))),
    points,
    otherMin: others.length ? Math.min(...others) : NaN,
    otherMax: others.length ? Math.max(...others) : NaN,
  };
}
