/**
 * Delta T = TT - UT by the spline of Morrison, Stephenson, Hohenkerk and Zawilski (2021),
 * with its published uncertainty: heliochron's default Delta T model.
 *
 * Source of the numbers: L. V. Morrison, F. R. Stephenson, C. Y. Hohenkerk and M. Zawilski,
 * "Addendum 2020 to 'Measurement of the Earth's rotation: 720 BC to AD 2015'", Proc. R. Soc. A
 * 477: 20200776 (2021), doi:10.1098/rspa.2020.0776, supplementary Table S15 (version 2020,
 * "Table S15: The Polynomial Coefficients for DT -720.0 to 2019.0"), distributed by HM Nautical
 * Almanac Office as Table-S15.2020.txt (also bundled with the Python library Skyfield). The
 * original analysis: Stephenson, Morrison and Hohenkerk, Proc. R. Soc. A 472: 20160404 (2016).
 *
 * Within -720.0 .. 2019.0 (decimal year Y): row i with K_i <= Y < K_{i+1},
 *   t = (Y - K_i) / (K_{i+1} - K_i),  Delta T = a0 + a1 t + a2 t^2 + a3 t^3 seconds (Table S15 notes).
 * Outside: the integral of the long-term length-of-day expression given by HM Nautical Almanac
 * Office with the paper's data (astro.ukho.gov.uk/nao/lvm/),
 *   lod = 1.72 T - 3.5 sin(2 pi (T + 0.75) / 14) ms/day,  T = (Y - 1825) / 100,
 * integrated over Julian years: Delta T = c + 31.4115 T^2 + (3.5 x 0.36525 x 100 x 14 / (2 pi)) cos(2 pi (T + 0.75) / 14)
 * (31.4115 = 1.72 x 0.36525 x 100 / 2), with the constant c chosen separately before -720 and after
 * 2019 so that the curve joins the spline without a jump (heliochron's joining; HMNAO extrapolates
 * its table in the same way, by integrating the lod expression from the spline's ends).
 *
 * Uncertainty (one standard error): the values HM Nautical Almanac Office publishes with its
 * table of Delta T from -2000 to +2500 for this model, as transcribed in the open DeltaT package
 * of Y.-T. Liu (github.com/ytliu0/DeltaT, function DeltaT_error_estimate); each value holds from its
 * epoch to the next. Beyond -2000 and +2500 heliochron scales the end value with T^2 (its own
 * assumption). The stated sigma does NOT cover every difference to older published tables: see
 * docs/time-keeping.md (the Astronomical Almanac's table before about 1680 and 1900-1955).
 * Valid: the spline -720..2019 as published; outside, an extrapolation whose sigma grows as stated.
 */

/** Table S15 (v. 2020): [K_i, K_{i+1}, a0, a1, a2, a3], Delta T in seconds. Morrison et al. (2021). */
const TABLE_S15_2020: readonly (readonly [number, number, number, number, number, number])[] = [
  [-720, -100, 20371.848, -9999.586, 776.247, 409.16],
  [-100, 400, 11557.668, -5822.27, 1303.151, -503.433],
  [400, 1000, 6535.116, -5671.519, -298.291, 1085.087],
  [1000, 1150, 1650.393, -753.21, 184.811, -25.346],
  [1150, 1300, 1056.647, -459.628, 108.771, -24.641],
  [1300, 1500, 681.149, -421.345, 61.953, -29.414],
  [1500, 1600, 292.343, -192.841, -6.572, 16.197],
  [1600, 1650, 109.127, -78.697, 10.505, 3.018],
  [1650, 1720, 43.952, -68.089, 38.333, -2.127],
  [1720, 1800, 12.068, 2.507, 41.731, -37.939],
  [1800, 1810, 18.367, -3.481, -1.126, 1.918],
  [1810, 1820, 15.678, 0.021, 4.629, -3.812],
  [1820, 1830, 16.516, -2.157, -6.806, 3.25],
  [1830, 1840, 10.804, -6.018, 2.944, -0.096],
  [1840, 1850, 7.634, -0.416, 2.658, -0.539],
  [1850, 1855, 9.338, 1.642, 0.261, -0.883],
  [1855, 1860, 10.357, -0.486, -2.389, 1.558],
  [1860, 1865, 9.04, -0.591, 2.284, -2.477],
  [1865, 1870, 8.255, -3.456, -5.148, 2.72],
  [1870, 1875, 2.371, -5.593, 3.011, -0.914],
  [1875, 1880, -1.126, -2.314, 0.269, -0.039],
  [1880, 1885, -3.21, -1.893, 0.152, 0.563],
  [1885, 1890, -4.388, 0.101, 1.842, -1.438],
  [1890, 1895, -3.884, -0.531, -2.474, 1.871],
  [1895, 1900, -5.017, 0.134, 3.138, -0.232],
  [1900, 1905, -1.977, 5.715, 2.443, -1.257],
  [1905, 1910, 4.923, 6.828, -1.329, 0.72],
  [1910, 1915, 11.142, 6.33, 0.831, -0.825],
  [1915, 1920, 17.479, 5.518, -1.643, 0.262],
  [1920, 1925, 21.617, 3.02, -0.856, 0.008],
  [1925, 1930, 23.789, 1.333, -0.831, 0.127],
  [1930, 1935, 24.418, 0.052, -0.449, 0.142],
  [1935, 1940, 24.164, -0.419, -0.022, 0.702],
  [1940, 1945, 24.426, 1.645, 2.086, -1.106],
  [1945, 1950, 27.05, 2.499, -1.232, 0.614],
  [1950, 1953, 28.932, 1.127, 0.22, -0.277],
  [1953, 1956, 30.002, 0.737, -0.61, 0.631],
  [1956, 1959, 30.76, 1.409, 1.282, -0.799],
  [1959, 1962, 32.652, 1.577, -1.115, 0.507],
  [1962, 1965, 33.621, 0.868, 0.406, 0.199],
  [1965, 1968, 35.093, 2.275, 1.002, -0.414],
  [1968, 1971, 37.956, 3.035, -0.242, 0.202],
  [1971, 1974, 40.951, 3.157, 0.364, -0.229],
  [1974, 1977, 44.244, 3.199, -0.323, 0.172],
  [1977, 1980, 47.291, 3.069, 0.193, -0.192],
  [1980, 1983, 50.361, 2.878, -0.384, 0.081],
  [1983, 1986, 52.936, 2.354, -0.14, -0.165],
  [1986, 1989, 54.984, 1.577, -0.637, 0.448],
  [1989, 1992, 56.373, 1.648, 0.708, -0.276],
  [1992, 1995, 58.453, 2.235, -0.121, 0.11],
  [1995, 1998, 60.678, 2.324, 0.21, -0.313],
  [1998, 2001, 62.898, 1.804, -0.729, 0.109],
  [2001, 2004, 64.083, 0.674, -0.402, 0.199],
  [2004, 2007, 64.553, 0.466, 0.194, -0.017],
  [2007, 2010, 65.197, 0.804, 0.144, -0.084],
  [2010, 2013, 66.061, 0.839, -0.109, 0.128],
  [2013, 2016, 66.92, 1.007, 0.277, -0.095],
  [2016, 2019, 68.109, 1.277, -0.007, -0.139],
];

/** First and last year of the published spline. */
export const MORRISON_2021_FIRST_YEAR = -720;
export const MORRISON_2021_LAST_YEAR = 2019;

/** The spline (Table S15) at a year within its range; the last row is closed at 2019.0. */
function splineSeconds(y: number): number {
  let row = TABLE_S15_2020[TABLE_S15_2020.length - 1];
  for (const r of TABLE_S15_2020) {
    if (y < r[1]) {
      row = r;
      break;
    }
  }
  const t = (y - row[0]) / (row[1] - row[0]);
  return row[2] + t * (row[3] + t * (row[4] + t * row[5])); // Table S15 notes: a0 + a1 t + a2 t^2 + a3 t^3
}

const LOD_PERIOD_CENTURIES = 14;
const LOD_OMEGA = (2 * Math.PI) / LOD_PERIOD_CENTURIES;

/**
 * Integral of HMNAO's long-term lod expression (without its constant), seconds.
 * lod = 1.72 T - 3.5 sin(omega (T + 0.75)) ms/day; one ms/day over a Julian century adds 36.525 s.
 */
function integratedLodSeconds(y: number): number {
  const T = (y - 1825) / 100;
  return (1.72 * 36.525 * T * T) / 2 + ((3.5 * 36.525) / LOD_OMEGA) * Math.cos(LOD_OMEGA * (T + 0.75));
}

/** Constants that join the extrapolation to the spline at its two ends (computed, not copied). */
const JOIN_BEFORE = splineSeconds(MORRISON_2021_FIRST_YEAR) - integratedLodSeconds(MORRISON_2021_FIRST_YEAR);
const JOIN_AFTER = splineSeconds(MORRISON_2021_LAST_YEAR) - integratedLodSeconds(MORRISON_2021_LAST_YEAR);

/**
 * Delta T in seconds by the Morrison et al. (2021) spline for a decimal year, any year
 * (extrapolated outside -720..2019 as the header says).
 * @example morrison2021Seconds(1900) // -1.977
 */
export function morrison2021Seconds(y: number): number {
  if (y < MORRISON_2021_FIRST_YEAR) return integratedLodSeconds(y) + JOIN_BEFORE;
  if (y > MORRISON_2021_LAST_YEAR) return integratedLodSeconds(y) + JOIN_AFTER;
  return splineSeconds(y);
}

/**
 * Published standard error of Delta T (HMNAO table for -2000..+2500, see the header):
 * [epoch, sigma in seconds], each value holding until the next epoch.
 */
const SIGMA_STEPS: readonly (readonly [number, number])[] = [
  [-2000, 1080], [-1600, 720], [-900, 360], [-720, 180], [-700, 170], [-600, 160], [-500, 150],
  [-400, 130], [-300, 120], [-200, 110], [-100, 100], [0, 90], [100, 80], [200, 70], [300, 60],
  [400, 50], [500, 40], [700, 30], [800, 25], [900, 20], [1000, 15], [1620, 20], [1660, 15],
  [1670, 10], [1680, 5], [1730, 2], [1770, 1], [1800, 0.5], [1802, 0.4], [1805, 0.3], [1809, 0.2],
  [1831, 0.1], [1870, 0.05], [2022, 0.1], [2023, 1], [2030, 2], [2040, 4], [2050, 6], [2100, 10],
  [2200, 20], [2300, 30], [2400, 50], [2500, 100],
];

/**
 * One-sigma uncertainty of the Morrison et al. (2021) Delta T, seconds.
 * @example morrison2021SigmaSeconds(1282) // 15
 */
export function morrison2021SigmaSeconds(y: number): number {
  const first = SIGMA_STEPS[0];
  const last = SIGMA_STEPS[SIGMA_STEPS.length - 1];
  const t2 = (year: number): number => ((year - 1825) / 100) ** 2;
  // heliochron's assumption beyond the published table: grow with T^2 from its end values.
  if (y < first[0]) return (first[1] * t2(y)) / t2(first[0]);
  if (y >= last[0]) return (last[1] * t2(y)) / t2(last[0]);
  let sigma = first[1];
  for (const [epoch, value] of SIGMA_STEPS) {
    if (y >= epoch) sigma = value;
    else break;
  }
  return sigma;
}
