/**
 * The moon's look in plain words: the name of its phase from the phase longitude, and where its lit side
 * is from the tilt seen by the observer (conventions in docs/conventions.md, "The moon").
 *
 * Phase names (common practice): "new moon", "first quarter", "full moon" and "last quarter" within
 * PRINCIPAL_PHASE_HALF_WIDTH_DEG of phase longitude 0, 90, 180 and 270 deg (about 0.6 day either side of
 * the instant); between them "waxing crescent", "waxing gibbous", "waning gibbous", "waning crescent".
 */
import { normalizeDeg180, normalizeDeg360 } from '../math/angles.js';

/** Half-width of the principal phases in phase longitude, degrees (7.5 deg = 0.62 day at 12.19 deg per day). */
export const PRINCIPAL_PHASE_HALF_WIDTH_DEG = 7.5;

export type MoonPhaseWords =
  | 'new moon'
  | 'waxing crescent'
  | 'first quarter'
  | 'waxing gibbous'
  | 'full moon'
  | 'waning gibbous'
  | 'last quarter'
  | 'waning crescent';

/**
 * The phase's plain name from the phase longitude (moon minus sun, degrees).
 * @example moonPhaseWords(45) // 'waxing crescent'
 */
export function moonPhaseWords(phaseLongitudeDeg: number): MoonPhaseWords {
  const lon = normalizeDeg360(phaseLongitudeDeg);
  const near = (centre: number): boolean => Math.abs(normalizeDeg180(lon - centre)) <= PRINCIPAL_PHASE_HALF_WIDTH_DEG;
  if (near(0)) return 'new moon';
  if (near(90)) return 'first quarter';
  if (near(180)) return 'full moon';
  if (near(270)) return 'last quarter';
  if (lon < 90) return 'waxing crescent';
  if (lon < 180) return 'waxing gibbous';
  if (lon < 270) return 'waning gibbous';
  return 'waning crescent';
}

const SIDES = ['on top', 'towards the upper left', 'on the left', 'towards the lower left', 'at the bottom', 'towards the lower right', 'on the right', 'towards the upper right'] as const;

/**
 * Where the lit side is, from its tilt from straight up (positive towards the observer's left), in eight
 * sectors of 45 deg.
 * @example litSideWords(-120) // 'towards the lower right'
 */
export function litSideWords(tiltFromVerticalDeg: number): (typeof SIDES)[number] {
  return SIDES[Math.round(normalizeDeg360(tiltFromVerticalDeg) / 45) % 8];
}
