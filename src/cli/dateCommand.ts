/**
 * `heliochron date`: read a scene, solve for the dates and hours, render the answer as
 * text, JSON or CSV, and print it or write it to a file. A thin layer over
 * src/scene, src/solver and src/report; the validation of the options is here.
 */
import { sameLightIn, sameLightLines, type SameLightAnswer } from '../solver/sameLight.js';
import type { SunSite } from '../ephemeris/sunPosition.js';
import type { DateAnswer } from '../solver/types.js';
import { calendarReadings, calendarReadingsLines } from '../solver/calendarReadings.js';
import type { DeltaTModel } from '../time/deltaT.js';
import { resolve } from 'node:path';
import { HeliochronError, InvalidInputError, quoteValue } from '../errors.js';
import { escapeControls } from '../textUnits.js';
import type { Scene } from '../scene/types.js';
import { readSceneFile } from './sceneFile.js';
import { solveDates } from '../solver/solveDates.js';
import { renderDateText } from '../report/text.js';
import { dateAnswerJson, stableJson } from '../report/json.js';
import { dateAnswerCsv } from '../report/csv.js';
import { checkOutputTarget, writeOutputFile, type CliIo } from './io.js';
import type { DateOptions } from './dateSpec.js';
import { withProgressLine } from './progress.js';

/** Read the scene file; a message about its content is prefixed with the file's path. */
export function readSceneForCommand(path: string, io: CliIo, seed?: number, deltaT?: DeltaTModel): { scene: Scene; fullPath: string } {
  const fullPath = resolve(io.cwd, path);
  try {
    const read = readSceneFile(fullPath);
    const scene = deltaT === undefined ? read : { ...read, deltaT };
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

/** The JSON answer with the comparison of calendar readings added (only when the window touches a disputed switch). */
export function withCalendarReadings<T extends object, R>(json: T, readings: R | null): T | (T & { calendarReadings: R }) {
  return readings === null ? json : { ...json, calendarReadings: readings };
}

/** The text answer with the comparison of calendar readings (its lines) placed right after the verdict, where a reader looks first. */
export function withCalendarReadingsText(text: string, readingLines: readonly string[] | null): string {
  if (readingLines === null) return text;
  const block = readingLines.join('\n');
  const verdictAt = text.indexOf('\nVerdict:');
  const end = verdictAt < 0 ? -1 : text.indexOf('\n\n', verdictAt + 1);
  return end < 0 ? `${text}${block}\n` : `${text.slice(0, end)}\n${block}${text.slice(end)}`;
}

/** The site as the sun model takes it. */
function siteOfScene(scene: Scene): SunSite {
  return { latitudeDeg: scene.site.latitudeDeg, longitudeDeg: scene.site.longitudeDeg, elevationM: scene.site.elevationM };
}

/** The same light of each family's best candidate in a later year (src/solver/sameLight.ts). */
export function sameLightOfFamilies(answer: DateAnswer, scene: Scene, year: number, zone: string): SameLightAnswer {
  return {
    year,
    zone,
    families: answer.families.map((f) => ({
      familyId: f.id,
      target: { azimuthDeg: f.best.sun.azimuthDeg, altitudeDeg: f.best.sun.altitudeDeg, hourAngleDeg: f.best.sun.hourAngleDeg },
      moments: sameLightIn(year, f.best.sun, siteOfScene(scene), zone, scene.air, scene.deltaT),
    })),
  };
}

function familyWords(answer: DateAnswer, id: string): string {
  const f = answer.families.find((x) => x.id === id);
  return f === undefined ? id : `family ${f.rank} (${f.summary})`;
}

function withSameLight<T extends object>(json: T, sameLight: SameLightAnswer | null): T | (T & { sameLight: SameLightAnswer }) {
  return sameLight === null ? json : { ...json, sameLight };
}

/** Run `heliochron date`. Bad input throws (the CLI exits with 2, nothing written). */
export async function run(args: readonly string[], options: DateOptions, io: CliIo): Promise<void> {
  const [scenePath] = args;
  if (scenePath === undefined) throw new InvalidInputError('<scene>', undefined, 'the path of a scene file');
  if (options.json && options.csv) throw new InvalidInputError('--csv', '--json --csv', 'one output form: --json or --csv, not both');
  const { scene, fullPath } = readSceneForCommand(scenePath, io, options.seed, options.deltaT);
  const target = checkOutputPath(options.output, options.force, fullPath, io);
  const answer = withProgressLine(io, 'searching the window', (onProgress) => inScene(scenePath, () => solveDates(scene, { perYear: options.allYears, onProgress })));
  // A disputed calendar switch in the window: solve under every published reading (src/solver/calendarReadings.ts).
  const readings = inScene(scenePath, () => calendarReadings(scene, answer, (s) => solveDates(s, { perYear: options.allYears })));
  const sameLight = options.sameLightIn === undefined || options.zone === undefined ? null : sameLightOfFamilies(answer, scene, options.sameLightIn, options.zone);
  const text = options.json
    ? stableJson(withSameLight(withCalendarReadings(dateAnswerJson(answer, scene, options.version, { allYears: options.allYears }), readings), sameLight))
    : options.csv
      ? dateAnswerCsv(answer, scene, { allYears: options.allYears })
      : withCalendarReadingsText(renderDateText(answer, scene, { allYears: options.allYears }), readings === null ? null : calendarReadingsLines(readings)) +
        (sameLight === null ? '' : `${sameLightLines(sameLight, siteOfScene(scene), (id) => familyWords(answer, id), scene.air).join('\n')}\n`);
  deliver(text, target, options.output, options.force, fullPath, io);
}
