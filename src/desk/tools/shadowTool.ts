/**
 * The common shape of the four two-click shadow tools (rod, overhang, fin, pole): two points,
 * from (`fromPx`) then to (`toPx`), as docs/measuring.md section 3 asks, and the lengths the
 * kind needs. Each tool file states its own words and fields.
 */
import type { PixelPoint } from '../../scene/types.js';
import { freshObservationId, type Draft, type DraftValue } from '../draft.js';
import { pointValue, typedNumber, wallIndex, type DeskTool, type ToolField, type ToolValues } from './tool.js';

export interface ShadowToolSpec {
  readonly id: string;
  readonly kind: 'rod-shadow' | 'overhang-shadow' | 'fin-shadow' | 'pole-shadow';
  readonly name: string;
  readonly key: string;
  readonly onWall: boolean;
  readonly fromWords: string;
  readonly toWords: string;
  /** Extra fields copied into `pixels` by name (projectionM, heightM, ...). */
  readonly lengthFields: readonly ToolField[];
}

export function shadowTool(spec: ShadowToolSpec): DeskTool {
  const fields: ToolField[] = [
    { name: 'id', label: 'name (id)', kind: 'text', initial: spec.id },
    ...(spec.onWall ? [{ name: 'wall', label: 'on wall', kind: 'wall' as const, initial: '' }] : []),
    ...spec.lengthFields,
    { name: 'note', label: 'note', kind: 'text', initial: '' },
  ];
  return {
    id: spec.kind,
    name: spec.name,
    key: spec.key,
    fields,
    clicks: () => [`Click ${spec.fromWords}.`, `Click ${spec.toWords}.`],
    finish(draft: Draft, clicks: readonly PixelPoint[], values: ToolValues) {
      if (spec.onWall && wallIndex(draft, values.wall ?? '') < 0) return 'Choose the wall it falls on (add the wall under Walls first).';
      const id = values.id?.trim() ? freshObservationId(draft, values.id.trim()) : freshObservationId(draft, spec.id);
      const pixels: Record<string, DraftValue> = { fromPx: pointValue(clicks[0]), toPx: pointValue(clicks[1]) };
      for (const f of spec.lengthFields) if ((values[f.name] ?? '').trim() !== '') pixels[f.name] = typedNumber(values[f.name]);
      const observation: Record<string, DraftValue> = { id, kind: spec.kind };
      if (spec.onWall) observation.wall = values.wall;
      if ((values.note ?? '').trim() !== '') observation.note = values.note.trim();
      observation.pixels = pixels;
      return {
        label: `add ${spec.name.toLowerCase()} ${id}`,
        change: (d: Draft) => {
          if (!Array.isArray(d.observations)) d.observations = [];
          (d.observations as DraftValue[]).push(observation);
        },
      };
    },
  };
}
