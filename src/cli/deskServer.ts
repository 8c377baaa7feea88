/**
 * The desk's local web server: small and dull. It serves the page's own files (built into
 * dist/desk-page by esbuild), the files of ONE folder (the folder of the opened scene or
 * picture), and saves text files into that folder atomically through writeOutputFile.
 *
 * Every request passes `refusal()` first, the one place where all checks are made:
 *   - the Host header must be exactly the loopback address and port the server bound
 *     (a page of another site that a DNS name was pointed at 127.0.0.1 sends its own name);
 *   - the first path segment must be the session token (compared in constant time);
 *   - only GET, HEAD and PUT (PUT only under /files/);
 *   - a file path is decoded once and refused if it has an empty, `.`, `..` or hidden
 *     segment, a backslash, a NUL, or if its real path (symlinks followed) leaves the folder;
 *   - a PUT body larger than its limit is refused (413) before it is read in full.
 * There is no directory listing: a path naming a folder is 404.
 *
 * URL layout (all under the token, so the page's relative URLs carry it):
 *   GET  /TOKEN/                 the page (index.html)
 *   GET  /TOKEN/page/NAME        a file of the page (desk.js, desk.css, worker.js)
 *   GET  /TOKEN/session          JSON: the opened file's name and kind
 *   GET  /TOKEN/files/PATH       a file of the folder
 *   PUT  /TOKEN/files/PATH       save a file (.yaml .yml .json .svg .html .jsonld); `?replace=1` after the user confirmed
 */
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import { existsSync, lstatSync, readFileSync, realpathSync, statSync } from 'node:fs';
import { extname, join, sep } from 'node:path';
import { randomBytes, timingSafeEqual } from 'node:crypto';
import { HeliochronError } from '../errors.js';
import { MAX_SCENE_BYTES } from '../scene/parseSceneText.js';
import { MAX_PICTURE_BYTES } from './pictureFile.js';
import { writeOutputFile } from './io.js';

/** The address the desk binds: loopback only. */
export const DESK_HOST = '127.0.0.1';

/** Largest body of a saved scene file: the scene reader's own limit. */
export const MAX_SCENE_BODY_BYTES = MAX_SCENE_BYTES;
/** Largest body of an exported overlay or report: it may embed the picture (base64, 4/3 of its bytes) plus the drawing. */
export const MAX_EXPORT_BODY_BYTES = Math.ceil((MAX_PICTURE_BYTES * 4) / 3) + 4 * 1024 * 1024;

const SAVE_LIMITS: Readonly<Record<string, number>> = {
  '.yaml': MAX_SCENE_BODY_BYTES,
  '.yml': MAX_SCENE_BODY_BYTES,
  '.json': MAX_SCENE_BODY_BYTES,
  '.svg': MAX_EXPORT_BODY_BYTES,
  '.html': MAX_EXPORT_BODY_BYTES,
  '.jsonld': MAX_SCENE_BODY_BYTES, // the clicked points as Web Annotations: text of the size of a scene file
};

const CONTENT_TYPES: Readonly<Record<string, string>> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.jsonld': 'application/ld+json; charset=utf-8',
  '.yaml': 'text/plain; charset=utf-8',
  '.yml': 'text/plain; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.jpg': 'image/jpeg',
  '.jpeg': 'image/jpeg',
  '.tif': 'image/tiff',
  '.tiff': 'image/tiff',
};

/** Headers on every answer: nothing cached, nothing sniffed, no referrer (the token is in the URL), scripts only from here. */
const COMMON_HEADERS: Readonly<Record<string, string>> = {
  'Cache-Control': 'no-store',
  'X-Content-Type-Options': 'nosniff',
  'Referrer-Policy': 'no-referrer',
  'X-Frame-Options': 'DENY',
  'Content-Security-Policy':
    "default-src 'none'; script-src 'self'; worker-src 'self'; style-src 'self' 'unsafe-inline'; img-src 'self' data: blob:; connect-src 'self'; font-src 'self'; base-uri 'none'; form-action 'none'; frame-ancestors 'none'",
};

export interface DeskServerOptions {
  /** The folder whose files the page may read and save into (absolute). */
  readonly folder: string;
  /** The opened file, relative to the folder, or undefined for an empty desk. */
  readonly openedName?: string;
  readonly openedKind?: 'scene' | 'picture';
  /** The folder holding the built page (index.html, desk.js, ...). */
  readonly pageFolder: string;
  /** Port to bind; 0 = a free one. */
  readonly port: number;
  /** The session token; a random one when absent (tests give their own). */
  readonly token?: string;
}

export interface DeskServer {
  readonly server: Server;
  readonly port: number;
  readonly token: string;
  /** The page's address, with the token. */
  readonly url: string;
  close(): Promise<void>;
}

/** A new random session token: 128 bits, URL-safe. */
export function newSessionToken(): string {
  return randomBytes(16).toString('base64url');
}

interface Refusal {
  readonly status: number;
  readonly message: string;
}

/** What a request asks for, once it has passed the checks. */
type Route =
  | { readonly kind: 'page'; readonly file: string }
  | { readonly kind: 'session' }
  | { readonly kind: 'read'; readonly path: string; readonly name: string }
  | { readonly kind: 'save'; readonly path: string; readonly name: string; readonly limit: number; readonly replace: boolean };

function sameToken(given: string, token: string): boolean {
  const a = Buffer.from(given, 'utf8');
  const b = Buffer.from(token, 'utf8');
  return a.length === b.length && timingSafeEqual(a, b);
}

function isInside(folderReal: string, candidateReal: string): boolean {
  return candidateReal === folderReal || candidateReal.startsWith(folderReal.endsWith(sep) ? folderReal : folderReal + sep);
}

/** Split a file path of the URL into safe segments, or say why not. */
function safeSegments(rawPath: string): string[] | string {
  let decoded: string;
  try {
    decoded = decodeURIComponent(rawPath);
  } catch {
    return 'the path is not valid percent-encoding';
  }
  if (decoded.includes('\0')) return 'the path holds a NUL character';
  if (decoded.includes('\\')) return 'the path holds a backslash';
  const segments = decoded.split('/');
  for (const s of segments) {
    if (s === '' || s === '.' || s === '..') return 'the path has an empty, "." or ".." part';
    if (s.startsWith('.')) return 'hidden files are not served';
  }
  return segments;
}

/**
 * All the checks of a request, in one place. Returns the route it asks for, or a refusal.
 */
function checkRequest(req: IncomingMessage, options: DeskServerOptions, folderReal: string, token: string, port: number): Route | Refusal {
  const method = req.method ?? '';
  if (method !== 'GET' && method !== 'HEAD' && method !== 'PUT') return { status: 405, message: `method ${method} is not used by the desk` };
  if (req.headers.host !== `${DESK_HOST}:${port}`) {
    return { status: 421, message: `the desk answers only requests addressed to ${DESK_HOST}:${port}` };
  }
  // the raw path, split before any normalisation, so that a `..` (plain or encoded) is seen and refused, not folded away
  const rawUrl = req.url ?? '/';
  const query = new URLSearchParams(rawUrl.includes('?') ? rawUrl.slice(rawUrl.indexOf('?') + 1) : '');
  const parts = rawUrl.split('?')[0].split('/');
  // parts[0] is '' (the path begins with '/'); parts[1] is the token
  if (parts.length < 2 || !sameToken(parts[1], token)) return { status: 403, message: 'missing or wrong session token; use the address the desk printed' };
  const rest = parts.slice(2);
  const head = rest[0] ?? '';
  if (method === 'PUT' && head !== 'files') return { status: 405, message: 'only files can be saved' };
  if (rest.length === 0 || (rest.length === 1 && head === '')) return { kind: 'page', file: 'index.html' };
  if (head === 'session' && rest.length === 1) return { kind: 'session' };
  if (head === 'page' && rest.length === 2 && /^[a-z][a-z0-9-]*\.(js|css|html)$/.test(rest[1])) return { kind: 'page', file: rest[1] };
  if (head !== 'files') return { status: 404, message: 'not found' };
  const segments = safeSegments(rest.slice(1).join('/'));
  if (typeof segments === 'string') return { status: 400, message: segments };
  const name = segments.join('/');
  const path = join(folderReal, ...segments);
  if (method === 'PUT') {
    const limit = SAVE_LIMITS[extname(name).toLowerCase()];
    if (limit === undefined) return { status: 400, message: `only ${Object.keys(SAVE_LIMITS).join(' ')} files can be saved` };
    const declared = Number(req.headers['content-length']);
    if (req.headers['content-length'] !== undefined && !(declared <= limit)) {
      return { status: 413, message: `the body is larger than ${limit} bytes allowed for a ${extname(name)} file` };
    }
    // the folder the file goes into must be inside; an existing name must not be a link or a folder
    const parent = join(path, '..');
    if (!existsSync(parent) || !isInside(folderReal, realpathSync(parent))) return { status: 403, message: 'the path leaves the folder of the opened file' };
    if (lstatExists(path)) {
      const st = lstatSync(path);
      if (st.isSymbolicLink()) return { status: 403, message: 'the path is a symbolic link; the desk does not save through links' };
      if (!st.isFile()) return { status: 404, message: 'not found' };
    }
    return { kind: 'save', path, name, limit, replace: query.get('replace') === '1' };
  }
  if (!existsSync(path)) return { status: 404, message: 'not found' };
  if (!isInside(folderReal, realpathSync(path))) return { status: 403, message: 'the path leaves the folder of the opened file' };
  if (!statSync(path).isFile()) return { status: 404, message: 'not found' }; // no directory listing
  return { kind: 'read', path, name };
}

function lstatExists(path: string): boolean {
  try {
    lstatSync(path);
    return true;
  } catch {
    return false;
  }
}

function send(res: ServerResponse, status: number, type: string, body: string | Uint8Array, head: boolean): void {
  res.writeHead(status, { ...COMMON_HEADERS, 'Content-Type': type, 'Content-Length': String(typeof body === 'string' ? Buffer.byteLength(body) : body.length) });
  res.end(head ? undefined : body);
}

function sendJson(res: ServerResponse, status: number, value: unknown, head = false): void {
  send(res, status, 'application/json; charset=utf-8', `${JSON.stringify(value)}\n`, head);
}

/** Read a request body up to `limit` bytes; resolves null (and stops reading) when it is larger. */
function readBody(req: IncomingMessage, limit: number): Promise<Buffer | null> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    let size = 0;
    let over = false;
    req.on('data', (chunk: Buffer) => {
      if (over) return;
      size += chunk.length;
      if (size > limit) {
        over = true;
        resolve(null);
        return;
      }
      chunks.push(chunk);
    });
    req.on('end', () => {
      if (!over) resolve(Buffer.concat(chunks));
    });
    req.on('error', reject);
  });
}

async function handle(req: IncomingMessage, res: ServerResponse, options: DeskServerOptions, folderReal: string, token: string, port: number): Promise<void> {
  const route = checkRequest(req, options, folderReal, token, port);
  const head = req.method === 'HEAD';
  if ('status' in route) {
    req.resume();
    sendJson(res, route.status, { error: route.message }, head);
    if (route.status === 413) req.socket.destroySoon?.();
    return;
  }
  switch (route.kind) {
    case 'page': {
      const file = join(options.pageFolder, route.file);
      if (!existsSync(file)) {
        sendJson(res, 404, { error: route.file === 'index.html' ? 'the desk page is not built: run npm run build' : 'not found' }, head);
        return;
      }
      send(res, 200, CONTENT_TYPES[extname(file)] ?? 'application/octet-stream', readFileSync(file), head);
      return;
    }
    case 'session':
      sendJson(res, 200, { opened: options.openedName ?? null, kind: options.openedKind ?? null }, head);
      return;
    case 'read':
      send(res, 200, CONTENT_TYPES[extname(route.name).toLowerCase()] ?? 'application/octet-stream', readFileSync(route.path), head);
      return;
    case 'save': {
      const body = await readBody(req, route.limit);
      if (body === null) {
        sendJson(res, 413, { error: `the body is larger than ${route.limit} bytes allowed for a ${extname(route.name)} file` });
        req.socket.destroySoon?.();
        return;
      }
      try {
        writeOutputFile(route.path, new Uint8Array(body), { force: route.replace, inputs: [] });
      } catch (error) {
        if (error instanceof HeliochronError && error.kind === 'output') {
          // the page asks the user, then sends ?replace=1
          sendJson(res, 409, { error: `${route.name} exists already`, exists: existsSync(route.path) });
          return;
        }
        throw error;
      }
      sendJson(res, 201, { saved: route.name, bytes: body.length });
      return;
    }
  }
}

/**
 * Start the desk's server on 127.0.0.1 (a free port when options.port is 0).
 * @example const desk = await startDeskServer({ folder, pageFolder, port: 0 }); console.log(desk.url)
 */
export function startDeskServer(options: DeskServerOptions): Promise<DeskServer> {
  const token = options.token ?? newSessionToken();
  const folderReal = realpathSync(options.folder);
  let boundPort = 0;
  const server = createServer((req, res) => {
    handle(req, res, options, folderReal, token, boundPort).catch(() => {
      if (!res.headersSent) sendJson(res, 500, { error: 'the desk could not answer this request' });
      else res.destroy();
    });
  });
  server.headersTimeout = 30_000;
  server.requestTimeout = 120_000;
  return new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port, DESK_HOST, () => {
      server.off('error', reject);
      const address = server.address();
      boundPort = typeof address === 'object' && address ? address.port : options.port;
      resolve({
        server,
        port: boundPort,
        token,
        url: `http://${DESK_HOST}:${boundPort}/${token}/`,
        close: () => new Promise<void>((done) => {
          server.closeAllConnections();
          server.close(() => done());
        }),
      });
    });
  });
}
