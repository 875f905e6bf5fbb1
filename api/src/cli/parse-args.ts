import type { SigmaPtRule } from '../../../shared/stats/sigma-pt';
import { CliInputError } from './cli-error';

export type EvaluateMode = 'pt' | 'precision';
export type OutputFormat = 'json' | 'table';

export interface EvaluateArgs {
  readonly file: string;
  readonly mode: EvaluateMode;
  readonly format: OutputFormat;
  /** Undefined: σ_pt = s* of the round (the default rule). */
  readonly sigmaPt?: SigmaPtRule;
  readonly help: boolean;
}

export const USAGE = `Usage: evaluate FILE.csv|FILE.xlsx [--sigma-pt 0.8|3%] [--mode pt|precision] [--format json|table]

  Input columns: participant,item,measurand,replicate,value (extra columns such as
  uncertainty,k are allowed). One row per replicate.
  --mode pt         (default) ISO 13528 evaluation: Algorithm A consensus, u(x_pt), z, z′, signal
  --mode precision  ISO 5725-2 precision analysis per item × measurand
  --sigma-pt 0.8    fixed σ_pt in the unit of the measurand; 3% = percent of x_pt;
                    default: the robust SD s* of the round (pt mode only)
  --format json     (default) machine-readable output; table = readable text
Exit codes: 0 ok, 2 bad option or bad input file, 1 unexpected failure.`;

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** Parses `--sigma-pt`: a positive number (fixed σ_pt) or a positive percentage "3%". */
export function parseSigmaPt(text: string): SigmaPtRule {
  const t = text.trim();
  const isPercent = t.endsWith('%');
  const num = isPercent ? t.slice(0, -1).trim() : t;
  const v = NUMBER.test(num) ? Number(num) : NaN;
  if (!(v > 0) || !Number.isFinite(v)) {
    throw new CliInputError(
      `option --sigma-pt: "${text}" is not a positive number or percentage (examples: 0.8, 3%)`,
    );
  }
  return isPercent ? { kind: 'percent', percent: v } : { kind: 'fixed', value: v };
}

/** The value of option `option`, which must be one of `choices`. */
function oneOf<T extends string>(option: string, value: string, choices: readonly T[]): T {
  if (!(choices as readonly string[]).includes(value)) {
    throw new CliInputError(`option ${option}: "${value}" is not one of ${choices.join(', ')}`);
  }
  return value as T;
}

/** Parses the command line (without `node script`). Accepts `--opt value` and `--opt=value`. */
export function parseArgs(argv: readonly string[]): EvaluateArgs {
  let file: string | undefined;
  let mode: EvaluateMode = 'pt';
  let format: OutputFormat = 'json';
  let sigmaPt: SigmaPtRule | undefined;
  let help = false;
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i];
    if (arg === '--help' || arg === '-h') {
      help = true;
      continue;
    }
    if (arg.startsWith('-')) {
      const eq = arg.indexOf('=');
      const name = eq >= 0 ? arg.slice(0, eq) : arg;
      const takeValue = (): string => {
        if (eq >= 0) return arg.slice(eq + 1);
        const next = argv[i + 1];
        if (next === undefined || next.startsWith('--')) {
          throw new CliInputError(`option ${name} needs a value\n\n${USAGE}`);
        }
        i++;
        return next;
      };
      switch (name) {
        case '--mode':
          mode = oneOf(name, takeValue(), ['pt', 'precision']);
          break;
        case '--format':
          format = oneOf(name, takeValue(), ['json', 'table']);
          break;
        case '--sigma-pt':
          sigmaPt = parseSigmaPt(takeValue());
          break;
        default:
          throw new CliInputError(`unknown option ${name}\n\n${USAGE}`);
      }
      continue;
    }
    if (file !== undefined) {
      throw new CliInputError(`only one input file is accepted (got "${file}" and "${arg}")`);
    }
    file = arg;
  }
  if (help) return { file: file ?? '', mode, format, sigmaPt, help };
  if (file === undefined) throw new CliInputError(`no input file given\n\n${USAGE}`);
  if (sigmaPt !== undefined && mode !== 'pt') {
    throw new CliInputError('option --sigma-pt applies to --mode pt only');
  }
  return { file, mode, format, sigmaPt, help };
}
