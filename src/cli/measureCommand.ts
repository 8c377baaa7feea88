/**
 * `heliochron measure`: every observation given in pixels turned into its number, with its
 * sigma, the parts of that sigma, how it was obtained, the residuals of each plane's
 * rectification in pixels, and a warning where the first-order sigma is not reliable;
 * optionally an SVG overlay in the picture's own pixels and, with --with-best, the shadows
 * the best candidate of a dating predicts. A thin layer over src/image; all validation of
 * the options is here. Everything is computed before anything is written or printed, so a
 * refusal (exit 2) leaves nothing behind.
 */
import { signedFixed } from '../textUnits.js';
import { existsSync } from 'node:fs';
import { dirname, relative, resolve } from 'node:path';
import { InvalidInputError } from '../errors.js';
import { escapeControls } from '../textUnits.js';
import type { Observation, Scene } from '../scene/types.js';
import { rectifyPlane, type RectifiedPlane } from '../image/planeInImage.js';
import { rectificationReport, LINEARITY_TOLERANCE } from '../image/pixelObservations.js';
import { rectifySceneGround } from '../image/measureScene.js';
import { measuredQuantities, resolvePixelObservations, type ResolvedMeasurement } from '../image/resolvePixels.js';
import { describeMoonDirection, moonDirectionRecord } from '../image/moonPixels.js';
import { describeSceneSun, sceneSunRecord } from '../image/sceneSun.js';
import { MEASURED_VALUE_WORDS, PIXEL_KIND_WORDS } from '../image/measuredValueWords.js';
import { annotationsText, sceneAnnotations } from '../report/annotations.js';
import { formatCalendarDate } from '../calendar/format.js';
import { hhmm, roundTo } from '../report/formatTimes.js';
import type { Candidate, DateAnswer } from '../solver/types.js';
import { checkOutputTarget, writeOutputFile, type CliIo } from './io.js';
import { inScene, readSceneForCommand } from './dateCommand.js';
import type { MeasureOptions } from './measureSpec.js';
import { measureOverlaySvg, observationIndex, planeLabel, planeShortLabel, predictMeasurements, type MeasurementPrediction } from './measureOverlay.js';
import type { PictureFile } from './pictureFile.js';
import { readPictureFile } from './readPictureFile.js';

/** Every plane of the scene rectified: those the measurements used, and any other wall or ground plane given. */
function allPlanes(scene: Scene, used: ReadonlyMap<string, RectifiedPlane>): Map<string, RectifiedPlane> {
  const planes = new Map(used);
  if (!scene.image) return planes;
  scene.walls.forEach((wall, i) => {
    const field = `walls[${i}].imagePlane`;
    if (wall.imagePlane && !planes.has(field)) planes.set(field, rectifyPlane(wall.imagePlane, scene.image!, 'wall', field));
  });
  if (scene.groundPlane && !planes.has('groundPlane')) rectifySceneGround(scene, scene.image, planes);
  return planes;
}

const KIND_WORDS = PIXEL_KIND_WORDS;
const VALUE_WORDS = MEASURED_VALUE_WORDS;

interface PlaneRecord {
  readonly field: string;
  readonly label: string;
  readonly kind: 'wall' | 'ground';
  readonly definition: string;
  readonly metric: boolean;
  readonly points: number;
  readonly residualsPx: readonly number[];
  readonly rmsPx: number;
  readonly exactlyDetermined: boolean;
  readonly conditionNumber: number;
  readonly note: string;
  readonly warning: string | null;
  /** Ground from two walls: their ids. */
  readonly fromWalls?: readonly string[];
}

function planeRecord(scene: Scene, field: string, plane: RectifiedPlane): PlaneRecord {
  const r = rectificationReport(plane);
  const worstSigma = Math.max(1e-9, ...plane.pointSigmasPx);
  const warning = r.exactlyDetermined
    ? null
    : r.rmsPx > 3 * worstSigma
      ? `rms residual ${r.rmsPx.toFixed(2)} px is more than 3 times the clicking precision (${worstSigma} px): a point is misclicked or the picture does not follow one perspective on this plane`
      : null;
  // the worst point named by its path in the scene file and by its label on the overlay (numbered from 1)
  const worst = r.residualsPx.indexOf(Math.max(...r.residualsPx));
  const note = r.exactlyDetermined
    ? r.note
    : `rms residual ${r.rmsPx.toFixed(2)} px, largest ${r.residualsPx[worst].toFixed(2)} px at ${field}.pointsPx[${worst}] ` +
      `(${planeShortLabel(field)} ${worst + 1} on the overlay): ${warning ? 'larger than the clicking precision' : 'within the clicking precision'}`;
  return {
    field, label: planeLabel(scene, field), kind: plane.kind, definition: r.definition, metric: r.metric,
    points: plane.pixelPoints.length, residualsPx: r.residualsPx.map((v) => roundTo(v, 3)), rmsPx: roundTo(r.rmsPx, 3),
    exactlyDetermined: r.exactlyDetermined, conditionNumber: roundTo(r.conditionNumber, 1), note, warning,
    ...(plane.fromWalls ? { fromWalls: plane.fromWalls.walls.map((w) => w.id) } : {}),
  };
}

/** @param written the observation's numeric form as the dating reads it (resolvePixelObservations) */
function observationRecord(scene: Scene, m: ResolvedMeasurement, written: Observation) {
  const meas = m.measurement;
  const quantities = measuredQuantities(meas);
  const obs = scene.observations[observationIndex(m.field)];
  const warnings: string[] = [];
  const values = quantities.map(({ name, quantity: q }, k) => {
    const used = m.values[k];
    if (!q.firstOrderReliable) {
      warnings.push(
        `${name}: the first-order sigma ${q.sigma.toPrecision(3)} is not reliable (the value bends within the clicking error, nonlinearity ` +
          `${q.nonlinearity.toFixed(2)} > ${LINEARITY_TOLERANCE}); the Monte Carlo spread of ${m.monteCarlo?.samples} samples (seed ${m.monteCarlo?.seed}) is ` +
          `${used.monteCarloSigma?.toPrecision(3)}, and ${used.sigma.toPrecision(3)} (${used.sigmaSource}) is what dating uses. Click a larger figure nearer the shadow`,
      );
    }
    return {
      name,
      value: roundTo(q.value, 6),
      sigma: roundTo(used.sigma, 6),
      sigmaSource: used.sigmaSource,
      firstOrderSigma: roundTo(q.sigma, 6),
      sigmaParts: {
        clickedFigure: roundTo(q.sigmaFromPlane, 6), shadowPoints: roundTo(q.sigmaFromPoints, 6), statedLength: roundTo(q.sigmaFromLength, 6),
        ...(q.sigmaFromAzimuth > 0 ? { wallAzimuth: roundTo(q.sigmaFromAzimuth, 6) } : {}),
      },
      firstOrderReliable: q.firstOrderReliable,
      nonlinearity: roundTo(q.nonlinearity, 4),
      ...(used.monteCarloSigma !== undefined ? { monteCarloSigma: roundTo(used.monteCarloSigma, 6) } : {}),
    };
  });
  const wallId = 'wallId' in obs ? obs.wallId : obs.kind === 'shadow-points' ? obs.pixels?.wallId : undefined;
  return {
    field: m.field,
    id: meas.id,
    kind: meas.kind,
    ...(wallId !== undefined ? { wallId } : {}),
    plane: meas.rectification.field,
    ...(meas.rectification.definition === 'camera' ? { planeFromCamera: true } : {}),
    ...(meas.kind === 'rod-shadow' || meas.kind === 'fin-shadow' ? { side: meas.side } : {}),
    ...(meas.kind === 'eave-shadow' ? { projectionRatio: roundTo(meas.projectionRatio, 6) } : {}),
    ...(written.kind === 'shadow-points'
      ? { caster: written.caster!.map((v) => roundTo(v, 6)), shadow: written.shadow!.map((v) => roundTo(v, 6)), sigmaM: roundTo(written.sigmaM!, 6) }
      : {}),
    values,
    ...(m.monteCarlo ? { monteCarlo: m.monteCarlo } : {}),
    obtained: meas.note,
    warnings,
  };
}

type ObservationRecord = ReturnType<typeof observationRecord>;

function candidateCaption(c: Candidate): string {
  return `${formatCalendarDate(c.civilDate)}, ${hhmm(c.times.localApparentMinutes)} local apparent time`;
}

function bestRecord(answer: DateAnswer, predictions: readonly MeasurementPrediction[] | null) {
  const c = answer.candidates[0];
  return {
    status: answer.status,
    verdict: answer.verdict,
    candidate: c
      ? {
          id: c.id,
          date: candidateCaption(c),
          civilDate: c.civilDate,
          localApparentMinutes: roundTo(c.times.localApparentMinutes, 2),
          sunAzimuthDeg: roundTo(c.sun.azimuthDeg, 4),
          sunAltitudeDeg: roundTo(c.sun.altitudeDeg, 4),
          chiSquare: roundTo(c.chiSquare, 4),
        }
      : null,
    predictions: (predictions ?? []).map((p) => ({
      field: p.field,
      id: p.id,
      defined: p.defined,
      ...(p.side !== undefined ? { side: p.side } : {}),
      ...(p.wallAzimuthDeg !== undefined ? { wallAzimuthDeg: roundTo(p.wallAzimuthDeg, 4) } : {}),
      values: p.values.map((v) => ({ name: v.name, measured: roundTo(v.measured, 6), predicted: roundTo(v.predicted, 6), sigma: roundTo(v.sigma, 6), normalised: roundTo(v.normalised, 3) })),
    })),
  };
}

function fmtValue(name: string, v: number): string {
  const w = VALUE_WORDS[name];
  return `${v.toFixed(w.digits)}${w.unit ? ` ${w.unit}` : ''}`;
}

function renderText(
  scene: Scene,
  planes: readonly PlaneRecord[],
  observations: readonly ObservationRecord[],
  best: ReturnType<typeof bestRecord> | null,
  notes: readonly string[],
): string {
  const out: string[] = [];
  const image = scene.image;
  out.push(`Measured on the picture: ${scene.title}`);
  if (image) {
    out.push(`Picture ${image.widthPx} x ${image.heightPx} px${image.mirrored ? ', a reversed print (x flipped before measuring)' : ''}; clicking precision ${image.pixelSigmaPx} px (image.pixelSigmaPx) unless a point gives its own; seed ${scene.seed} for any Monte Carlo run`);
  }
  out.push('');
  out.push('Planes straightened (rectification; residuals in pixels, clicked point to where the fit puts it)');
  if (planes.length === 0) out.push('  none');
  for (const p of planes) {
    out.push(`  ${p.field} (${p.kind === 'wall' ? `wall ${p.label}` : 'the ground'}): ${p.definition === 'camera' ? "from the camera and the plane's stated direction, no clicked figure (known up to scale)" : p.definition === 'walls' ? `from the foot lines of walls ${p.fromWalls?.join(' and ')} meeting at the corner` : p.definition === 'points' ? `${p.points} points of known position` : p.definition === 'rectangle' ? 'a rectangle of known size' : 'a rectangle of known proportion only'}`);
    if (p.definition !== 'camera') out.push(`    residuals ${p.residualsPx.map((r) => r.toFixed(2)).join(', ')} px; rms ${p.rmsPx.toFixed(2)} px; condition number ${p.conditionNumber.toPrecision(3)}`);
    out.push(`    ${p.note}`);
    if (p.warning) out.push(`    WARNING: ${p.warning}`);
  }
  out.push('');
  out.push('Observations measured from pixels');
  if (observations.length === 0) {
    out.push(scene.observations.some((o) => o.kind === 'object-shadow')
      ? '  none on a straightened wall or ground; the object-shadow pairs are measured through the camera, below'
      : '  none: no observation of this scene is given in pixels');
  }
  for (const o of observations) {
    out.push(`  ${o.field} ${JSON.stringify(o.id)}: ${KIND_WORDS[o.kind]}${o.kind === 'eave-shadow' ? ` of wall ${o.wallId}, on the ground` : o.wallId ? ` on wall ${o.wallId}` : ' on the ground'}`);
    for (const v of o.values) {
      const w = VALUE_WORDS[v.name];
      const side = v.name === 'slopeDeg' || v.name === 'widthRatio' ? (o.side ? `, to the ${o.side}` : '') : '';
      out.push(`    ${v.name} = ${fmtValue(v.name, v.value)}${side}, sigma ${fmtValue(v.name, v.sigma)}${v.sigmaSource === 'monte-carlo' ? ' (Monte Carlo spread)' : ''}   [${w.label}]`);
      const unit = w.unit ? ` ${w.unit}` : '';
      const length = (v.sigmaParts.statedLength > 0 ? `, stated length ${v.sigmaParts.statedLength.toFixed(w.digits)}${unit}` : '') +
        (v.sigmaParts.wallAzimuth !== undefined ? `, wall azimuth ${v.sigmaParts.wallAzimuth.toFixed(w.digits)}${unit}` : '');
      out.push(
        `      sigma parts (first order): ${o.planeFromCamera ? 'camera lines' : 'clicked figure'} ${v.sigmaParts.clickedFigure.toFixed(w.digits)}${unit}, ` +
          `shadow points ${v.sigmaParts.shadowPoints.toFixed(w.digits)}${unit}${length}; ` +
          `first order ${v.firstOrderReliable ? 'reliable' : 'NOT reliable'} (nonlinearity ${v.nonlinearity.toFixed(2)}, limit ${LINEARITY_TOLERANCE})`,
      );
    }
    const clicked = /clicked on [^;]*\)/.exec(o.obtained);
    out.push(`    how: ${clicked ? `${clicked[0]}; sigma by first-order propagation of the clicking precision${o.values.some((v) => v.sigmaParts.statedLength > 0) ? ' and of the stated length' : ''}${o.values.some((v) => v.sigmaParts.wallAzimuth !== undefined) ? " and of the wall's stated azimuth" : ''}${o.monteCarlo ? `, checked by a Monte Carlo run of ${o.monteCarlo.samples} samples (seed ${o.monteCarlo.seed})` : ''}` : o.obtained}`);
    if (o.projectionRatio !== undefined) out.push(`    written as distanceRatio with projectionRatio ${o.projectionRatio.toFixed(4)} (eave projection / height, held as stated; its sigma is in the distance ratio's)`);
    if (o.caster !== undefined && o.shadow !== undefined) {
      out.push(`    written as caster [${o.caster.join(', ')}] and shadow [${o.shadow.join(', ')}]${o.planeFromCamera ? " (site axes, in units of the camera's distance to the plane)" : ' m (site axes east, north, up)'}, sigmaM ${o.sigmaM}`);
    }
    for (const w of o.warnings) out.push(`    WARNING: ${w}`);
  }
  if (best) {
    out.push('');
    out.push(`Best candidate of the dating (${best.status}): ${best.verdict}`);
    if (best.candidate) {
      const c = best.candidate;
      out.push(`  ${c.date}; sun azimuth ${c.sunAzimuthDeg.toFixed(2)} deg, altitude ${c.sunAltitudeDeg.toFixed(2)} deg (refracted); chi-square ${c.chiSquare.toFixed(2)}`);
      out.push('  What it predicts for each measured shadow (measured - predicted, in sigmas):');
      for (const p of best.predictions) {
        if (!p.defined) {
          const kind = scene.observations[observationIndex(p.field)].kind;
          out.push(`    ${p.id}: no such shadow at this candidate (${kind === 'eave-shadow'
            ? "the eave's shadow line does not reach the ground in front of the wall, or the sun is down"
            : kind === 'shadow-points' ? 'the sun is down or behind the plane the shadow falls on' : 'its wall is in shade or the sun is down'})`);
          continue;
        }
        for (const v of p.values) {
          out.push(`    ${p.id} ${v.name}: measured ${fmtValue(v.name, v.measured)}, predicted ${fmtValue(v.name, v.predicted)} (${signedFixed(v.normalised, 2)} sigma)`);
        }
      }
    } else {
      out.push('  No candidate: nothing to predict.');
    }
  }
  if (notes.length) {
    out.push('');
    for (const n of notes) out.push(`Note: ${n}`);
  }
  return `${out.join('\n')}\n`;
}

/** The picture to embed: --image, else the scene's image.file when it exists beside the scene file. */
function pictureFor(scene: Scene, sceneFullPath: string, options: MeasureOptions, io: CliIo, notes: string[]): { picture?: PictureFile; path?: string } {
  if (options.image !== undefined) {
    const path = resolve(io.cwd, options.image);
    return { picture: readPictureFile(path, '--image', options.image), path };
  }
  const file = scene.image?.file;
  if (file === undefined) return {};
  const path = resolve(dirname(sceneFullPath), file);
  if (!existsSync(path)) {
    notes.push(`image.file ${JSON.stringify(file)} is not beside the scene file; the overlay is drawn without the picture (give it with --image)`);
    return {};
  }
  return { picture: readPictureFile(path, 'image.file', file), path };
}

/** A path as shown to the user: relative to the working folder when inside it, else in full. */
function shownPath(path: string, cwd: string): string {
  const rel = relative(cwd, path);
  return rel === '' || rel.startsWith('..') ? path : rel;
}

/** Refuse the overlay path early (before any work), with the name as given: see checkOutputTarget in io.ts. */
function checkOverlayPath(options: MeasureOptions, sceneFullPath: string, io: CliIo): string | undefined {
  if (options.overlay === undefined) return undefined;
  return checkOutputTarget(options.overlay, { force: options.force, inputs: [sceneFullPath], cwd: io.cwd }).path;
}

export async function run(args: readonly string[], options: MeasureOptions, io: CliIo): Promise<void> {
  const scenePath = args[0];
  const fullPath = resolve(io.cwd, scenePath);
  if (options.overlay !== undefined && !/\.svg$/i.test(options.overlay)) {
    throw new InvalidInputError('--overlay', options.overlay, 'a file name ending .svg (the overlay is an SVG drawing)');
  }
  if (options.annotations !== undefined && !/\.(jsonld|json)$/i.test(options.annotations)) {
    throw new InvalidInputError('--annotations', options.annotations, 'a file name ending .jsonld or .json (the annotations are a JSON-LD document)');
  }
  if (options.image !== undefined && options.overlay === undefined) {
    throw new InvalidInputError('--image', options.image, 'a picture only together with --overlay <file.svg>, which it is embedded in');
  }
  const { scene } = readSceneForCommand(scenePath, io, options.seed);
  const overlayTarget = checkOverlayPath(options, fullPath, io);
  const annotationsTarget = options.annotations === undefined
    ? undefined
    : checkOutputTarget(options.annotations, { force: options.force, inputs: [fullPath], cwd: io.cwd }).path;
  if (annotationsTarget !== undefined && scene.image?.file === undefined) {
    throw new InvalidInputError('image.file', undefined, 'the picture the points were clicked on, in the scene file, for --annotations (the annotations point into it)');
  }
  const resolved = inScene(scenePath, () => resolvePixelObservations(scene));
  const planes = inScene(scenePath, () => allPlanes(scene, resolved.planes));
  const notes: string[] = [];

  let picture: PictureFile | undefined;
  let picturePath: string | undefined;
  if (options.overlay !== undefined) {
    if (!scene.image) {
      throw new InvalidInputError('image', undefined, 'an image block (widthPx, heightPx) in the scene file to draw an overlay on', 'The scene has no picture');
    }
    ({ picture, path: picturePath } = pictureFor(scene, fullPath, options, io, notes));
    if (picture && picture.widthPx !== null && picture.heightPx !== null &&
      (picture.widthPx !== scene.image.widthPx || picture.heightPx !== scene.image.heightPx)) {
      const aspectOff = Math.abs(picture.widthPx / picture.heightPx / (scene.image.widthPx / scene.image.heightPx) - 1);
      notes.push(
        `the picture is ${picture.widthPx} x ${picture.heightPx} px but the scene's image block says ${scene.image.widthPx} x ${scene.image.heightPx} px; ` +
          `the overlay stretches it to the block's size` +
          (aspectOff > 0.01 ? ', and its proportions differ, so the clicked points will not sit on the picture: measure on the picture you give' : ''),
      );
    }
  }

  let best: ReturnType<typeof bestRecord> | null = null;
  let predictions: MeasurementPrediction[] | null = null;
  let caption = '';
  if (options.withBest) {
    const { solveDates } = await import('../solver/solveDates.js');
    const answer = solveDates(resolved.scene);
    const c = answer.candidates[0];
    if (c) {
      const wallAzimuth = (wallId: string): number =>
        c.nuisances.find((n) => n.name === `wall:${wallId}:azimuth`)?.fittedDeg ?? scene.walls.find((w) => w.id === wallId)!.azimuthDeg;
      predictions = predictMeasurements(scene, resolved.measurements, { azimuthDeg: c.sun.azimuthDeg, altitudeDeg: c.sun.altitudeDeg }, wallAzimuth);
      caption = candidateCaption(c);
    } else {
      notes.push('the dating found no candidate, so no predicted shadows are drawn');
    }
    best = bestRecord(answer, predictions);
  }

  const planeRecords = [...planes].map(([field, plane]) => planeRecord(scene, field, plane));
  const observationRecords = resolved.measurements.map((m) => observationRecord(scene, m, resolved.scene.observations[observationIndex(m.field)]));

  let svg: string | undefined;
  if (options.overlay !== undefined) {
    svg = measureOverlaySvg({
      scene,
      image: scene.image!,
      planes,
      measurements: resolved.measurements,
      ...(picture ? { picture } : {}),
      ...(predictions ? { best: { caption, predictions } } : {}),
      ...(resolved.sceneSun ? { sceneSun: resolved.sceneSun } : {}),
    });
  }

  const annotations = annotationsTarget ? sceneAnnotations(scene, scene.image!.file!) : undefined;
  const text = options.json
    ? `${JSON.stringify({
        scene: scene.title,
        image: scene.image ?? null,
        planes: planeRecords,
        observations: observationRecords,
        camera: resolved.sceneSun ? sceneSunRecord(resolved.sceneSun) : null,
        moon: (resolved.moonDirections ?? []).map(moonDirectionRecord),
        best,
        overlay: overlayTarget ? { file: options.overlay, picture: picturePath ? (options.image ?? scene.image?.file ?? null) : null } : null,
        annotations: annotationsTarget ? { file: options.annotations, items: annotations!.total } : null,
        notes,
      }, null, 2)}\n`
    : renderText(scene, planeRecords, observationRecords, best, notes) +
      (resolved.sceneSun ? `\n${describeSceneSun(resolved.sceneSun).map(escapeControls).join('\n')}\n` : '') +
      (resolved.moonDirections?.length ? `\nThe moon in pixels:\n${resolved.moonDirections.map((r) => `  ${escapeControls(describeMoonDirection(r))}`).join('\n')}\n` : '') +
      (annotationsTarget ? `Annotations (W3C Web Annotation, JSON-LD) of ${annotations!.total} clicked items written to ${escapeControls(options.annotations!)}.\n` : '') +
      (overlayTarget ? `Overlay written to ${escapeControls(options.overlay!)}${picture && picturePath ? ` (with the picture ${escapeControls(shownPath(picturePath, io.cwd))} embedded)` : ''}.\n` : '');

  if (svg !== undefined && overlayTarget !== undefined) {
    writeOutputFile(options.overlay!, svg, { force: options.force, inputs: [fullPath, ...(picturePath ? [picturePath] : [])], cwd: io.cwd });
  }
  if (annotations !== undefined) {
    writeOutputFile(options.annotations!, annotationsText(scene, scene.image!.file!), { force: options.force, inputs: [fullPath], cwd: io.cwd });
  }
  io.out(text);
}
