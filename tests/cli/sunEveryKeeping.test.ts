/**
 * `heliochron sun --clock` accepts every keeping and prints the moment in every hour system.
 * The check is a round trip through the command itself: the time given in one keeping is printed back
 * on that keeping's own line, and the other lines agree with the apparent-time run of the same moment.
 * Site and day invented (45.44 N 12.33 E, 15 June 1750, Gregorian).
 */
import { describe, expect, it } from 'vitest';
import { runCli } from '../helpers/runCli.js';

const BASE = ['sun', '--lat', '45.44', '--lon', '12.33', '--date', '1750-06-15', '--calendar', 'gregorian'];
const KEEPINGS = ['apparent', 'mean', 'meridian:2.33', 'zone:Europe/Rome', 'ut', 'italian', 'italian+30', 'italian:dusk', 'babylonian', 'unequal'];

/** The hh:mm:ss of a labelled line of the sun answer. */
function line(out: string, label: string): string {
  const m = new RegExp(`^  ${label}\\s+(\\d\\d:\\d\\d:\\d\\d)`, 'm').exec(out);
  if (!m) throw new Error(`no line "${label}" in:\n${out}`);
  return m[1];
}
const seconds = (t: string): number => t.split(':').map(Number).reduce((a, x) => a * 60 + x, 0);

describe('sun --clock with every keeping', () => {
  it.each(KEEPINGS)('--clock %s is accepted and the answer lists apparent, mean, Italian, Babylonian and unequal hours', async (keeping) => {
    const r = await runCli([...BASE, '--time', '10:00', '--clock', keeping]);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    for (const label of ['local apparent time', 'local mean time', 'Italian hours', 'Babylonian hours', 'unequal hours']) expect(line(r.out, label)).toMatch(/^\d\d:/);
  });
  it.each([['italian', 'Italian hours'], ['babylonian', 'Babylonian hours'], ['unequal', 'unequal hours']])('a time given in %s is printed back on its own line, and run again in apparent time gives the same readings', async (keeping, label) => {
    const given = await runCli([...BASE, '--time', '15:00', '--clock', keeping]);
    expect(line(given.out, label)).toBe('15:00:00');
    const apparent = line(given.out, 'local apparent time');
    const again = await runCli([...BASE, '--time', apparent, '--clock', 'apparent']);
    for (const l of ['Italian hours', 'Babylonian hours', 'unequal hours']) expect(Math.abs(seconds(line(again.out, l)) - seconds(line(given.out, l)))).toBeLessThanOrEqual(1);
  });
  it('an Italian count from the end of civil twilight says so in plain words', async () => {
    const r = await runCli([...BASE, '--time', '15:00', '--clock', 'italian:dusk']);
    expect(r.out).toContain("Italian hours (24 hours from the end of the previous evening's civil twilight)");
  });
  it('check --clock italian reads the proposed hour in Italian hours at the scene\'s site (round trip through sun)', async () => {
    // The bundled example's site (Velmar, 47.62 N 9.35 E, 410 m; its air 965 hPa, 18 C does not move the hour).
    const sun = await runCli(['sun', '--lat', '47.62', '--lon', '9.35', '--elevation', '410', '--date', '1771-07-30', '--calendar', 'gregorian', '--time', '09:33', '--clock', 'apparent']);
    const italian = line(sun.out, 'Italian hours');
    const r = await runCli(['check', 'examples/marktgasse-print.yaml', '--on', '1771-07-30', '--time', italian.slice(0, 5), '--clock', 'italian']);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/best within the proposal 30 July 1771 \(Gregorian, Tuesday\), 09:3[23] local apparent time/);
  });
});
