/**
 * Candidate sun directions where two loci of exact solutions meet (two rods on
 * walls of different azimuth, a rod and a pole's length, a fin and an overhang...),
 * to seed the least-squares solver.
 *
 * Method for two curves: sample the azimuth circle every stepDeg, and refine every
 * sign change of the altitude difference by bisection (Press et al., Numerical
 * Recipes, 3rd ed. 2007, section 9.1) to toleranceDeg (bounded;
 * each root reports { converged, iterations }). Where a curve's domain ends
 * between two samples, the end is located by bisection first so that crossings
 * next to it are found too. Roots where the curves only touch without crossing
 * can be missed unless a sample falls on them: a stated limit of the sampling. Curves that coincide over a stretch are reported as `degenerate`.
 */
import { angleDiffDeg, normalizeDeg360 } from '../math/angles.js';
import type { SkyLocus } from './skyLocus.js';

export interface SunCandidate {
  readonly azimuthDeg: number;
  readonly altitudeDeg: number;
  readonly converged: boolean;
  readonly iterations: number;
}

export interface LocusIntersection {
  readonly candidates: readonly SunCandidate[];
  /** The loci share a whole stretch (same curve, same vertical line): no isolated answer. */
  readonly degenerate: boolean;
  readonly note?: string;
}

export interface IntersectionOptions {
  /** Sampling step of the azimuth circle, degrees (default 0.1). */
  readonly stepDeg?: number;
  /** Bisection stops when the bracket is narrower than this, degrees of azimuth (default 1e-10). */
  readonly toleranceDeg?: number;
  /** Bound on bisection steps per root (default 200). */
  readonly maxIterations?: number;
  /** How close a point must lie to the other locus to count as on it, degrees (default 1e-6). */
  readonly pointToleranceDeg?: number;
}

type Curve = Extract<SkyLocus, { kind: 'curve' }>;
type Vertical = Extract<SkyLocus, { kind: 'vertical' }>;
type Point = Extract<SkyLocus, { kind: 'point' }>;

const isUpAltitude = (alt: number | null): alt is number => alt !== null && alt > 0 && alt <= 90;

function curveCurve(a: Curve, b: Curve, o: Required<IntersectionOptions>): LocusIntersection {
  const count = Math.ceil(360 / o.stepDeg);
  const step = 360 / count;
  const diffAt = (az: number): number | null => {
    const x = a.altitudeAt(az);
    const y = b.altitudeAt(az);
    return isUpAltitude(x) && isUpAltitude(y) ? x - y : null;
  };
  const samples: (number | null)[] = [];
  for (let k = 0; k <= count; k++) samples.push(diffAt(k * step));
  const defined = samples.filter((f) => f !== null) as number[];
  const zeros = defined.filter((f) => Math.abs(f) <= o.pointToleranceDeg).length;
  if (defined.length > 0 && zeros > Math.max(3, 0.01 * count)) {
    return { candidates: [], degenerate: true, note: 'the two loci coincide over a stretch of azimuth' };
  }
  const candidates: SunCandidate[] = [];
  const push = (az: number, converged: boolean, iterations: number): void => {
    const azimuthDeg = normalizeDeg360(az);
    if (candidates.some((c) => Math.abs(angleDiffDeg(c.azimuthDeg, azimuthDeg)) < 1e3 * o.toleranceDeg + 1e-9)) return;
    const altitudeDeg = a.altitudeAt(azimuthDeg);
    if (isUpAltitude(altitudeDeg)) candidates.push({ azimuthDeg, altitudeDeg, converged, iterations });
  };
  /** Bisection for a sign change of diffAt on [lo, hi], fLo = diffAt(lo) != 0 (Numerical Recipes, 3rd ed., sec. 9.1). */
  const bisect = (lo: number, hi: number, fLo: number): void => {
    let iterations = 0;
    let converged = false;
    while (iterations < o.maxIterations) {
      iterations++;
      const mid = 0.5 * (lo + hi);
      const fMid = diffAt(mid);
      if (fMid === null) break;
      if (fMid === 0 || hi - lo < o.toleranceDeg) {
        lo = hi = mid;
        converged = true;
        break;
      }
      if (fLo * fMid < 0) hi = mid;
      else {
        lo = mid;
        fLo = fMid;
      }
    }
    push(0.5 * (lo + hi), converged, iterations);
  };
  /** The defined point nearest to the end of a curve's domain between a defined and an undefined azimuth. */
  const domainEdge = (definedAz: number, undefinedAz: number): number => {
    let inside = definedAz;
    let outside = undefinedAz;
    for (let i = 0; i < 60 && Math.abs(outside - inside) > o.toleranceDeg; i++) {
      const mid = 0.5 * (inside + outside);
      if (diffAt(mid) === null) outside = mid;
      else inside = mid;
    }
    return inside;
  };
  for (let k = 0; k < count; k++) {
    const f0 = samples[k];
    const f1 = samples[k + 1];
    const az0 = k * step;
    const az1 = az0 + step;
    if (f0 === null && f1 === null) continue;
    if (f0 === null || f1 === null) {
      // One end outside a domain: look for a crossing between the defined end and the domain's edge.
      const [definedAz, fDefined, undefinedAz] = f0 === null ? [az1, f1 as number, az0] : [az0, f0, az1];
      if (fDefined === 0) continue; // found as a sample
      const edgeAz = domainEdge(definedAz, undefinedAz);
      const fEdge = diffAt(edgeAz);
      if (fEdge === null) continue;
      if (fEdge === 0) push(edgeAz, true, 0);
      else if (fEdge * fDefined < 0) {
        if (definedAz < edgeAz) bisect(definedAz, edgeAz, fDefined);
        else bisect(edgeAz, definedAz, fEdge);
      }
      continue;
    }
    if (f0 === 0) {
      push(az0, true, 0);
      continue;
    }
    if (f0 * f1 > 0 || f1 === 0) continue; // a zero at the right end is found as the next left end
    bisect(az0, az1, f0);
  }
  if (samples[count] === 0) push(0, true, 0);
  return { candidates, degenerate: false };
}

function verticalOther(v: Vertical, other: Curve | Vertical): LocusIntersection {
  if (other.kind === 'vertical') {
    const shared = v.azimuthsDeg.some((az) => other.azimuthsDeg.some((bz) => Math.abs(angleDiffDeg(az, bz)) < 1e-9));
    return shared
      ? { candidates: [], degenerate: true, note: 'two vertical loci on the same azimuth: the altitude is not fixed' }
      : { candidates: [], degenerate: false };
  }
  const candidates: SunCandidate[] = [];
  for (const az of v.azimuthsDeg) {
    const alt = other.altitudeAt(az);
    if (isUpAltitude(alt) && alt > v.minAltitudeDeg && alt <= v.maxAltitudeDeg) {
      candidates.push({ azimuthDeg: az, altitudeDeg: alt, converged: true, iterations: 0 });
    }
  }
  return { candidates, degenerate: false };
}

function pointOnLocus(p: Point, other: SkyLocus, toleranceDeg: number): boolean {
  const { azimuthDeg, altitudeDeg } = p.sun;
  switch (other.kind) {
    case 'point':
      return Math.abs(angleDiffDeg(azimuthDeg, other.sun.azimuthDeg)) <= toleranceDeg && Math.abs(altitudeDeg - other.sun.altitudeDeg) <= toleranceDeg;
    case 'curve': {
      const alt = other.altitudeAt(azimuthDeg);
      return alt !== null && Math.abs(alt - altitudeDeg) <= toleranceDeg;
    }
    case 'vertical':
      return (
        other.azimuthsDeg.some((az) => Math.abs(angleDiffDeg(az, azimuthDeg)) <= toleranceDeg) &&
        altitudeDeg > other.minAltitudeDeg &&
        altitudeDeg <= other.maxAltitudeDeg
      );
    default:
      return false;
  }
}

/**
 * All sun directions on both loci (0, 1, 2 or more), each above the horizon.
 * @example intersectLoci(rodShadowLocus({ slopeDeg: 50, side: 'right' }, 180), poleShadowLocus({ lengthRatio: 1.2 }))
 *   // { candidates: [{ azimuthDeg: 207.5..., altitudeDeg: 39.8..., converged: true, iterations: 30 }], degenerate: false }
 */
export function intersectLoci(a: SkyLocus, b: SkyLocus, options: IntersectionOptions = {}): LocusIntersection {
  const o: Required<IntersectionOptions> = {
    stepDeg: options.stepDeg ?? 0.1,
    toleranceDeg: options.toleranceDeg ?? 1e-10,
    maxIterations: options.maxIterations ?? 200,
    pointToleranceDeg: options.pointToleranceDeg ?? 1e-6,
  };
  if (a.kind === 'empty' || b.kind === 'empty') {
    return { candidates: [], degenerate: false, note: a.kind === 'empty' ? a.description : (b as { description: string }).description };
  }
  if (a.kind === 'point' || b.kind === 'point') {
    const [p, other] = a.kind === 'point' ? [a, b] : [b as Point, a];
    return pointOnLocus(p, other, o.pointToleranceDeg)
      ? { candidates: [{ ...p.sun, converged: true, iterations: 0 }], degenerate: false }
      : { candidates: [], degenerate: false, note: 'the point does not lie on the other locus' };
  }
  if (a.kind === 'vertical') return verticalOther(a, b);
  if (b.kind === 'vertical') return verticalOther(b, a);
  return curveCurve(a, b, o);
}
