/** Prints the compiled-server benchmark alone: `npx tsx bench/runtime-main.ts`. */
import { benchRuntime } from './runtime';
import { printRows } from './print-rows';

printRows(benchRuntime);
