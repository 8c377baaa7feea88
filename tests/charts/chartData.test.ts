import { beforeAll, describe, expect, it } from 'vitest';
import { readSceneText } from '../../src/scene/readScene.js';
import { readSceneFile } from '../../src/cli/sceneFile.js';
import type { Scene } from '../../src/scene/types.js';
import type { DateAnswer } from '../../src/solver/types.js';
import { solveDates } from '../../src/solver/solveDates.js';
import { buildEvidenceModel } from '../../src/solver/evidenceModel.js';
import { chiSquareOnDayMinuteGrid, finishDayMinuteCells, nuisancesOfCandidate, assumedClockOfCandidate } from '../../src/solver/chiSquareGrid.js';
import { civilDateToJd } from '../../src/calendar/regions.js';
import { evidenceResiduals } from '../../src/geometry/observationModels.js';
import { WALL_SHADOW_KINDS, wallAzimuthOf } from '../../src/solver/evidenceModel.js';
import { isWallSunlit } from '../../src/geometry/shadowAngles.js';
import { dateHourMapData, daylightMinuteRange } from '../../src/charts/dateHourMapData.js';
import { skyChartData } from '../../src/charts/skyChartData.js';
import { residualChartData, renderResidualChart } from '../../src/charts/residualChart.js';
import { renderDateHourMap } from '../../src/charts/dateHourMap.js';
import { renderSkyChart } from '../../src/charts/skyChart.js';
import { expectClose } from '../helpers/expectClose.js';

const EXAMPLE = 'examples/marktgasse-print.yaml';

let scene: Scene;
let answer: DateAnswer;
beforeAll(() => {
  scene = readSceneFile(EXAMPLE);
  answer = solveDates(scene);
});

/** Day of the year, Meeus, Astronomical Algorithms 2nd ed. (1998), ch. 7, p. 65: N = INT(275M/9) - K INT((M+9)/12) + D - 30. */
function meeusDayOfYear(month: number, day: number, leap: boolean): number {
  const k = leap ? 1 : 2;
  return Math.floor((275 * month) / 9) - k * Math.floor((month + 9) / 12) + day - 30;
}

function emptyAnswer(title: string, fromYear: number, toYear: number): DateAnswer {
  return {
    sceneTitle: title,
    status: 'no-candidates',
    verdict: 'none',
    headline: null,
    yearsWords: null,
    familyCount: 0,
    window: { fromYear, toYear },
    families: [],
    candidates: [],
    consistency: { rule: 'r', pThreshold: 0.01, entries: [], flaggedIds: [] },
    conflictingIds: [],
    clockAssumptions: [],
    measuredResiduals: 0,
    notes: [],
    diagnostics: { stageAGridPoints: 0, stageAMinima: 0, fullRefinements: 0, mappedYears: 0, chiSquareEvaluations: 0, clockAssumptionsTried: 0 },
    seed: 1,
  };
}

describe('chi-square on a (day, minute) grid', () => {
  it('agrees with the solver at the best candidate (chi-square + soft penalty)', () => {
    const best = answer.families[0].best;
    const model = buildEvidenceModel(scene);
    const grid = chiSquareOnDayMinuteGrid(model, {
      dayJd0s: [civilDateToJd(scene.calendar, best.civilDate)],
      minutes: [best.times.localApparentMinutes],
      assumedClock: assumedClockOfCandidate(best),
      nuisances: nuisancesOfCandidate(model, best),
    });
    expectClose(grid.values[0][0], best.chiSquare + best.softPenalty, 0.02, 'chi-square at the candidate');
    expect(grid.evaluations).toBe(1);
  });
  it('reports its progress once per day column', () => {
    const model = buildEvidenceModel(scene);
    const calls: [number, number][] = [];
    chiSquareOnDayMinuteGrid(model, { dayJd0s: [2372000.5, 2372001.5, 2372002.5], minutes: [480, 490], assumedClock: null, nuisances: nuisancesOfCandidate(model, undefined), onProgress: (d, t) => calls.push([d, t]) });
    expect(calls).toEqual([[1, 3], [2, 3], [3, 3]]);
  });
  it('with a ceiling, leaves only points above it unfinished, and finishing them gives the values of the grid without one', () => {
    const best = answer.families[0].best;
    const model = buildEvidenceModel(scene);
    const day0 = civilDateToJd(scene.calendar, best.civilDate);
    // 40 days around the best day (several sun tracks), from before sunrise to after sunset
    const spec = {
      dayJd0s: Array.from({ length: 40 }, (_, i) => day0 - 20 + i),
      minutes: Array.from({ length: 50 }, (_, j) => 240 + 20 * j),
      assumedClock: assumedClockOfCandidate(best),
      nuisances: nuisancesOfCandidate(model, best),
    };
    const full = chiSquareOnDayMinuteGrid(model, spec);
    const ceiling = best.chiSquare + best.softPenalty + 28.744; // the palest band of the map (palette.ts)
    const capped = chiSquareOnDayMinuteGrid(model, { ...spec, ceiling });
    let above = 0;
    let below = 0;
    full.values.forEach((row, j) =>
      row.forEach((v, i) => {
        if (capped.values[j][i] === Infinity) {
          above += 1;
          expect(v).toBeGreaterThan(ceiling);
        } else {
          below += 1;
          expect(capped.values[j][i]).toBe(v); // the same number, to the last bit
        }
      }),
    );
    expect(above).toBe(capped.unfinished.length);
    expect(above).toBeGreaterThan(100); // the night and the shaded wall: most of the grid
    expect(below).toBeGreaterThan(0);
    expect(capped.minimum).toBe(full.minimum);
    const finished = finishDayMinuteCells(model, { ...spec, ceiling }, capped, capped.unfinished);
    expect(finished.values).toEqual(full.values);
    expect(finished.unfinished).toEqual([]);
  });
});

describe('date-and-hour map data', () => {
  it('draws the year of the best family and places its best on its day of the year', () => {
    const data = dateHourMapData(scene, answer);
    const best = answer.families[0].best;
    expect(data.year).toBe(best.civilDate.year);
    const leap = best.civilDate.year % 4 === 0 && (best.civilDate.year % 100 !== 0 || best.civilDate.year % 400 === 0); // Gregorian rule, Meeus (1998) ch. 7
    expect(data.dayCount).toBe(leap ? 366 : 365);
    const f1 = data.markers.find((m) => m.label === 'F1')!;
    expect(f1.dayOffset).toBe(meeusDayOfYear(best.civilDate.month, best.civilDate.day, leap) - 1);
    expect(data.months[2].fromOffset).toBe(meeusDayOfYear(3, 1, leap) - 1);
    expect(data.months.map((m) => m.excluded)).toEqual([true, true, true, false, false, false, false, false, false, true, true, true]);
  });
  it('shades the best candidate inside the 1-sigma band and nothing below the best fit', () => {
    const data = dateHourMapData(scene, answer);
    const c = data.closeUp!;
    const f1 = data.markers[0];
    const i = c.dayOffsets.reduce((k, d, n) => (Math.abs(d - f1.dayOffset) < Math.abs(c.dayOffsets[k] - f1.dayOffset) ? n : k), 0);
    const j = c.minutes.reduce((k, m, n) => (Math.abs(m - f1.minutes) < Math.abs(c.minutes[k] - f1.minutes) ? n : k), 0);
    expect(c.deltaChiSquare[j][i]).toBeLessThan(2.3);
    const lowest = Math.min(...data.deltaChiSquare.flat(), ...c.deltaChiSquare.flat());
    expect(lowest).toBeGreaterThan(-1e-6);
    expect(lowest).toBeLessThan(0.5);
  });
  it('covers daylight from the earliest sunrise to the latest sunset in whole hours', () => {
    // At 47.62 N the longest day's sunrise is near 04:0x apparent time (cos H0 = -tan phi tan 23.44, Meeus 1998 eq. 15.1).
    expect(daylightMinuteRange(47.62)).toEqual([180, 1260]);
    expect(daylightMinuteRange(0)).toEqual([300, 1140]);
    expect(daylightMinuteRange(80)).toEqual([0, 1440]);
  });
  it("follows the site's own calendar switch: Velmar's 1700 lost 19-28 February", () => {
    const text = [
      'heliochron: 1',
      'title: switch year',
      'site: { latitudeDeg: 47.62, longitudeDeg: 9.35, elevationM: 410 }',
      'calendar: { lastJulian: 1700-02-18, firstGregorian: 1700-03-01 }',
      'yearStart: jan1',
      'window: { fromYear: 1700, toYear: 1700 }',
      'walls: []',
      'observations:',
      '  - { id: sun, kind: sun-direction, azimuthDeg: 180, azimuthSigmaDeg: 2, altitudeDeg: 40, altitudeSigmaDeg: 2 }',
      'seed: 1',
    ].join('\n');
    const s = readSceneText(text, 'switch.yaml');
    const data = dateHourMapData(s, emptyAnswer('switch year', 1700, 1700), { dayStep: 10, minuteStep: 60 });
    // 1 January (Julian) to 1 January 1701 (Gregorian): 366 Julian-leap days less the 11 skipped (19-29 February).
    expect(data.dayCount).toBe(355);
    expect(data.months[1].fromOffset).toBe(31);
    expect(data.months[2].fromOffset).toBe(31 + 18);
    expect(data.markers).toEqual([]);
  });
});

describe('sky chart data', () => {
  it("finds every wall shadow kind undefined wherever its wall is in shade, as the bands take it without the residual", () => {
    // The bands set 99 at once where the wall is in shade (|HSA| >= 90 or the sun down; common practice, shadowAngles.ts).
    const kinds = [
      { kind: 'rod-shadow', slopeDeg: 40, side: 'right', sigmaDeg: 2 },
      { kind: 'overhang-shadow', depthRatio: 0.8, sigma: 0.05 },
      { kind: 'fin-shadow', widthRatio: 0.6, side: 'left', sigma: 0.05 },
    ] as const;
    expect(kinds.map((k) => k.kind).every((k) => WALL_SHADOW_KINDS.has(k))).toBe(true);
    let shaded = 0;
    for (let az = 0; az < 360; az += 7.5) {
      for (let alt = -10; alt <= 85; alt += 5) {
        const sun = { azimuthDeg: az, altitudeDeg: alt };
        if (isWallSunlit(sun, 160)) continue;
        shaded += 1;
        for (const e of kinds) expect(evidenceResiduals(e, sun, 160).defined).toBe(false);
      }
    }
    expect(shaded).toBeGreaterThan(500);
  });
  it('puts the noon mark of local apparent time on the meridian (azimuth 180)', () => {
    // Local apparent noon is the meridian transit, hour angle 0 (definition of apparent solar time;
    // Explanatory Supplement to the Astronomical Almanac 1992, sec. 2.24).
    const data = skyChartData(scene, answer);
    for (const path of data.paths) {
      const noon = path.hourMarks.find((h) => h.label === '12h')!;
      expectClose(noon.azimuthDeg, 180, 0.05, `noon azimuth on ${path.label}`);
    }
    expect(data.paths[0].label).toContain('(F1)');
  });
  it("contains the best candidate's sun inside every observation's 1-sigma band, with the solver's residuals", () => {
    const data = skyChartData(scene, answer);
    const best = answer.families[0].best;
    const model = buildEvidenceModel(scene);
    const nuis = nuisancesOfCandidate(model, best);
    for (const band of data.bands) {
      const term = model.shadows.find((t) => t.observationId === band.observationId)!;
      const r = evidenceResiduals(term.evidence, { azimuthDeg: best.sun.azimuthDeg, altitudeDeg: best.sun.altitudeDeg }, wallAzimuthOf(model, term.wallId, nuis));
      const fromSolver = best.residuals.filter((e) => e.observationId === band.observationId).map((e) => Math.abs(e.normalised));
      expectClose(Math.max(...r.residuals.map(Math.abs)), Math.max(...fromSolver), 0.02, `residual of ${band.observationId}`);
      const i = band.azimuths.reduce((k, a, n) => (Math.abs(a - best.sun.azimuthDeg) < Math.abs(band.azimuths[k] - best.sun.azimuthDeg) ? n : k), 0);
      const j = band.altitudes.reduce((k, a, n) => (Math.abs(a - best.sun.altitudeDeg) < Math.abs(band.altitudes[k] - best.sun.altitudeDeg) ? n : k), 0);
      expect(band.values[j][i]).toBeLessThanOrEqual(1);
    }
    expect(data.bands.map((b) => b.observationId)).toEqual(['sign-bracket', 'cornice', 'pilaster', 'well-post']);
    expect(data.notes.join(' ')).toContain('weighhouse-clock');
  });
});

describe('sky chart data in the southern hemisphere', () => {
  it('centres the chart on north, where the sun culminates, and puts noon at azimuth 0', () => {
    // Invented demo site at 33.9 S; a sun direction to the north-east in the morning (2 deg sigmas).
    const text = [
      'heliochron: 1',
      'title: southern test',
      'site: { latitudeDeg: -33.9, longitudeDeg: 151.2, elevationM: 20 }',
      'calendar: gregorian',
      'yearStart: jan1',
      'window: { fromYear: 1890, toYear: 1890 }',
      'walls: []',
      'observations:',
      '  - { id: sun, kind: sun-direction, azimuthDeg: 60, azimuthSigmaDeg: 2, altitudeDeg: 35, altitudeSigmaDeg: 2 }',
      'seed: 1',
    ].join('\n');
    const s = readSceneText(text, 'south.yaml');
    const a = solveDates(s);
    const data = skyChartData(s, a, { columns: 91, rows: 46 });
    expect(data.centreAzimuthDeg).toBe(0);
    expect(data.azimuthRange[0]).toBeLessThan(0);
    expect(data.azimuthRange[1]).toBeGreaterThan(0);
    const noon = data.paths[0].hourMarks.find((h) => h.label === '12h')!;
    expectClose(noon.azimuthDeg, 0, 0.05, 'noon azimuth (due north)');
    const sun = data.suns[0];
    expectClose(sun.azimuthDeg, 60, 3, 'the candidate sun near the measured direction');
    expect(renderSkyChart(data)).toContain('>NE<');
  });
});

describe('residuals chart', () => {
  it('has one bar per measured number of the best candidate', () => {
    const data = residualChartData(answer);
    expect(data.rows.length).toBe(answer.candidates[0].residuals.length);
    expect(data.rows.map((r) => r.normalised)).toEqual(answer.candidates[0].residuals.map((r) => r.normalised));
    expect(data.facts.length).toBe(answer.candidates[0].facts.length);
  });
  it('marks an observation flagged by the leave-one-out test', () => {
    const flagged: DateAnswer = { ...answer, consistency: { ...answer.consistency, flaggedIds: ['cornice'] } };
    const svg = renderResidualChart(residualChartData(flagged));
    expect(residualChartData(flagged).rows.filter((r) => r.flagged).map((r) => r.observationId)).toEqual(['cornice']);
    expect(svg).toContain('FLAGGED (leave-one-out)');
    expect(svg).toContain('Flagged by the leave-one-out test (outlined bars): cornice.');
  });
  describe('edge cases', () => {
    it('draws an empty chart for an answer without candidates', () => {
      const svg = renderResidualChart(residualChartData(emptyAnswer('x', 1700, 1700)));
      expect(svg).toContain('</svg>');
      expect(svg).not.toContain('NaN');
    });
  });
});

describe('rendered charts', () => {
  it('are well-formed enough: balanced groups, no NaN, a title and a description', () => {
    const svgs = [renderDateHourMap(dateHourMapData(scene, answer)), renderSkyChart(skyChartData(scene, answer)), renderResidualChart(residualChartData(answer))];
    for (const svg of svgs) {
      expect(svg).not.toMatch(/NaN|undefined|Infinity/);
      expect((svg.match(/<g[ >]/g) ?? []).length).toBe((svg.match(/<\/g>/g) ?? []).length);
      expect(svg).toMatch(/<title id="[^"]+">[^<]+<\/title>/);
      expect(svg).toMatch(/<desc id="[^"]+">[^<]+<\/desc>/);
    }
  });
});
