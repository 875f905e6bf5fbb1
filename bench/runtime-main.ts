/** Prints the compiled-server benchmark alone: `npx tsx bench/runtime-main.ts`. */
import { benchRuntime } from './runtime';

void benchRuntime().then(
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
