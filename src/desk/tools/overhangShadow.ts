/** Overhang shadow: a cornice, balcony or lintel standing out of a wall, and the edge of its shadow below. */
import { shadowTool } from './shadowTool.js';

export const overhangShadowTool = shadowTool({
  id: 'overhang', kind: 'overhang-shadow', name: 'Overhang shadow', key: 'o', onWall: true,
  fromWords: 'a point on the line where the overhang meets the wall', toWords: "a point on the shadow's edge line below it",
  tipWords: "the point of the overhang's front edge straight out from the first point (its root)",
  lengthFields: [
    { name: 'projectionM', label: 'stands out, m', kind: 'number', initial: '' },
    { name: 'projectionSigmaM', label: 'its sigma, m', kind: 'number', initial: '0.02' },
  ],
});
