/**
 * The common shape of the shadow tools on one plane (rod, overhang, fin, pole, eave): their
 * points in order, from (`fromPx`) then to (`toPx`), as docs/measuring.md section 3 asks, or the
 * kind's own list (the eave's foot line takes two), and the lengths the kind needs. An overhang
 * or fin on a wall that only the camera puts into the picture (no imagePlane, a camera block) is
 * known there up to scale: its front point (`tipPx`) is clicked third in place of the depth in
 * metres (docs/measuring.md, section 8a). Each tool file states its own words and fields.
 */
import type { PixelPoint } from '../../scene/types.js';
import { freshObservationId, type Draft, type DraftValue } from '../draft.js';
import { addObservation, LIGHT_FIELD, pointValue, typedNumber, wallFromCamera, wallIndex, withLight, type DeskTool, type ToolField, type ToolValues } from './tool.js';

export interface ShadowToolSpec {
  readonly id: string;
  readonly kind: 'rod-shadow' | 'overhang-shadow' | 'fin-shadow' | 'pole-shadow' | 'eave-shadow';
  readonly name: string;
  readonly key: string;
  readonly onWall: boolean;
  readonly fromWords: string;
  readonly toWords: string;
  /** The points under `pixels` in click order, with what to click; absent: fromPx then toPx. */
  readonly points?: readonly (readonly [key: string, words: string])[];
  /** Extra fields copied into `pixels` by name (projectionM, heightM, ...). */
  readonly lengthFields: readonly ToolField[];
  /** What to click as `tipPx` when the wall comes from the camera; absent: the kind takes no tip. */
  readonly tipWords?: string;
}

export function shadowTool(spec: ShadowToolSpec): DeskTool {
  const points = spec.points ?? [['fromPx', spec.fromWords], ['toPx', spec.toWords]];
  const fields: ToolField[] = [
    { name: 'id', label: 'name (id)', kind: 'text', initial: spec.id },
    ...(spec.onWall ? [{ name: 'wall', label: 'on wall', kind: 'wall' as const, initial: '' }] : []),
    ...spec.lengthFields,
    LIGHT_FIELD,
    { name: 'note', label: 'note', kind: 'text', initial: '' },
  ];
  /** The points to click: the kind's own, plus the tip on a wall from the camera. */
  const pointsFor = (values: ToolValues, draft: Draft): readonly (readonly [string, string])[] =>
    spec.tipWords !== undefined && wallFromCamera(draft, values.wall ?? '')
      ? [...points, ['tipPx', `${spec.tipWords} (the wall comes from the camera, so the depth in metres is not used)`]]
      : points;
  return {
    id: spec.kind,
    name: spec.name,
    key: spec.key,
    fields,
    clicks: (values: ToolValues, draft: Draft) => pointsFor(values, draft).map(([, words]) => `Click ${words}.`),
    finish(draft: Draft, clicks: readonly PixelPoint[], values: ToolValues) {
      if (spec.onWall && wallIndex(draft, values.wall ?? '') < 0) return 'Choose the wall it falls on (add the wall under Walls first).';
      const id = values.id?.trim() ? freshObservationId(draft, values.id.trim()) : freshObservationId(draft, spec.id);
      const clicked = pointsFor(values, draft);
      const pixels: Record<string, DraftValue> = Object.fromEntries(clicked.map(([key], k) => [key, pointValue(clicks[k])]));
      // through the tip the ratio is free of scale: a depth in metres would be refused beside it
      if (clicked.length === points.length) for (const f of spec.lengthFields) if ((values[f.name] ?? '').trim() !== '') pixels[f.name] = typedNumber(values[f.name]);
      const observation: Record<string, DraftValue> = { id, kind: spec.kind };
      if (spec.onWall) observation.wall = values.wall;
      withLight(observation, values);
      if ((values.note ?? '').trim() !== '') observation.note = values.note.trim();
      observation.pixels = pixels;
      return addObservation(`add ${spec.name.toLowerCase()} ${id}`, observation);
    },
  };
}
