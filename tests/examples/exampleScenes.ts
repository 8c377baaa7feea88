/**
 * The generator of the bundled example scenes (examples/*.yaml), all in the fictional town
 * of Velmar. Invented data for demonstration only: each scene is built by choosing a true
 * instant (a civil day at the site and a local apparent time), computing the sun there with
 * our own ephemeris (src/ephemeris/sunPosition.ts) and the measurements with our own forward
 * models (src/geometry/observationModels.ts, src/time/clock.ts), then rounding each number as
 * a scholar would read it off a picture (slopes to the degree, ratios to 0.02, a clock to the
 * minute). An observation may be computed under other light (another instant) on purpose.
 *
 * examples.test.ts checks that the files are exactly what this generator writes; to write
 * them afresh (only on purpose): HELIOCHRON_WRITE_EXAMPLES=1 npx vitest run tests/examples
 */
import type { Air, CalendarRule, CivilDay, ClockKind, Side } from '../../src/scene/types.js';
import { civilDateToJd } from '../../src/calendar/regions.js';
import { formatIsoDay } from '../../src/calendar/format.js';
import { clockToJdUT, formatClockKind, jdUTToClockMinutes } from '../../src/time/clock.js';
import { sunPosition } from '../../src/ephemeris/sunPosition.js';
import { predictFinShadow, predictOverhangShadow, predictRodShadow } from '../../src/geometry/wallShadows.js';
import { predictPoleShadow } from '../../src/geometry/groundShadows.js';

export const VELMAR = { latitudeDeg: 47.62, longitudeDeg: 9.35, elevationM: 410 } as const;

/** An instant as a scholar states it: a civil day in the site's calendar and a local apparent time. */
export interface TrueInstant {
  readonly day: CivilDay;
  readonly apparentMinutes: number;
}

export type ObservationSpec =
  | { readonly id: string; readonly kind: 'rod-shadow'; readonly wall: string; readonly sigmaDeg: number; readonly note?: string; readonly light?: TrueInstant }
  | { readonly id: string; readonly kind: 'overhang-shadow'; readonly wall: string; readonly sigma: number; readonly note?: string; readonly light?: TrueInstant }
  | { readonly id: string; readonly kind: 'fin-shadow'; readonly wall: string; readonly sigma: number; readonly note?: string; readonly light?: TrueInstant }
  | {
      readonly id: string;
      readonly kind: 'pole-shadow';
      readonly azimuthSigmaDeg: number;
      readonly lengthSigma: number;
      readonly note?: string;
      readonly light?: TrueInstant;
    }
  | { readonly id: string; readonly kind: 'wall-lit' | 'wall-shaded'; readonly wall: string; readonly note?: string }
  | {
      readonly id: string;
      readonly kind: 'clock';
      readonly kept: ClockKind;
      readonly precisionMinutes: number;
      readonly dialHours: 12 | 24;
      readonly note?: string;
    };

export interface ExampleSpec {
  readonly file: string;
  readonly comments: readonly string[];
  readonly title: string;
  readonly calendar: CalendarRule;
  /** How the calendar is written in the file. */
  readonly calendarYaml: string;
  readonly windowYaml: readonly string[];
  readonly air: Air;
  readonly walls: readonly { readonly id: string; readonly azimuthDeg: number; readonly azimuthSigmaDeg: number; readonly note: string }[];
  readonly truth: TrueInstant;
  readonly observations: readonly ObservationSpec[];
  readonly seed: number;
}

/** The instant (UT JD) of a true instant in a scene's calendar, and the sun then. */
export function lightAt(instant: TrueInstant, calendar: CalendarRule, air: Air) {
  const dayJd0 = civilDateToJd(calendar, instant.day);
  const jdUT = clockToJdUT(dayJd0, instant.apparentMinutes, { kind: 'apparent' }, VELMAR);
  return { jdUT, sun: sunPosition(jdUT, VELMAR, air) };
}

/** Round to a step as a reader of the picture would: 38.4 -> 38 (step 1), 0.813 -> 0.82 (step 0.02). */
export function readAs(x: number, step: number): number {
  const digits = Math.max(0, -Math.floor(Math.log10(step) + 1e-9));
  return Number((Math.round(x / step) * step).toFixed(digits));
}

const hm = (minutes: number): string => `${Math.floor(minutes / 60)}:${String(Math.round(minutes % 60)).padStart(2, '0')}`;

function wallAzimuth(spec: ExampleSpec, wall: string): number {
  const w = spec.walls.find((x) => x.id === wall);
  if (!w) throw new Error(`example ${spec.file}: no wall ${wall}`);
  return w.azimuthDeg;
}

/** The measured values of one observation, as the file writes them. */
export function measure(spec: ExampleSpec, o: ObservationSpec): string {
  const noteOf = o.note === undefined ? '' : `, note: ${JSON.stringify(o.note)}`;
  if (o.kind === 'wall-lit' || o.kind === 'wall-shaded') return `{ id: ${o.id}, kind: ${o.kind}, wall: ${o.wall}${noteOf} }`;
  if (o.kind === 'clock') {
    const { jdUT } = lightAt(spec.truth, spec.calendar, spec.air);
    const shown = jdUTToClockMinutes(jdUT, o.kept, VELMAR).minutesOfDay;
    const onDial = Math.round(shown) % (o.dialHours * 60);
    return (
      `{ id: ${o.id}, kind: clock, reading: "${hm(onDial === 0 && o.dialHours === 12 ? 720 : onDial)}", precisionMinutes: ${o.precisionMinutes}, ` +
      `hourHandTrusted: true, dialHours: ${o.dialHours}, kept: ${formatClockKind(o.kept)}${noteOf} }`
    );
  }
  const { sun } = lightAt(('light' in o ? o.light : undefined) ?? spec.truth, spec.calendar, spec.air);
  switch (o.kind) {
    case 'rod-shadow': {
      const p = predictRodShadow(sun, wallAzimuth(spec, o.wall));
      return `{ id: ${o.id}, kind: rod-shadow, wall: ${o.wall}, slopeDeg: ${readAs(p.slopeDeg, 1)}, side: ${p.side as Side}, sigmaDeg: ${o.sigmaDeg}${noteOf} }`;
    }
    case 'overhang-shadow': {
      const p = predictOverhangShadow(sun, wallAzimuth(spec, o.wall));
      return `{ id: ${o.id}, kind: overhang-shadow, wall: ${o.wall}, depthRatio: ${readAs(p.depthRatio, 0.02)}, sigma: ${o.sigma}${noteOf} }`;
    }
    case 'fin-shadow': {
      const p = predictFinShadow(sun, wallAzimuth(spec, o.wall));
      return `{ id: ${o.id}, kind: fin-shadow, wall: ${o.wall}, widthRatio: ${readAs(p.widthRatio, 0.02)}, side: ${p.side as Side}, sigma: ${o.sigma}${noteOf} }`;
    }
    case 'pole-shadow': {
      const p = predictPoleShadow(sun);
      return (
        `{ id: ${o.id}, kind: pole-shadow, shadowAzimuthDeg: ${readAs(p.shadowAzimuthDeg, 1)}, shadowAzimuthSigmaDeg: ${o.azimuthSigmaDeg}, ` +
        `lengthRatio: ${readAs(p.lengthRatio, 0.02)}, lengthRatioSigma: ${o.lengthSigma}${noteOf} }`
      );
    }
  }
}

/** The whole scene file as text. */
export function sceneYaml(spec: ExampleSpec): string {
  const lines = [
    '# yaml-language-server: $schema=../docs/scene.schema.json',
    ...spec.comments.map((c) => `# ${c}`),
    `# Generated by tests/examples/exampleScenes.ts from the true instant ${formatIsoDay(spec.truth.day)} ${hm(spec.truth.apparentMinutes)} local apparent time.`,
    'heliochron: 1',
    `title: ${spec.title}`,
    `site: { latitudeDeg: ${VELMAR.latitudeDeg}, longitudeDeg: ${VELMAR.longitudeDeg}, elevationM: ${VELMAR.elevationM} }`,
    `calendar: ${spec.calendarYaml}`,
    'yearStart: jan1',
    'window:',
    ...spec.windowYaml.map((l) => `  ${l}`),
    `air: { pressureHPa: ${spec.air.pressureHPa}, temperatureC: ${spec.air.temperatureC} }`,
    'walls:',
    ...spec.walls.map((w) => `  - { id: ${w.id}, azimuthDeg: ${w.azimuthDeg}, azimuthSigmaDeg: ${w.azimuthSigmaDeg}, note: ${JSON.stringify(w.note)} }`),
    'observations:',
    ...spec.observations.map((o) => `  - ${measure(spec, o)}`),
    `seed: ${spec.seed}`,
  ];
  return `${lines.join('\n')}\n`;
}

const VELMAR_SWITCH: CalendarRule = { kind: 'switch', lastJulian: { year: 1700, month: 2, day: 18 }, firstGregorian: { year: 1700, month: 3, day: 1 } };
const VELMAR_SWITCH_YAML = '{ lastJulian: 1700-02-18, firstGregorian: 1700-03-01 }   # Velmar\'s own switch';

/** (a) Two dates either side of the summer solstice fit the shadows; the town clock (mean time) breaks the tie. */
export const MARKTGASSE: ExampleSpec = {
  file: 'marktgasse-print.yaml',
  comments: [
    'The Marktgasse view, anonymous print: a fictional scene in the fictional town of Velmar (invented data).',
    'Morning light on the Tanners\' Hall; the Weighhouse clock shows the hour. The shadows alone fit a day in',
    'mid-May and a day at the end of July equally well (the same declination of the sun); the clock, which',
    'kept local mean time, tells them apart through the equation of time (+4 min in May, -6 min in July).',
  ],
  title: 'Marktgasse view, anonymous print',
  calendar: VELMAR_SWITCH,
  calendarYaml: VELMAR_SWITCH_YAML,
  windowYaml: ['fromYear: 1765', 'toYear: 1785             # the style of the print and the costumes', 'months: [4, 5, 6, 7, 8, 9]   # trees in leaf'],
  air: { pressureHPa: 965, temperatureC: 18 },
  walls: [
    { id: 'tanners-hall-front', azimuthDeg: 135, azimuthSigmaDeg: 1, note: 'Street front of the Tanners\' Hall, from the 1820 town plan.' },
    { id: 'weighhouse-west', azimuthDeg: 262, azimuthSigmaDeg: 1.5, note: 'West side of the Weighhouse, in shade in the print.' },
  ],
  truth: { day: { year: 1771, month: 7, day: 30 }, apparentMinutes: 480 },
  observations: [
    { id: 'sign-bracket', kind: 'rod-shadow', wall: 'tanners-hall-front', sigmaDeg: 1.5, note: 'Iron bracket of the tanners\' sign.' },
    { id: 'cornice', kind: 'overhang-shadow', wall: 'tanners-hall-front', sigma: 0.04, note: 'Depth of the cornice shadow over the cornice projection (0.45 m).' },
    { id: 'pilaster', kind: 'fin-shadow', wall: 'tanners-hall-front', sigma: 0.03, note: 'Corner pilaster of the Tanners\' Hall, 0.4 m deep.' },
    { id: 'well-post', kind: 'pole-shadow', azimuthSigmaDeg: 2, lengthSigma: 0.05, note: 'Post of the market well, 2.1 m.' },
    { id: 'weighhouse-dark', kind: 'wall-shaded', wall: 'weighhouse-west' },
    { id: 'weighhouse-clock', kind: 'clock', kept: { kind: 'mean' }, precisionMinutes: 2, dialHours: 12, note: 'The town council set the clock to mean time from 1766 (town records, invented).' },
  ],
  seed: 7,
};

/** (b) One shadow painted under other light: the consistency test flags it. */
export const SALT_HOUSE: ExampleSpec = {
  file: 'salt-house-sketch.yaml',
  comments: [
    'The courtyard of the Salt House, oil sketch: a fictional scene in the fictional town of Velmar (invented data).',
    'The walls and the well were painted on the spot in the morning; the standing figure was added in the studio,',
    'lit from the other side: its shadow (figure-shadow) does not belong to the same light, and the consistency',
    'test should say so.',
  ],
  title: 'Courtyard of the Salt House, oil sketch',
  calendar: { kind: 'gregorian' },
  calendarYaml: 'gregorian',
  windowYaml: ['fromYear: 1830', 'toYear: 1845', 'months: [3, 4, 5]       # bare trees with first leaves'],
  air: { pressureHPa: 965, temperatureC: 10 },
  walls: [
    { id: 'salt-house-south', azimuthDeg: 172, azimuthSigmaDeg: 1, note: 'Courtyard front of the Salt House, surveyed.' },
    { id: 'granary-east', azimuthDeg: 84, azimuthSigmaDeg: 1.5, note: 'East wall of the granary across the yard.' },
  ],
  truth: { day: { year: 1836, month: 4, day: 12 }, apparentMinutes: 10 * 60 + 20 },
  observations: [
    { id: 'lamp-bracket', kind: 'rod-shadow', wall: 'salt-house-south', sigmaDeg: 2, note: 'Bracket of the courtyard lamp.' },
    { id: 'door-hood', kind: 'overhang-shadow', wall: 'salt-house-south', sigma: 0.05, note: 'Hood over the salt-store door, projection 0.6 m.' },
    { id: 'pilaster', kind: 'fin-shadow', wall: 'granary-east', sigma: 0.04, note: 'Corner pilaster of the granary, 0.3 m deep.' },
    { id: 'well-sweep-post', kind: 'pole-shadow', azimuthSigmaDeg: 2, lengthSigma: 0.06, note: 'Upright of the well sweep, 3 m.' },
    {
      id: 'figure-shadow',
      kind: 'pole-shadow',
      azimuthSigmaDeg: 3,
      lengthSigma: 0.1,
      note: 'The standing carter, taken as a vertical pole of his height.',
      light: { day: { year: 1836, month: 4, day: 12 }, apparentMinutes: 15 * 60 + 30 },
    },
  ],
  seed: 11,
};

/** (c) A window across Velmar's switch from the Julian to the Gregorian calendar in 1700. */
export const UPPER_GATE: ExampleSpec = {
  file: 'upper-gate-drawing.yaml',
  comments: [
    'The Upper Gate, pen drawing: a fictional scene in the fictional town of Velmar (invented data).',
    'The drawing is known only to be from 1695-1705, and Velmar changed from the Julian to the Gregorian',
    'calendar in 1700 (18 February, Old Style, was followed by 1 March, New Style). The same light falls on',
    'a day near 25 April (Julian) before the switch and near 5 May (Gregorian) after it.',
  ],
  title: 'Upper Gate, pen drawing',
  calendar: VELMAR_SWITCH,
  calendarYaml: VELMAR_SWITCH_YAML,
  windowYaml: ['fromYear: 1695', 'toYear: 1705', 'months: [3, 4, 5]       # the hay is not yet cut'],
  air: { pressureHPa: 965, temperatureC: 15 },
  walls: [
    { id: 'gate-tower-west', azimuthDeg: 255, azimuthSigmaDeg: 1, note: 'Field side of the gate tower.' },
    { id: 'toll-house-front', azimuthDeg: 215, azimuthSigmaDeg: 1.5, note: 'Front of the toll house beside the gate.' },
  ],
  truth: { day: { year: 1699, month: 4, day: 25 }, apparentMinutes: 16 * 60 + 10 },
  observations: [
    { id: 'banner-pole', kind: 'rod-shadow', wall: 'gate-tower-west', sigmaDeg: 2, note: 'Pole of the town banner, square to the tower.' },
    { id: 'machicolation', kind: 'overhang-shadow', wall: 'gate-tower-west', sigma: 0.05, note: 'Gallery over the gate, projection 0.8 m.' },
    { id: 'toll-house-jamb', kind: 'fin-shadow', wall: 'toll-house-front', sigma: 0.04, note: 'Door jamb of the toll house, reveal 0.35 m.' },
    { id: 'milestone', kind: 'pole-shadow', azimuthSigmaDeg: 3, lengthSigma: 0.08, note: 'Milestone before the gate, 1.2 m.' },
  ],
  seed: 3,
};

export const EXAMPLES: readonly ExampleSpec[] = [MARKTGASSE, SALT_HOUSE, UPPER_GATE];
