/**
 * The normalised DLT (Hartley and Zisserman, Multiple View Geometry, 2nd ed.,
 * 2003, Algorithm 4.2) and the checks on clicked planes.
 */
import { describe, expect, test } from 'vitest';
import { expectClose } from '../helpers/expectClose.js';
import { InvalidInputError } from '../../src/errors.js';
import { createRandom } from '../../src/math/random.js';
import {
  applyHomography,
  composeHomographies,
  fitHomography,
  fitHomographyDlt,
  invertHomography,
  normalisingSimilarity,
  type Homography,
  type Point2,
} from '../../src/image/homography.js';
import { rectifyPlane } from '../../src/image/planeInImage.js';
import type { ImageInfo, PlaneInImage } from '../../src/scene/types.js';

/** An exact projective map built by hand (a general 3 x 3 with non-zero last row; invented, exact by construction). */
const H_TRUE: Homography = [120, -8, 300, 6, -110, 700, 0.004, -0.01, 1];
const PLANE: Point2[] = [[0, 3], [2, 3], [2, 0], [0, 0], [1, 1.5], [0.5, 2.2], [1.7, 0.4]];

function expectSameHomography(a: Homography, b: Homography, tol: number): void {
  const na = Math.hypot(...a) * Math.sign(a[8]);
  const nb = Math.hypot(...b) * Math.sign(b[8]);
  a.forEach((v, i) => expectClose(v / na, b[i] / nb, tol, `h[${i}]`));
}

describe('normalised DLT', () => {
  test('recovers an exact projective map from 4 points and from 7 points (H&Z sec. 4.1: 4 points in general position fix H)', () => {
    for (const count of [4, 7]) {
      const src = PLANE.slice(0, count);
      const dst = src.map((p) => applyHomography(H_TRUE, p));
      const fit = fitHomography(src, dst);
      expectSameHomography(fit.matrix, H_TRUE, 1e-10);
      expect(fit.rms).toBeLessThan(1e-8);
      expect(fit.exactlyDetermined).toBe(count === 4);
    }
  });

  test('applying the inverse undoes the map (round trip, H&Z sec. 2.3)', () => {
    const inv = invertHomography(H_TRUE);
    for (const p of PLANE) {
      const back = applyHomography(inv, applyHomography(H_TRUE, p));
      expectClose(back[0], p[0], 1e-12, 'u');
      expectClose(back[1], p[1], 1e-12, 'v');
    }
    expectSameHomography(composeHomographies(inv, H_TRUE), [1, 0, 0, 0, 1, 0, 0, 0, 1], 1e-14);
  });

  test('the normalising similarity puts the centroid at the origin and the mean distance at sqrt(2) (H&Z Algorithm 4.2 (i))', () => {
    const pts: Point2[] = [[100, 50], [900, 80], [870, 700], [120, 650], [500, 400]];
    const t = normalisingSimilarity(pts);
    const mapped = pts.map((p) => applyHomography(t, p));
    expectClose(mapped.reduce((s, p) => s + p[0], 0) / pts.length, 0, 1e-12, 'centroid x');
    expectClose(mapped.reduce((s, p) => s + p[1], 0) / pts.length, 0, 1e-12, 'centroid y');
    expectClose(mapped.reduce((s, p) => s + Math.hypot(...p), 0) / pts.length, Math.SQRT2, 1e-12, 'mean distance');
  });

  test('the least-squares result is invariant to similarity transforms of either point set (H&Z sec. 4.4.4)', () => {
    // H&Z sec. 4.4.4: with normalisation, DLT on (T X, T' x) gives T' H T^-1, whatever similarities T, T'.
    const rng = createRandom(5);
    const src = PLANE;
    const dst = src.map((p) => {
      const q = applyHomography(H_TRUE, p);
      return [q[0] + 3 * rng.normal(), q[1] + 3 * rng.normal()] as Point2; // noisy: least squares, not exact
    });
    const h = fitHomographyDlt(src, dst).matrix;
    const similarity = (s: number, angleRad: number, tx: number, ty: number): Homography => [
      s * Math.cos(angleRad), -s * Math.sin(angleRad), tx, s * Math.sin(angleRad), s * Math.cos(angleRad), ty, 0, 0, 1,
    ];
    const t = similarity(3.7, 0.9, -12, 40);
    const tPrime = similarity(0.02, -2.1, 5000, -300);
    const h2 = fitHomographyDlt(src.map((p) => applyHomography(t, p)), dst.map((p) => applyHomography(tPrime, p))).matrix;
    expectSameHomography(h2, composeHomographies(tPrime, composeHomographies(h, invertHomography(t))), 1e-9);
    expect(fitHomography(src, dst).rms).toBeGreaterThan(0.5); // noise shows in the residual with more than 4 points
  });
});

const IMAGE: ImageInfo = { widthPx: 1000, heightPx: 800, mirrored: false, pixelSigmaPx: 1 };
const GOOD: PlaneInImage = { pointsPx: [[200, 150], [700, 180], [680, 600], [230, 620]], widthM: 2, heightM: 1.8 };

function expectInvalid(make: () => unknown, field: string, fragment?: string): void {
  try {
    make();
  } catch (e) {
    expect(e).toBeInstanceOf(InvalidInputError);
    expect((e as InvalidInputError).field).toBe(field);
    if (fragment) expect((e as Error).message).toContain(fragment);
    return;
  }
  throw new Error(`expected InvalidInputError for ${field}`);
}

describe('plane definitions', () => {
  test('a rectangle of known size maps its corners to (0, h), (w, h), (w, 0), (0, 0) (docs/conventions.md: u right, v up)', () => {
    const plane = rectifyPlane(GOOD, IMAGE, 'wall', 'walls[0].imagePlane');
    expect(plane.planePoints).toEqual([[0, 1.8], [2, 1.8], [2, 0], [0, 0]]);
    expect(plane.fit.rms).toBeLessThan(1e-9); // 4 points: exact by construction
    const c = applyHomography(plane.imageToPlane, [230, 620]);
    expectClose(c[0], 0, 1e-9, 'u of bottom-left');
    expectClose(c[1], 0, 1e-9, 'v of bottom-left');
  });

  test('a mirrored print gives the same plane after the flip x\' = widthPx - x (docs/conventions.md)', () => {
    const flipped: PlaneInImage = { ...GOOD, pointsPx: GOOD.pointsPx.map(([x, y]) => [IMAGE.widthPx - x, y]) };
    const a = rectifyPlane(GOOD, IMAGE, 'wall', 'w');
    const b = rectifyPlane(flipped, { ...IMAGE, mirrored: true }, 'wall', 'w');
    expectSameHomography(a.fit.matrix, b.fit.matrix, 1e-12);
  });

  test('a ground rectangle runs its first edge along firstEdgeAzimuthDeg and the next 90 deg clockwise', () => {
    const ground = rectifyPlane({ pointsPx: [[300, 500], [700, 500], [900, 750], [100, 750]], widthM: 4, heightM: 3, firstEdgeAzimuthDeg: 90 }, IMAGE, 'ground', 'groundPlane');
    // first edge due east (azimuth 90), second due south (azimuth 180): east = sin, north = cos (common practice)
    const pts = ground.planePoints;
    expectClose(pts[1][0], 4, 1e-12, 'second corner east');
    expectClose(pts[1][1], 0, 1e-12, 'second corner north');
    expectClose(pts[2][1], -3, 1e-12, 'third corner north');
  });

  test('an aspect-only rectangle is not metric', () => {
    const plane = rectifyPlane({ pointsPx: GOOD.pointsPx, aspect: 1.5 }, IMAGE, 'wall', 'w');
    expect(plane.metric).toBe(false);
    expect(plane.planePoints[1]).toEqual([1.5, 1]);
  });
});

describe('degenerate clicks are refused with the field path', () => {
  const f = 'walls[0].imagePlane';
  test('three collinear corners among four', () => {
    expectInvalid(() => rectifyPlane({ ...GOOD, pointsPx: [[200, 150], [700, 150], [450, 150.5], [230, 620]] }, IMAGE, 'wall', f), `${f}.pointsPx[1]`, 'on one line');
  });
  test('a rectangle clicked with crossing edges', () => {
    expectInvalid(() => rectifyPlane({ ...GOOD, pointsPx: [[200, 150], [680, 600], [700, 180], [230, 620]] }, IMAGE, 'wall', f), `${f}.pointsPx`, 'cross');
  });
  test('corners going round the other way (reversed print not flagged)', () => {
    expectInvalid(() => rectifyPlane({ ...GOOD, pointsPx: [[700, 180], [200, 150], [230, 620], [680, 600]] }, IMAGE, 'wall', f), `${f}.pointsPx`, 'mirrored: true');
  });
  test('a point outside the picture, quoted', () => {
    expectInvalid(() => rectifyPlane({ ...GOOD, pointsPx: [[200, 150], [700, 180], [1680, 600], [230, 620]] }, IMAGE, 'wall', f), `${f}.pointsPx[2]`, '[1680,600]');
  });
  test('duplicate points', () => {
    expectInvalid(() => rectifyPlane({ ...GOOD, pointsPx: [[200, 150], [700, 180], [700.3, 180.2], [230, 620]] }, IMAGE, 'wall', f), `${f}.pointsPx[2]`, 'at least 1 px');
  });
  test('a near-singular fit (every point on one line) by the condition number', () => {
    const line: PlaneInImage = {
      pointsPx: [[100, 100], [200, 200], [300, 300], [400, 400], [500, 500]],
      planePointsM: [[0, 0], [1, 1], [2, 2], [3, 3], [4, 4]],
    };
    expectInvalid(() => rectifyPlane(line, IMAGE, 'wall', f), `${f}.pointsPx`, 'near-singular');
  });
  test('a ground rectangle without firstEdgeAzimuthDeg, and a wall with one', () => {
    expectInvalid(() => rectifyPlane(GOOD, IMAGE, 'ground', 'groundPlane'), 'groundPlane.firstEdgeAzimuthDeg');
    expectInvalid(() => rectifyPlane({ ...GOOD, firstEdgeAzimuthDeg: 10 }, IMAGE, 'wall', f), `${f}.firstEdgeAzimuthDeg`);
  });
  test('both a size and an aspect', () => {
    expectInvalid(() => rectifyPlane({ ...GOOD, aspect: 1 }, IMAGE, 'wall', f), f, 'exactly one of');
  });
});
