/**
 * The search over the window for one evidence model: every clock assumption, stage A
 * (year-independent minima), stage B (dated candidates in every year). Returns raw
 * candidates sorted by objective (chi-square + soft penalty).
 */
import type { ClockAssumption } from './types.js';
import type { ClockKind } from '../scene/types.js';
import { rowSourcesIn, type EvidenceModel } from './evidenceModel.js';
import { zoneOffsetsAt } from './fitting.js';
import { zoneReading } from '../time/clock.js';
import { lowPrecisionSun } from './seasons.js';
import { stageA, type StageAGrid } from './stageA.js';
import { dedupeByDayAndHour, stageB, type RawCandidate } from './stageB.js';
import type { DayWindow } from './window.js';
import { assumedKind } from './candidates.js';
import { hasMoonEvidence } from './fitting.js';
import { moonStage } from './moonYears.js';
import { moonSearch, needsMoonSearch } from './moonSearch.js';

export interface SearchResult {
  readonly assumptions: readonly ClockAssumption[];
  readonly candidates: readonly RawCandidate[];
  readonly stageAGridPoints: number;
  readonly stageAMinima: number;
  readonly fullRefinements: number;
  readonly mappedYears: number;
  readonly evaluations: number;
  /** Calls of the full ephemeris (sunPosition) made by the search: three per sun track, one per verified candidate. */
  readonly sunEvaluations: number;
  /** Stage A's grids, by clock assumption (stageAGridKey), for reruns with observations left out. */
  readonly stageAGrids: StageAGrids;
  /** Calls of the moon's ephemeris (moonPosition) made by the moon's stage (src/solver/moonYears.ts); 0 without moon evidence. */
  readonly moonEvaluations: number;
  /** Days screened with the full moon ephemeris and years refined with the moon (src/solver/moonYears.ts). */
  readonly moonScreenedDays: number;
  readonly moonRefinedYears: number;
}

/** The stage-A grids of one model, by clock assumption (stageAGridKey). */
export interface StageAGrids {
  readonly model: EvidenceModel;
  readonly byAssumption: ReadonlyMap<string, StageAGrid>;
}

/** The key of a clock assumption among the kept grids. */
const stageAGridKey = (kind: ClockKind | null): string => JSON.stringify(kind);

/**
 * The clock assumptions to try: none without a clock (sundials state their hour lines and need
 * none); the stated kind when every clock says what it kept; else each keeping its dial allows,
 * each its own candidate set: on a 24-hour dial local apparent and local mean time, Italian hours
 * (from sunset), Babylonian hours (from sunrise) and unequal hours (src/time/hourSystems.ts); on a
 * 12-hour dial local apparent and mean time and Italian hours (Italian clocks also showed their
 * count on twelve-hour faces, 1-12 twice); on a 6-hour dial Italian hours only (the "sei ore" dials
 * of Rome and the Papal States, late 18th-19th c.: common practice); with several clocks, the keepings
 * every dial allows; plus any meridian or zone stated by another clock of the scene.
 */
export function clockAssumptionsOf(model: EvidenceModel): ClockAssumption[] {
  const clocks = model.clocks.filter((c) => c.observationKind === 'clock');
  if (clocks.length === 0) return [{ kind: 'none' }];
  const unknown = clocks.some((c) => c.kept === null);
  if (!unknown) return [{ ...(clocks[0].kept as ClockKind), stated: true }];
  const tried = KEEPINGS_BY_DIAL[24].filter((k) => clocks.every((c) => KEEPINGS_BY_DIAL[c.dialHours].includes(k)));
  for (const c of clocks) {
    const k = c.kept;
    if (k && (k.kind === 'meridian' || k.kind === 'zone') && !tried.some((t) => JSON.stringify(t) === JSON.stringify(k))) tried.push(k);
  }
  return tried.map((k) => ({ ...k, stated: false }));
}

/** Share of one clock assumption's search taken by stage A's grid (the rest: stage B), for progress (an estimate, not a measurement: the bar tells how far the search is, not how long it will take). */
const STAGE_A_SHARE = 0.4;

/** The search's stages in words, for progress shown to the user. */
export const SEARCH_STAGE_WORDS = {
  grid: "searching the sky for the sun's possible places",
  dating: 'dating each place in every year of the window',
  moon: "scanning every day of the window for the moon's place",
} as const;

const APPARENT: ClockKind = { kind: 'apparent' };
const MEAN: ClockKind = { kind: 'mean' };
const ITALIAN: ClockKind = { kind: 'italian', origin: 'sunset', offsetMinutes: 0 };
const BABYLONIAN: ClockKind = { kind: 'babylonian' };
const UNEQUAL: ClockKind = { kind: 'unequal' };
/** The keepings an unknown clock is tried in, by the hours on its dial (see clockAssumptionsOf). */
const KEEPINGS_BY_DIAL: Readonly<Record<6 | 12 | 24, readonly ClockKind[]>> = {
  24: [APPARENT, MEAN, ITALIAN, BABYLONIAN, UNEQUAL],
  12: [APPARENT, MEAN, ITALIAN],
  6: [ITALIAN],
};

/**
 * Every local best fit in the window, under every clock assumption.
 * @param onProgress called as the search advances: the fraction done (0 to 1) and the stage in words
 * @throws UnsupportedError (from src/time/clock.ts) for a zone clock in a window that starts
 *   before zone time existed (1847), unless the zone's entry there is local mean time.
 */
export function searchCandidates(model: EvidenceModel, win: DayWindow, reuse?: StageAGrids, onProgress?: (fraction: number, stage: string) => void): SearchResult {
  const assumptions = clockAssumptionsOf(model);
  const withMoon = hasMoonEvidence(model);
  // No shadow by sunlight: the sun's search has nothing to start from; every day is scanned with the moon (moonSearch.ts).
  const byMoon = withMoon && needsMoonSearch(model);
  model.clocks.forEach((c) => {
    if (c.kept && c.kept.kind === 'zone') zoneReading(c.kept.zone, win.firstDayJd0 + 0.5, `clock ${c.observationId}`);
  });
  const midJd = 0.5 * (win.firstDayJd0 + win.lastDayJd0);
  const obliquityDeg = lowPrecisionSun(midJd).obliquityDeg;
  const all: RawCandidate[] = [];
  let stageAGridPoints = 0;
  let stageAMinima = 0;
  let fullRefinements = 0;
  let mappedYears = 0;
  let evaluations = 0;
  let sunEvaluations = 0;
  const grids = new Map<string, StageAGrid>();
  const sources = reuse === undefined ? null : rowSourcesIn(model, reuse.model);
  let moonEvaluations = 0;
  let moonScreenedDays = 0;
  let moonRefinedYears = 0;
  assumptions.forEach((a, i) => {
    const kind = assumedKind(a);
    let zoneOffset: (zone: string) => number;
    try {
      zoneOffset = zoneOffsetsAt(model, kind, midJd);
    } catch {
      zoneOffset = () => 0;
    }
    const which = assumptions.length > 1 ? ` (clock assumption ${i + 1} of ${assumptions.length})` : '';
    const report = (share0: number, share: number, words: string) => onProgress && ((done: number, total: number) => onProgress((i + share0 + (share * done) / total) / assumptions.length, `${words}${which}`));
    if (byMoon) {
      onProgress?.(i / assumptions.length, `${SEARCH_STAGE_WORDS.moon}${which}`);
      const ms = moonSearch(model, kind, i, win);
      evaluations += ms.screenedInstants;
      moonEvaluations += ms.moonEvaluations;
      moonScreenedDays += ms.refinedDays;
      moonRefinedYears += new Set(ms.candidates.map((c) => c.cycle)).size;
      all.push(...dedupeByDayAndHour(ms.candidates));
      return;
    }
    const kept = sources === null ? undefined : reuse?.byAssumption.get(stageAGridKey(kind));
    const sa = stageA(model, kind, zoneOffset, obliquityDeg, kept === undefined || sources === null ? undefined : { grid: kept, sources }, report(0, STAGE_A_SHARE, SEARCH_STAGE_WORDS.grid));
    if (sa.grid !== null) grids.set(stageAGridKey(kind), sa.grid);
    stageAGridPoints += sa.gridPoints;
    stageAMinima += sa.minima.length;
    evaluations += sa.evaluations;
    const sb = stageB(model, kind, i, sa.minima, win, report(STAGE_A_SHARE, 1 - STAGE_A_SHARE, SEARCH_STAGE_WORDS.dating));
    fullRefinements += sb.fullRefinements;
    mappedYears += sb.mappedYears;
    evaluations += sb.ephemerisCalls;
    sunEvaluations += sb.ephemerisCalls;
    if (withMoon) {
      const ms = moonStage(model, kind, sb.candidates, win);
      moonEvaluations += ms.moonEvaluations;
      moonScreenedDays += ms.screenedDays;
      moonRefinedYears += ms.refinedYears;
      all.push(...dedupeByDayAndHour(ms.candidates));
    } else all.push(...sb.candidates);
  });
  all.sort((x, y) => x.objective - y.objective);
  return { assumptions, candidates: all, stageAGridPoints, stageAMinima, fullRefinements, mappedYears, evaluations, sunEvaluations, moonEvaluations, moonScreenedDays, moonRefinedYears, stageAGrids: { model, byAssumption: grids } };
}
