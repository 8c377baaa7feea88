/**
 * A scene's camera and the sun of each group of its object-shadow pairs.
 *
 * The `camera` block becomes a CameraInput (every point flipped into the
 * working frame for a mirrored print, docs/conventions.md; each wall's
 * horizontal lines carry its stated azimuth), solved by camera.ts. The
 * object-shadow observations are grouped by their `group` label (no label:
 * one group of its own), and each group's pairs give one sun direction with
 * its covariance (cameraSun.ts). When the first-order sigma is not reliable,
 * the Monte Carlo spread of the same clicks (seeded from the scene's seed)
 * is used when larger, as for the other pixel measurements
 * (resolvePixels.ts).
 *
 * A group's sun is for the report and the overlay. The dating does not use
 * it: each pair is its own observation there, its great circle of the sky
 * with the side planes of its arc, and each shadow wedge its lune
 * (sunConstraints.ts), written into the observation (`circle`, `sides`,
 * `edges`), with the camera's shared error as nuisances of the solver. A
 * group of one pair has no sun of its own here (one pair is a great circle
 * only) but dates like any other.
 *
 * With two or more groups, each group's sun is compared with the sun of all
 * the other pairs (cameraSun.ts, compareShadowSets): a Delta chi-square with
 * 2 degrees of freedom, its p-value, and a plain sentence ("the shadows of
 * group "figures" do not share the light of the other pairs: p = 0.001").
 * This is the test at the level of the picture's shadows; the dating's own
 * test of a group against all other evidence is not made here.
 */
import { InvalidInputError } from '../errors.js';
import { createRandom } from '../math/random.js';
import type { ObjectShadowObservation, Observation, Scene } from '../scene/types.js';
import { solveCamera, type CameraSolution } from './camera.js';
import type { CameraInput, LineFamily } from './cameraModel.js';
import { compareShadowSets, sunFromShadowPairs, sunFromShadowPairsFunction, type ShadowPairInput, type SunComparison, type SunFromShadows } from './cameraSun.js';
import { toWorkingFrame } from './planeInImage.js';
import type { Point2 } from './homography.js';
import { monteCarloSpread } from './propagation.js';
import { cameraErrorComponents, pairConstraint, wedgeConstraint, type CameraErrorComponents } from './sunConstraints.js';

/** Monte Carlo samples when the first-order sigma of a group's sun is not reliable. */
export const SUN_MONTE_CARLO_SAMPLES = 1000;

/** The camera input of a scene's camera block, in the working frame. */
export function cameraInputOf(scene: Scene): CameraInput {
  const block = scene.camera;
  const image = scene.image;
  if (!block || !image) throw new InvalidInputError('camera', block, 'a camera block with the picture described in "image"');
  const sigmaPx = block.sigmaPx ?? image.pixelSigmaPx;
  const lines = (list: readonly (readonly (readonly [number, number])[])[]) =>
    list.map((line) => ({ pointsPx: line.map((p) => toWorkingFrame(p, image)), sigmaPx }));
  const families: LineFamily[] = [{ field: 'camera.verticalLines', direction: { kind: 'vertical' }, lines: lines(block.verticalLines) }];
  block.wallLines.forEach((w, i) => {
    const wall = scene.walls.find((x) => x.id === w.wallId);
    if (!wall) throw new InvalidInputError(`camera.wallLines[${i}].wall`, w.wallId, 'the id of a wall of this scene');
    families.push({ field: `camera.wallLines[${i}].lines`, direction: { kind: 'wall', wallId: wall.id, wallAzimuthDeg: wall.azimuthDeg }, lines: lines(w.lines) });
  });
  return {
    field: 'camera', widthPx: image.widthPx, heightPx: image.heightPx, families,
    ...(block.focalLengthPx !== undefined ? { focalLengthPx: block.focalLengthPx } : {}),
  };
}

/** One group's sun, with the sigmas written into the scene. */
export interface GroupSun {
  /** The group label; '' for pairs without one. */
  readonly group: string;
  readonly ids: readonly string[];
  readonly fields: readonly string[];
  readonly sun: SunFromShadows;
  /** The sigmas reported: first order, or the Monte Carlo spread when that is not reliable and the spread is larger. */
  readonly azimuthSigmaDeg: number;
  readonly altitudeSigmaDeg: number;
  readonly correlation: number;
  readonly sigmaSource: 'first-order' | 'monte-carlo';
  readonly monteCarlo?: { readonly seed: number; readonly samples: number; readonly azimuthSigmaDeg: number; readonly altitudeSigmaDeg: number };
  /** With two or more groups: this group's sun against the sun of all other pairs (compareShadowSets). */
  readonly againstRest?: SunComparison & { readonly sentence: string };
}

/** Below this p-value a group is said not to share the light of the rest. */
export const GROUP_P_LIMIT = 0.01;

export interface SceneSun {
  readonly camera: CameraSolution;
  readonly groups: readonly GroupSun[];
  /** Groups (or the pairs without a group) of a single pair: a great circle only, no sun of their own. */
  readonly singlePairs: readonly { readonly group: string; readonly id: string; readonly field: string }[];
  /** The camera's shared error as independent components (sunConstraints.ts). */
  readonly cameraErrors: CameraErrorComponents;
  /** The observations with every object-shadow pair and shadow wedge given its planes through the camera (see the header). */
  readonly observations: readonly Observation[];
  /** Object and shadow point of each pair, working frame, by field (`observations[4]`). */
  readonly pairsByField: ReadonlyMap<string, readonly [Point2, Point2]>;
}

/** True when the scene has object-shadow pairs. */
export function hasObjectShadows(scene: Scene): boolean {
  return scene.observations.some((o) => o.kind === 'object-shadow' || o.kind === 'shadow-wedge');
}

/**
 * The scene's camera and the sun of each group of object-shadow pairs.
 * Throws InvalidInputError naming the field for degenerate lines or pairs.
 * @example resolveSceneSun(scene).groups[0].sun.azimuthDeg // 212.8
 */
export function resolveSceneSun(scene: Scene): SceneSun {
  const image = scene.image!;
  const camera = solveCamera(cameraInputOf(scene));
  const byGroup = new Map<string, { obs: ObjectShadowObservation; index: number }[]>();
  scene.observations.forEach((o, index) => {
    if (o.kind !== 'object-shadow') return;
    const key = o.group ?? '';
    byGroup.set(key, [...(byGroup.get(key) ?? []), { obs: o, index }]);
  });
  const cameraErrors = cameraErrorComponents(camera);
  const replaced: Observation[] = scene.observations.map((o, index): Observation => {
    const field = `observations[${index}]`;
    const sigmaPx = (o.kind === 'object-shadow' || o.kind === 'shadow-wedge') ? (o.sigmaPx ?? image.pixelSigmaPx) : 0;
    if (o.kind === 'object-shadow') {
      const c = pairConstraint(camera, cameraErrors, { field, objectPx: toWorkingFrame(o.objectPx, image), shadowPx: toWorkingFrame(o.shadowPx, image), sigmaPx });
      return { ...o, circle: c.circle, sides: c.sides };
    }
    if (o.kind === 'shadow-wedge') {
      const edgesPx = [toWorkingFrame(o.edgesPx[0], image), toWorkingFrame(o.edgesPx[1], image)] as const;
      return { ...o, edges: wedgeConstraint(camera, cameraErrors, { field, shadowPx: toWorkingFrame(o.shadowPx, image), edgesPx, sigmaPx }).edges };
    }
    return o;
  });
  const groups: GroupSun[] = [];
  const singlePairs: SceneSun['singlePairs'][number][] = [];
  for (const [group, members] of byGroup) {
    if (members.length < 2) {
      singlePairs.push({ group, id: members[0].obs.id, field: `observations[${members[0].index}]` });
      continue;
    }
    const pairs: ShadowPairInput[] = members.map(({ obs, index }) => ({
      field: `observations[${index}]`,
      objectPx: toWorkingFrame(obs.objectPx, image),
      shadowPx: toWorkingFrame(obs.shadowPx, image),
      sigmaPx: obs.sigmaPx ?? image.pixelSigmaPx,
    }));
    const sun = sunFromShadowPairs(camera, pairs);
    const correlation = sun.covarianceDeg2[0][1] / (sun.azimuthSigmaDeg * sun.altitudeSigmaDeg);
    let azimuthSigmaDeg = sun.azimuthSigmaDeg;
    let altitudeSigmaDeg = sun.altitudeSigmaDeg;
    let sigmaSource: GroupSun['sigmaSource'] = 'first-order';
    let monteCarlo: GroupSun['monteCarlo'];
    if (!sun.firstOrderReliable) {
      const seed = (scene.seed + members[0].index) >>> 0; // one stream per group, repeatable from the scene's seed
      const chain = sunFromShadowPairsFunction(camera, pairs);
      const mc = monteCarloSpread(chain.f, chain.p0, chain.sigmas, [true, false], createRandom(seed), SUN_MONTE_CARLO_SAMPLES);
      const [mcAz, mcAlt] = [mc.sigmas[0], mc.sigmas[1]];
      if (Number.isFinite(mcAz) && Number.isFinite(mcAlt) && (mcAz > azimuthSigmaDeg || mcAlt > altitudeSigmaDeg)) {
        azimuthSigmaDeg = Math.max(azimuthSigmaDeg, mcAz);
        altitudeSigmaDeg = Math.max(altitudeSigmaDeg, mcAlt);
        sigmaSource = 'monte-carlo';
      }
      monteCarlo = { seed, samples: SUN_MONTE_CARLO_SAMPLES, azimuthSigmaDeg: mc.sigmas[0], altitudeSigmaDeg: mc.sigmas[1] };
    }
    groups.push({
      group, ids: members.map((m) => m.obs.id), fields: pairs.map((p) => p.field), sun,
      azimuthSigmaDeg, altitudeSigmaDeg, correlation, sigmaSource, ...(monteCarlo ? { monteCarlo } : {}),
    });
  }
  const compared = groups.length < 2 ? groups : groups.map((g): GroupSun => {
    const mine = new Set(g.fields);
    const rest: ShadowPairInput[] = [];
    for (const [, members] of byGroup) {
      for (const { obs, index } of members) {
        const field = `observations[${index}]`;
        if (!mine.has(field)) rest.push({ field, objectPx: toWorkingFrame(obs.objectPx, image), shadowPx: toWorkingFrame(obs.shadowPx, image), sigmaPx: obs.sigmaPx ?? image.pixelSigmaPx });
      }
    }
    const mineInputs: ShadowPairInput[] = g.fields.map((field) => {
      const obs = scene.observations[Number(/\[(\d+)\]/.exec(field)![1])] as ObjectShadowObservation;
      return { field, objectPx: toWorkingFrame(obs.objectPx, image), shadowPx: toWorkingFrame(obs.shadowPx, image), sigmaPx: obs.sigmaPx ?? image.pixelSigmaPx };
    });
    let c: SunComparison;
    try {
      c = compareShadowSets(camera, mineInputs, rest);
    } catch {
      return g; // the other pairs together give no one sun (they disagree on where the light comes from): no comparison
    }
    const p = c.pValue < 1e-6 ? '< 0.000001' : c.pValue < 0.001 ? c.pValue.toExponential(1) : c.pValue.toPrecision(2);
    const who = `the shadows of group "${g.group || '(no group)'}"`;
    const sentence = c.pValue < GROUP_P_LIMIT
      ? `${who} do not share the light of the other pairs: p ${p.startsWith('<') ? p : `= ${p}`} (their suns are ${c.separationDeg.toFixed(1)} deg apart; Delta chi-square ${c.chiSquare.toFixed(1)} for 2 degrees of freedom)`
      : `${who} agree with the light of the other pairs: p ${p.startsWith('<') ? p : `= ${p}`} (their suns are ${c.separationDeg.toFixed(1)} deg apart, within the clicking error)`;
    return { ...g, againstRest: { ...c, sentence } };
  });
  const pairsByField = new Map<string, readonly [Point2, Point2]>();
  scene.observations.forEach((o, index) => {
    if (o.kind === 'object-shadow') pairsByField.set(`observations[${index}]`, [toWorkingFrame(o.objectPx, image), toWorkingFrame(o.shadowPx, image)]);
  });
  return { camera, groups: compared, singlePairs, cameraErrors, observations: replaced, pairsByField };
}

const f1 = (x: number): string => x.toFixed(1);
const f2 = (x: number): string => (Math.abs(x) < 0.005 ? 0 : x).toFixed(2);

/** Plain-words lines on the camera and the sun of each group, for `heliochron measure` and the desk. */
export function describeSceneSun(s: SceneSun): string[] {
  const c = s.camera;
  const out: string[] = [];
  out.push("The picture's camera, from its vanishing lines (camera)");
  out.push(`  ${c.methodNote}`);
  out.push(
    `  focal length ${f1(c.focalLengthPx.value)} px, sigma ${f1(c.focalLengthPx.sigma)} px (horizontal field of view ${f1(c.horizontalFieldOfViewDeg)} deg); ` +
      `principal point [${f1(c.principalPointPx[0].value)}, ${f1(c.principalPointPx[1].value)}] px${c.principalPointAssumed ? ' (assumed)' : `, sigma ${f1(c.principalPointPx[0].sigma)}, ${f1(c.principalPointPx[1].sigma)} px`}`,
  );
  out.push(
    `  looking towards azimuth ${f2(c.viewAzimuthDeg.value)} deg (sigma ${f2(c.viewAzimuthDeg.sigma)}), tilted ${f2(Math.abs(c.viewAltitudeDeg.value))} deg ${c.viewAltitudeDeg.value >= 0 ? 'up' : 'down'} (sigma ${f2(c.viewAltitudeDeg.sigma)}), ` +
      `rolled ${f2(c.rollDeg.value)} deg (sigma ${f2(c.rollDeg.sigma)}); rotation sigma about east, north, up ${c.rotationSigmaDeg.map(f2).join(', ')} deg`,
  );
  for (const v of c.vanishingPoints) {
    const where = v.pointPx ? `vanishing point [${f1(v.pointPx[0])}, ${f1(v.pointPx[1])}] px` : 'vanishing point at infinity (the lines are parallel in the picture)';
    out.push(`  ${v.field}: ${v.lineCount} lines, ${where}`);
    out.push(`    ${v.note}`);
  }
  c.directionMisfitsDeg.forEach((m, k) => {
    if (m > 2) out.push(`  WARNING: ${c.vanishingPoints[k].field} lies ${f1(m)} deg from where the camera puts its stated direction: check the wall's azimuth and the lines`);
  });
  for (const n of c.notes.slice(1 + c.vanishingPoints.length)) out.push(`  WARNING: ${n}`);
  out.push('');
  out.push('Sun directions from object-shadow pairs, through the camera');
  for (const g of s.groups) {
    const name = g.group ? `group "${g.group}"` : 'pairs without a group';
    out.push(`  ${name} (${g.ids.join(', ')}; ${g.fields.join(', ')})`);
    out.push(
      `    sun azimuth ${f2(g.sun.azimuthDeg)} deg, sigma ${f2(g.azimuthSigmaDeg)}; apparent altitude ${f2(g.sun.altitudeDeg)} deg, sigma ${f2(g.altitudeSigmaDeg)}` +
        `${g.sigmaSource === 'monte-carlo' ? ' (Monte Carlo spread)' : ''}`,
    );
    out.push(`    first-order sigmas ${f2(g.sun.azimuthSigmaDeg)} and ${f2(g.sun.altitudeSigmaDeg)} deg, correlation ${g.correlation.toFixed(2)}`);
    if (g.monteCarlo) out.push(`    Monte Carlo of ${g.monteCarlo.samples} samples (seed ${g.monteCarlo.seed}): ${f2(g.monteCarlo.azimuthSigmaDeg)} and ${f2(g.monteCarlo.altitudeSigmaDeg)} deg`);
    const vp = g.sun.vanishingPointPx;
    out.push(`    the shadow lines meet at ${vp ? `[${f1(vp[0])}, ${f1(vp[1])}] px (the ${g.sun.vanishingPointIsSun ? 'sun' : 'point opposite the sun'})` : 'infinity (the sun is square to the line of sight)'}`);
    for (const n of g.sun.notes) out.push(`    ${n}`);
    if (g.againstRest) out.push(`    ${g.againstRest.sentence}`);
    else if (s.groups.length > 1) out.push('    not compared with the other pairs: taken together they do not point to one sun (several other groups under different light)');
  }
  for (const p of s.singlePairs) {
    out.push(`  ${p.group ? `group "${p.group}"` : 'pairs without a group'} (${p.id}; ${p.field}): one pair, a great circle of the sky only; no sun of its own here, but the dating uses it`);
  }
  const wedges = s.observations.filter((o) => o.kind === 'shadow-wedge').length;
  out.push(
    `  For the dating each pair is its own observation (the sun's distance from its great circle)${wedges === 1 ? ', the shadow wedge a one-sided bound' : wedges > 1 ? `, each of the ${wedges} shadow wedges a one-sided bound` : ''}; the camera's error, shared by all of them, ` +
      `is fitted as ${s.cameraErrors.components.length} nuisance${s.cameraErrors.components.length === 1 ? '' : 's'} of one sigma each, so the pairs are not taken as independent.`,
  );
  if (s.groups.length === 2 && s.groups.some((g) => g.againstRest && g.againstRest.pValue < GROUP_P_LIMIT)) {
    out.push('  With two groups the test is the same both ways: it says the two groups were not lit by one sun, not which of them is out of place.');
  }
  out.push('  These are estimates conditional on the picture following one camera, the lines being straight edges vertical or along the stated walls, and each shadow point belonging to its object point.');
  return out;
}

/** The camera and the groups' suns as plain JSON-ready data (no functions, no input echo). */
export function sceneSunRecord(s: SceneSun): unknown {
  const c = s.camera;
  return {
    method: c.method.kind,
    methodNote: c.methodNote,
    focalLengthPx: c.focalLengthPx,
    principalPointPx: c.principalPointPx,
    principalPointAssumed: c.principalPointAssumed,
    horizontalFieldOfViewDeg: c.horizontalFieldOfViewDeg,
    viewAzimuthDeg: c.viewAzimuthDeg,
    viewAltitudeDeg: c.viewAltitudeDeg,
    rollDeg: c.rollDeg,
    rotation: c.rotation,
    rotationSigmaDeg: c.rotationSigmaDeg,
    firstOrderReliable: c.firstOrderReliable,
    perspectiveConsistent: c.perspectiveConsistent,
    vanishingPoints: c.vanishingPoints.map((v) => ({
      field: v.field, pointPx: v.pointPx, covariancePx: v.covariancePx ?? null, atInfinity: v.atInfinity,
      lines: v.lineCount, chiSquare: v.chiSquare, dof: v.dof, pValue: v.pValue, missAnglesDeg: v.missAnglesDeg, note: v.note,
    })),
    notes: c.notes,
    groups: s.groups.map((g) => ({
      group: g.group || null, ids: g.ids, fields: g.fields,
      azimuthDeg: g.sun.azimuthDeg, altitudeDeg: g.sun.altitudeDeg,
      firstOrder: { azimuthSigmaDeg: g.sun.azimuthSigmaDeg, altitudeSigmaDeg: g.sun.altitudeSigmaDeg, covarianceDeg2: g.sun.covarianceDeg2 },
      reported: { azimuthSigmaDeg: g.azimuthSigmaDeg, altitudeSigmaDeg: g.altitudeSigmaDeg, sigmaSource: g.sigmaSource },
      monteCarlo: g.monteCarlo ?? null,
      vanishingPointPx: g.sun.vanishingPointPx, vanishingPointCovariancePx: g.sun.vanishingPointCovariancePx ?? null, vanishingPointIsSun: g.sun.vanishingPointIsSun,
      meeting: { chiSquare: g.sun.chiSquare, dof: g.sun.dof, pValue: g.sun.pValue, missAnglesDeg: g.sun.missAnglesDeg },
      notes: g.sun.notes,
      againstRest: g.againstRest ?? null,
    })),
    singlePairs: s.singlePairs,
    cameraErrorComponents: s.cameraErrors.components.length,
  };
}
