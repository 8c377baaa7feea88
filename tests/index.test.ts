/** The public API re-exports the parts a program needs. */
import { describe, expect, it } from 'vitest';
import * as heliochron from '../src/index.js';
import { expectClose } from './helpers/expectClose.js';

describe('the public API', () => {
  it('exposes the calendar, the ephemeris, the scene reader and the solver', () => {
    for (const name of ['calendarDateToJd', 'sunPosition', 'readSceneText', 'solveDates', 'checkProposal', 'fitHomography']) {
      expect(typeof (heliochron as Record<string, unknown>)[name], name).toBe('function');
    }
  });
  it('exposes the moon: its place, its events and its look in words', () => {
    for (const name of ['moonPosition', 'moonEvents', 'moonAge', 'lunarPhaseNear', 'moonPhaseWords', 'litSideWords']) {
      expect(typeof (heliochron as Record<string, unknown>)[name], name).toBe('function');
    }
  });
  it('computes Meeus Example 7.a through the index', () => {
    // Meeus, Astronomical Algorithms, 2nd ed. (1998), Example 7.a: 1957 October 4.81 = JD 2436116.31.
    expectClose(heliochron.calendarDateToJd({ calendar: 'gregorian', year: 1957, month: 10, day: 4 }, 0.81), 2436116.31, 1e-9);
  });
});
