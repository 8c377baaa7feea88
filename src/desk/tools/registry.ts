/**
 * The desk's measuring tools, in the order of their buttons. One line per tool: the figures of
 * known size and their shadows (rod, overhang, fin, pole, eave line, caster and shadow point), then the picture's own perspective (vertical edges, wall
 * courses), object-shadow pairs on any surface and shadows whose casting point lies within a wedge, and the
 * moon's centre.
 */
import type { DeskTool } from './tool.js';
import { groundFigureTool } from './groundFigure.js';
import { wallFigureTool } from './wallFigure.js';
import { wallsCornerTool } from './wallsCorner.js';
import { rodShadowTool } from './rodShadow.js';
import { overhangShadowTool } from './overhangShadow.js';
import { finShadowTool } from './finShadow.js';
import { poleShadowTool } from './poleShadow.js';
import { eaveShadowTool } from './eaveShadow.js';
import { pointPairTool } from './pointPair.js';
import { verticalEdgesTool } from './verticalEdges.js';
import { wallCoursesTool } from './wallCourses.js';
import { objectShadowTool } from './objectShadow.js';
import { shadowWedgeTool } from './shadowWedge.js';
import { moonCentreTool } from './moonCentre.js';

export const TOOLS: readonly DeskTool[] = [
  wallFigureTool,
  groundFigureTool,
  wallsCornerTool,
  rodShadowTool,
  overhangShadowTool,
  finShadowTool,
  poleShadowTool,
  eaveShadowTool,
  pointPairTool,
  verticalEdgesTool,
  wallCoursesTool,
  objectShadowTool,
  shadowWedgeTool,
  moonCentreTool,
];
