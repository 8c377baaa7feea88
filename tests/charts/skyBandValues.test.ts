import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readSceneFile } from '../../src/cli/sceneFile.js';
import { readSceneText } from '../../src/scene/readScene.js';
import { resolvePixelObservations } from '../../src/image/resolvePixels.js';
import { WALL_SHADOW_KINDS, buildEvidenceModel, termEvidence, wallAzimuthOf, type EvidenceModel } from '../../src/solver/evidenceModel.js';
import { nuisancesOfCandidate } from '../../src/solver/chiSquareGrid.js';
import { exactBandValue, skyBandValues } from '../../src/charts/skyBandValues.js';
import { cellRunsByClass, isolineSegments } from '../../src/charts/contour.js';

const EXAMPLES = [
  'examples/fischertor-crescent.yaml',
  'examples/kornmarkt-moonlight.yaml',
  'examples/kornplatz-figures/kornplatz-figures-variant.yaml',
  'examples/kornplatz-figures/kornplatz-figures.yaml',
  'examples/marktgasse-print.yaml',
  'examples/salt-house-sketch.yaml',
  'examples/tanners-hall-photo/tanners-hall-photo.yaml',
  'examples/upper-gate-drawing.yaml',
];

function spread(n: number, lo: number, hi: number): number[] {
  return Array.from({ length: n }, (_, i) => lo + ((hi - lo) * i) / (n - 1));
}

/**
 * Every band of a model drawn from the quick values and from the exact ones (every cell by
 * exactBandValue, as the sky chart valued it before): the same cells within 1 sigma, the same outline
 * (contour.ts), and the exact number at every cell within 1 sigma or next to one.
 */
function compareBands(model: EvidenceModel, azimuths: readonly number[], altitudes: readonly number[]): number {
  const nuisances = nuisancesOfCandidate(model, undefined); // the priors
  let inside = 0;
  for (const term of model.shadows) {
    const evidence = termEvidence(model, term, nuisances);
    const wallAz = wallAzimuthOf(model, term.wallId, nuisances);
    const onLit = WALL_SHADOW_KINDS.has(evidence.kind);
    const quick = skyBandValues(evidence, wallAz, onLit, azimuths, altitudes, term.count);
    const exact = altitudes.map((alt) => azimuths.map((az) => exactBandValue(evidence, az, alt, wallAz, onLit)));
    const within = (v: readonly (readonly number[])[]) => cellRunsByClass(altitudes.length, azimuths.length, (j, i) => (v[j][i] <= 1 ? 0 : -1));
    expect(within(quick)).toEqual(within(exact));
    expect(isolineSegments({ xs: azimuths, ys: altitudes, values: quick }, 1)).toEqual(isolineSegments({ xs: azimuths, ys: altitudes, values: exact }, 1));
    const differing: string[] = []; // collected, so that a grid of thousands of cells costs one expect
    exact.forEach((row, j) =>
      row.forEach((v, i) => {
        const q = quick[j][i];
        if (q <= 1 !== v <= 1) differing.push(`${term.observationId} (${j}, ${i}): ${q} and ${v} on either side of 1`);
        let near = false;
        for (let b = Math.max(0, j - 1); b <= Math.min(altitudes.length - 1, j + 1); b += 1) {
          for (let a = Math.max(0, i - 1); a <= Math.min(azimuths.length - 1, i + 1); a += 1) if (exact[b][a] <= 1) near = true;
        }
        if (near && !Object.is(q, v)) differing.push(`${term.observationId} (${j}, ${i}): ${q} is not ${v} next to the band`); // to the last bit
        if (v <= 1) inside += 1;
      }),
    );
    expect(differing).toEqual([]);
  }
  return inside;
}

describe('sky band values (skyBandValues.ts): quick where it cannot show, exact where it does', () => {
  it.each(EXAMPLES)('draws every band of %s as the exact values do', (path) => {
    const model = buildEvidenceModel(resolvePixelObservations(readSceneFile(path)).scene);
    // The sky chart's grid over the whole sky: 241 azimuths and 121 altitudes (skyChartData.ts defaults).
    const inside = compareBands(model, spread(241, 0, 360), spread(121, 0, 90));
    expect(inside).toBeGreaterThan(0);
  }, 60_000);

  it('draws random bands of every kind of shadow as the exact values do (property test)', () => {
    const arb = fc.record({
      wallDeg: fc.integer({ min: 0, max: 359 }),
      slopeDeg: fc.integer({ min: 1, max: 89 }),
      right: fc.boolean(),
      depthRatio: fc.double({ min: 0.05, max: 3, noNaN: true }),
      widthRatio: fc.double({ min: 0.05, max: 3, noNaN: true }),
      poleDeg: fc.integer({ min: 0, max: 359 }),
      lengthRatio: fc.double({ min: 0.2, max: 5, noNaN: true }),
      sigma: fc.double({ min: 0.01, max: 0.5, noNaN: true }),
      sunAz: fc.integer({ min: 0, max: 359 }),
      sunAlt: fc.integer({ min: 1, max: 89 }),
      columns: fc.integer({ min: 20, max: 90 }),
      rows: fc.integer({ min: 10, max: 45 }),
    });
    fc.assert(
      fc.property(arb, (s) => {
        const scene = readSceneText(
          [
            'heliochron: 1',
            'title: Random bands (invented)',
            'site: { latitudeDeg: 47.62, longitudeDeg: 9.35, elevationM: 410 }',
            'calendar: gregorian',
            'yearStart: jan1',
            'window: { fromYear: 1700, toYear: 1701 }',
            'walls:',
            `  - { id: a, azimuthDeg: ${s.wallDeg}, azimuthSigmaDeg: 1 }`,
            'observations:',
            `  - { id: rod, kind: rod-shadow, wall: a, slopeDeg: ${s.slopeDeg}, side: ${s.right ? 'right' : 'left'}, sigmaDeg: ${1 + 10 * s.sigma} }`,
            `  - { id: cornice, kind: overhang-shadow, wall: a, depthRatio: ${s.depthRatio}, sigma: ${s.sigma} }`,
            `  - { id: pier, kind: fin-shadow, wall: a, widthRatio: ${s.widthRatio}, side: ${s.right ? 'left' : 'right'}, sigma: ${s.sigma} }`,
            `  - { id: post, kind: pole-shadow, shadowAzimuthDeg: ${s.poleDeg}, shadowAzimuthSigmaDeg: ${1 + 10 * s.sigma}, lengthRatio: ${s.lengthRatio}, lengthRatioSigma: ${s.sigma} }`,
            `  - { id: sun, kind: sun-direction, azimuthDeg: ${s.sunAz}, azimuthSigmaDeg: 3, altitudeDeg: ${s.sunAlt}, altitudeSigmaDeg: 3 }`,
          ].join('\n'),
          'random.yaml',
        );
        const model = buildEvidenceModel(scene);
        compareBands(model, spread(s.columns, 0, 360), spread(s.rows, 0, 90));
      }),
      { numRuns: 60 },
    );
  }, 120_000);
});
