/**
 * Stands in for node:fs, node:path and node:crypto in the desk's bundle (build.mjs).
 *
 * The page reads and writes no files itself: the scene and the picture come through the desk's
 * server. Some modules it imports for their pure functions (the scene reader, the command
 * line's proposal reading, the overlay) also hold file handling that the page never runs;
 * their imports are satisfied here, and a call would fail loudly. The one file the core reads
 * by itself, the calendar reform table, is bundled and handed over by readFileSync.
 * CommonJS, so that a module may import any name from it (the bundler checks names of ES
 * modules only); a name not given here is undefined and is never called by the page.
 */
const reformTable = require('../../data/calendar-reforms.json');

function notHere() {
  throw new Error('the desk page reads and writes no files itself');
}

module.exports = {
  readFileSync(path) {
    if (String(path).endsWith('/data/calendar-reforms.json')) return JSON.stringify(reformTable);
    return notHere();
  },
  statSync: notHere,
  existsSync: () => false,
  sep: '/',
  basename: notHere,
  dirname: notHere,
  join: notHere,
  resolve: notHere,
  createHash: notHere,
};
