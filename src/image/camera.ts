/**
 * The picture's camera from clicked lines, with its uncertainty and a report
 * of how well the picture's perspective holds together.
 *
 * The numbers come from cameraModel.ts (vanishing points by weighted least
 * squares, the orthocentre construction of Caprile and Torre 1990, Horn's
 * rotation). Here: the checks that refuse degenerate input with a message
 * naming the field, the choice of calibration method, and the first-order
 * propagation of every click into focal length, principal point and
 * rotation (Criminisi, Reid and Zisserman, "Single view metrology", IJCV 40,
 * 2000, sec. 4: the covariance of a measurement from vanishing points is
 * J Lambda J^T, J the Jacobian of the whole chain in the clicked
 * coordinates; taken here by central differences, src/image/propagation.ts),
 * with the same linearity check as the plane measurements.
 *
 * A vanishing point counts as at infinity (its lines parallel in the
 * picture) when its elevation on the sphere of directions (normalised
 * coordinates, vanishingPoint.ts) is within 2 sigma of zero: then no finite
 * point may be taken from it (common practice: a quantity within two sigma
 * of a singular value is treated as singular).
 */
import { InvalidInputError } from '../errors.js';
import { chiSquarePValue } from '../math/chiSquare.js';
import type { Point2 } from './homography.js';
import { propagateFirstOrder } from './propagation.js';
import { LINEARITY_TOLERANCE } from './pixelObservations.js';
import {
  applyMatrix,
  arePerpendicular,
  cameraAttitude,
  cameraFromParameters,
  cameraParameters,
  dot3,
  rotationDifferenceDeg,
  vanishingPointsOf,
  type CalibrationMethod,
  type CameraCore,
  type CameraInput,
  type FamilyDirection,
  type LineFamily,
  type Matrix3,
  type Vector3,
} from './cameraModel.js';
import { homogeneousToPixels, pictureFrame, type Homogeneous3 } from './vanishingPoint.js';

/** Two wall directions within this of 90 deg are taken as square to each other (for the orthocentre), degrees. */
export const PERPENDICULAR_TOLERANCE_DEG = 1;
/**
 * A family whose vanishing point lies further than this from where the camera fitted to all families puts
 * its stated direction is refused, degrees: far beyond clicking error, it means a wrong wall or azimuth.
 */
export const WALL_MISFIT_LIMIT_DEG = 10;
/** Meeting test: below this p-value the lines of a family are said not to meet in one point. */
export const MEETING_P_LIMIT = 0.01;
/** Shortest clicked line, px, from its first point to its farthest one (common practice: several clicking errors). */
export const MIN_LINE_LENGTH_PX = 5;

/** A vanishing point with its uncertainty and the meeting test of its lines. */
export interface VanishingPointReport {
  readonly field: string;
  readonly direction: FamilyDirection;
  readonly lineCount: number;
  /** Unit homogeneous point in the normalised frame of the picture (vanishingPoint.ts). */
  readonly homogeneous: Homogeneous3;
  /** Pixel position (working frame), null when exactly at infinity. */
  readonly pointPx: Point2 | null;
  /** Its first-order covariance, px^2, when finite. */
  readonly covariancePx?: readonly (readonly number[])[];
  /** Angle of the point from the line at infinity on the sphere of directions, degrees, and its sigma. */
  readonly elevationDeg: number;
  readonly elevationSigmaDeg: number;
  /** True when the lines are parallel in the picture within the clicking error. */
  readonly atInfinity: boolean;
  readonly chiSquare: number;
  readonly dof: number;
  /** Null when there is no check (two lines always meet). */
  readonly pValue: number | null;
  readonly missAnglesDeg: readonly number[];
  readonly meets: boolean;
  readonly note: string;
}

/** A value with its first-order sigma. */
export interface ValueWithSigma {
  readonly value: number;
  readonly sigma: number;
}

export interface CameraSolution {
  readonly input: CameraInput;
  readonly method: CalibrationMethod;
  /** How focal length and principal point were found, in words. */
  readonly methodNote: string;
  /** The camera at the nominal clicks. */
  readonly core: CameraCore;
  readonly focalLengthPx: ValueWithSigma;
  readonly principalPointPx: readonly [ValueWithSigma, ValueWithSigma];
  /** True when the principal point was assumed at the picture's centre (not measured). */
  readonly principalPointAssumed: boolean;
  /** Site (east, north, up) to camera (right, down, forward). */
  readonly rotation: Matrix3;
  /** Sigma of the camera's rotation about the east, north and up axes, degrees. */
  readonly rotationSigmaDeg: Vector3;
  readonly viewAzimuthDeg: ValueWithSigma;
  readonly viewAltitudeDeg: ValueWithSigma;
  readonly rollDeg: ValueWithSigma;
  readonly horizontalFieldOfViewDeg: number;
  /** Per family: angle between its vanishing direction and where the fitted rotation puts its stated direction, degrees. */
  readonly directionMisfitsDeg: readonly number[];
  readonly vanishingPoints: readonly VanishingPointReport[];
  /** Worst nonlinearity of the outputs (src/image/propagation.ts); above LINEARITY_TOLERANCE the sigmas are not reliable. */
  readonly nonlinearity: number;
  readonly firstOrderReliable: boolean;
  /** True when every family with a check meets in one point. */
  readonly perspectiveConsistent: boolean;
  /** Plain sentences for the report. */
  readonly notes: readonly string[];
}

/** Names of the propagated outputs, in order. */
export const CAMERA_OUTPUTS = ['focalLengthPx', 'principalXPx', 'principalYPx', 'rotationEastDeg', 'rotationNorthDeg', 'rotationUpDeg', 'viewAzimuthDeg', 'viewAltitudeDeg', 'rollDeg'] as const;
const CAMERA_ANGULAR = [false, false, false, false, false, false, true, false, true];

/** The camera's outputs for one parameter vector (for propagation and Monte Carlo). */
export function cameraOutputs(core: CameraCore, reference: Matrix3): number[] {
  const att = cameraAttitude(core.rotation);
  return [core.focalLengthPx, core.principalPointPx[0], core.principalPointPx[1], ...rotationDifferenceDeg(core.rotation, reference), att.viewAzimuthDeg, att.viewAltitudeDeg, att.rollDeg];
}

function familyName(fam: LineFamily): string {
  return fam.direction.kind === 'vertical' ? 'the vertical lines' : `the lines along wall ${fam.direction.wallId}`;
}

/** Refuse input no camera could be found from, naming the field. */
export function checkCameraInput(input: CameraInput): void {
  if (!(input.widthPx > 0 && input.heightPx > 0)) {
    throw new InvalidInputError('image', [input.widthPx, input.heightPx], 'a picture size (widthPx, heightPx) for a camera');
  }
  const verticals = input.families.filter((f) => f.direction.kind === 'vertical');
  const walls = input.families.filter((f) => f.direction.kind === 'wall');
  if (verticals.length !== 1) {
    throw new InvalidInputError(`${input.field}.verticalLines`, verticals.length === 0 ? undefined : `${verticals.length} families`, 'one family of two or more lines along edges vertical in the scene');
  }
  if (walls.length === 0) {
    throw new InvalidInputError(
      `${input.field}.wallLines`, undefined, 'lines along the horizontal edges of at least one wall of known azimuth',
      'One vanishing direction (the vertical) fixes the camera only up to a turn about the vertical',
    );
  }
  for (const fam of input.families) {
    if (fam.lines.length < 2) {
      throw new InvalidInputError(`${fam.field}`, `${fam.lines.length} line`, 'two or more lines along edges parallel in the scene (three or more to check that they meet)');
    }
    fam.lines.forEach((line, i) => {
      const f = `${fam.field}[${i}]`;
      if (!(line.pointsPx.length >= 2)) throw new InvalidInputError(f, line.pointsPx, 'two or more points [x, y] along one straight edge');
      if (!(Number.isFinite(line.sigmaPx) && line.sigmaPx > 0)) throw new InvalidInputError(`${f}.sigmaPx`, line.sigmaPx, 'a clicking sigma in pixels greater than 0');
      const a = line.pointsPx[0];
      const span = Math.max(...line.pointsPx.map((p) => Math.hypot(p[0] - a[0], p[1] - a[1])));
      if (!(span >= MIN_LINE_LENGTH_PX)) throw new InvalidInputError(f, line.pointsPx, `points at least ${MIN_LINE_LENGTH_PX} px apart along the edge`);
    });
  }
  for (let i = 0; i < walls.length; i++) {
    for (let j = i + 1; j < walls.length; j++) {
      const a = walls[i].direction as Extract<FamilyDirection, { kind: 'wall' }>;
      const b = walls[j].direction as Extract<FamilyDirection, { kind: 'wall' }>;
      const d = Math.abs(((a.wallAzimuthDeg - b.wallAzimuthDeg) % 180 + 180) % 180);
      if (Math.min(d, 180 - d) < 1) {
        throw new InvalidInputError(
          walls[j].field, b.wallId, `a wall not parallel to ${a.wallId}`,
          `Walls ${a.wallId} and ${b.wallId} run the same way, so their horizontal lines share one vanishing point: give them as one family`,
        );
      }
    }
  }
  if (input.focalLengthPx !== undefined && !(Number.isFinite(input.focalLengthPx) && input.focalLengthPx > 0)) {
    throw new InvalidInputError(`${input.field}.focalLengthPx`, input.focalLengthPx, 'a focal length in pixels greater than 0');
  }
}

interface VanishingPointState {
  readonly points: readonly Homogeneous3[];
  readonly reports: readonly VanishingPointReport[];
}

/** Every family's vanishing point with its sigma and meeting test. */
function vanishingPointReports(input: CameraInput): VanishingPointState {
  const { p0, sigmas } = cameraParameters(input);
  const nominal = vanishingPointsOf(input, p0);
  const points = nominal.map((v) => v.point);
  nominal.forEach((fit, i) => {
    if (!(fit.separation > 1e-10)) {
      const fam = input.families[i];
      throw new InvalidInputError(fam.field, `${fam.lines.length} lines`, 'two or more distinct lines', `${familyName(fam)} lie (nearly) on one line, so they give no vanishing point; click edges further apart`);
    }
  });
  const frame = pictureFrame(input.widthPx, input.heightPx);
  const deg = 180 / Math.PI;
  const f = (q: readonly number[]): number[] =>
    vanishingPointsOf(input, q, points).flatMap((fit) => {
      const v = fit.point;
      return [Math.atan2(v[2], Math.hypot(v[0], v[1])) * deg, (frame.scale * v[0]) / v[2], (frame.scale * v[1]) / v[2]];
    });
  const fo = propagateFirstOrder(f, p0, sigmas, f(p0).map(() => false), p0.map(() => 'clicks'));
  const reports = nominal.map((fit, i): VanishingPointReport => {
    const fam = input.families[i];
    const elevation = fo.values[3 * i];
    const elevationSigma = fo.sigmas[3 * i];
    const atInfinity = Math.abs(elevation) <= 2 * elevationSigma;
    const pointPx = homogeneousToPixels(fit.point, frame);
    const cov = fo.covariance;
    const covariancePx = pointPx && !atInfinity ? [[cov[3 * i + 1][3 * i + 1], cov[3 * i + 1][3 * i + 2]], [cov[3 * i + 2][3 * i + 1], cov[3 * i + 2][3 * i + 2]]] : undefined;
    const pValue = fit.dof > 0 ? chiSquarePValue(fit.chiSquare, fit.dof) : null;
    const worst = Math.max(...fit.missAnglesDeg);
    const meets = pValue === null || pValue >= MEETING_P_LIMIT;
    const note =
      pValue === null
        ? `${familyName(fam)}: two lines always meet, so there is no check of the perspective here; click a third line`
        : meets
        ? `${familyName(fam)} meet in one point within the clicking precision (chi-square ${fit.chiSquare.toFixed(1)} for ${fit.dof} degrees of freedom, p = ${pValue.toPrecision(2)}; worst line off by ${worst.toFixed(2)} deg)`
        : `${familyName(fam)} do NOT meet in one point within the clicking precision (chi-square ${fit.chiSquare.toFixed(1)} for ${fit.dof} degrees of freedom, p = ${pValue.toPrecision(2)}; worst line off by ${worst.toFixed(2)} deg): ` +
          'a line is misclicked, the edges are not parallel in the scene, or the picture was not drawn from one viewpoint; the camera found from them is to be doubted';
    return {
      field: fam.field, direction: fam.direction, lineCount: fam.lines.length, homogeneous: fit.point, pointPx: atInfinity ? null : pointPx,
      ...(covariancePx ? { covariancePx } : {}),
      elevationDeg: elevation, elevationSigmaDeg: elevationSigma, atInfinity,
      chiSquare: fit.chiSquare, dof: fit.dof, pValue, missAnglesDeg: fit.missAnglesDeg, meets, note,
    };
  });
  return { points, reports };
}

/** Choose how to find focal length and principal point; refuse when the vanishing points cannot give them. */
function chooseMethod(input: CameraInput, reports: readonly VanishingPointReport[]): { method: CalibrationMethod; note: string } {
  if (input.focalLengthPx !== undefined) {
    return { method: { kind: 'given-focal-length' }, note: `focal length ${input.focalLengthPx} px as given; principal point taken at the picture's centre (assumed, not measured)` };
  }
  const fams = input.families;
  const v = fams.findIndex((f) => f.direction.kind === 'vertical');
  const walls = fams.map((_, i) => i).filter((i) => i !== v);
  const finite = (i: number): boolean => !reports[i].atInfinity;
  for (let a = 0; a < walls.length; a++) {
    for (let b = a + 1; b < walls.length; b++) {
      const [i, j] = [walls[a], walls[b]];
      if (arePerpendicular(fams[i].direction, fams[j].direction, PERPENDICULAR_TOLERANCE_DEG) && finite(v) && finite(i) && finite(j)) {
        return {
          method: { kind: 'orthocentre', families: [v, i, j] },
          note: 'focal length and principal point from three square directions (the vertical and two walls square to each other): the principal point at the orthocentre of their vanishing points (Caprile and Torre 1990)',
        };
      }
    }
  }
  const pairs: [number, number][] = [];
  for (let a = 0; a < fams.length; a++) {
    for (let b = a + 1; b < fams.length; b++) {
      if (arePerpendicular(fams[a].direction, fams[b].direction, PERPENDICULAR_TOLERANCE_DEG) && finite(a) && finite(b)) pairs.push([a, b]);
    }
  }
  if (pairs.length === 0) {
    const parallel = reports.filter((r) => r.atInfinity).map((r) => r.field);
    throw new InvalidInputError(
      parallel.length > 0 ? parallel[0] : `${input.field}.focalLengthPx`,
      parallel.length > 0 ? 'lines parallel in the picture' : undefined,
      'lines that meet at a finite vanishing point, or camera.focalLengthPx',
      parallel.length > 0
        ? `${parallel.join(' and ')}: these lines are parallel in the picture within the clicking error (their vanishing point is at infinity), and the focal length needs two square directions whose vanishing points are both finite; ` +
          'give camera.focalLengthPx, or lines along a second wall square to the first'
        : 'No two families run in square directions, so the focal length is not fixed; give camera.focalLengthPx',
    );
  }
  return {
    method: { kind: 'centre-and-pairs', pairs },
    note:
      `focal length from ${pairs.length === 1 ? 'one pair' : `${pairs.length} pairs`} of square directions (${pairs.map(([a, b]) => `${fams[a].field} with ${fams[b].field}`).join('; ')}), ` +
      "with the principal point ASSUMED at the picture's centre (fewer than three square directions with finite vanishing points; a cropped picture or a shifted lens moves it, and that error is not in the sigmas)",
  };
}

/**
 * The picture's camera from clicked lines: focal length, principal point and rotation into the site's
 * east-north-up frame, with first-order sigmas and the meeting test of each family.
 * Throws InvalidInputError naming the field for input no camera can come from.
 * @example solveCamera({ field: 'camera', widthPx: 1600, heightPx: 1200, families: [...] }).focalLengthPx // { value: 1412.3, sigma: 9.8 }
 */
export function solveCamera(input: CameraInput): CameraSolution {
  checkCameraInput(input);
  const { points, reports } = vanishingPointReports(input);
  const { method, note: methodNote } = chooseMethod(input, reports);
  const { p0, sigmas } = cameraParameters(input);
  const core = cameraFromParameters(input, method, p0, points);
  if (!(core.focalLengthPx > 0)) {
    const fields = method.kind === 'orthocentre' ? method.families.map((i) => input.families[i].field) : method.kind === 'centre-and-pairs' ? method.pairs.flat().map((i) => input.families[i].field) : [];
    throw new InvalidInputError(
      fields.join(', '), 'vanishing points', 'vanishing points of square directions, on either side of the principal point',
      'No camera sees square directions this way (the angle their vanishing points make at the principal point is not obtuse); a family is misclicked, a wall azimuth is wrong, or the walls are not square',
    );
  }
  const misfits = core.siteDirections.map((a, k) => {
    const c = Math.min(1, Math.max(-1, dot3(applyMatrix(core.rotation, a), core.directions[k])));
    return (Math.acos(c) * 180) / Math.PI;
  });
  const worst = misfits.indexOf(Math.max(...misfits));
  if (misfits[worst] > WALL_MISFIT_LIMIT_DEG) {
    const fam = input.families[worst];
    throw new InvalidInputError(
      fam.field, fam.direction.kind === 'wall' ? `lines of wall ${fam.direction.wallId} (azimuth ${fam.direction.wallAzimuthDeg})` : 'vertical lines',
      'lines whose vanishing point agrees with the stated wall azimuths',
      `Their vanishing direction is ${misfits[worst].toFixed(1)} deg from where the camera fitted to all the lines puts it; the lines belong to another wall, a wall's azimuth is wrong, or a family is misclicked`,
    );
  }
  const reference = core.rotation;
  const f = (q: readonly number[]): number[] => cameraOutputs(cameraFromParameters(input, method, q, points), reference);
  const fo = propagateFirstOrder(f, p0, sigmas, CAMERA_ANGULAR, p0.map(() => 'clicks'));
  const vs = (k: number): ValueWithSigma => ({ value: fo.values[k], sigma: fo.sigmas[k] });
  const nonlinearity = Math.max(...fo.nonlinearity.filter((x, k) => fo.sigmas[k] > 0 && Number.isFinite(x)), 0);
  const perspectiveConsistent = reports.every((r) => r.meets);
  const notes = [methodNote, ...reports.map((r) => r.note)];
  if (!perspectiveConsistent) {
    notes.push('The picture does not follow one consistent perspective: its lines do not meet as a single camera would draw them (several viewpoints, perspective by eye, or a misclicked line). Every sun direction found through this camera inherits that error, which is not in the sigmas.');
  }
  const reliable = nonlinearity <= LINEARITY_TOLERANCE;
  if (!reliable) notes.push('The first-order sigmas of the camera are NOT RELIABLE (the result bends within the clicking error, usually a vanishing point far outside the picture); use the Monte Carlo spread.');
  const att = cameraAttitude(core.rotation);
  return {
    input, method, methodNote, core,
    focalLengthPx: vs(0),
    principalPointPx: [vs(1), vs(2)],
    principalPointAssumed: method.kind !== 'orthocentre',
    rotation: core.rotation,
    rotationSigmaDeg: [fo.sigmas[3], fo.sigmas[4], fo.sigmas[5]],
    viewAzimuthDeg: { value: att.viewAzimuthDeg, sigma: fo.sigmas[6] },
    viewAltitudeDeg: vs(7),
    rollDeg: vs(8),
    horizontalFieldOfViewDeg: (2 * Math.atan(input.widthPx / 2 / core.focalLengthPx) * 180) / Math.PI,
    directionMisfitsDeg: misfits,
    vanishingPoints: reports,
    nonlinearity,
    firstOrderReliable: reliable,
    perspectiveConsistent,
    notes,
  };
}
