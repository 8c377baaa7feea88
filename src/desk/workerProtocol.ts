/**
 * Messages between the page and the date solver's Web Worker (worker.ts). Plain data only.
 */
import type { CheckAnswer, DateAnswer } from '../solver/types.js';
import type { Draft } from './draft.js';
import type { CheckOptions } from '../cli/checkSpec.js';

/** A proposal as typed in the check form: `heliochron check`'s own options. */
export type CheckRequestFields = Pick<CheckOptions, 'on' | 'time' | 'clock' | 'within' | 'between' | 'season'>;

export type WorkerRequestBody =
  | { readonly kind: 'date'; readonly draft: Draft; readonly charts: boolean }
  | { readonly kind: 'check'; readonly draft: Draft; readonly proposal: CheckRequestFields }
  /** The HTML report of a saved scene file, as `heliochron report <sceneName> -o <output>` writes it. */
  | { readonly kind: 'report'; readonly sceneText: string; readonly sceneName: string; readonly sha256: string; readonly output: string };

export type WorkerRequest = WorkerRequestBody & { readonly id: number };

export type WorkerReply =
  | { readonly id: number; readonly kind: 'progress'; readonly stage: string; readonly fraction: number | null }
  | {
      readonly id: number;
      readonly kind: 'date';
      readonly answer: DateAnswer;
      /** The text answer of `heliochron date`. */
      readonly text: string;
      /** The charts; `light` is 'moon' when they are drawn for the moon (a scene lit by the moon alone, src/charts/chartLight.ts). */
      readonly charts: { readonly map: string; readonly sky: string; readonly residuals: string; readonly light: 'sun' | 'moon' } | null;
      /** Time the solve took in the worker, ms. */
      readonly solveMs: number;
    }
  | { readonly id: number; readonly kind: 'check'; readonly answer: CheckAnswer; readonly text: string }
  | { readonly id: number; readonly kind: 'report'; readonly html: string }
  | { readonly id: number; readonly kind: 'error'; readonly message: string };
