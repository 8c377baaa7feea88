/**
 * The measurements panel: each straightened plane with its residuals, and each shadow measured
 * from its clicks with its value, sigma, the parts of that sigma and any warning, all as the
 * library computed them (derive.ts), each next to its item, with a button to delete it.
 */
import { LINEARITY_TOLERANCE, rectificationReport } from '../image/pixelObservations.js';
import { measuredQuantities } from '../image/resolvePixels.js';
import { MEASURED_VALUE_WORDS, PIXEL_KIND_WORDS } from '../image/measuredValueWords.js';
import { h } from './dom.js';
import { getAt, type Draft, type DraftPath } from './draft.js';
import type { Derived } from './derive.js';
import { renderPerspective } from './perspectivePanel.js';

const KIND_WORDS = PIXEL_KIND_WORDS;

export interface MeasurementsContext {
  readonly draft: Draft;
  readonly derived: Derived;
  readonly commit: (label: string, change: (d: Draft) => void) => void;
  readonly remove: (label: string, path: DraftPath) => void;
}

function refusalNote(message: string): HTMLElement {
  return h('p', { class: 'message', role: 'alert' }, [h('strong', { text: 'Not accepted: ' }), message]);
}

function planeItems(ctx: MeasurementsContext): HTMLElement[] {
  const items: HTMLElement[] = [];
  const fields: string[] = [];
  if (ctx.draft.groundPlane !== undefined) fields.push('groundPlane');
  (Array.isArray(ctx.draft.walls) ? ctx.draft.walls : []).forEach((w, i) => getAt(w, ['imagePlane']) !== undefined && fields.push(`walls[${i}].imagePlane`));
  for (const field of fields) {
    const plane = ctx.derived.planes.get(field);
    const refusal = ctx.derived.itemRefusals.get(field) ?? (field.startsWith('walls') ? ctx.derived.itemRefusals.get(field.replace('.imagePlane', '')) : undefined);
    const wallNo = /^walls\[(\d+)\]/.exec(field);
    const title = wallNo ? `Wall figure on ${String(getAt(ctx.draft, ['walls', Number(wallNo[1]), 'id']))} (W${Number(wallNo[1]) + 1})` : 'Ground (G)';
    const path: DraftPath = wallNo ? ['walls', Number(wallNo[1]), 'imagePlane'] : ['groundPlane'];
    const remove = h('button', { type: 'button', class: 'quiet', text: 'Delete', 'aria-label': `delete ${title}` });
    remove.addEventListener('click', () => ctx.remove(`delete ${title}`, path));
    const body: (HTMLElement | null)[] = [];
    if (plane) {
      const r = rectificationReport(plane);
      const misfit = / larger than the clicking precision/.test(r.note);
      body.push(h('p', { class: 'small', text: `residuals ${r.residualsPx.map((v) => v.toFixed(2)).join(', ')} px; rms ${r.rmsPx.toFixed(2)} px; condition number ${r.conditionNumber.toPrecision(3)}` }));
      // the worst point named by its label on the picture (numbered from 1), not by its index
      const worst = r.residualsPx.indexOf(Math.max(...r.residualsPx));
      const short = wallNo ? `W${Number(wallNo[1]) + 1}` : 'G';
      const note = r.exactlyDetermined || plane.fromWalls
        ? r.note
        : `largest residual ${r.residualsPx[worst].toFixed(2)} px at ${short} ${worst + 1}: ${misfit ? 'larger than the clicking precision, so a point is misclicked or the picture does not follow one perspective on this plane' : 'within the clicking precision'}`;
      body.push(h('p', { class: misfit ? 'warning' : 'small' }, [misfit ? h('strong', { text: 'Warning: ' }) : null, note]));
    }
    if (refusal) body.push(refusalNote(refusal));
    items.push(h('li', { class: 'item', 'data-item': field }, [h('h4', { text: title }), ...body, remove]));
  }
  return items;
}

function observationItems(ctx: MeasurementsContext): HTMLElement[] {
  const list = Array.isArray(ctx.draft.observations) ? ctx.draft.observations : [];
  const items: HTMLElement[] = [];
  list.forEach((o, k) => {
    const kind = String(getAt(o, ['kind']));
    if (!KIND_WORDS[kind] || getAt(o, ['pixels']) === undefined) return;
    const field = `observations[${k}]`;
    const id = String(getAt(o, ['id']));
    const wall = getAt(o, ['wall']) ?? getAt(o, ['pixels', 'wall']);
    const m = ctx.derived.measurements.find((x) => x.field === field);
    const refusal = ctx.derived.itemRefusals.get(field);
    const rows: HTMLElement[] = [];
    if (m) {
      const quantities = measuredQuantities(m.measurement);
      quantities.forEach(({ name, quantity: q }, j) => {
        const used = m.values[j];
        const words = MEASURED_VALUE_WORDS[name];
        const w = { ...words, unit: words.unit ? ` ${words.unit}` : '' };
        const side = (name === 'slopeDeg' || name === 'widthRatio') && 'side' in m.measurement ? `, to the ${m.measurement.side}` : '';
        rows.push(h('div', { class: 'value', 'data-value': name, 'data-number': String(q.value), 'data-sigma': String(used.sigma) }, [
          h('span', { class: 'value-name', text: w.label }),
          h('span', { class: 'value-number', text: `${q.value.toFixed(w.digits)}${w.unit}${side}` }),
          h('span', { class: 'value-sigma', text: `sigma ${used.sigma.toFixed(w.digits)}${w.unit}${used.sigmaSource === 'monte-carlo' ? ' (Monte Carlo spread)' : ''}` }),
          h('span', { class: 'small', text: `parts: clicked figure ${q.sigmaFromPlane.toFixed(w.digits)}, shadow points ${q.sigmaFromPoints.toFixed(w.digits)}${q.sigmaFromLength > 0 ? `, stated length ${q.sigmaFromLength.toFixed(w.digits)}` : ''}${q.sigmaFromAzimuth > 0 ? `, wall azimuth ${q.sigmaFromAzimuth.toFixed(w.digits)}` : ''}` }),
        ]));
        if (!q.firstOrderReliable) {
          rows.push(h('p', { class: 'warning' }, [h('strong', { text: 'Warning: ' }),
            `the first-order sigma of ${name} is not reliable (nonlinearity ${q.nonlinearity.toFixed(2)} > ${LINEARITY_TOLERANCE}); ${used.monteCarloSigma !== undefined ? `the Monte Carlo spread ${used.monteCarloSigma.toPrecision(3)} is shown. ` : ''}Click a larger figure nearer the shadow.`]));
        }
      });
    }
    const remove = h('button', { type: 'button', class: 'quiet', text: 'Delete', 'aria-label': `delete ${id}` });
    remove.addEventListener('click', () => ctx.remove(`delete ${id}`, ['observations', k]));
    items.push(h('li', { class: 'item', 'data-item': field, 'data-id': id }, [
      h('h4', { text: `${id}: ${KIND_WORDS[kind]}${kind === 'eave-shadow' ? ` of wall ${String(wall)}, on the ground` : typeof wall === 'string' ? ` on wall ${wall}` : ' on the ground'}` }),
      ...rows,
      refusal ? refusalNote(refusal) : null,
      getAt(o, ['note']) !== undefined ? h('p', { class: 'note', text: String(getAt(o, ['note'])) }) : null,
      remove,
    ]));
  });
  return items;
}

export function renderMeasurements(ctx: MeasurementsContext): HTMLElement[] {
  const planes = planeItems(ctx);
  const shadows = observationItems(ctx);
  return [
    h('h3', { text: 'Figures straightened' }),
    planes.length ? h('ul', { class: 'items' }, planes) : h('p', { class: 'small', text: 'None yet: click a wall figure or a ground figure.' }),
    h('h3', { text: 'Shadows measured' }),
    shadows.length ? h('ul', { class: 'items' }, shadows) : h('p', { class: 'small', text: 'None yet: pick a shadow tool and click its two points.' }),
    ...renderPerspective({ draft: ctx.draft, perspective: ctx.derived.perspective, remove: ctx.remove }),
  ];
}
