/**
 * A wall's outward-normal azimuth from two points of its foot on a map and the
 * side it faces, corrected from map north to true north.
 *
 * The bearing of the line from -> to, clockwise from map north, is
 * atan2(dEast, dNorth) (plane surveying, common practice). Walking from -> to,
 * the left-hand side lies at bearing - 90 deg and the right-hand side at
 * bearing + 90 deg. The true azimuth adds the scene's mapNorthCorrectionDeg
 * (docs/conventions.md).
 */
import { InvalidInputError } from '../errors.js';
import { atan2Deg, normalizeDeg360 } from '../math/angles.js';
import type { Side } from './types.js';

/** Shortest wall line accepted, metres: shorter ones give no usable bearing. */
export const MIN_MAP_LINE_M = 0.1;

export interface MapWallLine {
  /** Map point [eastM, northM] where the walk along the wall foot starts. */
  readonly fromM: readonly [number, number];
  readonly toM: readonly [number, number];
  /** The side the wall faces (its outside), seen walking from -> to. */
  readonly outward: Side;
}

/**
 * The true azimuth of the outward normal and a sentence saying how it was obtained.
 * @param path the path of the mapPoints block in the file, for messages
 * @example wallAzimuthFromMap({ fromM: [0, 0], toM: [10, 0], outward: 'right' }, 0, 'walls[0].mapPoints')
 *   // { azimuthDeg: 180, source: 'from two map points ...' }  (a wall line running east, facing south)
 */
export function wallAzimuthFromMap(
  line: MapWallLine,
  mapNorthCorrectionDeg: number,
  path: string,
): { azimuthDeg: number; source: string } {
  const dEast = line.toM[0] - line.fromM[0];
  const dNorth = line.toM[1] - line.fromM[1];
  const lengthM = Math.hypot(dEast, dNorth);
  if (!(lengthM >= MIN_MAP_LINE_M)) {
    throw new InvalidInputError(
      `${path}.toM`,
      line.toM,
      `a point at least ${MIN_MAP_LINE_M} m from fromM ${JSON.stringify(line.fromM)}`,
      'Two points of the wall foot are needed to give its direction.',
    );
  }
  const lineBearingDeg = normalizeDeg360(atan2Deg(dEast, dNorth));
  const mapNormalDeg = normalizeDeg360(lineBearingDeg + (line.outward === 'left' ? -90 : 90));
  const azimuthDeg = normalizeDeg360(mapNormalDeg + mapNorthCorrectionDeg);
  const correction =
    mapNorthCorrectionDeg === 0
      ? 'map north taken as true north'
      : `map north correction ${mapNorthCorrectionDeg > 0 ? '+' : ''}${mapNorthCorrectionDeg} deg`;
  const source =
    `from two map points (${line.fromM.join(', ')}) -> (${line.toM.join(', ')}) m, facing ${line.outward}: ` +
    `wall line bearing ${lineBearingDeg.toFixed(2)} deg, outward normal ${mapNormalDeg.toFixed(2)} deg on the map, ${correction}`;
  return { azimuthDeg, source };
}
