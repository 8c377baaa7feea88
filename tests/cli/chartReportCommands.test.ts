import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { existsSync, mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { main } from '../../src/cli/main.js';
import type { CliIo } from '../../src/cli/io.js';
import { reportCommandLine, shellWord } from '../../src/cli/reportCommandLine.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const EXAMPLE = 'examples/marktgasse-print.yaml';
let dir: string;

async function runMain(args: string[], errIsTerminal = false): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const io: CliIo = { out: (t) => { out += t; }, err: (t) => { err += t; }, errIsTerminal, cwd: ROOT };
  const code = await main(args, io);
  return { code, out, err };
}

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'heliochron-chart-'));
});
afterAll(() => {
  rmSync(dir, { recursive: true, force: true });
});

describe('heliochron chart', () => {
  it('writes the chart asked for as an SVG file and says so on stderr', async () => {
    const out = join(dir, 'sky.svg');
    const r = await runMain(['chart', EXAMPLE, '--kind', 'sky', '-o', out]);
    expect(r.code).toBe(0);
    expect(r.out).toBe('');
    expect(r.err).toContain('wrote');
    const svg = readFileSync(out, 'utf8');
    expect(svg.startsWith('<svg xmlns="http://www.w3.org/2000/svg"')).toBe(true);
    expect(svg).toContain('Where the sun must have stood');
  });
  it('prints the SVG without -o', async () => {
    const r = await runMain(['chart', EXAMPLE, '--kind', 'residuals']);
    expect(r.code).toBe(0);
    expect(r.out).toContain('How well each measurement fits the best candidate');
  });
  it('refuses a bad or missing --kind with exit code 2, naming the option and what is allowed, writing nothing', async () => {
    const out = join(dir, 'bad.svg');
    const bad = await runMain(['chart', EXAMPLE, '--kind', 'pie', '-o', out]);
    expect(bad.code).toBe(2);
    expect(bad.err).toContain('--kind');
    expect(bad.err).toContain('"pie"');
    expect(bad.err).toContain('one of map, sky, residuals');
    expect(existsSync(out)).toBe(false);
    const missing = await runMain(['chart', EXAMPLE, '-o', out]);
    expect(missing.code).toBe(2);
    expect(missing.err).toContain('this option is required');
  });
  it('refuses to replace a file without --force and leaves it as it was', async () => {
    const out = join(dir, 'kept.svg');
    writeFileSync(out, 'old');
    const r = await runMain(['chart', EXAMPLE, '--kind', 'residuals', '-o', out]);
    expect(r.code).toBe(2);
    expect(r.err).toContain('--force');
    expect(readFileSync(out, 'utf8')).toBe('old');
    const forced = await runMain(['chart', EXAMPLE, '--kind', 'residuals', '-o', out, '--force']);
    expect(forced.code).toBe(0);
    expect(readFileSync(out, 'utf8')).toContain('<svg');
  });
  it('shows progress of the map on a terminal only, and never in the file', async () => {
    const quiet = await runMain(['chart', EXAMPLE, '--kind', 'map', '-o', join(dir, 'map1.svg')], false);
    expect(quiet.err).not.toContain('%');
    const shown = await runMain(['chart', EXAMPLE, '--kind', 'map', '-o', join(dir, 'map2.svg')], true);
    expect(shown.err).toContain('drawing the date and hour map: 100%');
    expect(readFileSync(join(dir, 'map1.svg'), 'utf8')).toBe(readFileSync(join(dir, 'map2.svg'), 'utf8'));
  });
});

describe('heliochron report', () => {
  it("writes one HTML file carrying the scene file's SHA-256, the version and the command", async () => {
    const out = join(dir, 'report.html');
    const r = await runMain(['report', EXAMPLE, '-o', out]);
    expect(r.code).toBe(0);
    const html = readFileSync(out, 'utf8');
    // SHA-256 (FIPS 180-4) of the file's bytes, through node:crypto independently of the command.
    const sha = createHash('sha256').update(readFileSync(join(ROOT, EXAMPLE))).digest('hex');
    expect(html).toContain(`<code>${sha}</code>`);
    const version = (JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8')) as { version: string }).version;
    expect(html).toContain(`<code>${version}</code>`);
    expect(html).toContain(`<code>heliochron report ${EXAMPLE} -o ${out}</code>`);
    expect(html).toContain('<dt>seed</dt><dd><code>7</code></dd>');
    expect(readdirSync(dir).filter((f) => f.endsWith('.tmp'))).toEqual([]);
  });
  it('refuses a scene file that is not there with exit code 2 and writes nothing', async () => {
    const out = join(dir, 'none.html');
    const r = await runMain(['report', 'examples/no-such-scene.yaml', '-o', out]);
    expect(r.code).toBe(2);
    expect(existsSync(out)).toBe(false);
  });
  it('quotes command-line words that a shell would split', () => {
    expect(shellWord('examples/a.yaml')).toBe('examples/a.yaml');
    expect(shellWord("my scene's file.yaml")).toBe(`'my scene'\\''s file.yaml'`);
    expect(reportCommandLine('a b.yaml', { output: 'r.html', force: true, version: '1' })).toBe("heliochron report 'a b.yaml' -o r.html --force");
  });
});
