/**
 * The chi-square distribution: upper-tail probabilities (p-values) and quantiles.
 *
 * Model: the regularised incomplete gamma functions P(a, x) and Q(a, x) = 1 - P(a, x),
 * computed as in Press, Teukolsky, Vetterling and Flannery, *Numerical Recipes*, 3rd ed.
 * (2007), section 6.2: the series (6.2.5) for x < a + 1 and Lentz's continued fraction
 * (6.2.7, evaluated by the modified Lentz method of section 5.2) otherwise; ln Gamma by
 * the Lanczos approximation (Numerical Recipes 3rd ed., section 6.1, `gammln`, g = 671/128,
 * 14 coefficients). The chi-square upper tail with k degrees of freedom is Q(k/2, x/2)
 * (Numerical Recipes 3rd ed., section 6.14.8 / eq. 6.2.18).
 * Accuracy: about 1e-14 relative for the series and fraction as used here, well beyond
 * any use in heliochron (p-values are printed to 3 significant figures).
 * Every iteration is bounded (at most MAX_ITERATIONS terms) and throws ConvergenceError
 * if the bound is reached, which does not happen for finite a <= 1e6.
 */
import { ConvergenceError } from '../errors.js';

const MAX_ITERATIONS = 1000;
const RELATIVE_EPS = 1e-15;
const TINY = 1e-300;

/** Lanczos coefficients of Numerical Recipes 3rd ed. (2007), section 6.1, routine gammln. */
const LANCZOS = [
  57.1562356658629235, -59.5979603554754912, 14.1360979747417471, -0.491913816097620199,
  0.339946499848118887e-4, 0.465236289270485756e-4, -0.983744753048795646e-4, 0.158088703224912494e-3,
  -0.210264441724104883e-3, 0.217439618115212643e-3, -0.164318106536763890e-3, 0.844182239838527433e-4,
  -0.261908384015814087e-4, 0.368991826595316234e-5,
];

/**
 * Natural logarithm of the gamma function for x > 0 (Numerical Recipes 3rd ed., section 6.1).
 * @example lnGamma(5) // ln 24 = 3.1780538...
 */
export function lnGamma(x: number): number {
  let y = x;
  const tmp0 = x + 5.24218750000000000; // x + g + 1/2 with g = 671/128
  const tmp = (x + 0.5) * Math.log(tmp0) - tmp0;
  let ser = 0.999999999999997092;
  for (let j = 0; j < 14; j += 1) ser += LANCZOS[j] / ++y;
  return tmp + Math.log((2.5066282746310005 * ser) / x);
}

/** Series for P(a, x), Numerical Recipes 3rd ed. eq. 6.2.5; valid and fast for x < a + 1. */
function gammaSeries(a: number, x: number): number {
  let ap = a;
  let del = 1 / a;
  let sum = del;
  for (let n = 0; n < MAX_ITERATIONS; n += 1) {
    ap += 1;
    del *= x / ap;
    sum += del;
    if (Math.abs(del) < Math.abs(sum) * RELATIVE_EPS) {
      return sum * Math.exp(-x + a * Math.log(x) - lnGamma(a));
    }
  }
  throw new ConvergenceError('incomplete gamma series', MAX_ITERATIONS);
}

/** Continued fraction for Q(a, x), Numerical Recipes 3rd ed. eq. 6.2.7 (modified Lentz, section 5.2); for x >= a + 1. */
function gammaContinuedFraction(a: number, x: number): number {
  let b = x + 1 - a;
  let c = 1 / TINY;
  let d = 1 / b;
  let h = d;
  for (let i = 1; i <= MAX_ITERATIONS; i += 1) {
    const an = -i * (i - a);
    b += 2;
    d = an * d + b;
    if (Math.abs(d) < TINY) d = TINY;
    c = b + an / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    const del = d * c;
    h *= del;
    if (Math.abs(del - 1) <= RELATIVE_EPS) return Math.exp(-x + a * Math.log(x) - lnGamma(a)) * h;
  }
  throw new ConvergenceError('incomplete gamma continued fraction', MAX_ITERATIONS);
}

/**
 * Regularised lower incomplete gamma P(a, x) = gamma(a, x) / Gamma(a), a > 0, x >= 0.
 * @example regularizedGammaP(1, 1) // 1 - e^-1 = 0.63212...
 */
export function regularizedGammaP(a: number, x: number): number {
  if (x <= 0) return 0;
  return x < a + 1 ? gammaSeries(a, x) : 1 - gammaContinuedFraction(a, x);
}

/**
 * Regularised upper incomplete gamma Q(a, x) = 1 - P(a, x), a > 0, x >= 0.
 * @example regularizedGammaQ(1, 1) // e^-1 = 0.36788...
 */
export function regularizedGammaQ(a: number, x: number): number {
  if (x <= 0) return 1;
  // Q(a, x) < exp(-x) x^(a-1) / Gamma(a) (1 + (a-1)/x + ...) underflows to 0 in double precision
  // long before x reaches a + 1e4 for the a of chi-square tests (Numerical Recipes 3rd ed. 6.2);
  // an infinite x (a sigma so small that chi-square overflows) has Q = 0.
  if (!Number.isFinite(x) || x - (a - 1) * Math.log(Math.max(x, 1)) > 800) return 0;
  return x < a + 1 ? 1 - gammaSeries(a, x) : gammaContinuedFraction(a, x);
}

/**
 * Upper-tail probability of the chi-square distribution: Pr(X >= chiSquare) for `dof`
 * degrees of freedom (dof > 0), Q(dof / 2, chiSquare / 2).
 * @example chiSquarePValue(5.991, 2) // 0.0500 (2 dof: exp(-x / 2))
 */
export function chiSquarePValue(chiSquare: number, dof: number): number {
  return regularizedGammaQ(dof / 2, Math.max(0, chiSquare) / 2);
}

/**
 * Chi-square value whose upper tail is `pValue` (0 < pValue < 1) for `dof` degrees of
 * freedom, by bisection on chiSquarePValue (bounded: 200 halvings of the bracket).
 * @example chiSquareQuantile(0.05, 1) // 3.841
 */
export function chiSquareQuantile(pValue: number, dof: number): number {
  let lo = 0;
  let hi = Math.max(10, dof * 10);
  while (chiSquarePValue(hi, dof) > pValue) hi *= 2;
  for (let i = 0; i < 200; i += 1) {
    const mid = 0.5 * (lo + hi);
    if (chiSquarePValue(mid, dof) > pValue) lo = mid;
    else hi = mid;
    if (hi - lo < 1e-12 * Math.max(1, hi)) break;
  }
  return 0.5 * (lo + hi);
}

/** Probability inside one standard deviation of a normal distribution, erf(1 / sqrt 2) (common practice). */
export const ONE_SIGMA_PROBABILITY = 0.6826894921370859;
/** Delta chi-square of the 1-sigma (68.27%) region for 2 parameters, -2 ln(1 - 0.6827) = 2.2958 (Numerical Recipes 3rd ed., section 15.6.5: 2.30). */
export const DELTA_CHI2_2DOF_68 = -2 * Math.log(1 - ONE_SIGMA_PROBABILITY);
/** Delta chi-square of the 95% region for 2 parameters: -2 ln(0.05) = 5.9915 (closed form for 2 dof). */
export const DELTA_CHI2_2DOF_95 = -2 * Math.log(0.05);
/** Delta chi-square of the 95% interval for 1 parameter (NIST/SEMATECH e-Handbook, chi-square table): 3.8415. */
export const DELTA_CHI2_1DOF_95 = 3.841458820694124;
