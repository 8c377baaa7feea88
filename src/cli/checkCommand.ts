/**
 * `heliochron check`: test a proposed day (optionally with an hour), range of days or
 * season against a scene's evidence. A thin layer over src/scene, src/solver/checkDate.ts
 * and src/report; the validation of the options is here.
 */
import { InvalidInputError } from '../errors.js';
import { checkProposal } from '../solver/checkDate.js';
import { renderCheckText } from '../report/text.js';
import { checkAnswerJson, stableJson } from '../report/json.js';
import { checkOutputPath, deliver, inScene, readSceneForCommand } from './dateCommand.js';
import type { CliIo } from './io.js';
import type { CheckOptions } from './checkSpec.js';
import { proposalFromOptions } from './proposalOptions.js';

/** Run `heliochron check`. Bad input throws (the CLI exits with 2, nothing written). */
export async function run(args: readonly string[], options: CheckOptions, io: CliIo): Promise<void> {
  const [scenePath] = args;
  if (scenePath === undefined) throw new InvalidInputError('<scene>', undefined, 'the path of a scene file');
  const { scene, fullPath } = readSceneForCommand(scenePath, io, options.seed, options.deltaT);
  const proposal = proposalFromOptions(options, scene);
  const target = checkOutputPath(options.output, options.force, fullPath, io);
  const answer = inScene(scenePath, () => checkProposal(scene, proposal));
  const text = options.json ? stableJson(checkAnswerJson(answer, scene, options.version)) : renderCheckText(answer, scene);
  deliver(text, target, options.output, options.force, fullPath, io);
}
