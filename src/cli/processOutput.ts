/**
 * The process's standard output and error, written straight to file descriptors 1 and 2.
 *
 * Why not process.stdout and process.stderr: the first touch of either makes a stream object,
 * and for a pipe (a script reading the answer, `heliochron date | head`) that loads Node's
 * stream and network modules, some milliseconds of every run. A synchronous write to the
 * descriptor gives the same bytes in the same order (Node itself writes to files and, on Linux,
 * to pipes and terminals synchronously: Node.js documentation, process, "A note on process I/O").
 *
 * - A descriptor that would block (EAGAIN: a pipe or terminal opened non-blocking by the program
 *   at its other end, and full) is handed to the stream from then on, which waits for it; the
 *   text already written stays written, and the order of the text is kept.
 * - A reader that closed the pipe early (EPIPE, `heliochron date --json | head -5`) is not an
 *   error: the run ends quietly with the exit code it has so far (0 for a finished run), as it
 *   did with the stream.
 * - Any other failure is reported in one line on stderr and ends the run with exit code 2.
 * - On Windows the stream is used from the start (it writes a console's text as the console
 *   expects).
 * - When a run has ended and all its text went straight to the descriptors, the process may end at
 *   once (endWhenWritten) instead of waiting for work the run left to V8's background threads.
 */
import { fstatSync, writeSync } from 'node:fs';
import { isatty } from 'node:tty';
import { systemErrorWords } from './systemErrors.js';

/** The exit code of a run that could not write its output (EXIT_BAD_INPUT of main.ts). */
const EXIT_CANNOT_WRITE = 2;

type Fd = 1 | 2;

/** Descriptors handed to their stream (after EAGAIN, or on Windows). */
const onStream = new Set<Fd>(process.platform === 'win32' ? [1, 2] : []);
const guarded = new Set<Fd>();

function streamOf(fd: Fd): NodeJS.WriteStream {
  const stream = fd === 1 ? process.stdout : process.stderr;
  if (!guarded.has(fd)) {
    guarded.add(fd);
    stream.on('error', (error: NodeJS.ErrnoException) => cannotWrite(error));
  }
  return stream;
}

/** End the run after a failed write: quietly for a closed pipe, else with one line on stderr. */
function cannotWrite(error: NodeJS.ErrnoException): never {
  if (error.code !== 'EPIPE') {
    try {
      writeSync(2, `heliochron: cannot write the output: ${systemErrorWords(error)}\n`);
    } catch {
      // stderr is gone too: the exit code tells
    }
    process.exit(EXIT_CANNOT_WRITE);
  }
  process.exit(process.exitCode ?? 0);
}

/**
 * Write `text` whole to standard output (fd 1) or error (fd 2), synchronously (see the header).
 * @example writeToProcess(1, 'Sun\n')
 */
export function writeToProcess(fd: Fd, text: string): void {
  if (onStream.has(fd)) {
    streamOf(fd).write(text);
    return;
  }
  const bytes = Buffer.from(text, 'utf8');
  let offset = 0;
  while (offset < bytes.length) {
    try {
      offset += writeSync(fd, bytes, offset, bytes.length - offset);
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code === 'EAGAIN') {
        onStream.add(fd);
        streamOf(fd).write(bytes.subarray(offset));
        return;
      }
      cannotWrite(error as NodeJS.ErrnoException);
    }
  }
}

/**
 * True when standard error is a terminal. Only a character device can be one, so a pipe or a
 * file is told without loading node:tty (which loads Node's stream and network modules).
 */
export function stderrIsTerminal(): boolean {
  try {
    if (!fstatSync(2).isCharacterDevice()) return false;
  } catch {
    return false; // no stderr at all
  }
  // A terminal or a device such as /dev/null: ask the terminal module (Node.js documentation, tty.isatty),
  // which the bundle loads only here (LAZY_BUILTINS of src/cli/build.mjs).
  return isatty(2);
}

/**
 * End the process now, with the exit code the run set, when nothing it wrote waits in a stream
 * (no descriptor was handed to its stream): called when a whole run has ended. Ending at once
 * skips Node's wait for V8's background work of the run (optimising compiles, heap tasks), which
 * no output depends on. With text waiting in a stream, the process ends as usual once the stream
 * has written it.
 */
export function endWhenWritten(): void {
  if (onStream.size === 0) process.exit();
}
