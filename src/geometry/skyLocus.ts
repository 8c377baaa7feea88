/**
 * The set of sun directions that satisfy one piece of shadow evidence exactly,
 * used to seed the solver: a curve (altitude as a function of azimuth), vertical
 * lines (given azimuths, any altitude in a range), a single point, or nothing.
 */
import type { SunDirection } from './sunVector.js';

export type SkyLocus =
  | {
      readonly kind: 'curve';
      /** Altitude in degrees, in (0, 90], on the locus at this azimuth; null where the locus has no sun above the horizon. */
      readonly altitudeAt: (azimuthDeg: number) => number | null;
      readonly description: string;
    }
  | {
      readonly kind: 'vertical';
      /** Azimuths [0, 360) of the locus; every altitude in (minAltitudeDeg, maxAltitudeDeg] belongs. */
      readonly azimuthsDeg: readonly number[];
      readonly minAltitudeDeg: number;
      readonly maxAltitudeDeg: number;
      readonly description: string;
    }
  | { readonly kind: 'point'; readonly sun: SunDirection; readonly description: string }
  | { readonly kind: 'empty'; readonly description: string };

/** Altitudes a shadow can be cast from: the sun above the horizon. */
export const SUN_UP_RANGE = { minAltitudeDeg: 0, maxAltitudeDeg: 90 } as const;
