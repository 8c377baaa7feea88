/**
 * Options of `heliochron measure`: light, loaded with the program; the work is in measureCommand.ts.
 */
import type { Command } from 'commander';
import type { CliIo } from './io.js';
import { parseSeedOption, SEED_FLAGS, SEED_HELP } from './seedOption.js';

/** The options as the command receives them (validated in measureCommand.ts). */
export interface MeasureOptions {
  readonly json: boolean;
  /** SVG file to write the overlay to. */
  readonly overlay?: string;
  /** JPEG or PNG picture to embed under the overlay (else the scene's image.file, if present). */
  readonly image?: string;
  /** JSON-LD file to write the clicked points and lines to, as W3C Web Annotations. */
  readonly annotations?: string;
  /** Run the date solver and draw the shadows its best candidate predicts. */
  readonly withBest: boolean;
  readonly force: boolean;
  /** Overrides the scene file's seed. */
  readonly seed?: number;
}

export function registerMeasure(program: Command, io: CliIo): void {
  program
    .command('measure')
    .summary('the shadow measurements read from the picture: values, sigmas, rectification residuals, an overlay')
    .description(
      'Read a scene file and turn every observation given in pixels (clicked points on the picture) into its number: ' +
        'the slope of a rod shadow, the depth ratio of an overhang, the width ratio of a fin, the azimuth and length ratio ' +
        'of a pole shadow. For each it prints the value, its sigma and the parts of that sigma (the clicked figure, the two ' +
        'shadow points, the stated length), how it was obtained, the residuals of the straightening of each wall or ground ' +
        'in pixels, and a warning where the first-order sigma is not reliable. Does not date the scene unless --with-best ' +
        'is given. With --overlay: an SVG drawing in the picture\'s own pixels (clicked points, the straightened grid, the ' +
        'measured shadows) to lay over the picture.',
    )
    .argument('<scene>', 'the scene file (.yaml, .yml or .json); see docs/scene-file.md and docs/measuring.md')
    .option('--json', 'print one JSON object instead of text')
    .option('--overlay <file.svg>', 'write the overlay drawing to this SVG file')
    .option('--image <picture>', "embed this JPEG or PNG picture under the overlay (default: the scene's image.file, if given)")
    .option('--annotations <file.jsonld>', 'write the clicked points and lines as W3C Web Annotations (JSON-LD), to share them with image platforms')
    .option('--with-best', 'also date the scene and draw, dashed, the shadows the best candidate predicts')
    .option('--force', 'replace the overlay or annotations file if it exists')
    .option(SEED_FLAGS, SEED_HELP)
    .addHelpText(
      'after',
      '\nExamples (the bundled example is a picture of the fictional town of Velmar):\n' +
        '  heliochron measure examples/tanners-hall-photo/tanners-hall-photo.yaml\n' +
        '  heliochron measure examples/tanners-hall-photo/tanners-hall-photo.yaml --overlay overlay.svg\n' +
        '  heliochron measure examples/tanners-hall-photo/tanners-hall-photo.yaml --with-best --overlay check.svg --force\n' +
        '  heliochron measure examples/tanners-hall-photo/tanners-hall-photo.yaml --annotations marks.jsonld\n',
    )
    .action(async (scene: string, options: Record<string, unknown>) => {
      const { run } = await import('./measureCommand.js');
      await run([scene], {
        json: options.json === true,
        overlay: options.overlay === undefined ? undefined : String(options.overlay),
        image: options.image === undefined ? undefined : String(options.image),
        annotations: options.annotations === undefined ? undefined : String(options.annotations),
        withBest: options.withBest === true,
        force: options.force === true,
        seed: parseSeedOption(options.seed),
      }, io);
    });
}
