import { describe, expect, it } from 'vitest';
import { bothStylesInUse, civilDateRendering, hhmm, minuteRange, roundTo, switchesNearWindow, uncertaintyWords } from '../../src/report/formatTimes.js';
import { candidate, sceneWith, scannedCandidate } from './answerFixtures.js';

describe('times of day', () => {
  it('hhmm rounds to the minute and wraps to one day', () => {
    expect(hhmm(455.6)).toBe('07:36');
    expect(hhmm(0)).toBe('00:00');
    expect(hhmm(1439.8)).toBe('00:00');
    expect(hhmm(-1)).toBe('23:59');
  });
  it('a range collapses to one time when both ends round alike', () => {
    expect(minuteRange(455, 470)).toBe('07:35-07:50');
    expect(minuteRange(480.2, 479.9)).toBe('08:00');
  });
});

describe('civil dates in the site calendar', () => {
  it('a fixed calendar writes one style with its name', () => {
    const scene = sceneWith('gregorian', 1765, 1785);
    expect(civilDateRendering({ calendar: 'gregorian', year: 1771, month: 7, day: 30 }, scene).text).toBe('30 July 1771 (Gregorian)');
  });
  it('a window spanning the site switch writes Old Style/New Style, naming the style in force', () => {
    // Calendar (New Style) Act 1750: in Great Britain 2 September 1752 was followed by 14 September 1752,
    // so 14 September 1752 New Style is 3 September Old Style.
    const scene = sceneWith('great-britain', 1750, 1755);
    const r = civilDateRendering({ calendar: 'gregorian', year: 1752, month: 9, day: 14 }, scene);
    expect(r.text).toBe('3/14 September 1752 (New Style)');
    expect(r.oldStyle).toBe('1752-09-03');
    expect(r.newStyle).toBe('1752-09-14');
    const before = civilDateRendering({ calendar: 'julian', year: 1751, month: 12, day: 25 }, scene);
    // 11 days between the calendars from March 1700 to February 1800 (Meeus 1998 ch. 7, common practice).
    expect(before.text).toBe('25 December 1751/5 January 1752 (Old Style)');
  });
  it('a switch far outside the years searched writes one style', () => {
    const scene = sceneWith('great-britain', 1800, 1810);
    expect(switchesNearWindow(scene)).toEqual([]);
    expect(bothStylesInUse(scene)).toBe(false);
    expect(bothStylesInUse(sceneWith('great-britain', 1740, 1751))).toBe(true); // switch in 1752, one year after the window
    expect(civilDateRendering({ calendar: 'gregorian', year: 1805, month: 6, day: 1 }, scene).text).toBe('1 June 1805 (Gregorian)');
  });
  it('a year start other than 1 January adds the year as written', () => {
    // Annunciation style: 10 February 1651 (January year) was written 1650/1 (common practice).
    const scene = sceneWith('julian', 1648, 1655, 'mar25-forward');
    const r = civilDateRendering({ calendar: 'julian', year: 1651, month: 2, day: 10 }, scene);
    expect(r.text).toBe('10 February 1651 (Julian, year written 1650/1)');
    expect(r.dualYear).toBe('1650/1');
  });
});

describe('uncertainty in words', () => {
  it('gives the 95% ellipse half-widths when the ellipse holds', () => {
    expect(uncertaintyWords(candidate({ id: 'c1', rank: 1 }))).toBe('+/- 9.8 d, +/- 5 min (95% ellipse)');
  });
  it('gives the profile-scan interval and why the ellipse was replaced', () => {
    const words = uncertaintyWords(scannedCandidate('c2', 2));
    expect(words).toContain('95% profile scan 6 June 1771 to 3 July 1771 (-12.0 to +15.0 d)');
    expect(words).toContain('07:55-08:10 local apparent time');
    expect(words).toContain('ellipse replaced because near the solstice the date is poorly constrained');
  });
});

describe('edge cases', () => {
  it('rounding never prints negative zero and NaN times print as dashes', () => {
    expect(Object.is(roundTo(-0.00001, 3), 0)).toBe(true);
    expect(roundTo(2.0049, 2)).toBe(2);
    expect(hhmm(Number.NaN)).toBe('--:--');
  });
});
