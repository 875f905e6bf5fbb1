import type { BenchIssue, BenchWarning } from '@ringlet/shared/bench/submission-checks';
import type { InstrumentCheck } from '@ringlet/shared/contracts/bench';
import type { SubmissionData } from '@ringlet/shared/contracts/submission';
import { checkNoticeFor, latestCheckFor, submitBlocker, withVersion } from './submit-rules';

const check = (instrument: string, passed: boolean, checkedAt: string) =>
  ({ instrument, checkedAt, verdict: { passed } }) as unknown as InstrumentCheck;
const withInstruments = (...names: string[]) =>
  ({
    items: names.map((instrument) => ({ conditions: { instrument } })),
  }) as unknown as SubmissionData;

// Newest first, as the bench service lists them.
const checks = [
  check('Sizer B', false, '2026-03-02T09:00:00Z'),
  check('Sizer A', true, '2026-03-01T09:00:00Z'),
];

describe('the instrument check beside the results', () => {
  it('is the newest check of an instrument the results name (case and spaces aside)', () => {
    expect(latestCheckFor(withInstruments(' sizer a '), checks)?.instrument).toBe('Sizer A');
    expect(checkNoticeFor(withInstruments('Sizer A'), checks)).toBeNull();
  });
  it('is the lab newest check while no instrument is named', () => {
    expect(latestCheckFor(withInstruments(''), checks)?.instrument).toBe('Sizer B');
    expect(checkNoticeFor(null, checks)).toContain('(Sizer B) failed');
  });
  it('is missing when the named instrument has no check, or the lab has none', () => {
    expect(latestCheckFor(withInstruments('Sizer C'), checks)).toBeNull();
    expect(checkNoticeFor(withInstruments('Sizer C'), checks)).toContain(
      'No instrument check is recorded',
    );
    expect(checkNoticeFor(null, [])).toContain('No instrument check is recorded');
  });
});

describe('submitBlocker', () => {
  const none = { errors: [], unacknowledged: [] };
  const warning: BenchWarning = {
    code: 'w1',
    kind: 'blunder',
    path: 'items.0.results.0',
    message: 'Far from the others',
  };
  it('names the first blocking error before anything else', () => {
    const full: { errors: BenchIssue[]; unacknowledged: BenchWarning[] } = {
      errors: [
        { path: 'items.0', code: 'missing-replicate', message: 'Replicate 1 is missing.' },
        { path: 'items.1', code: 'missing-item', message: 'Second' },
      ],
      unacknowledged: [warning],
    };
    expect(submitBlocker(full, 'notice', '')).toBe('Replicate 1 is missing.');
  });
  it('asks to acknowledge the open warnings', () => {
    expect(submitBlocker({ errors: [], unacknowledged: [warning, warning] }, null, '')).toBe(
      'Acknowledge 2 warning(s) first.',
    );
  });
  it('needs an explanation when the instrument check is missing or failed', () => {
    expect(submitBlocker(none, 'Explain why.', '   ')).toBe('Explain why.');
    expect(submitBlocker(none, 'Explain why.', 'The sizer was serviced.')).toBeNull();
    expect(submitBlocker(none, null, '')).toBeNull();
  });
});

describe('withVersion', () => {
  it('puts a new version in front, once', () => {
    const v1 = { version: 1 };
    const v2 = { version: 2 };
    expect(withVersion([v1], v2)).toEqual([v2, v1]);
    expect(withVersion([v2, v1], { version: 2 })).toEqual([v2, v1]);
  });
});
