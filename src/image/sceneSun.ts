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
 * For the solver each group becomes one `sun-direction` observation, put in
 * place of the group's first pair and named `group:<label>` (or the first
 * pair's id when the pairs have no group); its other pairs become `sun-up` facts
 * (a cast shadow means the sun is up) so that nothing is counted twice. The
 * sun-direction form has independent azimuth and altitude sigmas; the
 * correlation rho of the two is absorbed conservatively by widening both
 * sigmas by sqrt(1 + |rho|): the matrix (1 + |rho|) diag(sigma^2) is at
 * least the full covariance in every direction, because the correlation
 * matrix [[1, rho], [rho, 1]] has eigenvalues 1 +- rho (common practice of
 * bounding a covariance by a diagonal one).
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
  /** Sigmas written into the sun-direction observation (widened for the correlation, or from the Monte Carlo). */
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
  /** The observations with every object-shadow pair replaced (see the header). */
  readonly observations: readonly Observation[];
  /** Object and shadow point of each pair, working frame, by field (`observations[4]`). */
  readonly pairsByField: ReadonlyMap<string, readonly [Point2, Point2]>;
}

/** True when the scene has object-shadow pairs. */
export function hasObjectShadows(scene: Scene): boolean {
  return scene.observations.some((o) => o.kind === 'object-shadow');
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
  const replaced: Observation[] = [...scene.observations];
  const groups: GroupSun[] = [];
  for (const [group, members] of byGroup) {
    if (members.length < 2) {
      const m = members[0];
      throw new InvalidInputError(
        `observations[${m.index}]`, m.obs.id, `two or more object-shadow pairs${group ? ` in group "${group}"` : ' without a group'}`,
        'One pair confines the sun to a great circle of the sky only; add a second pair lit by the same sun',
      );
    }
    const pairs: ShadowPairInput[] = members.map(({ obs, index }) => ({
      field: `observations[${index}]`,
      objectPx: toWorkingFrame(obs.objectPx, image),
      shadowPx: toWorkingFrame(obs.shadowPx, image),
      sigmaPx: obs.sigmaPx ?? image.pixelSigmaPx,
    }));
    const sun = sunFromShadowPairs(camera, pairs);
    const correlation = sun.covarianceDeg2[0][1] / (sun.azimuthSigmaDeg * sun.altitudeSigmaDeg);
    const widen = Math.sqrt(1 + Math.abs(Number.isFinite(correlation) ? correlation : 0));
    let azimuthSigmaDeg = sun.azimuthSigmaDeg * widen;
    let altitudeSigmaDeg = sun.altitudeSigmaDeg * widen;
    let sigmaSource: GroupSun['sigmaSource'] = 'first-order';
    let monteCarlo: GroupSun['monteCarlo'];
    if (!sun.firstOrderReliable) {
      const seed = (scene.seed + members[0].index) >>> 0; // one stream per group, repeatable from the scene's seed
      const chain = sunFromShadowPairsFunction(camera, pairs);
      const mc = monteCarloSpread(chain.f, chain.p0, chain.sigmas, [true, false], createRandom(seed), SUN_MONTE_CARLO_SAMPLES);
      const [mcAz, mcAlt] = [mc.sigmas[0] * widen, mc.sigmas[1] * widen];
      if (Number.isFinite(mcAz) && Number.isFinite(mcAlt) && (mcAz > azimuthSigmaDeg || mcAlt > altitudeSigmaDeg)) {
        azimuthSigmaDeg = Math.max(azimuthSigmaDeg, mcAz);
        altitudeSigmaDeg = Math.max(altitudeSigmaDeg, mcAlt);
        sigmaSource = 'monte-carlo';
      }
      monteCarlo = { seed, samples: SUN_MONTE_CARLO_SAMPLES, azimuthSigmaDeg: mc.sigmas[0], altitudeSigmaDeg: mc.sigmas[1] };
    }
    const [first, ...rest] = members;
    const label = group ? `group "${group}"` : 'the pairs without a group';
    // a group's sun is named after the group ("group:figures"; a colon never occurs in an id of the file)
    replaced[first.index] = {
      id: group ? `group:${group}` : first.obs.id, kind: 'sun-direction', ...(group ? { group } : {}),
      azimuthDeg: sun.azimuthDeg, azimuthSigmaDeg, altitudeDeg: sun.altitudeDeg, altitudeSigmaDeg,
      note: `sun from ${members.length} object-shadow pairs of ${label} through the picture's camera (${members.map((m) => m.obs.id).join(', ')})${first.obs.note ? `; ${first.obs.note}` : ''}`,
    };
    for (const m of rest) {
      replaced[m.index] = { id: m.obs.id, kind: 'sun-up', note: `object-shadow pair combined into ${first.obs.id}${m.obs.note ? `; ${m.obs.note}` : ''}` };
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
  return { camera, groups: compared, observations: replaced, pairsByField };
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
    out.push(
      `    first-order sigmas ${f2(g.sun.azimuthSigmaDeg)} and ${f2(g.sun.altitudeSigmaDeg)} deg, correlation ${g.correlation.toFixed(2)}; ` +
        `written to the dating widened by sqrt(1 + |correlation|) so that no direction is claimed better than measured`,
    );
    if (g.monteCarlo) out.push(`    Monte Carlo of ${g.monteCarlo.samples} samples (seed ${g.monteCarlo.seed}): ${f2(g.monteCarlo.azimuthSigmaDeg)} and ${f2(g.monteCarlo.altitudeSigmaDeg)} deg`);
    const vp = g.sun.vanishingPointPx;
    out.push(`    the shadow lines meet at ${vp ? `[${f1(vp[0])}, ${f1(vp[1])}] px (the ${g.sun.vanishingPointIsSun ? 'sun' : 'point opposite the sun'})` : 'infinity (the sun is square to the line of sight)'}`);
    for (const n of g.sun.notes) out.push(`    ${n}`);
    if (g.againstRest) out.push(`    ${g.againstRest.sentence}`);
    else if (s.groups.length > 1) out.push('    not compared with the other pairs: taken together they do not point to one sun (several other groups under different light)');
  }
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
      written: { azimuthSigmaDeg: g.azimuthSigmaDeg, altitudeSigmaDeg: g.altitudeSigmaDeg, sigmaSource: g.sigmaSource },
      monteCarlo: g.monteCarlo ?? null,
      vanishingPointPx: g.sun.vanishingPointPx, vanishingPointCovariancePx: g.sun.vanishingPointCovariancePx ?? null, vanishingPointIsSun: g.sun.vanishingPointIsSun,
      meeting: { chiSquare: g.sun.chiSquare, dof: g.sun.dof, pValue: g.sun.pValue, missAnglesDeg: g.sun.missAnglesDeg },
      notes: g.sun.notes,
      againstRest: g.againstRest ?? null,
    })),
  };
}
