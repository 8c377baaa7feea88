/**
 * One entry point over every kind of shadow evidence: the numeric forms of the
 * scene's observations (src/scene/types.ts; pixel forms already reduced to numbers
 * by src/image), with the same kind names and field names, and for each: the forward
 * prediction, the residuals with partials, and the locus of exact solutions.
 * Clocks are not shadow evidence and are not handled here.
 */
import { DEFAULT_FACT_TOLERANCE_DEG, lightFactResidual } from './lightFacts.js';
import {
  shadowPointsLocus,
  shadowPointsResidual,
  predictShadowPoints,
  sunDirectionLocus,
  sunDirectionResidual,
  sunDirectionResidualValues,
  type ShadowPointsMeasurement,
  type ShadowPointsPrediction,
  type SunDirectionMeasurement,
} from './pointShadows.js';
import type { ResidualSet } from './residuals.js';
import { planeDistanceDeg, planeNormalAt, sunCircleLocus, sunCircleResidual, sunCircleResidualValue, type SunCircleMeasurement } from './skyPlanes.js';
import { sunUnitVector } from './sunVector.js';
import type { SkyLocus } from './skyLocus.js';
import type { SunDirection } from './sunVector.js';
import {
  finShadowLocus,
  finShadowResidual,
  finShadowResidualValue,
  overhangShadowLocus,
  overhangShadowResidual,
  overhangShadowResidualValue,
  predictFinShadow,
  predictOverhangShadow,
  predictRodShadow,
  rodShadowLocus,
  rodShadowResidual,
  rodShadowResidualValue,
  type FinShadowMeasurement,
  type FinShadowPrediction,
  type OverhangShadowMeasurement,
  type OverhangShadowPrediction,
  type RodShadowMeasurement,
  type RodShadowPrediction,
} from './wallShadows.js';
import {
  eaveShadowLocus,
  eaveShadowResidual,
  eaveShadowResidualValue,
  poleShadowLocus,
  poleShadowResidual,
  poleShadowResidualValues,
  predictEaveShadow,
  predictPoleShadow,
  type EaveShadowMeasurement,
  type EaveShadowPrediction,
  type PoleShadowMeasurement,
  type PoleShadowPrediction,
} from './groundShadows.js';

/** Shadow evidence in numbers. Wall kinds are evaluated against the wall azimuth passed beside them. */
export type ShadowEvidence =
  | ({ readonly kind: 'rod-shadow' } & RodShadowMeasurement)
  | ({ readonly kind: 'overhang-shadow' } & OverhangShadowMeasurement)
  | ({ readonly kind: 'fin-shadow' } & FinShadowMeasurement)
  | ({ readonly kind: 'pole-shadow' } & PoleShadowMeasurement)
  | ({ readonly kind: 'eave-shadow' } & EaveShadowMeasurement)
  | ({ readonly kind: 'shadow-points' } & ShadowPointsMeasurement)
  | ({ readonly kind: 'sun-direction' } & SunDirectionMeasurement)
  | ({ readonly kind: 'sun-circle' } & SunCircleMeasurement)
  | { readonly kind: 'wall-lit' | 'wall-shaded' | 'sun-up'; readonly toleranceDeg?: number };

export type ShadowEvidenceKind = ShadowEvidence['kind'];

/** The kinds that need a wall azimuth. */
export const WALL_EVIDENCE_KINDS: readonly ShadowEvidenceKind[] = [
  'rod-shadow',
  'overhang-shadow',
  'fin-shadow',
  'eave-shadow',
  'wall-lit',
  'wall-shaded',
];

export type EvidencePrediction =
  | ({ readonly kind: 'rod-shadow' } & RodShadowPrediction)
  | ({ readonly kind: 'overhang-shadow' } & OverhangShadowPrediction)
  | ({ readonly kind: 'fin-shadow' } & FinShadowPrediction)
  | ({ readonly kind: 'pole-shadow' } & PoleShadowPrediction)
  | ({ readonly kind: 'eave-shadow' } & EaveShadowPrediction)
  | ({ readonly kind: 'shadow-points' } & ShadowPointsPrediction)
  | { readonly kind: 'sun-direction'; readonly azimuthDeg: number; readonly altitudeDeg: number }
  | { readonly kind: 'sun-circle'; readonly distanceDeg: number }
  | { readonly kind: 'wall-lit' | 'wall-shaded' | 'sun-up'; readonly holds: boolean };

/**
 * What a sun direction predicts for this evidence, in the evidence's own units.
 * @example predictEvidence({ kind: 'overhang-shadow', depthRatio: 1, sigma: 0.05 }, { azimuthDeg: 180, altitudeDeg: 45 }, 180)
 *   // { kind: 'overhang-shadow', depthRatio: 1, verticalShadowAngleDeg: 45, defined: true } (to rounding)
 */
export function predictEvidence(evidence: ShadowEvidence, sun: SunDirection, wallAzimuthDeg = 0): EvidencePrediction {
  switch (evidence.kind) {
    case 'rod-shadow':
      return { kind: evidence.kind, ...predictRodShadow(sun, wallAzimuthDeg) };
    case 'overhang-shadow':
      return { kind: evidence.kind, ...predictOverhangShadow(sun, wallAzimuthDeg) };
    case 'fin-shadow':
      return { kind: evidence.kind, ...predictFinShadow(sun, wallAzimuthDeg) };
    case 'pole-shadow':
      return { kind: evidence.kind, ...predictPoleShadow(sun) };
    case 'eave-shadow':
      return { kind: evidence.kind, ...predictEaveShadow(sun, wallAzimuthDeg, evidence.projectionRatio) };
    case 'shadow-points':
      return { kind: evidence.kind, ...predictShadowPoints(evidence, sun) };
    case 'sun-direction':
      return { kind: evidence.kind, azimuthDeg: sun.azimuthDeg, altitudeDeg: sun.altitudeDeg };
    case 'sun-circle':
      return { kind: evidence.kind, distanceDeg: planeDistanceDeg(planeNormalAt(evidence.circle, evidence.cameraError ?? []), sunUnitVector(sun.azimuthDeg, sun.altitudeDeg)) };
    default: {
      const r = lightFactResidual(evidence.kind, sun, wallAzimuthDeg, evidence.toleranceDeg ?? DEFAULT_FACT_TOLERANCE_DEG);
      return { kind: evidence.kind, holds: r.defined };
    }
  }
}

/** Residuals normalised by sigma (or tolerance), with partials per degree of sun azimuth, sun altitude, wall azimuth. */
export function evidenceResiduals(evidence: ShadowEvidence, sun: SunDirection, wallAzimuthDeg = 0): ResidualSet {
  switch (evidence.kind) {
    case 'rod-shadow':
      return rodShadowResidual(evidence, sun, wallAzimuthDeg);
    case 'overhang-shadow':
      return overhangShadowResidual(evidence, sun, wallAzimuthDeg);
    case 'fin-shadow':
      return finShadowResidual(evidence, sun, wallAzimuthDeg);
    case 'pole-shadow':
      return poleShadowResidual(evidence, sun);
    case 'eave-shadow':
      return eaveShadowResidual(evidence, sun, wallAzimuthDeg);
    case 'shadow-points':
      return shadowPointsResidual(evidence, sun);
    case 'sun-direction':
      return sunDirectionResidual(evidence, sun);
    case 'sun-circle':
      return sunCircleResidual(evidence, sun);
    default:
      return lightFactResidual(evidence.kind, sun, wallAzimuthDeg, evidence.toleranceDeg ?? DEFAULT_FACT_TOLERANCE_DEG);
  }
}

/**
 * The residuals of evidenceResiduals alone, written into `out` from index `at`; returns how many.
 * The same numbers, bit for bit (each kind's residual set takes its values from the same function),
 * without partials or labels: the solver's inner loops sum them and never use the partials.
 */
export function evidenceResidualValues(evidence: ShadowEvidence, sun: SunDirection, wallAzimuthDeg: number, out: Float64Array, at: number): number {
  switch (evidence.kind) {
    case 'rod-shadow':
      out[at] = rodShadowResidualValue(evidence, sun, wallAzimuthDeg);
      return 1;
    case 'overhang-shadow':
      out[at] = overhangShadowResidualValue(evidence, sun, wallAzimuthDeg);
      return 1;
    case 'fin-shadow':
      out[at] = finShadowResidualValue(evidence, sun, wallAzimuthDeg);
      return 1;
    case 'pole-shadow':
      return poleShadowResidualValues(evidence, sun, out, at);
    case 'eave-shadow':
      out[at] = eaveShadowResidualValue(evidence, sun, wallAzimuthDeg);
      return 1;
    case 'sun-direction':
      sunDirectionResidualValues(evidence, sun, out, at);
      return 2;
    case 'sun-circle':
      out[at] = sunCircleResidualValue(evidence, sun);
      return 1;
    default: {
      const r = evidenceResiduals(evidence, sun, wallAzimuthDeg).residuals;
      for (let k = 0; k < r.length; k += 1) out[at + k] = r[k];
      return r.length;
    }
  }
}

/** The sun directions that satisfy this evidence exactly, for seeding; facts give no locus ('empty'). */
export function evidenceLocus(evidence: ShadowEvidence, wallAzimuthDeg = 0): SkyLocus {
  switch (evidence.kind) {
    case 'rod-shadow':
      return rodShadowLocus(evidence, wallAzimuthDeg);
    case 'overhang-shadow':
      return overhangShadowLocus(evidence, wallAzimuthDeg);
    case 'fin-shadow':
      return finShadowLocus(evidence, wallAzimuthDeg);
    case 'pole-shadow':
      return poleShadowLocus(evidence);
    case 'eave-shadow':
      return eaveShadowLocus(evidence, wallAzimuthDeg);
    case 'shadow-points':
      return shadowPointsLocus(evidence);
    case 'sun-direction':
      return sunDirectionLocus(evidence);
    case 'sun-circle':
      return sunCircleLocus(evidence);
    default:
      return { kind: 'empty', description: `${evidence.kind} bounds the sky but gives no curve` };
  }
}
