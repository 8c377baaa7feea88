/**
 * `heliochron date`: read a scene, solve for the dates and hours, render the answer as
 * text, JSON or CSV, and print it or write it to a file. A thin layer over
 * src/scene, src/solver and src/report; the validation of the options is here.
 */
import { resolve } from 'node:path';
import { HeliochronError, InvalidInputError, quoteValue } from '../errors.js';
import { escapeControls } from '../textUnits.js';
import type { Scene } from '../scene/types.js';
import { readSceneFile } from '../scene/readScene.js';
import { solveDates } from '../solver/solveDates.js';
import { renderDateText } from '../report/text.js';
import { dateAnswerJson, stableJson } from '../report/json.js';
import { dateAnswerCsv } from '../report/csv.js';
import { checkOutputTarget, writeOutputFile, type CliIo } from './io.js';
import type { DateOptions } from './dateSpec.js';

/** Read the scene file; a message about its content is prefixed with the file's path. */
export function readSceneForCommand(path: string, io: CliIo, seed?: number): { scene: Scene; fullPath: string } {
  const fullPath = resolve(io.cwd, path);
  try {
    const scene = readSceneFile(fullPath);
    return { scene: seed === undefined ? scene : { ...scene, seed }, fullPath };
  } catch (error) {
    if (error instanceof InvalidInputError) {
      // Messages name the path in the file; say which file, as the user wrote its name.
      const message = error.message.split(quoteValue(fullPath)).join(quoteValue(path)).split(fullPath).join(path);
      throw new HeliochronError('invalid-input', message.startsWith(path) ? message : `${path}: ${message}`);
    }
    throw error;
  }
}

/**
 * Run the work on a scene; a refusal raised there that names a path in the scene file (a picture
 * plane that cannot be rectified: walls[0].imagePlane.pointsPx) is prefixed with the file's
 * name, as the reader's refusals are. Refusals of a proposal (proposal.*) are left as they are.
 */
export function inScene<T>(scenePath: string, work: () => T): T {
  try {
    return work();
  } catch (error) {
    if (error instanceof InvalidInputError && !error.field.startsWith('proposal') && !error.message.startsWith(`${scenePath}: `)) {
      throw new HeliochronError('invalid-input', `${scenePath}: ${error.message}`);
    }
    throw error;
  }
}

/** Refuse an output path early (before any work): see checkOutputTarget in io.ts. */
export function checkOutputPath(output: string | undefined, force: boolean, inputPath: string, io: CliIo): string | undefined {
  if (output === undefined) return undefined;
  if (output.trim() === '') throw new InvalidInputError('--output', output, 'a file name');
  return checkOutputTarget(output, { force, inputs: [inputPath], cwd: io.cwd }).path;
}

/** Print the answer, or write it to the output file (atomically) and say so on stderr. */
export function deliver(text: string, target: string | undefined, output: string | undefined, force: boolean, inputPath: string, io: CliIo): void {
  if (target === undefined || output === undefined) {
    io.out(text);
    return;
  }
  writeOutputFile(output, text, { force, inputs: [inputPath], cwd: io.cwd });
  io.err(`heliochron: wrote ${escapeControls(output)}\n`);
}

/** Run `heliochron date`. Bad input throws (the CLI exits with 2, nothing written). */
export async function run(args: readonly string[], options: DateOptions, io: CliIo): Promise<void> {
  const [scenePath] = args;
  if (scenePath === undefined) throw new InvalidInputError('<scene>', undefined, 'the path of a scene file');
  if (options.json && options.csv) throw new InvalidInputError('--csv', '--json --csv', 'one output form: --json or --csv, not both');
  const { scene, fullPath } = readSceneForCommand(scenePath, io, options.seed);
  const target = checkOutputPath(options.output, options.force, fullPath, io);
  const answer = inScene(scenePath, () => solveDates(scene, { perYear: options.allYears }));
  const text = options.json
    ? stableJson(dateAnswerJson(answer, scene, options.version, { allYears: options.allYears }))
    : options.csv
      ? dateAnswerCsv(answer, scene, { allYears: options.allYears })
      : renderDateText(answer, scene, { allYears: options.allYears });
  deliver(text, target, options.output, options.force, fullPath, io);
}
