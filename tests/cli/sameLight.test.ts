/**
 * `date --same-light-in <year> --zone <IANA>` on the bundled example: every listed moment that the
 * answer puts within 0.1 deg of its family's best candidate is checked with the `sun` command, in
 * the zone time of that year (through the compiled CLI when dist/ is built).
 */
import { describe, expect, it } from 'vitest';
import { runCli } from '../helpers/runCli.js';
import { separationDeg } from '../../src/solver/sameLight.js';

const cli = runCli;

const two = (n: number): string => String(n).padStart(2, '0');
const hhmmss = (minutes: number): string => {
  const s = Math.round(minutes * 60) % 86400;
  return `${two(Math.floor(s / 3600))}:${two(Math.floor((s % 3600) / 60))}:${two(s % 60)}`;
};

describe('date --same-light-in', () => {
  it('lists, per family, days of 2026 whose zone times put the sun within 0.1 deg of the candidate, as the sun command confirms', async () => {
    const r = await cli(['date', 'examples/marktgasse-print.yaml', '--json', '--same-light-in', '2026', '--zone', 'Europe/Zurich']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.sameLight.year).toBe(2026);
    let checked = 0;
    for (const f of j.sameLight.families) {
      expect(f.moments.length).toBeGreaterThan(0);
      for (const m of f.moments) {
        if (m.separationDeg > 0.1) continue;
        const date = `${m.date.year}-${two(m.date.month)}-${two(m.date.day)}`;
        // The scene's air (examples/marktgasse-print.yaml: 960 hPa, 15 C), as the answer's check line says.
        const sun = await cli(['sun', '--lat', '47.62', '--lon', '9.35', '--elevation', '410', '--date', date, '--time', hhmmss(m.zoneMinutes), '--clock', 'zone:Europe/Zurich', '--pressure', '960', '--temperature', '15', '--json']);
        expect(sun.code).toBe(0);
        const s = JSON.parse(sun.out);
        expect(separationDeg(s.azimuth, s.altitude, f.target.azimuthDeg, f.target.altitudeDeg), `${date} ${hhmmss(m.zoneMinutes)}`).toBeLessThanOrEqual(0.1 + 0.003); // 0.5 s of rounding: 0.002 deg
        expect(s.times.zoneOffsetMinutes).toBe(120); // summer time (CEST) in May-August 2026
        checked += 1;
      }
    }
    expect(checked).toBeGreaterThanOrEqual(2);
  }, 180000);
  it('refuses --same-light-in without --zone, and a year before 1970, with exit 2', async () => {
    const a = await cli(['date', 'examples/marktgasse-print.yaml', '--same-light-in', '2026']);
    expect(a.code).toBe(2);
    expect(a.err).toMatch(/--zone/);
    const b = await cli(['date', 'examples/marktgasse-print.yaml', '--same-light-in', '1900', '--zone', 'Europe/Zurich']);
    expect(b.code).toBe(2);
    expect(b.err).toMatch(/--same-light-in.*1970/);
  }, 60000);
});
