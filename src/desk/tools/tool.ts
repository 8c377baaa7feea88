/**
 * What a desk tool is: a name of the trade, a key, the values it asks for beside the picture,
 * what it asks the user to click and in which order (one instruction per click), and the
 * transaction its clicks make on the document. Adding a tool is one file and one line in
 * registry.ts; nothing else changes.
 */
import type { PixelPoint } from '../../scene/types.js';
import { getAt, type Draft, type DraftValue } from '../draft.js';

/** Values typed into the tool's own fields, as text. */
export type ToolValues = Readonly<Record<string, string>>;

export interface ToolField {
  readonly name: string;
  readonly label: string;
  /** 'wall': a choice among the document's walls; 'lines': several lines of numbers. */
  readonly kind: 'wall' | 'number' | 'text' | 'choice' | 'lines';
  readonly choices?: readonly (readonly [value: string, words: string])[];
  readonly initial: string;
  /** Shown only when this is true of the other values. */
  readonly when?: (values: ToolValues) => boolean;
}

export interface ToolResult {
  readonly label: string;
  readonly change: (draft: Draft) => void;
}

export interface DeskTool {
  readonly id: string;
  /** Plain name of the trade, shown on its button. */
  readonly name: string;
  /** One key that picks the tool. */
  readonly key: string;
  readonly fields: readonly ToolField[];
  /** One instruction per click, in order: what to click next. */
  clicks(values: ToolValues, draft: Draft): readonly string[];
  /** The document change the clicks make; a string when the tool cannot be used yet (says why). */
  finish(draft: Draft, clicks: readonly PixelPoint[], values: ToolValues): ToolResult | string;
}

/** A typed number as a number; anything else kept as text, for the scene reader to name and refuse. */
export function typedNumber(text: string): DraftValue {
  const t = text.trim();
  return t !== '' && Number.isFinite(Number(t)) ? Number(t) : t;
}

/** Lines of two numbers each ("2 4", "3.2, 4"), for plane coordinates; text kept where not numbers. */
export function typedPairs(text: string): DraftValue[] {
  return text
    .split('\n')
    .map((l) => l.trim())
    .filter((l) => l !== '')
    .map((l) => l.split(/[\s,;]+/).map(typedNumber));
}

export function pointValue(p: PixelPoint): DraftValue {
  return [p[0], p[1]];
}

/** The index of a wall by id in the draft, or -1. */
export function wallIndex(draft: Draft, id: string): number {
  return (Array.isArray(draft.walls) ? draft.walls : []).findIndex((w) => w !== null && typeof w === 'object' && !Array.isArray(w) && w.id === id);
}

export const WALL_FIELD: ToolField = { name: 'wall', label: 'on wall', kind: 'wall', initial: '' };

/** True when the wall comes into the picture from the camera alone: a camera block, and no imagePlane on the wall. */
export function wallFromCamera(draft: Draft, wallId: string): boolean {
  const k = wallIndex(draft, wallId);
  return draft.camera !== undefined && k >= 0 && getAt(draft, ['walls', k, 'imagePlane']) === undefined;
}

/** The transaction that appends one observation to the document, with its label for undo. */
/** The light that casts a shadow, for every shadow tool: the sun (the default, not written) or the moon (docs/moon-evidence.md). */
export const LIGHT_FIELD: ToolField = { name: 'light', label: 'light', kind: 'choice', choices: [['sun', 'the sun'], ['moon', 'the moon (moonlight)']], initial: 'sun' };

/** `light: moon` on the observation when the tool's light is the moon; the sun, the default, is left out as the reader reads it. */
export function withLight(observation: Record<string, DraftValue>, values: ToolValues): void {
  if (values.light === 'moon') observation.light = 'moon';
}

export function addObservation(label: string, observation: Readonly<Record<string, DraftValue>>): ToolResult {
  return {
    label,
    change: (d: Draft) => {
      if (!Array.isArray(d.observations)) d.observations = [];
      (d.observations as DraftValue[]).push(observation as Record<string, DraftValue>);
    },
  };
}
