/** Prints the engine growth benchmark alone: `npx tsx bench/engine-scaling-main.ts`. */
import { benchEngineScaling } from './engine-scaling';
import { printRows } from './print-rows';

printRows(() => Promise.resolve(benchEngineScaling()));
