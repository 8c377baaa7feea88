import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { request } from 'node:http';
import { mkdirSync, mkdtempSync, readFileSync, readdirSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { MAX_SCENE_BODY_BYTES, startDeskServer, type DeskServer } from '../../src/cli/deskServer.js';
import { main } from '../../src/cli/main.js';
import type { CliIo } from '../../src/cli/io.js';

// The desk's server refuses everything it does not need (issue 10, "Safety"): a wrong Host
// header, a missing or wrong token, `..` paths, a symlink out of the folder, an oversized body,
// methods it does not use, directory listings; and saves only atomically, never over a file
// without the user's confirmation.

const TOKEN = 'test-token-0123456789abcdef';
let root: string;
let folder: string;
let page: string;
let desk: DeskServer;

interface Answer {
  readonly status: number;
  readonly body: string;
  readonly headers: Record<string, string | string[] | undefined>;
}

function ask(method: string, path: string, options: { host?: string; body?: string | Buffer; headers?: Record<string, string> } = {}): Promise<Answer> {
  return new Promise((resolve, reject) => {
    const req = request(
      { host: '127.0.0.1', port: desk.port, method, path, headers: { Host: options.host ?? `127.0.0.1:${desk.port}`, ...options.headers } },
      (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, body: Buffer.concat(chunks).toString('utf8'), headers: res.headers }));
      },
    );
    req.on('error', (error: NodeJS.ErrnoException) => {
      // the server may close the socket while a refused oversized body is still being sent
      if (error.code === 'EPIPE' || error.code === 'ECONNRESET') resolve({ status: -1, body: '', headers: {} });
      else reject(error);
    });
    if (options.body !== undefined) req.write(options.body);
    req.end();
  });
}

beforeAll(async () => {
  root = mkdtempSync(join(tmpdir(), 'heliochron-desk-'));
  folder = join(root, 'work');
  page = join(root, 'page');
  mkdirSync(folder);
  mkdirSync(page);
  mkdirSync(join(folder, 'sub'));
  writeFileSync(join(page, 'index.html'), '<!doctype html><title>desk</title>');
  writeFileSync(join(page, 'desk.js'), 'export {};');
  writeFileSync(join(folder, 'scene.yaml'), 'heliochron: 1\n');
  writeFileSync(join(folder, 'sub', 'inner.yaml'), 'inner\n');
  writeFileSync(join(root, 'secret.txt'), 'outside the folder');
  symlinkSync(join(root, 'secret.txt'), join(folder, 'link-out.yaml'));
  symlinkSync(root, join(folder, 'dir-out'));
  desk = await startDeskServer({ folder, openedName: 'scene.yaml', openedKind: 'scene', pageFolder: page, port: 0, token: TOKEN });
});

afterAll(async () => {
  await desk.close();
  rmSync(root, { recursive: true, force: true });
});

describe('the desk server answers its own page and folder', () => {
  it('binds 127.0.0.1 and gives the address with the token', () => {
    expect(desk.url).toBe(`http://127.0.0.1:${desk.port}/${TOKEN}/`);
    expect(desk.port).toBeGreaterThan(0);
  });

  it('serves the page, the session and a file of the folder with the token and the right Host', async () => {
    const index = await ask('GET', `/${TOKEN}/`);
    expect(index.status).toBe(200);
    expect(index.body).toContain('<title>desk</title>');
    expect(index.headers['content-security-policy']).toContain("default-src 'none'");
    expect((await ask('GET', `/${TOKEN}/page/desk.js`)).status).toBe(200);
    const session = await ask('GET', `/${TOKEN}/session`);
    expect(JSON.parse(session.body)).toEqual({ opened: 'scene.yaml', kind: 'scene' });
    const file = await ask('GET', `/${TOKEN}/files/scene.yaml`);
    expect(file.status).toBe(200);
    expect(file.body).toBe('heliochron: 1\n');
    expect((await ask('GET', `/${TOKEN}/files/sub/inner.yaml`)).body).toBe('inner\n');
  });
});

describe('refusals', () => {
  it('refuses a wrong Host header (another name, another port, localhost)', async () => {
    for (const host of ['evil.example:80', `127.0.0.1:${desk.port + 1}`, `localhost:${desk.port}`, 'rebound.example']) {
      const answer = await ask('GET', `/${TOKEN}/files/scene.yaml`, { host });
      expect(answer.status, host).toBe(421);
      expect(answer.body).not.toContain('heliochron: 1');
    }
  });

  it('refuses a missing or wrong token', async () => {
    for (const path of ['/', '/files/scene.yaml', `/${TOKEN.slice(0, -1)}x/files/scene.yaml`, `/${TOKEN}x/`, '/session']) {
      const answer = await ask('GET', path);
      expect(answer.status, path).toBe(403);
      expect(answer.body).not.toContain('heliochron: 1');
    }
  });

  it('refuses ".." paths, encoded or not, and hidden files', async () => {
    for (const path of [
      `/${TOKEN}/files/../../secret.txt`,
      `/${TOKEN}/files/%2e%2e/secret.txt`,
      `/${TOKEN}/files/sub/%2E%2E/%2E%2E/secret.txt`,
      `/${TOKEN}/files/..%2fsecret.txt`,
      `/${TOKEN}/files/sub%5c..%5c..%5csecret.txt`,
      `/${TOKEN}/files/.hidden.yaml`,
    ]) {
      const answer = await ask('GET', path);
      expect([400, 403, 404], path).toContain(answer.status);
      expect(answer.body).not.toContain('outside the folder');
    }
    // refused as such, plain or encoded, before any normalisation could fold them away
    expect((await ask('GET', `/${TOKEN}/files/../../secret.txt`)).status).toBe(400);
    expect((await ask('GET', `/${TOKEN}/files/%2e%2e/secret.txt`)).status).toBe(400);
    expect((await ask('GET', `/${TOKEN}/files/..%2fsecret.txt`)).status).toBe(400);
  });

  it('refuses a symlink out of the folder, for reading and for saving', async () => {
    const read = await ask('GET', `/${TOKEN}/files/link-out.yaml`);
    expect(read.status).toBe(403);
    expect(read.body).not.toContain('outside the folder');
    expect((await ask('GET', `/${TOKEN}/files/dir-out/secret.txt`)).status).toBe(403);
    const save = await ask('PUT', `/${TOKEN}/files/link-out.yaml?replace=1`, { body: 'overwritten' });
    expect(save.status).toBe(403);
    const saveThrough = await ask('PUT', `/${TOKEN}/files/dir-out/new.yaml`, { body: 'escaped' });
    expect(saveThrough.status).toBe(403);
    expect(readFileSync(join(root, 'secret.txt'), 'utf8')).toBe('outside the folder');
    expect(readdirSync(root).sort()).toEqual(['page', 'secret.txt', 'work']);
  });

  it('refuses an oversized body, declared or sent, and writes nothing', async () => {
    const big = Buffer.alloc(MAX_SCENE_BODY_BYTES + 1, 0x61);
    const declared = await ask('PUT', `/${TOKEN}/files/big.yaml`, { body: big });
    expect([413, -1]).toContain(declared.status);
    const chunked = await ask('PUT', `/${TOKEN}/files/big2.yaml`, { body: big, headers: { 'Transfer-Encoding': 'chunked' } });
    expect([413, -1]).toContain(chunked.status);
    expect(readdirSync(folder).filter((n) => n.startsWith('big') || n.endsWith('.tmp'))).toEqual([]);
  });

  it('refuses methods it does not use, PUT outside files/ and saving other kinds of file', async () => {
    for (const method of ['POST', 'DELETE', 'PATCH', 'OPTIONS']) {
      expect((await ask(method, `/${TOKEN}/files/scene.yaml`)).status, method).toBe(405);
    }
    expect((await ask('PUT', `/${TOKEN}/page/desk.js`, { body: 'x' })).status).toBe(405);
    expect((await ask('PUT', `/${TOKEN}/files/run.sh`, { body: 'x' })).status).toBe(400);
  });

  it('gives no directory listing', async () => {
    for (const path of [`/${TOKEN}/files/sub`, `/${TOKEN}/files/sub/`, `/${TOKEN}/page/`, `/${TOKEN}/files/`]) {
      const answer = await ask('GET', path);
      expect([400, 404], path).toContain(answer.status);
      expect(answer.body).not.toContain('inner.yaml');
    }
  });
});

describe('saving', () => {
  it('saves a new file atomically and refuses an existing one until replace=1 is sent', async () => {
    const first = await ask('PUT', `/${TOKEN}/files/saved.yaml`, { body: 'title: one\n' });
    expect(first.status).toBe(201);
    expect(readFileSync(join(folder, 'saved.yaml'), 'utf8')).toBe('title: one\n');
    const again = await ask('PUT', `/${TOKEN}/files/saved.yaml`, { body: 'title: two\n' });
    expect(again.status).toBe(409);
    expect(readFileSync(join(folder, 'saved.yaml'), 'utf8')).toBe('title: one\n');
    const confirmed = await ask('PUT', `/${TOKEN}/files/saved.yaml?replace=1`, { body: 'title: two\n' });
    expect(confirmed.status).toBe(201);
    expect(readFileSync(join(folder, 'saved.yaml'), 'utf8')).toBe('title: two\n');
    expect(readdirSync(folder).filter((n) => n.endsWith('.tmp'))).toEqual([]);
  });
});

describe('the desk command', () => {
  it('prints the address with a token first, and refuses a bad port or a file of another kind with exit 2', async () => {
    const out: string[] = [];
    const err: string[] = [];
    const io: CliIo = { out: (t) => out.push(t), err: (t) => err.push(t), errIsTerminal: false, cwd: folder };
    let stop!: () => void;
    const stopped = new Promise<void>((done) => { stop = done; });
    const { run } = await import('../../src/cli/deskCommand.js');
    const running = run(['scene.yaml'], { open: false }, io, stopped);
    for (let i = 0; i < 200 && out.length === 0; i += 1) await new Promise((r) => setTimeout(r, 10));
    expect(out[0]).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/[A-Za-z0-9_-]{22}\/\n$/);
    stop();
    await running;

    expect(await main(['desk', 'scene.yaml', '--port', '70000'], io)).toBe(2);
    expect(err.join('')).toContain('--port: "70000" is not allowed');
    expect(await main(['desk', 'notes.txt'], io)).toBe(2);
    expect(err.join('')).toContain('file: "notes.txt" is not allowed');
    expect(await main(['desk', 'missing.yaml'], io)).toBe(2);
  });
});
