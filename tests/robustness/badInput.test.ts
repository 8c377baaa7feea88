/**
 * Bad input end to end through the CLI (main() with a captured CliIo): every refusal is one line
 * on stderr, "heliochron: <option or path>: <the value, quoted> is not allowed; expected <what is
 * allowed>", exit code 2, nothing on stdout, and no file written even with -o (the contract of
 * src/errors.ts and src/cli/io.ts; a one-line refusal with exit code 2 for bad usage is common
 * practice for command-line tools: bash and many GNU tools use 2 for misuse). Scenes are small
 * Velmar variants (invented).
 */
import { existsSync, mkdirSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { cli, tempDir, velmar, writeScene, type Data } from './robustHelpers.js';

const SUN = ['sun', '--lat', '47.62', '--lon', '9.35', '--date', '1771-07-30', '--time', '8:00'];
/** The sun command's arguments with one option replaced (or added). */
function sun(option: string, value: string): string[] {
  const args = [...SUN];
  const i = args.indexOf(option);
  if (i >= 0) args[i + 1] = value;
  else args.push(option, value);
  return args;
}

interface BadCase {
  readonly name: string;
  readonly args: readonly string[];
  /** The option or path named first, and the value quoted as the message quotes it. */
  readonly where: string;
  readonly quoted: string | undefined;
  /** Words of what is allowed. */
  readonly allowed: RegExp;
}

const CLI_CASES: readonly BadCase[] = [
  { name: 'latitude 95', args: sun('--lat', '95'), where: '--lat', quoted: '"95"', allowed: /latitude in degrees from -90 to 90, north positive/ },
  { name: 'latitude not a number', args: sun('--lat', '47,62'), where: '--lat', quoted: '"47,62"', allowed: /latitude in degrees from -90 to 90.*Write the decimal point as a full stop: 47\.62\./ },
  { name: 'month 13', args: sun('--date', '1771-13-01'), where: '--date', quoted: '"1771-13-01"', allowed: /months run from 1 to 12/ },
  { name: 'a date in the reform gap', args: [...sun('--date', '1700-02-25'), '--calendar', 'protestant-germany'], where: '--date', quoted: '"1700-02-25"', allowed: /18 February 1700 \(Julian\) was followed by 1 March 1700 \(Gregorian\)/ },
  { name: 'unknown region', args: [...SUN, '--calendar', 'protestant-germani'], where: '--calendar', quoted: '"protestant-germani"', allowed: /Did you mean "protestant-germany"\?/ },
  { name: 'unknown zone', args: [...SUN, '--clock', 'zone:Europe/Velmar'], where: '--clock', quoted: '"zone:Europe/Velmar"', allowed: /not a zone of the IANA time zone database/ },
  { name: 'malformed time', args: sun('--time', '8h30'), where: '--time', quoted: '"8h30"', allowed: /hh:mm or hh:mm:ss on a 24-hour clock/ },
  { name: 'time out of the day', args: sun('--time', '25:70'), where: '--time', quoted: '"25:70"', allowed: /00:00 to 23:59:59/ },
  { name: 'a year outside the Delta T model', args: sun('--date', '5000-07-30'), where: '--date', quoted: '"5000-07-30"', allowed: /years -1999 to 3000/ },
  { name: 'calendar: month 13', args: ['calendar', '1771-13-01'], where: '<date>', quoted: '"1771-13-01"', allowed: /months run from 1 to 12/ },
  { name: 'calendar: a gap date', args: ['calendar', '1582-10-10', '--calendar', 'rome'], where: '<date>', quoted: '"1582-10-10"', allowed: /4 October 1582 \(Julian\) was followed by 15 October 1582/ },
  { name: 'calendar: unknown region', args: ['calendar', '1700-01-01', '--calendar', 'velmar'], where: '--calendar', quoted: '"velmar"', allowed: /a region id/ },
];

function withoutLat(): Data {
  const d = velmar();
  delete (d.site as Record<string, unknown>).latitudeDeg;
  return d;
}
const rod = (o: Data): Data => velmar({ observations: [{ id: 'bracket', kind: 'rod-shadow', wall: 'tanners-hall-front', side: 'left', sigmaDeg: 1.5, ...o }] });

/** Scene files for `date`, each with the path the message must name. */
const SCENE_CASES: readonly (Omit<BadCase, 'args'> & { readonly data: Data })[] = [
  { name: 'missing field', data: withoutLat(), where: 'site.latitudeDeg', quoted: undefined, allowed: /a latitude in degrees from -90 to 90, north positive.* The site needs "latitudeDeg"/ },
  { name: 'wrong unit', data: rod({ slopeRad: 0.86 }), where: 'observations[0].slopeRad', quoted: '0.86', allowed: /Did you mean "slopeDeg"\? Angles are in degrees/ },
  { name: 'angle out of range', data: velmar({ walls: [{ id: 'tanners-hall-front', azimuthDeg: 400, azimuthSigmaDeg: 1 }] }), where: 'walls[0].azimuthDeg', quoted: '400', allowed: /from 0 to 360 \(360 excluded\)/ },
  { name: 'slope out of range', data: rod({ slopeDeg: 90 }), where: 'observations[0].slopeDeg', quoted: '90', allowed: /\(0 and 90 excluded\)/ },
  { name: 'unknown wall', data: rod({ slopeDeg: 49, wall: 'tanners-hal-front' }), where: 'observations[0].wall', quoted: '"tanners-hal-front"', allowed: /Did you mean "tanners-hall-front"\?/ },
  { name: 'latitude 95 in the file', data: velmar({ site: { latitudeDeg: 95, longitudeDeg: 9.35 } }), where: 'site.latitudeDeg', quoted: '95', allowed: /from -90 to 90/ },
  { name: 'a gap date as a bound', data: velmar({ calendar: 'protestant-germany', yearStart: 'jan1', window: { fromYear: 1699, toYear: 1701, notBefore: '1700-02-25' } }), where: 'window.notBefore', quoted: '"1700-02-25"', allowed: /was followed by 1 March 1700/ },
  { name: 'unknown zone of a clock', data: velmar({ observations: [{ id: 'clock', kind: 'clock', reading: '8:06', precisionMinutes: 2, kept: 'zone:Europe/Velmar' }] }), where: 'observations[0].kept', quoted: '"zone:Europe/Velmar"', allowed: /IANA/ },
];

let refusals = 0;
function expectRefusal(r: { code: number; out: string; err: string; thrown?: unknown }, c: Omit<BadCase, 'args'>, prefix = ''): void {
  expect(r.thrown, String(r.thrown)).toBeUndefined();
  expect(r.code, r.err).toBe(2);
  expect(r.out).toBe('');
  const lines = r.err.split('\n').filter((l) => l !== '');
  expect(lines, r.err).toHaveLength(1);
  const line = lines[0];
  // A value left out is said to be missing; a value given is quoted.
  const head = c.quoted === undefined ? `${c.where} is missing; expected ` : `${c.where}: ${c.quoted} is not allowed; expected `;
  expect(line.startsWith(`heliochron: ${prefix}${head}`), line).toBe(true);
  expect(line).toMatch(c.allowed);
  refusals += 1;
}

describe('bad options of sun and calendar', () => {
  for (const c of CLI_CASES) {
    it(`${c.name}: one line naming ${c.where}, quoting the value, saying what is allowed; exit 2`, async () => {
      const r = await cli(c.args, tempDir());
      expectRefusal(r, c);
    });
  }
});

describe('bad scene files for date (and check), with -o', () => {
  for (const c of SCENE_CASES) {
    it(`${c.name}: names ${c.where} in the file, exit 2, no output file`, async () => {
      const dir = tempDir();
      writeScene(dir, 'scene.yaml', c.data);
      for (const args of [['date', 'scene.yaml', '--json', '-o', 'answer.json'], ['check', 'scene.yaml', '--on', '1765-07-30', '-o', 'check.txt']]) {
        const r = await cli(args, dir);
        expectRefusal(r, c, 'scene.yaml: ');
        expect(r.err).toMatch(/See line \d+ of scene\.yaml\.$/m);
      }
      // Nothing written: no answer file and no temporary file left behind.
      expect(readdirSync(dir).sort()).toEqual(['scene.yaml']);
    });
  }
});

describe('bad output paths and options of date and check', () => {
  it('an existing output file is refused before any work, and left as it was', async () => {
    const dir = tempDir();
    writeScene(dir, 'scene.yaml', velmar());
    writeScene(dir, 'answer.json', { untouched: true });
    const r = await cli(['date', 'scene.yaml', '--json', '-o', 'answer.json'], dir);
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    expect(r.err).toBe('heliochron: output file "answer.json" exists already; add --force to replace it\n');
    expect(readdirSync(dir).sort()).toEqual(['answer.json', 'scene.yaml']);
  });

  it('an output folder that does not exist, and the input as output, are refused', async () => {
    const dir = tempDir();
    writeScene(dir, 'scene.yaml', velmar());
    const a = await cli(['date', 'scene.yaml', '-o', join('no-such-folder', 'a.json')], dir);
    expect(a.code).toBe(2);
    expect(a.err).toBe('heliochron: folder "no-such-folder" for the output file does not exist\n');
    writeScene(dir, 'scene.txt', velmar());
    const b = await cli(['date', 'scene.txt', '-o', 'scene.txt', '--force'], dir);
    expect(b.code).toBe(2);
    expect(b.err).toBe('heliochron: output file "scene.txt" is the input file; choose another name\n');
    expect(existsSync(join(dir, 'no-such-folder'))).toBe(false);
  });

  it('a proposal outside the Delta T years, and a missing scene file, are refused by name', async () => {
    const dir = tempDir();
    writeScene(dir, 'scene.yaml', velmar());
    const a = await cli(['check', 'scene.yaml', '--on', '5000-06-21'], dir);
    expectRefusal(a, { name: '', where: '--on', quoted: '"5000-06-21"', allowed: /years -1999 to 3000/ });
    const b = await cli(['date', 'nowhere.yaml', '-o', 'x.json'], dir);
    expectRefusal(b, { name: '', where: 'nowhere.yaml', quoted: '"nowhere.yaml"', allowed: /There is no file at this path/ });
    mkdirSync(join(dir, 'folder.yaml'));
    const c = await cli(['date', 'folder.yaml'], dir);
    expectRefusal(c, { name: '', where: 'folder.yaml', quoted: '"folder.yaml"', allowed: /This is a folder, not a file/ });
    expect(existsSync(join(dir, 'x.json'))).toBe(false);
  });
});

describe('a picture plane that cannot be rectified (found while solving, not while reading)', () => {
  const IMAGE = { widthPx: 2000, heightPx: 1500 };
  const pixelRod = { id: 'o', kind: 'rod-shadow', wall: 'tanners-hall-front', pixels: { fromPx: [300, 300], toPx: [250, 350] } };
  const cases: readonly (Omit<BadCase, 'args'> & { readonly data: Data })[] = [
    {
      name: 'three corners on one line', where: 'walls[0].imagePlane.pointsPx[1]', quoted: '[500,100]', allowed: /no three lie on one line/,
      data: velmar({ image: IMAGE, walls: [{ id: 'tanners-hall-front', azimuthDeg: 135, azimuthSigmaDeg: 1, imagePlane: { pointsPx: [[100, 100], [500, 100], [900, 100], [110, 880]], widthM: 8, heightM: 7 } }], observations: [pixelRod] }),
    },
    {
      name: 'corners going round the wrong way (a reversed print)', where: 'walls[0].imagePlane.pointsPx', quoted: '[[100,100],[900,120],[880,900],[110,880]]', allowed: /reversed print \(set image\.mirrored: true\)/,
      data: velmar({ image: { ...IMAGE, mirrored: true }, walls: [{ id: 'tanners-hall-front', azimuthDeg: 135, azimuthSigmaDeg: 1, imagePlane: { pointsPx: [[100, 100], [900, 120], [880, 900], [110, 880]], widthM: 8, heightM: 7 } }], observations: [pixelRod] }),
    },
  ];
  for (const c of cases) {
    it(`${c.name}: names the file and ${c.where}, exit 2, no output file`, async () => {
      const dir = tempDir();
      writeScene(dir, 'scene.yaml', c.data);
      for (const args of [['date', 'scene.yaml', '-o', 'answer.txt'], ['check', 'scene.yaml', '--on', '1765-07-30', '--json', '-o', 'check.json']]) {
        expectRefusal(await cli(args, dir), c, 'scene.yaml: ');
      }
      expect(readdirSync(dir)).toEqual(['scene.yaml']);
    });
  }
});

describe('"nothing fits" is an answer, not an error', () => {
  it('exits 0 with the verdict on stdout', async () => {
    const dir = tempDir();
    writeScene(dir, 'scene.yaml', velmar({
      walls: [{ id: 'north-wall', azimuthDeg: 0, azimuthSigmaDeg: 0.5 }],
      observations: [{ id: 'lit', kind: 'wall-lit', wall: 'north-wall' }, { id: 'pole', kind: 'pole-shadow', shadowAzimuthDeg: 0, shadowAzimuthSigmaDeg: 2 }],
    }));
    const r = await cli(['date', 'scene.yaml'], dir);
    expect(r.code).toBe(0);
    expect(r.err).toBe('');
    expect(r.out).toMatch(/Verdict: .*Nothing fits/);
  });
});

describe('the refusals above', () => {
  it('all ran', () => {
    // eslint-disable-next-line no-console
    console.log(`bad input: ${refusals} refusals checked (${CLI_CASES.length} option cases, ${SCENE_CASES.length} scene cases x 2 commands, 3 more, 2 picture planes x 2 commands)`);
    expect(refusals).toBe(CLI_CASES.length + 2 * SCENE_CASES.length + 3 + 4);
  });
});

describe('refusals of the option parser', () => {
  // Common practice: every refusal is one line with the program's name, exit code 2.
  for (const args of [['sun', '--latt', '3'], ['frobnicate'], ['date'], ['sun', '--lat']]) {
    it(`"${args.join(' ')}" is refused in one line with exit code 2`, async () => {
      const { main } = await import('../../src/cli/main.js');
      let out = '';
      let err = '';
      const code = await main(args, { out: (t) => { out += t; }, err: (t) => { err += t; }, errIsTerminal: false, cwd: process.cwd() });
      expect(code).toBe(2);
      expect(out).toBe('');
      expect(err.trimEnd().split('\n')).toHaveLength(1);
      // The parser's own refusals point to --help; a missing argument says what it is (src/cli/commandLine.ts).
      expect(err).toMatch(/^heliochron: (.+; add --help for the options|<scene> is missing; expected the scene file .+)\n$/);
    });
  }
});
