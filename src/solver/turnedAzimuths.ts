/**
 * When nothing fits: would every stated azimuth, turned by 180 deg, fit? Azimuths in heliochron are
 * measured clockwise from true north (docs/conventions.md); an azimuth measured from south (a common
 * habit in some older solar tables, and an easy slip with a compass) is off by exactly 180 deg. The
 * check turns the walls' outward normals, the pole shadows' directions and the sun directions by
 * 180 deg together and solves again.
 */
import type { Observation, Scene } from '../scene/types.js';
import { normalizeDeg360 } from '../math/angles.js';

const turn = (deg: number): number => normalizeDeg360(deg + 180);

function turnedObservation(o: Observation): Observation {
  if (o.kind === 'pole-shadow' && o.shadowAzimuthDeg !== undefined) return { ...o, shadowAzimuthDeg: turn(o.shadowAzimuthDeg) };
  if (o.kind === 'sun-direction') return { ...o, azimuthDeg: turn(o.azimuthDeg) };
  return o;
}

/**
 * The scene with every stated azimuth turned by 180 deg, or null when it states none.
 * @example turnedAzimuthScene(scene)?.walls[0].azimuthDeg // 315 for a wall stated at 135
 */
export function turnedAzimuthScene(scene: Scene): Scene | null {
  const hasAzimuth =
    scene.walls.length > 0 || scene.observations.some((o) => (o.kind === 'pole-shadow' && o.shadowAzimuthDeg !== undefined) || o.kind === 'sun-direction');
  if (!hasAzimuth) return null;
  return {
    ...scene,
    walls: scene.walls.map((w) => ({ ...w, azimuthDeg: turn(w.azimuthDeg) })),
    observations: scene.observations.map(turnedObservation),
  };
}

/** The words of the hint, given the best fit with the azimuths turned. */
export function turnedAzimuthWords(bestText: string): string {
  return (
    `Every stated azimuth turned by 180 deg would fit (best ${bestText}). ` +
    'Azimuths are measured clockwise from true north (north 0, east 90, south 180, west 270); an azimuth measured from south needs 180 added.'
  );
}
