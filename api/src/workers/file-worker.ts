import { parentPort } from 'node:worker_threads';
import { runJob, type FileJob } from './file-jobs';
import { FileRefusal } from './refusal';

/**
 * The upload worker thread: runs one file job at a time for the server (pool.ts) and answers
 * `{ id, ok, result }` or `{ id, ok: false, refusal }`. Started with resourceLimits, so a file that
 * needs more memory ends this thread, never the server.
 */
parentPort!.on('message', (msg: { id: number; job: FileJob }) => {
  runJob(msg.job).then(
    (result) => {
      const bytes = (result as { bytes?: unknown } | null)?.bytes;
      parentPort!.postMessage(
        { id: msg.id, ok: true, result },
        bytes instanceof Uint8Array ? [bytes.buffer as ArrayBuffer] : [],
      );
    },
    (err: unknown) => {
      const refusal =
        err instanceof FileRefusal
          ? err.toJSON()
          : {
              status: 422,
              code: 'file_unreadable',
              message: `file: the file could not be read (${err instanceof Error ? err.message : String(err)}).`,
            };
      parentPort!.postMessage({ id: msg.id, ok: false, refusal });
    },
  );
});
parentPort!.postMessage({ ready: true });
