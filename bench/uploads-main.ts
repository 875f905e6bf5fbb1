/** Prints the upload benchmark alone: `npx tsx bench/uploads-main.ts`. */
import { benchUploads } from './uploads';
import { printRows } from './print-rows';

printRows(benchUploads);
