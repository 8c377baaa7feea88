import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
// @ts-expect-error: a plain ES module script without type declarations
import { ENGINE_SOURCE, VSOP_EARTH_MODULE, vsopEarthFromEngineSource, vsopEarthModuleText } from '../../scripts/build-data-modules.mjs';
import { VSOP_EARTH_LATITUDE, VSOP_EARTH_LONGITUDE, VSOP_EARTH_RADIUS } from '../../src/ephemeris/vsopEarth.generated.js';

// Source of truth: the installed astronomy-engine's own table (its esm/astronomy.js, `vsop.Earth`).
const engineText = readFileSync(ENGINE_SOURCE, 'utf8');
const engineVersion = (JSON.parse(readFileSync('node_modules/astronomy-engine/package.json', 'utf8')) as { version: string }).version;
const series = vsopEarthFromEngineSource(engineText) as number[][][][];

describe('the VSOP87 Earth table copied from astronomy-engine (src/ephemeris/vsopEarth.generated.ts)', () => {
  it('is the installed package\'s table, number for number and term for term', () => {
    [VSOP_EARTH_LONGITUDE, VSOP_EARTH_LATITUDE, VSOP_EARTH_RADIUS].forEach((copy, i) => {
      expect(copy.termCounts).toEqual(series[i]!.map((s) => s.length));
      expect(Array.from(copy.terms)).toEqual(series[i]!.flat(2));
    });
  });
  it('is the text the script writes from the installed package (run node scripts/build-data-modules.mjs --vsop-earth after an upgrade)', () => {
    expect(readFileSync(VSOP_EARTH_MODULE, 'utf8')).toBe(vsopEarthModuleText(series, engineVersion));
  });
  it('holds the sizes of the truncated series (common practice: a check that the extraction read the whole entry)', () => {
    // astronomy-engine 2.1.19: longitude 28 + 3 + 1 terms, latitude 0 + 2, radius 14 + 2 + 1.
    expect(VSOP_EARTH_LONGITUDE.termCounts).toEqual([28, 3, 1]);
    expect(VSOP_EARTH_LATITUDE.termCounts).toEqual([0, 2]);
    expect(VSOP_EARTH_RADIUS.termCounts).toEqual([14, 2, 1]);
  });
});
