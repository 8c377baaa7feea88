/**
 * The page's side of the date solver's worker: one worker at a time, requests numbered, a
 * running request cancelled by ending the worker (a new one starts with the next request).
 */
import type { WorkerReply, WorkerRequestBody } from './workerProtocol.js';

let worker: Worker | null = null;
let nextId = 1;
const pending = new Map<number, { resolve: (r: WorkerReply) => void; onProgress?: (stage: string, fraction: number | null) => void }>();

function ensureWorker(): Worker {
  if (worker) return worker;
  worker = new Worker('page/worker.js', { type: 'module' });
  worker.addEventListener('message', (event: MessageEvent<WorkerReply>) => {
    const reply = event.data;
    const waiting = pending.get(reply.id);
    if (!waiting) return;
    if (reply.kind === 'progress') {
      waiting.onProgress?.(reply.stage, reply.fraction);
      return;
    }
    pending.delete(reply.id);
    waiting.resolve(reply);
  });
  worker.addEventListener('error', (event) => {
    for (const [id, waiting] of pending) waiting.resolve({ id, kind: 'error', message: `the solver stopped: ${event.message}` });
    pending.clear();
    worker?.terminate();
    worker = null;
  });
  return worker;
}

/** Send a request; resolves with the final reply ('cancelled' error when cancelAll ran first). */
export function runInWorker(body: WorkerRequestBody, onProgress?: (stage: string, fraction: number | null) => void): Promise<WorkerReply> {
  const id = nextId++;
  return new Promise((resolve) => {
    pending.set(id, { resolve, onProgress });
    ensureWorker().postMessage({ ...body, id });
  });
}

/** End the worker and everything it was doing. */
export function cancelAll(): void {
  worker?.terminate();
  worker = null;
  for (const [id, waiting] of pending) waiting.resolve({ id, kind: 'error', message: 'cancelled' });
  pending.clear();
}
