/**
 * The desk's measuring tools, in the order of their buttons. One line per tool; the tools that
 * the picture's perspective will bring (vanishing lines, shadow pairs on any surface) are added
 * here the same way.
 */
import type { DeskTool } from './tool.js';
import { groundFigureTool } from './groundFigure.js';
import { wallFigureTool } from './wallFigure.js';
import { wallsCornerTool } from './wallsCorner.js';
import { rodShadowTool } from './rodShadow.js';
import { overhangShadowTool } from './overhangShadow.js';
import { finShadowTool } from './finShadow.js';
import { poleShadowTool } from './poleShadow.js';

export const TOOLS: readonly DeskTool[] = [
  wallFigureTool,
  groundFigureTool,
  wallsCornerTool,
  rodShadowTool,
  overhangShadowTool,
  finShadowTool,
  poleShadowTool,
];
