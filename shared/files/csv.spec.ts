import { readCsv } from './csv';

describe('readCsv (RFC 4180 quoting through papaparse)', () => {
  it('handles quotes, escaped quotes, CRLF, BOM, blank lines and line numbers', () => {
    const text = '\ufeffa,b,c\r\n"x, y","say ""hi""",3\r\n\r\n"multi\nline",,5\n';
    expect(readCsv(text)).toEqual([
      { line: 1, fields: ['a', 'b', 'c'] },
      { line: 2, fields: ['x, y', 'say "hi"', '3'] },
      { line: 4, fields: ['multi\nline', '', '5'] },
    ]);
  });
  it('last line without newline, and an unclosed quote fails', () => {
    expect(readCsv('a\n1')).toEqual([
      { line: 1, fields: ['a'] },
      { line: 2, fields: ['1'] },
    ]);
    expect(() => readCsv('a\n"1')).toThrow(/line 2/);
  });
  it('mixes line ends, skips comment lines and keeps their line numbers, trims when asked', () => {
    expect(
      readCsv('# note "x\rt;g\n 1 ; 2 \r\n\n# c\n3;4', {
        delimiter: ';',
        comment: '#',
        trim: true,
      }),
    ).toEqual([
      { line: 2, fields: ['t', 'g'] },
      { line: 3, fields: ['1', '2'] },
      { line: 6, fields: ['3', '4'] },
    ]);
  });
});

describe('readCsv without any quote character (split directly)', () => {
  it('gives the records papaparse gives: blank lines skipped, line numbers, trim, comments', () => {
    const text = '\ufeffa,b\r\n1, 2\r\n\r\n  \n# c\n3,\n';
    const expected = [
      { line: 1, fields: ['a', 'b'] },
      { line: 2, fields: ['1', '2'] },
      { line: 6, fields: ['3', ''] },
    ];
    expect(readCsv(text, { trim: true, comment: '#' })).toEqual(expected);
    // the same text with one quoted field goes through papaparse and reads the same
    expect(readCsv(text.replace('a,', '"a",'), { trim: true, comment: '#' })).toEqual(expected);
    expect(readCsv('x;y\n1;2', { delimiter: ';' })).toEqual([
      { line: 1, fields: ['x', 'y'] },
      { line: 2, fields: ['1', '2'] },
    ]);
  });
});
