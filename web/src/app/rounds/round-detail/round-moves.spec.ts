import { closesEarly, deskMoves, evaluatedElsewhere, transitionAsk } from './round-moves';

describe('round moves on the Round desk', () => {
  const now = Date.parse('2026-05-01T12:00:00Z');
  it('closing before results are due is closing early (and so is closing with no due date)', () => {
    expect(closesEarly({ resultsDueAt: '2026-05-02T00:00:00Z' }, 'closed', now)).toBe(true);
    expect(closesEarly({ resultsDueAt: '2026-04-30T00:00:00Z' }, 'closed', now)).toBe(false);
    expect(closesEarly({ resultsDueAt: null }, 'closed', now)).toBe(true);
    expect(closesEarly({ resultsDueAt: '2026-05-02T00:00:00Z' }, 'collecting', now)).toBe(false);
  });
  it('an early close offers the tick and needs a reason', () => {
    const ask = transitionAsk(
      { code: 'R-1', state: 'collecting', resultsDueAt: '2026-05-02T00:00:00Z' },
      'closed',
      now,
    );
    expect(ask).toMatchObject({ to: 'closed', offerForce: true, reasonRequired: true });
    expect(ask.intro).toContain('Close early');
    expect(ask.title).toBe('Move R-1 to Closed');
  });
  it('from Closed on, the evaluation page carries on; not before', () => {
    expect(evaluatedElsewhere('closed')).toBe(true);
    expect(evaluatedElsewhere('published')).toBe(true);
    expect(evaluatedElsewhere('collecting')).toBe(false);
  });
  it('offers only desk moves: never Published from the desk', () => {
    expect(deskMoves('evaluated')).not.toContain('published');
    expect(deskMoves('draft')).toContain('enrolling');
  });
});
