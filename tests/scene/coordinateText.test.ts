/**
 * Coordinates written as on maps and in gazetteers: decimal degrees, degrees-minutes-seconds,
 * hemisphere letters. Expected values by the sexagesimal rule 1 deg = 60' = 3600" (common practice).
 */
import { describe, expect, it } from 'vitest';
import { parseCoordinate } from '../../src/scene/coordinateText.js';
import { readSceneText } from '../../src/scene/readScene.js';

describe('parseCoordinate reads the forms a historian copies from a map', () => {
  const cases: [string | number, 'latitude' | 'longitude', number][] = [
    [48.2, 'latitude', 48.2],
    ['48.2', 'latitude', 48.2],
    ["48°12'N", 'latitude', 48.2],
    ['48 12 N', 'latitude', 48.2],
    [`48°12'30"N`, 'latitude', 48 + 12 / 60 + 30 / 3600],
    ['48 12 30 N', 'latitude', 48 + 12 / 60 + 30 / 3600],
    ['48 deg 12 min 30 sec N', 'latitude', 48 + 12 / 60 + 30 / 3600],
    ['N 48.2', 'latitude', 48.2],
    ['33°55′S', 'latitude', -(33 + 55 / 60)],
    ['16.4 E', 'longitude', 16.4],
    ['16.4W', 'longitude', -16.4],
    ['16.4w', 'longitude', -16.4],
    ["0°7'39\"W", 'longitude', -(7 / 60 + 39 / 3600)],
    ['-16.4', 'longitude', -16.4],
    ['180 W', 'longitude', -180],
  ];
  for (const [text, axis, expected] of cases) {
    it(`reads ${JSON.stringify(text)} as a ${axis} of ${expected.toFixed(6)} degrees`, () => {
      expect(parseCoordinate(text, axis, 'site.x')).toBeCloseTo(expected, 9);
    });
  }
});

describe('edge cases: each refusal names the field, quotes the value and says what is allowed', () => {
  const refusals: [string, 'latitude' | 'longitude', RegExp][] = [
    ['16.4 E', 'latitude', /E marks a longitude; a latitude takes N or S/],
    ['48 N', 'longitude', /N marks a latitude; a longitude takes E or W/],
    ['-48 S', 'latitude', /either a sign or the letter S, not both/],
    ["48°60'N", 'latitude', /Minutes and seconds run from 0 to 59/],
    ["48.5°12'N", 'latitude', /degrees are a whole number/],
    ['95 N', 'latitude', /That is 95 degrees/],
    ['48,2', 'latitude', /decimal point as a full stop: 48\.2\./],
    ['48:12:30', 'latitude', /Colons are not read; in decimal degrees that is 48\.208333/],
    ['NaN', 'latitude', /Only finite numbers/],
    ['Vienna', 'latitude', /expected a latitude in degrees from -90 to 90, north positive: 48\.2, or with N or S/],
  ];
  for (const [text, axis, says] of refusals) {
    it(`refuses ${JSON.stringify(text)} as a ${axis}`, () => {
      expect(() => parseCoordinate(text, axis, '--lat')).toThrow(new RegExp(`^--lat: ${JSON.stringify(text).replace(/[.*+?^${}()|[\]\\]/g, '\\$&')} is not allowed; expected `));
      expect(() => parseCoordinate(text, axis, '--lat')).toThrow(says);
    });
  }
  it('refuses a number out of range and a missing value', () => {
    expect(() => parseCoordinate(181, 'longitude', 'site.longitudeDeg')).toThrow(/^site\.longitudeDeg: 181 is not allowed; expected a longitude in degrees from -180 to 180/);
    expect(() => parseCoordinate(null, 'latitude', 'site.latitudeDeg')).toThrow(/The value is missing/);
  });
});

describe('the scene reader takes the same forms for the site', () => {
  const scene = (site: string): string =>
    `heliochron: 1\ntitle: Velmar square\nsite:\n${site}\ncalendar: austria\nwindow: { fromYear: 1760, toYear: 1790 }\nobservations:\n  - { id: up, kind: sun-up }\n`;
  it('reads degrees-minutes-seconds and hemisphere letters written unquoted in YAML', () => {
    const s = readSceneText(scene(`  latitudeDeg: 48°12'30"N\n  longitudeDeg: 16 24 W`), 'velmar.yaml');
    expect(s.site.latitudeDeg).toBeCloseTo(48 + 12 / 60 + 30 / 3600, 9);
    expect(s.site.longitudeDeg).toBeCloseTo(-16.4, 9);
  });
  it('says what is missing when the longitude is left out, with the line', () => {
    expect(() => readSceneText(scene('  latitudeDeg: 48.2'), 'velmar.yaml')).toThrow(
      /^site\.longitudeDeg is missing; expected a longitude in degrees from -180 to 180, east positive.* The site needs "longitudeDeg"\. See line 4 of velmar\.yaml\.$/,
    );
  });
});
