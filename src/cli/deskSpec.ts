/**
 * Options of `heliochron desk`: light, loaded with the program; the work is in deskCommand.ts.
 */
import type { Command } from 'commander';
import type { CliIo } from './io.js';

/** The options as the command receives them (validated in deskCommand.ts). */
export interface DeskOptions {
  /** Port to bind on 127.0.0.1; absent = a free one. */
  readonly port?: string;
  /** Also start the system's browser on the page. */
  readonly open: boolean;
}

export function registerDesk(program: Command, io: CliIo): void {
  program
    .command('desk')
    .summary('the measuring desk: a local web page to click the picture, see each measurement and the answer, and save the scene file')
    .description(
      'Start a small web server on this computer only (127.0.0.1) that serves the measuring desk: open a picture or a ' +
        'scene file, click the figures and shadows on the picture, see each measured value with its sigma at once, date ' +
        'the scene, and save the scene file that the other commands read. The first line printed is the page\'s address, ' +
        'with a random session token; open it in a browser on this computer. The page reads and saves files only in the ' +
        'folder of the file given (or the current folder). Stop the server with Ctrl-C. See docs/desk.md.',
    )
    .argument('[file]', 'a scene file (.yaml, .yml, .json) or a picture (.jpg, .jpeg, .png, .tif, .tiff) to open; none: an empty desk in the current folder')
    .option('--port <n>', 'the port to listen on (default: a free one)')
    .option('--open', "also open the page in the system's browser (without it nothing is launched)")
    .addHelpText(
      'after',
      '\nExamples (the bundled example is a picture of the fictional town of Velmar):\n' +
        '  heliochron desk examples/tanners-hall-photo/tanners-hall-photo.png\n' +
        '  heliochron desk examples/tanners-hall-photo/tanners-hall-photo.yaml --open\n',
    )
    .action(async (file: string | undefined, options: Record<string, unknown>) => {
      const { run } = await import('./deskCommand.js');
      await run(file === undefined ? [] : [file], {
        port: options.port === undefined ? undefined : String(options.port),
        open: options.open === true,
      }, io);
    });
}
