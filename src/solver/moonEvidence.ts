/**
 * The moon's evidence as residual terms: each a function of the moon's place and look at the
 * candidate's own instant (src/ephemeris/moonPosition.ts), never mapped from another year.
 *
 * - moon-direction: azimuth (wrapped to (-180, 180]) and apparent altitude of the centre, over their sigmas.
 * - moon-phase, by fraction: predicted minus stated illuminated fraction k over its sigma (k is the
 *   geocentric fraction, Meeus, Astronomical Algorithms, 2nd ed. 1998, eq. 48.1).
 * - moon-phase, named: the phase longitude (moon's ecliptic longitude minus the sun's, 0 new, 90 first
 *   quarter, 180 full, 270 last quarter) against the named phase's, on the circle (residual wrapped to
 *   (-180, 180]); "crescent" and "gibbous", which do not say waxing or waning, against the folded phase
 *   longitude min(L, 360 - L) (45 and 135 deg).
 * - moon-lit-side: the bright limb's tilt from the vertical as seen (position angle of the bright limb,
 *   Meeus eq. 48.5, minus the parallactic angle, Meeus eq. 14.1) against the drawn tilt, wrapped to
 *   (-180, 180]; the drawn tilt's sign is flipped on a reversed print (image.mirrored).
 * - moon-up / moon-not-up, and the implicit "moon up" of every observation of the moon drawn in the
 *   sky: soft penalties (the altitude of the centre below / above 0, over the facts' tolerance), as the
 *   sun's facts.
 * Leaves out: the moon's semi-diameter (0.25 deg) in the facts, any roll of the picture (its up is
 * taken as the true vertical), earthshine.
 */
import type { MoonFactObservation, NamedMoonPhase, Observation, Scene } from '../scene/types.js';
import type { MoonPosition } from '../ephemeris/moonPosition.js';
import { normalizeDeg180 } from '../math/angles.js';
import { UnsupportedError } from '../errors.js';

/** Phase longitude of each named phase, degrees; null for "crescent" / "gibbous" (folded, below). */
export const NAMED_PHASE_LONGITUDE_DEG: Readonly<Record<NamedMoonPhase, number>> = {
  new: 0,
  'waxing crescent': 45,
  'first quarter': 90,
  'waxing gibbous': 135,
  full: 180,
  'waning gibbous': 225,
  'last quarter': 270,
  'waning crescent': 315,
  crescent: 45, // folded: min(L, 360 - L)
  gibbous: 135, // folded
};

/** Named phases that do not say waxing or waning: compared with the folded phase longitude. */
export function isFoldedPhase(phase: NamedMoonPhase): boolean {
  return phase === 'crescent' || phase === 'gibbous';
}

export type MoonEvidence =
  | { readonly kind: 'moon-direction'; readonly azimuthDeg: number; readonly azimuthSigmaDeg: number; readonly altitudeDeg: number; readonly altitudeSigmaDeg: number }
  | { readonly kind: 'moon-fraction'; readonly illuminatedFraction: number; readonly sigma: number }
  | { readonly kind: 'moon-named-phase'; readonly phase: NamedMoonPhase; readonly phaseLongitudeDeg: number; readonly folded: boolean; readonly sigmaDeg: number }
  /** tiltDeg: as seen in the sky (a reversed print already flipped); drawnDeg: as written in the scene. */
  | { readonly kind: 'moon-lit-side'; readonly tiltDeg: number; readonly drawnDeg: number; readonly mirrored: boolean; readonly sigmaDeg: number };

export interface MoonTerm {
  readonly observationId: string;
  readonly observationKind: Observation['kind'];
  readonly evidence: MoonEvidence;
  readonly count: number;
}

export interface MoonFactTerm {
  readonly observationId: string;
  readonly fact: MoonFactObservation['kind'];
  /** True for the "moon up" implied by an observation of the moon in the sky. */
  readonly implicit: boolean;
}

/** The moon's terms and facts of a scene, leaving out the ids in `omit`. */
export function moonTermsOf(scene: Scene, omit: ReadonlySet<string>): { terms: MoonTerm[]; facts: MoonFactTerm[] } {
  const terms: MoonTerm[] = [];
  const facts: MoonFactTerm[] = [];
  let implicitUp = false;
  const mirrored = scene.image?.mirrored === true;
  for (const o of scene.observations) {
    if (omit.has(o.id)) continue;
    let e: MoonEvidence | null = null;
    if (o.kind === 'moon-direction') {
      // The pixel form is turned into numbers before solving (src/image/resolvePixels.ts).
      if (o.pixels !== undefined) throw new UnsupportedError(`observation ${o.id}: the moon's direction in pixels must be measured before it is fitted (resolvePixelObservations)`);
      e = { kind: 'moon-direction', azimuthDeg: o.azimuthDeg, azimuthSigmaDeg: o.azimuthSigmaDeg, altitudeDeg: o.altitudeDeg, altitudeSigmaDeg: o.altitudeSigmaDeg };
    } else if (o.kind === 'moon-phase') {
      e = o.phase !== undefined
        ? { kind: 'moon-named-phase', phase: o.phase, phaseLongitudeDeg: NAMED_PHASE_LONGITUDE_DEG[o.phase], folded: isFoldedPhase(o.phase), sigmaDeg: o.sigmaDeg }
        : { kind: 'moon-fraction', illuminatedFraction: o.illuminatedFraction, sigma: o.sigma };
    } else if (o.kind === 'moon-lit-side') {
      // A reversed print shows left as right: the tilt in the sky is the drawn one with its sign flipped.
      e = { kind: 'moon-lit-side', tiltDeg: mirrored ? normalizeDeg180(-o.litSideDeg) : o.litSideDeg, drawnDeg: o.litSideDeg, mirrored, sigmaDeg: o.sigmaDeg };
    } else if (o.kind === 'moon-up' || o.kind === 'moon-not-up') {
      facts.push({ observationId: o.id, fact: o.kind, implicit: false });
      continue;
    }
    if (e === null) continue;
    terms.push({ observationId: o.id, observationKind: o.kind, evidence: e, count: e.kind === 'moon-direction' ? 2 : 1 });
    if (!implicitUp) {
      implicitUp = true;
      facts.push({ observationId: o.id, fact: 'moon-up', implicit: true });
    }
  }
  return { terms, facts };
}

/** The folded phase longitude min(L, 360 - L), [0, 180]: 0 new, 90 a quarter, 180 full. */
export function foldedPhaseLongitudeDeg(moon: MoonPosition): number {
  const l = moon.phaseLongitudeDeg;
  return l <= 180 ? l : 360 - l;
}

/** One term's values: measured, predicted (on the measured's side of any wrap), sigma, unit, component. */
export function moonValuesOf(e: MoonEvidence, moon: MoonPosition): { component: string; measured: number; predicted: number; unit: string; sigma: number }[] {
  switch (e.kind) {
    case 'moon-direction':
      return [
        { component: 'moon-azimuth', measured: e.azimuthDeg, predicted: e.azimuthDeg + normalizeDeg180(moon.azimuthDeg - e.azimuthDeg), unit: 'deg', sigma: e.azimuthSigmaDeg },
        { component: 'moon-altitude', measured: e.altitudeDeg, predicted: moon.altitudeDeg, unit: 'deg', sigma: e.altitudeSigmaDeg },
      ];
    case 'moon-fraction':
      return [{ component: 'illuminated-fraction', measured: e.illuminatedFraction, predicted: moon.illuminatedFraction, unit: 'ratio', sigma: e.sigma }];
    case 'moon-named-phase': {
      const predicted = e.folded ? foldedPhaseLongitudeDeg(moon) : e.phaseLongitudeDeg + normalizeDeg180(moon.phaseLongitudeDeg - e.phaseLongitudeDeg);
      return [{ component: e.folded ? 'folded-phase-longitude' : 'phase-longitude', measured: e.phaseLongitudeDeg, predicted, unit: 'deg', sigma: e.sigmaDeg }];
    }
    case 'moon-lit-side':
      return [{ component: 'lit-side-tilt', measured: e.tiltDeg, predicted: e.tiltDeg + normalizeDeg180(moon.brightLimbTiltFromVerticalDeg - e.tiltDeg), unit: 'deg', sigma: e.sigmaDeg }];
  }
}

/** Residuals (predicted - measured) / sigma of one term, angles wrapped on the circle. */
export function moonResiduals(e: MoonEvidence, moon: MoonPosition): number[] {
  return moonValuesOf(e, moon).map((v) => (v.predicted - v.measured) / v.sigma);
}

/** Violation of a moon fact, degrees of altitude (0 when it holds). */
export function moonFactViolationDeg(fact: MoonFactTerm['fact'], moon: { readonly altitudeDeg: number }): number {
  return fact === 'moon-up' ? Math.max(0, -moon.altitudeDeg) : Math.max(0, moon.altitudeDeg);
}

/** A moon fact in words at the moon's place. */
export function moonFactNote(f: MoonFactTerm, moon: MoonPosition, satisfied: boolean): string {
  const where = `altitude ${moon.altitudeDeg.toFixed(1)} deg`;
  if (f.fact === 'moon-up') return `the moon is ${satisfied ? 'up' : 'below the horizon'} (${where})${f.implicit ? ', as a moon drawn in the sky needs' : ''}`;
  return `the moon is ${satisfied ? 'not in the sky' : 'in the sky'} (${where})`;
}

/** The moon's look in words: "a waxing crescent, 12% lit". */
export function moonLookWords(moon: MoonPosition): string {
  const l = moon.phaseLongitudeDeg;
  const k = moon.illuminatedFraction;
  const name =
    l < 10 || l > 350 ? 'new moon' : Math.abs(l - 180) < 10 ? 'full moon' : Math.abs(l - 90) < 10 ? 'first quarter' : Math.abs(l - 270) < 10 ? 'last quarter'
      : l < 90 ? 'waxing crescent' : l < 180 ? 'waxing gibbous' : l < 270 ? 'waning gibbous' : 'waning crescent';
  return `${name}, ${Math.round(100 * k)}% lit`;
}
