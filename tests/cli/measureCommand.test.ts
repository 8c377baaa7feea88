/**
 * `heliochron measure` through main() of src/cli/main.ts (and once through the compiled
 * program when dist/ is built). Demo data: the invented picture of the fictional town of
 * Velmar in examples/tanners-hall-photo/ and variations of it written to a temporary folder.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { copyFileSync, existsSync, mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { main } from '../../src/cli/main.js';
import type { CliIo } from '../../src/cli/io.js';
import { sniffPicture } from '../../src/cli/pictureFile.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const EXAMPLE_DIR = join(ROOT, 'examples/tanners-hall-photo');
const EXAMPLE = join(EXAMPLE_DIR, 'tanners-hall-photo.yaml');
const EXAMPLE_TEXT = readFileSync(EXAMPLE, 'utf8');
const dir = mkdtempSync(join(tmpdir(), 'heliochron-measure-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

interface Ran { code: number; out: string; err: string }

async function measure(args: string[]): Promise<Ran> {
  let out = '';
  let err = '';
  const io: CliIo = { out: (t) => { out += t; }, err: (t) => { err += t; }, errIsTerminal: false, cwd: ROOT };
  const code = await main(['measure', ...args], io);
  return { code, out, err };
}

/** A variation of the example scene in the temporary folder, with the picture beside it. */
function variant(name: string, edit: (text: string) => string): string {
  const path = join(dir, `${name}.yaml`);
  writeFileSync(path, edit(EXAMPLE_TEXT));
  if (!existsSync(join(dir, 'tanners-hall-photo.png'))) copyFileSync(join(EXAMPLE_DIR, 'tanners-hall-photo.png'), join(dir, 'tanners-hall-photo.png'));
  return path;
}

/** The wall's clicked window corners replaced by `points`. */
function wallPoints(text: string, points: string): string {
  const edited = text.replace(/(imagePlane:\n(?:\s+#.*\n)*\s+pointsPx: )\[.*\]/, `$1${points}`);
  if (edited === text) throw new Error('the example scene no longer has the expected imagePlane lines');
  return edited;
}

describe('heliochron measure: what it prints', () => {
  it('prints each derived value with its sigma, the sigma parts, how it was obtained and the residuals of each plane', async () => {
    const r = await measure([EXAMPLE]);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    for (const text of [
      'walls[0].imagePlane (wall tanners-hall-west): 8 points of known position',
      'groundPlane (the ground): a rectangle of known size',
      'exactly 4 points: the rectification passes through every click',
      'observations[1] "lamp-bracket": rod shadow on wall tanners-hall-west',
      'slopeDeg = ', 'to the left', 'depthRatio = ', 'shadowAzimuthDeg = ', 'lengthRatio = ',
      'sigma parts (first order): clicked figure', 'shadow points', 'stated length',
      'how: clicked on walls[0].imagePlane (8 plane points',
      'first order reliable',
    ]) {
      expect(r.out).toContain(text);
    }
    // 8 residuals listed for the wall, all within the 1 px clicking precision (the clicks are rounded renderings)
    const line = /residuals ((?:\d+\.\d+, ){7}\d+\.\d+) px; rms (\d+\.\d+) px/.exec(r.out);
    expect(line).not.toBeNull();
    for (const v of line![1].split(', ').map(Number)) expect(v).toBeLessThan(1);
    expect(r.out).not.toContain('Best candidate'); // no dating without --with-best
  });

  it('--json gives every value with sigma, sigma parts, reliability and the residuals per plane in pixels', async () => {
    const r = await measure([EXAMPLE, '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.planes.map((p: { field: string }) => p.field)).toEqual(['walls[0].imagePlane', 'groundPlane']);
    expect(j.planes[0].residualsPx).toHaveLength(8);
    expect(j.planes[1].exactlyDetermined).toBe(true);
    expect(j.observations.map((o: { id: string }) => o.id)).toEqual(['lamp-bracket', 'cornice', 'lamp-post']);
    const pole = j.observations[2];
    expect(pole.values.map((v: { name: string }) => v.name)).toEqual(['shadowAzimuthDeg', 'lengthRatio']);
    for (const o of j.observations) {
      for (const v of o.values) {
        // the parts are independent, so they add in quadrature to the whole (first-order propagation)
        const parts = Math.hypot(v.sigmaParts.clickedFigure, v.sigmaParts.shadowPoints, v.sigmaParts.statedLength);
        expect(Math.abs(parts - v.firstOrderSigma)).toBeLessThan(1e-5);
        expect(v.firstOrderReliable).toBe(true);
        expect(v.sigmaSource).toBe('first-order');
      }
    }
    expect(j.best).toBeNull();
    expect(j.overlay).toBeNull();
  });

  it('warns when the residuals of a plane are larger than the clicking precision allows (a misclicked corner)', async () => {
    // the first window corner clicked 25 px right and 20 px low of where it is
    const path = variant('misclick', (t) => t.replace('pointsPx: [[588, 558]', 'pointsPx: [[613, 578]'));
    const r = await measure([path]);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/WARNING: rms residual [\d.]+ px is more than 3 times the clicking precision \(1 px\): a point is misclicked/);
    const good = await measure([EXAMPLE]);
    expect(good.out).not.toContain('WARNING');
  });

  it('a reversed print clicked as it is (x flipped, mirrored: true) gives the same values (docs/conventions.md)', async () => {
    const flip = (line: string): string => line.replace(/\[(\d+(?:\.\d+)?), (\d+(?:\.\d+)?)\]/g, (_m, x, y) => `[${1600 - Number(x)}, ${y}]`);
    const path = variant('mirrored', (t) =>
      t.split('\n').map((line) => (/pointsPx:|pixels:/.test(line) ? flip(line) : line)).join('\n').replace('pixelSigmaPx: 1 }', 'pixelSigmaPx: 1, mirrored: true }'),
    );
    const a = JSON.parse((await measure([EXAMPLE, '--json'])).out);
    const b = JSON.parse((await measure([path, '--json'])).out);
    expect(b.image.mirrored).toBe(true);
    expect(b.observations.map((o: { values: unknown }) => o.values)).toEqual(a.observations.map((o: { values: unknown }) => o.values));
    expect(b.observations[0].side).toBe('left');
  });

  it('a scene without pixel forms says there is nothing to measure', async () => {
    const r = await measure([join(ROOT, 'examples/marktgasse-print.yaml')]);
    expect(r.code).toBe(0);
    expect(r.out).toContain('none: no observation of this scene is given in pixels');
  });

  it('warns when the first-order sigma is not reliable and says which sigma dating uses', async () => {
    // the rod's shadow measured far outside a tiny clicked tile (about 12 px) with 2 px clicks
    const path = variant('tiny-tile', (t) =>
      wallPoints(t, '[[798, 507], [810, 507], [810, 519], [798, 519]]')
        .replace(/      planePointsM: .*\n/, '      widthM: 0.12\n      heightM: 0.12\n')
        .replace('pixelSigmaPx: 1 }', 'pixelSigmaPx: 2 }')
        .replace(/  - id: cornice[\s\S]*?(?=  - id: lamp-post)/, ''),
    );
    const r = await measure([path]);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    expect(r.out).toContain('first order NOT reliable');
    expect(r.out).toMatch(/WARNING: slopeDeg: the first-order sigma [\d.]+ is not reliable .* the Monte Carlo spread of 1000 samples \(seed \d+\) is [\d.]+/);
    const j = JSON.parse((await measure([path, '--json'])).out);
    const slope = j.observations[0].values[0];
    expect(slope.firstOrderReliable).toBe(false);
    expect(slope.sigma).toBe(Math.max(slope.firstOrderSigma, slope.monteCarloSigma));
  });
});

describe('heliochron measure --overlay', () => {
  it('writes the SVG in the picture\'s own pixel frame with the clicked points, grid and shadows, the picture embedded', async () => {
    const out = join(dir, 'overlay.svg');
    const scene = variant('plain', (t) => t);
    const r = await measure([scene, '--overlay', out]);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    expect(r.out).toContain('Overlay written to');
    const svg = readFileSync(out, 'utf8');
    expect(/^<svg [^>]*viewBox="0 0 1600 1200"/.test(svg), 'viewBox in picture pixels').toBe(true);
    expect(svg.includes('href="data:image/png;base64,iVBORw0KGgo'), 'PNG embedded').toBe(true); // PNG signature in base64 (ISO/IEC 15948 sec. 5.2)
    expect((svg.match(/<circle /g) ?? []).length).toBeGreaterThanOrEqual(8 + 4 + 3); // corners, kerb, shadow roots
    expect(svg.includes('<g class="grid"><line'), 'grid drawn').toBe(true);
    // the clicked root of the lamp bracket is drawn where it was clicked
    expect(svg.includes('cx="800" cy="515"'), 'bracket root at its click').toBe(true);
    expect(svg.includes('#d9531e'), 'no predictions without --with-best').toBe(false);
  });

  it('refuses to overwrite an existing overlay without --force (exit 2, file unchanged) and replaces it with --force', async () => {
    const out = join(dir, 'existing.svg');
    writeFileSync(out, 'keep me');
    const r = await measure([EXAMPLE, '--overlay', out]);
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    expect(r.err).toMatch(/^heliochron: output file .*existing\.svg" exists already; add --force to replace it\n$/);
    expect(readFileSync(out, 'utf8')).toBe('keep me');
    const forced = await measure([EXAMPLE, '--overlay', out, '--force']);
    expect(forced.code).toBe(0);
    expect(readFileSync(out, 'utf8').startsWith('<svg ')).toBe(true);
  });

  it('--image embeds a PNG given on the command line; other files are refused by their first bytes', async () => {
    const png = join(dir, 'copy.png');
    copyFileSync(join(EXAMPLE_DIR, 'tanners-hall-photo.png'), png);
    const ok = await measure([EXAMPLE, '--overlay', join(dir, 'with-image.svg'), '--image', png]);
    expect(ok.code).toBe(0);
    expect(readFileSync(join(dir, 'with-image.svg'), 'utf8').includes('data:image/png;base64,')).toBe(true);

    const fake = join(dir, 'fake.png');
    writeFileSync(fake, 'this is text, not a picture');
    const target = join(dir, 'never.svg');
    const bad = await measure([EXAMPLE, '--overlay', target, '--image', fake]);
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/^heliochron: --image: ".*fake\.png" is not allowed; expected a JPEG or PNG picture\. Its first bytes \(74 68 69 73 20 69 73 20\) are neither JPEG/);
    expect(bad.err.trim().split('\n')).toHaveLength(1);
    expect(existsSync(target)).toBe(false);

    const gif = join(dir, 'scan.jpg');
    writeFileSync(gif, Buffer.from('GIF89a\x01\x00\x01\x00', 'latin1'));
    const g = await measure([EXAMPLE, '--overlay', target, '--image', gif]);
    expect(g.code).toBe(2);
    expect(g.err).toContain('This file is a GIF picture; save the picture as PNG or JPEG');
    expect(existsSync(target)).toBe(false);
  });

  it('--image without --overlay, and an overlay name not ending .svg, are refused', async () => {
    const a = await measure([EXAMPLE, '--image', join(EXAMPLE_DIR, 'tanners-hall-photo.png')]);
    expect(a.code).toBe(2);
    expect(a.err).toMatch(/^heliochron: --image: .* expected a picture only together with --overlay/);
    const b = await measure([EXAMPLE, '--overlay', join(dir, 'overlay.png')]);
    expect(b.code).toBe(2);
    expect(b.err).toMatch(/^heliochron: --overlay: .* expected a file name ending \.svg/);
  });
});

describe('heliochron measure: degenerate clicks (exit 2, one line naming the path, nothing written)', () => {
  const cases: [string, (t: string) => string, RegExp][] = [
    [
      'three collinear corners',
      (t) => wallPoints(t, '[[588, 558], [672, 558], [756, 558], [585, 686]]')
        .replace(/      planePointsM: .*\n/, '      widthM: 1.2\n      heightM: 1.8\n'),
      /^heliochron: \S+\.yaml: walls\[0\]\.imagePlane\.pointsPx\[1\]: \[672,558\] is not allowed; expected four points of which no three lie on one line\. Points 0, 1 and 2 are on one line/,
    ],
    [
      'crossing edges of a rectangle',
      (t) => wallPoints(t, '[[588, 558], [672, 558], [585, 686], [671, 686]]')
        .replace(/      planePointsM: .*\n/, '      widthM: 1.2\n      heightM: 1.8\n'),
      /^heliochron: \S+\.yaml: walls\[0\]\.imagePlane\.pointsPx: .*Two edges of the clicked figure cross each other/,
    ],
    [
      'a point outside the picture',
      (t) => t.replace('fromPx: [800, 515]', 'fromPx: [1700, 515]'),
      /^heliochron: \S+\.yaml: observations\[1\]\.pixels\.fromPx\[0\]: 1700 is not allowed; expected an x in pixels inside the image \(width 1600 px\)/,
    ],
    [
      'a ground corner outside the picture',
      (t) => t.replace('[63, 987]]', '[63, 1250]]'),
      /^heliochron: \S+\.yaml: groundPlane\.pointsPx\[3\]\[1\]: 1250 is not allowed; expected a y in pixels inside the image/,
    ],
  ];
  for (const [what, edit, message] of cases) {
    it(what, async () => {
      const path = variant(what.replace(/\W+/g, '-'), edit);
      const target = join(dir, `${what.replace(/\W+/g, '-')}.svg`);
      const r = await measure([path, '--overlay', target]);
      expect(r.code).toBe(2);
      expect(r.out).toBe('');
      expect(r.err).toMatch(message);
      expect(r.err.trim().split('\n')).toHaveLength(1);
      expect(existsSync(target)).toBe(false);
    });
  }
});

describe('heliochron measure --with-best', () => {
  it('dates the scene and draws, dashed, the shadows its best candidate predicts, beside the measured ones', async () => {
    const out = join(dir, 'best.svg');
    const r = await measure([EXAMPLE, '--with-best', '--overlay', out]);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/Best candidate of the dating \(fits\)/);
    expect(r.out).toMatch(/lamp-bracket slopeDeg: measured [\d.]+ deg, predicted [\d.]+ deg \([+-][\d.]+ sigma\)/);
    // every measured value within 2 sigma of what the best candidate predicts
    for (const m of r.out.matchAll(/\(([+-][\d.]+) sigma\)/g)) expect(Math.abs(Number(m[1]))).toBeLessThan(2);
    const svg = readFileSync(out, 'utf8');
    // rod and pole: dashed lines in the predicted colour from the clicked roots; cornice: its predicted shadow edge
    const dashed = svg.match(/stroke="#d9531e" stroke-width="2" stroke-dasharray="8 5"/g) ?? [];
    expect(dashed.length).toBeGreaterThanOrEqual(3);
    expect(/<g class="predicted-lines">\n<line [^>]*stroke="#d9531e"/.test(svg), 'the cornice\'s predicted shadow edge is drawn').toBe(true);
    expect(svg.includes('dashed: predicted by the best candidate, 2 September 1890 (Gregorian)'), 'the key names the candidate').toBe(true);
  });
});

describe('pictureFile: JPEG and PNG recognised by their first bytes', () => {
  it('reads the size of a PNG from its IHDR chunk (ISO/IEC 15948:2004 sec. 11.2.2)', () => {
    const p = sniffPicture(new Uint8Array(readFileSync(join(EXAMPLE_DIR, 'tanners-hall-photo.png'))), '--image', 'x.png');
    expect(p.mimeType).toBe('image/png');
    expect([p.widthPx, p.heightPx]).toEqual([1600, 1200]);
  });
  it('reads the size of a JPEG from its start-of-frame segment (ITU-T T.81 Annex B)', () => {
    // SOI, an APP0 segment of length 16, SOF0 (length 17): precision 8, height 0x01E0 = 480, width 0x0280 = 640;
    // then a start of scan (length 12, three components), two bytes of data and EOI
    const bytes = new Uint8Array([
      0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46, 0x49, 0x46, 0x00, 0x01, 0x01, 0x00, 0x00, 0x01, 0x00, 0x01, 0x00, 0x00,
      0xff, 0xc0, 0x00, 0x11, 0x08, 0x01, 0xe0, 0x02, 0x80, 0x03, 0x01, 0x22, 0x00, 0x02, 0x11, 0x01, 0x03, 0x11, 0x01,
      0xff, 0xda, 0x00, 0x0c, 0x03, 0x01, 0x00, 0x02, 0x11, 0x03, 0x11, 0x00, 0x3f, 0x00, 0x12, 0x34, 0xff, 0xd9,
    ]);
    const p = sniffPicture(bytes, '--image', 'x.jpg');
    expect(p.mimeType).toBe('image/jpeg');
    expect([p.widthPx, p.heightPx]).toEqual([640, 480]);
  });
  it('refuses an empty file and a WebP picture, naming the field', () => {
    expect(() => sniffPicture(new Uint8Array(0), 'image.file', 'empty.png')).toThrow(/^image\.file: "empty\.png" is not allowed; expected a JPEG or PNG picture\. Its first bytes \(none: the file is empty\)/);
    const webp = new Uint8Array(Buffer.from('RIFF\x10\x00\x00\x00WEBPVP8 ', 'latin1'));
    expect(() => sniffPicture(webp, '--image', 'a.png')).toThrow(/This file is a WebP picture/);
  });
});

describe('heliochron measure through the compiled program', () => {
  it.runIf(existsSync(join(ROOT, 'dist/cli/measureCommand.js')) &&
    statSync(join(ROOT, 'dist/cli/measureCommand.js')).mtimeMs >= statSync(join(ROOT, 'src/cli/measureCommand.ts')).mtimeMs)(
    'gives the same answer as main() (run `npx tsc -p tsconfig.json` first)',
    async () => {
      const r = spawnSync(process.execPath, [join(ROOT, 'dist/cli/main.js'), 'measure', EXAMPLE, '--json'], { encoding: 'utf8', cwd: ROOT });
      expect(r.status).toBe(0);
      expect(JSON.parse(r.stdout)).toEqual(JSON.parse((await measure([EXAMPLE, '--json'])).out));
    },
  );
});

describe('heliochron measure --seed', () => {
  it('prints the seed it uses, the scene file\'s or the one given', async () => {
    // Common practice: a seeded run states its seed so it can be repeated.
    const { main } = await import('../../src/cli/main.js');
    let out = '';
    const code = await main(['measure', 'examples/tanners-hall-photo/tanners-hall-photo.yaml', '--seed', '11'], {
      out: (t) => { out += t; }, err: () => {}, errIsTerminal: false, cwd: process.cwd(),
    });
    expect(code).toBe(0);
    expect(out).toMatch(/seed 11 for any Monte Carlo run/);
  });
});

describe('heliochron measure with the moon in pixels', () => {
  it('refuses the moon through a wall seen nearly face-on (the example\'s west front), saying why, with exit code 2', async () => {
    const path = variant('moon-face-on', (t) => t.replace(/\nseed: 1890/, '\n  - { id: moon, kind: moon-direction, pixels: { centrePx: [1500, 150], sigmaPx: 2, wall: tanners-hall-west } }\nseed: 1890'));
    const r = await measure([path]);
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    expect(r.err).toMatch(/observations\[4\]\.pixels\.wall: "walls\[0\]\.imagePlane" is not allowed; expected a figure that fixes the focal length to within 25%.*The wall's figure \(walls\[0\]\.imagePlane\) is seen too nearly face-on/);
  });
  it('prints the moon measured through the ground\'s figure, and lists it in the JSON', async () => {
    const path = variant('moon-in-pixels', (t) => t.replace(/\nseed: 1890/, '\n  - { id: moon, kind: moon-direction, pixels: { centrePx: [1500, 150], sigmaPx: 2 } }\nseed: 1890'));
    const text = await measure([path]);
    expect(text.err).toBe('');
    expect(text.out).toMatch(/The moon in pixels:\n {2}moon \(observations\[\d+\]\), the moon's centre: azimuth \d+\.\d\d \+\/- \d+\.\d\d deg, apparent altitude -?\d+\.\d\d \+\/- \d+\.\d\d deg, through the ground's figure/);
    const json = JSON.parse((await measure([path, '--json'])).out) as { moon: { id: string; through: string; azimuthSigmaDeg: number }[] };
    expect(json.moon.map((m) => [m.id, m.through])).toEqual([['moon', 'plane']]);
    expect(json.moon[0].azimuthSigmaDeg).toBeGreaterThan(0);
  });
});
