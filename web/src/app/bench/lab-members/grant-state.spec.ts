import type { AssessorGrantDto } from '@ringlet/shared/contracts/evaluation';
import { grantState, isRevocable } from './grant-state';

const grant = (overrides: Partial<AssessorGrantDto> = {}): AssessorGrantDto => ({
  id: '5c4b3a29-1807-4f6e-9d5c-4b3a29180706',
  organisationId: '0b6a7c1e-2d3f-4a5b-8c9d-0e1f2a3b4c5d',
  assessorId: '9e8d7c6b-5a49-4382-a716-f5e4d3c2b1a0',
  assessorEmail: 'tove.lindqvist@example.test',
  assessorName: 'Tove Lindqvist',
  startsOn: '2026-01-01',
  endsOn: '2026-12-31',
  revokedAt: null,
  isActive: false,
  createdAt: '2026-01-01T09:00:00.000Z',
  ...overrides,
});

describe('grant state', () => {
  it('may be revoked while it gives access now or later, not once ended or revoked', () => {
    expect(isRevocable(grant({ isActive: true }), '2026-05-01')).toBe(true);
    expect(isRevocable(grant({ startsOn: '2026-06-01' }), '2026-05-01')).toBe(true);
    expect(isRevocable(grant({ endsOn: '2026-04-30' }), '2026-05-01')).toBe(false);
    expect(isRevocable(grant({ revokedAt: '2026-03-02T10:00:00.000Z' }), '2026-05-01')).toBe(false);
    expect(grantState(grant({ endsOn: null }), '2030-01-01')).toBe('upcoming');
  });
});
