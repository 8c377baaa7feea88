/**
 * What every pixel-form measurement shares (pixelObservations.ts, pointPixels.ts): the inputs that fix its
 * plane as the first entries of one parameter vector, the plane map refitted from that vector, the checks of a
 * clicked point, the stated lengths in metres, and the measured quantity built from a first-order propagation
 * (src/image/propagation.ts, after Criminisi, Reid and Zisserman 1997).
 */
import { InvalidInputError } from '../errors.js';
import type { PixelPoint } from '../scene/types.js';
import { applyHomography, fitHomographyDlt, homogeneousW, invertHomography, type Homography, type Point2 } from './homography.js';
import { checkPixelPoint, toWorkingFrame, type RectifiedPlane } from './planeInImage.js';
import { groundFromWallsParameterCount, groundFromWallsParameters, groundHomographyOf } from './groundFromWalls.js';
import type { FirstOrderResult, MeasurementFunction } from './propagation.js';
import { cameraPlaneHomographyOf, cameraPlaneParameterCount, cameraPlaneParameters } from './planeFromCamera.js';

/** A measured number with its first-order sigma and the parts of that sigma. */
export interface MeasuredQuantity {
  readonly value: number;
  readonly sigma: number;
  /** Part of the sigma from the clicked corners (the rectification) alone. */
  readonly sigmaFromPlane: number;
  /** Part from the clicked points of the observation alone. */
  readonly sigmaFromPoints: number;
  /** Part from the sigma of the stated lengths (projectionM, heightM) alone. */
  readonly sigmaFromLength: number;
  /** Part from the sigma of a stated wall azimuth alone (point pairs on a wall); 0 elsewhere. */
  readonly sigmaFromAzimuth: number;
  /**
   * False when the measurement (any of its values, since they share the clicks) bends noticeably within
   * two sigmas of the clicks (nonlinearity above LINEARITY_TOLERANCE, see src/image/propagation.ts): then the first-order sigma may be far from the
   * true spread, and the Monte Carlo spread is the one to use.
   */
  readonly firstOrderReliable: boolean;
  readonly nonlinearity: number;
}

/**
 * Largest nonlinearity (src/image/propagation.ts) for a trusted first-order sigma. Chosen on the synthetic
 * cameras of tests/image: well-conditioned cases stay below 0.2, the cases where the first-order sigma is
 * several times off the Monte Carlo spread reach 1 and more.
 */
export const LINEARITY_TOLERANCE = 0.3;

/** Everything one observation's measurement depends on, as a parameter vector. */
export interface Setup {
  readonly p0: number[];
  readonly sigmas: number[];
  readonly groups: string[];
  readonly angular: boolean[];
  readonly f: MeasurementFunction;
  readonly names: readonly string[];
}

/** Quantity k of a first-order result, with the parts of its sigma by input group. */
export function quantityOf(fo: FirstOrderResult, k: number): MeasuredQuantity {
  return {
    value: fo.values[k],
    sigma: fo.sigmas[k],
    sigmaFromPlane: fo.sigmasByGroup.plane?.[k] ?? 0,
    sigmaFromPoints: fo.sigmasByGroup.points?.[k] ?? 0,
    sigmaFromLength: fo.sigmasByGroup.length?.[k] ?? 0,
    sigmaFromAzimuth: fo.sigmasByGroup.azimuth?.[k] ?? 0,
    firstOrderReliable: Math.max(...fo.nonlinearity) <= LINEARITY_TOLERANCE,
    nonlinearity: fo.nonlinearity[k],
  };
}

/**
 * The inputs that fix a plane, as the first entries of a parameter vector, with their sigmas:
 * its clicked points (x, y each), or for a ground from two walls every click of both walls, the corner
 * and the two wall azimuths (groundFromWalls.ts), or the camera's clicks, so that the Jacobian covers the whole chain.
 */
export function planeParameters(plane: RectifiedPlane): { p0: number[]; sigmas: number[] } {
  if (plane.fromWalls) return groundFromWallsParameters(plane.fromWalls);
  if (plane.fromCamera) return cameraPlaneParameters(plane.fromCamera);
  const p0: number[] = [];
  const sigmas: number[] = [];
  plane.pixelPoints.forEach((p, i) => {
    p0.push(p[0], p[1]);
    sigmas.push(plane.pointSigmasPx[i], plane.pointSigmasPx[i]);
  });
  return { p0, sigmas };
}

/** Number of entries planeParameters gives. */
export function planeParameterCount(plane: RectifiedPlane): number {
  if (plane.fromCamera) return cameraPlaneParameterCount(plane.fromCamera);
  return plane.fromWalls ? groundFromWallsParameterCount(plane.fromWalls) : 2 * plane.pixelPoints.length;
}

/** Plane -> working pixels, refitted to the plane's entries of params. */
export function planeHomographyAt(plane: RectifiedPlane, params: readonly number[]): Homography {
  if (plane.fromWalls) return groundHomographyOf(plane.fromWalls, params);
  if (plane.fromCamera) return cameraPlaneHomographyOf(plane.fromCamera, params);
  const px: Point2[] = [];
  for (let i = 0; i < plane.pixelPoints.length; i++) px.push([params[2 * i], params[2 * i + 1]]);
  return fitHomographyDlt(plane.planePoints, px).matrix;
}

/** Plane points of `count` working-frame pixel points that follow the plane's entries in params. */
export function mapPoints(plane: RectifiedPlane, params: readonly number[], count: number): Point2[] {
  const k = planeParameterCount(plane);
  const g = invertHomography(planeHomographyAt(plane, params));
  const out: Point2[] = [];
  for (let i = 0; i < count; i++) out.push(applyHomography(g, [params[k + 2 * i], params[k + 2 * i + 1]]));
  return out;
}

/**
 * A clicked point of an observation in the working frame: inside the picture and on the visible side of the
 * plane's vanishing line, like the plane's corners.
 */
export function measuredPoint(plane: RectifiedPlane, px: PixelPoint, field: string): Point2 {
  checkPixelPoint(px, plane.image, field);
  const p = toWorkingFrame(px, plane.image);
  const g = plane.imageToPlane;
  if (Math.sign(homogeneousW(g, p)) !== Math.sign(homogeneousW(g, plane.pixelPoints[0]))) {
    throw new InvalidInputError(field, px, `a point on the ${plane.kind} (below its horizon line in the picture)`);
  }
  return p;
}

/** A stated length and its sigma in metres, checked; undefined when not given and not required. */
export function lengthInputs(
  value: number | undefined,
  sigma: number | undefined,
  field: string,
  name: string,
  sigmaName: string,
  required: boolean,
  zeroAllowed = false,
): { value: number; sigma: number } | undefined {
  if (value === undefined && !required) return undefined;
  if (!(typeof value === 'number' && Number.isFinite(value) && (value > 0 || (zeroAllowed && value === 0)))) {
    throw new InvalidInputError(`${field}.pixels.${name}`, value, `a length in metres, ${zeroAllowed ? '0 or more' : 'greater than 0'}`);
  }
  const s = sigma ?? 0;
  if (!(Number.isFinite(s) && s >= 0)) {
    throw new InvalidInputError(`${field}.pixels.${sigmaName}`, sigma, 'a sigma in metres, 0 or more');
  }
  return { value, sigma: s };
}

/** Refuse a ratio to metres on a plane known only up to scale (from the camera, or an aspect-only rectangle). */
export function needsMetric(plane: RectifiedPlane, field: string, what: string): void {
  if (plane.fromCamera) {
    const where = plane.kind === 'wall' ? `wall ${plane.fromCamera.wallId} (its imagePlane` : 'the ground (groundPlane';
    throw new InvalidInputError(
      `${field}.pixels`,
      'a plane from the camera only',
      `a figure of known size on ${where} with widthM and heightM, or planePointsM) for ${field}`,
      `${what} compares a length in the plane with a length out of it in metres; the camera fixes the ${plane.kind} only up to scale (its distance is unknown)`,
    );
  }
  if (!plane.metric) {
    throw new InvalidInputError(
      `${plane.field}.aspect`,
      plane.definition,
      `a plane known in metres (widthM with heightM, or planePointsM) for ${field}`,
      `${what} compares a length in the plane with a length out of it in metres; an aspect-only rectangle gives lengths in the plane only up to scale`,
    );
  }
}

/** A clicking sigma in pixels: the point's own, else the picture's. */
export function clickSigma(sigmaPx: number | undefined, plane: RectifiedPlane, field: string): number {
  const s = sigmaPx ?? plane.image.pixelSigmaPx;
  if (!(Number.isFinite(s) && s >= 0)) throw new InvalidInputError(`${field}.pixels.sigmaPx`, sigmaPx, 'a sigma in pixels, 0 or more');
  return s;
}

/** How the plane was fixed, in words, for a measurement's note. */
export function planeHow(plane: RectifiedPlane): string {
  if (plane.fromCamera) return `on ${plane.kind === 'wall' ? `wall ${plane.fromCamera.wallId}` : 'the ground'} put into the picture by the camera (no clicked figure)`;
  if (plane.fromWalls) return `clicked on ${plane.field} (from the foot lines of walls ${plane.fromWalls.walls[0].id} and ${plane.fromWalls.walls[1].id} meeting at the corner)`;
  const figure = plane.definition === 'points' ? `${plane.planePoints.length} plane points` : plane.definition === 'rectangle' ? 'rectangle of known size' : 'rectangle of known aspect';
  return `clicked on ${plane.field} (${figure}${plane.fit.exactlyDetermined ? ', exact 4-point fit' : `, rms ${plane.fit.rms.toFixed(2)} px`})`;
}

/** The sigma of a quantity in words: its first-order value and parts, and a warning when it is not reliable. */
export function sigmaWords(plane: RectifiedPlane, m: MeasuredQuantity, digits: number): string {
  const d = (v: number): string => v.toFixed(digits);
  return `sigma ${d(m.sigma)} by first-order propagation (${plane.fromCamera ? 'camera lines' : 'corners'} ${d(m.sigmaFromPlane)}, points ${d(m.sigmaFromPoints)}` +
    `${m.sigmaFromLength > 0 ? `, length ${d(m.sigmaFromLength)}` : ''}${m.sigmaFromAzimuth > 0 ? `, wall azimuth ${d(m.sigmaFromAzimuth)}` : ''})` +
    (m.firstOrderReliable ? '' : ' NOT RELIABLE: the value bends within one clicking error (points far outside the clicked figure or near its horizon line); use the Monte Carlo spread');
}
