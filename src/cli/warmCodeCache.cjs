/**
 * Run by src/cli/build.mjs at build time only, once per warm-up case in a fresh process:
 *   node src/cli/warmCodeCache.cjs <bin folder> <name> <arguments of heliochron...>
 * Loads the bundled program as the bin does (loadProgram of dist/bin/heliochron.cjs, here without
 * cached data), runs the command, then writes V8's code cache of the script, with every function
 * the run compiled, to <bin folder>/program.<name>.cache (Node.js documentation, vm module:
 * `script.createCachedData()`). The command's output goes to the build, which does not show it; a
 * failed run writes no cache.
 */
'use strict';
const { writeFileSync } = require('node:fs');
const { join } = require('node:path');

const [folder, name, ...args] = process.argv.slice(2);
const { loadProgram, cacheFileName } = require(join(folder, 'heliochron.cjs'));
const { program, script } = loadProgram(folder, undefined, args[0]);
program.runAsProgram(args).then(() => {
  if (process.exitCode !== undefined && process.exitCode !== 0) {
    process.stderr.write(`heliochron ${args.join(' ')} ended with exit code ${process.exitCode}\n`);
    return;
  }
  writeFileSync(join(folder, cacheFileName(name)), script.createCachedData());
});
