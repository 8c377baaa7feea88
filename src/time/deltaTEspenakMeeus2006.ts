/**
 * Delta T = TT - UT, the difference between uniform Terrestrial Time and Universal
 * Time kept by the Earth's rotation, with its published uncertainty.
 *
 * Model: the polynomial expressions of Espenak and Meeus, *Five Millennium Canon of
 * Solar Eclipses: -1999 to +3000*, NASA TP-2006-214141 (2006), section 2.6, as also
 * printed on the NASA eclipse page "Polynomial Expressions for Delta T". The argument
 * is the decimal year y = year + (month - 0.5) / 12 (src/time/timeScales.ts gives a
 * continuous form of it from a Julian Day). Outside -500..+2150 the long-term parabola
 * -20 + 32 u^2, u = (y - 1820) / 100 (Morrison and Stephenson 2004) is used, which is
 * what the publication prescribes before -500 and after +2150; it is applied at any year.
 *
 * Uncertainty (sigma, one standard error), same publication, after Morrison and
 * Stephenson (2004) and Stephenson and Houlden (1986):
 *  - before +1200: 0.8 t^2 s, t = (y - 1820) / 100 (stated for -1000..+1200; extrapolated
 *    beyond -1000 by the same formula, heliochron's choice);
 *  - 1200-1300: linear from the formula's value at 1200 (30.8 s) to 20 s (our interpolation);
 *  - 1300-1600: 20 s;
 *  - 1600-1700, 1700-1800, 1800-1900: linear between the stated 20 s (1600), 5 s (1700),
 *    1 s (1800), 0.1 s (1900) (our interpolation);
 *  - 1900-2005: 0.1 s (observed era; the polynomials follow the observations closely);
 *  - after 2005: the polynomials are a forecast. heliochron's own conservative assumption,
 *    no published value: 0.1 s + 0.25 s per year after 2005 + 0.8 ((y - 2005) / 100)^2 s
 *    (about 5 s by 2025, by which year the forecast had drifted by roughly that much, from memory).
 * Leaves out: tidal-acceleration corrections for lunar ephemerides (not needed for the sun).
 */

/** Horner evaluation c[0] + c[1] x + c[2] x^2 + ... */
function poly(x: number, c: readonly number[]): number {
  let s = 0;
  for (let i = c.length - 1; i >= 0; i -= 1) s = s * x + c[i];
  return s;
}

/** Long-term parabola, Morrison and Stephenson (2004), as in Espenak and Meeus (2006). */
function longTermSeconds(y: number): number {
  const u = (y - 1820) / 100;
  return -20 + 32 * u * u;
}

/**
 * Delta T in seconds by the Espenak and Meeus (2006) polynomials, for any decimal year.
 * @example espenakMeeusSeconds(1900.0) // -2.79
 */
export function espenakMeeusSeconds(y: number): number {
  // Each branch: Espenak and Meeus (2006), NASA TP-2006-214141, sec. 2.6, the interval named.
  if (y < -500) return longTermSeconds(y); // before -500
  if (y < 500) {
    // -500..+500, u = y / 100
    return poly(y / 100, [10583.6, -1014.41, 33.78311, -5.952053, -0.1798452, 0.022174192, 0.0090316521]);
  }
  if (y < 1600) {
    // +500..+1600, u = (y - 1000) / 100
    return poly((y - 1000) / 100, [1574.2, -556.01, 71.23472, 0.319781, -0.8503463, -0.005050998, 0.0083572073]);
  }
  if (y < 1700) return poly(y - 1600, [120, -0.9808, -0.01532, 1 / 7129]); // t = y - 1600
  if (y < 1800) return poly(y - 1700, [8.83, 0.1603, -0.0059285, 0.00013336, -1 / 1174000]); // t = y - 1700
  if (y < 1860) {
    // t = y - 1800
    return poly(y - 1800, [
      13.72, -0.332447, 0.0068612, 0.0041116, -0.00037436, 0.0000121272, -0.0000001699, 0.000000000875,
    ]);
  }
  if (y < 1900) return poly(y - 1860, [7.62, 0.5737, -0.251754, 0.01680668, -0.0004473624, 1 / 233174]); // t = y - 1860
  if (y < 1920) return poly(y - 1900, [-2.79, 1.494119, -0.0598939, 0.0061966, -0.000197]); // t = y - 1900
  if (y < 1941) return poly(y - 1920, [21.2, 0.84493, -0.0761, 0.0020936]); // t = y - 1920
  if (y < 1961) return poly(y - 1950, [29.07, 0.407, -1 / 233, 1 / 2547]); // t = y - 1950
  if (y < 1986) return poly(y - 1975, [45.45, 1.067, -1 / 260, -1 / 718]); // t = y - 1975
  if (y < 2005) {
    // t = y - 2000
    return poly(y - 2000, [63.86, 0.3345, -0.060374, 0.0017275, 0.000651814, 0.00002373599]);
  }
  if (y < 2050) return poly(y - 2000, [62.92, 0.32217, 0.005589]); // t = y - 2000
  if (y < 2150) return longTermSeconds(y) - 0.5628 * (2150 - y); // 2050..2150
  return longTermSeconds(y); // after 2150
}

/**
 * One-sigma uncertainty of Delta T in seconds (see the header for sources and the
 * interpolation between the published epochs).
 */
export function espenakMeeusSigmaSeconds(y: number): number {
  const lin = (y0: number, s0: number, y1: number, s1: number): number => s0 + ((s1 - s0) * (y - y0)) / (y1 - y0);
  if (y < 1200) {
    const t = (y - 1820) / 100;
    return 0.8 * t * t; // Espenak and Meeus (2006), after Morrison and Stephenson (2004)
  }
  if (y < 1300) return lin(1200, 0.8 * 6.2 * 6.2, 1300, 20);
  if (y < 1600) return 20;
  if (y < 1700) return lin(1600, 20, 1700, 5);
  if (y < 1800) return lin(1700, 5, 1800, 1);
  if (y < 1900) return lin(1800, 1, 1900, 0.1);
  if (y < 2005) return 0.1;
  const a = y - 2005;
  return 0.1 + 0.25 * a + 0.8 * (a / 100) * (a / 100); // heliochron's assumption, see header
}
