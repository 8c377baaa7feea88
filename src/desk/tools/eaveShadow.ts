/** Eave's shadow line: the shadow of an eave (or arcade edge) as a line on the level ground in front of its wall. */
import { shadowTool } from './shadowTool.js';

export const eaveShadowTool = shadowTool({
  id: 'eave', kind: 'eave-shadow', name: "Eave's shadow line", key: 'e', onWall: true,
  fromWords: "a point of the wall's foot line (where the wall meets the ground)",
  toWords: "a point of the eave's shadow line on the ground",
  points: [
    ['fromPx', "a point of the wall's foot line (where the wall meets the ground)"],
    ['alongPx', 'a second point further along the same foot line'],
    ['toPx', "a point of the eave's shadow line on the ground"],
  ],
  lengthFields: [
    { name: 'heightM', label: 'eave height above ground, m', kind: 'number', initial: '' },
    { name: 'heightSigmaM', label: 'its sigma, m', kind: 'number', initial: '0.05' },
    { name: 'projectionM', label: 'eave stands out from the wall, m', kind: 'number', initial: '0' },
    { name: 'projectionSigmaM', label: 'its sigma, m', kind: 'number', initial: '0' },
  ],
});
