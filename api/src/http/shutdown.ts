import type { Server } from 'node:http';

export interface ShutdownOptions {
  /** Longest wait for in-flight requests before their connections are cut (ms). */
  requestTimeoutMs: number;
  log: (msg: string) => void;
}

/**
 * Graceful shutdown of a listening server: stop accepting connections, let every in-flight
 * request finish (idle keep-alive connections are closed as soon as they are idle; after
 * requestTimeoutMs the rest are cut), then run the `after` steps in order (stop the job queue,
 * which waits for the jobs in progress; close mail; close the database). Calling it again while
 * it runs returns the same promise.
 */
export function gracefulShutdown(
  server: Server,
  after: (() => Promise<void> | void)[],
  o: ShutdownOptions,
): () => Promise<void> {
  let running: Promise<void> | undefined;
  return () =>
    (running ??= (async () => {
      o.log('shutting down: finishing in-flight requests');
      const closed = new Promise<void>((resolve) => server.close(() => resolve()));
      const idle = setInterval(() => server.closeIdleConnections(), 50);
      server.closeIdleConnections();
      let timer: NodeJS.Timeout | undefined;
      const timedOut = new Promise<'timeout'>(
        (resolve) => (timer = setTimeout(() => resolve('timeout'), o.requestTimeoutMs)),
      );
      if ((await Promise.race([closed, timedOut])) === 'timeout') {
        o.log(`requests still open after ${o.requestTimeoutMs} ms: closing their connections`);
        server.closeAllConnections();
        await closed;
      }
      clearInterval(idle);
      clearTimeout(timer);
      for (const step of after) await step();
      o.log('shut down');
    })());
}
