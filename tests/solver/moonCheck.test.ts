/**
 * checkProposal with the moon's evidence: a range or a season of years is judged with the moon fitted at
 * each year's own instants, so years the moon rules out are found inconsistent even where the sun alone
 * fits them. Synthetic truth from the forward models (src/ephemeris/sunPosition.ts, moonPosition.ts,
 * src/geometry/): the light and the moon of 3 May 1790, 08:00 local mean time at Velmar (fictional town).
 * The near-repeats of the moon's phase are those of Meeus, Astronomical Algorithms, 2nd ed. 1998, ch. 49
 * (235 lunations in 19 years, 99 in 8).
 */
import { describe, expect, it } from 'vitest';
import { checkProposal } from '../../src/solver/checkDate.js';
import { civilDateToJd } from '../../src/calendar/regions.js';
import { sunPosition } from '../../src/ephemeris/sunPosition.js';
import { moonPosition } from '../../src/ephemeris/moonPosition.js';
import { predictRodShadow } from '../../src/geometry/wallShadows.js';
import { predictPoleShadow } from '../../src/geometry/groundShadows.js';
import type { Scene } from '../../src/scene/types.js';
import { baseScene, VELMAR } from './syntheticScene.js';

const day = civilDateToJd({ kind: 'gregorian' }, { year: 1790, month: 5, day: 3 });
const truth = day + (480 - 4 * VELMAR.longitudeDeg) / 1440;
const sun = sunPosition(truth, VELMAR);
const moon = moonPosition(truth, VELMAR);
const rod = predictRodShadow(sun, 130);
const pole = predictPoleShadow(sun);
const shadows = [
  { id: 'bracket', kind: 'rod-shadow' as const, wallId: 'tanners-hall', slopeDeg: rod.slopeDeg, side: rod.side!, sigmaDeg: 0.5 },
  { id: 'well-post', kind: 'pole-shadow' as const, shadowAzimuthDeg: pole.shadowAzimuthDeg, shadowAzimuthSigmaDeg: 1, lengthRatio: pole.lengthRatio, lengthRatioSigma: 0.03 },
];
const walls = [{ id: 'tanners-hall', azimuthDeg: 130, azimuthSigmaDeg: 0, azimuthSource: 'stated' }];
const withMoon: Scene = baseScene([
  ...shadows,
  { id: 'moon', kind: 'moon-direction', azimuthDeg: moon.azimuthDeg, azimuthSigmaDeg: 1, altitudeDeg: moon.altitudeDeg, altitudeSigmaDeg: 1 },
  { id: 'phase', kind: 'moon-phase', illuminatedFraction: moon.illuminatedFraction, sigma: 0.05 },
], walls, 1786, 1794);

describe('check with the moon', () => {
  it('finds a range of years the moon rules out inconsistent, naming the years', () => {
    const r = checkProposal(withMoon, { kind: 'range', from: { year: 1791, month: 1, day: 1 }, to: { year: 1793, month: 12, day: 31 } });
    expect(r.verdict).toBe('inconsistent');
    expect(r.verdictText).toMatch(/every year of the proposal the moon rules out: 1791 \(Delta chi-square \d+\.\d\), 1792 \(Delta chi-square \d+\.\d\), 1793 \(Delta chi-square \d+\.\d\)/);
    expect(r.verdictText).toMatch(/best fit anywhere in the window: 3 May 1790/);
  });
  it('finds a season over years the moon rules out inconsistent, and the same season with the true year consistent', () => {
    const out = checkProposal(withMoon, { kind: 'season', months: [4, 5, 6], fromYear: 1786, toYear: 1789 });
    expect(out.verdict).toBe('inconsistent');
    expect(out.verdictText).toMatch(/every year of the proposal the moon rules out: 1786 .*1787 .*1788 .*1789 \(Delta chi-square/);
    const within = checkProposal(withMoon, { kind: 'season', months: [4, 5, 6], fromYear: 1789, toYear: 1791 });
    expect(within.verdict).toBe('consistent');
    expect(within.best!.civilDate.year).toBe(1790);
  });
  it('finds the same range consistent on the sun alone (the shadows repeat every year)', () => {
    const r = checkProposal(baseScene(shadows, walls, 1786, 1794), { kind: 'range', from: { year: 1791, month: 1, day: 1 }, to: { year: 1793, month: 12, day: 31 } });
    expect(r.verdict).toBe('consistent');
  });
});
