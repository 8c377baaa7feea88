/**
 * The words shown for each measured value and each pixel-form kind, shared by `heliochron measure`
 * (src/cli/measureCommand.ts) and the desk's measurements panel (src/desk/measurements.ts), so that
 * both say the same thing about the same number.
 */

/** Label, unit ('' for a ratio) and digits of each measured value, by its field name in the numeric form. */
export const MEASURED_VALUE_WORDS: Readonly<Record<string, { readonly label: string; readonly unit: '' | 'deg'; readonly digits: number }>> = {
  slopeDeg: { label: 'slope below horizontal', unit: 'deg', digits: 2 },
  depthRatio: { label: 'depth ratio (shadow depth / projection)', unit: '', digits: 4 },
  widthRatio: { label: 'width ratio (shadow width / fin depth)', unit: '', digits: 4 },
  shadowAzimuthDeg: { label: 'shadow azimuth (foot to tip, from true north)', unit: 'deg', digits: 2 },
  lengthRatio: { label: 'length ratio (shadow length / height)', unit: '', digits: 4 },
  distanceRatio: { label: "distance ratio (shadow line's distance from the wall foot / eave height)", unit: '', digits: 4 },
  sunAzimuthDeg: { label: 'sun azimuth the pair gives (shadow point to caster, from true north)', unit: 'deg', digits: 2 },
  sunAltitudeDeg: { label: 'sun altitude the pair gives (shadow point to caster)', unit: 'deg', digits: 2 },
};

/** Plain words of each kind that has a pixel form on a plane. */
export const PIXEL_KIND_WORDS: Readonly<Record<string, string>> = {
  'rod-shadow': 'rod shadow',
  'overhang-shadow': 'overhang shadow',
  'fin-shadow': 'fin shadow',
  'pole-shadow': 'pole shadow',
  'eave-shadow': "eave's shadow line",
  'shadow-points': 'caster and shadow point',
};
