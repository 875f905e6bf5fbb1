import { CorrelationCsvError, parseCorrelationCsv } from './correlation-csv';

describe('parseCorrelationCsv', () => {
  it('comma-separated with header', () => {
    const r = parseCorrelationCsv('lag time (s),g2-1\n1e-6,0.80\n2e-6,0.75\n4.5E-06,0.7\n');
    expect(r.header).toBe('lag time (s),g2-1');
    expect(r.lagTimesS).toEqual([1e-6, 2e-6, 4.5e-6]);
    expect(r.g2Minus1).toEqual([0.8, 0.75, 0.7]);
  });

  it('semicolon with decimal comma, no header, CRLF, BOM, comments and blank lines', () => {
    const r = parseCorrelationCsv('\uFEFF# exported\r\n1,0E-06;0,80\r\n\r\n2,0E-06;0,75\r\n');
    expect(r.header).toBeNull();
    expect(r.lagTimesS).toEqual([1e-6, 2e-6]);
    expect(r.g2Minus1).toEqual([0.8, 0.75]);
  });

  it('tab-separated, negative baseline values allowed', () => {
    const r = parseCorrelationCsv('tau\tg\n0.001\t0.01\n0.002\t-0.002\n');
    expect(r.g2Minus1).toEqual([0.01, -0.002]);
  });

  it('errors name the line', () => {
    expect(() => parseCorrelationCsv('1e-6,0.8\n2e-6,0.7,9\n')).toThrow(
      'line 2: expected 2 columns',
    );
    expect(() => parseCorrelationCsv('tau,g\n1e-6,0.8\n2e-6,abc\n')).toThrow(
      'line 3: g2 − 1 value "abc" is not a number',
    );
    expect(() => parseCorrelationCsv('1e-6,0.8\n1e-6,0.7\n')).toThrow(
      'line 2: lag times must increase',
    );
    expect(() => parseCorrelationCsv('-1e-6,0.8\n')).toThrow(
      'line 1: lag time must be a finite number ≥ 0 s',
    );
    expect(() => parseCorrelationCsv('x,0.8\n')).toThrow('line 1: lag time "x" is not a number');
    expect(() => parseCorrelationCsv('tau,g\n\n')).toThrow(/no data rows/);
    try {
      parseCorrelationCsv('tau;g\n1e-6;0.8\n2e-6\n');
    } catch (e) {
      expect(e).toBeInstanceOf(CorrelationCsvError);
      expect((e as CorrelationCsvError).line).toBe(3);
    }
    expect.assertions(8);
  });
});
