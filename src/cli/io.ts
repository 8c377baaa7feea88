/**
 * What a command may touch of the outside world, passed in (never read from globals),
 * and the one way output files are written: atomically, never over an existing file
 * without `force`, never over the input.
 */
import { closeSync, existsSync, fsyncSync, openSync, realpathSync, renameSync, rmSync, writeSync } from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';
import { OutputError } from '../errors.js';

export interface CliIo {
  readonly out: (text: string) => void;
  readonly err: (text: string) => void;
  /** True when stderr is a terminal: only then is progress shown. */
  readonly errIsTerminal: boolean;
  readonly cwd: string;
}

export function processIo(): CliIo {
  return {
    out: (t) => process.stdout.write(t),
    err: (t) => process.stderr.write(t),
    errIsTerminal: Boolean(process.stderr.isTTY),
    cwd: process.cwd(),
  };
}

function samePath(a: string, b: string): boolean {
  const ra = existsSync(a) ? realpathSync(a) : resolve(a);
  const rb = existsSync(b) ? realpathSync(b) : resolve(b);
  return ra === rb;
}

export interface WriteOptions {
  readonly force: boolean;
  /** Input files of the run: the output may not be any of them. */
  readonly inputs: readonly string[];
}

/**
 * Write `content` to `path` atomically: a temporary file in the same folder, then a rename.
 * Refuses (OutputError) an existing file without `force`, and a path equal to an input.
 * A failure leaves no partial file behind.
 */
export function writeOutputFile(path: string, content: string | Uint8Array, options: WriteOptions): void {
  const target = resolve(path);
  for (const input of options.inputs) {
    if (samePath(input, target)) {
      throw new OutputError(`output file ${JSON.stringify(path)} is the input file; choose another name`);
    }
  }
  if (existsSync(target) && !options.force) {
    throw new OutputError(`output file ${JSON.stringify(path)} exists already; add --force to replace it`);
  }
  if (!existsSync(dirname(target))) {
    throw new OutputError(`folder ${JSON.stringify(dirname(path))} for the output file does not exist`);
  }
  const temp = join(dirname(target), `.${basename(target)}.${process.pid}.tmp`);
  let fd: number | undefined;
  try {
    fd = openSync(temp, 'wx');
    writeSync(fd, typeof content === 'string' ? Buffer.from(content, 'utf8') : content);
    fsyncSync(fd);
    closeSync(fd);
    fd = undefined;
    renameSync(temp, target);
  } catch (error) {
    if (fd !== undefined) closeSync(fd);
    rmSync(temp, { force: true });
    throw error;
  }
}
