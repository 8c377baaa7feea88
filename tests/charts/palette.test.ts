import { describe, expect, it } from 'vitest';
import { DASHES, FIT_BANDS, OKABE_ITO, fitBandIndex, seriesStyle } from '../../src/charts/palette.js';
import { chiSquareQuantile } from '../../src/math/chiSquare.js';
import { expectClose } from '../helpers/expectClose.js';

function rgb(hex: string): [number, number, number] {
  return [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16)) as [number, number, number];
}

/** Relative luminance, WCAG 2.1 (W3C 2018), definition of "relative luminance" (sRGB). */
function luminance(hex: string): number {
  const [r, g, b] = rgb(hex).map((c) => {
    const s = c / 255;
    return s <= 0.04045 ? s / 12.92 : ((s + 0.055) / 1.055) ** 2.4;
  });
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

describe('palette', () => {
  it('holds the Okabe-Ito colours with the RGB values of Okabe and Ito, "Color Universal Design" (2008)', () => {
    expect(rgb(OKABE_ITO.black)).toEqual([0, 0, 0]);
    expect(rgb(OKABE_ITO.orange)).toEqual([230, 159, 0]);
    expect(rgb(OKABE_ITO.skyBlue)).toEqual([86, 180, 233]);
    expect(rgb(OKABE_ITO.bluishGreen)).toEqual([0, 158, 115]);
    expect(rgb(OKABE_ITO.yellow)).toEqual([240, 228, 66]);
    expect(rgb(OKABE_ITO.blue)).toEqual([0, 114, 178]);
    expect(rgb(OKABE_ITO.vermillion)).toEqual([213, 94, 0]);
    expect(rgb(OKABE_ITO.reddishPurple)).toEqual([204, 121, 167]);
  });
  it('gives the first five series distinct colours and distinct line styles (readable in black and white)', () => {
    const five = [0, 1, 2, 3, 4].map(seriesStyle);
    expect(new Set(five.map((s) => s.color)).size).toBe(5);
    expect(new Set(five.map((s) => s.dash ?? 'solid')).size).toBe(5);
    expect(seriesStyle(7)).toEqual(seriesStyle(0));
    expect(seriesStyle(-1)).toEqual(seriesStyle(6));
    expect(Object.values(DASHES).filter((d) => d !== undefined).length).toBe(4);
  });
  it('orders the fit bands from dark to light, so that they also read in grey', () => {
    const l = FIT_BANDS.map((b) => luminance(b.fill));
    for (let i = 1; i < l.length; i += 1) expect(l[i]).toBeGreaterThan(l[i - 1] * 1.5);
  });
  it('bounds the fit bands by the chi-square quantiles of two parameters', () => {
    // Press et al., Numerical Recipes 3rd ed. (2007), section 15.6.5: Delta chi2 for 2 parameters is 2.30 (68.3%) and 11.8 (99.73%).
    expectClose(FIT_BANDS[0].maxDeltaChiSquare, 2.3, 0.01, '68.3% bound');
    expectClose(FIT_BANDS[2].maxDeltaChiSquare, 11.8, 0.05, '99.73% bound');
    // -2 ln(1 - p) for 2 degrees of freedom, against the project's chi-square quantile.
    expectClose(FIT_BANDS[1].maxDeltaChiSquare, chiSquareQuantile(0.05, 2), 1e-3, '95% bound');
    expectClose(FIT_BANDS[3].maxDeltaChiSquare, -2 * Math.log(5.733e-7), 0.01, '5 sigma bound');
  });
  it('puts a Delta chi-square into its band, -1 beyond the last', () => {
    expect(fitBandIndex(0)).toBe(0);
    expect(fitBandIndex(2.29)).toBe(0);
    expect(fitBandIndex(2.31)).toBe(1);
    expect(fitBandIndex(6)).toBe(2);
    expect(fitBandIndex(20)).toBe(3);
    expect(fitBandIndex(1000)).toBe(-1);
  });
});
