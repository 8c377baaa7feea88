/**
 * What the parts of the desk's page share: the view state beside the document (the tool, its
 * clicks, the selection, the keyboard cross, a point being dragged) and the few page actions one
 * part asks of another (redraw, show a notice, zoom). main.ts builds it once; the other modules
 * (documentChanges.ts, toolPanel.ts, keys.ts, sceneDocument.ts) take it as their argument.
 */
import type { PixelPoint } from '../scene/types.js';
import type { AnswerPanel } from './answerPanel.js';
import type { Derived } from './derive.js';
import type { Draft, DraftPath } from './draft.js';
import type { History } from './history.js';
import type { ViewTransform } from './viewer.js';

export interface DeskState {
  history: History;
  derived: Derived;
  view: ViewTransform;
  toolId: string | null;
  toolValues: Record<string, Record<string, string>>;
  clicks: PixelPoint[];
  selection: DraftPath | null;
  /** The keyboard cross, picture pixels, for placing points without a mouse. */
  cross: PixelPoint | null;
  pointer: PixelPoint | null;
  /** While a point is dragged: the document with the point moved (not yet committed). */
  preview: Draft | null;
  sectionsOpen: Map<string, boolean>;
  /** Where the work in progress is kept in the browser's storage (one key per opened file). */
  storageKey: string;
}

export type Notice = (text: string, kind?: 'info' | 'error') => void;

export interface DeskApp {
  readonly state: DeskState;
  readonly answers: AnswerPanel;
  readonly notice: Notice;
  /** Everything shown from the document, again (forms, measurements, tools, overlay, picture). */
  renderDocument(): void;
  /** The picture and its marks, at the next frame. */
  drawSoon(): void;
  /** The picture's size in pixels: the document's image block, else the picture's own. */
  pictureSize(): { w: number; h: number };
  /** The picture's own size as decoded, or null before a picture is loaded. */
  pictureDimensions(): { width: number; height: number } | null;
  setZoom(value: string): void;
  zoomBy(factor: number): void;
  loadPicture(name: string): Promise<void>;
}
