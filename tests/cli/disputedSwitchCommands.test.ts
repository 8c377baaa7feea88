/**
 * A disputed calendar switch in `check`, `report` and `chart` (the `date` command's case is in
 * tests/solver/calendarReadings.test.ts). The scene (tests/solver/scenes/holland-winter.yaml, invented)
 * holds a sun direction of Julian 25 December 1582, 11:00 local apparent time, in a town reckoning by
 * Holland's calendar. Holland's switch: 21 December 1582 (Julian) followed by 1 January 1583 (Gregorian)
 * in Grotefend (1941), the table's main reading; 1 January 1583 (Julian) followed by 12 January 1583 in
 * the sizes.com table citing the Plakaet of 10 December 1582 (`holland@placaet`). So the day of the
 * light is called 25 December 1582 only under the Plakaet reading; under Grotefend's that name was skipped.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { ROOT, runCli } from '../helpers/runCli.js';
import { readSceneText } from '../../src/scene/readScene.js';
import { calendarReadingNote } from '../../src/charts/calendarReadingLabel.js';

const SCENE = 'tests/solver/scenes/holland-winter.yaml';

describe('check under every reading of a disputed switch', () => {
  it('a day the main reading skipped is judged under the reading that has it: consistent, and the answer says the sources disagree', async () => {
    const r = await runCli(['check', SCENE, '--on', '1582-12-25']);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/^Verdict: consistent/m);
    expect(r.out).toContain('Calendar switch in dispute');
    expect(r.out).toContain('The sources disagree');
    expect(r.out).toContain('only "holland@placaet"');
    expect(r.out).toMatch(/- holland: 21 December 1582 \(Julian\) followed by 1 January 1583[\s\S]*?never used under Holland/);
    expect(r.out).toMatch(/- holland@placaet:[\s\S]*?consistent: best inside the proposal 25 December 1582 \(Julian\), chi2 0\.00/);
    expect(r.out).toContain('reading "placaet"'); // the assumptions name the reading the verdict used
  }, 120000);
  it('a day named alike under both readings gets one verdict under each, and says it is the same', async () => {
    const r = await runCli(['check', SCENE, '--on', '1582-12-10', '--json']);
    expect(r.code).toBe(0);
    const json = JSON.parse(r.out);
    expect(json.calendarReadings.outcomes.map((o: { ruleText: string; verdict: string }) => [o.ruleText, o.verdict])).toEqual([['holland', 'inconsistent'], ['holland@placaet', 'inconsistent']]);
    expect(json.calendarReadings.sameDays).toBe(true);
    expect(json.calendarReadings.verdict).toMatch(/same days under every reading and the verdict is the same: inconsistent/);
  }, 120000);
  it('a day that exists under no reading is refused as before (exit 2, one line naming the option)', async () => {
    const r = await runCli(['check', SCENE, '--on', '1582-02-30']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/^heliochron: --on: "1582-02-30" is not allowed; expected a date/);
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.out).toBe('');
  }, 120000);
});

describe('report and chart name the reading', () => {
  it('the HTML report shows both readings with their best candidates, and which fits', async () => {
    const r = await runCli(['report', SCENE]);
    expect(r.code).toBe(0);
    const section = /<section id="calendar-readings">[\s\S]*?<\/section>/.exec(r.out)?.[0] ?? '';
    expect(section).toContain('The sources disagree');
    expect(section).toMatch(/holland \(main reading\)<\/td><td>21 December 1582 \(Julian\) followed by 1 January 1583 \(Gregorian\)<\/td><td>1 December 1582 \(Julian\)/);
    expect(section).toMatch(/holland@placaet<\/td><td>1 January 1583 \(Julian\) followed by 12 January 1583 \(Gregorian\)<\/td><td>25 December 1582 \(Julian\)<\/td><td class="num">0\.00<\/td><td>best</);
    expect(section).toContain('Grotefend');
    expect(section).toContain('sizes.com');
  }, 180000);
  it.each(['map', 'sky'])('the %s chart says which reading names its days and that the sources disagree', async (kind) => {
    const r = await runCli(['chart', SCENE, '--kind', kind]);
    expect(r.code).toBe(0);
    expect(r.out).toContain('Days named under &quot;holland&quot;, the main reading of its calendar switch (21 December 1582 (Julian) followed by 1 January 1583 (Gregorian))');
    expect(r.out).toContain('The sources disagree: also &quot;holland@placaet&quot; (1 January 1583 (Julian) followed by 12 January 1583 (Gregorian))');
  }, 180000);
  it('the residuals chart names the reading beside the candidate\'s date; a stated reading is named as stated', async () => {
    const r = await runCli(['chart', SCENE, '--kind', 'residuals']);
    expect(r.out).toContain('1 December 1582 (Julian) (calendar &quot;holland&quot;, main reading; sources disagree)');
    // The chart command takes the calendar from the scene file: a scene stating the Plakaet reading.
    const stated = readSceneText(readFileSync(`${ROOT}${SCENE}`, 'utf8').replace('calendar: holland', 'calendar: holland@placaet'), 'stated.yaml');
    expect(calendarReadingNote(stated)?.[0]).toBe('days named under "holland@placaet", a reading stated in the scene of its calendar switch (1 January 1583 (Julian) followed by 12 January 1583 (Gregorian))');
    expect(calendarReadingNote(readSceneText(readFileSync(`${ROOT}${SCENE}`, 'utf8').replace('fromYear: 1582, toYear: 1582, notBefore: 1582-12-01', 'fromYear: 1650, toYear: 1651'), 'later.yaml'))).toBeNull();
  }, 180000);
});
