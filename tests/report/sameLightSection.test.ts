/**
 * `report --same-light-in <year> --zone <IANA>`: the HTML report's same-light table. Every listed
 * moment within 0.1 deg is taken back through the library (our calendar to a Julian Day, the zone time
 * to UT through src/time/clock.ts, the sun by sunPosition, NREL SPA-checked in tests/ephemeris) and must
 * put the sun within 0.1 deg of its family's best candidate, whose direction is taken from `date --json`.
 * Scene: the bundled example (fictional Velmar).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { ROOT, runCli } from '../helpers/runCli.js';
import { readSceneText } from '../../src/scene/readScene.js';
import { calendarDateToJd } from '../../src/calendar/julianDay.js';
import { clockToJdUT } from '../../src/time/clock.js';
import { sunPosition } from '../../src/ephemeris/sunPosition.js';
import { separationDeg } from '../../src/solver/sameLight.js';

const SCENE = 'examples/marktgasse-print.yaml';
const MONTHS = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December'];

describe('report --same-light-in', () => {
  it('lists per family days and zone times of 2026 that put the sun within 0.1 deg of the candidate\'s direction (checked by sunPosition)', async () => {
    const r = await runCli(['report', SCENE, '--same-light-in', '2026', '--zone', 'Europe/Zurich']);
    expect(r.code).toBe(0);
    expect(r.out).toContain('heliochron report examples/marktgasse-print.yaml --same-light-in 2026 --zone Europe/Zurich');
    const section = /<section id="same-light">[\s\S]*?<\/section>/.exec(r.out)?.[0] ?? '';
    // The families' best directions as `date --json` gives them (sameLight.families[].target, in family order).
    const date = JSON.parse((await runCli(['date', SCENE, '--json', '--same-light-in', '2026', '--zone', 'Europe/Zurich'])).out);
    const scene = readSceneText(readFileSync(`${ROOT}${SCENE}`, 'utf8'), SCENE);
    const site = { latitudeDeg: scene.site.latitudeDeg, longitudeDeg: scene.site.longitudeDeg, elevationM: scene.site.elevationM };
    const rows = [...section.matchAll(/<tr><td>F(\d+)<\/td><td class="num">[^<]*<\/td><td class="nowrap">(\d+) (\w+) (\d{4})<\/td><td class="num">(\d\d):(\d\d):(\d\d)<\/td><td>([^<]*)<\/td><td class="num">[^<]*<\/td><td class="num">([\d.]+)( \(closest that year\))?<\/td><\/tr>/g)];
    expect(rows.length).toBeGreaterThanOrEqual(2);
    let checked = 0;
    for (const m of rows) {
      const [, rank, day, monthName, year, hh, mm, ss, offset, distance, closest] = m;
      expect(offset).toBe('UT+2:00, summer time'); // May-August 2026 in Zurich: CEST
      if (closest !== undefined) continue;
      expect(Number(distance)).toBeLessThanOrEqual(0.1);
      const family = date.families.find((f: { rank: number }) => f.rank === Number(rank));
      const target = date.sameLight.families.find((f: { familyId: string }) => f.familyId === family.id).target;
      const dayJd0 = calendarDateToJd({ calendar: 'gregorian', year: Number(year), month: MONTHS.indexOf(monthName) + 1, day: Number(day) });
      const jdUT = clockToJdUT(dayJd0, Number(hh) * 60 + Number(mm) + Number(ss) / 60, { kind: 'zone', zone: 'Europe/Zurich' }, site);
      const sun = sunPosition(jdUT, site, scene.air);
      // 0.5 s of rounding in the listed time: up to 0.002 deg.
      expect(separationDeg(sun.azimuthDeg, sun.altitudeDeg, target.azimuthDeg, target.altitudeDeg), m[0]).toBeLessThanOrEqual(0.1 + 0.003);
      checked += 1;
    }
    expect(checked).toBeGreaterThanOrEqual(2);
  }, 240000);
  it('refuses --zone without --same-light-in with exit 2 and writes nothing', async () => {
    const r = await runCli(['report', SCENE, '--zone', 'Europe/Zurich']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/--zone/);
    expect(r.out).toBe('');
  }, 60000);
});
