/**
 * The desk's conversation with its server (src/cli/deskServer.ts): the session, reading a file
 * of the opened folder, saving one (atomically; an existing file only after the user
 * confirmed). All URLs are relative to the page's address, which carries the session token.
 */
export interface Session {
  readonly opened: string | null;
  readonly kind: 'scene' | 'picture' | null;
}

export class DeskRequestError extends Error {}

export async function fetchSession(): Promise<Session> {
  const r = await fetch('session', { cache: 'no-store' });
  if (!r.ok) throw new DeskRequestError(`the desk's server did not answer (${r.status})`);
  return (await r.json()) as Session;
}

function fileUrl(name: string): string {
  return `files/${name.split('/').map(encodeURIComponent).join('/')}`;
}

export async function readFolderFile(name: string): Promise<Uint8Array> {
  const r = await fetch(fileUrl(name), { cache: 'no-store' });
  if (!r.ok) {
    const body = (await r.json().catch(() => ({}))) as { error?: string };
    throw new DeskRequestError(`${name}: ${body.error ?? `the server answered ${r.status}`}`);
  }
  return new Uint8Array(await r.arrayBuffer());
}

/** What a save did: written, or not written because the file exists and the user has not confirmed. */
export type SaveOutcome = 'saved' | 'exists';

export async function saveFolderFile(name: string, content: string, replace: boolean): Promise<SaveOutcome> {
  const r = await fetch(`${fileUrl(name)}${replace ? '?replace=1' : ''}`, { method: 'PUT', body: content, headers: { 'Content-Type': 'text/plain; charset=utf-8' } });
  if (r.status === 409) return 'exists';
  if (!r.ok) {
    const body = (await r.json().catch(() => ({}))) as { error?: string };
    throw new DeskRequestError(`${name} was not saved: ${body.error ?? `the server answered ${r.status}`}`);
  }
  return 'saved';
}

/**
 * Save a file of the folder; when it exists already, ask the user once and replace it only
 * when they say so. True when the file was written.
 */
export async function saveAskingFirst(name: string, content: string): Promise<boolean> {
  if ((await saveFolderFile(name, content, false)) === 'saved') return true;
  if (!window.confirm(`${name} exists already in this folder. Replace it?`)) return false;
  return (await saveFolderFile(name, content, true)) === 'saved';
}
