/**
 * Progress of long work on stderr, shown only when stderr is a terminal (io.errIsTerminal):
 * a single line rewritten in place ("drawing the date and hour map: 45%"), then cleared.
 * When stderr is a file or a pipe nothing is written at all, so logs and scripts stay clean.
 * The core never writes: it takes an optional `onProgress(done, total)` callback, and this
 * module makes one.
 */
import type { CliIo } from './io.js';

export interface Progress {
  /** The callback to hand to the core; undefined when progress is not shown. */
  readonly onProgress: ((done: number, total: number) => void) | undefined;
  /** End the progress line (clears it on a terminal). */
  finish(): void;
}

/**
 * A progress line labelled `label`, or a silent one when stderr is not a terminal.
 * @example const p = progressLine(io, 'drawing the date and hour map'); work({ onProgress: p.onProgress }); p.finish();
 */
export function progressLine(io: CliIo, label: string): Progress {
  if (!io.errIsTerminal) return { onProgress: undefined, finish: () => undefined };
  let shown = -1;
  let written = false;
  return {
    onProgress: (done: number, total: number) => {
      const percent = total > 0 ? Math.min(100, Math.floor((100 * done) / total)) : 100;
      if (percent === shown) return;
      shown = percent;
      written = true;
      io.err(`\r${label}: ${String(percent).padStart(3)}%`);
    },
    finish: () => {
      if (written) io.err(`\r${' '.repeat(label.length + 6)}\r`);
      written = false;
    },
  };
}

/**
 * Run `work` with a progress line (see progressLine), finished however the work ends.
 * @example const answer = withProgressLine(io, 'searching the window', (onProgress) => solveDates(scene, { onProgress }));
 */
export function withProgressLine<T>(io: CliIo, label: string, work: (onProgress: ((done: number, total: number) => void) | undefined) => T): T {
  const progress = progressLine(io, label);
  try {
    return work(progress.onProgress);
  } finally {
    progress.finish();
  }
}
