#!/usr/bin/env node
/**
 * Makes the invented photograph "The Tanners' Hall, west front, about 1890" of the
 * fictional town of Velmar (47.62 N, 9.35 E, 410 m), and the scene file that
 * measures it, from a chosen true instant.
 *
 * The picture is a rendering, not a drawing by eye: a west front of known azimuth
 * with two windows and a door of known size, an iron lamp bracket (a rod straight
 * out of the wall), a cornice (an overhang), a lamp post on a paved square with a
 * kerbed rectangle of known size, all placed in site coordinates (east, north, up,
 * metres). The sun of the true instant comes from heliochron's own ephemeris; each
 * shadow point is found by carrying the sun ray from the casting point to the wall
 * or the ground plane (ray-plane intersection, common practice). A pinhole camera
 * (Hartley and Zisserman, Multiple View Geometry, 2nd ed. 2003, sec. 6.1, x = K[R|t]X)
 * takes the picture; pixel y runs down (docs/conventions.md). The points a user
 * would click are the projected points rounded to a whole pixel.
 *
 * Writes, beside this script: tanners-hall-photo.svg, tanners-hall-photo.png
 * (rendered with Debian's chromium, headless) and tanners-hall-photo.yaml.
 * Run after building: npx tsc -p tsconfig.json && node examples/tanners-hall-photo/make-picture.mjs
 * Options: --no-png (skip the chromium rendering).
 */
import { execFileSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { civilDateToJd } from '../../dist/calendar/regions.js';
import { clockToJdUT } from '../../dist/time/clock.js';
import { sunPosition } from '../../dist/ephemeris/sunPosition.js';
import { sunUnitVector } from '../../dist/geometry/sunVector.js';
import { add, cross, dot, horizontal, mul, sub, unit } from '../siteVectors.mjs';

const here = dirname(fileURLToPath(import.meta.url));

// ------------------------------------------------------------------ the truth
export const SITE = { latitudeDeg: 47.62, longitudeDeg: 9.35, elevationM: 410 };
export const AIR = { pressureHPa: 965, temperatureC: 18 };
/** The true instant: 2 September 1890 (Gregorian), 15:30 local mean time at Velmar. */
export const TRUE_DAY = { year: 1890, month: 9, day: 2 };
export const TRUE_LOCAL_MEAN_MINUTES = 15 * 60 + 30;
/** The west front's outward normal, degrees from true north. */
export const WALL_AZIMUTH_DEG = 268.5;
const WIDTH_PX = 1600;
const HEIGHT_PX = 1200;

const dayJd0 = civilDateToJd({ kind: 'gregorian' }, TRUE_DAY);
const jdUT = clockToJdUT(dayJd0, TRUE_LOCAL_MEAN_MINUTES, { kind: 'mean' }, SITE);
const sun = sunPosition(jdUT, SITE, AIR);
const s = sunUnitVector(sun.azimuthDeg, sun.altitudeDeg); // towards the sun (refracted: shadows follow the apparent sun)

// ------------------------------------------------------------------ the place
// Wall frame (docs/conventions.md): u to the right seen from outside, azimuth normal - 90; v up.
const normal = horizontal(WALL_AZIMUTH_DEG);
const eu = horizontal(WALL_AZIMUTH_DEG - 90);
const up = [0, 0, 1];
/** A point of the wall (u, v), or standing out of it by `out` metres. */
const wall = (u, v, out = 0) => add(add(mul(eu, u), mul(up, v)), mul(normal, out));
/** A point of the ground: u along the wall, d out in front of it. */
const ground = (u, d) => add(mul(eu, u), mul(normal, d));
/** Where the shadow of point p falls on the plane through o with normal n: p - t s, (p - t s - o) . n = 0. */
const shadowOn = (p, o, n) => sub(p, mul(s, dot(sub(p, o), n) / dot(s, n)));

const WALL_W = 10;
const CORNICE_V = 7; // underside of the cornice meets the wall here
const CORNICE_OUT = 0.6; // the cornice stands out 0.6 m (survey drawing)
const CORNICE_H = 0.45;
const WINDOWS = [
  { u0: 2.0, v0: 2.2, w: 1.2, h: 1.8 },
  { u0: 6.5, v0: 2.2, w: 1.2, h: 1.8 },
];
const DOOR = { u0: 4.4, v0: 0, w: 1.2, h: 2.6 };
const ROD_ROOT = [5.0, 4.6]; // the lamp bracket leaves the wall here
const ROD_LENGTH = 1.2;
const KERB = { u0: 0.5, d0: 2.0, w: 8.5, h: 6.5 }; // the paved square's kerbed rectangle, 8.5 m along the wall, 6.5 m out
const POLE_FOOT = ground(8.4, 7.2);
const POLE_HEIGHT = 3.2;

// shadows
const rodTip = wall(ROD_ROOT[0], ROD_ROOT[1], ROD_LENGTH);
const rodShadow = shadowOn(rodTip, [0, 0, 0], normal);
const corniceEdge = (u) => wall(u, CORNICE_V, CORNICE_OUT);
const corniceShadowV = dot(shadowOn(corniceEdge(8.6), [0, 0, 0], normal), up); // the edge is parallel to the wall: one height
const poleTop = add(POLE_FOOT, mul(up, POLE_HEIGHT));
const poleShadow = shadowOn(poleTop, [0, 0, 0], up);

// ------------------------------------------------------------------ the camera
const centre = add(add(mul(normal, 16), mul(eu, 5.5)), [0, 0, 1.7]);
const forward = unit(sub(wall(5, 3.4), centre));
const right = unit(cross(forward, up));
const down = cross(forward, right);
const FOCAL_PX = 1150;
const principal = [WIDTH_PX / 2, HEIGHT_PX / 2];
/** Pinhole projection (H&Z sec. 6.1): pixel = principal + f (X.right, X.down) / X.forward. */
function project(p) {
  const d = sub(p, centre);
  const z = dot(d, forward);
  if (z <= 0.2) throw new Error(`point behind the camera: ${p}`);
  return [principal[0] + (FOCAL_PX * dot(d, right)) / z, principal[1] + (FOCAL_PX * dot(d, down)) / z];
}
const click = (p) => project(p).map((v) => Math.round(v));

// ------------------------------------------------------------------ the drawing (sepia, as an albumen print)
const r1 = (v) => Math.round(v * 10) / 10;
const pts = (list) => list.map((p) => project(p).map(r1).join(',')).join(' ');
const poly = (list, attrs) => `<polygon points="${pts(list)}" ${attrs}/>`;
const seg = (a, b, attrs) => {
  const [p, q] = [project(a), project(b)];
  return `<line x1="${r1(p[0])}" y1="${r1(p[1])}" x2="${r1(q[0])}" y2="${r1(q[1])}" ${attrs}/>`;
};
const rect = (u0, v0, w, h, out = 0) => [wall(u0, v0 + h, out), wall(u0 + w, v0 + h, out), wall(u0 + w, v0, out), wall(u0, v0, out)];

const C = {
  sky: '#e9dcc3', ground: '#b49a74', groundLine: '#8f7656', kerb: '#6e5a40', wall: '#d8c29c', wallShade: '#8d7656',
  glass: '#3d3226', frame: '#efe3cb', door: '#4a3b2b', cornice: '#e2d0ae', soffit: '#5f4d38', roof: '#5b4a37',
  iron: '#2b241c', castShadow: '#6f5c44',
};
const svg = [];
svg.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${WIDTH_PX}" height="${HEIGHT_PX}" viewBox="0 0 ${WIDTH_PX} ${HEIGHT_PX}">`);
svg.push(`<!-- Invented picture of the fictional town of Velmar, made by make-picture.mjs; not a real photograph. -->`);
svg.push(`<defs><radialGradient id="vignette" cx="50%" cy="50%" r="85%"><stop offset="65%" stop-color="#000" stop-opacity="0"/><stop offset="100%" stop-color="#3a2a14" stop-opacity="0.3"/></radialGradient></defs>`);
svg.push(`<rect x="0" y="0" width="${WIDTH_PX}" height="${HEIGHT_PX}" fill="${C.sky}"/>`);
// the square: paving from the wall out towards the camera, slab joints every 1.5 m
svg.push(poly([ground(-8, 0), ground(20, 0), ground(20, 13), ground(-8, 13)], `fill="${C.ground}"`));
for (let u = -7.75; u <= 20; u += 1.5) svg.push(seg(ground(u, 0), ground(u, 13), `stroke="${C.groundLine}" stroke-width="1"`));
for (let d = 0; d <= 13; d += 1.5) svg.push(seg(ground(-8, d), ground(20, d), `stroke="${C.groundLine}" stroke-width="1"`));
const kerb = [ground(KERB.u0, KERB.d0), ground(KERB.u0 + KERB.w, KERB.d0), ground(KERB.u0 + KERB.w, KERB.d0 + KERB.h), ground(KERB.u0, KERB.d0 + KERB.h)];
svg.push(`<polygon points="${pts(kerb)}" fill="none" stroke="${C.kerb}" stroke-width="4" stroke-linejoin="round"/>`);
// neighbouring fronts, plain, to either side (set back a little, in the same plane)
svg.push(poly(rect(-9, 0, 8.6, 6.2), `fill="#cbb592"`));
svg.push(poly(rect(10.4, 0, 9, 8.2), `fill="#c6ae88"`));
// the Tanners' Hall front
svg.push(poly(rect(0, 0, WALL_W, CORNICE_V), `fill="${C.wall}"`));
// the cornice's shadow on the front: from the cornice down to the shadow line
svg.push(poly([wall(0, CORNICE_V), wall(WALL_W, CORNICE_V), wall(WALL_W, corniceShadowV), wall(0, corniceShadowV)], `fill="${C.wallShade}"`));
for (const w of WINDOWS) {
  svg.push(poly(rect(w.u0, w.v0, w.w, w.h), `fill="${C.frame}"`));
  svg.push(poly(rect(w.u0 + 0.08, w.v0 + 0.08, w.w - 0.16, w.h - 0.16), `fill="${C.glass}"`));
  svg.push(seg(wall(w.u0 + w.w / 2, w.v0 + 0.08), wall(w.u0 + w.w / 2, w.v0 + w.h - 0.08), `stroke="${C.frame}" stroke-width="5"`));
  svg.push(seg(wall(w.u0 + 0.08, w.v0 + w.h * 0.62), wall(w.u0 + w.w - 0.08, w.v0 + w.h * 0.62), `stroke="${C.frame}" stroke-width="5"`));
}
svg.push(poly(rect(DOOR.u0, DOOR.v0, DOOR.w, DOOR.h), `fill="${C.door}"`));
// the cornice: its soffit (in its own shade) and its front face
svg.push(poly([wall(0, CORNICE_V), wall(WALL_W, CORNICE_V), corniceEdge(WALL_W), corniceEdge(0)], `fill="${C.soffit}"`));
svg.push(poly([corniceEdge(0), corniceEdge(WALL_W), wall(WALL_W, CORNICE_V + CORNICE_H, CORNICE_OUT), wall(0, CORNICE_V + CORNICE_H, CORNICE_OUT)], `fill="${C.cornice}"`));
// the roof behind the cornice
svg.push(poly([wall(-0.3, CORNICE_V + CORNICE_H, CORNICE_OUT), wall(WALL_W + 0.3, CORNICE_V + CORNICE_H, CORNICE_OUT), wall(WALL_W + 0.3, CORNICE_V + 4.2, -4), wall(-0.3, CORNICE_V + 4.2, -4)], `fill="${C.roof}"`));
// the lamp bracket and its shadow on the front
svg.push(seg(wall(ROD_ROOT[0], ROD_ROOT[1]), rodShadow, `stroke="${C.castShadow}" stroke-width="5" stroke-linecap="round"`));
svg.push(seg(wall(ROD_ROOT[0], ROD_ROOT[1]), rodTip, `stroke="${C.iron}" stroke-width="6" stroke-linecap="round"`));
svg.push(`<circle cx="${r1(project(wall(ROD_ROOT[0], ROD_ROOT[1]))[0])}" cy="${r1(project(wall(ROD_ROOT[0], ROD_ROOT[1]))[1])}" r="6" fill="${C.iron}"/>`);
// the lamp post and its shadow on the paving
svg.push(seg(POLE_FOOT, poleShadow, `stroke="${C.castShadow}" stroke-width="8" stroke-linecap="round"`));
svg.push(seg(POLE_FOOT, poleTop, `stroke="${C.iron}" stroke-width="9" stroke-linecap="butt"`));
svg.push(`<rect x="0" y="0" width="${WIDTH_PX}" height="${HEIGHT_PX}" fill="url(#vignette)"/>`);
svg.push(`<text x="24" y="${HEIGHT_PX - 24}" font-family="serif" font-style="italic" font-size="22" fill="#4a3b2b">Velmar, the Tanners' Hall, west front (invented picture)</text>`);
svg.push('</svg>');
const svgText = `${svg.join('\n')}\n`;

// ------------------------------------------------------------------ the scene file
const fmt = (p) => `[${p[0]}, ${p[1]}]`;
const windowCorners = WINDOWS.flatMap((w) => [[w.u0, w.v0 + w.h], [w.u0 + w.w, w.v0 + w.h], [w.u0 + w.w, w.v0], [w.u0, w.v0]]);
const windowClicks = windowCorners.map(([u, v]) => click(wall(u, v)));
const kerbClicks = kerb.map(click);
const yaml = `# yaml-language-server: $schema=../../docs/scene.schema.json
# The Tanners' Hall, west front, a photograph of about 1890: an INVENTED picture of the fictional
# town of Velmar, rendered by make-picture.mjs from a chosen true instant (see README.md).
# Every pixel point below is a rendered point rounded to a whole pixel, as a user would click it.
heliochron: 1
title: "The Tanners' Hall, west front, photograph of about 1890"
site: { latitudeDeg: ${SITE.latitudeDeg}, longitudeDeg: ${SITE.longitudeDeg}, elevationM: ${SITE.elevationM} }
calendar: gregorian
window:
  fromYear: 1890          # the photographer's register dates the plate to 1890; the day is lost
  toYear: 1890
  months: [5, 6, 7, 8, 9, 10]   # the plane trees of the square are in full leaf
air: { pressureHPa: ${AIR.pressureHPa}, temperatureC: ${AIR.temperatureC} }
image: { widthPx: ${WIDTH_PX}, heightPx: ${HEIGHT_PX}, file: tanners-hall-photo.png, pixelSigmaPx: 1 }
groundPlane:
  # the kerbed rectangle of the paved square, 8.5 m along the front and 6.5 m out from it:
  # corners far-left, far-right, near-right, near-left as seen in the picture
  pointsPx: [${kerbClicks.map(fmt).join(', ')}]
  widthM: ${KERB.w}
  heightM: ${KERB.h}
  firstEdgeAzimuthDeg: ${WALL_AZIMUTH_DEG - 90}   # the far kerb runs along the front, towards the south
walls:
  - id: tanners-hall-west
    azimuthDeg: ${WALL_AZIMUTH_DEG}
    azimuthSigmaDeg: 1
    note: West front, orientation from the 1902 town survey.
    imagePlane:
      # the two ground-floor windows, 1.20 m by 1.80 m each (survey drawing), corners
      # top-left, top-right, bottom-right, bottom-left; wall metres u right, v up
      pointsPx: [${windowClicks.map(fmt).join(', ')}]
      planePointsM: [${windowCorners.map(fmt).join(', ')}]
observations:
  - id: front-lit
    kind: wall-lit
    wall: tanners-hall-west
  - id: lamp-bracket
    kind: rod-shadow
    wall: tanners-hall-west
    note: The iron lamp bracket above the door; its shadow runs down to the left.
    pixels: { fromPx: ${fmt(click(wall(ROD_ROOT[0], ROD_ROOT[1])))}, toPx: ${fmt(click(rodShadow))} }
  - id: cornice
    kind: overhang-shadow
    wall: tanners-hall-west
    note: The cornice stands out 0.60 m (survey drawing); its shadow edge is sharp.
    pixels: { fromPx: ${fmt(click(wall(8.6, CORNICE_V)))}, toPx: ${fmt(click(wall(8.9, corniceShadowV)))}, projectionM: ${CORNICE_OUT}, projectionSigmaM: 0.03 }
  - id: lamp-post
    kind: pole-shadow
    note: The lamp post of the square, 3.20 m to the lantern (the lantern itself is left out).
    pixels: { fromPx: ${fmt(click(POLE_FOOT))}, toPx: ${fmt(click(poleShadow))}, heightM: ${POLE_HEIGHT}, heightSigmaM: 0.05 }
seed: 1890
`;

writeFileSync(join(here, 'tanners-hall-photo.svg'), svgText);
writeFileSync(join(here, 'tanners-hall-photo.yaml'), yaml);
if (!process.argv.includes('--no-png')) {
  execFileSync('/usr/bin/chromium', [
    '--headless', '--no-sandbox', '--disable-gpu', '--hide-scrollbars', '--force-device-scale-factor=1',
    `--screenshot=${join(here, 'tanners-hall-photo.png')}`, `--window-size=${WIDTH_PX},${HEIGHT_PX}`,
    join(here, 'tanners-hall-photo.svg'),
  ], { stdio: 'ignore' });
}
process.stdout.write(
  `true instant: jdUT ${jdUT.toFixed(6)}; sun azimuth ${sun.azimuthDeg.toFixed(4)} deg, altitude ${sun.altitudeDeg.toFixed(4)} deg (refracted), ` +
    `hour angle ${sun.hourAngleDeg.toFixed(4)} deg, equation of time ${sun.equationOfTimeMinutes.toFixed(3)} min\n` +
    `rod shadow tip at u ${dot(sub(rodShadow, [0, 0, 0]), eu).toFixed(4)} v ${dot(rodShadow, up).toFixed(4)}; cornice shadow line v ${corniceShadowV.toFixed(4)}; ` +
    `pole shadow length ${Math.hypot(...sub(poleShadow, POLE_FOOT)).toFixed(4)} m\n`,
);
