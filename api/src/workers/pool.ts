import { extname, join } from 'node:path';
import { Worker, type ResourceLimits } from 'node:worker_threads';
import { formatBytes, UPLOAD_WORK_TIMEOUT_MS } from '../../../shared/contracts/upload-limits';
import { HttpError } from '../http/errors';
import type { FileJob } from './file-jobs';

/**
 * The upload workers: heavy work on an uploaded file (unpacking and reading a workbook, parsing a
 * correlation CSV) runs in a worker thread, never on the server's event loop. At most
 * UPLOAD_WORKERS threads run at once, each with a heap limit and a time limit; a thread that passes
 * either is ended, its request answers 413/422, and the server goes on. Further jobs wait in a short
 * queue (503 when it is full). An idle thread ends after IDLE_MS.
 */

/** Threads at once (the machine's cores are for requests first). */
export const UPLOAD_WORKERS = 2;
/** Jobs that may wait for a thread before further uploads answer 503. */
export const UPLOAD_QUEUE = 8;
/** Each thread's memory limits (V8 heap; the file's bytes and native buffers come on top). */
export const UPLOAD_WORKER_LIMITS: ResourceLimits = {
  maxOldGenerationSizeMb: 192,
  maxYoungGenerationSizeMb: 32,
};
const IDLE_MS = 30_000;

interface Slot {
  worker: Worker;
  busy: boolean;
  dead: boolean;
  idleTimer?: NodeJS.Timeout;
  /** The job in flight: settles on its answer, the thread's death or the time limit. */
  pending?: { id: number; resolve: (v: unknown) => void; reject: (e: unknown) => void };
}

const slots: Slot[] = [];
const waiting: (() => void)[] = [];
let nextId = 1;

/** The worker's entry: the .ts source through tsx's require hook when running from source. */
function spawnWorker(): Worker {
  const ext = extname(__filename);
  const entry = join(__dirname, `file-worker${ext}`);
  // Resolved here, so the thread finds tsx whatever the working directory.
  const code =
    ext === '.ts'
      ? `require(${JSON.stringify(require.resolve('tsx/cjs/api'))}).register(); require(${JSON.stringify(entry)});`
      : `require(${JSON.stringify(entry)});`;
  return new Worker(code, { eval: true, execArgv: [], resourceLimits: UPLOAD_WORKER_LIMITS });
}

function spawn(): Slot {
  const slot: Slot = { worker: spawnWorker(), busy: false, dead: false };
  const die = (err: unknown) => {
    const p = slot.pending;
    slot.pending = undefined;
    retire(slot);
    p?.reject(err);
  };
  slot.worker.on(
    'message',
    (msg: {
      id?: number;
      ok?: boolean;
      result?: unknown;
      refusal?: { status: number; code: string; message: string; details?: unknown };
    }) => {
      if (msg.id === undefined || msg.id !== slot.pending?.id) return;
      const p = slot.pending;
      slot.pending = undefined;
      if (msg.ok) p.resolve(msg.result);
      else
        p.reject(
          new HttpError(
            msg.refusal!.status,
            msg.refusal!.code,
            msg.refusal!.message,
            msg.refusal!.details,
          ),
        );
    },
  );
  slot.worker.on('error', (err: Error & { code?: string }) => die(err));
  slot.worker.on('exit', () => die(new Error('the upload worker stopped')));
  slots.push(slot);
  return slot;
}

/** Takes a thread out of the pool (it died, or is being ended) and lets a waiting job go on. */
function retire(slot: Slot): void {
  if (slot.dead) return;
  slot.dead = true;
  clearTimeout(slot.idleTimer);
  slots.splice(slots.indexOf(slot), 1);
  wake();
}

function wake(): void {
  waiting.shift()?.();
}

async function acquire(): Promise<Slot> {
  for (;;) {
    const idle = slots.find((s) => !s.busy && !s.dead);
    if (idle) {
      clearTimeout(idle.idleTimer);
      idle.busy = true;
      idle.worker.ref();
      return idle;
    }
    if (slots.length < UPLOAD_WORKERS) {
      const s = spawn();
      s.busy = true;
      return s;
    }
    if (waiting.length >= UPLOAD_QUEUE) {
      throw new HttpError(
        503,
        'uploads_busy',
        'Many files are being read right now. Try the upload again in a minute.',
      );
    }
    await new Promise<void>((resolve) => waiting.push(resolve));
  }
}

function release(slot: Slot): void {
  if (slot.dead) return;
  slot.busy = false;
  slot.worker.unref();
  slot.idleTimer = setTimeout(() => {
    retire(slot);
    void slot.worker.terminate();
  }, IDLE_MS);
  slot.idleTimer.unref();
  wake();
}

/**
 * Runs one job in an upload worker. `label` names the file in the messages ("results workbook").
 * Refusals from the job keep their status (413 limit passed, 422 unreadable); a thread that runs
 * out of memory answers 413 and one that runs out of time 422.
 */
export async function runInWorker<T>(
  job: FileJob,
  label: string,
  timeoutMs = UPLOAD_WORK_TIMEOUT_MS,
): Promise<T> {
  const slot = await acquire();
  const id = nextId++;
  let timer: NodeJS.Timeout | undefined;
  try {
    return (await new Promise<unknown>((resolve, reject) => {
      slot.pending = { id, resolve, reject };
      timer = setTimeout(() => {
        reject(
          new HttpError(
            422,
            'file_too_complex',
            `file: reading the ${label} took longer than ${Math.round(timeoutMs / 1000)} s; send a smaller or simpler file.`,
            [{ path: 'file', message: 'Took too long to read.' }],
          ),
        );
        slot.pending = undefined;
        retire(slot);
        void slot.worker.terminate();
      }, timeoutMs);
      const data = 'data' in job ? job.data : null;
      slot.worker.postMessage({ id, job }, data ? [data.buffer as ArrayBuffer] : []);
    }).catch((err: unknown) => {
      if (err instanceof HttpError) throw err;
      const code = (err as { code?: string }).code;
      if (code === 'ERR_WORKER_OUT_OF_MEMORY') {
        const mb = (UPLOAD_WORKER_LIMITS.maxOldGenerationSizeMb ?? 0) * 1024 * 1024;
        throw new HttpError(
          413,
          'file_too_complex',
          `file: reading the ${label} needs more than ${formatBytes(mb)} of memory; send a smaller file.`,
          [{ path: 'file', message: 'Too large to read.' }],
        );
      }
      throw new HttpError(422, 'file_unreadable', `file: the ${label} could not be read.`, [
        { path: 'file', message: 'Could not be read.' },
      ]);
    })) as T;
  } finally {
    clearTimeout(timer);
    release(slot);
  }
}

/** A copy of the bytes that can be handed to a worker (transferred, not copied again). */
export function transferable(buf: Buffer): Uint8Array {
  // ArrayBuffer.slice is one memcpy; `new Uint8Array(buffer)` copies element by element (seconds for 20 MB).
  return new Uint8Array(
    buf.buffer.slice(buf.byteOffset, buf.byteOffset + buf.byteLength) as ArrayBuffer,
  );
}

/**
 * The bytes for a worker without copying them when the Buffer owns its whole memory (as a large
 * upload's does): the memory moves to the worker and `buf` is empty afterwards, so the caller must
 * use the bytes the job hands back. A pooled (small) Buffer is copied.
 */
export function handOver(buf: Buffer): Uint8Array {
  return buf.byteOffset === 0 && buf.byteLength === buf.buffer.byteLength && buf.byteLength > 0
    ? new Uint8Array(buf.buffer, 0, buf.byteLength)
    : transferable(buf);
}

/** Ends every upload worker (tests, shutdown). */
export async function closeUploadWorkers(): Promise<void> {
  await Promise.all(slots.map((s) => s.worker.terminate()));
}

/** The running threads' resource limits, as Node reports them (tests assert the bound). */
export function uploadWorkerCount(): number {
  return slots.length;
}
