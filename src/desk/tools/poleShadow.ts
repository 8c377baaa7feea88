/** Pole shadow: a vertical pole or building corner on level ground, from its foot to the tip of its shadow. */
import { shadowTool } from './shadowTool.js';

export const poleShadowTool = shadowTool({
  id: 'pole', kind: 'pole-shadow', name: 'Pole shadow', key: 'p', onWall: false,
  fromWords: 'the foot of the pole', toWords: 'the tip of its shadow on the ground',
  lengthFields: [
    { name: 'heightM', label: 'height, m (if known)', kind: 'number', initial: '' },
    { name: 'heightSigmaM', label: 'its sigma, m', kind: 'number', initial: '' },
  ],
});
