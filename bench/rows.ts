import type { ChildProcess } from 'node:child_process';

/** One row of the `npm run bench` table. */
export interface BenchRow {
  name: string;
  median_ms: number;
  p95_ms: number;
  runs: number;
  target?: string;
  extra?: string;
}

/** Ends a bench's server process if it still runs (its exit is expected now) and gives it a moment to let go. */
export async function stopServer(child: ChildProcess | undefined): Promise<void> {
  if (child && child.exitCode === null) {
    child.removeAllListeners('exit');
    child.kill('SIGTERM');
    await new Promise((r) => setTimeout(r, 300));
  }
}
