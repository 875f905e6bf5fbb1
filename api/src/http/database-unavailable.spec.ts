import { isDatabaseUnavailable } from './errors';

/** Which errors count as "the database cannot be reached" (503) rather than a fault (500). */
describe('isDatabaseUnavailable', () => {
  // SQLSTATE codes: PostgreSQL documentation, Appendix A "PostgreSQL Error Codes".
  it.each([
    [
      'refused connection',
      Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:5432'), { code: 'ECONNREFUSED' }),
    ],
    ['dropped connection', new Error('Connection terminated unexpectedly')],
    ['pool timeout', new Error('timeout exceeded when trying to connect')],
    [
      'server shutting down (57P01) inside a TypeORM QueryFailedError',
      {
        message: 'terminating connection due to administrator command',
        driverError: { code: '57P01' },
      },
    ],
    [
      'server starting up (57P03)',
      { message: 'the database system is starting up', code: '57P03' },
    ],
    ['too many connections (53300)', { message: 'sorry, too many clients already', code: '53300' }],
    ['connection exception class 08 (08006)', { message: 'connection failure', code: '08006' }],
    [
      'both addresses refused (AggregateError)',
      Object.assign(
        new AggregateError([Object.assign(new Error('x'), { code: 'ECONNREFUSED' })], ''),
        {},
      ),
    ],
    [
      'wrapped as a cause',
      new Error('session store failed', {
        cause: Object.assign(new Error('x'), { code: 'ECONNRESET' }),
      }),
    ],
  ])('%s → unavailable', (_name, err) => {
    expect(isDatabaseUnavailable(err)).toBe(true);
  });

  it.each([
    [
      'unique violation (23505)',
      {
        message: 'duplicate key value violates unique constraint',
        code: '23505',
        driverError: { code: '23505' },
      },
    ],
    [
      'append-only trigger (P0001)',
      { message: 'a submitted version of results is immutable', code: 'P0001' },
    ],
    ['permission denied (42501)', { message: 'permission denied for table round', code: '42501' }],
    ['a plain bug', new TypeError('Cannot read properties of undefined')],
    ['nothing', undefined],
  ])('%s → not unavailable', (_name, err) => {
    expect(isDatabaseUnavailable(err)).toBe(false);
  });
});
