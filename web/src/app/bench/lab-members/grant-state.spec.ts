import type { AssessorGrantDto } from '@ringlet/shared/contracts/evaluation';
import { aGrant } from './grant-fixtures';
import { grantState, isRevocable } from './grant-state';

const grant = (overrides: Partial<AssessorGrantDto> = {}) =>
  aGrant({ isActive: false, ...overrides });

describe('grant state', () => {
  it('may be revoked while it gives access now or later, not once ended or revoked', () => {
    expect(isRevocable(grant({ isActive: true }), '2026-05-01')).toBe(true);
    expect(isRevocable(grant({ startsOn: '2026-06-01' }), '2026-05-01')).toBe(true);
    expect(isRevocable(grant({ endsOn: '2026-04-30' }), '2026-05-01')).toBe(false);
    expect(isRevocable(grant({ revokedAt: '2026-03-02T10:00:00.000Z' }), '2026-05-01')).toBe(false);
    expect(grantState(grant({ endsOn: null }), '2030-01-01')).toBe('upcoming');
  });
});
