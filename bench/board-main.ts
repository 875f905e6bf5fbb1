/** Prints the board benchmark alone: `npx tsx bench/board-main.ts`. */
import { benchBoard } from './board';

void benchBoard().then(
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
