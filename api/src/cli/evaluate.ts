/**
 * Offline evaluation of a round from a CSV or xlsx file:
 *   npx tsx api/src/cli/evaluate.ts FILE.csv|FILE.xlsx [--sigma-pt 0.8|3%] [--mode pt|precision] [--format json|table]
 * See parse-args.ts for the options and run-evaluate.ts for what it does.
 */
import { runEvaluate } from './run-evaluate';

void runEvaluate(process.argv.slice(2)).then(({ exitCode, stdout, stderr }) => {
  if (stderr) process.stderr.write(stderr);
  process.stdout.write(stdout, () => {
    process.exitCode = exitCode;
  });
});
