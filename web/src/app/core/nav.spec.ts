import { navEntries } from './nav';
import { aMe } from './testing';

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
    const manager = aMe({
      roles: ['lab'],
      memberships: [
        {
          id: '0d7c1f7a-1111-4a2b-8c3d-000000000001',
          organisationId: '0d7c1f7a-2222-4a2b-8c3d-000000000002',
          organisationName: 'Harbourside Colloid Lab',
          isManager: true,
        },
      ],
    });
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
