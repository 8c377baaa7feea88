#!/usr/bin/env node
/**
 * Makes the invented picture "Figures before the Kornhaus, Velmar" of the fictional town of
 * Velmar (47.62 N, 9.35 E, 410 m), and the scene files that date it, from a chosen true instant.
 * No size in metres appears in the scene files: the camera comes from the picture's own
 * perspective (vertical edges, courses along two walls of known azimuth), and the sun from
 * object points and their shadow points, wherever the shadows fall.
 *
 * The picture is a rendering, not a drawing by eye: the corner of the Kornhaus (two walls of
 * known azimuth, square to each other), a flight of steps along its front, uneven paving in
 * front of it, two lamp posts and six figures, all placed in site coordinates (east, north, up,
 * metres). The sun of the true instant comes from heliochron's own ephemeris; each shadow point
 * is found by carrying the sun ray from the casting point until it first enters a solid: a step,
 * the paving, or the building (ray marching in 1 cm steps, then bisection; common practice).
 * A pinhole camera (Hartley and Zisserman, Multiple View Geometry, 2nd ed. 2003, sec. 6.1,
 * x = K[R|t]X), looking down from a window across the square, takes the picture; pixel y runs
 * down (docs/conventions.md). The points a user would click are the projected points rounded
 * to a whole pixel.
 *
 * The variant: the same picture, but the figures lit by the sun of four hours
 * earlier, as if painted in at another sitting. The group test of `heliochron measure` names
 * them.
 *
 * Writes, beside this script: kornplatz-figures.svg/.png/.yaml and kornplatz-figures-variant.svg/.png/.yaml.
 * Run after building: npx tsc -p tsconfig.json && node examples/kornplatz-figures/make-picture.mjs
 * Options: --no-png (skip the chromium rendering).
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { civilDateToJd } from '../../dist/calendar/regions.js';
import { clockToJdUT } from '../../dist/time/clock.js';
import { sunPosition } from '../../dist/ephemeris/sunPosition.js';
import { sunUnitVector } from '../../dist/geometry/sunVector.js';
import { add, cross, dot, horizontal, mul, sub, unit } from '../siteVectors.mjs';

const here = dirname(fileURLToPath(import.meta.url));

// ------------------------------------------------------------------ the truth
const SITE = { latitudeDeg: 47.62, longitudeDeg: 9.35, elevationM: 410 };
const AIR = { pressureHPa: 965, temperatureC: 17 };
/** The true instant: 14 May 1871 (Gregorian), 16:40 local mean time at Velmar. */
const TRUE_DAY = { year: 1871, month: 5, day: 14 };
const TRUE_LOCAL_MEAN_MINUTES = 16 * 60 + 40;
/** The variant's figures: the same day, four hours earlier. */
const VARIANT_OFFSET_MINUTES = -240;
/** Outward normals of the Kornhaus front and side, degrees from true north (square to each other). */
const FRONT_AZIMUTH_DEG = 200;
const SIDE_AZIMUTH_DEG = 290;
const WIDTH_PX = 2400;
const HEIGHT_PX = 1800;

const dayJd0 = civilDateToJd({ kind: 'gregorian' }, TRUE_DAY);
const jdUT = clockToJdUT(dayJd0, TRUE_LOCAL_MEAN_MINUTES, { kind: 'mean' }, SITE);
const sun = sunPosition(jdUT, SITE, AIR);
const sunOther = sunPosition(jdUT + VARIANT_OFFSET_MINUTES / 1440, SITE, AIR);

const up = [0, 0, 1];

// ------------------------------------------------------------------ the place
// The corner of the Kornhaus is the site origin. The front (normal 200) runs from the corner along
// its u axis (azimuth 110, docs/conventions.md); the side (normal 290) runs from the corner along
// azimuth 20, which is its -u direction. The building is the box behind both faces.
const nFront = horizontal(FRONT_AZIMUTH_DEG);
const nSide = horizontal(SIDE_AZIMUTH_DEG);
const alongFront = horizontal(FRONT_AZIMUTH_DEG - 90); // = -nSide
const alongSide = horizontal(SIDE_AZIMUTH_DEG + 90); // = -nFront
const FRONT_W = 16;
const SIDE_W = 12;
const EAVES = 9.5;
/** A point on the front: s metres from the corner along it, at height v, standing out `out` metres. */
const front = (s, v, out = 0) => add(add(mul(alongFront, s), mul(up, v)), mul(nFront, out));
/** A point on the side: s metres from the corner along it, at height v. */
const side = (s, v, out = 0) => add(add(mul(alongSide, s), mul(up, v)), mul(nSide, out));
/** Ground point: a metres along the front from the corner, d metres out in front of it. */
const square = (a, d) => add(mul(alongFront, a), mul(nFront, d));

// the steps along the front, from a = 4 to a = 12: four risers of 0.16 m, treads 0.38 m deep
const STEPS = { a0: 4, a1: 12, rise: 0.16, tread: 0.38, count: 4 };
/** Height of the paving: gently uneven (a few centimetres up and down), as old cobbles are. */
const paving = (p) => 0.035 * Math.sin(0.9 * p[0] + 0.4) * Math.cos(0.7 * p[1] - 0.3) + 0.02 * Math.sin(2.3 * p[1] + 1.1 * p[0]);
/** Height of the ground or steps under a site point (x east, y north). */
function terrain(p) {
  const a = dot(p, alongFront);
  const d = dot(p, nFront);
  if (a >= STEPS.a0 && a <= STEPS.a1 && d >= 0 && d < STEPS.tread * STEPS.count) {
    const k = Math.floor(d / STEPS.tread); // 0 at the wall
    return (STEPS.count - k) * STEPS.rise;
  }
  return paving(p);
}
/** Inside a solid: under the ground or steps, or inside the building. */
function solid(p) {
  if (p[2] < terrain(p)) return true;
  const a = dot(p, alongFront);
  const b = dot(p, alongSide);
  return a > 0 && a < FRONT_W && b > 0 && b < SIDE_W && p[2] < EAVES;
}
/** Where the shadow of p falls: march along -s from p until inside a solid, then bisect (1e-6 m). */
function shadowOf(p, s) {
  const step = 0.01;
  let t0 = 0;
  for (let t = step; t < 200; t += step) {
    if (solid(sub(p, mul(s, t)))) {
      let lo = t0;
      let hi = t;
      for (let i = 0; i < 40; i++) {
        const mid = (lo + hi) / 2;
        if (solid(sub(p, mul(s, mid)))) hi = mid;
        else lo = mid;
      }
      return sub(p, mul(s, hi));
    }
    t0 = t;
  }
  throw new Error(`no shadow found for ${p}`);
}

// lamp posts and figures: foot on the terrain, the casting point on top (a figure's head)
const onTerrain = (g) => [g[0], g[1], terrain(g)];
const POSTS = [{ at: square(17.5, 3.2), h: 3.6 }, { at: square(1.5, 7.5), h: 3.6 }];
const FIGURES = [
  { at: square(5.2, 0.2), h: 1.68 }, // on the top step
  { at: square(8.1, 0.95), h: 1.74 }, // on the third
  { at: square(10.6, 1.3), h: 1.6 }, // on the bottom step
  { at: square(7.0, 3.6), h: 1.72 }, // in the square
  { at: square(13.4, 5.1), h: 1.66 },
  { at: square(3.2, 4.4), h: 1.78 },
].map((f) => ({ ...f, at: onTerrain(f.at) }));
const postFeet = POSTS.map((p) => onTerrain(p.at));

// ------------------------------------------------------------------ the camera: from a first-floor window across the square
const centre = add(square(-8, 21), [0, 0, 7.5]);
const target = add(square(5, 1), [0, 0, 3.2]);
const forward = unit(sub(target, centre));
const right = unit(cross(forward, up));
const down = cross(forward, right);
const FOCAL_PX = 2050;
const principal = [WIDTH_PX / 2 + 18, HEIGHT_PX / 2 - 11]; // a lens not quite centred: the orthocentre finds it
function project(p) {
  const d = sub(p, centre);
  const z = dot(d, forward);
  if (z <= 0.2) throw new Error(`point behind the camera: ${p}`);
  return [principal[0] + (FOCAL_PX * dot(d, right)) / z, principal[1] + (FOCAL_PX * dot(d, down)) / z];
}
const click = (p) => {
  const q = project(p).map((v) => Math.round(v));
  if (q[0] < 0 || q[0] > WIDTH_PX || q[1] < 0 || q[1] > HEIGHT_PX) throw new Error(`point outside the picture: ${p} -> ${q}`);
  return q;
};

// ------------------------------------------------------------------ one picture and its scene file
const r1 = (v) => Math.round(v * 10) / 10;
const pts = (list) => list.map((p) => project(p).map(r1).join(',')).join(' ');
const poly = (list, attrs) => `<polygon points="${pts(list)}" ${attrs}/>`;
const seg = (a, b, attrs) => {
  const [p, q] = [project(a), project(b)];
  return `<line x1="${r1(p[0])}" y1="${r1(p[1])}" x2="${r1(q[0])}" y2="${r1(q[1])}" ${attrs}/>`;
};
const polyline = (list, attrs) => `<polyline points="${pts(list)}" fill="none" ${attrs}/>`;
const C = {
  sky: '#dfe3e0', paving: '#a99c86', joint: '#8a7d68', step: '#c9bda6', riser: '#9c8f78', front: '#d9c7a3', side: '#b7a27c',
  course: '#9a8766', window: '#3c3a36', sill: '#efe6d2', roof: '#6b4f3a', iron: '#2a2622', coat: '#3b3f52', skin: '#d6b08c', shadow: '#5a5143',
};
const FRONT_WINDOWS = [2, 5.5, 9, 12.5].map((s) => ({ s, w: 1.3 }));
const SIDE_WINDOWS = [2.2, 5.8, 9.2].map((s) => ({ s, w: 1.3 }));
const FLOORS = [{ v0: 1.6, h: 2.0 }, { v0: 5.4, h: 2.2 }];
const COURSES = [0.9, 4.6, 8.6]; // string courses, plinth top and eaves band

function picture(figureSun, title) {
  const sVec = sunUnitVector(sun.azimuthDeg, sun.altitudeDeg);
  const fVec = sunUnitVector(figureSun.azimuthDeg, figureSun.altitudeDeg);
  const svg = [];
  svg.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${WIDTH_PX}" height="${HEIGHT_PX}" viewBox="0 0 ${WIDTH_PX} ${HEIGHT_PX}">`);
  svg.push('<!-- Invented picture of the fictional town of Velmar, made by make-picture.mjs; not a real picture. -->');
  svg.push(`<rect x="0" y="0" width="${WIDTH_PX}" height="${HEIGHT_PX}" fill="${C.sky}"/>`);
  // paving with joints every metre
  svg.push(poly([square(-14, 0), square(28, 0), square(28, 16), square(-14, 16)], `fill="${C.paving}"`));
  for (let a = -14; a <= 28; a += 1) svg.push(seg(square(a, 0), square(a, 16), `stroke="${C.joint}" stroke-width="1"`));
  for (let d = 0; d <= 16; d += 1) svg.push(seg(square(-14, d), square(28, d), `stroke="${C.joint}" stroke-width="1"`));
  // the building: side (in light, from the west) and front
  svg.push(poly([side(0, 0), side(SIDE_W, 0), side(SIDE_W, EAVES), side(0, EAVES)], `fill="${C.side}"`));
  svg.push(poly([front(0, 0), front(FRONT_W, 0), front(FRONT_W, EAVES), front(0, EAVES)], `fill="${C.front}"`));
  svg.push(poly([front(0, EAVES), front(FRONT_W, EAVES), add(front(FRONT_W, EAVES + 3.5), mul(nFront, -4)), add(front(0, EAVES + 3.5), mul(nFront, -4))], `fill="${C.roof}"`));
  for (const v of COURSES) {
    svg.push(seg(front(0, v), front(FRONT_W, v), `stroke="${C.course}" stroke-width="5"`));
    svg.push(seg(side(0, v), side(SIDE_W, v), `stroke="${C.course}" stroke-width="5"`));
  }
  for (const f of FLOORS) {
    for (const w of FRONT_WINDOWS) svg.push(poly([front(w.s, f.v0 + f.h), front(w.s + w.w, f.v0 + f.h), front(w.s + w.w, f.v0), front(w.s, f.v0)], `fill="${C.window}" stroke="${C.sill}" stroke-width="4"`));
    for (const w of SIDE_WINDOWS) svg.push(poly([side(w.s, f.v0 + f.h), side(w.s + w.w, f.v0 + f.h), side(w.s + w.w, f.v0), side(w.s, f.v0)], `fill="${C.window}" stroke="${C.sill}" stroke-width="4"`));
  }
  // the steps: treads and risers, nearest last
  for (let k = STEPS.count - 1; k >= 0; k--) {
    const h = (STEPS.count - k) * STEPS.rise;
    const d0 = k * STEPS.tread;
    const d1 = d0 + STEPS.tread;
    const at = (a, d, z) => add(square(a, d), [0, 0, z]);
    svg.push(poly([at(STEPS.a0, d0, h), at(STEPS.a1, d0, h), at(STEPS.a1, d1, h), at(STEPS.a0, d1, h)], `fill="${C.step}"`));
    svg.push(poly([at(STEPS.a0, d1, h), at(STEPS.a1, d1, h), at(STEPS.a1, d1, h - STEPS.rise), at(STEPS.a0, d1, h - STEPS.rise)], `fill="${C.riser}"`));
  }
  // cast shadows first (under the casters): each caster's shadow traced point by point, so it breaks over the steps
  const castShadow = (foot, top, s, width) => {
    const line = [];
    for (let i = 0; i <= 40; i++) line.push(shadowOf(add(foot, mul(sub(top, foot), Math.max(0.02, i / 40))), s));
    return polyline(line, `stroke="${C.shadow}" stroke-width="${width}" stroke-linecap="round" stroke-linejoin="round" opacity="0.85"`);
  };
  POSTS.forEach((p, i) => svg.push(castShadow(postFeet[i], add(postFeet[i], [0, 0, p.h]), sVec, 9)));
  FIGURES.forEach((f) => svg.push(castShadow(f.at, add(f.at, [0, 0, f.h]), fVec, 16)));
  // the casters
  POSTS.forEach((p, i) => {
    svg.push(seg(postFeet[i], add(postFeet[i], [0, 0, p.h]), `stroke="${C.iron}" stroke-width="10"`));
    const top = project(add(postFeet[i], [0, 0, p.h]));
    svg.push(`<circle cx="${r1(top[0])}" cy="${r1(top[1])}" r="9" fill="${C.iron}"/>`);
  });
  FIGURES.forEach((f) => {
    svg.push(seg(f.at, add(f.at, [0, 0, f.h - 0.22]), `stroke="${C.coat}" stroke-width="22" stroke-linecap="round"`));
    const head = project(add(f.at, [0, 0, f.h - 0.1]));
    const top = project(add(f.at, [0, 0, f.h]));
    svg.push(`<circle cx="${r1(head[0])}" cy="${r1(head[1])}" r="${r1(Math.hypot(head[0] - top[0], head[1] - top[1]))}" fill="${C.skin}"/>`);
  });
  svg.push(`<text x="30" y="${HEIGHT_PX - 30}" font-family="serif" font-style="italic" font-size="30" fill="#3b3630">${title} (invented picture)</text>`);
  svg.push('</svg>');

  // the scene file: lines a user would click, and object-shadow pairs
  const fmt = (p) => `[${p[0]}, ${p[1]}]`;
  const line = (a, b) => `[${fmt(click(a))}, ${fmt(click(b))}]`;
  const verticals = [
    line(front(0, 0.3), front(0, EAVES - 0.2)),
    line(front(FRONT_W, 0.3), front(FRONT_W, EAVES - 0.2)),
    line(side(SIDE_W, 0.3), side(SIDE_W, EAVES - 0.2)),
    ...FRONT_WINDOWS.slice(1, 3).map((w) => line(front(w.s, FLOORS[0].v0), front(w.s, FLOORS[1].v0 + FLOORS[1].h))),
    line(side(SIDE_WINDOWS[1].s + SIDE_WINDOWS[1].w, FLOORS[0].v0), side(SIDE_WINDOWS[1].s + SIDE_WINDOWS[1].w, FLOORS[1].v0 + FLOORS[1].h)),
  ];
  const frontLines = [
    ...COURSES.map((v) => line(front(0.2, v), front(FRONT_W - 0.2, v))),
    line(front(FRONT_WINDOWS[0].s, FLOORS[1].v0 + FLOORS[1].h), front(FRONT_WINDOWS[3].s + 1.3, FLOORS[1].v0 + FLOORS[1].h)),
  ];
  const sideLines = [
    ...COURSES.map((v) => line(side(0.2, v), side(SIDE_W - 0.2, v))),
    line(side(SIDE_WINDOWS[0].s, FLOORS[1].v0), side(SIDE_WINDOWS[2].s + 1.3, FLOORS[1].v0)),
  ];
  /** Where a shadow point lies, in words. */
  const surface = (q) => {
    const a = dot(q, alongFront);
    const b = dot(q, alongSide);
    if (a > -0.01 && b > -0.01 && q[2] > terrain(q) + 0.01) return Math.abs(dot(q, nFront)) < 0.01 ? 'on the front wall' : 'on the side wall';
    if (a >= STEPS.a0 && a <= STEPS.a1 && dot(q, nFront) < STEPS.tread * STEPS.count) return 'on the steps';
    return 'on the cobbles';
  };
  const pair = (id, group, top, s, what) => {
    const q = shadowOf(top, s);
    return `  - { id: ${id}, kind: object-shadow, group: ${group}, objectPx: ${fmt(click(top))}, shadowPx: ${fmt(click(q))}, note: "${what}, its shadow ${surface(q)}" }`;
  };
  const pairs = [
    ...POSTS.map((p, i) => pair(`post-${i + 1}`, 'lamp-posts', add(postFeet[i], [0, 0, p.h]), sVec, 'top of a lamp post')),
    ...FIGURES.map((f, i) => pair(`figure-${i + 1}`, 'figures', add(f.at, [0, 0, f.h]), fVec, `top of the head of a figure ${i < 3 ? 'standing on the steps' : 'in the square'}`)),
  ];
  return { svg: `${svg.join('\n')}\n`, verticals, frontLines, sideLines, pairs };
}

function sceneText(pic, title, file, comment) {
  return `# yaml-language-server: $schema=../../docs/scene.schema.json
# ${comment}
# An INVENTED picture of the fictional town of Velmar, rendered by make-picture.mjs (see README.md).
# No size in metres anywhere: the camera comes from the picture's perspective, the sun from
# object points and their shadows. Every pixel point is a rendered point rounded to a whole pixel.
heliochron: 1
title: "${title}"
site: { latitudeDeg: ${SITE.latitudeDeg}, longitudeDeg: ${SITE.longitudeDeg}, elevationM: ${SITE.elevationM} }
calendar: gregorian
window:
  fromYear: 1871          # the print's dedication names the year; the day is lost
  toYear: 1871
air: { pressureHPa: ${AIR.pressureHPa}, temperatureC: ${AIR.temperatureC} }
image: { widthPx: ${WIDTH_PX}, heightPx: ${HEIGHT_PX}, file: ${file}, pixelSigmaPx: 1 }
walls:
  - { id: kornhaus-front, azimuthDeg: ${FRONT_AZIMUTH_DEG}, azimuthSigmaDeg: 0, note: "front towards the square, from the town plan" }
  - { id: kornhaus-side, azimuthDeg: ${SIDE_AZIMUTH_DEG}, azimuthSigmaDeg: 0, note: "west side, square to the front" }
camera:
  verticalLines:        # the building's corners and window jambs
${pic.verticals.map((l) => `    - ${l}`).join('\n')}
  wallLines:
    - wall: kornhaus-front   # string courses, eaves band, window heads
      lines:
${pic.frontLines.map((l) => `        - ${l}`).join('\n')}
    - wall: kornhaus-side
      lines:
${pic.sideLines.map((l) => `        - ${l}`).join('\n')}
observations:
  - { id: front-lit, kind: wall-lit, wall: kornhaus-front }
${pic.pairs.join('\n')}
seed: 1871
`;
}

const TITLE = 'Figures before the Kornhaus, Velmar';
const base = picture(sun, TITLE);
const variant = picture(sunOther, `${TITLE} (variant)`);
writeFileSync(join(here, 'kornplatz-figures.svg'), base.svg);
writeFileSync(join(here, 'kornplatz-figures-variant.svg'), variant.svg);
writeFileSync(join(here, 'kornplatz-figures.yaml'), sceneText(base, `${TITLE}, print of 1871`, 'kornplatz-figures.png', 'All shadows cast by one sun.'));
writeFileSync(join(here, 'kornplatz-figures-variant.yaml'), sceneText(variant, `${TITLE}, print of 1871 (variant: figures painted in at another sitting)`, 'kornplatz-figures-variant.png', 'The figures lit by the sun of four hours earlier; the group test should name them.'));
if (!process.argv.includes('--no-png')) {
  const profile = mkdtempSync(join(tmpdir(), 'kornplatz-chromium-'));
  for (const name of ['kornplatz-figures', 'kornplatz-figures-variant']) {
    execFileSync('/usr/bin/chromium', [
      '--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run',
      '--hide-scrollbars', '--force-device-scale-factor=1', `--user-data-dir=${profile}`,
      `--screenshot=${join(here, `${name}.png`)}`, `--window-size=${WIDTH_PX},${HEIGHT_PX}`, join(here, `${name}.svg`),
    ], { stdio: 'ignore' });
  }
  rmSync(profile, { recursive: true, force: true });
}
process.stdout.write(
  `true instant: jdUT ${jdUT.toFixed(6)}; sun azimuth ${sun.azimuthDeg.toFixed(4)} deg, altitude ${sun.altitudeDeg.toFixed(4)} deg (refracted)\n` +
    `variant figures: sun azimuth ${sunOther.azimuthDeg.toFixed(4)} deg, altitude ${sunOther.altitudeDeg.toFixed(4)} deg\n`,
);
