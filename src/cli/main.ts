#!/usr/bin/env node
/**
 * The heliochron command line: a thin layer over the library.
 * Each command's options are declared in its light `*Spec.ts` file; the command's
 * work is imported only when it runs, so that every command loads only what it needs.
 */
import { readFileSync, realpathSync } from 'node:fs';
import { pathToFileURL } from 'node:url';
import { CommanderError, type Command } from 'commander';
import { HistorianCommand } from './commandLine.js';
import { HeliochronError, quoteValue } from '../errors.js';
import { escapeControls } from '../textUnits.js';
import { isSystemError, PLAIN_SYSTEM_ERRORS, systemErrorWords } from './systemErrors.js';
import { processIo, type CliIo } from './io.js';
import { endWhenWritten, writeToProcess } from './processOutput.js';
import { registerSun } from './sunSpec.js';
import { registerMoon } from './moonSpec.js';
import { registerCalendar } from './calendarSpec.js';
import { registerDate } from './dateSpec.js';
import { registerCheck } from './checkSpec.js';
import { registerChart } from './chartSpec.js';
import { registerReport } from './reportSpec.js';
import { registerMeasure } from './measureSpec.js';
import { registerDesk } from './deskSpec.js';

/** Each entry adds one command to the program. Add new commands here, one line each. */
const COMMANDS: ReadonlyArray<(program: Command, io: CliIo) => void> = [
  registerSun,
  registerMoon,
  registerCalendar,
  registerDate,
  registerCheck,
  registerMeasure,
  registerChart,
  registerReport,
  registerDesk,
];

export const EXIT_BAD_INPUT = 2;

export async function main(argv: readonly string[], io: CliIo = processIo()): Promise<number> {
  const program = new HistorianCommand();
  program
    .name('heliochron')
    .description('Date a depicted outdoor scene from its sunlight.')
    .version(VERSION)
    .exitOverride()
    .configureOutput({
      writeOut: io.out,
      writeErr: io.err,
      // The option parser's own complaints, as one line like every other refusal; ours (commandLine.ts) are already in shape.
      outputError: (text, write) =>
        write(
          text.startsWith('error: ')
            ? `heliochron: ${text.replace(/^error: /, '').trim().replace(/\s*\n\s*/g, ' ').replace(/\.$/, '')}; add --help for the options\n`
            : `heliochron: ${text.trim().replace(/\s*\n\s*/g, ' ')}\n`,
        ),
    });
  for (const register of COMMANDS) register(program, io);
  try {
    await program.parseAsync(argv as string[], { from: 'user' });
    return 0;
  } catch (error) {
    if (error instanceof CommanderError) {
      if (error.code === 'commander.helpDisplayed' || error.code === 'commander.version' || error.exitCode === 0) return 0;
      return EXIT_BAD_INPUT; // commander has printed its message already
    }
    if (error instanceof HeliochronError && error.kind !== 'convergence') {
      io.err(`heliochron: ${escapeControls(error.message)}\n`);
      return EXIT_BAD_INPUT;
    }
    // A system error of the user's files or machine (a full disk, a read-only folder): one plain line.
    if (isSystemError(error) && PLAIN_SYSTEM_ERRORS.has(error.code as string)) {
      const where = error.path !== undefined ? `${quoteValue(error.path)}: ` : '';
      io.err(`heliochron: ${where}${escapeControls(systemErrorWords(error))}\n`);
      return EXIT_BAD_INPUT;
    }
    throw error;
  }
}

/** Set by the bundler (src/cli/build.mjs) to package.json's version; absent in tsc's dist/cli/main.js. */
declare const BUNDLED_VERSION: string | undefined;

/** The package version: the bundle's (written in at build), else read once from package.json beside dist/. */
export const VERSION: string =
  typeof BUNDLED_VERSION === 'string'
    ? BUNDLED_VERSION
    : (JSON.parse(readFileSync(new URL('../../package.json', import.meta.url), 'utf8')) as { version: string }).version;

/** True when this file is the program being run (also through the npm bin link). */
function isMain(): boolean {
  try {
    return process.argv[1] !== undefined && import.meta.url === pathToFileURL(realpathSync(process.argv[1])).href;
  } catch {
    return false;
  }
}

/**
 * Run the program as a user's command does: output to the process's streams, the exit code set on
 * the process when the run ends (70 for an internal error). The bundled program's start file
 * (src/cli/bin.ts) calls this; so does this file when it is itself the program (tsc's dist/cli/main.js).
 */
export function runAsProgram(argv: readonly string[]): Promise<void> {
  return main(argv).then(
    (code) => {
      process.exitCode = code;
    },
    (error: unknown) => {
      writeToProcess(2, `heliochron: internal error (please report): ${escapeControls(error instanceof Error ? error.message : String(error))}\n`);
      process.exitCode = 70;
    },
  );
}

/** Called by src/cli/bin.ts when runAsProgram has ended: see src/cli/processOutput.ts. */
export { endWhenWritten };

// The bundle's start file (src/cli/bin.ts) runs the program itself: only tsc's dist/cli/main.js asks.
if (typeof BUNDLED_VERSION !== 'string' && isMain()) void runAsProgram(process.argv.slice(2)).then(endWhenWritten);
