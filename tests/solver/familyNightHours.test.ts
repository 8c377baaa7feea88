/**
 * A family's span of hours when its members lie on both sides of midnight (a view lit by a full
 * moon near its transit): the span is read across midnight ("18:06-05:15 (across midnight)"), never
 * as the whole day "00:30-23:56", which would tell a reader that any hour fits. The members come
 * from the solver (a moonlit pole shadow and a full moon over four years at Velmar's latitude);
 * that a full moon transits near local midnight is common practice (Meeus, Astronomical
 * Algorithms, 2nd ed. 1998, ch. 49: full moon at elongation 180 deg, opposite the sun).
 */
import { describe, expect, it } from 'vitest';
import { solveDates } from '../../src/solver/solveDates.js';
import { baseScene } from './syntheticScene.js';

describe('the hours of a family across midnight', () => {
  it('reads the hours of a night across midnight and holds every member inside the span', () => {
    const scene = baseScene(
      [
        { id: 'well-post', kind: 'pole-shadow', light: 'moon', shadowAzimuthDeg: 0, shadowAzimuthSigmaDeg: 3, lengthRatio: 0.8, lengthRatioSigma: 0.06 },
        { id: 'full', kind: 'moon-phase', phase: 'full', sigmaDeg: 22.5 },
      ],
      [],
      1815,
      1818,
    );
    const answer = solveDates(scene, { consistency: false, profileScans: false, maxCandidates: 20 });
    const family = answer.families[0];
    const hours = answer.candidates.map((c) => c.times.localApparentMinutes);
    // The candidates lie both before and after midnight (the test's premise).
    expect(hours.some((m) => m > 1260)).toBe(true);
    expect(hours.some((m) => m < 180)).toBe(true);
    expect(family.toLocalApparentMinutes).toBeGreaterThan(1440);
    expect(family.toLocalApparentMinutes - family.fromLocalApparentMinutes).toBeLessThan(720);
    expect(family.summary).toContain('(across midnight)');
    expect(answer.families).toHaveLength(1); // no clock: one family holds every candidate
    for (const c of answer.candidates) {
      const m = c.times.localApparentMinutes < family.fromLocalApparentMinutes ? c.times.localApparentMinutes + 1440 : c.times.localApparentMinutes;
      expect(m).toBeGreaterThanOrEqual(family.fromLocalApparentMinutes - 1e-9);
      expect(m).toBeLessThanOrEqual(family.toLocalApparentMinutes + 1e-9);
    }
  });
});
