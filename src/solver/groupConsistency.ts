/**
 * Whether the parts of a picture share one light: the leave-one-out test
 * (consistency.ts) extended from single observations to groups of them.
 *
 * Observations may carry a `group` label ("architecture", "figures"). For
 * each label, two fits are compared at the best candidate:
 * - one sun for all: the best candidate's objective (chi-square + soft
 *   penalty of the facts);
 * - a separate sun for the group: the rest refitted without the group (a
 *   local refit from the best candidate, consistency.ts localRefitWithout),
 *   plus the group's shadow observations fitted by a sun direction of their
 *   own (azimuth and altitude free, the walls' azimuths and the camera's
 *   error as the rest was refitted to them), found by a grid over the sky
 *   and a bounded pattern search.
 * The fall of chi-square between the nested fits is distributed as
 * chi-square with as many degrees of freedom as the separate sun adds,
 * min(2, the group's number of residuals) (Press et al., Numerical Recipes
 * 3rd ed. 2007, sec. 15.6, on Delta chi-square of nested fits); the group is
 * said not to share the light of the rest when p < LOO_P_THRESHOLD (0.01).
 *
 * Leaves out: clock readings carry no sun of their own, so a clock with a
 * group label stays with the rest; a group needs at least one shadow
 * observation, and a rest with at least one measured number.
 */
import type { ClockKind, Scene } from '../scene/types.js';
import { evidenceResiduals } from '../geometry/observationModels.js';
import { residualRowsByObservation, termEvidence, wallAzimuthOf, type EvidenceModel, type ShadowTerm } from './evidenceModel.js';
import { improvementPValue, localRefitWithout, LOO_P_THRESHOLD } from './consistency.js';
import type { RawCandidate } from './stageB.js';
import type { DayWindow } from './window.js';

/** One group of the picture tested against the rest. */
/** Said of two groups that are each other's rest. */
export const CANNOT_TELL_WHICH = 'with two groups the test says that they were not lit by one sun, not which of them is out of place';

export interface GroupTest {
  readonly group: string;
  /** Measured observations of the group that take part (its shadows). */
  readonly observationIds: readonly string[];
  /** Measured observations of the rest. */
  readonly restIds: readonly string[];
  /** Labels of the rest ('' for observations without a label). */
  readonly restGroups: readonly string[];
  /** Scalar residuals of the group. */
  readonly residualCount: number;
  /** One sun for all: the best candidate's chi-square (with the facts' penalty). */
  readonly chiSquareOneSun: number;
  /** A separate sun for the group: the rest refitted plus the group at its own sun. */
  readonly chiSquareSeparate: number;
  readonly chiSquareRest: number;
  readonly chiSquareGroupOwnSun: number;
  /** The group's own sun (apparent altitude), degrees. */
  readonly ownSun: { readonly azimuthDeg: number; readonly altitudeDeg: number };
  readonly deltaChiSquare: number;
  readonly degreesOfFreedom: number;
  readonly pValue: number;
  /** True when p < pThreshold: the group does not share the light of the rest. */
  readonly differs: boolean;
  readonly pThreshold: number;
  /** The plain sentence for the report. */
  readonly sentence: string;
  /** The finding alone, without the cautions in brackets: for the verdict when the group differs. */
  readonly finding: string;
  /** True for two groups that are each other's rest: the test cannot say which of them is out of place. */
  readonly cannotTellWhich: boolean;
}

/** Grid of the separate sun's first search, degrees (common practice: coarser than any sigma that matters, refined after). */
const AZIMUTH_STEP_DEG = 4;
const ALTITUDE_STEP_DEG = 2;
/** Lowest altitude the separate sun may take, degrees (a shadow needs the sun about the horizon). */
const MIN_ALTITUDE_DEG = -1;
/** Pattern search: halvings of the step, from the grid step down to below 1e-5 deg. */
const MAX_HALVINGS = 20;

function groupChiSquare(model: EvidenceModel, terms: readonly ShadowTerm[], nuisances: readonly number[], azimuthDeg: number, altitudeDeg: number): number {
  let chi = 0;
  for (const t of terms) {
    for (const r of evidenceResiduals(termEvidence(model, t, nuisances), { azimuthDeg, altitudeDeg }, wallAzimuthOf(model, t.wallId, nuisances)).residuals) chi += r * r;
  }
  return Number.isFinite(chi) ? chi : Infinity;
}

/** The group's own best sun: grid over the sky, then a compass (pattern) search with halving steps, bounded. */
function ownSun(model: EvidenceModel, terms: readonly ShadowTerm[], nuisances: readonly number[]): { azimuthDeg: number; altitudeDeg: number; chiSquare: number } {
  let best = { azimuthDeg: 0, altitudeDeg: 45, chiSquare: Infinity };
  for (let az = 0; az < 360; az += AZIMUTH_STEP_DEG) {
    for (let alt = MIN_ALTITUDE_DEG; alt <= 89; alt += ALTITUDE_STEP_DEG) {
      const c = groupChiSquare(model, terms, nuisances, az, alt);
      if (c < best.chiSquare) best = { azimuthDeg: az, altitudeDeg: alt, chiSquare: c };
    }
  }
  let step = AZIMUTH_STEP_DEG;
  for (let k = 0; k < MAX_HALVINGS; k++) {
    let moved = true;
    for (let guard = 0; moved && guard < 200; guard++) {
      moved = false;
      for (const [da, dh] of [[step, 0], [-step, 0], [0, step], [0, -step]]) {
        const az = (best.azimuthDeg + da + 360) % 360;
        const alt = Math.min(90, Math.max(MIN_ALTITUDE_DEG, best.altitudeDeg + dh));
        const c = groupChiSquare(model, terms, nuisances, az, alt);
        if (c < best.chiSquare - 1e-12) {
          best = { azimuthDeg: az, altitudeDeg: alt, chiSquare: c };
          moved = true;
        }
      }
    }
    step /= 2;
  }
  return best;
}

const quoted = (label: string): string => `"${label}"`;

/**
 * Each group of the picture against the rest, at the best candidate; [] when no observation has a group label.
 * @example groupConsistency(scene, model, best, null, win)[0].sentence // 'the shadows of "figures" do not share the light of "architecture": ...'
 */
export function groupConsistency(scene: Scene, model: EvidenceModel, best: RawCandidate, assumed: ClockKind | null, win: DayWindow): GroupTest[] {
  const groupOf = new Map(scene.observations.map((o) => [o.id, o.group ?? '']));
  const labels = [...new Set(scene.observations.map((o) => o.group).filter((g): g is string => g !== undefined))].sort();
  if (labels.length === 0) return [];
  const rows = residualRowsByObservation(model);
  const out: GroupTest[] = [];
  for (const label of labels) {
    const terms = model.shadows.filter((t) => groupOf.get(t.observationId) === label);
    const ids = [...new Set(terms.map((t) => t.observationId))];
    const restIds = [...rows.keys()].filter((id) => !ids.includes(id));
    if (ids.length === 0 || restIds.length === 0) continue;
    // The group's own light is one direction: a group whose shadows are cast by the sun and by the moon has none.
    const lights = new Set(terms.map((t) => t.light));
    if (lights.size > 1) continue;
    const body = lights.has('moon') ? 'moon' : 'sun';
    const residualCount = terms.reduce((n, t) => n + t.count, 0);
    const rest = localRefitWithout(scene, model, best, assumed, win, new Set(ids));
    // the group's own sun with the nuisances the rest was refitted to (the camera's error, shared by the pairs of
    // both, is then set by the rest and its prior, not bent towards a compromise with the group: conservative)
    const sun = ownSun(model, terms, model.nuisances.map((n, k) => rest.nuisancesByName.get(n.name) ?? best.nuisances[k]));
    const separate = rest.objective + sun.chiSquare;
    const delta = Math.max(0, best.objective - separate);
    const dof = Math.min(2, residualCount);
    const p = improvementPValue(delta, dof);
    const restGroups = [...new Set(restIds.map((id) => groupOf.get(id) ?? ''))].sort();
    const restName = restGroups.length === 1 && restGroups[0] !== '' ? quoted(restGroups[0]) : 'the rest of the picture';
    const differs = p < LOO_P_THRESHOLD;
    const numbers = `Delta chi-square ${delta.toFixed(1)} for ${dof} degree${dof === 1 ? '' : 's'} of freedom, ${p < 1e-6 ? 'p < 0.000001' : `p = ${p.toPrecision(2)}`}`;
    const finding = differs
      ? `the shadows of ${quoted(label)} do not share the light of ${restName}: ${numbers}; on their own they point to a ${body} at azimuth ${sun.azimuthDeg.toFixed(1)} deg, altitude ${sun.altitudeDeg.toFixed(1)} deg`
      : `the shadows of ${quoted(label)} agree with the light of ${restName}`;
    const sentence = differs
      ? `${finding} (another day or hour, another hand, or a misread shadow: an estimate under the stated assumptions, not a proof)`
      : `${finding} (${numbers})`;
    out.push({
      group: label, observationIds: ids, restIds, restGroups, residualCount,
      chiSquareOneSun: best.objective, chiSquareSeparate: separate, chiSquareRest: rest.objective, chiSquareGroupOwnSun: sun.chiSquare,
      ownSun: { azimuthDeg: sun.azimuthDeg, altitudeDeg: sun.altitudeDeg },
      deltaChiSquare: delta, degreesOfFreedom: dof, pValue: p, differs, pThreshold: LOO_P_THRESHOLD, sentence, finding, cannotTellWhich: false,
    });
  }
  // two groups that are each other's rest: the test cannot say which of them is out of place
  if (out.length === 2 && out.every((g) => g.differs && g.restGroups.length === 1 && g.restGroups[0] !== '')) {
    return out.map((g) => ({ ...g, sentence: `${g.sentence}; ${CANNOT_TELL_WHICH}`, cannotTellWhich: true }));
  }
  return out;
}
