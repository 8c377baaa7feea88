/**
 * Hostile text and files: terminal control sequences written as YAML or JSON escapes, file
 * names with line breaks, nesting bombs the old text scan could be fooled by, lengths in
 * user-perceived characters, mis-indented lines, damaged pictures and pictures outside the
 * scene's folder. Control characters: ISO/IEC 6429 (ECMA-48) C0, DEL and C1; graphemes:
 * Unicode Standard Annex #29 (through Intl.Segmenter).
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { deflateSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main.js';
import { sniffPicture } from '../../src/cli/pictureFile.js';
import { quoteValue } from '../../src/errors.js';
import { readSceneText } from '../../src/scene/readScene.js';
import { graphemeLength, shortenText } from '../../src/textUnits.js';
import { parse } from 'yaml';
import { schemaViolation } from '../scene/miniSchema.js';
import { cli, STACK_LINE, tempDir, velmar, writeScene } from './robustHelpers.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const SCHEMA = JSON.parse(readFileSync(join(ROOT, 'docs/scene.schema.json'), 'utf8'));
/** Any C0 or C1 control character or DEL except the final line feed of a message. */
const RAW_CONTROL = /[\u0000-\u0009\u000b-\u001f\u007f-\u009f]/;
const LONE_SURROGATE = /[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/;

function expectOneLineRefusal(r: { code: number; out: string; err: string }): void {
  expect(r.code, r.err).toBe(2);
  expect(r.out).toBe('');
  expect(r.err).toMatch(/^heliochron: [^\n]*\n$/);
  expect(r.err).not.toMatch(RAW_CONTROL);
  expect(r.err).not.toMatch(STACK_LINE);
}

describe('terminal control sequences in scene text', () => {
  const dir = tempDir('heliochron-hostile-');
  const yamlEscapes = 'heliochron: 1\ntitle: "\\e[2J\\e]0;PWNED\\a Velmar"\nsite: { latitudeDeg: 47.62, longitudeDeg: 9.35 }\ncalendar: gregorian\nwindow: { fromYear: 1760, toYear: 1770 }\nwalls: [{ id: w, azimuthDeg: 135, azimuthSigmaDeg: 1 }]\nobservations: [{ id: b, kind: rod-shadow, wall: w, slopeDeg: 49, side: left, sigmaDeg: 1.5 }]\n';
  writeFileSync(join(dir, 'escapes.yaml'), yamlEscapes);
  const json = JSON.stringify({ ...velmar(), walls: [{ id: 'w', azimuthDeg: 135, azimuthSigmaDeg: 1, note: 'x\u001b]0;PWNED\u0007' }], observations: [{ id: 'b', kind: 'rod-shadow', wall: 'w', slopeDeg: 49, side: 'left', sigmaDeg: 1.5 }] });
  writeFileSync(join(dir, 'escapes.json'), json);
  writeScene(dir, 'c1.yaml', velmar({ title: 'Velmar \u009b2J (C1 CSI)' }));

  for (const [file, field] of [['escapes.yaml', 'title'], ['escapes.json', 'walls[0].note'], ['c1.yaml', 'title']] as const) {
    for (const command of [['date'], ['check', '--on', '1765-06-01'], ['measure']]) {
      it(`${command[0]} refuses ${file}, naming ${field}, and prints the characters escaped`, async () => {
        const r = await cli([command[0], file, ...command.slice(1)], dir);
        expectOneLineRefusal(r);
        expect(r.err).toContain(`${file}: ${field}: `);
        expect(r.err).toMatch(/without control characters\. It holds U\+00(1B|9B)/);
        expect(r.err).toMatch(/\\u001b|\\u009b/);
      });
    }
  }

  it('a file name with a line break stays on one line of the message', async () => {
    const r = await cli(['date', 'no\nsuch\u001b[2J.yaml'], dir);
    expectOneLineRefusal(r);
    expect(r.err).toContain('no\\nsuch\\u001b[2J.yaml');
  });

  it('an output name with a line break is reported on one line after writing', async () => {
    writeScene(dir, 'ok.yaml', velmar());
    const r = await cli(['date', 'ok.yaml', '-o', 'answer\nx.txt'], dir);
    expect(r.code, r.err).toBe(0);
    expect(r.err).toBe('heliochron: wrote answer\\nx.txt\n');
  });
});

describe('nesting measured on the parser\'s own tokens', () => {
  const scene = (title: string, extra = ''): string =>
    `heliochron: 1\ntitle: ${title}\n${extra}site: { latitudeDeg: 47.62, longitudeDeg: 9.35 }\ncalendar: gregorian\nwindow: { fromYear: 1760, toYear: 1770 }\nwalls: [{ id: w, azimuthDeg: 135, azimuthSigmaDeg: 1 }]\nobservations: [{ id: b, kind: rod-shadow, wall: w, slopeDeg: 49, side: left, sigmaDeg: 1.5 }]\n`;

  it('a stray quote on an earlier line does not hide 750 levels of brackets', () => {
    for (const stray of ["note: it's here\n", "x: a'b\n", "y: ['a', b'c]\n"]) {
      const text = `${stray}deep: ${'['.repeat(750)}${']'.repeat(750)}\n` + scene('T');
      expect(() => readSceneText(text, 'deep.yaml')).toThrow(/deep\.yaml \(line 2, column \d+\): "nesting 33 levels deep" is not allowed; expected lists and maps nested at most 32 levels deep/);
    }
  });

  it('a million brackets and a thousand dashes are refused without running out of stack', () => {
    expect(() => readSceneText(`a: ${'['.repeat(1_000_000)}`, 'bomb.yaml')).toThrow(/nesting 33 levels deep/);
    expect(() => readSceneText(`a: ${'- '.repeat(1000)}x`, 'bomb.yaml')).toThrow(/nesting \d+ levels deep/);
    let block = '';
    for (let i = 0; i < 40; i++) block += `${' '.repeat(2 * i)}k${i}:\n`;
    expect(() => readSceneText(block, 'block.yaml')).toThrow(/block\.yaml \(line 40, column 79\): "nesting 40 levels deep"/);
  });

  it('40 brackets inside a quoted title are text, not nesting', () => {
    const title = `Velmar ${'['.repeat(40)} a print`;
    expect(readSceneText(scene(JSON.stringify(title)), 'brackets.yaml').title).toBe(title);
    expect(readSceneText(scene(`'${title}'`), 'brackets.yaml').title).toBe(title);
  });

  it('a "..." line is named as the end of the document, not as "---"', () => {
    const text = `${scene('T')}...\nmore: 1\n`;
    expect(() => readSceneText(text, 'end.yaml')).toThrow(/A line "\.\.\." ends the scene, and more text follows it/);
    expect(() => readSceneText(`${scene('T')}---\nmore: 1\n`, 'end.yaml')).toThrow(/A line "---" starts a second document/);
  });
});

describe('a mis-indented line is the line named', () => {
  it('line 13 indented one space too deep is reported at line 13, not at the line after it', () => {
    const lines = readFileSync(join(ROOT, 'examples/salt-house-sketch.yaml'), 'utf8').split('\n');
    expect(lines[12]).toBe('  fromYear: 1830');
    lines[12] = `   ${lines[12].trimStart()}`;
    expect(() => readSceneText(lines.join('\n'), 'salt.yaml')).toThrow(/^salt\.yaml \(line 13, column 4\): "fromYear: 1830" is not allowed/);
  });
});

describe('lengths in user-perceived characters', () => {
  const emoji = '\u{1F3DB}\u{FE0F}'; // classical building + variation selector: one character, three UTF-16 units
  it('counts a 300-emoji title as 300 characters (accepted; the limit is 500)', () => {
    const title = emoji.repeat(300);
    expect(title.length).toBe(900);
    expect(graphemeLength(title)).toBe(300);
    const scene = readSceneText(`heliochron: 1\ntitle: "${title}"\nsite: { latitudeDeg: 47.62, longitudeDeg: 9.35 }\ncalendar: gregorian\nwindow: { fromYear: 1760, toYear: 1770 }\nwalls: [{ id: w, azimuthDeg: 135, azimuthSigmaDeg: 1 }]\nobservations: [{ id: b, kind: rod-shadow, wall: w, slopeDeg: 49, side: left, sigmaDeg: 1.5 }]\n`, 'e.yaml');
    expect(scene.title).toBe(title);
  });

  it('refuses 501 of them as "501 characters" and never cuts a character in half when quoting', () => {
    const title = `Velmar ${'e\u0301'.repeat(10)}${emoji.repeat(491)}`;
    let message = '';
    try {
      readSceneText(`heliochron: 1\ntitle: "${title}"\n`, 'e.yaml');
    } catch (error) {
      message = (error as Error).message;
    }
    expect(message).toMatch(/^title: ".*\.\.\. is not allowed; expected a title for the scene \(text of 1 to 500 characters\)\. It has 508 characters\./);
    expect(message).not.toMatch(LONE_SURROGATE);
    for (let cut = 70; cut < 90; cut++) expect(shortenText(`${'a'.repeat(cut)}${emoji.repeat(20)}`, 80)).not.toMatch(LONE_SURROGATE);
    expect(quoteValue(emoji.repeat(100))).toMatch(/^"(\u{1F3DB}\u{FE0F})+\.\.\.$/u);
  });
});

/** A minimal PNG (ISO/IEC 15948:2004): signature, IHDR, one IDAT, IEND, with real CRCs. */
function png(width: number, height: number, damage?: (b: Buffer) => void): Buffer {
  const crcTable = Array.from({ length: 256 }, (_, n) => {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    return c >>> 0;
  });
  const crc = (b: Buffer): number => {
    let c = 0xffffffff;
    for (const x of b) c = crcTable[(c ^ x) & 0xff] ^ (c >>> 8);
    return (c ^ 0xffffffff) >>> 0;
  };
  const chunk = (type: string, data: Buffer): Buffer => {
    const head = Buffer.alloc(8);
    head.writeUInt32BE(data.length, 0);
    head.write(type, 4, 'latin1');
    const tail = Buffer.alloc(4);
    tail.writeUInt32BE(crc(Buffer.concat([head.subarray(4), data])), 0);
    return Buffer.concat([head, data, tail]);
  };
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 0; // grey
  const rows = Buffer.alloc((width + 1) * height);
  const bytes = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), chunk('IHDR', ihdr), chunk('IDAT', deflateSync(rows)), chunk('IEND', Buffer.alloc(0))]);
  damage?.(bytes);
  return bytes;
}

describe('pictures: the whole header is checked', () => {
  const refusal = (bytes: Uint8Array): string => {
    try {
      sniffPicture(bytes, '--image', 'p');
    } catch (error) {
      return (error as Error).message;
    }
    return 'accepted';
  };

  it('accepts a complete PNG and reads its size from IHDR', () => {
    const p = sniffPicture(png(40, 30), '--image', 'p.png');
    expect([p.mimeType, p.widthPx, p.heightPx]).toEqual(['image/png', 40, 30]);
  });

  it('refuses the JPEG signature followed by text, a cut PNG, a damaged IHDR and a giant declared size', () => {
    expect(refusal(Buffer.from('\xff\xd8\xffThis is a text file, not a picture.\n', 'latin1'))).toMatch(/^--image: "p" is not allowed; expected a complete JPEG picture\. The file starts like JPEG, but/);
    const whole = png(40, 30);
    expect(refusal(whole.subarray(0, whole.length - 20))).toMatch(/expected a complete PNG picture\. The file starts like PNG, but .*(cut or damaged|IEND)/);
    expect(refusal(png(40, 30, (b) => { b[17] ^= 1; }))).toMatch(/image header \(IHDR\) fails its checksum/);
    expect(refusal(png(200_000, 10))).toMatch(/expected a picture of at most 100000 pixels a side .*Its header says 200000 x 10 pixels/);
  });

  it('accepts the JPEG frame header of a minimal baseline file (ITU-T T.81, B.2.2)', () => {
    // SOI, SOF0 (precision 8, 16 x 8, one component), SOS, two bytes of data, EOI.
    const jpeg = Buffer.from([0xff, 0xd8, 0xff, 0xc0, 0, 11, 8, 0, 8, 0, 16, 1, 1, 0x11, 0, 0xff, 0xda, 0, 8, 1, 1, 0, 0, 63, 0, 0x12, 0x34, 0xff, 0xd9]);
    const p = sniffPicture(jpeg, '--image', 'p.jpg');
    expect([p.mimeType, p.widthPx, p.heightPx]).toEqual(['image/jpeg', 16, 8]);
    expect(refusal(jpeg.subarray(0, jpeg.length - 2))).toMatch(/does not end with the end-of-image marker/);
  });
});

describe("image.file stays in the scene's folder", () => {
  for (const file of ['../elsewhere.png', '/etc/hall.png', 'pictures/../../hall.jpg', 'C:\\hall.jpg']) {
    it(`refuses ${JSON.stringify(file)}`, () => {
      const text = `heliochron: 1\ntitle: T\nsite: { latitudeDeg: 47.62, longitudeDeg: 9.35 }\ncalendar: gregorian\nwindow: { fromYear: 1760, toYear: 1770 }\nimage: { widthPx: 100, heightPx: 80, file: ${JSON.stringify(file)} }\nwalls: [{ id: w, azimuthDeg: 135, azimuthSigmaDeg: 1 }]\nobservations: [{ id: b, kind: rod-shadow, wall: w, slopeDeg: 49, side: left, sigmaDeg: 1.5 }]\n`;
      expect(() => readSceneText(text, 'pic.yaml')).toThrow(/image\.file: .* is not allowed; expected a file name relative to the scene file's folder/);
      expect(schemaViolation(SCHEMA, parse(text))).toMatch(/image\.file/);
    });
  }
  it('accepts a picture beside the scene or in a folder inside it, as the JSON Schema does', () => {
    for (const file of ['hall.png', 'pictures/hall.jpg', 'hall..v2.png']) {
      const text = `heliochron: 1\ntitle: T\nsite: { latitudeDeg: 47.62, longitudeDeg: 9.35 }\ncalendar: gregorian\nwindow: { fromYear: 1760, toYear: 1770 }\nimage: { widthPx: 100, heightPx: 80, file: ${JSON.stringify(file)} }\nwalls: [{ id: w, azimuthDeg: 135, azimuthSigmaDeg: 1 }]\nobservations: [{ id: b, kind: rod-shadow, wall: w, slopeDeg: 49, side: left, sigmaDeg: 1.5 }]\n`;
      expect(readSceneText(text, 'pic.yaml').image?.file).toBe(file);
      expect(schemaViolation(SCHEMA, parse(text))).toBeNull();
    }
  });
});

describe('the output path is checked before the work', () => {
  it('chart --kind map refuses a bad -o before drawing anything (no progress line on a terminal)', async () => {
    const dir = tempDir('heliochron-early-');
    writeScene(dir, 'ok.yaml', velmar());
    writeFileSync(join(dir, 'plain-file'), 'x');
    let err = '';
    const code = await main(['chart', 'ok.yaml', '--kind', 'map', '-o', 'plain-file/map.svg'], { out: () => undefined, err: (t) => { err += t; }, errIsTerminal: true, cwd: dir });
    expect(code).toBe(2);
    expect(err).toBe('heliochron: output file "plain-file/map.svg" cannot be written: a part of the path is a file, not a folder [ENOTDIR]\n');
  });
});
