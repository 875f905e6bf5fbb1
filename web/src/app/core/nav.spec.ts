import { navEntries } from './nav';
import { aLabMember, aMe } from './testing';

describe('navEntries', () => {
  const labels = (...args: Parameters<typeof navEntries>) =>
    navEntries(...args).map((entry) => entry.label);

  it('shows nothing when signed out', () => {
    expect(navEntries(null, true)).toEqual([]);
  });

  it('gives each role its own entries', () => {
    expect(labels(aMe({ roles: ['coordinator'] }), false)).toEqual([
      'Round desk',
      'Consensus board',
      'PT provider',
    ]);
    expect(labels(aMe({ roles: ['lab'] }), false)).toEqual([
      'Lab bench',
      'Track record',
      'Consensus board',
    ]);
    expect(labels(aMe({ roles: ['assessor'] }), false)).toEqual(['Assessor', 'Consensus board']);
    expect(labels(aMe({ roles: ['admin'] }), false)).toEqual([
      'Users',
      'Organisations',
      'PT provider',
    ]);
  });

  it('adds "My lab" for lab managers and the Outbox in demo/development mode', () => {
    const manager = aLabMember(true);
    const entries = navEntries(manager, true);
    expect(entries.map((e) => e.path)).toEqual([
      '/bench',
      '/bench/track-record',
      '/bench/lab-members',
      '/board',
      '/outbox',
    ]);
  });
});
