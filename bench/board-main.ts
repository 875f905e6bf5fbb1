/** Prints the board benchmark alone: `npx tsx bench/board-main.ts`. */
import { benchBoard } from './board';
import { printRows } from './print-rows';

printRows(benchBoard);
