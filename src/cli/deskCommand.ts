/**
 * `heliochron desk`: start the desk's local server (deskServer.ts) on the folder of the file
 * given, print the page's address as the first line, and serve until Ctrl-C (or until the
 * `stop` signal passed in by a caller, for tests). Validation of the options is here.
 */
import { spawn } from 'node:child_process';
import { statSync } from 'node:fs';
import { basename, dirname, extname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { InvalidInputError } from '../errors.js';
import type { CliIo } from './io.js';
import type { DeskOptions } from './deskSpec.js';
import { startDeskServer } from './deskServer.js';

const SCENE_ENDINGS = ['.yaml', '.yml', '.json'];
const PICTURE_ENDINGS = ['.jpg', '.jpeg', '.png', '.tif', '.tiff'];

/** The built page: dist/desk-page beside dist/cli (this file runs from dist/cli, or from src/cli under the tests). */
export function deskPageFolder(): string {
  return fileURLToPath(new URL('../../dist/desk-page/', import.meta.url));
}

function parsePort(text: string | undefined): number {
  if (text === undefined) return 0;
  const n = Number(text);
  if (!/^\d+$/.test(text) || n < 1 || n > 65535) throw new InvalidInputError('--port', text, 'a whole number from 1 to 65535');
  return n;
}

/** Start the system's browser on the address, detached; only with --open. */
function openBrowser(url: string): void {
  const [command, args] =
    process.platform === 'darwin' ? ['open', [url]] : process.platform === 'win32' ? ['cmd', ['/c', 'start', '', url]] : ['xdg-open', [url]];
  const child = spawn(command as string, args as string[], { detached: true, stdio: 'ignore' });
  child.on('error', () => undefined);
  child.unref();
}

export async function run(args: readonly string[], options: DeskOptions, io: CliIo, stop?: Promise<void>): Promise<void> {
  const port = parsePort(options.port);
  let folder = io.cwd;
  let openedName: string | undefined;
  let openedKind: 'scene' | 'picture' | undefined;
  if (args[0] !== undefined) {
    const name = args[0];
    const ending = extname(name).toLowerCase();
    if (!SCENE_ENDINGS.includes(ending) && !PICTURE_ENDINGS.includes(ending)) {
      throw new InvalidInputError('file', name, 'a scene file (.yaml, .yml, .json) or a picture (.jpg, .jpeg, .png, .tif, .tiff)');
    }
    const full = resolve(io.cwd, name);
    let isFile = false;
    try {
      isFile = statSync(full).isFile();
    } catch {
      throw new InvalidInputError('file', name, 'an existing file', 'There is no file at this path (or it cannot be read)');
    }
    if (!isFile) throw new InvalidInputError('file', name, 'a file', 'This is not a regular file');
    folder = dirname(full);
    openedName = basename(full);
    openedKind = SCENE_ENDINGS.includes(ending) ? 'scene' : 'picture';
  }
  const desk = await startDeskServer({ folder, openedName, openedKind, pageFolder: deskPageFolder(), port }).catch((error: NodeJS.ErrnoException) => {
    if (error.code === 'EADDRINUSE') throw new InvalidInputError('--port', options.port, 'a port that is free on this computer', 'Another program listens on it');
    throw error;
  });
  io.out(`${desk.url}\n`);
  io.out(`The measuring desk is serving ${openedName ? `${openedName} in ` : ''}the folder ${folder}; open the address above in a browser on this computer. Ctrl-C stops it.\n`);
  if (options.open) openBrowser(desk.url);
  await new Promise<void>((done) => {
    const finish = (): void => {
      process.off('SIGINT', finish);
      process.off('SIGTERM', finish);
      done();
    };
    process.once('SIGINT', finish);
    process.once('SIGTERM', finish);
    stop?.then(finish, finish);
  });
  await desk.close();
}
