/**
 * The picture's own perspective in the measurements panel: the camera found from the clicked
 * vertical edges and wall courses (focal length, principal point, view azimuth and tilt, with
 * their sigmas, and the note when the principal point is assumed at the centre), how closely the
 * lines of each family meet, each group's sun from its object-shadow pairs with the group test,
 * and every refusal beside its item in the library's own words (derivePerspective.ts). Nothing
 * is computed here: every number and sentence is the library's.
 */
import { GROUP_COLOURS } from '../image/cameraOverlay.js';
import type { ValueWithSigma } from '../image/camera.js';
import { h } from './dom.js';
import { getAt, type Draft, type DraftPath, type DraftValue } from './draft.js';
import type { Perspective } from './derivePerspective.js';

export interface PerspectiveContext {
  readonly draft: Draft;
  readonly perspective: Perspective | null;
  readonly remove: (label: string, path: DraftPath) => void;
}

function refusalNote(message: string): HTMLElement {
  return h('p', { class: 'message', role: 'alert' }, [h('strong', { text: 'Not accepted: ' }), message]);
}

/** One value with its sigma; the exact numbers in data attributes for tests and assistive tools. */
function valueRow(name: string, label: string, v: ValueWithSigma, unit: string, digits: number, extra = ''): HTMLElement {
  return h('div', { class: 'value', 'data-value': name, 'data-number': String(v.value), 'data-sigma': String(v.sigma) }, [
    h('span', { class: 'value-name', text: label }),
    // no "-0.00": a value that rounds to zero is shown as zero
    h('span', { class: 'value-number', text: `${(Math.abs(v.value) < 0.5 * 10 ** -digits ? 0 : v.value).toFixed(digits)}${unit}` }),
    h('span', { class: 'value-sigma', text: `sigma ${v.sigma.toFixed(digits)}${unit}${extra}` }),
  ]);
}

function deleteButton(ctx: PerspectiveContext, label: string, path: DraftPath): HTMLElement {
  const b = h('button', { type: 'button', class: 'quiet', text: 'Delete', 'aria-label': label });
  b.addEventListener('click', () => ctx.remove(label, path));
  return b;
}

function cameraItems(ctx: PerspectiveContext): HTMLElement[] {
  const p = ctx.perspective;
  const block = ctx.draft.camera;
  if (block === undefined) return [h('p', { class: 'small', text: 'None yet: pick Vertical edges (V) and click two or more vertical edges, then Wall courses (H) along the horizontal edges of a wall of known azimuth.' })];
  const vertical = getAt(block, ['verticalLines']);
  const wallLines = getAt(block, ['wallLines']);
  const counts = `${Array.isArray(vertical) ? vertical.length : 0} vertical edge(s); ${(Array.isArray(wallLines) ? wallLines : [])
    .map((e) => `${Array.isArray(getAt(e, ['lines'])) ? (getAt(e, ['lines']) as DraftValue[]).length : 0} course line(s) on wall ${String(getAt(e, ['wall']))}`).join('; ') || 'no wall courses'}`;
  const out: HTMLElement[] = [];
  const c = p?.camera;
  const body: (HTMLElement | null)[] = [h('p', { class: 'small', text: counts })];
  if (c) {
    body.push(h('p', { class: 'small', text: c.methodNote }));
    body.push(valueRow('focalLengthPx', 'focal length', c.focalLengthPx, ' px', 1, ` (horizontal field of view ${c.horizontalFieldOfViewDeg.toFixed(1)} deg)`));
    body.push(valueRow('principalXPx', 'principal point, x', c.principalPointPx[0], ' px', 1, c.principalPointAssumed ? ' (assumed)' : ''));
    body.push(valueRow('principalYPx', 'principal point, y', c.principalPointPx[1], ' px', 1, c.principalPointAssumed ? ' (assumed)' : ''));
    if (c.principalPointAssumed) body.push(h('p', { class: 'warning', 'data-note': 'principal-point-assumed' }, [h('strong', { text: 'Note: ' }), "the principal point is assumed at the picture's centre, not measured; a cropped picture or a shifted lens moves it, and that error is not in the sigmas."]));
    body.push(valueRow('viewAzimuthDeg', 'looking towards azimuth (from true north)', c.viewAzimuthDeg, ' deg', 2));
    body.push(valueRow('viewAltitudeDeg', `view altitude: tilted ${c.viewAltitudeDeg.value >= 0 ? 'up' : 'down'} by ${Math.abs(c.viewAltitudeDeg.value).toFixed(2)} deg`, c.viewAltitudeDeg, ' deg', 2));
    body.push(valueRow('rollDeg', 'rolled', c.rollDeg, ' deg', 2));
    if (!c.firstOrderReliable) body.push(h('p', { class: 'warning' }, [h('strong', { text: 'Warning: ' }), 'the first-order sigmas of the camera are not reliable (they bend within the clicking error).']));
    for (const n of c.notes.slice(1 + c.vanishingPoints.length)) body.push(h('p', { class: 'warning' }, [h('strong', { text: 'Warning: ' }), n]));
  } else if (p?.cameraRefusal) {
    body.push(h('div', { 'data-refused': p.cameraRefusal.field }, [refusalNote(p.cameraRefusal.message)]));
  }
  out.push(h('li', { class: 'item', 'data-item': 'camera' }, [h('h4', { text: 'Camera' }), ...body, deleteButton(ctx, 'delete the camera lines', ['camera'])]));
  // the families: how closely each meets
  c?.vanishingPoints.forEach((v, k) => {
    const misfit = c.directionMisfitsDeg[k];
    const where = v.pointPx ? `vanishing point [${v.pointPx[0].toFixed(1)}, ${v.pointPx[1].toFixed(1)}] px` : 'vanishing point at infinity (the lines are parallel in the picture)';
    out.push(h('li', { class: 'item', 'data-item': v.field, 'data-meets': String(v.meets) }, [
      h('h4', { text: `${v.field}: ${v.lineCount} lines` }),
      h('p', { class: 'small readout', text: where }),
      h('p', { class: v.meets ? 'small' : 'warning' }, [v.meets ? null : h('strong', { text: 'Warning: ' }), v.note]),
      misfit > 2 ? h('p', { class: 'warning' }, [h('strong', { text: 'Warning: ' }), `these lines lie ${misfit.toFixed(1)} deg from where the camera puts their stated direction: check the wall's azimuth and the lines`]) : null,
    ]));
  });
  return out;
}

function sunItems(ctx: PerspectiveContext): HTMLElement[] {
  const p = ctx.perspective;
  const groups = p?.drawing?.groups ?? [];
  return groups.map((g, k) => {
    const name = g.group ? `group "${g.group}"` : 'pairs without a group';
    const mc = g.sigmaSource === 'monte-carlo' ? ' (Monte Carlo spread)' : '';
    const vp = g.sun.vanishingPointPx;
    return h('li', { class: 'item', 'data-group': g.group, style: `border-left: 5px solid ${GROUP_COLOURS[k % GROUP_COLOURS.length]}` }, [
      h('h4', { text: `Sun of ${name}` }),
      h('p', { class: 'small', text: `from ${g.ids.join(', ')}` }),
      valueRow('azimuthDeg', 'sun azimuth (from true north)', { value: g.sun.azimuthDeg, sigma: g.azimuthSigmaDeg }, ' deg', 2, mc),
      valueRow('altitudeDeg', 'apparent altitude', { value: g.sun.altitudeDeg, sigma: g.altitudeSigmaDeg }, ' deg', 2, mc),
      h('p', { class: 'small', text: `first-order sigmas ${g.sun.azimuthSigmaDeg.toFixed(2)} and ${g.sun.altitudeSigmaDeg.toFixed(2)} deg, correlation ${g.correlation.toFixed(2)}; the dating takes each pair on its own, the camera's error shared` }),
      h('p', { class: 'small readout', text: `the shadow lines meet at ${vp ? `[${vp[0].toFixed(1)}, ${vp[1].toFixed(1)}] px (the ${g.sun.vanishingPointIsSun ? 'sun' : 'point opposite the sun'})` : 'infinity (the sun is square to the line of sight)'}` }),
      ...g.sun.notes.map((n) => h('p', { class: /NOT/.test(n) ? 'warning' : 'small', text: n })),
      g.againstRest
        ? h('p', { class: g.againstRest.pValue < 0.01 ? 'warning' : 'small', 'data-group-test': String(g.againstRest.pValue) }, [g.againstRest.sentence])
        : groups.length > 1 ? h('p', { class: 'small', text: 'not compared with the other pairs: taken together they do not point to one sun' }) : null,
    ]);
  });
}

function pairItems(ctx: PerspectiveContext): HTMLElement[] {
  const list = Array.isArray(ctx.draft.observations) ? ctx.draft.observations : [];
  const items: HTMLElement[] = [];
  list.forEach((o, k) => {
    const kind = getAt(o, ['kind']);
    if (kind !== 'object-shadow' && kind !== 'shadow-wedge') return;
    const field = `observations[${k}]`;
    const id = String(getAt(o, ['id']));
    const group = getAt(o, ['group']);
    const refusal = ctx.perspective?.pairRefusals.get(field);
    items.push(h('li', { class: 'item', 'data-item': field, 'data-id': id }, [
      h('h4', { text: `${id}: ${kind === 'shadow-wedge' ? 'shadow and wedge (a one-sided bound on the sun)' : 'object and shadow'}${typeof group === 'string' ? `, group ${group}` : ''}` }),
      refusal ? refusalNote(refusal) : null,
      getAt(o, ['note']) !== undefined ? h('p', { class: 'note', text: String(getAt(o, ['note'])) }) : null,
      deleteButton(ctx, `delete ${id}`, ['observations', k]),
    ]));
  });
  return items;
}

/** The perspective sections, or nothing when the document has no camera lines and no pairs. */
export function renderPerspective(ctx: PerspectiveContext): HTMLElement[] {
  const pairs = pairItems(ctx);
  if (ctx.draft.camera === undefined && pairs.length === 0) return [];
  const suns = sunItems(ctx);
  const sentences = ctx.perspective?.drawing?.groups.length === 2 && ctx.perspective.drawing.groups.some((g) => g.againstRest && g.againstRest.pValue < 0.01)
    ? [h('p', { class: 'small', text: 'With two groups the test is the same both ways: it says the two groups were not lit by one sun, not which of them is out of place.' })]
    : [];
  const out: (HTMLElement | null)[] = [
    h('h3', { text: "The picture's camera" }),
    h('ul', { class: 'items' }, cameraItems(ctx)),
    h('h3', { text: 'Sun from object and shadow' }),
    suns.length ? h('ul', { class: 'items' }, suns) : h('p', { class: 'small', text: 'None yet: with the camera found, pick Object and shadow (S) and click two or more pairs lit by one sun.' }),
    ...sentences,
    pairs.length ? h('ul', { class: 'items' }, pairs) : null,
    suns.length ? h('p', { class: 'small', text: 'These are estimates conditional on the picture following one camera, the lines being straight edges vertical or along the stated walls, and each shadow point belonging to its object point.' }) : null,
  ];
  return out.filter((x): x is HTMLElement => x !== null);
}

