import { demoRounds } from './demo-scenario';

describe('demo scenario dates follow the clock at seeding time', () => {
  it.each(['2026-12-02T08:00:00Z', '2027-01-10T12:00:00Z', '2031-07-01T00:00:00Z'])(
    'today %s: the past lies in the past',
    (today) => {
      const now = new Date(today);
      const rounds = demoRounds(now);
      const due = (story: string) =>
        new Date(rounds.find((r) => r.story === story)!.dueAt).getTime();
      // the collecting round is due in about two weeks; the published ones before today, oldest first
      expect((due('current') - now.getTime()) / 86400000).toBeGreaterThan(14);
      expect((due('current') - now.getTime()) / 86400000).toBeLessThan(18);
      expect(due('blunders')).toBeLessThan(now.getTime());
      expect(due('first')).toBeLessThan(due('second'));
      expect(due('second')).toBeLessThan(due('blunders'));
      // evaluations are back-dated to 21 days after the due date: still before today
      expect(due('blunders') + 21 * 86400000).toBeLessThan(now.getTime());
      // codes carry the year of the due date and stay unique
      for (const r of rounds)
        expect(r.code.startsWith(`NPS-${new Date(r.dueAt).getUTCFullYear()}-`)).toBe(true);
      expect(new Set(rounds.map((r) => r.code)).size).toBe(4);
    },
  );

  it('matches the original story on its own date', () => {
    const codes = demoRounds(new Date('2026-12-02T08:00:00Z')).map(
      (r) => `${r.code} ${r.dueAt.slice(0, 10)}`,
    );
    expect(codes).toEqual([
      'NPS-2025-A 2025-04-30',
      'NPS-2025-B 2025-10-31',
      'NPS-2026-A 2026-04-30',
      'NPS-2026-B 2026-12-18',
    ]);
  });
});
