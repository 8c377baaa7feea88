import { beforeAll, describe, expect, it } from 'vitest';
import { readSceneFile } from '../../src/cli/sceneFile.js';
import type { Observation, Scene } from '../../src/scene/types.js';
import type { DateAnswer } from '../../src/solver/types.js';
import { solveDates } from '../../src/solver/solveDates.js';
import { observationWords, renderHtmlReport, type HtmlReportInput } from '../../src/report/html.js';
import { dateHourMapData } from '../../src/charts/dateHourMapData.js';
import { renderDateHourMap } from '../../src/charts/dateHourMap.js';
import { skyChartData } from '../../src/charts/skyChartData.js';
import { renderSkyChart } from '../../src/charts/skyChart.js';
import { residualChartData, renderResidualChart } from '../../src/charts/residualChart.js';
import { civilDateRendering } from '../../src/report/formatTimes.js';

// A scene whose texts carry markup and quotes (tests/charts/scenes/tanners-hall.yaml, invented demo data).
const SCENE = 'tests/charts/scenes/tanners-hall.yaml';
const SCRIPT = `<script>alert("x")</script>`;

let scene: Scene;
let answer: DateAnswer;
let html: string;

function reportFor(s: Scene, a: DateAnswer): string {
  const input: HtmlReportInput = {
    scene: s,
    answer: a,
    charts: {
      map: renderDateHourMap(dateHourMapData(s, a, { dayStep: 3, minuteStep: 15 }), 'hc-map'),
      sky: renderSkyChart(skyChartData(s, a, { columns: 61, rows: 31 }), 'hc-sky'),
      residuals: renderResidualChart(residualChartData(a), 'hc-residuals'),
    },
    reproducibility: { version: '9.9.9', sceneSha256: 'ab'.repeat(32), commandLine: 'heliochron report "x & y.yaml" -o r.html', seed: s.seed, sceneFileName: 'x & y.yaml' },
  };
  return renderHtmlReport(input);
}

beforeAll(() => {
  const read = readSceneFile(SCENE);
  const observations: Observation[] = read.observations.map((o, i) => (i === 0 ? { ...o, note: `bracket ${SCRIPT} & "quoted"` } : o));
  scene = { ...read, observations, walls: read.walls.map((w, i) => (i === 0 ? { ...w, azimuthSource: `plan <1820> & survey` } : w)) };
  answer = solveDates(scene);
  html = reportFor(scene, answer);
});

describe('HTML report', () => {
  it('has every section, in order', () => {
    const ids = ['verdict', 'question', 'assumptions', 'walls', 'evidence', 'evidence-table', 'answer', 'families', 'candidates', 'charts', 'figure-map', 'figure-sky', 'figure-residuals', 'glossary', 'consistency', 'cautions', 'reproducibility'];
    let last = -1;
    for (const id of ids) {
      const at = html.indexOf(`id="${id}"`);
      expect(at, `section ${id}`).toBeGreaterThan(last);
      last = at;
    }
  });
  it('states the assumptions a reader must weigh', () => {
    for (const words of ['Site', 'Calendar', 'Time-keeping', 'Delta T', 'Refraction', 'the year begins on 1 January', 'Morrison, Stephenson, Hohenkerk and Zawilski 2021', '960 hPa', 'plan &lt;1820&gt; &amp; survey']) {
      expect(html).toContain(words);
    }
    expect(html).toContain('Weigh it with the documentary evidence and expert judgement');
  });
  it('escapes every text from the scene file', () => {
    expect(html).not.toContain(SCRIPT);
    expect(html).not.toContain('<west front>');
    expect(html).toContain('Tanners&#39; Hall &lt;west front&gt;, a drawing &amp; study');
    expect(html).toContain('bracket &lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt; &amp; &quot;quoted&quot;');
    expect(html).toContain('<code>x &amp; y.yaml</code>');
    expect(html.match(/<script/gi)).toBeNull();
  });
  it('is self-contained: no scripts, no external files, fonts or links, an inline print stylesheet', () => {
    const withoutSvgNamespace = html.split('xmlns="http://www.w3.org/2000/svg"').join('');
    expect(withoutSvgNamespace).not.toMatch(/https?:\/\//);
    expect(html).not.toMatch(/<link|<img|<iframe|@import|@font-face|url\((?!#)/i);
    expect(html).toContain('@media print');
    expect(html).toContain('<meta charset="utf-8">');
    expect((html.match(/<svg /g) ?? []).length).toBe(3);
    for (const id of ['hc-map', 'hc-sky', 'hc-residuals']) expect(html).toMatch(new RegExp(`<svg xmlns="http://www.w3.org/2000/svg"[^>]* id="${id}"`));
  });
  it('lists the ranked candidates with the first one first', () => {
    const first = answer.candidates[0];
    const at = html.indexOf('data-rank="1"');
    expect(at).toBeGreaterThan(0);
    // the calendar every row shares is named once in the caption, not in each cell
    const shared = / \((Julian|Gregorian)\)$/.exec(civilDateRendering(first.civilDate, scene).text)![0];
    expect(html.slice(at, at + 400)).toContain(civilDateRendering(first.civilDate, scene).text.slice(0, -shared.length));
    expect(html).toContain(`dates in the ${shared.slice(2, -1)} calendar`);
    expect(html.indexOf('data-rank="2"')).toBeGreaterThan(at);
  });
  it('gives what is needed to reproduce it', () => {
    expect(html).toContain('<code>9.9.9</code>');
    expect(html).toContain(`<code>${'ab'.repeat(32)}</code>`);
    expect(html).toContain('heliochron report &quot;x &amp; y.yaml&quot; -o r.html');
    expect(html).toContain(`<dt>seed</dt><dd><code>${scene.seed}</code></dd>`);
  });
  it('is the same for the same input (no clock inside)', () => {
    expect(reportFor(scene, answer)).toBe(html);
  });
  describe('edge cases', () => {
    it('writes a report for an answer without candidates', () => {
      const none: DateAnswer = { ...answer, status: 'no-candidates', families: [], candidates: [], verdict: 'No date fits <at all>.' };
      const page = reportFor(scene, none);
      expect(page).toContain('No candidate.');
      expect(page).toContain('No date fits &lt;at all&gt;.');
      expect(page).toContain('status-no-candidates');
    });
    it('leaves out the family column when the answer has candidates but no families', () => {
      const page = reportFor(scene, { ...answer, families: [] });
      const head = /<table id="candidates"[\s\S]*?<thead>([\s\S]*?)<\/thead>/.exec(page)![1];
      expect(head).not.toContain('family');
      expect(head).toMatch(/^<tr><th class="num">rank<\/th>/);
      expect(page).not.toContain('data-family=');
      expect(page).toContain('data-rank="1"');
    });
    it('describes every kind of observation in words', () => {
      const kinds: Observation[] = [
        { id: 'a', kind: 'eave-shadow', wallId: 'w', distanceRatio: 0.5, sigma: 0.05, projectionRatio: 0.1 },
        { id: 'b', kind: 'shadow-points', caster: [0, 0, 3], shadow: [1, 2, 0], sigmaM: 0.05 },
        { id: 'c', kind: 'sun-direction', azimuthDeg: 120, azimuthSigmaDeg: 2, altitudeDeg: 30, altitudeSigmaDeg: 2 },
        { id: 'd', kind: 'sun-up' },
        { id: 'e', kind: 'wall-shaded', wallId: 'w' },
        { id: 'f', kind: 'clock', readingMinutes: 460, precisionMinutes: 5, hourHandTrusted: false, dialHours: 12, kept: { kind: 'unknown' } },
        { id: 'g', kind: 'rod-shadow', wallId: 'w', pixels: { fromPx: [0, 0], toPx: [1, 1] } },
      ];
      const words = kinds.map(observationWords);
      expect(words[0]).toContain('0.5');
      expect(words[1]).toContain('(1, 2, 0) m');
      expect(words[2]).toContain('120 deg');
      expect(words[5]).toContain('reads 07:40 on a 12-hour dial');
      expect(words[5]).toContain('hour hand not trusted');
      expect(words[6]).toBe('measured in the picture (pixels)');
    });
  });

  describe('the four-family square (tests/report/scenes/four-family-square.yaml, invented)', () => {
    let square: Scene;
    let squareAnswer: DateAnswer;
    let page: string;
    beforeAll(() => {
      square = readSceneFile('tests/report/scenes/four-family-square.yaml');
      // as `heliochron report` solves it: every year of each family listed, so that each row names its family
      squareAnswer = solveDates(square, { perYear: true });
      page = reportFor(square, squareAnswer);
    });
    it('shows the best of each family first, then the other years, each row naming its family', () => {
      expect(squareAnswer.families.length).toBeGreaterThanOrEqual(2);
      const rows = [...page.matchAll(/<tr data-rank="(\d+)" data-date="[^"]*" data-family="(F\d+)?"/g)].map((m) => ({ rank: Number(m[1]), family: m[2] }));
      const k = squareAnswer.families.length;
      expect(rows.slice(0, k)).toEqual(squareAnswer.families.map((f) => ({ rank: f.best.rank, family: `F${f.rank}` })));
      // then the other years in rank order, at most ten, each a member of a family
      const rest = rows.slice(k);
      expect(rest.length).toBeGreaterThan(0);
      expect(rest.length).toBeLessThanOrEqual(10);
      expect(rest.map((r) => r.rank)).toEqual([...rest.map((r) => r.rank)].sort((a, b) => a - b));
      for (const r of rest) {
        const c = squareAnswer.candidates.find((x) => x.rank === r.rank)!;
        const family = squareAnswer.families.find((f) => `F${f.rank}` === r.family)!;
        expect(family.members!.map((m) => m.id), `rank ${r.rank}`).toContain(c.id);
      }
      // the old table showed 20 rows of the first family and none of the second
      expect(new Set(rows.map((r) => r.family)).size).toBe(k);
    });
    it('explains each chart in the report itself and names the colours as drawn', () => {
      expect(page).not.toContain('docs/pictures.md');
      const captions = [...page.matchAll(/<figcaption>([\s\S]*?)<\/figcaption>/g)].map((m) => m[1]);
      expect(captions).toHaveLength(3);
      expect(captions[0]).toMatch(/darkest blue[\s\S]*palest blue, dotted, is a poor fit[\s\S]*white does not fit/);
      expect(captions[0]).toContain('Vermilion dots');
      expect(captions[1]).toContain('opposite the shadow');
      expect(captions[1]).toContain('yellow dots');
      expect(captions[2]).toContain('(measured - predicted) / sigma');
      expect(captions[2]).toMatch(/blue, within 2 sigma orange, beyond 2 sigma vermilion/);
      for (const c of captions) expect(c).not.toMatch(/\bred\b/);
    });
    it('has a glossary of sigma, chi-square, p-value and error ellipse', () => {
      const glossary = /<section id="glossary">([\s\S]*?)<\/section>/.exec(page)![1];
      for (const word of ['sigma', 'residual', 'chi-square (chi2)', 'p-value (p)', 'error ellipse']) expect(glossary).toContain(`<dt>${word}</dt>`);
      expect(glossary).toContain('68%');
      expect(glossary).toContain('Measured minus predicted');
    });
  });
});
