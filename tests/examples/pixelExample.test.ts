/**
 * The invented photograph of the Tanners' Hall (fictional town of Velmar), from the clicked
 * pixels to the date, end to end through the command line (main() of src/cli/main.ts).
 *
 * The truth is the instant the picture was rendered for (examples/tanners-hall-photo/README.md):
 * 2 September 1890 (Gregorian), 15:30 local mean time at 47.62 N, 9.35 E. The sun at that instant
 * is taken here not from heliochron but from astronomia (npm), a port of Meeus, Astronomical
 * Algorithms (1998): solar.apparentEquatorialVSOP87 (ch. 25), sidereal.apparent (ch. 12),
 * coord.Equatorial.toHorizontal (eqs. 13.5, 13.6), refraction.gt15Apparent (eq. 16.2, scaled for
 * pressure and temperature as in ch. 16, p. 107 from memory), eqtime.e (ch. 28), deltat.deltaT, julian (ch. 7).
 * The shadows it implies come from the closed forms of the shadow angles (ASHRAE Handbook -
 * Fundamentals, Fenestration: tan VSA = tan a / cos HSA; rod slope tan s = tan a / |sin HSA|;
 * pole shadow opposite the sun, length / height = 1 / tan a, common practice).
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
// @ts-expect-error astronomia ships no type declarations
import { solar, sidereal, coord, globe, planetposition, refraction, eqtime, deltat, julian } from 'astronomia';
// @ts-expect-error astronomia ships no type declarations
import vsop87Dearth from 'astronomia/data/vsop87Dearth';
import { main } from '../../src/cli/main.js';
import type { CliIo } from '../../src/cli/io.js';
import { sniffPicture } from '../../src/cli/pictureFile.js';
import { readSceneFile } from '../../src/cli/sceneFile.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const DIR = join(ROOT, 'examples/tanners-hall-photo');
const SCENE = join(DIR, 'tanners-hall-photo.yaml');
const RAD = Math.PI / 180;

async function cli(args: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const io: CliIo = { out: (t) => { out += t; }, err: (t) => { err += t; }, errIsTerminal: false, cwd: ROOT };
  const code = await main(args, io);
  return { code, out, err };
}

// ---------------------------------------------------------------- the truth, independently
const SITE = { latitudeDeg: 47.62, longitudeDeg: 9.35 };
const AIR = { pressureHPa: 965, temperatureC: 18 };
const WALL_AZIMUTH_DEG = 268.5;
const LOCAL_MEAN_MINUTES = 15 * 60 + 30;
const dayJd0 = julian.CalendarGregorianToJD(1890, 9, 2) as number; // 0h of 2 September 1890 (Meeus ch. 7)
// local mean time = UT + 4 min per degree of east longitude (common practice)
const jdUT = dayJd0 + (LOCAL_MEAN_MINUTES - 4 * SITE.longitudeDeg) / 1440;
const deltaTSeconds = deltat.deltaT(1890 + (9 - 0.5) / 12) as number;
const jdTT = jdUT + deltaTSeconds / 86400;
const earth = new planetposition.Planet(vsop87Dearth);
const eq = solar.apparentEquatorialVSOP87(earth, jdTT);
// astronomia's longitude is positive west (Meeus's convention); its azimuth is reckoned from the south
const horizontal = new coord.Equatorial(eq.ra, eq.dec).toHorizontal(new globe.Coord(SITE.latitudeDeg * RAD, -SITE.longitudeDeg * RAD), sidereal.apparent(jdUT));
const geometricAltitudeDeg = horizontal.alt / RAD;
const sunAzimuthDeg = horizontal.az / RAD + 180;
const refractionDeg = (refraction.gt15Apparent(horizontal.alt) / RAD) * (AIR.pressureHPa / 1010) * (283 / (273 + AIR.temperatureC));
const sunAltitudeDeg = geometricAltitudeDeg + refractionDeg;
const equationOfTimeMinutes = (eqtime.e(jdTT, earth) / (2 * Math.PI)) * 1440;
const trueApparentMinutes = LOCAL_MEAN_MINUTES + equationOfTimeMinutes;

const hsaRad = (sunAzimuthDeg - WALL_AZIMUTH_DEG) * RAD;
const altRad = sunAltitudeDeg * RAD;
const TRUTH: Record<string, number> = {
  slopeDeg: Math.atan(Math.tan(altRad) / Math.abs(Math.sin(hsaRad))) / RAD,
  depthRatio: Math.tan(altRad) / Math.cos(hsaRad),
  shadowAzimuthDeg: sunAzimuthDeg + 180 - 360 * Math.floor((sunAzimuthDeg + 180) / 360),
  lengthRatio: 1 / Math.tan(altRad),
};

describe('the Tanners\' Hall photograph: the files', () => {
  it('the picture is a PNG of the size the scene file states, and the scene reads', () => {
    const scene = readSceneFile(SCENE);
    const png = sniffPicture(new Uint8Array(readFileSync(join(DIR, 'tanners-hall-photo.png'))), 'png', 'tanners-hall-photo.png');
    expect(png.mimeType).toBe('image/png');
    expect([png.widthPx, png.heightPx]).toEqual([scene.image!.widthPx, scene.image!.heightPx]);
  });

  it('the clicked shadow points are the drawn shadow lines of the SVG rounded to a whole pixel', () => {
    const svg = readFileSync(join(DIR, 'tanners-hall-photo.svg'), 'utf8');
    const lines = [...svg.matchAll(/<line x1="([\d.]+)" y1="([\d.]+)" x2="([\d.]+)" y2="([\d.]+)" stroke="#6f5c44"/g)].map((m) => m.slice(1, 5).map(Number));
    expect(lines).toHaveLength(2); // the bracket's shadow on the wall, the lamp post's on the paving
    const scene = readSceneFile(SCENE);
    const segments = scene.observations.flatMap((o) => ('pixels' in o && o.pixels && o.kind !== 'overhang-shadow' && o.kind !== 'moon-direction' ? [o.pixels] : []));
    segments.forEach((seg, k) => {
      const [x1, y1, x2, y2] = lines[k];
      for (const [clicked, drawn] of [[seg.fromPx[0], x1], [seg.fromPx[1], y1], [seg.toPx[0], x2], [seg.toPx[1], y2]]) {
        expect(Math.abs(clicked - drawn)).toBeLessThanOrEqual(0.55); // rounding to a pixel, plus the SVG's 0.1 px rounding
      }
    });
  });
});

describe('the Tanners\' Hall photograph through `heliochron measure`', () => {
  it('every derived value lies within its sigma of the truth', async () => {
    // sanity of the independent truth: a sun in the south-west, low in the afternoon
    expect(sunAzimuthDeg).toBeGreaterThan(240);
    expect(sunAzimuthDeg).toBeLessThan(250);
    const r = await cli(['measure', SCENE, '--json']);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    const seen: string[] = [];
    for (const o of j.observations) {
      for (const v of o.values) {
        const truth = TRUTH[v.name];
        const off = Math.abs(v.value - truth);
        expect(off <= v.sigma, `${o.id} ${v.name}: measured ${v.value} +/- ${v.sigma}, truth ${truth} (off by ${off})`).toBe(true);
        seen.push(v.name);
      }
    }
    expect(seen.sort()).toEqual(['depthRatio', 'lengthRatio', 'shadowAzimuthDeg', 'slopeDeg']);
    expect(j.observations[0].side).toBe('left'); // HSA < 0: the sun is to the viewer's right, the shadow runs left
    // the wall's 8 clicked corners agree with one perspective to within the 1 px clicking precision
    expect(j.planes[0].rmsPx).toBeLessThan(1);
  });
});

describe('the Tanners\' Hall photograph through `heliochron date`, end to end', () => {
  it('the true date and hour lie within the reported 95% uncertainty of the best candidate', async () => {
    const r = await cli(['date', SCENE, '--json']);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.status).toBe('fits');
    const best = j.candidates[0];
    const [y, m, d] = (best.date.iso as string).split('-').map(Number);
    const dayOffset = (julian.CalendarGregorianToJD(y, m, d) as number) - dayJd0;
    const minuteOffset = best.times.localApparentMinutes - trueApparentMinutes;
    const { halfWidthDays, halfWidthMinutes } = best.uncertainty.ellipse95;
    expect(Math.abs(dayOffset) <= halfWidthDays, `day off by ${dayOffset}, 95% half-width ${halfWidthDays} d`).toBe(true);
    expect(Math.abs(minuteOffset) <= halfWidthMinutes, `time off by ${minuteOffset.toFixed(2)} min, 95% half-width ${halfWidthMinutes} min`).toBe(true);
    // and the sun of the best candidate is the true sun to well within a degree
    expect(Math.abs(best.sun.azimuthDeg - sunAzimuthDeg)).toBeLessThan(1);
    expect(Math.abs(best.sun.altitudeDeg - sunAltitudeDeg)).toBeLessThan(1);
  });
});

describe('the Tanners\' Hall photograph through `heliochron check`', () => {
  it('the true day is consistent with the clicked shadows, a day three months earlier is not', async () => {
    const yes = await cli(['check', SCENE, '--on', '1890-09-02', '--json']);
    expect(yes.code).toBe(0);
    expect(JSON.parse(yes.out).verdict).toBe('consistent');
    // 2 June: the sun's declination is about +22 deg instead of +8 deg (Meeus 1998 ch. 25), far beyond the sigmas
    const no = await cli(['check', SCENE, '--on', '1890-06-02', '--json']);
    expect(no.code).toBe(0);
    expect(JSON.parse(no.out).verdict).toBe('inconsistent');
  });
});
