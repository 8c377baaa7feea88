/**
 * `heliochron check`: test a proposed day (optionally with an hour), range of days or
 * season against a scene's evidence. A thin layer over src/scene, src/solver/checkDate.ts
 * and src/report; the validation of the options is here.
 */
import { InvalidInputError } from '../errors.js';
import { checkProposal } from '../solver/checkDate.js';
import { renderCheckText } from '../report/text.js';
import { checkAnswerJson, stableJson } from '../report/json.js';
import { checkOutputPath, deliver, inScene, readSceneForCommand, withCalendarReadings, withCalendarReadingsText } from './dateCommand.js';
import { checkReadingsLines, checkUnderReadings, type CheckReadings } from '../solver/calendarReadings.js';
import { disputedSwitchIn } from '../calendar/disputedSwitch.js';
import { HeliochronError } from '../errors.js';
import type { Scene } from '../scene/types.js';
import type { CheckAnswer, Proposal } from '../solver/types.js';
import type { CliIo } from './io.js';
import type { CheckOptions } from './checkSpec.js';
import { proposalFromOptions } from './proposalOptions.js';

/** True when the scene's calendar is a region with more than one published reading of its switch, none stated. */
function hasOtherReadings(scene: Scene): boolean {
  return disputedSwitchIn(scene.calendar, -Infinity, Infinity) !== null;
}

/**
 * The answer to print when the main reading has no such day: the check under the first reading that has
 * it (the comparison block names every reading); the main reading's refusal when none has it.
 */
function answerUnderAnotherReading(scene: Scene, readings: CheckReadings | null, judge: (s: Scene) => CheckAnswer, refusal: HeliochronError): { answer: CheckAnswer; scene: Scene } {
  const other = readings?.outcomes.find((o) => o.verdict !== null);
  if (readings === null || other === undefined) throw refusal; // no reading has the day: the main reading's own refusal
  const s: Scene = { ...scene, calendar: { kind: 'region', regionId: readings.regionId, reading: other.readingId } };
  return { answer: judge(s), scene: s };
}

/** Run `heliochron check`. Bad input throws (the CLI exits with 2, nothing written). */
export async function run(args: readonly string[], options: CheckOptions, io: CliIo): Promise<void> {
  const [scenePath] = args;
  if (scenePath === undefined) throw new InvalidInputError('<scene>', undefined, 'the path of a scene file');
  const { scene, fullPath } = readSceneForCommand(scenePath, io, options.seed, options.deltaT);
  const target = checkOutputPath(options.output, options.force, fullPath, io);
  const judge = (s: Scene): CheckAnswer => checkProposal(s, proposalFromOptions(options, s));
  let proposal: Proposal | null;
  let main: CheckAnswer | { readonly refusal: string };
  let mainRefusal: HeliochronError | null = null;
  try {
    proposal = proposalFromOptions(options, scene);
    main = inScene(scenePath, () => checkProposal(scene, proposal as Proposal));
  } catch (error) {
    // A day skipped under the table's main reading of a disputed switch may be a day under another reading.
    if (!(error instanceof HeliochronError && error.kind === 'invalid-input') || !hasOtherReadings(scene)) throw error;
    proposal = null;
    mainRefusal = error;
    main = { refusal: error.message };
  }
  // A disputed calendar switch touched by the proposal or the window: judge it under every published reading.
  const readings = inScene(scenePath, () => checkUnderReadings(scene, proposal, main, judge));
  const shown = mainRefusal !== null ? answerUnderAnotherReading(scene, readings, judge, mainRefusal) : { answer: main as CheckAnswer, scene };
  const text = options.json
    ? stableJson(withCalendarReadings(checkAnswerJson(shown.answer, shown.scene, options.version), readings))
    : withCalendarReadingsText(renderCheckText(shown.answer, shown.scene), readings === null ? null : checkReadingsLines(readings));
  deliver(text, target, options.output, options.force, fullPath, io);
}
