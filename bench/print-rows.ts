import type { BenchRow } from './rows';

/** Runs one benchmark alone and prints its rows (the *-main.ts entry points); exits 1 on failure. */
export function printRows(run: () => Promise<BenchRow[]>): void {
  void run().then(
    (rows) => {
      for (const r of rows)
        console.log(
          `${r.name}\n  median ${r.median_ms} ms  p95 ${r.p95_ms} ms  runs ${r.runs}  ${r.target ?? ''}  ${r.extra ?? ''}`,
        );
      process.exit(0);
    },
    (err: unknown) => {
      console.error(err);
      process.exit(1);
    },
  );
}
