import { invitationsFromRows, invitedLab } from './invitation-rows';

describe('invitation rows', () => {
  it('a known lab goes by its id (the typed name dropped), a new one by its trimmed name', () => {
    expect(
      invitationsFromRows([
        { organisationId: 'o1', labName: 'ignored', email: 'a@example.test' },
        { organisationId: '', labName: '  Lab Nova ', email: 'b@example.test' },
        { organisationId: '', labName: ' ', email: 'c@example.test' },
      ]).invitations,
    ).toEqual([
      { organisationId: 'o1', labName: null, email: 'a@example.test' },
      { organisationId: null, labName: 'Lab Nova', email: 'b@example.test' },
      { organisationId: null, labName: null, email: 'c@example.test' },
    ]);
  });
  it('names a new lab "(new)"', () => {
    expect(invitedLab({ organisationName: null, labName: 'Lab Nova' })).toBe('Lab Nova (new)');
    expect(invitedLab({ organisationName: 'Lab Alba', labName: null })).toBe('Lab Alba');
  });
});
