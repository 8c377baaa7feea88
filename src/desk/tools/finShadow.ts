/** Fin shadow: a pilaster, buttress or shutter standing out of a wall, and the edge of its shadow beside it. */
import { shadowTool } from './shadowTool.js';

export const finShadowTool = shadowTool({
  id: 'fin', kind: 'fin-shadow', name: 'Fin shadow', key: 'f', onWall: true,
  fromWords: 'a point on the line where the fin meets the wall', toWords: "a point on the shadow's edge line beside it",
  tipWords: "the point of the fin's front edge straight out from the first point (its root)",
  lengthFields: [
    { name: 'projectionM', label: 'fin depth, m', kind: 'number', initial: '' },
    { name: 'projectionSigmaM', label: 'its sigma, m', kind: 'number', initial: '0.02' },
  ],
});
