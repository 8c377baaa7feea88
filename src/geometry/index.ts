/** Shadow geometry: pure functions of a sun direction and a wall. Re-exports only. */
export * from './sunVector.js';
export * from './shadowAngles.js';
export * from './residuals.js';
export * from './skyLocus.js';
export * from './wallShadows.js';
export * from './groundShadows.js';
export * from './pointShadows.js';
export * from './lightFacts.js';
export * from './observationModels.js';
export * from './skyIntersection.js';
export * from './skyPlanes.js';
