/**
 * One residual sign in every output: (measured - predicted) / sigma (docs/conventions.md,
 * "Residuals"). The scenes are invented: the four-family town square of
 * tests/report/scenes/four-family-square.yaml and the Tanners' Hall photograph of the fictional
 * town of Velmar (examples/tanners-hall-photo/), the one bundled scene measured in pixels, which
 * `measure --with-best` needs. The CSV output carries no residuals, so it is not compared.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import { join } from 'node:path';
import { readSceneFile } from '../../src/cli/sceneFile.js';
import type { Scene } from '../../src/scene/types.js';
import type { DateAnswer, ResidualEntry } from '../../src/solver/types.js';
import { solveDates } from '../../src/solver/solveDates.js';
import { renderDateText } from '../../src/report/text.js';
import { dateAnswerJson } from '../../src/report/json.js';
import { residualChartData, renderResidualChart } from '../../src/charts/residualChart.js';
import { renderHtmlReport } from '../../src/report/html.js';
import { angleDiffDeg } from '../../src/math/angles.js';
import { main } from '../../src/cli/main.js';
import type { CliIo } from '../../src/cli/io.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const SQUARE = 'tests/report/scenes/four-family-square.yaml';
const PHOTO = join(ROOT, 'examples/tanners-hall-photo/tanners-hall-photo.yaml');

let scene: Scene;
let answer: DateAnswer;
let best: ResidualEntry[];

beforeAll(() => {
  scene = readSceneFile(SQUARE);
  answer = solveDates(scene);
  best = [...answer.candidates[0].residuals];
});

/** measured - predicted, angles in (-180, 180], clock readings around a 12-hour dial. */
function difference(r: ResidualEntry): number {
  if (r.unit === 'deg') return angleDiffDeg(r.measured, r.predicted);
  if (r.unit === 'min') return ((((r.measured - r.predicted + 360) % 720) + 720) % 720) - 360;
  return r.measured - r.predicted;
}

function row(id: string): ResidualEntry {
  const r = best.find((x) => x.observationId === id);
  if (!r) throw new Error(`no residual for ${id}`);
  return r;
}

/** "+1.23" / "-1.23" as every output writes it. */
function signed(x: number): string {
  return `${x >= 0 ? '+' : ''}${x.toFixed(2)}`;
}

describe('the residual of the answer model', () => {
  it('is (measured - predicted) / sigma for every measured number of the four-family square', () => {
    expect(best.map((r) => r.observationId)).toEqual(['cornice', 'flagpole', 'church-clock']);
    for (const r of best) {
      const expected = difference(r) / r.sigma;
      expect(Math.sign(r.normalised), r.observationId).toBe(Math.sign(expected));
      // An angle and a clock reading are compared directly: equal; the cornice's model compares
      // the angle whose tangent is the ratio: equal to first order (docs/conventions.md).
      expect(Math.abs(r.normalised - expected), r.observationId).toBeLessThan(r.unit === 'ratio' ? 0.05 : 1e-6);
    }
  });
  it('is negative for a flagpole shadow measured at 300 deg where the best candidate predicts more', () => {
    const pole = row('flagpole');
    expect(pole.measured).toBe(300);
    expect(pole.predicted).toBeGreaterThan(302);
    expect(pole.normalised).toBeLessThan(-0.5);
  });
});

describe('every output writes the same sign', () => {
  it('text: the residual column of each row', () => {
    const text = renderDateText(answer, scene);
    for (const r of best) expect(text).toMatch(new RegExp(`\\n  ${r.observationId} .* ${signed(r.normalised).replace('+', '\\+')}\\n`));
  });
  it('JSON: residuals[].normalised of the best candidate', () => {
    const json = JSON.parse(JSON.stringify(dateAnswerJson(answer, scene, '0.0.0'))) as { candidates: { residuals: { observationId: string; normalised: number }[] }[] };
    for (const r of best) {
      const j = json.candidates[0].residuals.find((x) => x.observationId === r.observationId)!;
      expect(j.normalised, r.observationId).toBeCloseTo(r.normalised, 3);
    }
  });
  it('residual chart and HTML report: the printed value, and the bar on the side of that sign', () => {
    const svg = renderResidualChart(residualChartData(answer));
    const html = renderHtmlReport({
      scene,
      answer,
      charts: { map: '<svg></svg>', sky: '<svg></svg>', residuals: svg },
      reproducibility: { version: '0.0.0', sceneSha256: '0'.repeat(64), commandLine: 'heliochron report x.yaml', seed: 1, sceneFileName: 'x.yaml' },
    });
    const zero = Number(/<line x1="([\d.]+)" y1="[\d.]+" x2="\1"[^>]*stroke="#1A1A1A"/.exec(svg)![1]);
    for (const r of best) {
      const g = new RegExp(`<g class="hc-residual-row" data-observation="${r.observationId}">([\\s\\S]*?)</g>`).exec(svg);
      expect(g, r.observationId).not.toBeNull();
      expect(g![1]).toContain(`${signed(r.normalised)} sigma`);
      const bar = /<rect x="([\d.]+)" y="[\d.]+" width="([\d.]+)"/.exec(g![1])!;
      const middle = Number(bar[1]) + Number(bar[2]) / 2;
      expect(Math.sign(middle - zero), `${r.observationId}: bar side`).toBe(Math.sign(r.normalised));
      expect(html).toContain(`${signed(r.normalised)} sigma`);
    }
  });
  it('check: the residuals of the best fit inside a proposal carry the same sign', async () => {
    let out = '';
    const io: CliIo = { out: (t) => { out += t; }, err: () => undefined, errIsTerminal: false, cwd: ROOT };
    await main(['check', SQUARE, '--on', '1775-04-02', '--time', '09:15', '--clock', 'mean', '--within', '10'], io);
    const line = /\n  flagpole\s+pole-shadow\s+shadow-azimuth\s+([\d.]+)\s+([\d.]+)\s+([\d.]+)\s+deg\s+([+-][\d.]+)\n/.exec(out);
    expect(line, out).not.toBeNull();
    const [measured, predicted, sigma, printed] = line!.slice(1).map(Number);
    expect(measured).toBe(300);
    expect(printed).toBeLessThan(0);
    expect(printed).toBeCloseTo((measured - predicted) / sigma, 1);
  });
  it('measure --with-best: the same sign and value as the dating, observation by observation', async () => {
    const run = async (args: string[]): Promise<string> => {
      let out = '';
      const io: CliIo = { out: (t) => { out += t; }, err: () => undefined, errIsTerminal: false, cwd: ROOT };
      expect(await main(args, io)).toBe(0);
      return out;
    };
    const measured = JSON.parse(await run(['measure', PHOTO, '--with-best', '--json'])) as {
      best: { predictions: { id: string; values: { name: string; measured: number; predicted: number; sigma: number; normalised: number }[] }[] };
    };
    const dated = JSON.parse(await run(['date', PHOTO, '--json'])) as { candidates: { residuals: { observationId: string; component: string; normalised: number }[] }[] };
    const component: Record<string, string> = { slopeDeg: 'slope', depthRatio: 'depth-ratio', shadowAzimuthDeg: 'shadow-azimuth', lengthRatio: 'length-ratio' };
    let compared = 0;
    for (const p of measured.best.predictions) {
      for (const v of p.values) {
        const d = dated.candidates[0].residuals.find((r) => r.observationId === p.id && r.component === component[v.name]);
        expect(d, `${p.id} ${v.name}`).toBeDefined();
        expect(Math.sign(v.normalised), `${p.id} ${v.name}: sign of (measured - predicted)`).toBe(Math.sign(v.measured - v.predicted));
        expect(Math.abs(v.normalised - d!.normalised), `${p.id} ${v.name}: measure against date`).toBeLessThan(0.02);
        compared += 1;
      }
    }
    expect(compared).toBe(4);
  });
});
