import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { readSceneText } from '../../src/scene/readScene.js';
import { expectClose } from '../helpers/expectClose.js';
import { parse } from 'yaml';
import { minimalScene } from './sceneSamples.js';

const velmarYaml = readFileSync(new URL('./scenes/velmar-marktgasse.yaml', import.meta.url), 'utf8');

describe('readSceneText reads the Velmar example', () => {
  const scene = readSceneText(velmarYaml, 'velmar-marktgasse.yaml');

  it('keeps the stated values with their units', () => {
    expect(scene.formatVersion).toBe(1);
    expect(scene.title).toBe('Marktgasse view, anonymous print');
    expect(scene.site).toEqual({ latitudeDeg: 47.62, longitudeDeg: 9.35, elevationM: 410, latitudeSigmaDeg: 0.001, longitudeSigmaDeg: 0 });
    expect(scene.calendar).toEqual({ kind: 'switch', lastJulian: { year: 1700, month: 2, day: 18 }, firstGregorian: { year: 1700, month: 3, day: 1 } });
    expect(scene.window).toEqual({ fromYear: 1640, toYear: 1690, notBefore: { year: 1652, month: 3, day: 1 }, notAfter: { year: 1689, month: 12, day: 31 }, months: [5, 6, 7, 8, 9] });
    expect(scene.air).toEqual({ pressureHPa: 960, temperatureC: 15 });
    expect(scene.image).toEqual({ widthPx: 2400, heightPx: 1800, file: 'marktgasse.jpg', mirrored: false, pixelSigmaPx: 1.5 });
    expect(scene.seed).toBe(7);
    expect(scene.observations.map((o) => o.kind)).toEqual(['rod-shadow', 'rod-shadow', 'overhang-shadow', 'fin-shadow', 'pole-shadow', 'wall-lit', 'clock']);
  });

  it('turns a wall given by two map points into a true azimuth of its outward normal', () => {
    // Plane surveying (common practice): the line (0,0) -> (12.3,-1.1) has bearing atan2(12.3, -1.1) = 95.11 deg
    // from map north; its right-hand side faces 95.11 + 90 = 185.11 deg; plus the 1.5 deg map north correction.
    const wall = scene.walls[1];
    expectClose(wall.azimuthDeg, 90 + (Math.atan2(12.3, -1.1) * 180) / Math.PI + 1.5, 1e-9, 'chapel-south azimuth');
    expectClose(wall.azimuthDeg, 186.61, 0.01, 'chapel-south azimuth, rounded');
    expect(wall.azimuthSource).toMatch(/two map points.*facing right.*map north correction \+1\.5 deg/);
    expect(wall.note).toBe('Measured on the 1820 town plan.');
    expect(scene.walls[0].azimuthSource).toBe('stated, true north');
  });

  it('reads a clock reading "7:40" as 460 minutes and keeps its dial and what it kept', () => {
    const clock = scene.observations[6];
    expect(clock).toEqual({ id: 'town-clock', kind: 'clock', readingMinutes: 460, precisionMinutes: 5, hourHandTrusted: true, dialHours: 12, kept: { kind: 'unknown' } });
  });

  it('keeps pixel forms as given (no flipping, no defaults filled in)', () => {
    expect(scene.observations[1]).toEqual({ id: 'sign-rod', kind: 'rod-shadow', wallId: 'tanners-hall-front', pixels: { fromPx: [600, 700], toPx: [520, 780] } });
    expect(scene.observations[4]).toEqual({ id: 'well-post', kind: 'pole-shadow', pixels: { fromPx: [1200, 1600], toPx: [1300, 1650], heightM: 2.1, heightSigmaM: 0.1 } });
    expect(scene.groundPlane?.firstEdgeAzimuthDeg).toBe(96);
    expect(scene.walls[0].imagePlane?.widthM).toBe(9.5);
  });

  it('reads the same scene written as JSON to the same model', () => {
    const asJson = JSON.stringify(readYamlAsData(velmarYaml), null, 2);
    expect(readSceneText(asJson, 'velmar.json')).toEqual(scene);
  });
});

function readYamlAsData(text: string): unknown {
  return parse(text);
}

describe('defaults', () => {
  it('fills in only the stated defaults: elevation 0, site sigmas 0, yearStart jan1, map north 0, seed 1, no air', () => {
    const scene = readSceneText(JSON.stringify(minimalScene()), 'minimal.json');
    expect(scene.site).toEqual({ latitudeDeg: 47.62, longitudeDeg: 9.35, elevationM: 0, latitudeSigmaDeg: 0, longitudeSigmaDeg: 0 });
    expect(scene.yearStart).toBe('jan1');
    expect(scene.mapNorthCorrectionDeg).toBe(0);
    expect(scene.seed).toBe(1);
    expect(scene.air).toBeUndefined();
    expect(scene.image).toBeUndefined();
  });

  it('takes the year start of the region when the table names one, and asks when it changes within the window', () => {
    // data/calendar-reforms.json: Florence counted from 25 March (forward) until 1749.
    const s = { ...minimalScene(), calendar: 'florence', window: { fromYear: 1600, toYear: 1700, notBefore: '1650-02-10' } };
    const scene = readSceneText(JSON.stringify(s), 'florence.json');
    expect(scene.yearStart).toBe('mar25-forward');
    // 10 February 1650 in the Florentine style is 10 February 1651 in January years.
    expect(scene.window.notBefore).toEqual({ year: 1651, month: 2, day: 10 });
    const across = { ...s, window: { fromYear: 1740, toYear: 1760 } };
    expect(() => readSceneText(JSON.stringify(across), 'florence.json')).toThrow(/yearStart is missing; expected a stated yearStart.*"mar25-forward" style in 1740 and in the "jan1" style in 1760/);
  });

  it('reads a dual year as the January year whatever the style', () => {
    const s = { ...minimalScene(), calendar: 'julian', yearStart: 'mar25-forward', window: { fromYear: 1640, toYear: 1690, notAfter: '1650/1-02-10' } };
    expect(readSceneText(JSON.stringify(s), 'dual.json').window.notAfter).toEqual({ year: 1651, month: 2, day: 10 });
  });

  it('reads a wall given against map north with the correction', () => {
    const s = { ...minimalScene(), mapNorthCorrectionDeg: -2, walls: [{ id: 'tanners-hall-front', mapAzimuthDeg: 1, azimuthSigmaDeg: 1 }] };
    const wall = readSceneText(JSON.stringify(s), 'map.json').walls[0];
    expect(wall.azimuthDeg).toBe(359);
    expect(wall.azimuthSource).toMatch(/map north/);
  });
});
