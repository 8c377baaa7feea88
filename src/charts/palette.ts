/**
 * heliochron's visual identity for charts: colours, line styles, the font stack and the
 * shared stylesheet.
 *
 * Colours: the eight-colour set of Okabe and Ito, "Color Universal Design (CUD): how to make
 * figures and presentations that are friendly to colorblind people" (2002, revised 2008),
 * distinguishable with the common colour-vision deficiencies. Every series also has its own
 * line style (solid, dashed, dotted, dash-dot) so that a black-and-white print still reads.
 * The map's fit bands are one hue (Okabe-Ito blue) in falling lightness, so that they also
 * order correctly in grey.
 */

/** The Okabe-Ito set (Okabe and Ito 2008, "Color Universal Design", Fig. 16). */
export const OKABE_ITO = {
  black: '#000000',
  orange: '#E69F00',
  skyBlue: '#56B4E9',
  bluishGreen: '#009E73',
  yellow: '#F0E442',
  blue: '#0072B2',
  vermillion: '#D55E00',
  reddishPurple: '#CC79A7',
} as const;

/** Paper and ink: a warm off-white page, a near-black ink, and a grey for grids. */
export const INK = {
  paper: '#FFFFFF',
  ink: '#1A1A1A',
  muted: '#5C5C5C',
  grid: '#D9D9D9',
  frame: '#8C8C8C',
} as const;

/** Stroke dash patterns, in user units. */
export const DASHES = {
  solid: undefined,
  dashed: '6 3',
  dotted: '1.5 2.5',
  dashDot: '7 3 1.5 3',
  longDash: '11 4',
} as const;

export interface SeriesStyle {
  readonly color: string;
  readonly dash: string | undefined;
  /** Name of the line style in words, for legends read in black and white. */
  readonly dashName: string;
}

/** The series order: colour and line style vary together. Yellow is left out (too light on white paper). */
const SERIES: readonly SeriesStyle[] = [
  { color: OKABE_ITO.blue, dash: DASHES.solid, dashName: 'solid' },
  { color: OKABE_ITO.vermillion, dash: DASHES.dashed, dashName: 'dashed' },
  { color: OKABE_ITO.bluishGreen, dash: DASHES.dotted, dashName: 'dotted' },
  { color: OKABE_ITO.reddishPurple, dash: DASHES.dashDot, dashName: 'dash-dot' },
  { color: OKABE_ITO.orange, dash: DASHES.longDash, dashName: 'long dash' },
  { color: OKABE_ITO.skyBlue, dash: DASHES.solid, dashName: 'solid' },
  { color: OKABE_ITO.black, dash: DASHES.dashed, dashName: 'dashed' },
];

/**
 * The style of the i-th series (cycles after seven).
 * @example seriesStyle(1) // { color: '#D55E00', dash: '6 3', dashName: 'dashed' }
 */
export function seriesStyle(index: number): SeriesStyle {
  const n = SERIES.length;
  return SERIES[((index % n) + n) % n];
}

/** A fit band of the date-and-hour map: Delta chi-square upper bound, fill, words for the legend. */
export interface FitBand {
  readonly maxDeltaChiSquare: number;
  readonly fill: string;
  readonly label: string;
}

/**
 * Bands of Delta chi-square above the best fit, two parameters (day and minute). The bounds
 * are the chi-square quantiles with 2 degrees of freedom: -2 ln(1 - p) for p = 0.6827, 0.95,
 * 0.9973 and 0.99999943 (1, 2, 3 and 5 sigma); Press et al., Numerical Recipes 3rd ed. 2007,
 * section 15.6.5, give 2.30, 6.18 (95.4%) and 11.8 for two parameters.
 */
export const FIT_BANDS: readonly FitBand[] = [
  { maxDeltaChiSquare: 2.2957, fill: '#00507D', label: 'fits within 1 sigma (68%)' },
  { maxDeltaChiSquare: 5.9915, fill: '#3A8FC7', label: 'within 95%' },
  { maxDeltaChiSquare: 11.8290, fill: '#9CC9E6', label: 'within 99.7% (3 sigma)' },
  { maxDeltaChiSquare: 28.744, fill: '#E3EFF7', label: 'poor fit (3 to 5 sigma), dotted' },
];

/** Words for everything beyond the last band. */
export const OUTSIDE_BANDS_LABEL = 'does not fit (left white)';

/** Index of the band a Delta chi-square falls in, or -1 outside all bands. */
export function fitBandIndex(deltaChiSquare: number): number {
  for (let i = 0; i < FIT_BANDS.length; i += 1) if (deltaChiSquare <= FIT_BANDS[i].maxDeltaChiSquare) return i;
  return -1;
}

/** A plain system sans-serif stack: no web fonts are fetched. */
export const FONT_STACK = '"Helvetica Neue", Helvetica, Arial, "Liberation Sans", "DejaVu Sans", sans-serif';

/** Stylesheet inside every chart (class names prefixed "hc-" so they do not clash in a page). */
export const CHART_STYLE = [
  `text{font-family:${FONT_STACK};fill:${INK.ink};font-size:11px}`,
  `.hc-title{font-size:15px;font-weight:bold}`,
  `.hc-caption{font-size:11.5px;fill:${INK.muted}}`,
  `.hc-axis-label{font-size:11.5px}`,
  `.hc-tick{font-size:10px;fill:${INK.muted}}`,
  `.hc-secondary{font-size:10px;font-weight:bold;fill:${INK.muted}}`,
  `.hc-legend{font-size:10.5px}`,
  `.hc-note{font-size:10px;fill:${INK.muted}}`,
  `.hc-mark-label{font-size:10.5px;font-weight:bold;paint-order:stroke;stroke:${INK.paper};stroke-width:3px;stroke-linejoin:round}`,
  `.hc-frame{fill:none;stroke:${INK.frame};stroke-width:1}`,
  `.hc-grid{stroke:${INK.grid};stroke-width:0.6}`,
  `.hc-tickmark{stroke:${INK.frame};stroke-width:1}`,
].join('');
