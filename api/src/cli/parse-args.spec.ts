import { CliInputError } from './cli-error';
import { parseArgs, parseSigmaPt } from './parse-args';

describe('parseArgs', () => {
  it('defaults: pt mode, json, σ_pt from s*', () => {
    expect(parseArgs(['r.csv'])).toEqual({
      file: 'r.csv',
      mode: 'pt',
      format: 'json',
      sigmaPt: undefined,
      help: false,
    });
  });
  it('both option spellings', () => {
    const a = parseArgs(['--format', 'table', 'r.xlsx', '--sigma-pt=0.8']);
    expect(a).toMatchObject({
      file: 'r.xlsx',
      format: 'table',
      sigmaPt: { kind: 'fixed', value: 0.8 },
    });
  });
  it('σ_pt percentages and bad values', () => {
    expect(parseSigmaPt('3%')).toEqual({ kind: 'percent', percent: 3 });
    expect(parseSigmaPt(' 2.5 % ')).toEqual({ kind: 'percent', percent: 2.5 });
    for (const bad of ['0', '-1', 'abc', '%', '1e999'])
      expect(() => parseSigmaPt(bad)).toThrow(CliInputError);
  });
  it('a missing option value, two files and unknown options fail', () => {
    expect(() => parseArgs(['r.csv', '--mode'])).toThrow(/needs a value/);
    expect(() => parseArgs(['a.csv', 'b.csv'])).toThrow(/only one input file/);
    expect(() => parseArgs(['a.csv', '-x'])).toThrow(/unknown option -x/);
  });
});
