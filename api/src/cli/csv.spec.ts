import { parseCsv } from './csv';

describe('parseCsv (RFC 4180)', () => {
  it('handles quotes, escaped quotes, CRLF, BOM, blank lines and line numbers', () => {
    const text = '\ufeffa,b,c\r\n"x, y","say ""hi""",3\r\n\r\n"multi\nline",,5\n';
    expect(parseCsv(text)).toEqual([
      { line: 1, fields: ['a', 'b', 'c'] },
      { line: 2, fields: ['x, y', 'say "hi"', '3'] },
      { line: 4, fields: ['multi\nline', '', '5'] },
    ]);
  });
  it('last line without newline, and an unclosed quote fails', () => {
    expect(parseCsv('a\n1')).toEqual([
      { line: 1, fields: ['a'] },
      { line: 2, fields: ['1'] },
    ]);
    expect(() => parseCsv('a\n"1')).toThrow(/line 2/);
  });
});
