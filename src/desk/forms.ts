/**
 * The forms for what is not clicked: the scene's title, picture, site, calendar, window, air,
 * walls, facts (lit / shaded / sun up), clocks and sundials, and the moon (its direction, phase, lit
 * side, up or not up). Each field edits one path of the document in
 * one transaction; the scene reader's own message is shown beside the field it names.
 */
import { loadReformTable } from '../calendar/regions.js';
import { h, type Child } from './dom.js';
import { getAt, pathText, setAt, type Draft, type DraftPath, type DraftValue } from './draft.js';
import type { Refusal } from './derive.js';
import { NAMED_MOON_PHASES } from '../scene/readObservation.js';
import { typedNumber } from './tools/tool.js';

export interface FormContext {
  readonly draft: Draft;
  readonly refusal: Refusal | null;
  readonly itemRefusals: ReadonlyMap<string, string>;
  readonly commit: (label: string, change: (d: Draft) => void) => void;
  /** Sections the user opened or closed, by title (view state, kept across re-renders). */
  readonly sectionsOpen: Map<string, boolean>;
}

type FieldKind = 'number' | 'text' | 'checkbox' | 'select' | 'months' | 'longtext';

interface FieldSpec {
  readonly path: DraftPath;
  readonly label: string;
  readonly kind: FieldKind;
  readonly choices?: readonly (readonly [string, string])[];
  readonly hint?: string;
  readonly readOnly?: boolean;
}

/** The reader's message for this field, when it names this field or a part of it. */
function messageFor(ctx: FormContext, field: string): string | null {
  const r = ctx.refusal;
  if (!r) return null;
  if (r.field === field || r.field.startsWith(`${field}.`) || r.field.startsWith(`${field}[`)) return r.message;
  return null;
}

function valueText(v: DraftValue | undefined, kind: FieldKind): string {
  if (v === undefined || v === null) return '';
  if (kind === 'months' && Array.isArray(v)) return v.join(' ');
  if (typeof v === 'object') return JSON.stringify(v);
  return String(v);
}

function parseValue(text: string, kind: FieldKind): DraftValue | undefined {
  if (kind === 'months') {
    const parts = text.split(/[\s,;]+/).filter((p) => p !== '');
    return parts.length ? parts.map(typedNumber) : undefined;
  }
  if (text.trim() === '') return undefined;
  if (kind === 'number') return typedNumber(text);
  return text;
}

function field(ctx: FormContext, spec: FieldSpec): HTMLElement {
  const key = pathText(spec.path);
  const id = `f-${key.replace(/[^A-Za-z0-9_-]/g, '_')}`;
  const current = getAt(ctx.draft, spec.path);
  const message = messageFor(ctx, key);
  let input: HTMLInputElement | HTMLSelectElement | HTMLTextAreaElement;
  if (spec.kind === 'checkbox') {
    input = h('input', { type: 'checkbox', id, 'data-field': key, checked: current === true });
    input.addEventListener('change', () => {
      const checked = (input as HTMLInputElement).checked;
      ctx.commit(`${checked ? 'set' : 'clear'} ${key}`, (d) => setAt(d, spec.path, checked ? true : undefined));
    });
  } else if (spec.kind === 'select') {
    const text = valueText(current, 'text');
    const choices = spec.choices ?? [];
    const known = choices.some(([v]) => v === text);
    input = h('select', { id, 'data-field': key }, [
      h('option', { value: '', text: '(not given)' }),
      ...(!known && text !== '' ? [h('option', { value: text, text: `${text} (as in the file)` })] : []),
      ...choices.map(([v, words]) => h('option', { value: v, text: words })),
    ]);
    (input as HTMLSelectElement).value = text;
    input.addEventListener('change', () => {
      const v = (input as HTMLSelectElement).value;
      ctx.commit(`set ${key}`, (d) => setAt(d, spec.path, v === '' ? undefined : spec.path[spec.path.length - 1] === 'dialHours' ? typedNumber(v) : v));
    });
  } else {
    input = spec.kind === 'longtext'
      ? h('textarea', { id, 'data-field': key, rows: 2 })
      : h('input', { type: 'text', id, 'data-field': key, inputmode: spec.kind === 'number' ? 'decimal' : undefined, readonly: spec.readOnly, spellcheck: 'false' });
    input.value = valueText(current, spec.kind);
    input.addEventListener('change', () => {
      const v = parseValue(input.value, spec.kind);
      ctx.commit(`set ${key}`, (d) => setAt(d, spec.path, v));
    });
  }
  if (message) input.setAttribute('aria-invalid', 'true');
  const msgId = `${id}-msg`;
  if (message) input.setAttribute('aria-describedby', msgId);
  return h('div', { class: `field${message ? ' refused' : ''}` }, [
    h('label', { for: id, text: spec.label }),
    input,
    spec.hint ? h('span', { class: 'hint', text: spec.hint }) : null,
    message ? h('p', { class: 'message', id: msgId, role: 'alert' }, [h('strong', { text: 'Not accepted: ' }), message]) : null,
  ]);
}

function section(ctx: FormContext, title: string, children: readonly Child[], open = true): HTMLElement {
  const details = h('details', { class: 'form-section', open: ctx.sectionsOpen.get(title) ?? open }, [h('summary', { text: title }), ...children]);
  details.addEventListener('toggle', () => ctx.sectionsOpen.set(title, details.open));
  return details;
}

const YEAR_STARTS: readonly (readonly [string, string])[] = [
  ['jan1', '1 January'],
  ['mar25-forward', '25 March, after 1 January (Annunciation, Florentine / English)'],
  ['mar25-backward', '25 March, before 1 January (Pisan)'],
  ['mar1', '1 March (Venetian)'],
  ['dec25', '25 December (Nativity)'],
];
const WEEKDAY_CHOICES = ['sunday', 'monday', 'tuesday', 'wednesday', 'thursday', 'friday', 'saturday'].map((d) => [d, d] as const);

function calendarChoices(): (readonly [string, string])[] {
  const fixed: (readonly [string, string])[] = [['gregorian', 'Gregorian throughout'], ['julian', 'Julian throughout']];
  try {
    return [...fixed, ...loadReformTable().map((r) => [r.id, `${r.name} (reform table)`] as const)];
  } catch {
    return fixed;
  }
}

function listOf(draft: Draft, key: string): DraftValue[] {
  const v = draft[key];
  return Array.isArray(v) ? v : [];
}

function wallsSection(ctx: FormContext): HTMLElement {
  const walls = listOf(ctx.draft, 'walls');
  const items = walls.map((w, i) => {
    const path = ['walls', i];
    const refusal = ctx.itemRefusals.get(`walls[${i}]`);
    const name = String(getAt(w, ['id']) ?? `wall ${i + 1}`);
    return h('fieldset', { class: 'item' }, [
      h('legend', { text: `Wall ${i + 1}: ${name}` }),
      field(ctx, { path: [...path, 'id'], label: 'name (id)', kind: 'text' }),
      field(ctx, { path: [...path, 'azimuthDeg'], label: 'faces azimuth, deg (outward normal, from true north)', kind: 'number' }),
      field(ctx, { path: [...path, 'azimuthSigmaDeg'], label: 'its sigma, deg', kind: 'number' }),
      field(ctx, { path: [...path, 'note'], label: 'note', kind: 'longtext' }),
      getAt(w, ['imagePlane']) !== undefined ? h('p', { class: 'small', text: 'Its figure is clicked on the picture (Wall figure).' }) : h('p', { class: 'small', text: 'No figure clicked on it yet: use the Wall figure tool.' }),
      refusal ? h('p', { class: 'message', role: 'alert' }, [h('strong', { text: 'Not accepted: ' }), refusal]) : null,
      removeButton(ctx, `remove wall ${name}`, path),
    ]);
  });
  const add = h('button', { type: 'button', text: 'Add a wall' });
  add.addEventListener('click', () => ctx.commit('add a wall', (d) => {
    const list = Array.isArray(d.walls) ? d.walls : (d.walls = []);
    list.push({ id: `wall-${list.length + 1}`, azimuthDeg: '' as DraftValue, azimuthSigmaDeg: 1 });
  }));
  return section(ctx, 'Walls', [h('p', { class: 'small', text: 'Each wall: where it faces (the azimuth of its outward normal) and how well that is known.' }), ...items, add]);
}

function removeButton(ctx: FormContext, label: string, path: DraftPath): HTMLButtonElement {
  const b = h('button', { type: 'button', class: 'quiet', text: 'Remove' , 'aria-label': label });
  b.addEventListener('click', () => ctx.commit(label, (d) => setAt(d, path, undefined)));
  return b;
}

const FACT_KINDS: readonly (readonly [string, string])[] = [
  ['wall-lit', 'a wall is in sunlight'],
  ['wall-shaded', 'a wall is in shade'],
  ['sun-up', 'the sun is up'],
];

function factsAndClocks(ctx: FormContext): HTMLElement[] {
  const observations = listOf(ctx.draft, 'observations');
  const wallChoices = listOf(ctx.draft, 'walls').map((w) => String(getAt(w, ['id']) ?? '')).map((id) => [id, id] as const);
  const facts: HTMLElement[] = [];
  const clocks: HTMLElement[] = [];
  observations.forEach((o, k) => {
    const kind = String(getAt(o, ['kind']));
    const path = ['observations', k];
    const id = String(getAt(o, ['id']) ?? '');
    const refusal = ctx.itemRefusals.get(`observations[${k}]`);
    const refusalNode = refusal && messageFor(ctx, `observations[${k}]`) === null ? h('p', { class: 'message', role: 'alert' }, [h('strong', { text: 'Not accepted: ' }), refusal]) : null;
    if (kind === 'wall-lit' || kind === 'wall-shaded' || kind === 'sun-up') {
      facts.push(h('fieldset', { class: 'item' }, [
        h('legend', { text: `${FACT_KINDS.find(([v]) => v === kind)?.[1] ?? kind}: ${id}` }),
        field(ctx, { path: [...path, 'id'], label: 'name (id)', kind: 'text' }),
        kind !== 'sun-up' ? field(ctx, { path: [...path, 'wall'], label: 'wall', kind: 'select', choices: wallChoices }) : null,
        field(ctx, { path: [...path, 'note'], label: 'note', kind: 'longtext' }),
        refusalNode,
        removeButton(ctx, `remove ${id}`, path),
      ]));
    } else if (kind === 'clock') {
      clocks.push(h('fieldset', { class: 'item' }, [
        h('legend', { text: `Clock: ${id}` }),
        field(ctx, { path: [...path, 'id'], label: 'name (id)', kind: 'text' }),
        field(ctx, { path: [...path, 'reading'], label: 'reading, H:MM', kind: 'text' }),
        field(ctx, { path: [...path, 'precisionMinutes'], label: 'read to within, minutes (sigma)', kind: 'number' }),
        field(ctx, { path: [...path, 'dialHours'], label: 'hours on the dial', kind: 'select', choices: [['6', '6'], ['12', '12'], ['24', '24']] }),
        field(ctx, { path: [...path, 'hourHandTrusted'], label: 'the hour hand can be trusted', kind: 'checkbox' }),
        field(ctx, { path: [...path, 'kept'], label: 'what it kept (unknown, apparent, mean, meridian:LON, zone:NAME, ut, italian, italian+MIN, italian:dusk, babylonian, unequal)', kind: 'text' }),
        field(ctx, { path: [...path, 'note'], label: 'note', kind: 'longtext' }),
        refusalNode,
        removeButton(ctx, `remove ${id}`, path),
      ]));
    } else if (kind === 'sundial') {
      clocks.push(h('fieldset', { class: 'item' }, [
        h('legend', { text: `Sundial: ${id}` }),
        field(ctx, { path: [...path, 'id'], label: 'name (id)', kind: 'text' }),
        field(ctx, { path: [...path, 'reading'], label: 'reading among the hour lines, H:MM', kind: 'text' }),
        field(ctx, { path: [...path, 'hours'], label: 'hour lines', kind: 'select', choices: SUNDIAL_LINES }),
        field(ctx, { path: [...path, 'precisionMinutes'], label: 'read to within, minutes (sigma)', kind: 'number' }),
        field(ctx, { path: [...path, 'note'], label: 'note', kind: 'longtext' }),
        refusalNode,
        removeButton(ctx, `remove ${id}`, path),
      ]));
    }
  });
  const factKind = h('select', { id: 'new-fact-kind', 'aria-label': 'kind of fact' }, FACT_KINDS.map(([v, w]) => h('option', { value: v, text: w })));
  const addFact = h('button', { type: 'button', text: 'Add this fact' });
  addFact.addEventListener('click', () => ctx.commit('add a fact', (d) => {
    const list = Array.isArray(d.observations) ? d.observations : (d.observations = []);
    const kind = factKind.value;
    const fact: Record<string, DraftValue> = { id: `${kind}-${list.length + 1}`, kind };
    if (kind !== 'sun-up') fact.wall = wallChoices[0]?.[0] ?? '';
    list.push(fact);
  }));
  const addClock = h('button', { type: 'button', text: 'Add a clock' });
  addClock.addEventListener('click', () => ctx.commit('add a clock', (d) => {
    const list = Array.isArray(d.observations) ? d.observations : (d.observations = []);
    list.push({ id: `clock-${list.length + 1}`, kind: 'clock', reading: '', precisionMinutes: 5 });
  }));
  const addSundial = h('button', { type: 'button', text: 'Add a sundial' });
  addSundial.addEventListener('click', () => ctx.commit('add a sundial', (d) => {
    const list = Array.isArray(d.observations) ? d.observations : (d.observations = []);
    list.push({ id: `sundial-${list.length + 1}`, kind: 'sundial', reading: '', hours: 'apparent', precisionMinutes: 10 });
  }));
  return [
    section(ctx, 'Facts without numbers', [...facts, h('div', { class: 'row' }, [factKind, addFact])], facts.length > 0),
    section(ctx, 'Clocks and sundials', [...clocks, h('div', { class: 'row' }, [addClock, addSundial])], clocks.length > 0),
  ];
}

/** The hour lines a sundial may carry (src/scene/readObservation.ts), value and words. */
const SUNDIAL_LINES: readonly (readonly [string, string])[] = [
  ['apparent', 'equal hours (local apparent time)'],
  ['italian', 'Italian hours (since sunset)'],
  ['babylonian', 'Babylonian hours (since sunrise)'],
  ['unequal', 'unequal hours (twelfths of the daylight)'],
];

/** The moon's observations (docs/moon-evidence.md), value and words. */
const MOON_KINDS: readonly (readonly [string, string])[] = [
  ['moon-direction', "the moon's direction (azimuth and altitude)"],
  ['moon-phase', 'how much of the moon is lit (its phase)'],
  ['moon-phase-named', "the moon's phase by name"],
  ['moon-lit-side', 'which way its lit side faces, as drawn'],
  ['moon-up', 'the moon is in the sky'],
  ['moon-not-up', 'the moon is not in the sky'],
];

/** A new moon observation of a kind, with the keys the scene reader asks for (left empty to be filled in). */
export function newMoonObservation(choice: string, n: number): Record<string, DraftValue> {
  const kind = choice === 'moon-phase-named' ? 'moon-phase' : choice;
  const o: Record<string, DraftValue> = { id: `${kind}-${n}`, kind };
  if (choice === 'moon-phase-named') return { ...o, phase: '' };
  if (kind === 'moon-direction') Object.assign(o, { azimuthDeg: '', azimuthSigmaDeg: 2, altitudeDeg: '', altitudeSigmaDeg: 2 });
  if (kind === 'moon-phase') Object.assign(o, { illuminatedFraction: '', sigma: 0.05 });
  if (kind === 'moon-lit-side') Object.assign(o, { litSideDeg: '', sigmaDeg: 10 });
  return o;
}

/** The fields of one moon observation; the reader's messages beside them. */
function moonFields(ctx: FormContext, kind: string, path: DraftPath): (HTMLElement | null)[] {
  const clicked = getAt(ctx.draft, [...path, 'pixels', 'centrePx']);
  if (kind === 'moon-direction' && getAt(ctx.draft, [...path, 'pixels']) !== undefined) {
    return [
      h('p', { class: 'small', text: `The moon's centre clicked at [${Array.isArray(clicked) ? clicked.join(', ') : '?'}] px (the Moon's centre tool); its azimuth and altitude are measured from the picture.` }),
      field(ctx, { path: [...path, 'pixels', 'sigmaPx'], label: 'clicking sigma, px', kind: 'number', hint: "default: the picture's" }),
    ];
  }
  if (kind === 'moon-direction') {
    return [
      field(ctx, { path: [...path, 'azimuthDeg'], label: 'azimuth, deg (from true north, clockwise)', kind: 'number' }),
      field(ctx, { path: [...path, 'azimuthSigmaDeg'], label: 'its sigma, deg', kind: 'number' }),
      field(ctx, { path: [...path, 'altitudeDeg'], label: "altitude of the moon's centre, deg (as seen, refracted)", kind: 'number' }),
      field(ctx, { path: [...path, 'altitudeSigmaDeg'], label: 'its sigma, deg', kind: 'number' }),
    ];
  }
  if (kind === 'moon-phase') {
    return [
      h('p', { class: 'small', text: 'Give either the lit fraction with its sigma, or a named phase (not both).' }),
      field(ctx, { path: [...path, 'illuminatedFraction'], label: 'lit fraction of the disc (0 new to 1 full)', kind: 'number' }),
      field(ctx, { path: [...path, 'sigma'], label: 'its sigma (more than 0, up to 1)', kind: 'number' }),
      field(ctx, { path: [...path, 'phase'], label: 'or a named phase', kind: 'select', choices: NAMED_MOON_PHASES.map((p) => [p, p] as const) }),
      field(ctx, { path: [...path, 'sigmaDeg'], label: 'its sigma, deg of phase longitude', kind: 'number', hint: 'default 22.5' }),
    ];
  }
  if (kind === 'moon-lit-side') {
    return [
      field(ctx, { path: [...path, 'litSideDeg'], label: 'lit side, deg from straight up in the picture, + towards the left (0 top, 90 left, -90 right, 180 bottom), as the print shows it', kind: 'number' }),
      field(ctx, { path: [...path, 'sigmaDeg'], label: 'its sigma, deg', kind: 'number' }),
    ];
  }
  return [];
}

function moonSection(ctx: FormContext): HTMLElement {
  const items: HTMLElement[] = [];
  listOf(ctx.draft, 'observations').forEach((o, k) => {
    const kind = String(getAt(o, ['kind']));
    const words = MOON_KINDS.find(([v]) => v === kind)?.[1];
    if (words === undefined) return;
    const path = ['observations', k];
    const id = String(getAt(o, ['id']) ?? '');
    const refusal = ctx.itemRefusals.get(`observations[${k}]`);
    items.push(h('fieldset', { class: 'item', 'data-item': `observations[${k}]` }, [
      h('legend', { text: `${words[0].toUpperCase()}${words.slice(1)}: ${id}` }),
      field(ctx, { path: [...path, 'id'], label: 'name (id)', kind: 'text' }),
      ...moonFields(ctx, kind, path),
      field(ctx, { path: [...path, 'note'], label: 'note', kind: 'longtext' }),
      refusal && messageFor(ctx, `observations[${k}]`) === null ? h('p', { class: 'message', role: 'alert' }, [h('strong', { text: 'Not accepted: ' }), refusal]) : null,
      removeButton(ctx, `remove ${id}`, path),
    ]));
  });
  const kind = h('select', { id: 'new-moon-kind', 'aria-label': 'kind of moon observation' }, MOON_KINDS.map(([v, w]) => h('option', { value: v, text: w })));
  const add = h('button', { type: 'button', id: 'add-moon', text: 'Add this' });
  add.addEventListener('click', () => ctx.commit(`add ${kind.value.replace('-named', '')}`, (d) => {
    const list = Array.isArray(d.observations) ? d.observations : (d.observations = []);
    list.push(newMoonObservation(kind.value, list.length + 1));
  }));
  return section(ctx, 'The moon', [
    h('p', { class: 'small', text: "A moon drawn in the picture narrows the years (docs/moon-evidence.md). It needs the sun's evidence beside it; a painted moon may be a convention." }),
    ...items,
    h('div', { class: 'row' }, [kind, add]),
  ], items.length > 0);
}

/** All the forms, in the order of the scene file. */
export function renderForms(ctx: FormContext): HTMLElement[] {
  // the reader's first refusal, also at the top (the field itself may be further down, marked the same way)
  const whole = ctx.refusal
    ? h('p', { class: 'message', role: 'status' }, [h('strong', { text: ctx.refusal.field === '' ? 'Not accepted: ' : 'Not complete yet: ' }), ctx.refusal.message])
    : h('p', { class: 'small', text: 'The scene reader takes this scene as it stands.' });
  return [
    whole,
    section(ctx, 'Scene', [
      field(ctx, { path: ['title'], label: 'title', kind: 'text' }),
      field(ctx, { path: ['seed'], label: 'seed for Monte Carlo runs', kind: 'number', hint: 'default 1' }),
    ]),
    section(ctx, 'Picture', [
      field(ctx, { path: ['image', 'file'], label: 'file', kind: 'text', readOnly: true }),
      field(ctx, { path: ['image', 'widthPx'], label: 'width, px (read from the file)', kind: 'number', readOnly: true }),
      field(ctx, { path: ['image', 'heightPx'], label: 'height, px (read from the file)', kind: 'number', readOnly: true }),
      field(ctx, { path: ['image', 'pixelSigmaPx'], label: 'clicking precision, px (sigma)', kind: 'number' }),
      field(ctx, { path: ['image', 'mirrored'], label: 'reversed print (mirror: x is flipped before measuring)', kind: 'checkbox' }),
    ]),
    section(ctx, 'Site', [
      field(ctx, { path: ['site', 'latitudeDeg'], label: 'latitude, deg (north +)', kind: 'number' }),
      field(ctx, { path: ['site', 'longitudeDeg'], label: 'longitude, deg (east +)', kind: 'number' }),
      field(ctx, { path: ['site', 'elevationM'], label: 'elevation, m', kind: 'number' }),
    ]),
    section(ctx, 'Calendar and window', [
      field(ctx, { path: ['calendar'], label: 'calendar in force at the site', kind: 'select', choices: calendarChoices() }),
      field(ctx, { path: ['yearStart'], label: 'year began on', kind: 'select', choices: YEAR_STARTS }),
      field(ctx, { path: ['window', 'fromYear'], label: 'from year', kind: 'number' }),
      field(ctx, { path: ['window', 'toYear'], label: 'to year', kind: 'number' }),
      field(ctx, { path: ['window', 'months'], label: 'months allowed (numbers, e.g. 5 6 7)', kind: 'months' }),
      field(ctx, { path: ['window', 'notBefore'], label: 'not before (date, YYYY-MM-DD)', kind: 'text' }),
      field(ctx, { path: ['window', 'notAfter'], label: 'not after (date, YYYY-MM-DD)', kind: 'text' }),
      field(ctx, { path: ['window', 'weekday'], label: 'weekday', kind: 'select', choices: WEEKDAY_CHOICES }),
    ]),
    section(ctx, 'Air (for refraction)', [
      field(ctx, { path: ['air', 'pressureHPa'], label: 'pressure, hPa', kind: 'number' }),
      field(ctx, { path: ['air', 'temperatureC'], label: 'temperature, deg C', kind: 'number' }),
    ], ctx.draft.air !== undefined),
    wallsSection(ctx),
    ...factsAndClocks(ctx),
    moonSection(ctx),
  ];
}
