/**
 * heliochron's public API for Node programs (`heliochron/node`): everything of index.ts, which
 * runs in a browser too, plus the readers of files on disk.
 */
export * from './index.js';
export { readSceneFile } from './cli/sceneFile.js';
