/** Rod shadow: a straight rod standing out of a wall, and its shadow on that wall. */
import { shadowTool } from './shadowTool.js';

export const rodShadowTool = shadowTool({
  id: 'rod', kind: 'rod-shadow', name: 'Rod shadow', key: 'r', onWall: true,
  fromWords: 'where the rod leaves the wall', toWords: 'a point far along its shadow on the wall',
  lengthFields: [],
});
