/**
 * Linear scales (data value <-> drawing coordinate) and "nice" tick values.
 * Tick steps are 1, 2 or 5 times a power of ten (common practice of chart making; the same
 * rule as Heckbert, "Nice numbers for graph labels", Graphics Gems, 1990).
 */

export interface LinearScale {
  /** Drawing coordinate of a data value. */
  (value: number): number;
  readonly domain: readonly [number, number];
  readonly range: readonly [number, number];
  /** Data value of a drawing coordinate (the inverse). */
  invert(coordinate: number): number;
}

/**
 * The linear map of domain [d0, d1] onto range [r0, r1] (r0 > r1 for an upward y axis).
 * @example linearScale([0, 10], [100, 200])(5) // 150
 */
export function linearScale(domain: readonly [number, number], range: readonly [number, number]): LinearScale {
  const [d0, d1] = domain;
  const [r0, r1] = range;
  const span = d1 - d0 === 0 ? 1 : d1 - d0;
  const k = (r1 - r0) / span;
  const f = ((value: number) => r0 + (value - d0) * k) as LinearScale;
  return Object.assign(f, {
    domain: [d0, d1] as const,
    range: [r0, r1] as const,
    invert: (coordinate: number) => d0 + (coordinate - r0) / (k === 0 ? 1 : k),
  });
}

/**
 * A tick step of 1, 2 or 5 x 10^n giving about `count` intervals over [min, max].
 * @example niceStep(0, 100, 5) // 20
 */
export function niceStep(min: number, max: number, count: number): number {
  const span = Math.abs(max - min);
  if (!(span > 0) || !(count > 0)) return 1;
  const raw = span / count;
  const power = 10 ** Math.floor(Math.log10(raw));
  const f = raw / power;
  const nice = f < 1.5 ? 1 : f < 3 ? 2 : f < 7 ? 5 : 10;
  return nice * power;
}

/**
 * Tick values: the multiples of a nice step inside [min, max], rounded to clear binary noise.
 * @example niceTicks(0, 90, 4) // [0, 20, 40, 60, 80]
 */
export function niceTicks(min: number, max: number, count: number, step = niceStep(min, max, count)): number[] {
  const lo = Math.min(min, max);
  const hi = Math.max(min, max);
  const first = Math.ceil(lo / step - 1e-9);
  const last = Math.floor(hi / step + 1e-9);
  const out: number[] = [];
  for (let i = first; i <= last && out.length < 1000; i += 1) out.push(Number((i * step).toPrecision(12)));
  return out;
}
